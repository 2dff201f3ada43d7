import { createHash } from 'node:crypto';
import { expect } from 'chai';
import exifr from 'exifr';
import sharp from 'sharp';
import { mountApp } from '../../support/api-client';
import { runningServer } from '../../support/test-server';
import { sql } from '../db-state';
import {
  classIdOf,
  download,
  figureNotificationsFor,
  figureReviewPath,
  figureReviewRecords,
  figuresPath,
  figureStateOf,
  figureThreadsPath,
  imageWithOriginal,
  makeFigure,
  moveFigure,
} from './figure-review-fixtures';
import { reviewScene, type ReviewScene } from './review-fixtures';

const sha256 = (bytes: Buffer) => createHash('sha256').update(bytes).digest('hex');

describe('reviews: figures under review', function () {
  this.timeout(60_000);
  let app: Awaited<ReturnType<typeof mountApp>>;
  let s: ReviewScene;

  before(async () => {
    app = await mountApp();
    s = await reviewScene(app.url);
  });
  after(() => app.close());

  /** Two fresh panel images with originals, and a two-panel figure of them composed by the researcher. */
  async function freshFigure(title?: string): Promise<{ figureId: string; images: [string, string] }> {
    const images: [string, string] = [await imageWithOriginal(s.projectId, s.people.researcher, 1), await imageWithOriginal(s.projectId, s.people.researcher, 2)];
    const figure = await makeFigure(s.researcher, s.projectId, images, title);
    return { figureId: figure.id, images };
  }

  /** A figure the lead asked about in a thread (mentioning the guest), resolved, submitted by the researcher and cleared. */
  async function clearedFigure(): Promise<{ figureId: string; images: [string, string] }> {
    const made = await freshFigure();
    const thread = await s.lead.post(figureThreadsPath(s.projectId, made.figureId), { anchor: { kind: 'panel', panel: 0 }, body: 'Is the bond line the etched one?', mentions: [s.people.guest.id] });
    expect(thread.status, JSON.stringify(thread.body)).to.equal(201);
    expect((await s.lead.post(`${figureThreadsPath(s.projectId, made.figureId)}/${thread.body.id}/resolve`)).status).to.equal(200);
    await moveFigure(s.researcher, s.projectId, made.figureId, 'submit');
    await moveFigure(s.reviewer, s.projectId, made.figureId, 'clear', 'Scale bars and letters checked.');
    return made;
  }

  it('when a researcher submits, a reviewer asks for changes, it is submitted again, cleared and reopened by the lead, then every move is on record, in the history and told to the right people', async () => {
    const { figureId } = await freshFigure('Interface plate');
    const draft = await s.researcher.get(figureReviewPath(s.projectId, figureId));
    expect(draft.body).to.deep.include({ subjectType: 'figure', subjectId: figureId, state: 'draft', transitions: ['submit'], openThreads: 0 });

    await moveFigure(s.researcher, s.projectId, figureId, 'submit', 'Ready for a look.');
    await moveFigure(s.reviewer, s.projectId, figureId, 'request-changes', 'Panel b needs a bar.');
    await moveFigure(s.researcher, s.projectId, figureId, 'submit');
    await moveFigure(s.reviewer, s.projectId, figureId, 'clear');
    await moveFigure(s.lead, s.projectId, figureId, 'reopen', 'The journal wants 600 dpi.');

    const status = (await s.researcher.get(figureReviewPath(s.projectId, figureId))).body;
    expect(status.state).to.equal('draft');
    expect(status.history.map((e: { from: string; to: string; reason: string }) => `${e.from}→${e.to}:${e.reason}`)).to.deep.equal([
      'draft→with_reviewers:submit',
      'with_reviewers→needs_changes:requestChanges',
      'needs_changes→with_reviewers:submit',
      'with_reviewers→cleared:clear',
      'cleared→draft:reopen',
    ]);
    const activity = await sql<{ summary: string; image_id: string | null }>(
      `SELECT summary, image_id FROM activity_events WHERE project_id = $1 AND action = 'review.state_changed' AND details->>'figureId' = $2 ORDER BY seq`,
      [s.projectId, figureId],
    );
    expect(activity).to.have.length(5);
    expect(activity.every((a) => a.image_id === null && a.summary.endsWith('for the figure “Interface plate”'))).to.equal(true);
    expect((await figureNotificationsFor(s.people.reviewer.id, figureId)).map((n) => n.kind)).to.deep.equal(['review_requested', 'review_requested', 'returned_to_draft']);
    const researcherTold = await figureNotificationsFor(s.people.researcher.id, figureId);
    expect(researcherTold.map((n) => n.kind)).to.deep.equal(['changes_requested', 'cleared', 'returned_to_draft']);
    expect(researcherTold[0]!.facts).to.deep.include({ figureTitle: 'Interface plate', note: 'Panel b needs a bar.' });
    expect(researcherTold.every((n) => n.image_id === null)).to.equal(true);
  });

  it('when a reviewer clears a figure, then its definition and a PNG and a TIFF at its print size are kept; after an annotation edit on a panel image it is a draft again, on record, everyone involved is told, re-export draws the edit, and the cleared files download byte for byte as they were', async () => {
    const { figureId, images } = await clearedFigure();
    expect(await figureStateOf(figureId)).to.equal('cleared');
    const [clearance] = (await s.researcher.get(`${figureReviewPath(s.projectId, figureId)}/clearances`)).body;
    expect(clearance).to.deep.include({ figureId, figureVersion: 1, title: 'Bond line, two fields' });
    expect(clearance.definition).to.deep.include({ widthMm: 40, dpi: 150, columns: 2 });
    expect(clearance.images.map((i: { imageId: string }) => i.imageId)).to.deep.equal(images);
    expect(clearance.files.map((f: { format: string }) => f.format)).to.deep.equal(['png', 'tiff']);

    const url = (format: string) => `${figureReviewPath(s.projectId, figureId)}/clearances/${clearance.id}/${format}`;
    const png = await download(s.guest, url('png'));
    const tiff = await download(s.guest, url('tiff'));
    expect([png.status, png.type, tiff.status, tiff.type]).to.deep.equal([200, 'image/png', 200, 'image/tiff']);
    expect(sha256(png.bytes)).to.equal(clearance.files[0].sha256);
    expect(sha256(tiff.bytes)).to.equal(clearance.files[1].sha256);
    // 40 mm at 150 dpi: 40 / 25.4 in × 150 px/in = 236.2 → 236 px wide (1 in = 25.4 mm exactly, NIST SP 811, B.8).
    expect((await sharp(tiff.bytes).metadata()).width).to.equal(236);
    expect(clearance.files[1]).to.deep.include({ width: 236, widthMm: 40, dpi: 150 });
    // TIFF 6.0, Section 8: ResolutionUnit 2 = inch, XResolution in px per inch; read back with exifr as the reference reader.
    const tags = await exifr.parse(tiff.bytes, { translateValues: false, pick: ['XResolution', 'ResolutionUnit'] });
    expect(tags.ResolutionUnit).to.equal(2);
    expect(tags.XResolution).to.be.closeTo(150, 0.01);
    // PNG 1.2, pHYs chunk (px per metre), as libvips reports it through sharp.
    expect((await sharp(png.bytes).metadata()).density).to.be.closeTo(150, 0.5);

    // The researcher draws a second bond line on panel a's image: the figure no longer is what was cleared.
    const drawn = await s.researcher.post(`/api/projects/${s.projectId}/images/${images[0]}/annotations`, {
      classId: await classIdOf(s.projectId, 'Bond interface'),
      kind: 'polyline',
      points: [[0, 60], [320, 60]],
    });
    expect(drawn.status, JSON.stringify(drawn.body)).to.equal(201);

    expect(await figureStateOf(figureId)).to.equal('draft');
    const [last] = await sql('SELECT from_state, to_state, reason, actor_id, note FROM review_events WHERE subject_id = $1 ORDER BY seq DESC LIMIT 1', [figureId]);
    expect(last).to.deep.equal({ from_state: 'cleared', to_state: 'draft', reason: 'edited', actor_id: s.people.researcher.id, note: 'changed the annotations of fixture.tif, shown in a panel' });
    const [history] = await sql<{ summary: string }>(`SELECT summary FROM activity_events WHERE details->>'figureId' = $1 ORDER BY seq DESC LIMIT 1`, [figureId]);
    expect(history!.summary).to.equal('changed the annotations of fixture.tif, shown in a panel, after the figure “Bond line, two fields” was cleared; it is a draft again');
    for (const who of ['reviewer', 'lead', 'guest'] as const) {
      const told = (await figureNotificationsFor(s.people[who].id, figureId)).filter((n) => n.kind === 'returned_to_draft');
      expect(told.map((n) => n.facts['note']), who).to.deep.equal(['changed the annotations of fixture.tif, shown in a panel']);
    }
    expect((await figureNotificationsFor(s.people.researcher.id, figureId)).map((n) => n.kind)).to.not.include('returned_to_draft');

    const again = await fetch(`${app.url}${figuresPath(s.projectId)}/${figureId}/export`, {
      method: 'POST',
      headers: { ...(await s.researcher.authHeaders()), 'content-type': 'application/json' },
      body: JSON.stringify({ format: 'png', widthMm: 40, dpi: 150 }),
    });
    const reexported = Buffer.from(await again.arrayBuffer());
    expect(again.status).to.equal(200);
    const [before, after] = await Promise.all([png.bytes, reexported].map((b) => sharp(b).raw().toBuffer()));
    expect(before!.length).to.equal(after!.length);
    expect(before!.equals(after!), 're-export draws the new line').to.equal(false);

    const keptPng = await download(s.researcher, url('png'));
    const keptTiff = await download(s.researcher, url('tiff'));
    expect(keptPng.bytes.equals(png.bytes)).to.equal(true);
    expect(keptTiff.bytes.equals(tiff.bytes)).to.equal(true);
    expect((await s.researcher.get(`${figureReviewPath(s.projectId, figureId)}/clearances`)).body).to.have.length(1);
  });

  it('when a cleared figure itself is edited, or a panel image gets a new pixel size, then it is a draft again; an annotation on an image whose panel draws no classes leaves it cleared', async () => {
    const edited = await clearedFigure();
    const patched = await s.researcher.patch(`${figuresPath(s.projectId)}/${edited.figureId}`, { version: 1, title: 'Bond line, renamed' });
    expect(patched.status, JSON.stringify(patched.body)).to.equal(200);
    expect(patched.body).to.deep.include({ reviewState: 'draft', columns: 2, widthMm: 40, dpi: 150 });
    const [note] = await sql<{ note: string }>('SELECT note FROM review_events WHERE subject_id = $1 ORDER BY seq DESC LIMIT 1', [edited.figureId]);
    expect(note!.note).to.equal('changed the figure');

    const rescaled = await clearedFigure();
    expect((await s.researcher.patch(`/api/projects/${s.projectId}/images/${rescaled.images[1]}`, { pixelSizeUm: 0.25 })).status).to.equal(200);
    expect(await figureStateOf(rescaled.figureId)).to.equal('draft');

    const untouched = await clearedFigure();
    const pore = await s.researcher.post(`/api/projects/${s.projectId}/images/${untouched.images[1]}/annotations`, { classId: await classIdOf(s.projectId, 'Pore'), kind: 'point', points: [[9, 9]] });
    expect(pore.status).to.equal(201);
    expect(await figureStateOf(untouched.figureId)).to.equal('cleared');
  });

  it('when threads on a figure are opened, answered and resolved, then mentions and replies are told with a link to the figure, and clearing waits for them', async () => {
    const { figureId } = await freshFigure();
    const opened = await s.reviewer.post(figureThreadsPath(s.projectId, figureId), { anchor: { kind: 'figure' }, body: 'Legend is missing; @lead?', mentions: [s.people.lead.id] });
    expect(opened.status, JSON.stringify(opened.body)).to.equal(201);
    expect(opened.body).to.deep.include({ figureId, imageId: null, anchor: { kind: 'figure' }, status: 'open' });
    await moveFigure(s.researcher, s.projectId, figureId, 'submit');
    const refused = await s.reviewer.post(`${figureReviewPath(s.projectId, figureId)}/clear`, { note: '' });
    expect(refused.status).to.equal(409);
    expect(refused.body.error.message).to.equal('1 comment thread is still open on this figure; resolve it before clearing.');

    const reply = await s.researcher.post(`${figureThreadsPath(s.projectId, figureId)}/${opened.body.id}/comments`, { body: 'Added in version 2.' });
    expect(reply.status).to.equal(201);
    expect((await figureNotificationsFor(s.people.lead.id, figureId)).map((n) => [n.kind, n.thread_id])).to.deep.equal([['mention', opened.body.id], ['reply', opened.body.id]]);
    expect((await figureNotificationsFor(s.people.reviewer.id, figureId)).map((n) => n.kind)).to.deep.equal(['review_requested', 'reply']);
    const listed = (await s.guest.get(`${figureThreadsPath(s.projectId, figureId)}?status=open`)).body;
    expect(listed.map((t: { id: string; comments: unknown[] }) => [t.id, t.comments.length])).to.deep.equal([[opened.body.id, 2]]);
    expect((await s.reviewer.post(`${figureThreadsPath(s.projectId, figureId)}/${opened.body.id}/resolve`)).status).to.equal(200);
    await moveFigure(s.reviewer, s.projectId, figureId, 'clear');
    // Image counts leave figure threads out.
    const counts = (await s.guest.get(`/api/projects/${s.projectId}/comment-counts`)).body;
    expect(Object.keys(counts.images)).to.not.include(figureId);
  });

  it('when a comment on a figure mentions a non-member, pins a panel the figure lacks or an image point, then 422 naming the problem, and nothing changes', async () => {
    const { figureId } = await freshFigure();
    const before = await figureReviewRecords(s.projectId, figureId);
    const stranger = await s.researcher.post(figureThreadsPath(s.projectId, figureId), { anchor: { kind: 'figure' }, body: 'See this.', mentions: [s.people.outsider.id] });
    expect(stranger.status).to.equal(422);
    expect(stranger.body.error.message).to.contain(`${s.people.outsider.id} is not`);
    const nowhere = await s.researcher.post(figureThreadsPath(s.projectId, figureId), { anchor: { kind: 'panel', panel: 2 }, body: 'Third panel?' });
    expect(nowhere.status).to.equal(422);
    expect(nowhere.body.error.details).to.deep.equal([{ field: 'body.anchor.panel', message: 'The figure has 2 panels (places 0 to 1); there is no panel at place 2.' }]);
    const point = await s.researcher.post(figureThreadsPath(s.projectId, figureId), { anchor: { kind: 'point', at: [1, 1] }, body: 'Here.' });
    expect(point.status).to.equal(422);
    expect(await figureReviewRecords(s.projectId, figureId)).to.deep.equal(before);
  });

  it('when someone outside the project comments on, reads or moves a figure, then 404 as if it did not exist, and nothing changes', async () => {
    const { figureId } = await freshFigure();
    const before = await figureReviewRecords(s.projectId, figureId);
    expect((await s.outsider.post(figureThreadsPath(s.projectId, figureId), { anchor: { kind: 'figure' }, body: 'Hello?' })).status).to.equal(404);
    expect((await s.outsider.get(figureReviewPath(s.projectId, figureId))).status).to.equal(404);
    expect((await s.outsider.post(`${figureReviewPath(s.projectId, figureId)}/submit`, {})).status).to.equal(404);
    // A figure id of another project, asked for under this one, is not found either.
    const elsewhere = await s.lead.post(`/api/projects/${s.projectId}/figures/${figureId.replace(/.$/, (c) => (c === '0' ? '1' : '0'))}/threads`, { anchor: { kind: 'figure' }, body: 'Hm.' });
    expect(elsewhere.status).to.equal(404);
    expect(elsewhere.body.error.message).to.equal('The figure was not found.');
    expect(await figureReviewRecords(s.projectId, figureId)).to.deep.equal(before);
  });

  it('when a panel image is deleted, then submitting or clearing the figure is refused with 409 naming the panel and nothing changes; a cleared figure goes back to draft and its cleared files stay downloadable', async () => {
    const waiting = await freshFigure();
    await moveFigure(s.researcher, s.projectId, waiting.figureId, 'submit');
    const cleared = await clearedFigure();
    const [clearance] = (await s.lead.get(`${figureReviewPath(s.projectId, cleared.figureId)}/clearances`)).body;

    expect((await s.lead.delete(`/api/projects/${s.projectId}/images/${waiting.images[1]}`)).status).to.equal(204);
    expect((await s.lead.delete(`/api/projects/${s.projectId}/images/${cleared.images[1]}`)).status).to.equal(204);

    const before = await figureReviewRecords(s.projectId, waiting.figureId);
    const refused = await s.reviewer.post(`${figureReviewPath(s.projectId, waiting.figureId)}/clear`, { note: '' });
    expect(refused.status).to.equal(409);
    expect(refused.body.error.message).to.equal('The image of panel b has been deleted; choose another image or remove the panel, save, and submit again.');
    expect(await figureReviewRecords(s.projectId, waiting.figureId)).to.deep.equal(before);

    expect(await figureStateOf(cleared.figureId)).to.equal('draft');
    const [last] = await sql<{ note: string; actor_id: string }>('SELECT note, actor_id FROM review_events WHERE subject_id = $1 ORDER BY seq DESC LIMIT 1', [cleared.figureId]);
    expect(last).to.deep.equal({ note: 'deleted fixture.tif, shown in a panel', actor_id: s.people.lead.id });
    const afterDelete = await sql('SELECT * FROM figure_clearances WHERE figure_id = $1', [cleared.figureId]);
    expect(afterDelete).to.have.length(1);
    const before2 = await figureReviewRecords(s.projectId, cleared.figureId);
    const resubmit = await s.researcher.post(`${figureReviewPath(s.projectId, cleared.figureId)}/submit`, { note: '' });
    expect(resubmit.status).to.equal(409);
    expect(await figureReviewRecords(s.projectId, cleared.figureId)).to.deep.equal(before2);
    const kept = await download(s.guest, `${figureReviewPath(s.projectId, cleared.figureId)}/clearances/${clearance.id}/tiff`);
    expect(kept.status).to.equal(200);
    expect(sha256(kept.bytes)).to.equal(clearance.files[1].sha256);
  });

  it('when a move starts from the wrong state, then 409 saying why and nothing changes', async () => {
    const { figureId } = await freshFigure();
    const before = await figureReviewRecords(s.projectId, figureId);
    const early = await s.reviewer.post(`${figureReviewPath(s.projectId, figureId)}/clear`, { note: '' });
    expect(early.status).to.equal(409);
    expect(early.body.error.message).to.equal('Only an item with reviewers can be cleared; this one is a draft.');
    expect((await s.lead.post(`${figureReviewPath(s.projectId, figureId)}/reopen`, {})).status).to.equal(409);
    expect(await figureReviewRecords(s.projectId, figureId)).to.deep.equal(before);
  });

  it('when anyone tries to rewrite what a clearing kept, then the database refuses', async () => {
    const { figureId } = await clearedFigure();
    const ds = runningServer().ctx.dataSource;
    for (const statement of [`UPDATE figure_clearances SET title = 'x' WHERE figure_id = $1`, `DELETE FROM figure_clearances WHERE figure_id = $1`]) {
      let refused = '';
      try {
        await ds.query(statement, [figureId]);
      } catch (err) {
        // The append-only trigger raises; that refusal is what this test wants to see.
        refused = (err as Error).message;
      }
      expect(refused).to.contain('figure_clearances is append-only');
    }
  });

  it('when a figure waits for reviewers, then it is in their queue beside images, links by subject, and a modality filter leaves it out', async () => {
    const { figureId } = await freshFigure('Queue plate');
    await moveFigure(s.researcher, s.projectId, figureId, 'submit');
    const queue = (await s.reviewer.get(`/api/review-queue?projectId=${s.projectId}&pageSize=100`)).body;
    const row = queue.items.find((i: { subjectId: string }) => i.subjectId === figureId);
    expect(row).to.deep.include({ subjectType: 'figure', name: 'Queue plate', panelCount: 2, modality: null, specimenCode: null, projectId: s.projectId });
    const onlyFigures = (await s.reviewer.get(`/api/review-queue?projectId=${s.projectId}&subjectType=figure&pageSize=100`)).body;
    expect(onlyFigures.items.every((i: { subjectType: string }) => i.subjectType === 'figure')).to.equal(true);
    const byModality = (await s.reviewer.get(`/api/review-queue?projectId=${s.projectId}&modality=lom_bright_field&pageSize=100`)).body;
    expect(byModality.items.map((i: { subjectId: string }) => i.subjectId)).to.not.include(figureId);
    const list = (await s.guest.get(figuresPath(s.projectId))).body;
    expect(list.find((f: { id: string }) => f.id === figureId).reviewState).to.equal('with_reviewers');
  });
});
