import { readOutbox } from '../../server/admin/mail-outbox';
import type { KeptMail } from '../../shared/admin';
import { testConfig } from './test-config';

/** Waits for the fake SMTP server to keep a message to `to` matching `subject`, and returns the newest. */
export async function waitForMail(to: string, subject: RegExp, timeoutMs = 5000): Promise<KeptMail> {
  const deadline = Date.now() + timeoutMs;
  for (;;) {
    const found = (await readOutbox(testConfig.storageDir, 1000)).find((m) => m.to.includes(to) && subject.test(m.subject));
    if (found) return found;
    if (Date.now() > deadline) throw new Error(`no mail to ${to} matching ${subject} within ${timeoutMs} ms`);
    await new Promise((r) => setTimeout(r, 100));
  }
}

/** The one-time token in a password link inside a message. */
export function tokenIn(mail: KeptMail): string {
  const match = /reset-password\?token=([A-Za-z0-9_-]+)/.exec(mail.text);
  if (!match) throw new Error(`no password link in mail: ${mail.text}`);
  return match[1]!;
}
