import type { Browser, Locator, Page } from 'playwright-core';
import { launchBrowser, openApp, type AppPage } from './browser';
import { expectCount, expectPath, expectText } from './page-checks';

/** Actions fail after this long instead of playwright's 30 s, so a broken flow reports quickly. */
const ACTION_TIMEOUT_MS = 15_000;

/** An app page that also keeps what went wrong in it, to explain a failed test. */
export interface WatchedApp extends AppPage {
  /** Console errors, uncaught exceptions and failed responses, in order. */
  troubles: string[];
}

/** A fresh context (no cookies) on the app, recording foreign requests and troubles. */
export async function freshApp(browser: Browser): Promise<WatchedApp> {
  const app = await openApp(browser);
  app.context.setDefaultTimeout(ACTION_TIMEOUT_MS);
  app.context.setDefaultNavigationTimeout(ACTION_TIMEOUT_MS);
  const troubles = collectConsoleErrors(app.page);
  app.page.on('response', (res) => {
    if (res.status() >= 400) troubles.push(`HTTP ${res.status()} ${res.request().method()} ${res.url()}`);
  });
  return { ...app, troubles };
}

/**
 * For an afterEach hook: when the test failed, prints where the page was and what went wrong in it,
 * so a failure on this shared machine (a client rebuilt mid-run, say) can be told from a product bug.
 */
export async function explainFailure(test: Mocha.Test | undefined, app: WatchedApp | undefined): Promise<void> {
  if (test?.state !== 'failed' || !app) return;
  const text = await app.page
    .locator('body')
    .innerText({ timeout: 1000 })
    .catch(() => '(no page text)');
  const fields = await app.page
    .locator('input, textarea')
    .evaluateAll((els) => els.map((el) => `${el.getAttribute('formcontrolname') ?? el.getAttribute('type') ?? el.tagName}=${JSON.stringify((el as HTMLInputElement).value)}`))
    .catch(() => []);
  console.log(
    `    page at ${app.page.url()}\n    page text: ${JSON.stringify(text.slice(0, 600))}\n    fields: ${fields.join(', ')}\n    troubles: ${JSON.stringify(app.troubles)}`,
  );
}

/**
 * The hooks a browser test file needs, in one call inside its describe(): one Chromium for the file,
 * a fresh signed-out page for each test, and, when a test fails, where that page was and what went
 * wrong in it. Tests read `session.app` (and `session.browser` for a second page).
 */
export function chromiumPerTest(): { readonly browser: Browser; readonly app: WatchedApp } {
  let browser: Browser | undefined;
  let close: (() => Promise<void>) | undefined;
  let app: WatchedApp | undefined;
  before(async function () {
    this.timeout(60_000);
    ({ browser, close } = await launchBrowser());
  });
  after(async () => close?.());
  beforeEach(async () => {
    app = await freshApp(browser!);
  });
  afterEach(async function () {
    await explainFailure(this.currentTest, app);
    await app?.context.close();
    app = undefined;
  });
  return {
    get browser() {
      return browser!;
    },
    get app() {
      return app!;
    },
  };
}

/** Signs out through the account menu and waits for the sign-in form. */
export async function signOutThroughMenu(page: Page): Promise<void> {
  await page.getByRole('button', { name: 'Account menu' }).click();
  await page.getByRole('menuitem', { name: 'Sign out' }).click();
  await expectPath(page, '/sign-in');
  await expectText(page.getByRole('heading', { level: 1 }), 'Sign in');
}

/** Fills and submits the sign-in form without waiting for any outcome. */
export async function submitSignIn(app: AppPage, email: string, password: string): Promise<void> {
  const { page } = app;
  if (!new URL(page.url()).pathname.startsWith('/sign-in')) await page.goto(app.url('/sign-in'));
  await page.getByLabel('E-mail').fill(email);
  await page.getByLabel('Password', { exact: true }).fill(password);
  await page.getByRole('button', { name: 'Sign in' }).click();
}

/** The codes in the project list's rows, as shown. */
export async function listedCodes(page: Page): Promise<string[]> {
  return (await page.locator('td.mat-column-code').allTextContents()).map((t) => t.trim()).sort();
}

/** Collects console errors and uncaught exceptions of a page. */
export function collectConsoleErrors(page: Page): string[] {
  const errors: string[] = [];
  page.on('console', (msg) => {
    if (msg.type() === 'error') errors.push(`${msg.text()} (${msg.location().url})`);
  });
  page.on('pageerror', (err) => errors.push(`uncaught: ${err.message}`));
  return errors;
}

/** Picks `option` in a Material select and waits for its panel to close, so the next select opens cleanly. */
export async function chooseOption(page: Page, select: Locator, option: string): Promise<void> {
  await select.click();
  await page.getByRole('listbox').getByRole('option', { name: option, exact: true }).click();
  await expectCount(page.getByRole('listbox'), 0);
}

/**
 * The open dialog, once it is ready for typing: Material moves focus into a dialog when its opening
 * animation ends, and typing before that can land while focus moves. On this busy machine that window is long.
 */
export async function openedDialog(page: Page): Promise<Locator> {
  const dialog = page.getByRole('dialog');
  await dialog.waitFor();
  await page.waitForFunction(() => !!document.activeElement?.closest('mat-dialog-container'));
  return dialog;
}
