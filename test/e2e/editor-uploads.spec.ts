// Issue 6, browser: a Matrix Market pair uploaded with the picker becomes two matrix blocks and
// is solved; a typed non-symmetric matrix shows its error at the line, underlined, on hover.
import path from 'node:path';
import { describe, it } from 'vitest';
import { saveScreenshot } from '../support/browser';
import {
  FIXTURES,
  RUN,
  addBlock,
  block,
  blockCount,
  newSheet,
  shotPath,
  solveUploadedChain,
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
