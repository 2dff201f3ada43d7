import { sql } from '../db-state';

/** Mail goes through the relay and the queue's worker (about a second each); a loaded machine gets room. */
export const MAIL_WAIT_MS = 20_000;

/** Polls `check` until it holds, e.g. until the worker has marked a notification sent. */
export async function eventually(what: string, check: () => Promise<boolean>, timeoutMs = MAIL_WAIT_MS): Promise<void> {
  const deadline = Date.now() + timeoutMs;
  while (!(await check())) {
    if (Date.now() > deadline) throw new Error(`${what}: not so within ${timeoutMs} ms`);
    await new Promise((r) => setTimeout(r, 100));
  }
}

/** The stored notifications of one person about one image, oldest first, with their delivery state. */
export function deliveries(userId: string, imageId: string): Promise<{ id: string; kind: string; status: string; job_id: string | null }[]> {
  return sql('SELECT id, kind, status, job_id FROM notifications WHERE recipient_id = $1 AND image_id = $2 ORDER BY created_at', [userId, imageId]);
}
