import { expect } from 'chai';
import type { Page } from 'playwright-core';
import { makeUser, TEST_PASSWORD } from '../support/fixtures';
import { runningServer } from '../support/test-server';
import { chromiumPerTest } from './support/app-session';
import { signInThroughForm } from './support/browser';
import { expectCount, expectNoForeignRequests, expectText, expectValue } from './support/page-checks';
import { clickAt, dragFrom, expectPointsNear, openAtActualPixels, smoothTiff, uploadReady, viewerCanvas, viewerPath, viewerScene, type ViewerScene } from './support/viewer-scene';

const W = 1600;
const H = 1200;

interface StoredThread {
  id: string;
  anchor: { kind: 'point'; at: [number, number] } | { kind: 'region'; ring: [number, number][] };
}

async function storedThreads(imageId: string): Promise<StoredThread[]> {
  return runningServer().ctx.dataSource.query('SELECT id, anchor FROM comment_threads WHERE image_id = $1 ORDER BY created_at', [imageId]);
}

/** Writes the first comment in the card beside a freshly drawn pin and starts the thread. */
async function writeFirstComment(page: Page, body: string): Promise<void> {
  const card = page.getByRole('region', { name: 'New comment thread' });
  await card.getByRole('combobox', { name: 'First comment' }).fill(body);
  await card.getByRole('button', { name: 'Start thread' }).click();
  await expectCount(card, 0);
}

describe('e2e: comment pins on the micrograph in Chromium', function () {
  this.timeout(120_000);
  const session = chromiumPerTest();
  let scene: ViewerScene;
  let imageId: string;

  before(async function () {
    this.timeout(180_000);
    scene = await viewerScene();
    imageId = await uploadReady(scene, await smoothTiff(W, H, 0.5, 7), 'pinned-field.tif');
  });


  it('when a reviewer clicks a point and drags a box with the comment pin, then two threads are stored at those image pixels and listed as numbered pins', async () => {
    const { page } = session.app;
    await signInThroughForm(session.app, scene.reviewer.email, TEST_PASSWORD);
    const at = await openAtActualPixels(session.app, scene.project.id, imageId, { width: W, height: H });

    await page.getByRole('button', { name: 'Comment pin', exact: true }).click();
    await clickAt(page, at(700, 500));
    await writeFirstComment(page, 'Oxide chain along the interface here?');
    await dragFrom(page, at(880, 620), at(1000, 700));
    await writeFirstComment(page, 'This band looks finer than the rest of the layer.');

    await expectValue('stored threads', async () => (await storedThreads(imageId)).length, 2, 15_000);
    const [point, region] = await storedThreads(imageId);
    expect(point!.anchor.kind).to.equal('point');
    // At 1:1 one screen pixel is one image pixel, so the pin lands within 2 px of the click (hand-computed from the view).
    expectPointsNear('point pin', [point!.anchor.kind === 'point' ? point!.anchor.at : [NaN, NaN]], [[700, 500]], 2);
    expect(region!.anchor.kind).to.equal('region');
    expectPointsNear('region pin', region!.anchor.kind === 'region' ? region!.anchor.ring : [], [[880, 620], [1000, 620], [1000, 700], [880, 700]], 2);

    const pins = page.getByRole('list', { name: 'Comment pins on this image' });
    await expectCount(pins.getByRole('button'), 2);
    await expectText(pins.getByRole('button').nth(0), 'Oxide chain along the interface here?');
    await expectText(page.getByRole('tab', { name: 'Comments (2)' }), 'Comments (2)');
    expectNoForeignRequests(session.app);
  });

  it('when a notification link carries ?thread=, then the viewer opens the Comments tab on that thread and centres the view on its pin', async () => {
    const { page } = session.app;
    const threads = await storedThreads(imageId);
    expect(threads, 'the threads of the previous test').to.have.length(2);
    await signInThroughForm(session.app, scene.user.email, TEST_PASSWORD);
    await page.goto(session.app.url(`${viewerPath(scene.project.id, imageId)}?thread=${threads[0]!.id}`));
    await viewerCanvas(page).waitFor();

    await expectText(page.getByRole('tab', { selected: true }), 'Comments');
    await expectCount(page.locator(`#thread-${threads[0]!.id}.focused`), 1);
    // The flight ends with the pin in the middle of the canvas: hover there and read the cursor position.
    await page.waitForTimeout(800);
    const box = (await viewerCanvas(page).boundingBox())!;
    await page.mouse.move(box.x + box.width / 2, box.y + box.height / 2);
    const readout = await viewerCanvas(page).locator('.readout').innerText();
    const [x, y] = /(\d+), (\d+) px/.exec(readout)!.slice(1).map(Number);
    expect(Math.abs(x! - 700), `x in "${readout}"`).to.be.at.most(3);
    expect(Math.abs(y! - 500), `y in "${readout}"`).to.be.at.most(3);

    // At 1:1 around the same centre, the region's marker (its top-left corner, 880, 620) sits 180 px right
    // of and 120 px below the middle: clicking it with the select tool focuses the region's thread.
    await page.getByRole('button', { name: 'Actual pixels', exact: true }).click();
    await expectText(viewerCanvas(page).locator('.readout'), /(^|\D)100 %/);
    await page.getByRole('button', { name: 'Select tool', exact: true }).click();
    await clickAt(page, { x: box.x + box.width / 2 + 180, y: box.y + box.height / 2 + 120 });
    await expectCount(page.locator(`#thread-${threads[1]!.id}.focused`), 1);

    // And the list flies back to the first one.
    await page.getByRole('button', { name: 'Pin 1, open: Oxide chain along the interface here?' }).click();
    await expectCount(page.locator(`#thread-${threads[0]!.id}.focused`), 1);
    expectNoForeignRequests(session.app);
  });

  it('when a guest opens the viewer, then no comment pin tool is offered but the pins and threads show', async () => {
    const { page } = session.app;
    const guest = await makeUser();
    await runningServer().ctx.dataSource.query(`INSERT INTO project_memberships (project_id, user_id, role) VALUES ($1, $2, 'guest')`, [scene.project.id, guest.id]);
    await signInThroughForm(session.app, guest.email, TEST_PASSWORD);
    await page.goto(session.app.url(viewerPath(scene.project.id, imageId)));
    await viewerCanvas(page).waitFor();
    await page.getByRole('tab', { name: /^Comments/ }).click();
    await expectCount(page.getByRole('list', { name: 'Comment pins on this image' }).getByRole('button'), 2);
    await expectCount(page.getByRole('button', { name: 'Comment pin', exact: true }), 0);
    expectNoForeignRequests(session.app);
  });
});
