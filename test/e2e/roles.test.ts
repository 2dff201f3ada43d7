import { expect } from 'chai';
import type { Browser, Page } from 'playwright-core';
import { chooseOption, explainFailure, freshApp, listedCodes, openedDialog, type WatchedApp } from './support/app-session';
import { launchBrowser, signInThroughForm } from './support/browser';
import { demo, LAMINATE, OXIDES, PILOT, projectCodesOf, projectCount, projectIdOf, type DemoRole } from './support/demo-lab';
import { expectCount, expectNoForeignRequests, expectPath, expectText, expectValue, fieldError } from './support/page-checks';

/** The demo scenario's own memberships (README); tests may add more, never take these away. */
const SCENARIO_PROJECTS: Record<Exclude<DemoRole, 'admin'>, string[]> = {
  lead: [LAMINATE.code, OXIDES.code],
  researcher: [LAMINATE.code, OXIDES.code],
  reviewer: [LAMINATE.code],
  guest: [LAMINATE.code],
};

function nav(page: Page) {
  return page.getByRole('navigation', { name: 'Main navigation' });
}

async function chooseStatus(page: Page, status: 'Active' | 'Archived' | 'All'): Promise<void> {
  await chooseOption(page, page.getByRole('combobox', { name: 'Status' }), status);
}

/** Opens KV-LAM-24 from the project list, as a person would, and waits for its members. */
async function openLaminate(page: Page): Promise<void> {
  await page.getByRole('link', { name: LAMINATE.name }).click();
  await expectText(page.getByRole('heading', { level: 1 }), LAMINATE.name);
  await expectText(page.getByRole('table', { name: /Members/ }), demo('guest').displayName);
}

describe('e2e: what each demo role sees and may do', function () {
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

  /** Signs in and checks the list holds exactly the person's active projects, and no administration links. */
  async function signInAndCheckList(role: Exclude<DemoRole, 'admin'>): Promise<void> {
    const person = demo(role);
    const { page } = app;
    await signInThroughForm(app, person.email, person.password);

    const expected = await projectCodesOf(person.email, 'active');
    expect(expected, 'the demo memberships are still in place').to.include.members(SCENARIO_PROJECTS[role]);
    await expectValue('codes in the project list', () => listedCodes(page), expected);

    await expectText(nav(page), 'Projects');
    await expectCount(nav(page).getByRole('link', { name: 'Users' }), 0);
    await expectCount(nav(page).getByRole('link', { name: 'Mail outbox' }), 0);
  }

  it('when the lead signs in, then exactly their projects are listed (archived ones under Archived), and KV-LAM-24 offers member and project controls but refuses a too-short name beside Name', async () => {
    const lead = demo('lead');
    const guest = demo('guest');
    const { page } = app;
    await signInAndCheckList('lead');

    const archived = await projectCodesOf(lead.email, 'archived');
    expect(archived).to.include(PILOT.code);
    await chooseStatus(page, 'Archived');
    await expectValue('archived codes', () => listedCodes(page), archived);
    await chooseStatus(page, 'All');
    const all = [...(await projectCodesOf(lead.email, 'active')), ...archived].sort();
    await expectValue('all codes', () => listedCodes(page), all);

    await openLaminate(page);
    await expectText(page.locator('ef-role-permissions'), 'You are a lead in this project.');
    await expectCount(page.getByRole('button', { name: 'Add member' }), 1);
    await expectCount(page.getByRole('button', { name: 'Archive project' }), 1);
    await expectCount(page.getByRole('combobox', { name: `Role of ${guest.displayName}` }), 1);
    await expectCount(page.getByRole('button', { name: `Remove ${guest.displayName}` }), 1);

    await page.getByRole('button', { name: 'Edit project' }).click();
    const dialog = await openedDialog(page);
    await dialog.getByLabel('Name', { exact: true }).fill('ab');
    await dialog.getByRole('button', { name: 'Save' }).click();
    await expectText(fieldError(dialog, 'Name'), 'Use at least 3 characters.');
    await dialog.getByRole('button', { name: 'Cancel' }).click();
    await expectCount(page.getByRole('dialog'), 0);
    await expectText(page.getByRole('heading', { level: 1 }), LAMINATE.name);
    expectNoForeignRequests(app);
  });

  for (const role of ['researcher', 'reviewer', 'guest'] as const) {
    it(`when the ${role} signs in, then exactly their projects are listed, and KV-LAM-24 opens without member or project controls`, async () => {
      const { page } = app;
      await signInAndCheckList(role);

      await openLaminate(page);
      // The page has drawn the project (and so its `allowed` list) before anything is counted.
      await expectText(page.locator('ef-role-permissions'), `You are a ${role} in this project.`);
      for (const name of ['Edit project', 'Archive project', 'Add member', `Remove ${demo('guest').displayName}`]) {
        await expectCount(page.getByRole('button', { name }), 0);
      }
      await expectCount(page.getByRole('combobox', { name: /^Role of / }), 0);
      await expectCount(page.getByLabel('E-mail'), 0);
      expectNoForeignRequests(app);
    });
  }

  it('when the admin signs in, then every project is listed, archived ones under Archived and All, and the administration links show', async () => {
    const admin = demo('admin');
    const { page } = app;
    await signInThroughForm(app, admin.email, admin.password);
    await expectText(nav(page).getByRole('link', { name: 'Users' }), 'Users');
    await expectText(nav(page).getByRole('link', { name: 'Mail outbox' }), 'Mail outbox');

    const rangeLabel = page.locator('.mat-mdc-paginator-range-label');
    await expectText(rangeLabel, new RegExp(`of ${await projectCount(['active'])}$`));
    await page.getByLabel('Filter').fill('KV-');
    await expectValue('active demo projects', () => listedCodes(page), [LAMINATE.code, OXIDES.code]);

    await chooseStatus(page, 'Archived');
    await expectValue('archived demo projects', () => listedCodes(page), [PILOT.code]);
    // The admin is no member of the pilot and reads it with a site admin's rights.
    await expectText(page.locator('td.mat-column-myRole'), 'site admin');

    await chooseStatus(page, 'All');
    await expectValue('all demo projects', () => listedCodes(page), [LAMINATE.code, OXIDES.code, PILOT.code].sort());
    await page.getByLabel('Filter').fill('');
    await expectText(rangeLabel, new RegExp(`of ${await projectCount(['active', 'archived'])}$`));
    expectNoForeignRequests(app);
  });

  it('when a member types the address of the user administration, then they are turned away to their projects', async () => {
    const researcher = demo('researcher');
    const { page } = app;
    await signInThroughForm(app, researcher.email, researcher.password);

    for (const path of ['/admin/users', '/admin/mail']) {
      await page.goto(app.url(path));
      await expectPath(page, '/projects');
      await expectText(page.getByRole('heading', { level: 1 }), 'Projects');
      await expectCount(page.getByRole('button', { name: 'Invite user' }), 0);
    }
    expectNoForeignRequests(app);
  });

  it('when the guest types the address of a project they are not in, then the page says it was not found and shows nothing of it', async () => {
    const guest = demo('guest');
    const { page } = app;
    await signInThroughForm(app, guest.email, guest.password);

    await page.goto(app.url(`/projects/${await projectIdOf(OXIDES.code)}`));

    await expectText(page.getByRole('alert'), 'The project was not found.');
    await expectCount(page.getByRole('heading', { level: 1 }), 0);
    await expectCount(page.getByText(OXIDES.name), 0);
    expectNoForeignRequests(app);
  });
});
