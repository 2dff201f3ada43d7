import { expect } from 'chai';
import type { PanelSpec } from '../../../shared/figures';
import { panelMoves } from '../../../server/figures/panel-moves';
import { mountApp } from '../../support/api-client';
import { sql } from '../db-state';
import { figuresPath, figureThreadsPath, imageWithOriginal, makeFigure } from '../reviews/figure-review-fixtures';
import { reviewScene, type ReviewScene } from '../reviews/review-fixtures';

const panel = (imageId: string, x = 0): PanelSpec => ({
  imageId,
  region: { x, y: 0, width: 100, height: 80 },
  classIds: [],
  legend: false,
  letter: '',
  scaleBar: { lengthUm: null, position: 'bottom-right', colour: 'auto', show: true },
});

describe('figures: threads pinned to a panel follow it', () => {
  it('follows panels that swap places, one edited where it stands, and says which are gone', () => {
    const [a, b, c] = [panel('A'), panel('B'), panel('C')];

    // Hand-worked: a and b swap, c is removed → a goes to 1, b to 0, c to nowhere.
    expect(panelMoves([a, b, c], [b, a])).to.deep.equal([1, 0, null]);
    // A new region on the same image at the same place is the same panel.
    expect(panelMoves([a, b], [panel('A', 50), b])).to.deep.equal([0, 1]);
    // Two panels of one image and region: each finds its own place, in order.
    expect(panelMoves([a, a], [a, b, a])).to.deep.equal([0, 2]);
    // Another image at the old place is another panel.
    expect(panelMoves([a], [c])).to.deep.equal([null]);
  });

  describe('through the API', () => {
    let app: Awaited<ReturnType<typeof mountApp>>;
    let s: ReviewScene;
    before(async () => {
      app = await mountApp();
      s = await reviewScene(app.url);
    });
    after(() => app.close());

    it('when the panels of a figure are swapped and one is then removed, then a thread on panel b moves to its new place and then to the whole figure, its comments untouched', async () => {
      const images: [string, string] = [await imageWithOriginal(s.projectId, s.people.researcher, 3), await imageWithOriginal(s.projectId, s.people.researcher, 4)];
      const figure = await makeFigure(s.researcher, s.projectId, images);
      const opened = await s.reviewer.post(figureThreadsPath(s.projectId, figure.id), { anchor: { kind: 'panel', panel: 1 }, body: 'Panel b: is this the same etch as a?' });
      expect(opened.status, JSON.stringify(opened.body)).to.equal(201);
      const anchorOf = async () => (await sql<{ anchor: unknown }>('SELECT anchor FROM comment_threads WHERE id = $1', [opened.body.id]))[0]!.anchor;
      const current = async () => (await s.researcher.get(`${figuresPath(s.projectId)}/${figure.id}`)).body;

      const before = await current();
      const swapped = await s.researcher.patch(`${figuresPath(s.projectId)}/${figure.id}`, { version: before.version, panels: [before.panels[1], before.panels[0]] });
      expect(swapped.status, JSON.stringify(swapped.body)).to.equal(200);
      expect(await anchorOf()).to.deep.equal({ kind: 'panel', panel: 0 });

      const now = await current();
      const removed = await s.researcher.patch(`${figuresPath(s.projectId)}/${figure.id}`, { version: now.version, panels: [now.panels[1]] });
      expect(removed.status, JSON.stringify(removed.body)).to.equal(200);
      expect(await anchorOf()).to.deep.equal({ kind: 'figure' });
      const [comment] = await sql<{ body: string }>('SELECT body FROM comments WHERE thread_id = $1', [opened.body.id]);
      expect(comment!.body).to.equal('Panel b: is this the same etch as a?');
    });
  });
});
