import { expect } from 'chai';
import type { User } from '../../../server/auth/user.entity';
import { mountApp } from '../../support/api-client';
import { makeImageRow } from '../../support/catalogue-fixtures';
import { waitForMail } from '../../support/mail-box';
import { runningServer } from '../../support/test-server';
import { sql } from '../db-state';
import { mailsTo } from '../mail-links';
import { clearImage, move, reviewScene, threadsPath, type ReviewScene } from '../reviews/review-fixtures';
import { deliveries, eventually, MAIL_WAIT_MS } from './notification-fixtures';

/** One kind of notification: how to cause it on a fresh image, who receives it, and what the mail says. */
interface KindCase {
  kind: string;
  cause(s: ReviewScene, imageId: string): Promise<string | null>;
  to: keyof ReviewScene['people'];
  subject: RegExp;
  says: string;
}

const thread = async (s: ReviewScene, imageId: string, mentions: string[] = []) => {
  const res = await s.reviewer.post(threadsPath(s, imageId), { anchor: { kind: 'point', at: [40, 80] }, body: 'Is this oxide chain continuous along the bond?', mentions });
  expect(res.status, JSON.stringify(res.body)).to.equal(201);
  return res.body.id as string;
};

const KINDS: KindCase[] = [
  { kind: 'review_requested', to: 'reviewer', subject: /submitted fixture\.tif for review$/, says: 'It is waiting in your review queue.', cause: async (s, id) => (await move(s.researcher, s, id, 'submit'), null) },
  { kind: 'mention', to: 'lead', subject: /mentioned you on fixture\.tif$/, says: '“Is this oxide chain continuous along the bond?”', cause: (s, id) => thread(s, id, [s.people.lead.id]) },
  {
    kind: 'reply',
    to: 'reviewer',
    subject: /replied in a thread on fixture\.tif$/,
    says: '“Yes, over the whole field.”',
    cause: async (s, id) => {
      const t = await thread(s, id);
      expect((await s.researcher.post(`${threadsPath(s, id)}/${t}/comments`, { body: 'Yes, over the whole field.' })).status).to.equal(201);
      return t;
    },
  },
  {
    kind: 'changes_requested',
    to: 'researcher',
    subject: /asked for changes to fixture\.tif$/,
    says: 'Note: Calibrate against the stage micrometer.',
    cause: async (s, id) => {
      await move(s.researcher, s, id, 'submit');
      await move(s.reviewer, s, id, 'request-changes', 'Calibrate against the stage micrometer.');
      return null;
    },
  },
  { kind: 'cleared', to: 'researcher', subject: /cleared fixture\.tif for publication$/, says: 'is kept as a snapshot', cause: async (s, id) => (await clearImage(s, id), null) },
  {
    kind: 'returned_to_draft',
    to: 'reviewer',
    subject: /fixture\.tif is back to draft$/,
    says: 'changed the pixel size, so it needs a new review',
    cause: async (s, id) => {
      await clearImage(s, id);
      expect((await s.lead.patch(`/api/projects/${s.projectId}/images/${id}`, { pixelSizeUm: 0.31 })).status).to.equal(200);
      return null;
    },
  },
];

describe('notifications: e-mail for each kind, through the durable queue', () => {
  let app: Awaited<ReturnType<typeof mountApp>>;
  let s: ReviewScene;
  const publicUrl = () => runningServer().ctx.config.publicUrl;

  before(async () => {
    app = await mountApp();
    s = await reviewScene(app.url);
  });
  after(() => app.close());

  for (const c of KINDS) {
    it(`when ${c.kind.replace(/_/g, ' ')} happens, then the ${c.to} gets one e-mail that says so and links to the image${c.kind === 'mention' || c.kind === 'reply' ? ' and its thread' : ''}`, async () => {
      const imageId = await makeImageRow(s.projectId, s.people.researcher, { width: 2000, height: 1500 }, 0.5);
      const recipient: User = s.people[c.to];
      const threadId = await c.cause(s, imageId);

      const mail = await waitForMail(recipient.email, c.subject, MAIL_WAIT_MS);
      const code = (await sql<{ code: string }>('SELECT code FROM projects WHERE id = $1', [s.projectId]))[0]!.code;
      expect(mail.subject.startsWith(`[${code}] `)).to.equal(true);
      expect(mail.text).to.contain(`Hello ${recipient.displayName},`);
      expect(mail.text).to.contain(c.says);
      const link = `${publicUrl()}/projects/${s.projectId}/images/${imageId}${threadId ? `?thread=${threadId}` : ''}`;
      expect(mail.text).to.contain(`Open it: ${link}\n`);
      const mine = async () => (await deliveries(recipient.id, imageId)).filter((n) => n.kind === c.kind);
      expect(await mine()).to.have.length(1);
      await eventually('marked sent', async () => (await mine())[0]!.status === 'sent');
      expect((await mailsTo(recipient.email)).filter((m) => c.subject.test(m.subject) && m.text.includes(imageId))).to.have.length(1);
    });
  }

  it('when the person who acted is the only one concerned, then no notification is written at all', async () => {
    const imageId = await makeImageRow(s.projectId, s.people.researcher, { width: 2000, height: 1500 }, 0.5);
    await s.reviewer.post(threadsPath(s, imageId), { anchor: { kind: 'point', at: [1, 1] }, body: 'Note to self.', mentions: [s.people.reviewer.id] });
    expect(await sql('SELECT 1 FROM notifications WHERE image_id = $1', [imageId])).to.deep.equal([]);
  });
});
