import { createHash, randomBytes } from 'node:crypto';
import { IsNull, type DataSource, type EntityManager } from 'typeorm';
import { AppError } from '../http/app-error';
import { PasswordToken, type PasswordTokenPurpose } from './password-token.entity';
import type { User } from './user.entity';

function sha256(token: string): string {
  return createHash('sha256').update(token).digest('hex');
}

/** Makes a one-time token for `user`, replacing any earlier unused ones, and returns the raw token for the link. */
export async function issuePasswordToken(ds: DataSource, user: User, purpose: PasswordTokenPurpose, lifetimeMs: number): Promise<string> {
  const token = randomBytes(32).toString('base64url');
  await ds.transaction(async (m) => {
    await m.delete(PasswordToken, { userId: user.id, usedAt: IsNull() });
    await m.insert(PasswordToken, { tokenHash: sha256(token), userId: user.id, purpose, expiresAt: new Date(Date.now() + lifetimeMs) });
  });
  return token;
}

/**
 * Marks the token used and returns its user id, or throws a message saying why the link does not work.
 * Pass the transaction's manager so a later refusal rolls the use back.
 * The conditional UPDATE makes the token single-use even when two requests race.
 */
export async function consumePasswordToken(m: EntityManager, token: string): Promise<string> {
  // TypeORM answers an UPDATE with [rows, affectedCount], not the rows alone.
  const [rows]: [{ user_id: string }[], number] = await m.query(
    `UPDATE password_tokens SET used_at = now()
      WHERE token_hash = $1 AND used_at IS NULL AND expires_at > now()
      RETURNING user_id`,
    [sha256(token)],
  );
  if (rows.length === 1) return rows[0]!.user_id;
  throw tokenRefusal(await m.getRepository(PasswordToken).findOneBy({ tokenHash: sha256(token) }));
}

/** Throws why the link does not work, as consuming it would, but leaves it unused when it does. */
export async function checkPasswordToken(m: EntityManager, token: string): Promise<void> {
  const known = await m.getRepository(PasswordToken).findOneBy({ tokenHash: sha256(token) });
  if (!known || known.usedAt || known.expiresAt.getTime() <= Date.now()) throw tokenRefusal(known);
}

function tokenRefusal(known: PasswordToken | null): AppError {
  if (!known) return new AppError(400, 'token_invalid', 'This link is not valid. Ask for a new one.');
  if (known.usedAt) return new AppError(400, 'token_invalid', 'This link has already been used. Ask for a new one if you still need it.');
  return new AppError(400, 'token_invalid', 'This link has expired. Ask for a new one.');
}
