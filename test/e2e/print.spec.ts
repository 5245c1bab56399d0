// Issue 8, browser: the printed package reads as a calculation: a text block's Markdown is set as
// headings and paragraphs with its formulas typeset, not printed as source; calc, modes and
// criteria blocks keep their numbered source lines above their results.
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
  });
});
