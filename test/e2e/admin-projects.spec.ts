// Browser: the admin starts a project (a duplicate job number is refused by its field),
// finds it with the filter, and corrects its details; the activity list records each step.
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

describe('admin projects (browser)', () => {
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

  it('finds the new project with the filter on the projects list', async () => {
    const { page } = ada;
    const projectUrl = page.url();
    await page.getByRole('link', { name: 'Projects', exact: true }).click();
    const table = page.getByRole('table', { name: 'Projects' });
    await table.waitFor();
    await page.getByLabel('Filter projects').fill(jobNumber.toLowerCase());
    await expect.poll(() => table.getByRole('row').count()).toBe(2); // header + the project
    await table.getByRole('link', { name: projectName }).click();
    await page.waitForURL(projectUrl);
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
});
