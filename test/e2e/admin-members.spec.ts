// Issue 2, browser: the admin starts a project, adds a member on the project page, changes the
// member's roles and removes them; the activity list records each step.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import {
  demoPeople,
  demoProjects,
  launchBrowser,
  saveScreenshot,
  signInAs,
  type BrowserSession,
} from '../support/browser';

// A job number of its own per run, so runs against the same test database do not collide.
const stamp = Date.now().toString(36).toUpperCase();
const jobNumber = `E2E-${stamp}`;
const projectName = `Browser test job ${stamp}`;

describe('admin (browser)', () => {
  let ada: BrowserSession;

  beforeAll(async () => {
    ada = await launchBrowser();
    await signInAs(ada.page, demoPeople.ada);
  });
  afterAll(async () => {
    await ada?.close();
  });

  it('refuses a duplicate job number by the Job no. field', async () => {
    const { page } = ada;
    await page.goto('/');
    await page.getByRole('button', { name: 'New project' }).click();
    const form = page.getByRole('form', { name: 'New project' });
    await form.getByLabel('Job no.').fill(demoProjects.footbridge.jobNumber);
    await form.getByLabel('Name').fill('A second footbridge');
    await form.getByLabel('Client').fill('Kestrel Quay Harbour Trust');
    await form.getByLabel('Site').fill('West Basin');
    await form.getByRole('button', { name: 'Create project' }).click();
    const job = form.getByLabel('Job no.');
    await expect.poll(() => job.getAttribute('aria-invalid')).toBe('true');
    const errorId = (await job.getAttribute('aria-describedby')) ?? '';
    expect(errorId).not.toBe('');
    expect((await page.locator(`[id="${errorId}"]`).textContent())?.length).toBeGreaterThan(0);
    await saveScreenshot(page, 'new-project-duplicate');
    await form.getByRole('button', { name: 'Cancel' }).click();
  });

  it('starts a project and lands on its page', async () => {
    const { page } = ada;
    await page.goto('/');
    await page.getByRole('button', { name: 'New project' }).click();
    const form = page.getByRole('form', { name: 'New project' });
    await form.getByLabel('Job no.').fill(jobNumber);
    await form.getByLabel('Name').fill(projectName);
    await form.getByLabel('Client').fill('Invented Client Ltd');
    await form.getByLabel('Site').fill('Plot 7, North Quay');
    await form.getByRole('button', { name: 'Create project' }).click();
    await page.getByRole('heading', { name: projectName }).waitFor();
    expect(new URL(page.url()).pathname).toMatch(/^\/projects\/\d+$/);
    await page.getByText('No members yet').waitFor();
    await page.getByRole('list', { name: 'Activity' }).getByText('created the project').waitFor();
  });

  it('corrects the project details from the header', async () => {
    const { page } = ada;
    await page.getByRole('button', { name: 'Edit details' }).click();
    const form = page.getByRole('form', { name: 'Edit project details' });
    expect(await form.getByLabel('Job no.').inputValue()).toBe(jobNumber);
    await form.getByLabel('Site').fill('Plot 8, North Quay');
    await form.getByRole('button', { name: 'Save details' }).click();
    await page.getByRole('heading', { name: projectName }).waitFor();
    await page.getByText('Plot 8, North Quay', { exact: true }).waitFor();
    await page
      .getByRole('list', { name: 'Activity' })
      .getByText('changed the project details')
      .waitFor();
    expect(await page.title()).toBe(`${jobNumber} ${projectName} · Modewright`);
  });

  it('names the e-mail field when no one has that e-mail', async () => {
    const { page } = ada;
    const form = page.getByRole('form', { name: 'Add a member' });
    await form.getByLabel("Member's e-mail").fill('no.such.person@brackwater.example');
    await form.getByRole('checkbox', { name: 'Checker' }).check();
    await form.getByRole('button', { name: 'Add member' }).click();
    const email = form.getByLabel("Member's e-mail");
    await expect.poll(() => email.getAttribute('aria-invalid')).toBe('true');
  });

  it('adds a member on the project page', async () => {
    const { page } = ada;
    const form = page.getByRole('form', { name: 'Add a member' });
    await form.getByLabel("Member's e-mail").fill(demoPeople.tomasz.email);
    const checker = form.getByRole('checkbox', { name: 'Checker' });
    if (!(await checker.isChecked())) await checker.check();
    await form.getByRole('button', { name: 'Add member' }).click();
    await form.getByText(`${demoPeople.tomasz.name} was added to the project.`).waitFor();

    const row = page.getByRole('table', { name: 'Members' }).getByRole('row', {
      name: demoPeople.tomasz.name,
    });
    await row.waitFor();
    expect(await row.getByText('Checker', { exact: true }).count()).toBe(1);
    await page.getByRole('list', { name: 'Activity' }).getByText('added a member').waitFor();
    await saveScreenshot(page, 'project-admin');
  });

  it('lets the added member see the project', async () => {
    const tomasz = await launchBrowser();
    try {
      await signInAs(tomasz.page, demoPeople.tomasz);
      const table = tomasz.page.getByRole('table', { name: 'Projects' });
      await table.getByRole('cell', { name: jobNumber, exact: true }).waitFor();
    } finally {
      await tomasz.close();
    }
  });

  it("changes the member's roles and then removes them", async () => {
    const { page } = ada;
    const members = page.getByRole('table', { name: 'Members' });
    await page.getByRole('button', { name: `Change roles of ${demoPeople.tomasz.name}` }).click();
    const rolesForm = page.getByRole('form', { name: `Roles of ${demoPeople.tomasz.name}` });
    // The inline editor takes the focus (first box), and gives it back when it closes.
    await expect
      .poll(() => page.evaluate(() => (document.activeElement as HTMLInputElement).value))
      .toBe('author');
    // Keyboard only: Tab to the Viewer box (author, checker, principal, viewer), Space, Enter.
    for (let i = 0; i < 3; i += 1) await page.keyboard.press('Tab');
    await page.keyboard.press('Space');
    expect(await rolesForm.getByRole('checkbox', { name: 'Viewer' }).isChecked()).toBe(true);
    await page.keyboard.press('Enter');
    const row = members.getByRole('row', { name: demoPeople.tomasz.name });
    await row.getByText('Viewer', { exact: true }).waitFor();
    await expect
      .poll(() => page.evaluate(() => document.activeElement?.getAttribute('aria-label')))
      .toBe(`Change roles of ${demoPeople.tomasz.name}`);
    expect(await row.getByText('Checker', { exact: true }).count()).toBe(1);
    await page
      .getByRole('list', { name: 'Activity' })
      .getByText('changed the roles of a member')
      .waitFor();

    await page.getByRole('button', { name: `Remove ${demoPeople.tomasz.name}` }).click();
    await page
      .getByRole('button', { name: `Remove ${demoPeople.tomasz.name}` })
      .and(page.locator('.text-fail'))
      .click();
    await page.getByText('No members yet').waitFor();
    await page.getByRole('list', { name: 'Activity' }).getByText('removed a member').waitFor();
  });
});
