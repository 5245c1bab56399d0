// Browser: the author builds a three-storey frame sheet from storey data, runs the
// modes, sees the frequencies and the mass ratios, adds a criterion that fails and sees it fail.
// Screenshots of the text, calc, modes and criteria blocks go to test-results/screenshots/.
import { readFile } from 'node:fs/promises';
import { describe, expect, it } from 'vitest';
import { saveScreenshot } from '../support/browser';
import {
  RUN,
  addBlock,
  block,
  column,
  newSheet,
  relative,
  shotPath,
  uniformChain,
  waitForResults,
  waitSaved,
  source,
  useAuthorBrowser,
} from './editor-helpers';

describe('sheet editor: three-storey frame (browser)', () => {
  const session = useAuthorBrowser();

  it('builds a three-storey frame from storey data, solves it and shows a failing criterion', async () => {
    const { page } = session();
    await newSheet(page, `E2E-F${RUN}`, 'Three-storey frame');
    const textIndex = await addBlock(
      page,
      'text',
      '## Three-storey frame\n\nShear building, equal storeys: $k = 30\\,\\mathrm{kN/mm}$.',
    );
    const calcIndex = await addBlock(
      page,
      'calc',
      [
        'm_s = 20 t  # each floor',
        'k_s = 30 kN/mm  # each storey',
        'frame = storey_chain([m_s, m_s, m_s], [k_s, k_s, k_s])',
        'f_hand = sqrt(k_s / m_s) / (2 pi)',
      ].join('\n'),
    );
    await addBlock(
      page,
      'modes',
      [
        'name: sway',
        'stiffness: frame.K',
        'mass: frame.M',
        'method: dense',
        'count: 3',
        'direction: x',
      ].join('\n'),
    );
    await waitForResults(page);

    const table = page.getByRole('table', { name: 'Modes of sway' });
    await table.waitFor();
    // Closed form (REFERENCES.md item 2) with k = 30 kN/mm = 3e7 N/m, m = 20 t = 2e4 kg.
    const expected = uniformChain(3, 3e7, 2e4);
    const f = await column(table, 'f (Hz)');
    expect(f).toHaveLength(3);
    // The table shows 4 significant figures: agree to 0.05 % (half a unit in the 4th figure).
    f.forEach((value, i) => expect(relative(value, expected[i]!.f)).toBeLessThan(5e-4));
    // Mass ratios to the shown 0.1 %: within 0.06 percentage points.
    const ratios = await column(table, 'Eff. mass');
    ratios.forEach((value, i) =>
      expect(Math.abs(value - 100 * expected[i]!.ratio)).toBeLessThan(0.06),
    );
    const cumulative = await column(table, 'Cumulative');
    expect(Math.abs(cumulative[2]! - 100)).toBeLessThan(0.06);
    // The dense method is direct: no iteration count, a dash in each row rather than a 0.
    expect(await table.locator('tbody tr td:last-child').allInnerTexts()).toEqual(['—', '—', '—']);
    // The table as CSV, every value in full: the closed form to 1e-12, not to the 4 figures shown.
    const [file] = await Promise.all([
      page.waitForEvent('download'),
      page.getByRole('button', { name: 'Modes table' }).click(),
    ]);
    expect(file.suggestedFilename()).toBe(`E2E-F${RUN}_draft_sway_modes.csv`);
    const csv = await readFile(await file.path(), 'utf8');
    const rows = csv
      .trim()
      .split('\r\n')
      .map((line) => line.split(','));
    expect(rows[0]!.slice(0, 2)).toEqual(['mode', 'f (Hz)']);
    expect(rows).toHaveLength(4);
    rows
      .slice(1)
      .forEach((row, i) => expect(relative(Number(row[1]), expected[i]!.f)).toBeLessThan(1e-12));
    // …shares of rᵀMr, the three floors of 20 t.
    await page.getByText('Effective masses are shares of rᵀMr = 60 t in the direction x').waitFor();
    await page.getByText(/Sturm check/).waitFor();
    await page.getByRole('figure', { name: 'Mode shapes' }).waitFor();
    await saveScreenshot(page, 'editor-modes');

    // A criterion that cannot pass: the first frequency is ≈ 2.7 Hz.
    await addBlock(
      page,
      'criteria',
      [
        'sway.cumulative[3] >= 0.90  # 90 % of the mass',
        'sway.f[1] >= 5 Hz  # deliberately strict',
      ].join('\n'),
    );
    await waitForResults(page);
    const criteria = page.getByRole('list', { name: 'Criteria' });
    await criteria
      .getByRole('listitem')
      .filter({ hasText: 'deliberately strict' })
      .getByText('Failed')
      .waitFor();
    await criteria
      .getByRole('listitem')
      .filter({ hasText: '90 % of the mass' })
      .getByText('Passed')
      .waitFor();
    const summary = page.getByTestId('criteria-summary');
    expect(await summary.innerText()).toMatch(/1 passed\s*1 failed/);
    await waitSaved(page);
    await saveScreenshot(page, 'editor-criteria');

    // The calc block: formula, substitution, result rendered by KaTeX.
    await block(page, calcIndex, 'calc').locator('.katex').first().waitFor();
    await block(page, calcIndex, 'calc').screenshot({ path: await shotPath('editor-calc') });
    await block(page, textIndex, 'text').screenshot({ path: await shotPath('editor-text') });
  });

  it('completes names in scope and the keys of a modes block', async () => {
    const { page } = session();
    const calc = await addBlock(page, 'calc', 'T_check = ');
    await source(page, calc, 'calc').click();
    await page.keyboard.press('End');
    await page.keyboard.type('sway.cu');
    const list = page.locator('.cm-tooltip-autocomplete');
    await list.getByText('sway.cumulative', { exact: true }).waitFor();
    await page.keyboard.press('Escape');
    const modes = await addBlock(page, 'modes', 'name: check\n');
    await source(page, modes, 'modes').click();
    await page.keyboard.press('ControlOrMeta+End');
    await page.keyboard.press('Control+Space');
    await list.getByText('max iterations', { exact: true }).waitFor();
    await list.getByText('stiffness', { exact: true }).waitFor();
    await page.keyboard.press('Escape');
    await waitSaved(page);
  });
});
