import { mkdtempSync, rmSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { chromium, type Browser, type BrowserContext, type Page } from 'playwright-core';
import { runningServer } from '../../support/test-server';

/**
 * Debian's Chromium, started for a closed network: headless, no sandbox as root (playwright adds it),
 * nothing phoning home, a fresh profile and config folder per run.
 */
export async function launchBrowser(): Promise<{ browser: Browser; close(): Promise<void> }> {
  const scratch = mkdtempSync(path.join(os.tmpdir(), 'etchfile-chromium-'));
  const browser = await chromium.launch({
    executablePath: process.env['EF_CHROMIUM'] ?? '/usr/bin/chromium',
    headless: true,
    args: [
      '--disable-gpu',
      '--disable-quic',
      '--no-first-run',
      '--disable-background-networking',
      '--disable-component-update',
      '--disable-sync',
      '--disable-dev-shm-usage',
    ],
    env: { ...process.env, XDG_CONFIG_HOME: scratch, TMPDIR: scratch, HOME: scratch },
  });
  return {
    browser,
    async close() {
      await browser.close();
      rmSync(scratch, { recursive: true, force: true });
    },
  };
}

/** A page on the app's origin that records every request made to any other origin. */
export interface AppPage {
  context: BrowserContext;
  page: Page;
  /** URLs the page asked for outside the app's own origin; tests assert this stays empty. */
  foreignRequests: string[];
  url(path: string): string;
}

export async function openApp(browser: Browser): Promise<AppPage> {
  const origin = runningServer().ctx.config.publicUrl;
  const context = await browser.newContext({ viewport: { width: 1280, height: 860 } });
  const page = await context.newPage();
  const foreignRequests: string[] = [];
  page.on('request', (req) => {
    const u = req.url();
    if (!u.startsWith(origin) && !u.startsWith('data:') && !u.startsWith('blob:')) foreignRequests.push(u);
  });
  return { context, page, foreignRequests, url: (p: string) => origin + p };
}

/** How long a sign-in may take on a busy shared machine before it counts as failed. */
const SIGN_IN_MS = 15_000;

/** Signs in through the sign-in form and waits for the project list; a refusal fails at once with its message. */
export async function signInThroughForm(app: AppPage, email: string, password: string): Promise<void> {
  const { page } = app;
  await page.goto(app.url('/sign-in'));
  await page.getByLabel('E-mail').fill(email);
  await page.getByLabel('Password', { exact: true }).fill(password);
  await page.getByRole('button', { name: 'Sign in' }).click();
  const refusal = page.getByRole('alert');
  const deadline = Date.now() + SIGN_IN_MS;
  for (;;) {
    if (new URL(page.url()).pathname === '/projects') return;
    if ((await refusal.count()) > 0) throw new Error(`sign-in as ${email} was refused: ${(await refusal.allTextContents()).join(' ')}`);
    if (Date.now() > deadline) throw new Error(`sign-in as ${email} did not reach /projects within ${SIGN_IN_MS} ms; the page is at ${page.url()}`);
    await new Promise((r) => setTimeout(r, 50));
  }
}
