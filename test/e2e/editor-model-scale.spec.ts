// A sheet at model scale in the browser: a 10 000-element beam (20 000 DOFs) evaluates, its modes
// table and first frequency show, its mode shapes come as a paged table (50 rows at a time, the
// rows of evenly spaced nodes) and a plot drawn through a bounded number of points, and the page
// goes on taking input. No timing is asserted: the bounds are on what the page holds.
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
  source,
  waitForResults,
  waitSaved,
  useAuthorBrowser,
} from './editor-helpers';

describe('sheet editor: a model-scale beam (browser)', () => {
  const session = useAuthorBrowser();

  it('shows a 10 000-element beam’s modes with its shapes paged and its plot decimated', async () => {
    const { page } = session();
    await newSheet(page, `E2E-L${RUN}`, 'Long girder');
    const gen = await addBlock(
      page,
      'calc',
      'deck = beam({E: 210 GPa, I: 0.02 m^4, mass: 1.5 t/m, length: 120 m, elements: 10000, ends: "clamped-free"})',
    );
    const solve = await addBlock(
      page,
      'modes',
      ['name: deck_v', 'stiffness: deck.K', 'mass: deck.M', 'count: 3'].join('\n'),
    );
    await waitForResults(page, 180_000);

    // The generated K is held sparse: the calc line says so instead of listing entries.
    await block(page, gen, 'calc')
      .getByText(/20000×20000 sparse matrix/)
      .first()
      .waitFor();

    const modes = block(page, solve, 'modes');
    const table = modes.getByRole('table', { name: 'Modes of deck_v' });
    await table.waitFor();
    const f = await column(table, 'f (Hz)');
    expect(f).toHaveLength(3);
    // Clamped–free Euler–Bernoulli beam, β₁L = 1.87510407 (Blevins, Table 8-1, from memory):
    // f₁ = (β₁L)² √(EI/(mL⁴)) / 2π. At 12 mm elements double precision cannot resolve λ₁ (the
    // engine warns); what it prints is within 2 %.
    const f1 = (1.87510407 ** 2 * Math.sqrt((210e9 * 0.02) / (1500 * 120 ** 4))) / (2 * Math.PI);
    expect(relative(f[0]!, f1)).toBeLessThan(0.02);

    // The shapes: a paged table of the rows kept (both DOFs of every 11th node, 910 nodes from
    // node 2, the first free one, to the tip), 50 rows to a page.
    const shapes = modes.getByRole('region', { name: 'Mode shapes of deck_v' });
    await shapes
      .getByText(/rows 1–50 of 1,820 \(the DOFs of evenly spaced nodes: 1,820 of 20,000\)/)
      .waitFor();
    const rows = shapes.locator('tbody tr');
    expect(await rows.count()).toBe(50);
    expect(await rows.first().locator('td').nth(1).innerText()).toBe('w2');
    await shapes.getByRole('button', { name: 'Next rows' }).click();
    await shapes.getByText(/rows 51–100 of 1,820/).waitFor();
    expect(await rows.count()).toBe(50);
    await shapes.getByText('Page 2 of 37', { exact: true }).waitFor();

    // The plot draws each mode through at most 800 points (components/results/modes-plots.tsx).
    const plot = modes.getByRole('figure', { name: 'Mode shapes' });
    await plot.locator('path.recharts-line-curve').first().waitFor();
    const paths = await plot
      .locator('path.recharts-line-curve')
      .evaluateAll((ps) => ps.map((p) => (p.getAttribute('d') ?? '').split(/[LC]/).length));
    expect(paths.length).toBe(3);
    for (const points of paths) expect(points).toBeLessThanOrEqual(801);
    await modes.screenshot({
      path: await shotPath('editor-model-scale'),
    });

    // The page still takes input: a line typed below is evaluated and saved.
    const after = await addBlock(page, 'calc', 'f_1 = deck_v.f[1]');
    await waitForResults(page, 180_000);
    await block(page, after, 'calc').getByText(/Hz/).first().waitFor();
    expect(await source(page, after, 'calc').innerText()).toContain('f_1 = deck_v.f[1]');
    await waitSaved(page, 60_000);
    await page.setViewportSize({ width: 390, height: 844 });
    await saveScreenshot(page, 'editor-model-scale-narrow');
  });
});
