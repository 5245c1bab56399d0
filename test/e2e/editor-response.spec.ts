// Browser: from modes to the deliverable. The author adds a response-spectrum analysis to a
// two-storey frame and reads the modal base shears, the storey table, the spectrum plot and the
// caution; a wrong key is named with its line; the seeded frame revision prints the same results.
import { describe, expect, it } from 'vitest';
import { saveScreenshot } from '../support/browser';
import {
  RUN,
  addBlock,
  block,
  newSheet,
  openDemoRevision,
  projectHref,
  shotPath,
  relative,
  setSource,
  useAuthorBrowser,
  waitForResults,
} from './editor-helpers';

const CAUTION = /Code checks remain the engineer’s responsibility/;

describe('response blocks (browser)', () => {
  const session = useAuthorBrowser();

  it('runs a spectrum analysis on the modes above and shows its tables, plot and caution', async () => {
    const { page } = session();
    await newSheet(page, `E2E-R${RUN}`, 'Two-storey frame, response spectrum');
    await addBlock(
      page,
      'calc',
      ['m_0 = 100 t', 'k_0 = 40 kN/mm', 'frame = storey_chain([2 m_0, m_0], [2 k_0, k_0])'].join(
        '\n',
      ),
    );
    await addBlock(page, 'modes', 'name: sway\nstiffness: frame.K\nmass: frame.M\ndirection: x');
    const index = await addBlock(
      page,
      'response',
      [
        'modes: sway',
        'analysis: spectrum',
        'spectrum: ASCE 7-16',
        'SDS: 1.0',
        'SD1: 0.6',
        'TL: 8 s',
        'R: 8',
        'damping: 0.05',
        'combine: cqc',
        'heights: 3.5 m',
        'name: rsa',
      ].join('\n'),
    );
    await waitForResults(page);
    const card = block(page, index, 'response');
    const modal = card.getByRole('table', { name: 'Modal responses' });
    await modal.waitFor();
    // Mode 2 of the frame 2m, m / 2k, k: T₂ = 2π/√(2k/m) = 0.2221 s, on the ASCE 7-16 plateau
    // (T₀ = 0.12 s, T_S = 0.6 s): S_a = S_DS g / R = 1.226 m/s²; its base shear is 1/9 of
    // 3m·S_a (Chopra, chapter 10 example, from memory) = 40.86 kN. The table shows 4 figures.
    const row2 = (await modal.locator('tbody tr').nth(1).locator('td').allInnerTexts()).map((c) =>
      c.replace('−', '-'),
    );
    expect(relative(Number(row2[1]), (2 * Math.PI) / Math.sqrt((2 * 4e7) / 1e5))).toBeLessThan(
      5e-4,
    );
    expect(relative(Number(row2[3]), 9.80665 / 8)).toBeLessThan(5e-4);
    expect(
      relative(Number(row2[6]!.replace(' kN', '')), ((1 / 9) * 3e5 * (9.80665 / 8)) / 1000),
    ).toBeLessThan(5e-4);
    await card.getByRole('table', { name: 'Storey results' }).waitFor();
    await card.getByRole('figure', { name: "Design spectrum, modes' periods marked" }).waitFor();
    await card.getByRole('note').getByText(CAUTION).waitFor();
    await card.getByText(/Method: ASCE 7-16 §11\.4\.6/).waitFor();
    await saveScreenshot(page, 'editor-response-spectrum');
    await page.setViewportSize({ width: 390, height: 844 });
    await card.scrollIntoViewIfNeeded();
    await saveScreenshot(page, 'editor-response-spectrum-390');
    await page.setViewportSize({ width: 1280, height: 900 });

    // A key of another analysis is refused at its line.
    await setSource(
      page,
      index,
      'response',
      'modes: sway\nanalysis: walking\ndamping: 0.01\ncombine: cqc',
    );
    await waitForResults(page);
    await card
      .getByRole('list', { name: `Errors in block ${index}, response` })
      .getByText(/Line 4: "combine:" is not a key of a walking analysis/)
      .waitFor();
  });

  it('prints the seeded frame revision with its spectrum results and the caution', async () => {
    const { page } = session();
    // seeds/02_demo_sheets.ts: DYN-02 Rev 1 carries an ASCE 7-16 spectrum analysis scaled to V_ELF.
    await openDemoRevision(page, 'DYN-02', 1);
    await page.getByRole('table', { name: 'Modal responses' }).first().waitFor();
    await page.getByRole('link', { name: 'Print' }).first().click();
    const printed = page.getByRole('table', { name: 'Storey results' }).first();
    await printed.waitFor();
    await page
      .getByText(/Modal forces scaled by 1\.1\d\d to 100 % of the ELF base shear/)
      .first()
      .waitFor();
    expect(await page.getByRole('note').filter({ hasText: CAUTION }).count()).toBeGreaterThan(0);
    await saveScreenshot(page, 'print-dyn-02-response');
  });

  it('shows the unbalance response of the pump draft and the walking acceleration of the footbridge draft', async () => {
    const { page } = session();
    // seeds/02_demo_sheets.ts: DYN-03 (a draft) adds the unbalance response at 1485 rpm.
    await page.goto(await projectHref(page));
    await page.getByRole('link', { name: 'DYN-03' }).first().click();
    await waitForResults(page);
    const harmonic = page.getByRole('table', { name: 'Harmonic response' });
    await harmonic.waitFor();
    expect(await harmonic.locator('thead th').allInnerTexts()).toContain('At running speed');
    await page
      .getByRole('figure', { name: 'Amplitude against frequency, running speed ±20 % marked' })
      .waitFor();
    await page.getByText(/Running speed 24\.75 Hz \(1485 rpm\)/).waitFor();
    await page
      .locator('section[data-kind="response"]')
      .first()
      .screenshot({ path: await shotPath('editor-response-harmonic-block') });
    // seeds/03_demo_review.ts: after the seal, DYN-01's draft adds the walking check for Rev 3.
    await page.goto(await projectHref(page));
    await page.getByRole('link', { name: 'DYN-01' }).first().click();
    await waitForResults(page);
    await page.getByRole('table', { name: 'Walking response' }).waitFor();
    await page.getByText(/against the limit 0\.7 m\/s²/).waitFor();
    await page.getByText(/AISC Design Guide 11 \(2nd ed\.\) Eq\. 4-1/).waitFor();
    await page
      .locator('section[data-kind="response"]')
      .first()
      .screenshot({ path: await shotPath('editor-response-walking-block') });
  });
});
