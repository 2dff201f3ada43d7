import { createHash } from 'node:crypto';
import { readFile } from 'node:fs/promises';
import { expect } from 'chai';
import type { Browser, Page } from 'playwright-core';
import { TEST_PASSWORD } from '../support/fixtures';
import { waitForMail } from '../support/mail-box';
import { runningServer } from '../support/test-server';
import { explainFailure, freshApp, type WatchedApp } from './support/app-session';
import { launchBrowser, signInThroughForm } from './support/browser';
import { expectCount, expectNoForeignRequests, expectText, expectValue } from './support/page-checks';
import { openLinkIn } from './support/review-scene';
import { clickAt, openAtActualPixels, smoothTiff, storedShapes, uploadReady, viewerScene, type ViewerScene } from './support/viewer-scene';

const TITLE = 'Bond line before and after annealing';
const reviewCard = (page: Page) => page.locator('ef-review-panel');
const sha256 = (bytes: Buffer) => createHash('sha256').update(bytes).digest('hex');

/** Clicks a download link and returns the file's bytes. */
async function downloadVia(page: Page, name: string): Promise<Buffer> {
  const [download] = await Promise.all([page.waitForEvent('download', { timeout: 30_000 }), page.getByRole('link', { name }).click()]);
  return readFile((await download.path())!);
}

describe('e2e: a figure under review', function () {
  this.timeout(240_000);
  let browser: Browser;
  let closeBrowser: () => Promise<void>;
  let scene: ViewerScene;
  let panelImages: [string, string];
  let figureId: string;
  const opened: WatchedApp[] = [];

  before(async function () {
    this.timeout(180_000);
    ({ browser, close: closeBrowser } = await launchBrowser());
    scene = await viewerScene();
    panelImages = [
      await uploadReady(scene, await smoothTiff(2000, 1500, 0.5, 4), 'anneal-before.tif'),
      await uploadReady(scene, await smoothTiff(640, 480, 0.5, 5), 'anneal-after.tif'),
    ];
    // The figure as the researcher saved it: panel a draws the bond interfaces, panel b is clean.
    const res = await scene.client.post(`/api/projects/${scene.project.id}/figures`, {
      title: TITLE,
      columns: 2,
      gapMm: 1,
      widthMm: 60,
      dpi: 150,
      panels: [
        { imageId: panelImages[0], region: { x: 0, y: 0, width: 2000, height: 1500 }, classIds: [scene.classes['Bond interface']], letter: 'a' },
        { imageId: panelImages[1], region: { x: 0, y: 0, width: 640, height: 480 }, classIds: [], letter: 'b' },
      ],
    });
    expect(res.status, JSON.stringify(res.body)).to.equal(201);
    figureId = res.body.id;
  });
  after(async () => closeBrowser?.());
  afterEach(async function () {
    for (const app of opened.splice(0)) {
      await explainFailure(this.currentTest, app);
      await app.context.close();
    }
  });

  async function signedInApp(email: string): Promise<WatchedApp> {
    const app = await freshApp(browser);
    opened.push(app);
    await signInThroughForm(app, email, TEST_PASSWORD);
    return app;
  }

  it('when the researcher submits a figure and the reviewer, refused while a panel thread is open, resolves it and clears, then an annotation edit on a panel image puts the figure back to draft, the reviewer is told, and the cleared TIFF still downloads byte for byte', async () => {
    const figurePath = `/projects/${scene.project.id}/figures/${figureId}`;
    const researcher = await signedInApp(scene.user.email);
    const reviewer = await signedInApp(scene.reviewer.email);
    const r = researcher.page;
    const v = reviewer.page;

    // The researcher hands the saved figure to the reviewers from its page.
    await r.goto(researcher.url(figurePath));
    await expectText(r.getByRole('heading', { level: 1 }), TITLE);
    await expectText(reviewCard(r), 'Draft');
    await reviewCard(r).getByLabel('Review note').fill('Panel a is the as-bonded state.');
    await reviewCard(r).getByRole('button', { name: 'Submit for review' }).click();
    await expectText(reviewCard(r).getByRole('status'), 'Done: now with reviewers.');

    // The reviewer follows the mailed link to the figure page and pins a question to panel a.
    const requested = await waitForMail(scene.reviewer.email, new RegExp(`^\\[${scene.project.code}\\] .* submitted the figure “${TITLE}” for review$`), 60_000);
    const link = openLinkIn(requested);
    expect(link).to.equal(`${runningServer().ctx.config.publicUrl}${figurePath}`);
    await v.goto(link);
    await expectText(v.getByRole('heading', { level: 1 }), TITLE);
    await expectText(reviewCard(v), 'With reviewers');
    await v.getByRole('button', { name: 'New thread' }).click();
    const form = v.getByRole('form', { name: 'New thread' });
    await form.getByRole('radio', { name: 'One panel' }).check();
    await form.getByRole('radio', { name: 'panel a' }).check();
    await form.getByRole('combobox', { name: 'First comment' }).fill('Is the bond line drawn on the etched boundary?');
    await form.getByRole('button', { name: 'Start thread' }).click();
    const thread = v.getByRole('article', { name: 'Thread on panel a' });
    await expectText(thread, 'Is the bond line drawn on the etched boundary?');

    // Clearing is refused while the thread is open; the figure stays with the reviewers.
    await reviewCard(v).getByRole('button', { name: 'Clear for publication' }).click();
    await expectText(reviewCard(v).getByRole('alert'), '1 comment thread is still open on this figure; resolve it before clearing.');
    await expectText(reviewCard(v), 'With reviewers');
    await thread.getByRole('button', { name: 'Resolve thread' }).click();
    await expectText(v.locator('ef-thread-list'), 'No open threads on this figure.');
    await reviewCard(v).getByRole('button', { name: 'Clear for publication' }).click();
    await expectText(reviewCard(v).getByRole('status'), 'Done: now cleared for publication.');
    await expectCount(reviewCard(v).getByRole('list', { name: 'Cleared versions of this figure' }).getByRole('listitem'), 1);
    const clearedTiff = await downloadVia(v, 'Download the cleared TIFF');
    const [kept] = await runningServer().ctx.dataSource.query(`SELECT files FROM figure_clearances WHERE figure_id = $1`, [figureId]);
    expect(sha256(clearedTiff)).to.equal(kept.files.find((f: { format: string }) => f.format === 'tiff').sha256);

    // The researcher draws one more bond interface on panel a's image in the viewer.
    await waitForMail(scene.user.email, new RegExp(`cleared the figure “${TITLE}” for publication$`), 60_000);
    const at = await openAtActualPixels(researcher, scene.project.id, panelImages[0], { width: 2000, height: 1500 });
    await r.getByRole('button', { name: 'Polyline tool', exact: true }).click();
    for (const [x, y] of [[800, 700], [1000, 720], [1200, 705]] as const) await clickAt(r, at(x, y));
    await r.keyboard.press('Enter');
    await expectValue('stored annotations on panel a', async () => (await storedShapes(panelImages[0])).length, 1, 15_000);

    // The figure is a draft again, says why, and the reviewer hears of it.
    await r.goto(researcher.url(figurePath));
    await expectText(r.getByLabel('Review state'), 'Draft');
    await expectText(reviewCard(r), 'Back to draft after an edit');
    await expectText(reviewCard(r), 'changed the annotations of anneal-before.tif, shown in a panel');
    await waitForMail(scene.reviewer.email, new RegExp(`The figure “${TITLE}” is back to draft$`), 60_000);

    // The cleared TIFF is still the one that was cleared, byte for byte.
    await expectCount(reviewCard(r).getByRole('list', { name: 'Cleared versions of this figure' }).getByRole('listitem'), 1);
    const later = await downloadVia(r, 'Download the cleared TIFF');
    expect(later.equals(clearedTiff), 'the cleared TIFF after the edit is byte-identical').to.equal(true);

    expectNoForeignRequests(researcher);
    expectNoForeignRequests(reviewer);
  });
});
