// The entries of a large matrix in the browser: a generated 600-element beam (1 200 DOFs, held
// sparse) lists its K's nonzeros under its calc line as a paged table (row, column, value in N/m,
// 50 a page) with the size and nonzeros above it; at a 390 px phone width the page does not widen.
import { describe, expect, it } from 'vitest';
import { saveScreenshot } from '../support/browser';
import {
  RUN,
  addBlock,
  block,
  newSheet,
  relative,
  shotPath,
  useAuthorBrowser,
  waitForResults,
} from './editor-helpers';

describe('sheet editor: the entries of a large matrix (browser)', () => {
  const session = useAuthorBrowser();

  it('pages through the nonzero entries of a generated beam’s K', async () => {
    const { page } = session();
    await newSheet(page, `E2E-ME${RUN}`, 'Deck stiffness entries');
    const gen = await addBlock(
      page,
      'calc',
      'deck = beam({E: 210 GPa, I: 0.02 m^4, mass: 1.5 t/m, length: 120 m, elements: 600, ends: "clamped-free"})',
    );
    await waitForResults(page, 120_000);
    const calc = block(page, gen, 'calc');
    await calc.getByText('Entries of deck.K and deck.M').click();
    const entries = calc.getByRole('region', { name: 'Entries of deck.K' });
    // A clamped–free Hermite beam of 600 elements: 1 200 DOFs. Nonzeros of the lower triangle:
    // w–w and θ–θ of each free node (1 200), θ–w at the tip only (it cancels where two elements
    // meet), 4 couplings to the next node (599 · 4): 3 597; the whole matrix 2 · 3 597 − 1 200.
    await entries
      .getByText(
        'deck.K: 1,200 × 1,200, 5,994 nonzeros (symmetric: the lower triangle is listed). Entries 1–50 of 3,597',
      )
      .waitFor();
    const rows = entries.locator('tbody tr');
    expect(await rows.count()).toBe(50);
    expect(await entries.getByRole('columnheader', { name: 'Value (N/m)' }).count()).toBe(1);
    // K(w₂, w₂) of the first free node = 24 EI/h³, h = 0.2 m (the Hermite element stiffness;
    // Przemieniecki, Theory of Matrix Structural Analysis, from memory), shown to 4 figures.
    const first = rows.first().locator('td');
    expect(await first.nth(0).innerText()).toBe('1');
    expect(await first.nth(1).innerText()).toBe('1');
    const k11 = Number((await first.nth(2).innerText()).replace('−', '-'));
    expect(relative(k11, (24 * 210e9 * 0.02) / 0.2 ** 3)).toBeLessThan(5e-4);

    await entries.getByRole('button', { name: 'Next rows' }).click();
    await entries.getByText(/Entries 51–100 of 3,597/).waitFor();
    await entries.getByText('Page 2 of 72', { exact: true }).waitFor();
    expect(await rows.count()).toBe(50);
    // Column by column: page 2 is further down the matrix than page 1 began.
    expect(Number(await rows.first().locator('td').nth(1).innerText())).toBeGreaterThan(1);
    await entries.screenshot({ path: await shotPath('editor-matrix-entries') });

    await page.setViewportSize({ width: 390, height: 844 });
    await expect
      .poll(() => page.evaluate(() => document.documentElement.scrollWidth))
      .toBeLessThanOrEqual(390);
    await saveScreenshot(page, 'editor-matrix-entries-narrow');
  });
});
