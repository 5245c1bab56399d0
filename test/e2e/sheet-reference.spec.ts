// The author's in-app reference: new modes and matrix blocks start from a point that evaluates, a
// modes block without a direction says why its participation columns are empty, hover and
// completion give a function's signature, and the reference page opens from the editor.
// Screenshots: test-results/screenshots/sheet-reference-1280.png and sheet-reference-390.png.
import { describe, expect, it } from 'vitest';
import { saveScreenshot } from '../support/browser';
import {
  RUN,
  addBlock,
  block,
  blockCount,
  column,
  newSheet,
  shotPath,
  source,
  useAuthorBrowser,
  waitForResults,
} from './editor-helpers';

describe('sheet reference, starters, hover and completion (browser)', () => {
  const session = useAuthorBrowser();

  it('starts new modes and matrix blocks that evaluate, explains empty participation, and shows the reference', async () => {
    const { page } = session();
    await page.setViewportSize({ width: 1280, height: 860 });
    await newSheet(page, `E2E-R${RUN}`, 'Reference and starters');
    const addGroup = page.getByRole('group', { name: 'Add a block' });

    // New blocks as they come: no text typed.
    await addGroup.getByRole('button', { name: '+ Matrix' }).click();
    const matrixIndex = await blockCount(page);
    await addGroup.getByRole('button', { name: '+ Modes' }).click();
    const modesIndex = await blockCount(page);
    await waitForResults(page);
    for (const [i, kind] of [
      [matrixIndex, 'matrix'],
      [modesIndex, 'modes'],
    ] as const) {
      expect(
        await block(page, i, kind)
          .getByRole('list', { name: /^Errors in/ })
          .count(),
      ).toBe(0);
    }
    // The starter's K = 1000 kN/m [2 −1; −1 1], M = 1 t I: ω² = 1000 (3 ∓ √5)/2 s⁻² (closed form
    // of the 2 × 2 pencil), f = ω/2π = 3.111 Hz and 8.144 Hz; the table shows 4 figures.
    const table = page.getByRole('table', { name: 'Modes of modes' });
    const f = await column(table, 'f (Hz)');
    const expected = [3 - Math.sqrt(5), 3 + Math.sqrt(5)].map(
      (x) => Math.sqrt((1e3 * x) / 2) / (2 * Math.PI),
    );
    f.forEach((v, i) => expect(Math.abs(v - expected[i]!) / expected[i]!).toBeLessThan(5e-4));
    expect(await page.getByTestId('participation-reason').count()).toBe(0);

    // Without a direction the participation columns are empty, and the block says why.
    const plain = await addBlock(
      page,
      'modes',
      ['name: plain', 'stiffness: K2', 'mass: [1, 0; 0, 1] * 1 t', 'count: 2'].join('\n'),
    );
    await waitForResults(page);
    const reason = block(page, plain, 'modes').getByTestId('participation-reason');
    expect(await reason.innerText()).toMatch(
      /empty \(—\): no direction given: write "direction:" with an influence vector, one entry per DOF \(ones\(2\)/,
    );

    // Completion and hover name a generator's signature.
    const calc = await addBlock(
      page,
      'calc',
      'frame = storey_chain([20 t, 20 t], [30 kN/mm, 30 kN/mm])',
    );
    const editor = source(page, calc, 'calc');
    await editor.click();
    await page.keyboard.press('ControlOrMeta+End');
    await page.keyboard.press('Enter');
    await page.keyboard.type('deck = bea');
    const option = page.getByRole('option', { name: /beam/ });
    await option.waitFor();
    expect(await option.innerText()).toContain(
      'beam({E, I, mass, length, elements, ends, lumped?})',
    );
    await page.keyboard.press('Escape');
    await editor.getByText('storey_chain').hover();
    const tip = page.getByRole('tooltip').filter({ hasText: 'storey_chain(masses, stiffnesses)' });
    await tip.waitFor();
    expect(await tip.innerText()).toContain('fixed base');

    // The reference opens from the editor in a new tab.
    const [reference] = await Promise.all([
      page.context().waitForEvent('page'),
      addGroup.getByRole('link', { name: 'Sheet reference' }).click(),
    ]);
    await reference.getByRole('heading', { name: 'Sheet reference', level: 1 }).waitFor();
    const beam = reference.getByRole('article', { name: 'beam', exact: true });
    expect(await beam.innerText()).toContain('ends: "pinned-pinned"');
    const keys = reference.getByRole('table', { name: 'Keys of a modes block' });
    expect(await keys.getByRole('row').count()).toBe(11);
    // The response block's keys, one row each (36 keys in core/sheet/blocks/response.ts) and a head.
    const responseKeys = reference.getByRole('table', { name: 'Keys of a response block' });
    expect(await responseKeys.getByRole('row').count()).toBe(37);
    expect(await responseKeys.getByRole('row', { name: /elf base shear:/ }).innerText()).toContain(
      '§12.9.1.4',
    );
    expect(await reference.getByRole('article', { name: 'Response block' }).innerText()).toContain(
      'analysis: spectrum',
    );
    await saveScreenshot(reference, 'sheet-reference-1280');
    await reference.setViewportSize({ width: 390, height: 844 });
    await expect
      .poll(() => reference.evaluate(() => document.documentElement.scrollWidth))
      .toBeLessThanOrEqual(390);
    await saveScreenshot(reference, 'sheet-reference-390');
    // How an uploaded model gets its directions, with the files and blocks of its example.
    const topic = reference.getByRole('region', { name: 'DOF labels of an uploaded model' });
    expect(await topic.innerText()).toContain('dofs: per node ux uy rz');
    await topic.screenshot({ path: await shotPath('sheet-reference-dof-labels-390') });
    await reference.setViewportSize({ width: 1366, height: 900 });
    await topic.screenshot({ path: await shotPath('sheet-reference-dof-labels-1366') });
    await reference.close();
  });
});
