import { expect } from 'chai';
import type { KeptMail } from '../../../shared/admin';
import { runningServer } from '../../support/test-server';

/** The password link in a kept message (reset or invitation), checked to point at this app. */
export function passwordLinkIn(mail: KeptMail): string {
  const link = /https?:\/\/\S+\/reset-password\?token=[A-Za-z0-9_-]+/.exec(mail.text)?.[0];
  if (!link) expect.fail(`no password link in the mail: ${mail.text}`);
  expect(link.startsWith(`${runningServer().ctx.config.publicUrl}/reset-password?token=`), `link ${link} leads to this app`).to.equal(true);
  return link;
}
