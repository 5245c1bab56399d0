// The firm's template library, in the browser: the demo author saves the pump foundation draft
// (DYN-03, seeds/02_demo_sheets.ts) as a firm template, starts a new sheet from it in "New sheet",
// finds it on the Templates page with where it came from, and deletes it.
import { describe, expect, it } from 'vitest';
import { demoProjects, saveScreenshot } from '../support/browser';
import {
  RUN,
  blockCount,
  projectHref,
  source,
  useAuthorBrowser,
  waitForResults,
} from './editor-helpers';

describe('firm templates (browser)', () => {
  const session = useAuthorBrowser();

  it('saves a sheet as a firm template, starts a sheet from it and deletes it', async () => {
    const { page } = session();
    const name = `Pump foundation ${RUN}`;
    await page.goto(await projectHref(page));
    await page.getByRole('link', { name: 'DYN-03' }).first().click();
    await waitForResults(page);
    const blocks = await blockCount(page);
    const firstText = await source(page, 1, 'text').innerText();

    await page.getByRole('button', { name: 'Save as firm template' }).click();
    const save = page.getByRole('dialog', { name: 'Save as firm template' });
    await save.getByLabel('Template name').fill(name);
    await save.getByLabel('Description').fill('Two-mass block on piles, running speed check.');
    await save.getByRole('button', { name: 'Save template' }).click();
    await page
      .getByRole('status')
      .filter({ hasText: `Saved as the firm template “${name}”` })
      .waitFor();

    // The same name again is refused at its input.
    await page.getByRole('button', { name: 'Save as firm template' }).click();
    await save.getByLabel('Template name').fill(name);
    await save.getByRole('button', { name: 'Save template' }).click();
    await save.getByText(`The firm already has a template named "${name}".`).waitFor();
    await save.getByRole('button', { name: 'Cancel' }).click();

    await page.goto(await projectHref(page));
    await page.getByRole('button', { name: 'New sheet' }).click();
    const dialog = page.getByRole('dialog', { name: 'New sheet' });
    await dialog.getByLabel('Sheet number').fill(`E2E-T${RUN}`);
    await dialog.getByLabel('Title').fill('From the firm library');
    const option = dialog.getByRole('radio', { name: new RegExp(name) });
    await option.check();
    expect(await dialog.getByText(/From BW-2611 · DYN-03 draft, saved by/).count()).toBeGreaterThan(
      0,
    );
    await saveScreenshot(page, 'firm-templates-new-sheet');
    await dialog.getByRole('button', { name: 'Create sheet' }).click();
    await page.getByRole('heading', { name: /From the firm library/ }).waitFor();
    await waitForResults(page);
    expect(await blockCount(page)).toBe(blocks);
    expect(await source(page, 1, 'text').innerText()).toBe(firstText);

    await page
      .getByRole('navigation', { name: 'Main' })
      .getByRole('link', { name: 'Templates' })
      .click();
    const table = page.getByRole('table', { name: 'Firm templates' });
    const row = table.getByRole('row').filter({ hasText: name });
    await row.waitFor();
    expect(await row.getByRole('link').innerText()).toBe(
      `${demoProjects.footbridge.jobNumber} · DYN-03 draft`,
    );
    await saveScreenshot(page, 'firm-templates-page');
    await row.getByRole('button', { name: `Delete ${name}` }).click();
    await row.waitFor({ state: 'detached' });
  });
});
