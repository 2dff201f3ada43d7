import { expect } from 'chai';
import type { Browser } from 'playwright-core';
import { makeUser, TEST_PASSWORD } from '../support/fixtures';
import { explainFailure, freshApp, signOutThroughMenu, submitSignIn, type WatchedApp } from './support/app-session';
import { launchBrowser, signInThroughForm } from './support/browser';
import { demo, LAMINATE, projectIdOf } from './support/demo-lab';
import { expectNoForeignRequests, expectPath, expectText, expectValue, fieldError } from './support/page-checks';

describe("e2e: signing in and out, and changing one's password", function () {
  this.timeout(60_000);
  let browser: Browser;
  let closeBrowser: () => Promise<void>;
  let app: WatchedApp;

  before(async () => {
    ({ browser, close: closeBrowser } = await launchBrowser());
  });
  after(async () => closeBrowser?.());
  beforeEach(async () => {
    app = await freshApp(browser);
  });
  afterEach(async function () {
    await explainFailure(this.currentTest, app);
    await app?.context.close();
  });

  it('when a visitor picks a demo account with its Fill in button and signs in, then the project list opens under their name', async () => {
    const guest = demo('guest');
    const { page } = app;
    await page.goto(app.url('/sign-in'));

    await page.getByRole('button', { name: `Fill in ${guest.email}` }).click();
    await expectValue('the filled-in address', () => page.getByLabel('E-mail').inputValue(), guest.email);
    await page.getByRole('button', { name: 'Sign in' }).click();

    await expectPath(page, '/projects');
    await expectText(page.getByRole('button', { name: 'Account menu' }), guest.displayName);
    await expectText(page.getByRole('heading', { level: 1 }), 'Projects');
    expectNoForeignRequests(app);
  });

  it('when someone signs in with a wrong password or a malformed address, then they see why and stay signed out on /sign-in', async () => {
    const guest = demo('guest');
    const { page } = app;

    await submitSignIn(app, 'not-an-address', guest.password);
    await expectText(fieldError(page, 'E-mail'), 'Enter a valid e-mail address.');

    await submitSignIn(app, guest.email, 'not-the-guest-password');
    await expectText(page.getByRole('alert'), 'The e-mail address or password is wrong.');
    await expectPath(page, '/sign-in');

    // The refusal signed nobody in: a signed-in page still sends the visitor back.
    await page.goto(app.url('/projects'));
    await expectPath(page, '/sign-in?returnUrl=%2Fprojects');
    await expectText(page.getByRole('heading', { level: 1 }), 'Sign in');
    expectNoForeignRequests(app);
  });

  it('when a signed-in user signs out, then the sign-in page shows and a reload stays signed out', async () => {
    const lead = demo('lead');
    const { page } = app;
    await signInThroughForm(app, lead.email, lead.password);
    await expectText(page.getByRole('button', { name: 'Account menu' }), lead.displayName);

    await signOutThroughMenu(page);
    await page.reload();

    await expectPath(page, '/sign-in');
    await expectText(page.getByRole('heading', { level: 1 }), 'Sign in');
    await page.goto(app.url('/projects'));
    await expectPath(page, '/sign-in?returnUrl=%2Fprojects');
    expect(await page.getByRole('button', { name: 'Account menu' }).count()).to.equal(0);
    expectNoForeignRequests(app);
  });

  it('when a signed-out visitor opens a project address, then they sign in first and arrive at that project', async () => {
    const researcher = demo('researcher');
    const { page } = app;
    const projectPath = `/projects/${await projectIdOf(LAMINATE.code)}`;

    await page.goto(app.url(projectPath));
    await expectPath(page, `/sign-in?returnUrl=${encodeURIComponent(projectPath)}`);
    await submitSignIn(app, researcher.email, researcher.password);

    await expectPath(page, projectPath);
    await expectText(page.getByRole('heading', { level: 1 }), LAMINATE.name);
    expectNoForeignRequests(app);
  });

  it('when a sign-in link asks to return to another site, then signing in stays on the app', async () => {
    const reviewer = demo('reviewer');
    const { page } = app;

    await page.goto(app.url(`/sign-in?returnUrl=${encodeURIComponent('//elsewhere.invalid/collect')}`));
    await submitSignIn(app, reviewer.email, reviewer.password);

    await expectPath(page, '/projects');
    await expectText(page.getByRole('heading', { level: 1 }), 'Projects');
    expect(new URL(page.url()).origin).to.equal(new URL(app.url('/')).origin);
    expectNoForeignRequests(app);
  });

  it('when a user changes their password on the Account page, then a wrong current password is refused beside its field, and afterwards only the new password signs in', async () => {
    const user = await makeUser();
    const newPassword = 'martensite-needles-9';
    const { page } = app;
    await signInThroughForm(app, user.email, TEST_PASSWORD);
    await page.getByRole('button', { name: 'Account menu' }).click();
    await page.getByRole('menuitem', { name: 'Account' }).click();
    await expectText(page.locator('dl.profile'), user.email);

    await page.getByLabel('Current password', { exact: true }).fill('not-my-password');
    await page.getByLabel('New password', { exact: true }).fill(newPassword);
    await page.getByLabel('Confirm new password', { exact: true }).fill(newPassword);
    await page.getByRole('button', { name: 'Change password' }).click();
    await expectText(fieldError(page, 'Current password'), 'The current password is wrong.');

    await page.getByLabel('Current password', { exact: true }).fill(TEST_PASSWORD);
    await page.getByRole('button', { name: 'Change password' }).click();
    await expectText(page.getByRole('status'), 'Your password is changed.');
    expect(await page.getByLabel('New password', { exact: true }).inputValue(), 'the form is cleared').to.equal('');

    await signOutThroughMenu(page);
    await submitSignIn(app, user.email, TEST_PASSWORD);
    await expectText(page.getByRole('alert'), 'The e-mail address or password is wrong.');
    await submitSignIn(app, user.email, newPassword);
    await expectPath(page, '/projects');
    expectNoForeignRequests(app);
  });
});
