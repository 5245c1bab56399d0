// Browser: the printed package reads as a calculation: a text block's Markdown is set as
// headings and paragraphs with its formulas typeset, not printed as source; calc, modes and
// criteria blocks keep their numbered source lines above their results.
import { readFile } from 'node:fs/promises';
import { describe, expect, it } from 'vitest';
import { saveScreenshot } from '../support/browser';
import { openDemoRevision, useAuthorBrowser } from './editor-helpers';

describe('print view (browser)', () => {
  const session = useAuthorBrowser();

  it('prints a text block as set text and a calc block as numbered lines', async () => {
    const { page } = session();
    await openDemoRevision(page, 'DYN-01', 2);
    await page.getByRole('link', { name: 'Print' }).first().click();

    // The demo sheet's first block (seeds/02_demo_sheets.ts) opens "## Deck natural frequencies".
    const text = page.getByRole('region', { name: 'Block 1 (text)' });
    await text.getByRole('heading', { name: 'Deck natural frequencies', level: 2 }).waitFor();
    expect(await text.innerText()).not.toContain('##');
    expect(await text.locator('.katex').count()).toBeGreaterThan(0);

    const calc = page.getByRole('region', { name: 'Block 2 (calc)' });
    expect(await calc.locator('pre').innerText()).toMatch(/^\s+1 {2}L = 31\.5 m/);
    await saveScreenshot(page, 'print-dyn-01');
    // Paper has no downloads.
    expect(await page.getByRole('button', { name: 'Modes table' }).count()).toBe(0);
  });

  it('offers the modes of a revision as CSV, named by sheet, revision and block', async () => {
    const { page } = session();
    await openDemoRevision(page, 'DYN-01', 2);
    const [file] = await Promise.all([
      page.waitForEvent('download'),
      page.getByRole('button', { name: 'Modes table' }).first().click(),
    ]);
    expect(file.suggestedFilename()).toBe('DYN-01_Rev2_deck_v_modes.csv');
    const rows = (await readFile(await file.path(), 'utf8'))
      .trim()
      .split('\r\n')
      .map((line) => line.split(','));
    // count: 3 in the demo's deck_v block; f₁ in full, the 3.072 Hz the page shows to 4 figures.
    expect(rows).toHaveLength(4);
    expect(rows[0]![1]).toBe('f (Hz)');
    expect(Number(rows[1]![1]).toPrecision(4)).toBe('3.072');
    expect(rows[1]![1]!.length).toBeGreaterThan(8);
  });
});
