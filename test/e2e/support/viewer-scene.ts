import { expect } from 'chai';
import type { Locator, Page } from 'playwright-core';
import sharp from 'sharp';
import { addDefaultAnnotationClasses } from '../../../server/annotations/default-classes';
import type { User } from '../../../server/auth/user.entity';
import { ProjectMembership } from '../../../server/projects/project-membership.entity';
import type { ApiClient } from '../../support/api-client';
import { makeUser } from '../../support/fixtures';
import { runningServer } from '../../support/test-server';
import { archiveScene, fieldsFor, upload, waitForState, type ArchiveScene } from '../../server/images/image-fixtures';
import type { AppPage } from './browser';
import { expectText } from './page-checks';

/** A project of its own with the default annotation classes, a researcher (the scene's user) and a reviewer. */
export interface ViewerScene extends ArchiveScene {
  reviewer: User;
  /** Annotation class ids by name. */
  classes: Record<string, string>;
}

export async function viewerScene(): Promise<ViewerScene> {
  const ctx = runningServer().ctx;
  const scene = await archiveScene(ctx.config.publicUrl, 'researcher');
  await addDefaultAnnotationClasses(ctx.dataSource.manager, scene.project.id);
  const reviewer = await makeUser();
  await ctx.dataSource.getRepository(ProjectMembership).insert({ projectId: scene.project.id, userId: reviewer.id, role: 'reviewer' });
  const rows: { id: string; name: string }[] = await ctx.dataSource.query('SELECT id, name FROM annotation_classes WHERE project_id = $1', [scene.project.id]);
  return { ...scene, reviewer, classes: Object.fromEntries(rows.map((c) => [c.name, c.id])) };
}

/** Uploads a file through the API as the scene's researcher and waits until its tiles are made. */
export async function uploadReady(scene: ArchiveScene, bytes: Buffer, name: string, client: ApiClient = scene.client): Promise<string> {
  const res = await upload(client, scene.project.id, bytes, name, fieldsFor(scene));
  expect(res.status, JSON.stringify(res.body)).to.equal(201);
  const id = (res.body.id ?? res.body.image?.id ?? res.body.images?.[0]?.id) as string;
  const row = await waitForState(id, ['ready', 'failed'], 60_000);
  expect(row['state'], `image ${name}: ${String(row['failure_reason'] ?? '')}`).to.equal('ready');
  return id;
}

/**
 * A smooth grey 8-bit TIFF: a diagonal ramp with soft round blobs, so tiles compress well and
 * the picture is not uniform; `seed` shifts the blobs so each file has bytes of its own. `umPerPx` writes TIFF resolution tags (sharp takes px/mm), none leaves it uncalibrated.
 */
export async function smoothTiff(width: number, height: number, umPerPx: number | null, seed = 0): Promise<Buffer> {
  const px = Buffer.alloc(width * height);
  for (let y = 0; y < height; y++) {
    for (let x = 0; x < width; x++) {
      const ramp = 90 + (80 * (x + y)) / (width + height);
      const blob = Math.cos((x + 7 * seed) / 37) * Math.sin(y / 29) > 0.6 ? 40 : 0;
      px[y * width + x] = Math.round(ramp + blob);
    }
  }
  const image = sharp(px, { raw: { width, height, channels: 1 } }).toColourspace('b-w');
  return image.tiff({ compression: 'lzw', ...(umPerPx ? { xres: 1000 / umPerPx, yres: 1000 / umPerPx } : {}) }).toBuffer();
}

/**
 * An uncalibrated picture of a stage micrometer: white, with a black tick 2 px wide every `tickPx`
 * pixels from `firstTickX` (longer every tenth tick), centred on the tick's x. Returned as a TIFF
 * without resolution tags.
 */
export async function micrometerTiff(width: number, height: number, firstTickX: number, tickPx: number): Promise<Buffer> {
  const px = Buffer.alloc(width * height, 245);
  const mid = Math.round(height / 2);
  for (let k = 0; firstTickX + k * tickPx < width - 1; k++) {
    const x = firstTickX + k * tickPx;
    const half = k % 10 === 0 ? 120 : k % 5 === 0 ? 80 : 50;
    for (let y = mid - half; y <= mid + half; y++) {
      px[y * width + x - 1] = 10;
      px[y * width + x] = 10;
    }
  }
  for (let x = firstTickX; x < width - 40; x++) for (let y = mid + 50; y < mid + 52; y++) px[y * width + x] = 10;
  return sharp(px, { raw: { width, height, channels: 1 } }).toColourspace('b-w').tiff({ compression: 'lzw' }).toBuffer();
}

/** The viewer's address for an image. */
export const viewerPath = (projectId: string, imageId: string) => `/projects/${projectId}/images/${imageId}/view`;

/** The canvas container of the viewer. */
export const viewerCanvas = (page: Page): Locator => page.getByRole('application', { name: 'Micrograph viewer' });

/**
 * Opens the viewer on an image and waits for its canvas, then shows actual pixels (one image pixel per
 * screen pixel, centred on the image's centre) and waits for "100 %". Returns the page-coordinates of an
 * image point in that view, worked out from the stage's box alone.
 */
export async function openAtActualPixels(app: AppPage, projectId: string, imageId: string, image: { width: number; height: number }): Promise<(x: number, y: number) => { x: number; y: number }> {
  const { page } = app;
  await page.goto(app.url(viewerPath(projectId, imageId)));
  const canvas = viewerCanvas(page);
  await canvas.waitFor();
  const stage = canvas.locator('.stage');
  await stage.locator('canvas').first().waitFor();
  const readout = canvas.locator('.readout');
  await expectText(readout, / %/);
  const fitPercent = Number(/(\d+) %/.exec(await readout.innerText())?.[1]);
  expect(fitPercent, 'the whole image fits at less than 100 %').to.be.below(100);
  await page.getByRole('button', { name: 'Actual pixels', exact: true }).click();
  await expectText(readout, /(^|\D)100 %/);
  const box = (await canvas.boundingBox())!;
  // At scale 1 the view's top-left image point is (W/2 − w/2, H/2 − h/2), w × h being the canvas size.
  const size = await canvas.evaluate((el) => ({ w: el.clientWidth, h: el.clientHeight }));
  const left = image.width / 2 - size.w / 2;
  const top = image.height / 2 - size.h / 2;
  return (x, y) => ({ x: box.x + (x - left), y: box.y + (y - top) });
}

/** Clicks at page coordinates with a pause after, so the zoneless page handles each click on its own. */
export async function clickAt(page: Page, p: { x: number; y: number }): Promise<void> {
  await page.mouse.move(p.x, p.y);
  await page.mouse.down();
  await page.mouse.up();
  await page.waitForTimeout(60);
}

/** Drags with the left button from `a` to `b` in small steps, as a hand would. */
export async function dragFrom(page: Page, a: { x: number; y: number }, b: { x: number; y: number }): Promise<void> {
  await page.mouse.move(a.x, a.y);
  await page.mouse.down();
  await page.mouse.move(b.x, b.y, { steps: 12 });
  await page.mouse.up();
  await page.waitForTimeout(60);
}

/** An image's annotations straight from the database, in drawing order, with class names. */
export async function storedShapes(imageId: string): Promise<{ kind: string; points: [number, number][]; className: string }[]> {
  return runningServer().ctx.dataSource.query(
    `SELECT a.kind, a.points, c.name AS "className" FROM annotations a JOIN annotation_classes c ON c.id = a.class_id WHERE a.image_id = $1 ORDER BY a.seq`,
    [imageId],
  );
}

/** Fails unless every point lies within `tolerancePx` of the expected one, saying which did not. */
export function expectPointsNear(what: string, actual: [number, number][], expected: [number, number][], tolerancePx: number): void {
  expect(actual.length, `${what}: number of points in ${JSON.stringify(actual)}`).to.equal(expected.length);
  actual.forEach(([x, y], i) => {
    const [ex, ey] = expected[i]!;
    expect(Math.hypot(x - ex, y - ey), `${what}: point ${i} is (${x.toFixed(1)}, ${y.toFixed(1)}), drawn at (${ex}, ${ey})`).to.be.at.most(tolerancePx);
  });
}
