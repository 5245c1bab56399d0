// Browser: a Matrix Market pair uploaded with the picker becomes two matrix blocks and
// is solved; a typed non-symmetric matrix shows its error at the line, underlined, on hover.
import { mkdtemp, writeFile } from 'node:fs/promises';
import os from 'node:os';
import path from 'node:path';
import { describe, expect, it } from 'vitest';
import { saveScreenshot } from '../support/browser';
import { chainMatrixMarket } from '../support/chain-files';
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
  solveUploadedChain,
  uniformChain,
  useAuthorBrowser,
  waitForResults,
  waitSaved,
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
    await solveUploadedChain(page, before, 'chain', ['method: inverse']);
    await block(page, before + 1, 'matrix')
      .getByText(/3 × 3/)
      .waitFor();
    await saveScreenshot(page, 'editor-matrix-upload');
    await waitSaved(page);
  });

  it('keeps a large uploaded model sparse and solves it by Lanczos', async () => {
    const { page } = session();
    // A 2 000-DOF fixed–free chain exported as Matrix Market (k = 1e6 N/m, m = 1e3 kg): its
    // dense form (4 million entries) is beyond what a sheet value holds.
    const n = 2000;
    const dir = await mkdtemp(path.join(os.tmpdir(), 'mw-large-'));
    const files = chainMatrixMarket(n, 1e6, 1e3);
    await writeFile(path.join(dir, 'long_K.mtx'), files.K);
    await writeFile(path.join(dir, 'long_M.mtx'), files.M);
    await newSheet(page, `E2E-X${RUN}`, 'Exported chain');
    const before = await blockCount(page);
    await page
      .getByLabel('Upload K or M file…')
      .setInputFiles([path.join(dir, 'long_K.mtx'), path.join(dir, 'long_M.mtx')]);
    await block(page, before + 2, 'matrix').waitFor();
    await addBlock(
      page,
      'modes',
      ['name: long', 'stiffness: long_K', 'mass: long_M', 'count: 3'].join('\n'),
    );
    await waitForResults(page);
    await block(page, before + 1, 'matrix')
      .getByText(/2000 × 2000.*kept sparse \(5,998 nonzeros\)/)
      .waitFor();
    const table = page.getByRole('table', { name: 'Modes of long' });
    await page.getByText(/solved by lanczos/).waitFor();
    // the lowest three of the 2 000-mass chain's closed form
    const expected = uniformChain(n, 1e6, 1e3);
    const f = await column(table, 'f (Hz)');
    expect(f).toHaveLength(3);
    // 4 significant figures shown: half a unit in the 4th figure.
    f.forEach((value, i) => expect(relative(value, expected[i]!.f)).toBeLessThan(5e-4));
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
