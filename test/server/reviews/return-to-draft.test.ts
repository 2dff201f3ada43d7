import { expect } from 'chai';
import type { ApiResponse } from '../../support/api-client';
import { mountApp } from '../../support/api-client';
import { makeImageRow } from '../../support/catalogue-fixtures';
import { sql } from '../db-state';
import { clearImage, measurementRow, move, notificationsFor, reviewRecords, reviewScene, stateOf, threadsPath, type ReviewScene } from './review-fixtures';

/** One way of editing what a review covers: what to prepare before clearing, and the edit itself (as the researcher). */
interface EditCase {
  title: string;
  note: string;
  prepare?(s: ReviewScene, imageId: string): Promise<string>;
  edit(s: ReviewScene, imageId: string, prepared: string): Promise<ApiResponse>;
}

const classId = async (s: ReviewScene, name: string) =>
  (await sql<{ id: string }>('SELECT id FROM annotation_classes WHERE project_id = $1 AND name = $2', [s.projectId, name]))[0]!.id;
const annotations = (s: ReviewScene, imageId: string) => `/api/projects/${s.projectId}/images/${imageId}/annotations`;
const drawPore = async (s: ReviewScene, imageId: string) =>
  (await s.researcher.post(annotations(s, imageId), { classId: await classId(s, 'Pore'), kind: 'point', points: [[50, 50]] })).body.id as string;

const EDITS: EditCase[] = [
  { title: 'a typed pixel size', note: 'changed the pixel size', edit: (s, id) => s.researcher.patch(`/api/projects/${s.projectId}/images/${id}`, { pixelSizeUm: 0.3 }) },
  {
    title: 'a pixel size drawn on the image',
    note: 'changed the pixel size',
    edit: (s, id) => s.researcher.post(`/api/projects/${s.projectId}/images/${id}/calibration/drawn`, { start: [100, 700], end: [512, 700], trueLengthUm: 100 }),
  },
  { title: 'a new annotation', note: 'changed the annotations', edit: async (s, id) => s.researcher.post(annotations(s, id), { classId: await classId(s, 'Pore'), kind: 'point', points: [[9, 9]] }) },
  { title: 'a moved annotation', note: 'changed the annotations', prepare: drawPore, edit: (s, id, a) => s.researcher.patch(`${annotations(s, id)}/${a}`, { version: 1, points: [[60, 60]] }) },
  { title: 'a deleted annotation', note: 'changed the annotations', prepare: drawPore, edit: (s, id, a) => s.researcher.delete(`${annotations(s, id)}/${a}?version=1`) },
  {
    title: 'a GeoJSON import of annotations',
    note: 'changed the annotations',
    edit: (s, id) =>
      s.researcher.raw('POST', `${annotations(s, id)}.geojson`, JSON.stringify({ type: 'FeatureCollection', features: [{ type: 'Feature', geometry: { type: 'Point', coordinates: [20, 20] }, properties: { class: 'Pore' } }] }), {
        'content-type': 'application/geo+json',
      }),
  },
  {
    title: 'a deleted measurement',
    note: 'changed the measurements',
    prepare: (s, id) => measurementRow(s, id),
    edit: (s, id, measurementId) => s.researcher.delete(`/api/projects/${s.projectId}/images/${id}/measurements/${measurementId}?version=1`),
  },
];

describe('reviews: an edit after clearing returns the image to draft', () => {
  let app: Awaited<ReturnType<typeof mountApp>>;
  let s: ReviewScene;

  before(async () => {
    app = await mountApp();
    s = await reviewScene(app.url);
  });
  after(() => app.close());

  /** A fresh image whose review involved everyone: the lead asked in a thread, mentioning the guest; it was resolved, then cleared. */
  async function clearedWithThread(prepare?: EditCase['prepare']): Promise<{ imageId: string; prepared: string }> {
    const imageId = await makeImageRow(s.projectId, s.people.researcher, { width: 2000, height: 1500 }, 0.5);
    const prepared = prepare ? await prepare(s, imageId) : '';
    const thread = (await s.lead.post(threadsPath(s, imageId), { anchor: { kind: 'point', at: [5, 5] }, body: 'Is the etch even here?', mentions: [s.people.guest.id] })).body;
    await s.lead.post(`${threadsPath(s, imageId)}/${thread.id}/resolve`);
    await clearImage(s, imageId);
    return { imageId, prepared };
  }

  for (const c of EDITS) {
    it(`when ${c.title} changes a cleared image, then it is a draft again, on record, and everyone involved but the editor is told`, async () => {
      const { imageId, prepared } = await clearedWithThread(c.prepare);
      const res = await c.edit(s, imageId, prepared);

      expect(res.status, JSON.stringify(res.body)).to.be.within(200, 204);
      expect(await stateOf(imageId)).to.equal('draft');
      const [last] = await sql('SELECT from_state, to_state, reason, actor_id, note FROM review_events WHERE subject_id = $1 ORDER BY seq DESC LIMIT 1', [imageId]);
      expect(last).to.deep.equal({ from_state: 'cleared', to_state: 'draft', reason: 'edited', actor_id: s.people.researcher.id, note: c.note });
      const [activity] = await sql<{ summary: string }>(`SELECT summary FROM activity_events WHERE image_id = $1 AND action = 'review.state_changed' ORDER BY seq DESC LIMIT 1`, [imageId]);
      expect(activity!.summary).to.equal(`${c.note} after the image was cleared; it is a draft again`);
      for (const who of ['reviewer', 'lead', 'guest'] as const) {
        const told = (await notificationsFor(s.people[who].id, imageId)).filter((n) => n.kind === 'returned_to_draft');
        expect(told.map((n) => n.facts['note']), who).to.deep.equal([c.note]);
      }
      expect((await notificationsFor(s.people.researcher.id, imageId)).map((n) => n.kind)).to.not.include('returned_to_draft');
      expect(await sql('SELECT id FROM review_snapshots WHERE subject_id = $1', [imageId])).to.have.length(1);
    });
  }

  it('when the lead deletes a class and moves its shapes to another, then a cleared image holding some is a draft again and one without any stays cleared', async () => {
    const extra = (await s.lead.post(`/api/projects/${s.projectId}/annotation-classes`, { name: `Inclusion ${Date.now()}`, colour: 'verdigris', shapeKind: 'point_or_outline' })).body;
    expect(extra.id, JSON.stringify(extra)).to.be.a('string');
    const holding = await clearedWithThread(async (sc, id) => (await sc.researcher.post(annotations(sc, id), { classId: extra.id, kind: 'point', points: [[40, 40]] })).body.id as string);
    const without = await clearedWithThread();

    const res = await s.lead.delete(`/api/projects/${s.projectId}/annotation-classes/${extra.id}?moveTo=${await classId(s, 'Pore')}`);

    expect(res.status, JSON.stringify(res.body)).to.equal(204);
    expect(await stateOf(holding.imageId)).to.equal('draft');
    const [last] = await sql('SELECT from_state, to_state, actor_id, note FROM review_events WHERE subject_id = $1 ORDER BY seq DESC LIMIT 1', [holding.imageId]);
    expect(last).to.deep.equal({ from_state: 'cleared', to_state: 'draft', actor_id: s.people.lead.id, note: 'changed the annotations' });
    expect(await stateOf(without.imageId)).to.equal('cleared');
  });

  it('when an image waiting for reviewers is edited, then it stays with them and nobody is told it went back', async () => {
    const imageId = await makeImageRow(s.projectId, s.people.researcher, { width: 2000, height: 1500 }, 0.5);
    await move(s.researcher, s, imageId, 'submit');
    expect((await s.researcher.patch(`/api/projects/${s.projectId}/images/${imageId}`, { pixelSizeUm: 0.3 })).status).to.equal(200);
    expect(await stateOf(imageId)).to.equal('with_reviewers');
    expect(await sql(`SELECT 1 FROM notifications WHERE image_id = $1 AND kind = 'returned_to_draft'`, [imageId])).to.deep.equal([]);
  });

  it('when an edit to a cleared image is refused, then it stays cleared and nothing is recorded or told', async () => {
    const { imageId } = await clearedWithThread();
    const before = await reviewRecords(s.projectId, imageId);
    const res = await s.researcher.post(annotations(s, imageId), { classId: await classId(s, 'Pore'), kind: 'point', points: [[5000, 5000]] });
    expect(res.status).to.equal(422);
    expect(await stateOf(imageId)).to.equal('cleared');
    expect(await reviewRecords(s.projectId, imageId)).to.deep.equal(before);
  });
});
