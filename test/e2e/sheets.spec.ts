// Browser: the sheets table on the project page — sorted and filtered — and the New sheet
// dialog: a taken number is refused at its field, and a template starts a real sheet.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import {
  demoPeople,
  demoProjects,
  launchBrowser,
  saveScreenshot,
  signInAs,
  type BrowserSession,
} from '../support/browser';

const RUN = Date.now().toString(36).slice(-5).toUpperCase();

describe('sheets table (browser)', () => {
  let ines: BrowserSession;

  beforeAll(async () => {
    ines = await launchBrowser();
    ines.page.on('dialog', (d) => void d.accept());
    await signInAs(ines.page, demoPeople.ines);
    const row = ines.page
      .getByRole('table', { name: 'Projects' })
      .getByRole('row')
      .filter({ hasText: demoProjects.footbridge.jobNumber });
    await row.getByRole('link').first().click();
  });
  afterAll(async () => {
    await ines?.close();
  });

  const table = () => ines.page.getByRole('table', { name: 'Sheets of the project' });
  const numbers = async () => table().locator('tbody tr td:first-child').allInnerTexts();

  it('sorts by sheet number both ways and filters by words and status', async () => {
    await table().waitFor();
    // The demo sheets of the seeds: DYN-01 … DYN-03.
    const ascending = await numbers();
    const demo = ascending.filter((n) => /^DYN-0[123]$/.test(n));
    expect(demo).toEqual(['DYN-01', 'DYN-02', 'DYN-03']);
    await table()
      .getByRole('button', { name: /^Sheet/ })
      .click();
    const descending = (await numbers()).filter((n) => /^DYN-0[123]$/.test(n));
    expect(descending).toEqual(['DYN-03', 'DYN-02', 'DYN-01']);
    expect(await table().locator('th[aria-sort="descending"]').count()).toBe(1);

    await ines.page.getByLabel('Filter').fill('four-storey');
    const filtered = await numbers();
    expect(filtered).toContain('DYN-02');
    expect(filtered).not.toContain('DYN-01');
    expect(filtered).not.toContain('DYN-03');
    await ines.page.getByLabel('Filter').fill('');
    await ines.page.getByLabel('Status').selectOption('sealed');
    const sealed = await numbers();
    expect(sealed.includes('DYN-01') && sealed.includes('DYN-02')).toBe(false);
    await ines.page.getByLabel('Status').selectOption('');
    await saveScreenshot(ines.page, 'sheets-table');
  });

  it('refuses a sheet number the project already has, at the number field', async () => {
    const { page } = ines;
    await page.getByRole('button', { name: 'New sheet' }).click();
    const dialog = page.getByRole('dialog', { name: 'New sheet' });
    await dialog.getByLabel('Sheet number').fill('DYN-01');
    await dialog.getByLabel('Title').fill('A second DYN-01');
    await dialog.getByRole('button', { name: 'Create sheet' }).click();
    const number = dialog.getByLabel('Sheet number');
    await expect.poll(() => number.getAttribute('aria-invalid')).toBe('true');
    await saveScreenshot(page, 'sheets-new-duplicate');
    await dialog.getByRole('button', { name: 'Cancel' }).click();
  });

  it('starts a sheet from the pump foundation template', async () => {
    const { page } = ines;
    await page.getByRole('button', { name: 'New sheet' }).click();
    const dialog = page.getByRole('dialog', { name: 'New sheet' });
    await dialog.getByLabel('Sheet number').fill(`E2E-P${RUN}`);
    await dialog.getByLabel('Title').fill('Pump foundation from the template');
    await dialog.getByLabel(/Pump foundation resonance check/).check();
    await saveScreenshot(page, 'sheets-new-dialog');
    await dialog.getByRole('button', { name: 'Create sheet' }).click();
    await page.getByRole('heading', { name: /Pump foundation from the template/ }).waitFor();
    await page.getByText('Results up to date').waitFor({ timeout: 60_000 });
    // The template's criteria are evaluated: each line passed or failed, none an error.
    const criteria = page.getByRole('list', { name: 'Criteria' }).first().getByRole('listitem');
    expect(await criteria.count()).toBeGreaterThan(0);
    const summary = await page.getByTestId('criteria-summary').innerText();
    expect(summary).not.toMatch(/error/);
    await saveScreenshot(page, 'editor-template-pump');
  });
});
