import { expect } from 'chai';
import type { Browser, Locator, Page } from 'playwright-core';
import sharp from 'sharp';
import { TEST_PASSWORD } from '../support/fixtures';
import { etchedMicrograph, voronoiLabels } from '../support/synthetic-micrograph';
import { runningServer } from '../support/test-server';
import { explainFailure, freshApp, type WatchedApp } from './support/app-session';
import { launchBrowser, signInThroughForm } from './support/browser';
import { expectCount, expectNoForeignRequests, expectText, expectValue } from './support/page-checks';
import { smoothTiff, uploadReady, viewerScene, type ViewerScene } from './support/viewer-scene';

const W = 900;
const H = 600;
const UM_PER_PX = 0.5;
/** The bond interface drawn through the API: straight across the image at mid height. */
const INTERFACE_Y = 300;

type Pt = [number, number];

/**
 * A two-layer laminate: an etched grain structure (seeded Voronoi, finer grains above the interface than
 * below), with a dark bond line, written as a TIFF whose resolution tags say 0.5 µm per pixel.
 */
async function laminateTiff(): Promise<Buffer> {
  const fine = voronoiLabels(W, INTERFACE_Y, 160, 11);
  const coarse = voronoiLabels(W, H - INTERFACE_Y, 60, 12);
  const labels = new Int32Array(W * H);
  labels.set(fine, 0);
  labels.set(coarse.map((l) => l + 1000), W * INTERFACE_Y);
  const png = await etchedMicrograph(labels, W, H, 11);
  return sharp(png).toColourspace('b-w').tiff({ compression: 'lzw', xres: 1000 / UM_PER_PX, yres: 1000 / UM_PER_PX }).toBuffer();
}

const measurePath = (projectId: string, imageId: string) => `/projects/${projectId}/images/${imageId}/measure`;

/** The value beside a label in the saved-result card. */
const resultValue = (page: Page, label: string): Locator =>
  page.locator('ef-measure-result dl > div').filter({ has: page.locator('dt', { hasText: label }) }).locator('dd');

/** A number with its length unit, in µm ("812.5 µm", "1.250 mm"). */
function lengthUm(text: string): number {
  const m = /([\d.]+)\s*(µm|mm)/.exec(text);
  if (!m) expect.fail(`no length in ${JSON.stringify(text)}`);
  return Number(m[1]) * (m[2] === 'mm' ? 1000 : 1);
}

describe('e2e: measuring grain size by intercepts in Chromium', function () {
  this.timeout(120_000);
  let browser: Browser;
  let closeBrowser: () => Promise<void>;
  let scene: ViewerScene;
  let laminateId: string;
  let uncalibratedId: string;
  let app: WatchedApp | undefined;

  before(async function () {
    this.timeout(180_000);
    ({ browser, close: closeBrowser } = await launchBrowser());
    scene = await viewerScene();
    laminateId = await uploadReady(scene, await laminateTiff(), 'laminate.tif');
    uncalibratedId = await uploadReady(scene, await smoothTiff(1200, 900, null, 9), 'uncalibrated.tif');
    const drawn = await scene.client.post(`/api/projects/${scene.project.id}/images/${laminateId}/annotations`, {
      classId: scene.classes['Bond interface'],
      kind: 'polyline',
      points: [[0, INTERFACE_Y], [W, INTERFACE_Y]],
      label: '',
    });
    expect(drawn.status, JSON.stringify(drawn.body)).to.equal(201);
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

  it('when a researcher counts a layer band with accepted suggestions and two marks of their own, then the saved row holds every mark, a reload shows the same l̄ and G, and the summary page draws the field with its lines and marks', async () => {
    const { page } = app!;
    await signInThroughForm(app!, scene.user.email, TEST_PASSWORD);
    await page.goto(app!.url(measurePath(scene.project.id, laminateId)));
    await expectText(page.getByRole('heading', { level: 1 }), 'Measure laminate.tif');

    await page.getByRole('combobox', { name: 'Measurement kind' }).selectOption('intercept');
    const where = page.getByRole('combobox', { name: 'Where' });
    await expectCount(where.locator('option', { hasText: 'Layer band 1' }), 1);
    await where.selectOption({ label: 'Layer band 1' });
    await page.getByRole('combobox', { name: 'Pattern' }).selectOption('lines');
    await page.getByRole('combobox', { name: 'Line direction' }).selectOption('horizontal');
    await page.getByRole('combobox', { name: 'Count' }).selectOption('intersections');
    const pattern = page.getByRole('img', { name: 'Test pattern over the micrograph' });
    const counted = pattern.locator('line.test-line.counted');
    await counted.first().waitFor({ state: 'attached' });

    await page.getByRole('button', { name: 'Suggest crossings' }).click();
    const note = page.getByRole('status').filter({ hasText: 'suggestions in' });
    await expectText(note, /\d+ suggestions in/);
    const suggested = Number(/(\d+) suggestions in/.exec(await note.innerText())![1]);
    expect(suggested, 'crossings suggested on an etched structure').to.be.above(5);
    await page.getByRole('button', { name: 'Accept all suggestions' }).click();
    const tally = page.getByRole('region', { name: 'Live counts' });
    await expectText(tally, `from ${suggested} confirmed marks`);

    // Two marks by hand, each in the middle of the widest gap between marks on a counted line of band 1.
    const toPage = async ([x, y]: Pt) => {
      // Accepting suggestions can scroll the page: bring the pattern into view and measure it at each click.
      await pattern.scrollIntoViewIfNeeded();
      const box = (await pattern.boundingBox())!;
      return { x: box.x + (x * box.width) / W, y: box.y + (y * box.height) / H };
    };
    const pieces = await counted.evaluateAll((ls) => ls.map((l) => ['x1', 'y1', 'x2', 'y2'].map((a) => Number(l.getAttribute(a)))));
    const [x1, y, x2] = pieces.find(([, ya]) => ya! < INTERFACE_Y)!;
    expect(y, 'a counted line lies in band 1, above the interface').to.be.below(INTERFACE_Y);
    const handMarks: Pt[] = [];
    for (let n = 0; n < 2; n++) {
      const rows = await page.locator('ol.marks li').allTextContents();
      const onLine = rows.map((r) => /\((\d+), (\d+)\) px/.exec(r)).filter((m) => m && Math.abs(Number(m[2]) - y!) < 1).map((m) => Number(m![1]));
      const stops = [Math.min(x1!, x2!), ...onLine, ...handMarks.map((p) => p[0]), Math.max(x1!, x2!)].sort((a, b) => a - b);
      let best = 0;
      for (let i = 1; i < stops.length; i++) if (stops[i]! - stops[i - 1]! > stops[best + 1]! - stops[best]!) best = i - 1;
      const at: Pt = [Math.round((stops[best]! + stops[best + 1]!) / 2), y!];
      expect(stops[best + 1]! - stops[best]!, 'room for a mark of my own').to.be.above(30);
      const p = await toPage(at);
      await page.mouse.click(p.x, p.y);
      handMarks.push(at);
      await expectText(tally, `from ${suggested + n + 1} confirmed marks`);
    }

    await page.getByRole('button', { name: 'Save measurement' }).click();
    await expectText(page.getByRole('heading', { name: /^Saved result/ }), 'band 1');
    await expectText(resultValue(page, 'ASTM grain size G'), /\d/);
    // White space as the page checks see it (the units follow a no-break space).
    const shown = async (label: string) => (await resultValue(page, label).innerText()).replace(/\s+/g, ' ').trim();
    const lBar = await shown('Mean lineal intercept l̄');
    const g = await shown('ASTM grain size G');
    const lineUm = lengthUm(await resultValue(page, 'Total test line length').innerText());
    const intersections = Number((await resultValue(page, 'P (intersections)').innerText()).trim());

    // l̄ = L / P (ASTM E112-13, §3.2 lineal intercept definitions); G = −6.6439·log10(l̄ in mm) − 3.2877
    // (ASTM E112-13, Table 4 relation; the constants from memory, checked against its row G 7 ↔ l̄ 0.0283 mm).
    expect(intersections, 'P counts every accepted and hand-placed mark').to.be.at.least(suggested + 2);
    expect(lengthUm(lBar)).to.be.closeTo(lineUm / intersections, 0.01 + lineUm / intersections / 1000);
    expect(Number(g)).to.be.closeTo(-6.6439 * Math.log10(lineUm / intersections / 1000) - 3.2877, 0.06);

    const rows = await runningServer().ctx.dataSource.query('SELECT definition FROM measurements WHERE image_id = $1', [laminateId]);
    expect(rows, 'one saved measurement').to.have.length(1);
    const marks: { x: number; y: number; status: string }[] = rows[0].definition.marks;
    expect(marks).to.have.length(suggested + 2);
    expect(marks.every((m) => m.status === 'confirmed'), 'every stored mark confirmed').to.equal(true);
    for (const [hx, hy] of handMarks) {
      expect(marks.some((m) => Math.hypot(m.x - hx, m.y - hy) <= 1), `a stored mark at (${hx}, ${hy})`).to.equal(true);
    }

    await page.reload();
    const saved = page.getByRole('region', { name: 'Saved measurements on this image' });
    await expectText(saved, `l̄ = ${lBar}, G = ${g}`);
    await saved.getByRole('button', { name: 'Reopen' }).click();
    await expectText(resultValue(page, 'Mean lineal intercept l̄'), lBar);
    await expectText(resultValue(page, 'ASTM grain size G'), g);

    // The specimen's summary draws the saved field: its preview, the test lines as the server counted them
    // (one polyline per counted piece) and one glyph per confirmed mark, as the saved measurement lists them.
    const listed = await scene.client.get(`/api/projects/${scene.project.id}/images/${laminateId}/measurements`);
    expect(listed.status).to.equal(200);
    const field = listed.body[0] as { id: string; testLines: { pieces: unknown[] }[]; definition: { marks: { status: string }[] } };
    const pieceCount = field.testLines.reduce((n, l) => n + l.pieces.length, 0);
    expect(pieceCount, 'band 1 holds counted pieces of the lines').to.be.above(0);
    const [{ specimen_id: specimenId }] = await runningServer().ctx.dataSource.query('SELECT specimen_id FROM images WHERE id = $1', [laminateId]);
    await page.goto(app!.url(`/projects/${scene.project.id}/specimens/${specimenId}/grain-size`));
    const figure = page.getByRole('region', { name: 'Fields' }).locator('figure');
    await expectCount(figure, 1);
    const drawing = figure.getByRole('img', { name: 'Field 1 · laminate.tif · band 1: test lines and marks' });
    await expectCount(drawing.locator('polyline.test-line'), pieceCount);
    await expectCount(drawing.locator('.mark'), field.definition.marks.filter((m) => m.status === 'confirmed').length);
    await expectCount(drawing.locator('.mark'), suggested + 2);
    await expectValue('the preview is drawn under the pattern', () => figure.locator('img').evaluate((i: HTMLImageElement) => i.complete && i.naturalWidth > 0), true);
    const caption = figure.locator('figcaption');
    await expectText(caption, `l̄ = ${lBar}, G = ${g}.`);
    await expectText(caption, `P = ${intersections}`);
    // 900 px × 0.5 µm/px = 450 µm wide; the largest 1-2-5 length within a fifth (90 µm) is 50 µm = 100 px (common practice, no source).
    await expectText(caption, 'Pixel size 0.5 µm/px, TIFF resolution tags; scale bar 50 µm.');
    expect(Number(await drawing.locator('.scale-bar rect.bar').getAttribute('width'))).to.be.closeTo(100, 1e-9);
    // Printed, the page flows over the sheets (the shell no longer scrolls inside the window) and the link is left out.
    const reopenLink = figure.getByRole('link', { name: 'Reopen field 1 on the measuring page' });
    await page.emulateMedia({ media: 'print' });
    await expectValue('the reopen link is hidden in print', () => reopenLink.isVisible(), false);
    await expectValue('the printed page is taller than the window', () => page.evaluate(() => document.documentElement.scrollHeight > window.innerHeight), true);
    await page.emulateMedia({ media: 'screen' });
    await reopenLink.click();
    await expectText(page.locator('.editing'), 'Editing the measurement on band 1');
    await expectText(resultValue(page, 'Mean lineal intercept l̄'), lBar);
    // The bench draws the reopened field with the same component: every confirmed mark, no suggestion.
    await expectCount(pattern.locator('.mark'), suggested + 2);
    await expectCount(pattern.locator('.suggestion'), 0);
    expectNoForeignRequests(app!);
  });

  it('when a researcher opens the measuring bench on an uncalibrated image, then it says to calibrate the image first and Save stays disabled', async () => {
    const { page } = app!;
    await signInThroughForm(app!, scene.user.email, TEST_PASSWORD);
    await page.goto(app!.url(measurePath(scene.project.id, uncalibratedId)));
    await expectText(page.getByRole('heading', { level: 1 }), 'Measure uncalibrated.tif');
    await expectText(page.getByRole('alert'), 'calibrate the image first');
    expect(await page.getByRole('button', { name: 'Save measurement' }).isDisabled()).to.equal(true);
    expect(await page.getByRole('button', { name: 'Suggest crossings' }).isDisabled()).to.equal(true);
    await page.getByRole('button', { name: 'Save measurement' }).click({ force: true });
    await page.waitForTimeout(500);
    const rows = await runningServer().ctx.dataSource.query('SELECT id FROM measurements WHERE image_id = $1', [uncalibratedId]);
    expect(rows).to.deep.equal([]);
    expectNoForeignRequests(app!);
  });
});
