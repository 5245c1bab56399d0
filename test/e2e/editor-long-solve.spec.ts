// Browser: a long solve shows its progress and is cancelled.
import { describe, expect, it } from 'vitest';
import { saveScreenshot } from '../support/browser';
import { RUN, addBlock, newSheet, waitSaved, useAuthorBrowser } from './editor-helpers';

describe('sheet editor: a long solve (browser)', () => {
  const session = useAuthorBrowser();

  // 300 DOFs and 80 modes by inverse iteration with deflation: far longer than the steps below
  // take (40 modes of 200 DOFs took about 5 s here), small enough in memory (300 × 300) to harm
  // nothing.
  it('cancels a long solve', async () => {
    const { page } = session();
    await newSheet(page, `E2E-L${RUN}`, 'Long solve');
    await addBlock(
      page,
      'calc',
      'girder = beam({E: 210 GPa, I: 0.02 m^4, mass: 1.5 t/m, length: 120 m, elements: 150, ends: "pinned-pinned"})',
    );
    await addBlock(
      page,
      'modes',
      ['name: long', 'stiffness: girder.K', 'mass: girder.M', 'method: inverse', 'count: 80'].join(
        '\n',
      ),
    );
    const cancel = page.getByRole('button', { name: 'Cancel', exact: true });
    await cancel.waitFor({ timeout: 60_000 });
    // The solver's own progress: its stage and how many of the 80 modes have converged. The
    // waits are generous because a loaded machine starts the worker and builds the model slowly;
    // the solve itself takes far longer (about 19 s under load, measured).
    await page
      .getByText(/Solving long \(block 3 of 3\): inverse iteration, \d+ of 80 modes converged/)
      .waitFor({ timeout: 60_000 });
    await saveScreenshot(page, 'editor-long-solve');
    await cancel.click();
    await page.getByText('Evaluation cancelled — results are stale').waitFor();
    expect(await page.getByRole('table', { name: 'Modes of long' }).count()).toBe(0);
    await page.getByRole('button', { name: 'Run', exact: true }).waitFor();
    await waitSaved(page, 60_000);
  });
});
