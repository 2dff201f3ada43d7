import { expect } from 'chai';
import type { Locator } from 'playwright-core';
import { TEST_PASSWORD } from '../support/fixtures';
import { runningServer } from '../support/test-server';
import { chromiumPerTest } from './support/app-session';
import { signInThroughForm } from './support/browser';
import { expectCount, expectNoForeignRequests, expectText, expectValue } from './support/page-checks';
import { clickAt, expectPointsNear, smoothTiff, uploadReady, viewerCanvas, viewerPath, viewerScene, type ViewerScene } from './support/viewer-scene';

type Pt = [number, number];

/** The main image: 2000 × 1500 px at 0.5 µm/px; the compared one of the same location: 1000 × 750 px at 1.0 µm/px. */
const MAIN = { width: 2000, height: 1500 };
const OTHER = { width: 1000, height: 750 };
/**
 * The pairs clicked. Hand-computed fit: the main vector (200, 100) matches the other's (100, 50), so the
 * compared image is drawn at 2 ×, unturned, shifted by (900, 700) − 2·(455, 355) = (−10, −10).
 */
const PAIRS: { image: Pt; other: Pt }[] = [
  { image: [900, 700], other: [455, 355] },
  { image: [1100, 800], other: [555, 405] },
];
/** How far a stored point may lie from where the mouse clicked, in image px (at most a screen px either way). */
const CLICK_TOLERANCE_PX = 1.5;

/**
 * Page coordinates of an image point in a pane whose view is centred on `centre` at `scale` screen px
 * per image px, from the pane's box at the moment of asking (the compared pane's height changes as
 * the alignment card grows).
 */
async function pointIn(pane: Locator, centre: Pt, scale: number, [x, y]: Pt): Promise<{ x: number; y: number }> {
  const box = (await pane.boundingBox())!;
  const size = await pane.evaluate((el) => ({ w: el.clientWidth, h: el.clientHeight }));
  return { x: box.x + size.w / 2 + (x - centre[0]) * scale, y: box.y + size.h / 2 + (y - centre[1]) * scale };
}

describe('e2e: aligning a co-located image by point pairs and laying it over in Chromium', function () {
  this.timeout(120_000);
  const session = chromiumPerTest();
  let scene: ViewerScene;
  let mainId: string;
  let otherId: string;

  before(async function () {
    this.timeout(180_000);
    scene = await viewerScene();
    mainId = await uploadReady(scene, await smoothTiff(MAIN.width, MAIN.height, 0.5, 11), 'field-light.tif');
    otherId = await uploadReady(scene, await smoothTiff(OTHER.width, OTHER.height, 1.0, 12), 'field-sem.tif');
    const drawn = await scene.client.post(`/api/projects/${scene.project.id}/images/${otherId}/annotations`, {
      classId: scene.classes['Oxide particle'],
      kind: 'rectangle',
      points: [[400, 300], [460, 300], [460, 340], [400, 340]],
      label: '',
    });
    expect(drawn.status, JSON.stringify(drawn.body)).to.equal(201);
  });


  it('when a researcher picks two point pairs by mouse and sets the opacity, then the similarity is saved and the overlay is drawn at that opacity', async () => {
    const { page } = session.app;
    await signInThroughForm(session.app, scene.user.email, TEST_PASSWORD);
    await page.goto(session.app.url(viewerPath(scene.project.id, mainId)));
    const main = viewerCanvas(page);
    await main.locator('.stage canvas').first().waitFor();

    await page.getByRole('tab', { name: 'Image' }).click();
    await page.getByRole('button', { name: 'Compare side by side with field-sem.tif' }).click();
    const compared = page.getByRole('application', { name: 'Compared micrograph' });
    await compared.locator('.stage canvas').first().waitFor();
    const card = page.getByRole('region', { name: 'Alignment with the main image' });
    await expectText(card, '1 annotation of this image shown (read-only).');

    // Fit, then 1:1: the main view is centred on the image centre at 1 screen px per px; the compared pane,
    // linked by µm (0.5 / 1.0), is centred on (500, 375) at 2 screen px per px.
    await main.click({ position: { x: 5, y: 5 } });
    await page.keyboard.press('0');
    await page.getByRole('button', { name: 'Actual pixels', exact: true }).click();
    await expectText(main.locator('.readout'), /(^|\D)100 %/);
    const onMain = (p: Pt) => pointIn(main, [MAIN.width / 2, MAIN.height / 2], 1, p);
    const onOther = (p: Pt) => pointIn(compared, [OTHER.width / 2, OTHER.height / 2], 2, p);

    await card.getByRole('button', { name: 'Align by point pairs' }).click();
    await expectText(card.getByRole('status').first(), 'Pair 1: click a distinct feature on the main image');
    await clickAt(page, await onMain(PAIRS[0]!.image));
    await expectText(card.getByRole('status').first(), 'Pair 1: click the same feature on field-sem.tif');
    await clickAt(page, await onOther(PAIRS[0]!.other));

    // Bad input first: the second pair starts on the same spot as the first, and the card refuses it.
    await clickAt(page, await onMain(PAIRS[0]!.image));
    await clickAt(page, await onOther(PAIRS[1]!.other));
    await expectText(card.getByRole('alert'), /Points 1 and 2 on the main image are the same place/);
    expect(await card.getByRole('button', { name: 'Save alignment' }).isDisabled()).to.equal(true);
    await card.getByRole('button', { name: 'Undo last point' }).click();
    await card.getByRole('button', { name: 'Undo last point' }).click();
    await expectCount(card.getByRole('list', { name: 'Picked point pairs' }).getByRole('listitem'), 1);

    await clickAt(page, await onMain(PAIRS[1]!.image));
    await clickAt(page, await onOther(PAIRS[1]!.other));
    await expectText(card, 'Two pairs fit exactly');
    await expectText(card, /Compared image drawn at 2\.0\d\d ×|Compared image drawn at 1\.9\d\d ×/);
    await card.getByRole('button', { name: 'Save alignment' }).click();
    await expectText(card, /saved by/);
    await expectText(page.locator('.compare-head .link-note'), 'Linked by the saved alignment');

    const slider = card.getByRole('slider', { name: 'Overlay opacity' });
    await slider.fill('30');
    await expectText(card, 'Opacity 30 %');
    // The overlaid image's canvas on the main pane, faded by CSS (alignment-layer.ts), between the
    // micrograph's tiles and its annotations: right after the tile canvas, before the shapes'.
    await expectValue('overlay opacity', async () => (await main.locator('canvas.alignment-overlay').evaluateAll((cs) => cs.map((c) => (c as HTMLCanvasElement).style.opacity))).includes('0.3'), true);
    const order = await main.locator('.stage canvas').evaluateAll((cs) => cs.map((c) => (c.classList.contains('alignment-overlay') ? 'overlay' : 'stage')));
    expect(order.slice(0, 3), 'tiles, the overlaid image, then the shapes').to.deep.equal(['stage', 'overlay', 'stage']);

    const rows = await runningServer().ctx.dataSource.query('SELECT image_id, other_image_id, kind, pairs, transform FROM image_alignments WHERE image_id = $1', [mainId]);
    expect(rows).to.have.length(1);
    expect(rows[0]).to.include({ image_id: mainId, other_image_id: otherId, kind: 'similarity' });
    expectPointsNear('main points', rows[0].pairs.map((p: { image: Pt }) => p.image), PAIRS.map((p) => p.image), CLICK_TOLERANCE_PX);
    expectPointsNear('compared points', rows[0].pairs.map((p: { other: Pt }) => p.other), PAIRS.map((p) => p.other), CLICK_TOLERANCE_PX / 2);
    // Hand-computed above: a = d = 2, b = c = 0, e = f = −10 (clicks land within a pixel, so a few hundredths on the scale).
    const t = rows[0].transform;
    expect(t.a).to.be.closeTo(2, 0.05);
    expect(t.d).to.be.closeTo(2, 0.05);
    expect(t.b).to.be.closeTo(0, 0.05);
    expect(t.c).to.be.closeTo(0, 0.05);
    expect(t.e).to.be.closeTo(-10, 4);
    expect(t.f).to.be.closeTo(-10, 4);
    const events = await runningServer().ctx.dataSource.query(`SELECT action FROM activity_events WHERE image_id = $1 AND action LIKE 'alignment.%'`, [mainId]);
    expect(events.map((e: { action: string }) => e.action)).to.deep.equal(['alignment.saved']);

    // Hidden, then shown again after a reload: the saved alignment is read back, not redone.
    await card.getByRole('button', { name: 'Hide overlay' }).click();
    await expectCount(main.locator('canvas.alignment-overlay'), 0);
    await page.reload();
    await page.getByRole('tab', { name: 'Image' }).click();
    await page.getByRole('button', { name: 'Compare side by side with field-sem.tif' }).click();
    await expectText(page.getByRole('region', { name: 'Alignment with the main image' }), /Scale, rotation and shift from 2 point pairs, saved by/);
    expectNoForeignRequests(session.app);
  });
});
