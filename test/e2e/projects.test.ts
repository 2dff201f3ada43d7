import { expect } from 'chai';
import type { Browser, Locator, Page } from 'playwright-core';
import { makeProject, makeUser, TEST_PASSWORD, unique } from '../support/fixtures';
import { chooseOption, explainFailure, freshApp, listedCodes, openedDialog, type WatchedApp } from './support/app-session';
import { launchBrowser, signInThroughForm } from './support/browser';
import { demo, LAMINATE } from './support/demo-lab';
import { expectCount, expectNoForeignRequests, expectNoText, expectPath, expectText, expectValue, fieldError } from './support/page-checks';

function membersTable(page: Page): Locator {
  return page.getByRole('table', { name: /Members/ });
}

describe('e2e: projects and their members', function () {
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

  it('when the researcher creates a project, then bad and taken codes are refused beside Code, and the new project is found with the Filter, opened, and takes the reviewer as a member', async () => {
    const researcher = demo('researcher');
    const reviewer = demo('reviewer');
    const tag = unique().toUpperCase();
    const code = `BOND-${tag}`;
    const name = `Bond line oxides, batch ${tag}`;
    const { page } = app;
    await signInThroughForm(app, researcher.email, researcher.password);

    await page.getByRole('button', { name: 'New project' }).click();
    const dialog = await openedDialog(page);
    await dialog.getByLabel('Code', { exact: true }).fill('B 7');
    await dialog.getByLabel('Name', { exact: true }).fill(name);
    await dialog.getByRole('button', { name: 'Create' }).click();
    await expectText(fieldError(dialog, 'Code'), 'Use 2-20 capital letters, digits or hyphens, e.g. LAM-24.');

    await dialog.getByLabel('Code', { exact: true }).fill(LAMINATE.code);
    await dialog.getByRole('button', { name: 'Create' }).click();
    await expectText(fieldError(dialog, 'Code'), 'This code is taken.');

    // Typed in small letters: the code is saved in capitals.
    await dialog.getByLabel('Code', { exact: true }).fill(code.toLowerCase());
    await dialog.getByLabel('Description', { exact: true }).fill('Oxide chains along the first bond interface after brushing.');
    await dialog.getByRole('button', { name: 'Create' }).click();
    await expectText(page.getByRole('heading', { level: 1 }), name);
    await expectPath(page, /^\/projects\/[0-9a-f-]{36}$/);
    await expectText(page.locator('.head .code'), code);
    await expectText(page.locator('ef-role-permissions'), 'You are a lead in this project.');

    await page.getByRole('link', { name: 'Project list' }).click();
    await page.getByLabel('Filter').fill(tag.toLowerCase());
    await expectValue('codes matching the filter', () => listedCodes(page), [code]);
    await page.getByRole('link', { name }).click();
    await expectText(page.getByRole('heading', { level: 1 }), name);

    const email = page.getByLabel('E-mail', { exact: true });
    const role = page.getByRole('combobox', { name: 'Role', exact: true });
    await email.fill(`nobody-${tag.toLowerCase()}@example.test`);
    await chooseOption(page, role, 'reviewer');
    await page.getByRole('button', { name: 'Add member' }).click();
    await expectText(fieldError(page, 'E-mail'), 'No account uses this address.');
    await expectText(page.locator('#members-heading'), 'Members (1)');

    await email.fill(reviewer.email);
    await page.getByRole('button', { name: 'Add member' }).click();
    await expectText(membersTable(page), reviewer.displayName);
    await expectText(page.getByRole('combobox', { name: `Role of ${reviewer.displayName}` }), 'reviewer');
    await expectText(page.locator('#members-heading'), 'Members (2)');
    expect(await email.inputValue(), 'the add form is cleared').to.equal('');
    expectNoForeignRequests(app);
  });

  it('when a lead renames and archives their project, then an empty name is refused, and the project moves to the archived list until restored', async () => {
    const lead = await makeUser();
    const tag = unique().toUpperCase();
    const project = await makeProject([[lead, 'lead']], { code: `ROLL-${tag}`, name: `Roll bonding trial ${tag}` });
    const renamed = `Roll bonding trial ${tag}, second anneal`;
    const { page } = app;
    await signInThroughForm(app, lead.email, TEST_PASSWORD);
    await page.getByRole('link', { name: project.name }).click();
    await expectText(page.getByRole('heading', { level: 1 }), project.name);

    await page.getByRole('button', { name: 'Edit project' }).click();
    const dialog = await openedDialog(page);
    await dialog.getByLabel('Name', { exact: true }).fill('');
    await dialog.getByRole('button', { name: 'Save' }).click();
    await expectText(fieldError(dialog, 'Name'), 'Required.');
    await dialog.getByLabel('Name', { exact: true }).fill(renamed);
    await dialog.getByRole('button', { name: 'Save' }).click();
    await expectCount(page.getByRole('dialog'), 0);
    await expectText(page.getByRole('heading', { level: 1 }), renamed);

    await page.getByRole('button', { name: 'Archive project' }).click();
    await (await openedDialog(page)).getByRole('button', { name: 'Archive', exact: true }).click();
    await expectText(page.getByRole('status'), 'This project is archived.');
    await expectCount(page.getByRole('button', { name: 'Restore project' }), 1);

    await page.getByRole('link', { name: 'Project list' }).click();
    await expectText(page.getByRole('status'), 'No projects yet.');
    await chooseOption(page, page.getByRole('combobox', { name: 'Status' }), 'Archived');
    await expectValue('archived codes', () => listedCodes(page), [project.code]);

    await page.getByRole('link', { name: renamed }).click();
    await page.getByRole('button', { name: 'Restore project' }).click();
    await expectCount(page.getByRole('button', { name: 'Archive project' }), 1);
    await expectNoText(page.locator('main'), 'This project is archived.');
    await page.getByRole('link', { name: 'Project list' }).click();
    await expectValue('active codes', () => listedCodes(page), [project.code]);
    expectNoForeignRequests(app);
  });

  it("when a lead changes a member's role and removes them, then the list follows, and demoting the only lead is refused with the server's reason", async () => {
    const lead = await makeUser();
    const member = await makeUser();
    const project = await makeProject([
      [lead, 'lead'],
      [member, 'guest'],
    ]);
    const { page } = app;
    await signInThroughForm(app, lead.email, TEST_PASSWORD);
    await page.getByRole('link', { name: project.name }).click();
    await expectText(page.locator('#members-heading'), 'Members (2)');

    const memberRole = page.getByRole('combobox', { name: `Role of ${member.displayName}` });
    await chooseOption(page, memberRole, 'researcher');
    await expectText(memberRole, 'researcher');
    await page.reload();
    await expectText(page.getByRole('combobox', { name: `Role of ${member.displayName}` }), 'researcher');

    const myRole = page.getByRole('combobox', { name: `Role of ${lead.displayName}` });
    await chooseOption(page, myRole, 'guest');
    await expectText(page.getByRole('alert'), 'A project needs at least one lead. Make someone else lead first.');
    await expectText(myRole, 'lead');
    await expectCount(page.getByRole('button', { name: 'Add member' }), 1);

    await page.getByRole('button', { name: `Remove ${member.displayName}` }).click();
    await (await openedDialog(page)).getByRole('button', { name: 'Remove', exact: true }).click();
    await expectText(page.locator('#members-heading'), 'Members (1)');
    await expectNoText(membersTable(page), member.displayName);
    expectNoForeignRequests(app);
  });
});
