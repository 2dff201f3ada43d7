import { expect } from 'chai';
import type { Browser, Locator, Page } from 'playwright-core';
import { makeUser, TEST_PASSWORD, unique } from '../support/fixtures';
import { waitForMail } from '../support/mail-box';
import { explainFailure, freshApp, openedDialog, submitSignIn, type WatchedApp } from './support/app-session';
import { launchBrowser, signInThroughForm } from './support/browser';
import { demo } from './support/demo-lab';
import { passwordLinkIn } from './support/mail-links';
import { expectCount, expectNoForeignRequests, expectPath, expectText, fieldError } from './support/page-checks';

const INVITATION = /you are invited/;

function nav(page: Page): Locator {
  return page.getByRole('navigation', { name: 'Main navigation' });
}

/** The row of `email` in the user list, after filtering the list down to it. */
async function userRow(page: Page, email: string): Promise<Locator> {
  await page.getByLabel('Filter').fill(email);
  // Wait for the filtered answer itself: a row of the unfiltered list would be replaced (and its menu closed) when it lands.
  const rows = page.locator('tr.mat-mdc-row');
  await expectCount(rows, 1);
  await expectText(rows, email);
  await expectCount(page.getByRole('progressbar', { name: 'Loading users' }), 0);
  return rows;
}

/** Opens the row menu of `email` and chooses `item`. */
async function rowAction(page: Page, email: string, item: string): Promise<void> {
  await page.getByRole('button', { name: `Actions for ${email}` }).click();
  await page.getByRole('menuitem', { name: item }).click();
}

describe('e2e: site administration', function () {
  this.timeout(60_000);
  let browser: Browser;
  let closeBrowser: () => Promise<void>;
  const apps: WatchedApp[] = [];

  /** A fresh context; this file's tests need two people at once, so each gets one. */
  async function person(): Promise<WatchedApp> {
    const app = await freshApp(browser);
    apps.push(app);
    return app;
  }

  before(async () => {
    ({ browser, close: closeBrowser } = await launchBrowser());
  });
  after(async () => closeBrowser?.());
  afterEach(async function () {
    for (const app of apps) await explainFailure(this.currentTest, app);
    await Promise.all(apps.splice(0).map((app) => app.context.close()));
  });

  it('when the admin invites someone, then a taken address is refused beside E-mail, the invitee sets a password from the mail and signs in, and once deactivated is turned away', async () => {
    const admin = await person();
    const invitee = await person();
    const tag = unique();
    const email = `tove.marlund-${tag}@example.test`;
    const name = `Tove Marlund ${tag}`;
    const { page } = admin;
    await signInThroughForm(admin, demo('admin').email, demo('admin').password);
    await nav(page).getByRole('link', { name: 'Users' }).click();
    await expectText(page.getByRole('heading', { level: 1 }), 'Users');

    await page.getByRole('button', { name: 'Invite user' }).click();
    const dialog = await openedDialog(page);
    await dialog.getByLabel('E-mail', { exact: true }).fill(demo('guest').email);
    await dialog.getByLabel('Name', { exact: true }).fill(name);
    await dialog.getByRole('button', { name: 'Send invitation' }).click();
    await expectText(fieldError(dialog, 'E-mail'), 'This address already has an account.');
    await dialog.getByLabel('E-mail', { exact: true }).fill(email);
    await expectText(dialog.getByRole('combobox', { name: 'Site role' }), 'Member');
    await dialog.getByRole('button', { name: 'Send invitation' }).click();
    await expectCount(page.getByRole('dialog'), 0);
    await expectText(page.locator('mat-snack-bar-container'), `Invitation sent to ${email}.`);
    await expectText(await userRow(page, email), 'Not yet (invited)');

    // The admin reads the invitation in the outbox, as a tester without a mail account would.
    await nav(page).getByRole('link', { name: 'Mail outbox' }).click();
    await page.getByRole('button', { name: 'Refresh' }).click();
    await page.getByRole('group', { name: 'Messages' }).getByRole('button').filter({ hasText: email }).click();
    const reader = page.getByRole('article');
    await expectText(reader.getByRole('heading'), 'Etchfile: you are invited');
    const link = await reader.getByRole('link').getAttribute('href');
    expect(link, 'the outbox shows the link the mail carries').to.equal(passwordLinkIn(await waitForMail(email, INVITATION)));

    await invitee.page.goto(link!);
    await invitee.page.getByLabel('New password', { exact: true }).fill('ferrite-bands-and-twins');
    await invitee.page.getByLabel('Confirm new password', { exact: true }).fill('ferrite-bands-and-twins');
    await invitee.page.getByRole('button', { name: 'Set password' }).click();
    await expectPath(invitee.page, '/sign-in?notice=password-set');
    await submitSignIn(invitee, email, 'ferrite-bands-and-twins');
    await expectPath(invitee.page, '/projects');
    await expectText(invitee.page.getByRole('button', { name: 'Account menu' }), name);
    await expectText(invitee.page.getByRole('status'), 'No projects yet.');
    await invitee.page.getByRole('button', { name: 'Account menu' }).click();
    await invitee.page.getByRole('menuitem', { name: 'Account' }).click();
    await expectText(invitee.page.locator('dl.profile'), email);

    await nav(page).getByRole('link', { name: 'Users' }).click();
    await userRow(page, email);
    await rowAction(page, email, 'Deactivate');
    await (await openedDialog(page)).getByRole('button', { name: 'Deactivate', exact: true }).click();
    await expectText(await userRow(page, email), 'Deactivated');

    // Their next step inside the already loaded app asks the server, which no longer knows them.
    await nav(invitee.page).getByRole('link', { name: 'Projects' }).click();
    await expectPath(invitee.page, /^\/sign-in/);
    await submitSignIn(invitee, email, 'ferrite-bands-and-twins');
    await expectText(invitee.page.getByRole('alert'), 'This account has been deactivated. Ask a site administrator.');
    await expectPath(invitee.page, /^\/sign-in/);
    expectNoForeignRequests(admin);
    expectNoForeignRequests(invitee);
  });

  it('when the admin makes a member an admin, then the member finds the administration links on their next load, while the admin is offered no change to their own account', async () => {
    const admin = await person();
    const member = await person();
    const user = await makeUser();
    await signInThroughForm(member, user.email, TEST_PASSWORD);
    await expectText(nav(member.page), 'Projects');
    await expectCount(nav(member.page).getByRole('link', { name: 'Users' }), 0);
    const { page } = admin;
    await signInThroughForm(admin, demo('admin').email, demo('admin').password);
    await page.goto(admin.url('/admin/users'));

    await userRow(page, demo('admin').email);
    await page.getByRole('button', { name: `Actions for ${demo('admin').email}` }).click();
    await expectCount(page.getByRole('menuitem', { name: 'Send reset link' }), 1);
    await expectCount(page.getByRole('menuitem'), 1);
    await page.keyboard.press('Escape');
    await expectCount(page.getByRole('menuitem'), 0);

    const row = await userRow(page, user.email);
    await expectText(row.locator('td.mat-column-siteRole'), 'member');
    await rowAction(page, user.email, 'Make admin');
    await (await openedDialog(page)).getByRole('button', { name: 'Make admin', exact: true }).click();
    await expectText(row.locator('td.mat-column-siteRole'), 'admin');

    await member.page.reload();
    await expectText(nav(member.page).getByRole('link', { name: 'Users' }), 'Users');
    await nav(member.page).getByRole('link', { name: 'Users' }).click();
    await expectText(member.page.getByRole('heading', { level: 1 }), 'Users');
    expectNoForeignRequests(admin);
    expectNoForeignRequests(member);
  });
});
