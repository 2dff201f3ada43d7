import { expect } from 'chai';
import type { Browser, Locator, Page } from 'playwright-core';
import { TEST_PASSWORD } from '../support/fixtures';
import { runningServer } from '../support/test-server';
import { explainFailure, freshApp, type WatchedApp } from './support/app-session';
import { launchBrowser, signInThroughForm } from './support/browser';
import { expectCount, expectNoForeignRequests, expectNoText, expectText, expectValue } from './support/page-checks';
import { smoothTiff, uploadReady, viewerScene, type ViewerScene } from './support/viewer-scene';

const W = 900;
const H = 600;
const UM_PER_PX = 0.5;
/** The bond interface drawn through the API: straight across at mid height. */
const INTERFACE_Y = 300;
/** The outlined region: x 150–750, y 170–430, i.e. 130 px (65 µm) either side of the interface. */
const ZONE: [number, number][] = [[150, 170], [750, 170], [750, 430], [150, 430]];

type Pt = [number, number];

const measurePath = (projectId: string, imageId: string) => `/projects/${projectId}/images/${imageId}/measure`;

/** The rows of one titled group of the saved-result card (a sub-band). */
const groupValue = (page: Page, group: string, label: string): Locator =>
  page
    .locator('ef-measure-result h3', { hasText: group })
    .locator('xpath=following-sibling::dl[1]')
    .locator('div')
    .filter({ has: page.locator('dt', { hasText: label }) })
    .locator('dd');

describe('e2e: measuring inside an outlined region with sub-bands, V_V from a saved point count, and results that go stale when an interface is redrawn', function () {
  this.timeout(120_000);
  let browser: Browser;
  let closeBrowser: () => Promise<void>;
  let scene: ViewerScene;
  let app: WatchedApp | undefined;

  before(async function () {
    this.timeout(180_000);
    ({ browser, close: closeBrowser } = await launchBrowser());
    scene = await viewerScene();
  });

  after(async () => {
    await closeBrowser?.();
  });

  beforeEach(async () => {
    app = await freshApp(browser);
  });

  afterEach(async function () {
    await explainFailure(this.currentTest, app);
    await app?.context.close();
    app = undefined;
  });

  /** A calibrated image (0.5 µm/px) with one bond interface across it, and its interface's id. */
  async function laminate(name: string, seed: number): Promise<{ imageId: string; interfaceId: string }> {
    const imageId = await uploadReady(scene, await smoothTiff(W, H, UM_PER_PX, seed), name);
    const drawn = await scene.client.post(`/api/projects/${scene.project.id}/images/${imageId}/annotations`, {
      classId: scene.classes['Bond interface'], kind: 'polyline', points: [[0, INTERFACE_Y], [W, INTERFACE_Y]], label: '',
    });
    expect(drawn.status, JSON.stringify(drawn.body)).to.equal(201);
    return { imageId, interfaceId: drawn.body.id as string };
  }

  it('when a researcher measures inside an outlined region with sub-bands 0-20-40-60 µm, then the pattern is clipped to the outline, the edges are drawn, and each sub-band has its own result, also on the summary page, whose field figure is clipped the same way', async () => {
    const { imageId } = await laminate('zoned.tif', 5);
    const zone = await scene.client.post(`/api/projects/${scene.project.id}/images/${imageId}/annotations`, {
      classId: scene.classes['Deformation zone'], kind: 'rectangle', points: ZONE, label: 'near bond',
    });
    expect(zone.status, JSON.stringify(zone.body)).to.equal(201);
    const { page } = app!;
    await signInThroughForm(app!, scene.user.email, TEST_PASSWORD);
    await page.goto(app!.url(measurePath(scene.project.id, imageId)));
    await expectText(page.getByRole('heading', { level: 1 }), 'Measure zoned.tif');

    await page.getByRole('combobox', { name: 'Where' }).selectOption({ label: 'Deformation zone · near bond' });
    await page.getByRole('combobox', { name: 'Line direction' }).selectOption('vertical');
    await page.getByRole('spinbutton', { name: 'Number of lines' }).fill('3');
    await page.getByRole('spinbutton', { name: 'Number of lines' }).dispatchEvent('change');
    await page.getByRole('textbox', { name: 'Sub-band edges in µm' }).fill('0, 20, 40, 60');
    await page.getByRole('textbox', { name: 'Sub-band edges in µm' }).dispatchEvent('change');

    const pattern = page.getByRole('img', { name: 'Test pattern over the micrograph' });
    // 20, 40 and 60 µm on both sides of the one interface, inside the outline: six dashed edges.
    await expectCount(pattern.locator('polyline.sub-band-edge'), 6);
    await expectCount(pattern.locator('line.test-line.counted'), 3);
    const pieces = await pattern.locator('line.test-line.counted').evaluateAll((ls) => ls.map((l) => ['x1', 'y1', 'x2', 'y2'].map((a) => Number(l.getAttribute(a)))));
    for (const [x1, y1, x2, y2] of pieces) {
      expect(x1, 'a counted line runs inside the outline').to.be.within(150, 750);
      expect(Math.min(y1!, y2!)).to.be.closeTo(170, 1e-6);
      expect(Math.max(y1!, y2!)).to.be.closeTo(430, 1e-6);
      expect(x2).to.equal(x1);
    }

    // One mark per sub-band on the first counted line: 10 px (5 µm), 60 px (30 µm) and 100 px (50 µm) from the interface.
    const x = pieces[0]![0]!;
    const toPage = async ([px, py]: Pt) => {
      await pattern.scrollIntoViewIfNeeded();
      const box = (await pattern.boundingBox())!;
      return { x: box.x + (px * box.width) / W, y: box.y + (py * box.height) / H };
    };
    const tally = page.getByRole('region', { name: 'Live counts' });
    const ys = [INTERFACE_Y + 10, INTERFACE_Y - 60, INTERFACE_Y + 100];
    for (const [n, y] of ys.entries()) {
      const p = await toPage([x, y]);
      await page.mouse.click(p.x, p.y);
      await expectText(tally, `from ${n + 1} confirmed marks`);
    }
    // A click outside the outline adds nothing.
    const outside = await toPage([x, 500]);
    await page.mouse.click(outside.x, outside.y);
    await page.waitForTimeout(300);
    await expectText(tally, 'from 3 confirmed marks');
    await expectText(tally.getByRole('list', { name: 'Counts per sub-band' }), /0–20 µm: 1\s*20–40 µm: 1\s*40–60 µm: 1/);

    await page.getByRole('button', { name: 'Save measurement' }).click();
    await expectText(page.getByRole('heading', { name: /^Saved result/ }), 'region “near bond”');
    // Each sub-band: 3 lines × 2 sides × 40 px × 0.5 µm/px = 120 µm of line, P = 1, l̄ = 120 µm (hand-computed;
    // l̄ = L / P, ASTM E112 lineal intercept). The whole field: 3 × 260 px × 0.5 = 390 µm, P = 3.
    for (const group of ['0–20', '20–40', '40–60']) {
      const title = `Sub-band ${group}`;
      await expectText(groupValue(page, title, 'Total test line length'), /120\.0\s*µm/);
      await expectText(groupValue(page, title, 'P (intersections)'), '1');
      await expectText(groupValue(page, title, 'Mean lineal intercept l̄'), /120\.00\s*µm/);
    }
    const stored = await runningServer().ctx.dataSource.query('SELECT definition, result FROM measurements WHERE image_id = $1', [imageId]);
    expect(stored).to.have.length(1);
    expect(stored[0].definition.where).to.deep.equal({ type: 'region', annotationId: zone.body.id });
    expect(stored[0].definition.distanceBinsUm).to.deep.equal([0, 20, 40, 60]);
    expect(stored[0].result.lineLengthUm).to.be.closeTo(390, 1e-6);

    const [{ specimen_id: specimenId }] = await runningServer().ctx.dataSource.query('SELECT specimen_id FROM images WHERE id = $1', [imageId]);
    await page.goto(app!.url(`/projects/${scene.project.id}/specimens/${specimenId}/grain-size`));
    const byDistance = page.getByRole('region', { name: 'l̄ by distance from the bond interfaces' });
    await expectCount(byDistance.locator('tbody tr'), 3);
    const first = byDistance.locator('tbody tr').first();
    await expectText(first.locator('th'), 'region “near bond” · 0–20 µm');
    await expectText(first.locator('td').nth(0), '1');
    await expectText(first.locator('td').nth(1), /120\.00\s*µm/);
    await expectCount(byDistance.locator('canvas'), 1);
    // The table per layer and direction has the field once, with its whole totals (3 intersections on 390 µm), and no sub-band.
    const layers = page.getByRole('table', { name: /^Mean lineal intercept per layer band and direction/ });
    await expectCount(layers.locator('tbody th'), 1);
    await expectText(layers.locator('tbody th').first(), /^region “near bond” · /);
    await expectText(layers.locator('tbody td').nth(0), '1');
    await expectText(layers.locator('tbody td').nth(5), /^3 P on 390/);
    await expectNoText(layers, 'µm from the nearest bond interface');
    // The field's figure draws the lines as counted, clipped to the outline (x 150–750, y 170–430), and the three marks.
    const drawing = page.getByRole('region', { name: 'Fields' }).getByRole('img', { name: 'Field 1 · zoned.tif · region “near bond”: test lines and marks' });
    await expectCount(drawing.locator('polyline.test-line'), 3);
    await expectCount(drawing.locator('.mark'), 3);
    const drawn = await drawing.locator('polyline.test-line').evaluateAll((ls) => ls.map((l) => l.getAttribute('points')!.split(' ').map((q) => q.split(',').map(Number))));
    for (const [px, py] of drawn.flat()) {
      expect(px, 'a drawn line lies inside the outline').to.be.within(150, 750);
      expect(py, 'a drawn line lies inside the outline').to.be.within(170 - 1e-6, 430 + 1e-6);
    }
    expectNoForeignRequests(app!);
  });

  it('when a researcher counts intercepts of one phase in a region and takes V_V from the saved point count of that region, then l̄ is divided by it and the result names the count', async () => {
    const { imageId } = await laminate('two-phase.tif', 7);
    const zone = await scene.client.post(`/api/projects/${scene.project.id}/images/${imageId}/annotations`, {
      classId: scene.classes['Deformation zone'], kind: 'rectangle', points: ZONE, label: 'ferrite patch',
    });
    expect(zone.status, JSON.stringify(zone.body)).to.equal(201);
    // Grid 40 µm = 80 px centred on (450, 300): x 210, 290 … 690 (7) and y 220, 300, 380 (3) lie in the region: P_T = 21;
    // the 7 points of the middle row marked inside → P_p = 1/3 (hand-computed; ASTM E562 P_p = P_i / P_T).
    const marks = [210, 290, 370, 450, 530, 610, 690].map((x) => ({ x, y: 300, hit: 'inside' }));
    const pc = await scene.client.post(`/api/projects/${scene.project.id}/images/${imageId}/measurements`, {
      kind: 'point_count', grid: { spacingUm: 40 }, where: { type: 'region', annotationId: zone.body.id }, phaseName: 'ferrite', marks,
    });
    expect(pc.status, JSON.stringify(pc.body)).to.equal(201);
    expect(pc.body.result.gridPoints).to.equal(21);

    const { page } = app!;
    await signInThroughForm(app!, scene.user.email, TEST_PASSWORD);
    await page.goto(app!.url(measurePath(scene.project.id, imageId)));
    await expectText(page.getByRole('heading', { level: 1 }), 'Measure two-phase.tif');
    await page.getByRole('combobox', { name: 'Where' }).selectOption({ label: 'Deformation zone · ferrite patch' });
    await page.getByRole('combobox', { name: 'Line direction' }).selectOption('vertical');
    await page.getByRole('spinbutton', { name: 'Number of lines' }).fill('1');
    await page.getByRole('spinbutton', { name: 'Number of lines' }).dispatchEvent('change');
    await page.getByRole('checkbox', { name: /Two-phase/ }).check();
    // The page switches the count on its next render: wait for it rather than read it once.
    await expectValue('a two-phase count counts intercepts', () => page.getByRole('combobox', { name: 'Count' }).inputValue(), 'intercepts');
    await page.getByRole('textbox', { name: 'Phase counted' }).fill('ferrite');
    await page.getByRole('textbox', { name: 'Phase counted' }).dispatchEvent('change');
    const source = page.getByRole('combobox', { name: 'Volume fraction from' });
    await expectText(source.locator(`option[value="${pc.body.id}"]`), /^Point count · ferrite: P_p 33\.3\s*% on region “ferrite patch” \(version 1/);
    await source.selectOption(pc.body.id);

    // One line at x = 450 through the region: 260 px = 130 µm; two crossings by hand → N = 2.
    const pattern = page.getByRole('img', { name: 'Test pattern over the micrograph' });
    await expectCount(pattern.locator('line.test-line.counted'), 1);
    const tally = page.getByRole('region', { name: 'Live counts' });
    for (const [n, y] of [230, 350].entries()) {
      await pattern.scrollIntoViewIfNeeded();
      const box = (await pattern.boundingBox())!;
      await page.mouse.click(box.x + (450 * box.width) / W, box.y + (y * box.height) / H);
      await expectText(tally, `from ${n + 1} confirmed marks`);
    }
    await page.getByRole('button', { name: 'Save measurement' }).click();
    await expectText(page.getByRole('heading', { name: /^Saved result/ }), 'region “ferrite patch”');
    const card = page.locator('ef-measure-result');
    // l̄α = V_V·L / N = (1/3)·130 µm / 2 = 21.67 µm (ASTM E112 two-phase note; hand-computed).
    await expectText(card.locator('dl > div').filter({ has: page.locator('dt', { hasText: 'Mean lineal intercept l̄' }) }).locator('dd').first(), /21\.67\s*µm/);
    await expectText(card, /Volume fraction of ferrite/);
    await expectText(card, '0.333 (from the point count of ferrite on region “ferrite patch”, version 1)');
    const [row] = await runningServer().ctx.dataSource.query('SELECT definition FROM measurements WHERE image_id = $1 AND kind = $2', [imageId, 'intercept']);
    expect(row.definition.phase).to.deep.include({ name: 'ferrite', pointCountId: pc.body.id });
    expectNoForeignRequests(app!);
  });

  it('when the bond interface a saved band measurement used is redrawn, then the page says which line changed and recompute clears it, keeping the old result in the history', async () => {
    const { imageId, interfaceId } = await laminate('redrawn.tif', 6);
    const made = await scene.client.post(`/api/projects/${scene.project.id}/images/${imageId}/measurements`, {
      kind: 'intercept', pattern: { type: 'lines', direction: 'vertical', spacingUm: 100, count: 3 }, where: { type: 'band', band: 1 },
      marks: [{ x: 450, y: 100, line: 1, kind: 'crossing' }],
    });
    expect(made.status, JSON.stringify(made.body)).to.equal(201);
    // Band 1 = y 0–300 on three lines: 3 × 300 px × 0.5 = 450 µm (hand-computed).
    expect(made.body.result.lineLengthUm).to.be.closeTo(450, 1e-6);
    const moved = await scene.client.patch(`/api/projects/${scene.project.id}/images/${imageId}/annotations/${interfaceId}`, { version: 1, points: [[0, 200], [W, 200]] });
    expect(moved.status, JSON.stringify(moved.body)).to.equal(200);

    const { page } = app!;
    await signInThroughForm(app!, scene.user.email, TEST_PASSWORD);
    await page.goto(app!.url(measurePath(scene.project.id, imageId)));
    const saved = page.getByRole('region', { name: 'Saved measurements on this image' });
    const warning = saved.getByRole('alert');
    await expectText(warning, 'Bond interface 1 was redrawn or changed (version 1, now 2).');
    await expectText(warning, 'Recompute');
    await saved.getByRole('button', { name: 'Recompute' }).click();
    await expectNoText(saved, 'was redrawn');
    await expectCount(saved.getByRole('button', { name: 'Recompute' }), 0);
    await saved.getByRole('button', { name: 'Reopen' }).click();
    // The old result stays on record: 3 × 300 px × 0.5 = 450 µm with P = 1 → l̄ 450 µm (hand-computed).
    const earlier = page.getByRole('region', { name: 'Earlier results of this measurement' });
    await expectText(earlier, /Version 1, replaced by a recompute .*l̄ = 450\.00\s*µm/);

    const rows = await runningServer().ctx.dataSource.query('SELECT version, result FROM measurements WHERE image_id = $1', [imageId]);
    expect(rows[0].version).to.equal(2);
    // Band 1 is now y 0–200: 3 × 200 px × 0.5 = 300 µm (hand-computed).
    expect(rows[0].result.lineLengthUm).to.be.closeTo(300, 1e-6);
    const history = await runningServer().ctx.dataSource.query('SELECT version, reason, result FROM measurement_history WHERE image_id = $1', [imageId]);
    expect(history).to.have.length(1);
    expect(history[0]).to.deep.include({ version: 1, reason: 'recomputed' });
    expect(history[0].result.lineLengthUm).to.be.closeTo(450, 1e-6);
    expectNoForeignRequests(app!);
  });
});
