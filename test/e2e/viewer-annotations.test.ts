import { readFile } from 'node:fs/promises';
import { mkdtempSync, rmSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { expect } from 'chai';
import type { Page } from 'playwright-core';
import { TEST_PASSWORD } from '../support/fixtures';
import { runningServer } from '../support/test-server';
import { chooseOption, chromiumPerTest } from './support/app-session';
import { signInThroughForm } from './support/browser';
import { expectCount, expectNoForeignRequests, expectText, expectValue } from './support/page-checks';
import {
  clickAt,
  dragFrom,
  expectPointsNear,
  micrometerTiff,
  openAtActualPixels,
  smoothTiff,
  storedShapes,
  uploadReady,
  viewerCanvas,
  viewerPath,
  viewerScene,
  type ViewerScene,
} from './support/viewer-scene';

const W = 2000;
const H = 1500;
/** How far a stored vertex may lie from where the mouse pressed, in image px (screen px at 1:1). */
const CLICK_TOLERANCE_PX = 2;

type Pt = [number, number];

/** What the researcher draws, in full-resolution image px; all within the middle of the 1:1 view. */
const INTERFACE_1: Pt[] = [[720, 640], [900, 630], [1100, 655], [1280, 645]];
const INTERFACE_2: Pt[] = [[720, 860], [1000, 870], [1280, 855]];
const OUTLINE: Pt[] = [[950, 700], [990, 706], [984, 742], [946, 736]];
const RECT_1: [Pt, Pt] = [[800, 720], [842, 761]];
const RECT_2: [Pt, Pt] = [[1150, 716], [1204, 772]];
const corners = ([[x0, y0], [x1, y1]]: [Pt, Pt]): Pt[] => [[x0, y0], [x1, y0], [x1, y1], [x0, y1]];

const tool = (page: Page, name: string) => page.getByRole('button', { name, exact: true });

describe('e2e: viewer annotations, GeoJSON and calibration in Chromium', function () {
  this.timeout(120_000);
  const session = chromiumPerTest();
  let scene: ViewerScene;
  let drawnId: string;
  let importTargetId: string;
  let refusedId: string;
  let micrometerId: string;
  let scratch: string;

  before(async function () {
    this.timeout(180_000);
    scene = await viewerScene();
    drawnId = await uploadReady(scene, await smoothTiff(W, H, 0.5, 1), 'interface-drawn.tif');
    importTargetId = await uploadReady(scene, await smoothTiff(W, H, 0.5, 2), 'interface-imported.tif');
    refusedId = await uploadReady(scene, await smoothTiff(W, H, 0.5, 3), 'interface-refused.tif');
    micrometerId = await uploadReady(scene, await micrometerTiff(W, 1400, 200, 40), 'stage-micrometer.tif');
    scratch = mkdtempSync(path.join(os.tmpdir(), 'etchfile-geojson-'));
  });

  after(() => {
    if (scratch) rmSync(scratch, { recursive: true, force: true });
  });

  it('when a researcher draws two bond interfaces and three oxide particles with the mouse at 1:1, then the database holds them at the clicked image pixels and a reload lists them', async () => {
    const { page } = session.app;
    await signInThroughForm(session.app, scene.user.email, TEST_PASSWORD);
    const at = await openAtActualPixels(session.app, scene.project.id, drawnId, { width: W, height: H });
    const to = ([x, y]: Pt) => at(x, y);

    // Bond interfaces (the first class, chosen by default): one ended with Enter, one with a double click.
    await expectText(page.getByRole('combobox', { name: 'Class for new shapes' }), 'Bond interface');
    await tool(page, 'Polyline tool').click();
    for (const p of INTERFACE_1) await clickAt(page, to(p));
    await page.keyboard.press('Enter');
    for (const p of INTERFACE_2.slice(0, -1)) await clickAt(page, to(p));
    const last = to(INTERFACE_2.at(-1)!);
    await page.mouse.move(last.x, last.y);
    await page.mouse.dblclick(last.x, last.y);

    await chooseOption(page, page.getByRole('combobox', { name: 'Class for new shapes' }), 'Oxide particle');
    await tool(page, 'Rectangle tool').click();
    await dragFrom(page, to(RECT_1[0]), to(RECT_1[1]));
    await tool(page, 'Polygon tool').click();
    for (const p of OUTLINE) await clickAt(page, to(p));
    await clickAt(page, to(OUTLINE[0]!));
    await tool(page, 'Rectangle tool').click();
    await dragFrom(page, to(RECT_2[0]), to(RECT_2[1]));

    await expectValue('stored annotations', async () => (await storedShapes(drawnId)).length, 5, 15_000);
    const stored = await storedShapes(drawnId);
    expect(stored.map((s) => `${s.kind} ${s.className}`)).to.deep.equal([
      'polyline Bond interface',
      'polyline Bond interface',
      'rectangle Oxide particle',
      'polygon Oxide particle',
      'rectangle Oxide particle',
    ]);
    expectPointsNear('first interface', stored[0]!.points, INTERFACE_1, CLICK_TOLERANCE_PX);
    expectPointsNear('second interface', stored[1]!.points, INTERFACE_2, CLICK_TOLERANCE_PX);
    expectPointsNear('first rectangle', stored[2]!.points, corners(RECT_1), CLICK_TOLERANCE_PX);
    expectPointsNear('outline', stored[3]!.points, OUTLINE, CLICK_TOLERANCE_PX);
    expectPointsNear('second rectangle', stored[4]!.points, corners(RECT_2), CLICK_TOLERANCE_PX);

    await page.reload();
    const list = page.getByRole('list', { name: 'Annotations of this image' });
    await expectCount(list.getByRole('listitem'), 5);
    await expectCount(list.getByRole('button', { name: /^Polyline, Bond interface/ }), 2);
    await expectCount(list.getByRole('button', { name: /^Rectangle, Oxide particle/ }), 2);
    await expectCount(list.getByRole('button', { name: /^Outline, Oxide particle/ }), 1);
    expectNoForeignRequests(session.app);
  });

  it('when a researcher exports the GeoJSON of an image and imports the file onto another image, then the other image holds the same shapes', async () => {
    const { page } = session.app;
    const source = await storedShapes(drawnId);
    expect(source, 'the shapes drawn by the previous test').to.have.length(5);
    await signInThroughForm(session.app, scene.user.email, TEST_PASSWORD);
    await page.goto(session.app.url(viewerPath(scene.project.id, drawnId)));
    await expectCount(page.getByRole('list', { name: 'Annotations of this image' }).getByRole('listitem'), 5);

    const [download] = await Promise.all([page.waitForEvent('download'), page.getByRole('button', { name: 'Export GeoJSON' }).click()]);
    const file = path.join(scratch, download.suggestedFilename());
    await download.saveAs(file);
    const geojson = JSON.parse(await readFile(file, 'utf8'));
    expect(geojson.type).to.equal('FeatureCollection');
    expect(geojson.features).to.have.length(5);
    // Image pixel coordinates as stored (RFC 7946 closes a polygon's ring by repeating its first position).
    const lines = geojson.features.filter((f: { geometry: { type: string } }) => f.geometry.type === 'LineString');
    expect(lines.map((f: { geometry: { coordinates: Pt[] } }) => f.geometry.coordinates)).to.deep.equal([source[0]!.points, source[1]!.points]);
    const rings = geojson.features.filter((f: { geometry: { type: string } }) => f.geometry.type === 'Polygon');
    expect(rings.map((f: { geometry: { coordinates: Pt[][] } }) => f.geometry.coordinates[0])).to.deep.equal(source.slice(2).map((s) => [...s.points, s.points[0]]));

    await page.goto(session.app.url(viewerPath(scene.project.id, importTargetId)));
    await viewerCanvas(page).waitFor();
    await expectText(page.getByText('No annotations on this image yet.'), 'No annotations');
    const [chooser] = await Promise.all([page.waitForEvent('filechooser'), page.getByRole('button', { name: 'Import GeoJSON' }).click()]);
    await chooser.setFiles(file);
    await expectText(page.getByRole('status').filter({ hasText: 'imported' }), `5 shapes imported from ${path.basename(file)}.`);
    await expectCount(page.getByRole('list', { name: 'Annotations of this image' }).getByRole('listitem'), 5);

    const imported = await storedShapes(importTargetId);
    expect(imported.map((s) => `${s.kind} ${s.className}`)).to.deep.equal(source.map((s) => `${s.kind} ${s.className}`));
    imported.forEach((s, i) => expectPointsNear(`imported ${s.kind} ${i}`, s.points, source[i]!.points, 1e-6));
    expectNoForeignRequests(session.app);
  });

  it('when a researcher closes an outline whose edges cross, then it is refused with the reason and nothing is stored', async () => {
    const { page } = session.app;
    await signInThroughForm(session.app, scene.user.email, TEST_PASSWORD);
    const at = await openAtActualPixels(session.app, scene.project.id, refusedId, { width: W, height: H });
    await chooseOption(page, page.getByRole('combobox', { name: 'Class for new shapes' }), 'Oxide particle');
    await tool(page, 'Polygon tool').click();
    // A bow tie: the edge from the first to the second corner crosses the one from the third to the fourth.
    for (const [x, y] of [[900, 700], [1100, 820], [1100, 700], [900, 820]] as Pt[]) await clickAt(page, at(x, y));
    await page.keyboard.press('Enter');

    await expectText(page.getByRole('alert'), 'The outline crosses itself');
    await page.waitForTimeout(1000);
    expect(await storedShapes(refusedId)).to.deep.equal([]);
    await expectText(page.getByText(/No annotations on this image yet/), 'No annotations');
    expectNoForeignRequests(session.app);
  });

  it('when a researcher pulls a new vertex out of an outline edge and Alt+clicks another vertex away, then the stored outline has the new vertex and not the removed one', async () => {
    const { page } = session.app;
    expect(await storedShapes(refusedId), 'the image the previous test left empty').to.deep.equal([]);
    await signInThroughForm(session.app, scene.user.email, TEST_PASSWORD);
    const at = await openAtActualPixels(session.app, scene.project.id, refusedId, { width: W, height: H });
    await chooseOption(page, page.getByRole('combobox', { name: 'Class for new shapes' }), 'Oxide particle');
    await tool(page, 'Polygon tool').click();
    const square: Pt[] = [[900, 700], [1100, 700], [1100, 900], [900, 900]];
    for (const [x, y] of square) await clickAt(page, at(x, y));
    await clickAt(page, at(900, 700));
    await expectValue('stored outlines', async () => (await storedShapes(refusedId)).length, 1, 15_000);

    await tool(page, 'Select tool').click();
    await clickAt(page, at(1000, 780));
    // The round handle in the middle of the top edge, pulled up by 50 px.
    await dragFrom(page, at(1000, 700), at(1000, 650));
    await expectValue('vertices after adding one', async () => (await storedShapes(refusedId))[0]!.points.length, 5, 15_000);
    expectPointsNear('outline with the new vertex', (await storedShapes(refusedId))[0]!.points, [[900, 700], [1000, 650], [1100, 700], [1100, 900], [900, 900]], CLICK_TOLERANCE_PX);

    await page.keyboard.down('Alt');
    await clickAt(page, at(1100, 900));
    await page.keyboard.up('Alt');
    await expectValue('vertices after removing one', async () => (await storedShapes(refusedId))[0]!.points.length, 4, 15_000);
    expectPointsNear('outline without the removed vertex', (await storedShapes(refusedId))[0]!.points, [[900, 700], [1000, 650], [1100, 700], [900, 900]], CLICK_TOLERANCE_PX);

    // A triangle cannot lose a vertex: the reason shows and the stored outline stays as it was.
    await page.keyboard.down('Alt');
    await clickAt(page, at(1000, 650));
    await page.keyboard.up('Alt');
    await expectValue('vertices after removing another', async () => (await storedShapes(refusedId))[0]!.points.length, 3, 15_000);
    await page.keyboard.down('Alt');
    await clickAt(page, at(900, 900));
    await page.keyboard.up('Alt');
    await expectText(page.getByRole('alert'), 'An outline needs at least 3 vertices');
    await page.waitForTimeout(500);
    expect((await storedShapes(refusedId))[0]!.points).to.have.length(3);
    expectNoForeignRequests(session.app);
  });

  it('when a researcher drags the calibrate tool along 100 µm of a stage micrometer and enters the length, then the stored pixel size is 0.25 µm', async () => {
    const { page } = session.app;
    await signInThroughForm(session.app, scene.user.email, TEST_PASSWORD);
    const at = await openAtActualPixels(session.app, scene.project.id, micrometerId, { width: W, height: 1400 });
    await expectText(page.locator('header .calibration-chip'), 'Uncalibrated');

    await tool(page, 'Calibrate').click();
    // Ticks every 40 px from x = 200: the ticks at x = 800 and x = 1200 are ten divisions (100 µm) apart.
    await dragFrom(page, at(800, 700), at(1200, 700));
    const card = page.getByRole('region', { name: 'Calibrate from the drawn line' });
    await expectText(card, 'The line is');
    await card.getByRole('spinbutton', { name: 'True length' }).fill('100');
    await expectText(card, 'Pixel size:');
    await card.getByRole('button', { name: 'Save pixel size' }).click();
    await expectCount(card, 0);

    // 100 µm / 400 px = 0.25 µm per pixel (hand-computed from the tick spacing).
    const [row] = await runningServer().ctx.dataSource.query('SELECT pixel_size_um, pixel_size_source FROM images WHERE id = $1', [micrometerId]);
    expect(row.pixel_size_source).to.equal('drawn');
    expect(row.pixel_size_um).to.be.closeTo(0.25, 0.0025);
    await expectCount(page.locator('header .calibration-chip.uncalibrated'), 0);
    expectNoForeignRequests(session.app);
  });

  it('when a reviewer opens an image in the viewer, then no drawing, calibrating or importing tools are offered', async () => {
    const { page } = session.app;
    await signInThroughForm(session.app, scene.reviewer.email, TEST_PASSWORD);
    const projectLoaded = page.waitForResponse((r) => new URL(r.url()).pathname === `/api/projects/${scene.project.id}` && r.status() === 200);
    await page.goto(session.app.url(viewerPath(scene.project.id, drawnId)));
    await projectLoaded;
    await viewerCanvas(page).waitFor();
    await tool(page, 'Select tool').waitFor();
    await page.getByRole('button', { name: 'Export GeoJSON' }).waitFor();
    // The rights came with the project; give the page a moment to draw from them.
    await page.waitForTimeout(500);

    for (const name of ['Polyline tool', 'Polygon tool', 'Rectangle tool', 'Point tool', 'Ruler tool', 'Angle tool', 'Note tool', 'Calibrate', 'Import GeoJSON', 'Undo']) {
      expect(await tool(page, name).count(), `${name} offered to a reviewer`).to.equal(0);
    }
    expect(await page.getByRole('combobox', { name: 'Class for new shapes' }).count()).to.equal(0);
    expectNoForeignRequests(session.app);
  });
});
