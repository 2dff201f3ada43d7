import { createHash } from 'node:crypto';
import { expect } from 'chai';
import { mountApp } from '../../support/api-client';
import { sql } from '../db-state';
import {
  classIdOf,
  download,
  figureNotificationsFor,
  figureReviewPath,
  figureStateOf,
  imageWithOriginal,
  makeFigure,
  moveFigure,
} from './figure-review-fixtures';
import { reviewScene, type ReviewScene } from './review-fixtures';

const sha256 = (bytes: Buffer) => createHash('sha256').update(bytes).digest('hex');

/**
 * A figure draws annotation classes by their name (legend) and colour (shapes, legend swatch), so a change
 * to a class it draws means it no longer looks as it was cleared. The figures here come from `makeFigure`:
 * panel a draws the “Bond interface” class, panel b draws no class.
 */
describe('reviews: cleared figures and the annotation classes they draw', function () {
  this.timeout(60_000);
  let app: Awaited<ReturnType<typeof mountApp>>;
  let s: ReviewScene;

  before(async () => {
    app = await mountApp();
    s = await reviewScene(app.url);
  });
  after(() => app.close());

  const classesPath = () => `/api/projects/${s.projectId}/annotation-classes`;

  /** Two fresh panel images with originals. */
  async function freshImages(): Promise<[string, string]> {
    return [await imageWithOriginal(s.projectId, s.people.researcher, 1), await imageWithOriginal(s.projectId, s.people.researcher, 2)];
  }

  /** A two-panel figure of `images`, submitted by the researcher and cleared by the reviewer. */
  async function clearedFigure(title: string, images?: [string, string]): Promise<{ figureId: string; images: [string, string] }> {
    images ??= await freshImages();
    const { id: figureId } = await makeFigure(s.researcher, s.projectId, images, title);
    await moveFigure(s.researcher, s.projectId, figureId, 'submit');
    await moveFigure(s.reviewer, s.projectId, figureId, 'clear');
    return { figureId, images };
  }

  /** The lead rewrites a class (PUT takes the whole class) and insists it worked. */
  async function putClass(classId: string, changes: Partial<{ name: string; colour: string; shapeKind: string }>): Promise<void> {
    const [current] = await sql<{ name: string; colour: string; shape_kind: string }>('SELECT name, colour, shape_kind FROM annotation_classes WHERE id = $1', [classId]);
    const res = await s.lead.request('PUT', `${classesPath()}/${classId}`, { name: current!.name, colour: current!.colour, shapeKind: current!.shape_kind, ...changes });
    expect(res.status, JSON.stringify(res.body)).to.equal(200);
  }

  it('when the colour of a class a cleared figure draws is changed, then the figure is a draft again, on record, everyone involved is told, and the cleared files are unchanged', async () => {
    const { figureId } = await clearedFigure('Interface colours');
    const interfaces = await classIdOf(s.projectId, 'Bond interface');
    const [colour] = await sql<{ colour: string }>('SELECT colour FROM annotation_classes WHERE id = $1', [interfaces]);
    const newColour = colour!.colour === 'lime' ? 'crimson' : 'lime';
    const [clearance] = (await s.researcher.get(`${figureReviewPath(s.projectId, figureId)}/clearances`)).body;
    const url = (format: string) => `${figureReviewPath(s.projectId, figureId)}/clearances/${clearance.id}/${format}`;

    await putClass(interfaces, { colour: newColour });

    expect(await figureStateOf(figureId)).to.equal('draft');
    const note = `changed the colour of the annotation class “Bond interface” from ${colour!.colour} to ${newColour}, drawn in a panel`;
    const [last] = await sql('SELECT from_state, to_state, reason, actor_id, note FROM review_events WHERE subject_id = $1 ORDER BY seq DESC LIMIT 1', [figureId]);
    expect(last).to.deep.equal({ from_state: 'cleared', to_state: 'draft', reason: 'edited', actor_id: s.people.lead.id, note });
    const [history] = await sql<{ summary: string; actor_id: string }>(`SELECT summary, actor_id FROM activity_events WHERE details->>'figureId' = $1 ORDER BY seq DESC LIMIT 1`, [figureId]);
    expect(history).to.deep.equal({ summary: `${note}, after the figure “Interface colours” was cleared; it is a draft again`, actor_id: s.people.lead.id });
    for (const who of ['researcher', 'reviewer'] as const) {
      const told = (await figureNotificationsFor(s.people[who].id, figureId)).filter((n) => n.kind === 'returned_to_draft');
      expect(told.map((n) => n.facts['note']), who).to.deep.equal([note]);
    }
    // What the clearing kept is not rewritten: one clearance, both files byte for byte with their recorded SHA-256.
    expect((await s.researcher.get(`${figureReviewPath(s.projectId, figureId)}/clearances`)).body).to.have.length(1);
    const [png, tiff] = [await download(s.guest, url('png')), await download(s.guest, url('tiff'))];
    expect([png.status, tiff.status]).to.deep.equal([200, 200]);
    expect([sha256(png.bytes), sha256(tiff.bytes)]).to.deep.equal([clearance.files[0].sha256, clearance.files[1].sha256]);
  });

  it('when a class a cleared figure draws is renamed, then it is a draft again; a class it does not draw, or a change of shape kind alone, leaves it cleared', async () => {
    const renamed = await clearedFigure('Renamed legend');
    const pores = await classIdOf(s.projectId, 'Pore');
    const [pore] = await sql<{ colour: string }>('SELECT colour FROM annotation_classes WHERE id = $1', [pores]);

    await putClass(pores, { name: 'Pore (etched)', colour: pore!.colour === 'slate' ? 'copper' : 'slate' });
    expect(await figureStateOf(renamed.figureId), 'no panel draws “Pore”').to.equal('cleared');

    const interfaces = await classIdOf(s.projectId, 'Bond interface');
    // No shape of the class exists yet in this project, so any shape kind fits.
    await putClass(interfaces, { shapeKind: 'point_or_outline' });
    expect(await figureStateOf(renamed.figureId), 'the shape kind is not drawn').to.equal('cleared');
    await putClass(interfaces, { shapeKind: 'line' });

    await putClass(interfaces, { name: 'Bond line' });
    expect(await figureStateOf(renamed.figureId)).to.equal('draft');
    const [last] = await sql<{ note: string }>('SELECT note FROM review_events WHERE subject_id = $1 ORDER BY seq DESC LIMIT 1', [renamed.figureId]);
    expect(last!.note).to.equal('renamed the annotation class “Bond interface” to “Bond line”, drawn in a panel');
    await putClass(interfaces, { name: 'Bond interface' });
  });

  it('when a class is deleted and its shapes move to a class a cleared figure draws, then the figure is a draft again; a figure drawing neither stays cleared', async () => {
    const created = await s.lead.post(classesPath(), { name: 'Weld seam', colour: 'magenta', shapeKind: 'line' });
    expect(created.status, JSON.stringify(created.body)).to.equal(201);
    // The seam is drawn on panel a's image before the figure is cleared; panel a draws only “Bond interface”.
    const images = await freshImages();
    const drawn = await s.researcher.post(`/api/projects/${s.projectId}/images/${images[0]}/annotations`, { classId: created.body.id, kind: 'polyline', points: [[0, 90], [320, 90]] });
    expect(drawn.status, JSON.stringify(drawn.body)).to.equal(201);
    const { figureId } = await clearedFigure('Seam moved', images);
    const bystander = await clearedFigure('Seam elsewhere');
    const interfaces = await classIdOf(s.projectId, 'Bond interface');
    // Panel a of the bystander draws “Bond interface” too, but on images that had no “Weld seam” shape.
    const res = await s.lead.delete(`${classesPath()}/${created.body.id}?moveTo=${interfaces}`);
    expect(res.status, JSON.stringify(res.body)).to.equal(204);

    expect(await figureStateOf(figureId)).to.equal('draft');
    const [last] = await sql<{ note: string; actor_id: string }>('SELECT note, actor_id FROM review_events WHERE subject_id = $1 ORDER BY seq DESC LIMIT 1', [figureId]);
    expect(last).to.deep.equal({ note: 'deleted the annotation class “Weld seam” and moved its shapes to “Bond interface”, drawn in a panel', actor_id: s.people.lead.id });
    expect(await figureStateOf(bystander.figureId)).to.equal('cleared');
  });
});
