import { expect } from 'chai';
import type { Browser, Locator } from 'playwright-core';
import { explainFailure, freshApp, type WatchedApp } from './support/app-session';
import { launchBrowser, signInThroughForm } from './support/browser';
import { demo, LAMINATE, projectIdOf } from './support/demo-lab';
import { expectNoForeignRequests, expectPath, expectText } from './support/page-checks';

describe('e2e: every top-level page', function () {
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

  it('when each page is loaded once, signed out and then as the admin, then none logs a console error, fails a request or asks another origin for anything', async () => {
    const { page } = app;
    /** Loads `path` and waits for its heading and for `ready`, the part drawn from the server's data. */
    const visit = async (path: string, heading: string, ready: Locator, readyText: string | RegExp, landsOn = path) => {
      await page.goto(app.url(path));
      await expectText(page.getByRole('heading', { level: 1 }), heading);
      await expectText(ready, readyText);
      await expectPath(page, landsOn);
    };
    const admin = demo('admin');
    const main = page.locator('main');

    await visit('/sign-in', 'Sign in', page.getByRole('button', { name: `Fill in ${admin.email}` }), 'Fill in');
    await visit('/forgot-password', 'Forgot password', main, 'Back to sign-in');
    await visit('/reset-password', 'Set a password', page.getByRole('alert'), 'missing its code');
    await visit('/a/page/that/does/not/exist', 'Page not found', main, 'Go to projects');
    await signInThroughForm(app, admin.email, admin.password);
    // Other tests add projects, so the first page of the admin's list need not hold the demo ones.
    const projectTotal = page.locator('.mat-mdc-paginator-range-label');
    await visit('/', 'Projects', projectTotal, / of [1-9]\d*$/, '/projects');
    await visit('/projects', 'Projects', projectTotal, / of [1-9]\d*$/);
    await visit(`/projects/${await projectIdOf(LAMINATE.code)}`, LAMINATE.name, page.locator('#members-heading'), 'Members (');
    await visit('/account', 'Account', page.locator('dl.profile'), admin.email);
    await visit('/admin', 'Users', page.locator('.mat-mdc-paginator-range-label'), / of [1-9]\d*$/, '/admin/users');
    await visit('/admin/mail', 'Mail outbox', main, /Choose a message|No mail yet/);
    // Whatever the last page still had in flight has answered before the check.
    await page.waitForLoadState('networkidle');

    expect(app.troubles, 'console errors and failed requests').to.deep.equal([]);
    expectNoForeignRequests(app);
  });
});
