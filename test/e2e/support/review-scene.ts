import type { Locator, Page } from 'playwright-core';
import type { User } from '../../../server/auth/user.entity';
import { ProjectMembership } from '../../../server/projects/project-membership.entity';
import type { KeptMail } from '../../../shared/admin';
import { makeUser, unique } from '../../support/fixtures';
import { etchedMicrograph, voronoiLabels } from '../../support/synthetic-micrograph';
import { runningServer } from '../../support/test-server';
import { archiveScene, fieldsFor, upload, waitForState } from '../../server/images/image-fixtures';

/** One uploaded, processed image of the review scene. */
export interface SceneImage {
  id: string;
  name: string;
  width: number;
  height: number;
}

/**
 * A project of its own for a review flow: a researcher who uploaded two ready micrographs, a reviewer
 * and a guest (all with the test password), so mail to them is theirs alone and no other test's rows interfere.
 */
export interface ReviewScene {
  projectId: string;
  projectCode: string;
  researcher: User;
  reviewer: User;
  guest: User;
  images: [SceneImage, SceneImage];
}

export async function reviewScene(): Promise<ReviewScene> {
  const baseUrl = runningServer().ctx.config.publicUrl;
  const scene = await archiveScene(baseUrl, 'researcher');
  const reviewer = await makeUser('member', { displayName: `Reviewer ${unique()}` });
  const guest = await makeUser('member', { displayName: `Guest ${unique()}` });
  const memberships = runningServer().ctx.dataSource.getRepository(ProjectMembership);
  await memberships.insert({ projectId: scene.project.id, userId: reviewer.id, role: 'reviewer' });
  await memberships.insert({ projectId: scene.project.id, userId: guest.id, role: 'guest' });

  const images: SceneImage[] = [];
  for (const [i, seed] of [11, 23].entries()) {
    const [width, height] = [480, 360];
    const bytes = await etchedMicrograph(voronoiLabels(width, height, 30, seed), width, height, seed);
    const name = `review-${String.fromCharCode(97 + i)}-${unique()}.png`;
    const res = await upload(scene.client, scene.project.id, bytes, name, fieldsFor(scene));
    if (res.status !== 201) throw new Error(`upload of ${name} failed: ${res.status} ${JSON.stringify(res.body)}`);
    const row = await waitForState(res.body.image.id, ['ready', 'failed']);
    if (row['state'] !== 'ready') throw new Error(`image ${name} did not become ready: ${row['state']}`);
    images.push({ id: res.body.image.id, name, width, height });
  }
  return { projectId: scene.project.id, projectCode: scene.project.code, researcher: scene.user, reviewer, guest, images: images as [SceneImage, SceneImage] };
}

/** The "Open it:" link of a notification message. */
export function openLinkIn(mail: KeptMail): string {
  const link = /Open it: (\S+)/.exec(mail.text)?.[1];
  if (!link) throw new Error(`no link in the mail: ${mail.text}`);
  return link;
}

/** The thread pinned at a point, as the thread list labels it. */
export function threadAt(page: Page, x: number, y: number): Locator {
  return page.getByRole('article', { name: `Thread on point at ${x}, ${y} px` });
}

/** Starts a thread pinned at a typed point with a first comment, through the "New thread" form. */
export async function pinThread(page: Page, x: number, y: number, body: string): Promise<void> {
  await page.getByRole('button', { name: 'New thread' }).click();
  const form = page.getByRole('form', { name: 'New thread' });
  await form.getByRole('radio', { name: 'A point I type' }).check();
  await form.getByLabel('Point x').fill(String(x));
  await form.getByLabel('Point y').fill(String(y));
  await form.getByRole('combobox', { name: 'First comment' }).fill(body);
  await form.getByRole('button', { name: 'Start thread' }).click();
}
