// Issue 6, browser: a long solve shows its progress and is cancelled.
import { describe, expect, it } from 'vitest';
import { saveScreenshot } from '../support/browser';
import { RUN, addBlock, newSheet, waitSaved, useAuthorBrowser } from './editor-helpers';

describe('sheet editor: a long solve (browser)', () => {
  const session = useAuthorBrowser();

  // 200 DOFs and 40 modes by inverse iteration with deflation take ~13 s on this machine (2
  // cores): long enough to cancel, small enough in memory (dense 200 × 200) to harm nothing.
  it('cancels a long solve', async () => {
    const { page } = session();
    await newSheet(page, `E2E-L${RUN}`, 'Long solve');
    await addBlock(
      page,
      'calc',
      'girder = beam({E: 210 GPa, I: 0.02 m^4, mass: 1.5 t/m, length: 120 m, elements: 100, ends: "pinned-pinned"})',
    );
    await addBlock(
      page,
      'modes',
      ['name: long', 'stiffness: girder.K', 'mass: girder.M', 'method: inverse', 'count: 40'].join(
        '\n',
      ),
    );
    const cancel = page.getByRole('button', { name: 'Cancel', exact: true });
    await cancel.waitFor({ timeout: 20_000 });
    await saveScreenshot(page, 'editor-long-solve');
    await cancel.click();
    await page.getByText('Evaluation cancelled — results are stale').waitFor();
    expect(await page.getByRole('table', { name: 'Modes of long' }).count()).toBe(0);
    await page.getByRole('button', { name: 'Run', exact: true }).waitFor();
    await waitSaved(page, 60_000);
  });
});
