// Browser: a solve that goes on when the page is left, and is there, then done, on return.
import { describe, expect, it } from 'vitest';
import { saveScreenshot } from '../support/browser';
import { RUN, addBlock, newSheet, waitSaved, useAuthorBrowser } from './editor-helpers';

describe('sheet editor: a solve in the background (browser)', () => {
  const session = useAuthorBrowser();

  // 300 DOFs (a pinned girder of 150 beam elements, two DOFs a node) and 80 modes by inverse
  // iteration with deflation: long enough to leave the page and come back while it runs (about
  // 19 s in one process on this machine under load, measured), inside the background time limit.
  it('goes on when the page is left, shows it running on return, then its results', async () => {
    const { page } = session();
    const url = await newSheet(page, `E2E-B${RUN}`, 'Background solve');
    await addBlock(
      page,
      'calc',
      'girder = beam({E: 210 GPa, I: 0.02 m^4, mass: 1.5 t/m, length: 120 m, elements: 150, ends: "pinned-pinned"})',
    );
    await addBlock(
      page,
      'modes',
      ['name: bg', 'stiffness: girder.K', 'mass: girder.M', 'method: inverse', 'count: 80'].join(
        '\n',
      ),
    );
    await waitSaved(page, 60_000);
    await page
      .getByText(/Solving bg \(block 3 of 3\)/)
      .first()
      .waitFor({ timeout: 30_000 });
    // Leave the sheet while it solves: the page closes, the solve goes on.
    await page.goto('/');
    await page.goto(url);
    // Back on the sheet: the same solve, still running (its progress), then its modes.
    await page
      .getByText(/Solving bg \(block 3 of 3\)/)
      .first()
      .waitFor({ timeout: 30_000 });
    await saveScreenshot(page, 'editor-background-solve');
    const table = page.getByRole('table', { name: 'Modes of bg' });
    await table.waitFor({ timeout: 90_000 });
    expect(await table.getByRole('row').count()).toBeGreaterThan(80);
  });
});
