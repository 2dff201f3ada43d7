import { readFile } from 'node:fs/promises';
import { expect } from 'chai';
import exifr from 'exifr';
import type { Browser, Page } from 'playwright-core';
import sharp from 'sharp';
import { TEST_PASSWORD } from '../support/fixtures';
import { waitForMail } from '../support/mail-box';
import { runningServer } from '../support/test-server';
import { chooseOption, explainFailure, freshApp, type WatchedApp } from './support/app-session';
import { launchBrowser, signInThroughForm } from './support/browser';
import { expectCount, expectNoForeignRequests, expectPath, expectText } from './support/page-checks';
import { openLinkIn, pinThread, reviewScene, threadAt, type ReviewScene } from './support/review-scene';

const imagePath = (s: ReviewScene, i = 0) => `/projects/${s.projectId}/images/${s.images[i].id}`;

/** The review card of the image page. */
const reviewCard = (page: Page) => page.locator('ef-review-panel');

describe('e2e: review flow', function () {
  this.timeout(180_000);
  let browser: Browser;
  let closeBrowser: () => Promise<void>;
  const opened: WatchedApp[] = [];

  before(async () => {
    ({ browser, close: closeBrowser } = await launchBrowser());
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

  it('when a researcher submits, the reviewer follows the mailed link, pins two threads, is refused clearing while they are open and asks for changes, the researcher replies, resolves and resubmits, then the reviewer clears and the researcher exports a two-panel TIFF at the chosen size and dpi', async () => {
    const scene = await reviewScene();
    const [first, second] = scene.images;
    const researcher = await signedInApp(scene.researcher.email);
    const reviewer = await signedInApp(scene.reviewer.email);
    const r = researcher.page;
    const v = reviewer.page;

    // The researcher hands the image to the reviewers.
    await r.goto(researcher.url(imagePath(scene)));
    await expectText(r.getByRole('heading', { level: 1 }), first.name);
    await expectText(reviewCard(r), 'Draft');
    await reviewCard(r).getByLabel('Review note').fill('Etched 10 s in Nital; please check the interface region.');
    await r.getByRole('button', { name: 'Submit for review' }).click();
    await expectText(reviewCard(r).getByRole('status'), 'Done: now with reviewers.');

    // The reviewer is told by mail and opens the image from it.
    const requested = await waitForMail(scene.reviewer.email, new RegExp(`^\\[${scene.projectCode}\\] .* submitted ${first.name} for review$`), 60_000);
    const link = openLinkIn(requested);
    expect(link).to.equal(`${runningServer().ctx.config.publicUrl}${imagePath(scene)}`);
    await v.goto(link);
    await expectText(v.getByRole('heading', { level: 1 }), first.name);
    await expectText(reviewCard(v), 'With reviewers');
    await expectCount(v.getByRole('button', { name: 'Submit for review' }), 0);

    // Two comments pinned at two points, then changes requested.
    await pinThread(v, 120, 80, 'Crack at the bond interface? Please add a higher magnification.');
    await expectText(threadAt(v, 120, 80), 'Crack at the bond interface?');
    await pinThread(v, 400, 300, 'Scale bar is missing in this corner.');
    await expectText(threadAt(v, 400, 300), 'Scale bar is missing');
    await expectText(reviewCard(v), '2 open threads on this image; resolve them before clearing.');
    // Clearing is refused while threads are open; the image stays with the reviewers.
    await v.getByRole('button', { name: 'Clear for publication' }).click();
    await expectText(reviewCard(v).getByRole('alert'), '2 comment threads are still open on this image; resolve them before clearing.');
    await expectText(reviewCard(v), 'With reviewers');
    await expectCount(reviewCard(v).locator('ul.snapshots li'), 0);
    await v.getByRole('button', { name: 'Request changes' }).click();
    await expectText(reviewCard(v).getByRole('status'), 'Done: now needs changes.');

    // The researcher answers one thread, resolves both and submits again.
    await waitForMail(scene.researcher.email, new RegExp(`asked for changes to ${first.name}$`), 60_000);
    await r.reload();
    await expectText(reviewCard(r), 'Needs changes');
    const cracked = threadAt(r, 120, 80);
    await cracked.getByRole('combobox', { name: 'Your reply' }).fill('Added a 1000× image of the same spot; it is a polishing scratch.');
    await cracked.getByRole('button', { name: 'Reply' }).click();
    await expectText(cracked, 'it is a polishing scratch');
    await cracked.getByRole('button', { name: 'Resolve thread' }).click();
    await expectCount(threadAt(r, 120, 80), 0);
    await threadAt(r, 400, 300).getByRole('button', { name: 'Resolve thread' }).click();
    await expectText(r.locator('ef-thread-list'), 'No open threads on this image.');
    await expectText(reviewCard(r), 'no open threads');
    await r.getByRole('button', { name: 'Submit for review' }).click();
    await expectText(reviewCard(r).getByRole('status'), 'Done: now with reviewers.');

    // The reviewer follows the reply's link to its thread, then clears the image.
    const replied = await waitForMail(scene.reviewer.email, new RegExp(`replied in a thread on ${first.name}$`), 60_000);
    const threadLink = openLinkIn(replied);
    expect(threadLink).to.match(new RegExp(`${imagePath(scene)}\\?thread=[0-9a-f-]{36}$`));
    await v.goto(threadLink);
    await expectText(v.locator('article.focused'), 'it is a polishing scratch');
    await expectText(v.locator('article.focused'), 'Resolved');
    await expectText(reviewCard(v), 'With reviewers');
    await v.getByRole('button', { name: 'Clear for publication' }).click();
    await expectText(reviewCard(v).getByRole('status'), 'Done: now cleared for publication.');
    await expectCount(reviewCard(v).locator('ul.snapshots li'), 1);

    // The researcher composes a two-panel figure and exports it as TIFF.
    await r.goto(researcher.url(`/projects/${scene.projectId}/figures`));
    await r.getByRole('link', { name: 'New figure' }).click();
    await expectPath(r, `/projects/${scene.projectId}/figures/new`);
    await r.getByLabel('Title', { exact: true }).fill('Interface after resubmission');
    await r.getByRole('list', { name: 'Images to choose for panel 1' }).getByRole('button', { name: first.name }).click();
    await r.getByRole('button', { name: 'Add panel' }).click();
    await r.getByRole('list', { name: 'Images to choose for panel 2' }).getByRole('button', { name: second.name }).click();
    await expectText(r.getByRole('region', { name: 'Panel 2' }), second.name);
    await r.getByRole('button', { name: 'Save figure' }).click();
    await expectPath(r, new RegExp(`^/projects/${scene.projectId}/figures/[0-9a-f-]{36}$`));
    await expectText(r.getByRole('heading', { level: 1 }), 'Interface after resubmission');

    const [widthMm, dpi] = [85, 300];
    await chooseOption(r, r.getByRole('combobox', { name: 'Format' }), 'TIFF (LZW)');
    await r.getByLabel('Width in mm').fill(String(widthMm));
    await r.getByLabel('Dots per inch').fill(String(dpi));
    const [download] = await Promise.all([r.waitForEvent('download', { timeout: 60_000 }), r.getByRole('button', { name: 'Export' }).click()]);
    const bytes = await readFile((await download.path())!);

    const meta = await sharp(bytes).metadata();
    expect(meta.format).to.equal('tiff');
    // width in px = width in inches × dots per inch; 1 in = 25.4 mm exactly (NIST SP 811, B.8)
    expect(meta.width).to.equal(Math.round((widthMm / 25.4) * dpi));
    const tags = await exifr.parse(bytes, { tiff: true, ifd0: true, translateValues: false, pick: ['XResolution', 'YResolution', 'ResolutionUnit'] } as any);
    // TIFF 6.0, Section 8: ResolutionUnit 2 = inch, so XResolution is in pixels per inch
    expect(tags.ResolutionUnit).to.equal(2);
    expect(tags.XResolution).to.be.closeTo(dpi, 0.01);
    expect(tags.YResolution).to.be.closeTo(dpi, 0.01);
    await expectText(r.getByRole('status').filter({ hasText: 'Downloaded' }), /Downloaded .+\.tiff?\./);

    expectNoForeignRequests(researcher);
    expectNoForeignRequests(reviewer);
  });

  it('when a guest opens an image with a thread on it, then no comment box, reply field or review move is offered; and an empty first comment from the reviewer is refused in place and starts no thread', async () => {
    const scene = await reviewScene();
    const guest = await signedInApp(scene.guest.email);
    const reviewer = await signedInApp(scene.reviewer.email);
    const g = guest.page;
    const v = reviewer.page;

    // The reviewer pins one thread, so the guest has something to (not) reply to.
    await v.goto(reviewer.url(imagePath(scene)));
    await expectText(v.getByRole('heading', { level: 1 }), scene.images[0].name);
    await pinThread(v, 50, 60, 'Grain boundaries look over-etched here.');
    await expectText(threadAt(v, 50, 60), 'over-etched');

    await g.goto(guest.url(imagePath(scene)));
    await expectText(threadAt(g, 50, 60), 'Grain boundaries look over-etched here.');
    await expectText(reviewCard(g), 'Your role has no review move to make at this stage.');
    await expectCount(g.getByRole('button', { name: 'New thread' }), 0);
    await expectCount(g.getByRole('combobox', { name: 'Your reply' }), 0);
    await expectCount(g.getByRole('button', { name: 'Resolve thread' }), 0);
    await expectCount(g.getByRole('button', { name: 'Submit for review' }), 0);

    // The reviewer, for their part, sends a blank first comment.
    await v.getByRole('button', { name: 'New thread' }).click();
    const form = v.getByRole('form', { name: 'New thread' });
    await form.getByRole('combobox', { name: 'First comment' }).fill('   ');
    await form.getByRole('button', { name: 'Start thread' }).click();
    await expectText(form.locator('mat-error'), 'Write something first; the comment is empty.');
    await expectCount(v.getByRole('article'), 1);
    const [{ n }] = await runningServer().ctx.dataSource.query('SELECT count(*)::int AS n FROM comment_threads WHERE image_id = $1', [scene.images[0].id]);
    expect(n, 'threads stored for the image').to.equal(1);

    expectNoForeignRequests(guest);
    expectNoForeignRequests(reviewer);
  });
});
