// Browser: comparing two revisions of the demo footbridge sheet (DYN-01, Rev 1 returned
// with a query on the services allowance, Rev 2 with it revised; seeds/02 and 03) shows the source
// change, the results that moved with them to six significant figures, and folds away the results
// that differ only in the last binary digits.
import { describe, expect, it } from 'vitest';
import { saveScreenshot } from '../support/browser';
import { openDemoRevision, useAuthorBrowser } from './editor-helpers';

describe('compare two revisions (browser)', () => {
  const session = useAuthorBrowser();

  it('shows what changed from Rev 1 to Rev 2 and folds rounding differences away', async () => {
    const { page } = session();
    await openDemoRevision(page, 'DYN-01', 2);
    await page
      .getByRole('link', { name: /^Compare/ })
      .first()
      .click();
    await page.getByLabel('From').selectOption({ label: 'Rev 1' });
    await page.getByLabel('To').selectOption({ label: 'Rev 2' });

    const summary = page.getByRole('status').filter({ hasText: 'From Rev 1 to Rev 2' });
    await summary.waitFor();
    expect(await summary.innerText()).toMatch(/1 block changed, 0 added, 0 removed, 0 moved;/);

    const results = page.getByRole('region', { name: 'Result changes' });
    const row = (block: string, key: string) =>
      results
        .getByRole('row')
        .filter({ has: page.getByRole('cell', { name: block, exact: true }) })
        .filter({ has: page.getByRole('cell', { name: key, exact: true }) })
        .first();
    const massRow = row('Block 2 (calc) · deck-data', 'm');
    // m = 2.85 t/m in Rev 1 and 2.90 t/m in Rev 2 (seeds/02_demo_sheets.ts): +1.75 %.
    expect((await massRow.innerText()).replace(/\s+/g, ' ')).toBe(
      'Block 2 (calc) · deck-data m 2.85 t/m 2.9 t/m +1.75 %',
    );
    // A frequency to six significant figures, not seventeen.
    const f1 = row('Block 4 (modes) · deck-vertical', 'mode 1 f');
    expect(await f1.innerText()).toMatch(/\b\d\.\d{5} Hz\s+\d\.\d{5} Hz\s+−0\.866 %/);

    // Mode ratios unchanged but for rounding, and ratios of modes that do not move in the direction
    // (2.5e-14: zero), are folded away and counted.
    expect(await row('Block 4 (modes) · deck-vertical', 'mode 2 ratio').isVisible()).toBe(false);
    const folded = results.locator('details');
    expect(await folded.locator('summary').innerText()).toMatch(
      /^\d+ results? differ only by rounding/,
    );
    expect(
      await folded.getByRole('row').filter({ hasText: 'mode 1 ratio' }).first().isVisible(),
    ).toBe(false);

    const source = page.getByRole('article', { name: 'Block 2 (calc) · deck-data' });
    await source.getByText('2 remarks on this block (listed below).').waitFor();
    await saveScreenshot(page, 'compare-rev1-rev2');
  });
});
