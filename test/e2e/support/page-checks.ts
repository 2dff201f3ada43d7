import { expect } from 'chai';
import type { Locator, Page } from 'playwright-core';
import type { AppPage } from './browser';

/** How long a check waits for the page to catch up; zoneless Angular redraws a tick after each event. */
const SETTLE_MS = 10_000;
const POLL_MS = 50;

async function poll<T>(read: () => Promise<T>, ok: (value: T) => boolean, timeoutMs: number): Promise<{ ok: boolean; last: T }> {
  const deadline = Date.now() + timeoutMs;
  for (;;) {
    const last = await read();
    if (ok(last)) return { ok: true, last };
    if (Date.now() > deadline) return { ok: false, last };
    await new Promise((r) => setTimeout(r, POLL_MS));
  }
}

/**
 * The text of every element the locator matches, joined by newlines ('' when none match), with white
 * space collapsed. DOM text, not rendered text, so CSS capitals (`text-transform`) do not change it.
 */
async function textOf(locator: Locator): Promise<string> {
  return (await locator.allTextContents()).map((t) => t.replace(/\s+/g, ' ').trim()).join('\n');
}

function contains(text: string, expected: string | RegExp): boolean {
  return typeof expected === 'string' ? text.includes(expected) : expected.test(text);
}

/** Waits until the locator's text contains `expected` (or matches it), else fails saying what was there. */
export async function expectText(locator: Locator, expected: string | RegExp, timeoutMs = SETTLE_MS): Promise<void> {
  const { ok, last } = await poll(() => textOf(locator), (text) => contains(text, expected), timeoutMs);
  if (!ok) expect.fail(`expected ${locator} to show ${String(expected)} within ${timeoutMs} ms; it showed ${JSON.stringify(last)}`);
}

/** Waits until the locator's text no longer contains `unexpected`. */
export async function expectNoText(locator: Locator, unexpected: string | RegExp, timeoutMs = SETTLE_MS): Promise<void> {
  const { ok, last } = await poll(() => textOf(locator), (text) => !contains(text, unexpected), timeoutMs);
  if (!ok) expect.fail(`expected ${locator} to stop showing ${String(unexpected)} within ${timeoutMs} ms; it showed ${JSON.stringify(last)}`);
}

/** Waits until the locator matches exactly `count` elements. */
export async function expectCount(locator: Locator, count: number, timeoutMs = SETTLE_MS): Promise<void> {
  const { ok, last } = await poll(() => locator.count(), (n) => n === count, timeoutMs);
  if (!ok) expect.fail(`expected ${count} of ${locator} within ${timeoutMs} ms; found ${last}`);
}

/** Waits until the page's path (and query, if given) matches. */
export async function expectPath(page: Page, expected: string | RegExp, timeoutMs = SETTLE_MS): Promise<void> {
  const read = async () => {
    const u = new URL(page.url());
    return u.pathname + u.search;
  };
  const matches = (p: string) => (typeof expected === 'string' ? p === expected || p.startsWith(`${expected}?`) : expected.test(p));
  const { ok, last } = await poll(read, matches, timeoutMs);
  if (!ok) expect.fail(`expected the address ${String(expected)} within ${timeoutMs} ms; the page is at ${last}`);
}

/** The error shown beside a form field: the mat-error inside the field whose label is `label`. */
export function fieldError(scope: Page | Locator, label: string): Locator {
  // The inner locator of `has` is matched inside each field, so it must start from the page, not from `scope`.
  const page = 'page' in scope ? scope.page() : scope;
  return scope.locator('mat-form-field').filter({ has: page.getByLabel(label, { exact: true }) }).locator('mat-error');
}

/** Every test ends with this: the page asked nothing of any other origin. */
export function expectNoForeignRequests(app: AppPage): void {
  expect(app.foreignRequests, 'requests to origins other than the app').to.deep.equal([]);
}

/** Waits until `read()` gives a value deeply equal to `expected`, else fails showing the last value. */
export async function expectValue<T>(what: string, read: () => Promise<T>, expected: T, timeoutMs = SETTLE_MS): Promise<void> {
  const same = (value: T) => JSON.stringify(value) === JSON.stringify(expected);
  const { ok, last } = await poll(read, same, timeoutMs);
  if (!ok) expect(last, `${what} after ${timeoutMs} ms`).to.deep.equal(expected);
}
