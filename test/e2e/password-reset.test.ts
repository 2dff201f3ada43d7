import { expect } from 'chai';
import type { Browser, Page } from 'playwright-core';
import { ApiClient } from '../support/api-client';
import { makeUser, TEST_PASSWORD } from '../support/fixtures';
import { waitForMail } from '../support/mail-box';
import { explainFailure, freshApp, submitSignIn, type WatchedApp } from './support/app-session';
import { launchBrowser } from './support/browser';
import { passwordLinkIn } from './support/mail-links';
import { expectCount, expectNoForeignRequests, expectPath, expectText, fieldError } from './support/page-checks';

const SUBJECT = /set a new password/;
const NEW_PASSWORD = 'austenite-twins-at-50-percent';

async function choosePassword(page: Page, password: string, confirmation = password): Promise<void> {
  await page.getByLabel('New password', { exact: true }).fill(password);
  await page.getByLabel('Confirm new password', { exact: true }).fill(confirmation);
  await page.getByRole('button', { name: 'Set password' }).click();
}

describe('e2e: password reset by e-mailed link', function () {
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

  it('when a user asks for a link and follows it, then a malformed address, a short and a mistyped password are refused, and the new password signs in instead of the old one', async () => {
    const user = await makeUser();
    const { page } = app;
    await page.goto(app.url('/sign-in'));
    await page.getByRole('link', { name: 'Forgot password?' }).click();
    await expectPath(page, '/forgot-password');

    await page.getByLabel('E-mail').fill('someone.example.test');
    await page.getByRole('button', { name: 'Send reset link' }).click();
    await expectText(fieldError(page, 'E-mail'), 'Enter a valid e-mail address.');
    await page.getByLabel('E-mail').fill(user.email);
    await page.getByRole('button', { name: 'Send reset link' }).click();
    await expectText(page.getByRole('status'), 'If an account exists for that address, a link is on its way.');

    await page.goto(passwordLinkIn(await waitForMail(user.email, SUBJECT)));
    await choosePassword(page, 'too-short');
    await expectText(fieldError(page, 'New password'), 'Use at least 10 characters.');
    await choosePassword(page, NEW_PASSWORD, `${NEW_PASSWORD}!`);
    await expectText(fieldError(page, 'Confirm new password'), 'The two passwords differ.');
    await choosePassword(page, NEW_PASSWORD);
    await expectPath(page, '/sign-in?notice=password-set');
    await expectText(page.getByRole('status'), 'Your password is set. Sign in with it.');

    await submitSignIn(app, user.email, TEST_PASSWORD);
    await expectText(page.getByRole('alert'), 'The e-mail address or password is wrong.');
    await submitSignIn(app, user.email, NEW_PASSWORD);
    await expectPath(page, '/projects');
    await expectText(page.getByRole('button', { name: 'Account menu' }), user.displayName);
    expectNoForeignRequests(app);
  });

  it('when a used link is opened again, then the page says at once that it has already been used and offers a new one, with no password form', async () => {
    const user = await makeUser();
    const { page } = app;
    expect((await new ApiClient(app.url('')).post('/api/auth/password-reset', { email: user.email })).status).to.equal(202);
    const link = passwordLinkIn(await waitForMail(user.email, SUBJECT));
    await page.goto(link);
    await choosePassword(page, NEW_PASSWORD);
    await expectPath(page, '/sign-in?notice=password-set');

    await page.goto(link);

    await expectText(page.getByRole('alert'), 'This link has already been used. Ask for a new one if you still need it.');
    await expectCount(page.getByRole('button', { name: 'Set password' }), 0);
    await expectCount(page.getByLabel('New password'), 0);
    await page.getByRole('link', { name: 'Request a new link' }).click();
    await expectPath(page, '/forgot-password');
    expectNoForeignRequests(app);
  });

  it('when the reset page is opened without its code, then it says the link is incomplete and offers a new one', async () => {
    const { page } = app;
    await page.goto(app.url('/reset-password'));

    await expectText(page.getByRole('alert'), 'This page needs the link from your e-mail, and that link is missing its code.');
    await expectCount(page.getByRole('button', { name: 'Set password' }), 0);
    await page.getByRole('link', { name: 'Request a new link' }).click();
    await expectPath(page, '/forgot-password');
    await expectText(page.getByRole('heading', { level: 1 }), 'Forgot password');
    expectNoForeignRequests(app);
  });
});
