import type { DataSource } from 'typeorm';

/**
 * Ends a user's stored sessions (after a password change, reset or deactivation),
 * keeping the one given so the person who made the change stays signed in.
 */
export async function endSessionsOf(ds: DataSource, userId: string, keepSid?: string): Promise<void> {
  await ds.query(`DELETE FROM user_sessions WHERE sess->'passport'->>'user' = $1 AND sid <> $2`, [userId, keepSid ?? '']);
}
