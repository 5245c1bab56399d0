// The author (Ines) meets her own mistakes: a unit slip in a storey chain shows one error where
// it is and a quiet "not evaluated" note on the blocks below (not a wave of unknown names); an
// uploaded model gets its x direction from DOF labels, its participation matches the uniform
// chain's closed form, and labels or a count that do not fit the model are refused at their line.
// Screenshots: test-results/screenshots/editor-errors-1366.png, editor-errors-390.png and
// editor-dof-labels-1366.png.
import path from 'node:path';
import { describe, expect, it } from 'vitest';
import { saveScreenshot } from '../support/browser';
import {
  FIXTURES,
  RUN,
  addBlock,
  block,
  blockCount,
  column,
  newSheet,
  relative,
  setSource,
  source,
  uniformChain,
  useAuthorBrowser,
  waitForResults,
} from './editor-helpers';

describe('sheet editor: errors in the author’s terms (browser)', () => {
  const session = useAuthorBrowser();

  it('shows one error for a unit slip, and notes on what it left unevaluated', async () => {
    const { page } = session();
    await page.setViewportSize({ width: 1366, height: 900 });
    await newSheet(page, `E2E-ER${RUN}`, 'One slip');
    const calc = await addBlock(
      page,
      'calc',
      [
        'm_f = 20 t',
        'k_storey = 30 kN  # the slip: kN instead of kN/mm',
        'frame = storey_chain([m_f, m_f, m_f], [k_storey, k_storey, k_storey])',
      ].join('\n'),
    );
    const modes = await addBlock(
      page,
      'modes',
      ['name: plant_x', 'stiffness: frame.K', 'mass: frame.M', 'count: 3', 'direction: x'].join(
        '\n',
      ),
    );
    const criteria = await addBlock(page, 'criteria', 'plant_x.cumulative[3] >= 0.9  # 90 %');
    await waitForResults(page);

    const errors = block(page, calc, 'calc').getByRole('list', { name: /^Errors in/ });
    expect(await errors.getByRole('listitem').allInnerTexts()).toEqual([
      'Line 3: storey_chain: stiffness 1 must be a stiffness (for example N/m); got 30 kN.',
    ]);
    for (const [i, kind] of [
      [modes, 'modes'],
      [criteria, 'criteria'],
    ] as const) {
      const b = block(page, i, kind);
      expect(await b.getByRole('list', { name: /^Errors in/ }).count()).toBe(0);
      const note = b.getByRole('list', { name: /^Not evaluated in/ });
      expect(await note.innerText()).toMatch(
        /^Line \d: Not evaluated: depends on "(frame|plant_x)"/,
      );
    }
    expect(await page.getByText(/Unknown name/).count()).toBe(0);
    // The sheet header counts the one error, not the notes.
    await page.getByText('1 error', { exact: true }).first().waitFor();
    await saveScreenshot(page, 'editor-errors-1366');
    await page.setViewportSize({ width: 390, height: 844 });
    await block(page, modes, 'modes').scrollIntoViewIfNeeded();
    await saveScreenshot(page, 'editor-errors-390');
    await page.setViewportSize({ width: 1366, height: 900 });

    // Corrected, everything evaluates.
    await setSource(
      page,
      calc,
      'calc',
      [
        'm_f = 20 t',
        'k_storey = 30 kN/mm',
        'frame = storey_chain([m_f, m_f, m_f], [k_storey, k_storey, k_storey])',
      ].join('\n'),
    );
    await waitForResults(page);
    expect(await page.getByRole('list', { name: /^(Errors|Not evaluated) in/ }).count()).toBe(0);
    await page.getByRole('table', { name: 'Modes of plant_x' }).waitFor();
  });

  it('gives an uploaded model its x direction from DOF labels and refuses labels or a count that do not fit', async () => {
    const { page } = session();
    await page.setViewportSize({ width: 1366, height: 900 });
    await newSheet(page, `E2E-DL${RUN}`, 'Labelled upload');
    const before = await blockCount(page);
    await page
      .getByLabel('Upload K or M file…')
      .setInputFiles([path.join(FIXTURES, 'chain3-K.mtx'), path.join(FIXTURES, 'chain3-M.mtx')]);
    const kIndex = before + 1;
    await block(page, before + 2, 'matrix').waitFor();
    await waitForResults(page);
    const kSource = (await source(page, kIndex, 'matrix').innerText()).trimEnd();
    await setSource(page, kIndex, 'matrix', `${kSource}\ndofs: per node ux`);
    const modes = await addBlock(
      page,
      'modes',
      ['name: tower', 'stiffness: chain3_K', 'mass: chain3_M', 'count: 3', 'direction: x'].join(
        '\n',
      ),
    );
    await waitForResults(page);
    const table = page.getByRole('table', { name: 'Modes of tower' });
    // The uniform fixed–free chain (REFERENCES.md item 2): effective mass ratios from its closed
    // form shapes; the table shows percentages to 0.1 (tolerance 0.06 points).
    const expected = uniformChain(3, 1e6, 1e3);
    const shares = await column(table, 'Eff. mass');
    shares.forEach((s, i) => expect(Math.abs(s - 100 * expected[i]!.ratio)).toBeLessThan(0.06));
    expect(relative((await column(table, 'Cumulative'))[2]!, 100)).toBeLessThan(1e-3);
    expect(await page.getByTestId('participation-reason').count()).toBe(0);
    await saveScreenshot(page, 'editor-dof-labels-1366');

    // Labels that do not fit the matrix: refused at the dofs: line of the matrix block.
    await setSource(page, kIndex, 'matrix', `${kSource}\ndofs: per node ux uy`);
    await waitForResults(page);
    const kErrors = block(page, kIndex, 'matrix').getByRole('list', { name: /^Errors in/ });
    expect(await kErrors.innerText()).toMatch(
      /^Line \d: "dofs: per node ux uy" gives 2 DOFs to a node, but chain3_K \(3×3\) has 3 rows/,
    );

    // More modes than DOFs: refused at the count line, naming both.
    await setSource(page, kIndex, 'matrix', `${kSource}\ndofs: per node ux`);
    await setSource(
      page,
      modes,
      'modes',
      ['name: tower', 'stiffness: chain3_K', 'mass: chain3_M', 'count: 5', 'direction: x'].join(
        '\n',
      ),
    );
    await waitForResults(page);
    expect(
      await block(page, modes, 'modes')
        .getByRole('list', { name: /^Errors in/ })
        .innerText(),
    ).toBe(
      'Line 4: "count: 5" asks for more modes than the model has: K is 3×3, so it has 3 modes. Write "count: 3" for all of them, or fewer.',
    );
  });
});
