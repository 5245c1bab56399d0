// Browser: comparing two revisions of the demo footbridge sheet (DYN-01, Rev 1 returned
// with a query on the services allowance, Rev 2 with it revised; seeds/02 and 03) shows the source
// change, the results that moved with them to six significant figures, and folds away the results
// that differ only in the last binary digits.
import { describe, expect, it } from 'vitest';
import { saveScreenshot } from '../support/browser';
import {
  RUN,
  addBlock,
  newSheet,
  openDemoRevision,
  setSource,
  sheetIdOf,
  useAuthorBrowser,
  waitForResults,
  waitSaved,
} from './editor-helpers';

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
    // Tomasz's query on Rev 1 and its carried copy on Rev 2 are one thread: counted once.
    await source.getByText('1 remark on this block (listed below).').waitFor();
    await saveScreenshot(page, 'compare-rev1-rev2');
  });

  it('shows a criterion whose comment alone changed as one changed line and no result change', async () => {
    const { page } = session();
    const url = await newSheet(page, `E2E-C${RUN}`, 'Criterion comment');
    const sheetId = sheetIdOf(url);
    const data = await addBlock(page, 'calc', 'k = 24 kN/mm\nm_1 = 18 t\nf = sqrt(k/m_1)/(2 pi)');
    const checks = await addBlock(page, 'criteria', 'f >= 5 Hz  # above 5 Hz');
    await waitForResults(page);
    await waitSaved(page);
    await page.getByRole('button', { name: 'Issue for check' }).click();
    await page
      .getByRole('form', { name: 'Issue for check' })
      .getByRole('button', { name: 'Issue Rev 1' })
      .click();
    await page.getByRole('heading', { name: /Rev 1$/ }).waitFor({ timeout: 60_000 });
    const revisionId = Number(/\/revisions\/(\d+)/.exec(page.url())?.[1]);

    await page.goto(url);
    await setSource(page, checks, 'criteria', 'f >= 5 Hz  # above 5 Hz, clear of walking');
    await waitForResults(page);
    await waitSaved(page);
    await page.goto(`/sheets/${sheetId}/compare?from=${revisionId}&to=draft`);

    const summary = page.getByRole('status').filter({ hasText: 'From Rev 1 to the draft' });
    await summary.waitFor();
    // f = 5.812 Hz passes either way: no result changed, no criterion flipped.
    expect(await summary.innerText()).toMatch(
      /1 block changed.*0 results changed; 0 criteria flipped/,
    );
    const source = page.getByRole('region', { name: 'Source changes' });
    const changed = source.getByLabel('Line 1 changed');
    expect((await changed.innerText()).replace(/\s+/g, ' ')).toBe(
      '~ f >= 5 Hz # above 5 Hz, clear of walking',
    );
    expect(await changed.locator('ins').innerText()).toBe(', clear of walking');
    expect(await source.getByText(/^[−+] /).count()).toBe(0);
    await saveScreenshot(page, 'compare-criterion-comment');

    // The draft now in US customary units with a heavier mass: the changes are shown in the
    // newer side's units, with a note that Rev 1 shows SI.
    await page.goto(url);
    await page.getByLabel('Units shown').selectOption('us');
    await setSource(page, data, 'calc', 'k = 24 kN/mm\nm_1 = 24 t\nf = sqrt(k/m_1)/(2 pi)');
    await waitForResults(page);
    await waitSaved(page);
    await page.goto(`/sheets/${sheetId}/compare?from=${revisionId}&to=draft`);
    const note = page.getByTestId('compare-units-note');
    expect(await note.innerText()).toMatch(
      /^Results are shown in US customary \(kip, in, lbf·s²\/in\), the units of the draft \(version \d+\); Rev 1 shows SI \(kN, mm, t\)\.$/,
    );
    const mass = page
      .getByRole('region', { name: 'Result changes' })
      .getByRole('row')
      .filter({ has: page.getByRole('cell', { name: 'm_1', exact: true }) });
    // 18 t and 24 t in lbf·s²/in = 0.45359237 kg × 9.80665 m/s² / 0.0254 m = 175.126835 kg
    // (NIST SP 811 B.8): 102.783 and 137.044, to six significant figures; +33.3 %.
    expect((await mass.innerText()).replace(/\s+/g, ' ')).toMatch(
      /m_1 102\.783 lbf·s²\/in 137\.044 lbf·s²\/in \+33\.3 %$/,
    );
    await saveScreenshot(page, 'compare-units-us');
  });
});
