// Browser: the admin adds a member on the project page, the member then sees the
// project, the admin changes the member's roles (by keyboard) and removes them; the activity list
// records each step.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import {
  demoPeople,
  launchBrowser,
  saveScreenshot,
  signInAs,
  type BrowserSession,
} from '../support/browser';

// A job number of its own per run, so runs against the same test database do not collide.
const stamp = Date.now().toString(36).toUpperCase();
const jobNumber = `E2M-${stamp}`;

describe('admin members (browser)', () => {
  let ada: BrowserSession;

  beforeAll(async () => {
    ada = await launchBrowser();
    await signInAs(ada.page, demoPeople.ada);
    // The project itself is made through the API from the signed-in page (its form is covered by
    // admin-projects.spec.ts), with the same CSRF token exchange the client uses.
    const projectId = await ada.page.evaluate(async (job) => {
      const { csrfToken } = (await (await fetch('/api/auth/csrf')).json()) as { csrfToken: string };
      const res = await fetch('/api/projects', {
        method: 'POST',
        headers: { 'Content-Type': 'application/json', 'X-CSRF-Token': csrfToken },
        body: JSON.stringify({
          jobNumber: job,
          name: `Members test job ${job}`,
          client: 'Invented Client Ltd',
          site: 'Plot 9, North Quay',
        }),
      });
      if (res.status !== 201) throw new Error(`POST /api/projects answered ${res.status}`);
      return ((await res.json()) as { project: { id: number } }).project.id;
    }, jobNumber);
    await ada.page.goto(`/projects/${projectId}`);
    await ada.page.getByText('No members yet').waitFor();
  });
  afterAll(async () => {
    await ada?.close();
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
    await page
      .getByRole('list', { name: 'Activity' })
      .getByText(`added ${demoPeople.tomasz.name} as checker`)
      .waitFor();
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
      .getByText(`changed the roles of ${demoPeople.tomasz.name}`)
      .waitFor();

    await page.getByRole('button', { name: `Remove ${demoPeople.tomasz.name}` }).click();
    await page
      .getByRole('button', { name: `Remove ${demoPeople.tomasz.name}` })
      .and(page.locator('.text-fail'))
      .click();
    await page.getByText('No members yet').waitFor();
    await page
      .getByRole('list', { name: 'Activity' })
      .getByText(`removed ${demoPeople.tomasz.name} from the project`)
      .waitFor();
  });
});
