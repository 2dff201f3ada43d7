import { expect } from 'chai';
import { mountApp } from '../../support/api-client';
import { makeImageRow } from '../../support/catalogue-fixtures';
import { sql } from '../db-state';
import { expectApiError } from '../error-shape';
import { clearImage, measurementRow, move, reviewPath, reviewRecords, reviewScene, stateOf, threadsPath, type ReviewScene } from './review-fixtures';

describe('reviews: review states of an image', () => {
  let app: Awaited<ReturnType<typeof mountApp>>;
  let s: ReviewScene;
  const fresh = () => makeImageRow(s.projectId, s.people.researcher, { width: 2000, height: 1500 }, 0.5);

  before(async () => {
    app = await mountApp();
    s = await reviewScene(app.url);
  });
  after(() => app.close());

  it('when nobody has submitted an image, then it is a draft and only those who submit are offered a move', async () => {
    const imageId = await fresh();
    const asResearcher = await s.researcher.get(reviewPath(s, imageId));
    expect(asResearcher.status).to.equal(200);
    expect(asResearcher.body).to.include({ state: 'draft', stateLabel: 'Draft', submittedBy: null, openThreads: 0 });
    expect(asResearcher.body.transitions).to.deep.equal(['submit']);
    expect((await s.reviewer.get(reviewPath(s, imageId))).body.transitions).to.deep.equal([]);
    expect((await s.guest.get(reviewPath(s, imageId))).body.transitions).to.deep.equal([]);
  });

  it('when a researcher submits, a reviewer asks for changes, it is submitted again and cleared, then every move is on record with its note', async () => {
    const imageId = await fresh();
    await move(s.researcher, s, imageId, 'submit');
    const waiting = (await s.reviewer.get(reviewPath(s, imageId))).body;
    expect(waiting).to.include({ state: 'with_reviewers', stateLabel: 'With reviewers' });
    expect(waiting.submittedBy).to.deep.equal({ id: s.people.researcher.id, name: s.people.researcher.displayName });
    expect(waiting.transitions).to.deep.equal(['requestChanges', 'clear']);

    await move(s.reviewer, s, imageId, 'request-changes', 'The scale bar disagrees with the calibration.');
    expect(await stateOf(imageId)).to.equal('needs_changes');
    await move(s.lead, s, imageId, 'submit');
    const cleared = await s.reviewer.post(`${reviewPath(s, imageId)}/clear`, { note: 'Checked.' });

    expect(cleared.status).to.equal(200);
    expect(cleared.body).to.include({ state: 'cleared', stateLabel: 'Cleared for publication' });
    expect(cleared.body.submittedBy.id, 'the last submission counts').to.equal(s.people.lead.id);
    expect(cleared.body.history.map((e: { reason: string; to: string }) => `${e.reason}→${e.to}`)).to.deep.equal([
      'submit→with_reviewers', 'requestChanges→needs_changes', 'submit→with_reviewers', 'clear→cleared',
    ]);
    expect(cleared.body.history[1]).to.deep.include({ note: 'The scale bar disagrees with the calibration.', actor: { id: s.people.reviewer.id, name: s.people.reviewer.displayName } });
    const activity = await sql<{ summary: string }>(`SELECT summary FROM activity_events WHERE image_id = $1 AND action = 'review.state_changed' ORDER BY seq`, [imageId]);
    expect(activity.map((a) => a.summary)).to.deep.equal([
      'submit for review: draft → with reviewers',
      'request changes: with reviewers → needs changes',
      'submit for review: needs changes → with reviewers',
      'clear for publication: with reviewers → cleared for publication',
    ]);
  });

  it('when a reviewer clears, then the pixel size, annotations and measurements are frozen and stay so after later edits', async () => {
    const imageId = await fresh();
    const classes = await sql<{ id: string }>(`SELECT id FROM annotation_classes WHERE project_id = $1 AND name = 'Bond interface'`, [s.projectId]);
    const drawn = await s.researcher.post(`/api/projects/${s.projectId}/images/${imageId}/annotations`, { classId: classes[0]!.id, kind: 'polyline', points: [[0, 700], [2000, 720]] });
    expect(drawn.status).to.equal(201);
    const measurementId = await measurementRow(s, imageId);
    await clearImage(s, imageId);
    const [frozen] = (await s.guest.get(`${reviewPath(s, imageId)}/snapshots`)).body;

    expect(frozen.clearedBy).to.deep.equal({ id: s.people.reviewer.id, name: s.people.reviewer.displayName });
    expect(frozen.pixelSize).to.include({ xUm: 0.5, source: 'user' });
    expect(frozen.annotations.map((a: { id: string; points: unknown }) => [a.id, a.points])).to.deep.equal([[drawn.body.id, [[0, 700], [2000, 720]]]]);
    expect(frozen.measurements.map((x: { id: string; umPerPx: number }) => [x.id, x.umPerPx])).to.deep.equal([[measurementId, 0.5]]);

    const patched = await s.researcher.patch(`/api/projects/${s.projectId}/images/${imageId}`, { pixelSizeUm: 0.25 });
    expect(patched.status).to.equal(200);
    await s.researcher.patch(`/api/projects/${s.projectId}/images/${imageId}/annotations/${drawn.body.id}`, { version: 1, points: [[0, 10], [2000, 10]] });
    expect(await stateOf(imageId)).to.equal('draft');
    const later = (await s.guest.get(`${reviewPath(s, imageId)}/snapshots`)).body;
    expect(later).to.deep.equal([frozen]);
  });

  it('when anyone tries to rewrite a snapshot or a review event, then the database refuses', async () => {
    const imageId = await fresh();
    await clearImage(s, imageId);
    for (const table of ['review_snapshots', 'review_events']) {
      let refused = '';
      await sql(`UPDATE ${table} SET project_id = project_id WHERE subject_id = $1`, [imageId]).catch((e: Error) => (refused = e.message));
      expect(refused).to.contain('append-only');
      refused = '';
      await sql(`DELETE FROM ${table} WHERE subject_id = $1`, [imageId]).catch((e: Error) => (refused = e.message));
      expect(refused).to.contain('append-only');
    }
  });

  it('when a lead reopens a cleared image, then it is a draft that can be submitted anew, and the snapshot stays', async () => {
    const imageId = await fresh();
    await clearImage(s, imageId);
    const reopened = await s.lead.post(`${reviewPath(s, imageId)}/reopen`, { note: 'New figure layout.' });
    expect(reopened.status).to.equal(200);
    expect(reopened.body.state).to.equal('draft');
    expect(reopened.body.transitions).to.deep.equal(['submit']);
    await move(s.researcher, s, imageId, 'submit');
    expect((await s.guest.get(`${reviewPath(s, imageId)}/snapshots`)).body).to.have.length(1);
  });

  // Each case: how far to bring a fresh image, then the move that cannot start from there.
  const WRONG_STATE = [
    { title: 'a reviewer clears a draft', setup: [] as const, who: 'reviewer', to: 'clear', says: 'Only an item with reviewers can be cleared; this one is a draft.' },
    { title: 'a reviewer asks for changes on a draft', setup: [] as const, who: 'reviewer', to: 'request-changes', says: 'sent back for changes; this one is a draft' },
    { title: 'a researcher submits what is with reviewers', setup: ['submit'] as const, who: 'researcher', to: 'submit', says: 'already with reviewers' },
    { title: 'a researcher submits a cleared image', setup: ['submit', 'clear'] as const, who: 'researcher', to: 'submit', says: 'a lead reopens it' },
    { title: 'a reviewer clears a cleared image again', setup: ['submit', 'clear'] as const, who: 'reviewer', to: 'clear', says: 'this one is already cleared for publication' },
    { title: 'a lead reopens a draft', setup: [] as const, who: 'lead', to: 'reopen', says: 'Only a cleared item can be reopened' },
    { title: 'a lead reopens what needs changes', setup: ['submit', 'request-changes'] as const, who: 'lead', to: 'reopen', says: 'this one is waiting for changes' },
  ] as const;
  for (const c of WRONG_STATE) {
    it(`when ${c.title}, then 409 saying why and nothing changes`, async () => {
      const imageId = await fresh();
      for (const step of c.setup) await move(step === 'submit' ? s.researcher : s.reviewer, s, imageId, step);
      const before = await reviewRecords(s.projectId, imageId);
      const res = await s[c.who].post(`${reviewPath(s, imageId)}/${c.to}`, { note: '' });
      expect(expectApiError(res, 409, 'conflict').message).to.contain(c.says);
      expect(await reviewRecords(s.projectId, imageId)).to.deep.equal(before);
    });
  }

  it('when threads are still open, then clearing is refused with 409 naming how many, and nothing changes', async () => {
    const imageId = await fresh();
    await move(s.researcher, s, imageId, 'submit');
    for (const at of [[10, 10], [20, 20]]) {
      expect((await s.reviewer.post(threadsPath(s, imageId), { anchor: { kind: 'point', at }, body: 'Is this an oxide?' })).status).to.equal(201);
    }
    const before = await reviewRecords(s.projectId, imageId);
    const res = await s.reviewer.post(`${reviewPath(s, imageId)}/clear`, {});
    expect(expectApiError(res, 409, 'conflict').message).to.equal('2 comment threads are still open on this image; resolve them before clearing.');
    expect(await reviewRecords(s.projectId, imageId)).to.deep.equal(before);
  });

  it('when a note is too long or an unknown field is sent, then 422 and nothing changes', async () => {
    const imageId = await fresh();
    const before = await reviewRecords(s.projectId, imageId);
    const long = await s.researcher.post(`${reviewPath(s, imageId)}/submit`, { note: 'x'.repeat(2001) });
    expect(expectApiError(long, 422, 'validation_failed').details?.[0]?.field).to.equal('body.note');
    const unknown = await s.researcher.post(`${reviewPath(s, imageId)}/submit`, { state: 'cleared' });
    expect(expectApiError(unknown, 422, 'validation_failed').message).to.contain('Unknown field');
    expect(await reviewRecords(s.projectId, imageId)).to.deep.equal(before);
  });

  it('when the image is not in the project, then 404 and nothing is stored', async () => {
    const missing = crypto.randomUUID();
    expectApiError(await s.researcher.post(`${reviewPath(s, missing)}/submit`, {}), 404, 'not_found');
    expect(await sql('SELECT 1 FROM review_states WHERE subject_id = $1', [missing])).to.deep.equal([]);
  });
});
