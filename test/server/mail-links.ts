import { readOutbox } from '../../server/admin/mail-outbox';
import type { KeptMail } from '../../shared/admin';
import { testConfig } from '../support/test-config';

/** Waits for a kept message to `to` matching `subject` that is not one of `seen` (by id): the next mail, not an earlier one. */
export async function waitForNextMail(to: string, subject: RegExp, seen: KeptMail[], timeoutMs = 5000): Promise<KeptMail> {
  const known = new Set(seen.map((m) => m.id));
  const deadline = Date.now() + timeoutMs;
  for (;;) {
    const found = (await readOutbox(testConfig.storageDir, 1000)).find((m) => !known.has(m.id) && m.to.includes(to) && subject.test(m.subject));
    if (found) return found;
    if (Date.now() > deadline) throw new Error(`no new mail to ${to} matching ${subject} within ${timeoutMs} ms`);
    await new Promise((r) => setTimeout(r, 100));
  }
}

/** Every kept message to `to`. */
export async function mailsTo(to: string): Promise<KeptMail[]> {
  return (await readOutbox(testConfig.storageDir, 1000)).filter((m) => m.to.includes(to));
}
