import { runningServer } from '../support/test-server';

/** Reads rows straight from PostgreSQL, so tests can say "nothing changed" without trusting the API. */
export function sql<T = Record<string, unknown>>(text: string, params: unknown[] = []): Promise<T[]> {
  return runningServer().ctx.dataSource.query(text, params);
}

/** A project row with its memberships, in a stable order, for before/after comparisons. */
export async function projectState(projectId: string): Promise<unknown> {
  const [project] = await sql('SELECT * FROM projects WHERE id = $1', [projectId]);
  const members = await sql('SELECT user_id, role, added_at FROM project_memberships WHERE project_id = $1 ORDER BY user_id', [projectId]);
  return { project, members };
}

/** A user row (including the password hash) for before/after comparisons. */
export async function userState(userId: string): Promise<Record<string, unknown> | undefined> {
  const [user] = await sql('SELECT * FROM users WHERE id = $1', [userId]);
  return user;
}

export async function projectIdByCode(code: string): Promise<string | null> {
  const rows = await sql<{ id: string }>('SELECT id FROM projects WHERE code = $1', [code]);
  return rows[0]?.id ?? null;
}

export async function userIdByEmail(email: string): Promise<string | null> {
  const rows = await sql<{ id: string }>('SELECT id FROM users WHERE email = $1', [email]);
  return rows[0]?.id ?? null;
}

/** How many stored sessions belong to a user. */
export async function sessionCount(userId: string): Promise<number> {
  const rows = await sql<{ n: number }>(`SELECT count(*)::int AS n FROM user_sessions WHERE sess->'passport'->>'user' = $1`, [userId]);
  return rows[0]!.n;
}

/** Password links issued to a user, oldest first. */
export async function passwordTokens(userId: string): Promise<{ id: string; purpose: string; used_at: Date | null; expires_at: Date }[]> {
  return sql('SELECT id, purpose, used_at, expires_at FROM password_tokens WHERE user_id = $1 ORDER BY created_at', [userId]);
}
