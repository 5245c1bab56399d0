// Issue 6, browser: a Matrix Market pair uploaded with the picker becomes two matrix blocks and
// is solved; a typed non-symmetric matrix shows its error at the line, underlined, on hover.
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
  shotPath,
  source,
  uniformChain,
  waitForResults,
  waitSaved,
  useAuthorBrowser,
} from './editor-helpers';

describe('sheet editor: uploads and matrices (browser)', () => {
  const session = useAuthorBrowser();

  it('uploads a Matrix Market pair and solves it', async () => {
    const { page } = session();
    await newSheet(page, `E2E-U${RUN}`, 'Uploaded chain');
    const before = await blockCount(page);
    await page
      .getByLabel('Upload K or M file…')
      .setInputFiles([path.join(FIXTURES, 'chain3-K.mtx'), path.join(FIXTURES, 'chain3-M.mtx')]);
    await block(page, before + 2, 'matrix').waitFor();
    expect(await source(page, before + 1, 'matrix').innerText()).toContain('from: chain3-K.mtx');
    expect(await source(page, before + 2, 'matrix').innerText()).toContain('from: chain3-M.mtx');
    await addBlock(
      page,
      'modes',
      ['name: chain', 'stiffness: chain3_K', 'mass: chain3_M', 'method: inverse', 'count: 3'].join(
        '\n',
      ),
    );
    await waitForResults(page);
    const table = page.getByRole('table', { name: 'Modes of chain' });
    // k = 1000 kN/m = 1e6 N/m, m = 1 t = 1000 kg in the fixtures' comments.
    const expected = uniformChain(3, 1e6, 1e3);
    const f = await column(table, 'f (Hz)');
    f.forEach((value, i) => expect(relative(value, expected[i]!.f)).toBeLessThan(5e-4));
    await block(page, before + 1, 'matrix')
      .getByText(/3 × 3/)
      .waitFor();
    await saveScreenshot(page, 'editor-matrix-upload');
    await waitSaved(page);
  });

  it('shows a non-symmetric matrix as an error at its line', async () => {
    const { page } = session();
    await newSheet(page, `E2E-S${RUN}`, 'Typed matrix');
    const at = await addBlock(page, 'matrix', ['name: A', 'unit: kN/m', '4 1', '2 3'].join('\n'));
    await waitForResults(page);
    const errors = page.getByRole('list', { name: `Errors in block ${at}, matrix` });
    // The worst asymmetry is A[1,2] = 1 against A[2,1] = 2; the engine points at the row of the
    // lower entry, line 4 of the block.
    await errors.getByText(/Line 4:.*not symmetric/).waitFor();
    const underline = block(page, at, 'matrix').locator('.cm-lintRange-error').first();
    await underline.waitFor();
    // The message shows on hover over the underlined line.
    await underline.hover();
    await page
      .locator('.cm-tooltip-lint')
      .getByText(/not symmetric/)
      .waitFor();
    await block(page, at, 'matrix').screenshot({ path: await shotPath('editor-matrix-error') });
    await waitSaved(page);
  });
});
