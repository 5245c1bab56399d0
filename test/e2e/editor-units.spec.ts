// The sheet's display units, in the browser: the author starts a sheet from the built-in
// four-storey frame (the demo frame sheet's content), switches "Units shown" to US customary and
// reads the participating mass rᵀMr in lbf·s²/in, a computed storey force in kip and a criterion's
// two sides in kip, while the frequencies stay in Hz with the same values. Factors: NIST SP 811
// (2008), Appendix B.8.
import { describe, expect, it } from 'vitest';
import { saveScreenshot } from '../support/browser';
import {
  RUN,
  addBlock,
  column,
  projectHref,
  relative,
  useAuthorBrowser,
  waitForResults,
  waitSaved,
} from './editor-helpers';

// 1 lbf = 0.45359237 kg × 9.80665 m/s² (NIST SP 811 B.8, exact); 1 lbf·s²/in = lbf / 0.0254 m/s².
const LBF = 0.45359237 * 9.80665;
const LBF_S2_PER_IN = LBF / 0.0254;

describe('sheet editor: units shown (browser)', () => {
  const session = useAuthorBrowser();

  it('shows a frame sheet in US customary units and back in SI, frequencies unchanged', async () => {
    const { page } = session();
    await page.goto(await projectHref(page));
    await page.getByRole('button', { name: 'New sheet' }).click();
    const dialog = page.getByRole('dialog', { name: 'New sheet' });
    await dialog.getByLabel('Sheet number').fill(`E2E-U${RUN}`);
    await dialog.getByLabel('Title').fill('Frame in US units');
    await dialog.getByLabel(/Four-storey frame/).check();
    await dialog.getByRole('button', { name: 'Create sheet' }).click();
    await page.getByRole('heading', { name: /Frame in US units/ }).waitFor();
    // A computed force: the first storey's stiffness times a drift of 10 mm.
    await addBlock(page, 'calc', 'V_1 = k_1 * 10 mm');
    // A criterion on it, read below in both systems.
    await addBlock(page, 'criteria', 'V_1 <= 5000 kN  # storey shear capacity');
    await waitForResults(page);
    const criterion = page
      .getByRole('listitem')
      .filter({ hasText: 'storey shear capacity' })
      .getByTestId('criterion-values');
    expect(await criterion.innerText()).toBe('3.1 MN vs 5000 kN');

    const table = page.getByRole('table', { name: 'Modes of sway' });
    const fSi = await column(table, 'f (Hz)');
    // rᵀMr = 212 + 208 + 208 + 165 t = 793 t (the template's storey masses, every floor moves).
    const note = page.getByText(/Effective masses are shares of/);
    expect(await note.innerText()).toContain('rᵀMr = 793 t');

    await page.getByLabel('Units shown').selectOption('us');
    await expect.poll(() => note.innerText()).toContain('lbf·s²/in');
    const mass = /rᵀMr = ([\d.]+) lbf·s²\/in/.exec(await note.innerText());
    expect(mass).not.toBeNull();
    // 793 000 kg / 175.1268 kg = 4528 lbf·s²/in; shown to 4 figures: within 0.05 %.
    expect(relative(Number(mass![1]), 793e3 / LBF_S2_PER_IN)).toBeLessThan(5e-4);
    // V_1 = 310 kN/mm × 10 mm = 3100 kN = 696.9 kip (1 kip = 4.448222 kN, NIST SP 811 B.8).
    const force = page.getByText(/result [\d.]+ kip$/);
    const kip = /result ([\d.]+) kip/.exec(await force.innerText());
    expect(relative(Number(kip![1]), 3.1e6 / (1000 * LBF))).toBeLessThan(5e-4);
    // The criterion's sides both in kip: 3.1 MN = 696.9 kip, 5000 kN = 1124 kip (NIST SP 811 B.8).
    await expect.poll(() => criterion.innerText()).toMatch(/kip vs .* kip$/);
    const sides = /^([\d.]+) kip vs ([\d.]+) kip$/.exec(await criterion.innerText());
    expect(relative(Number(sides![1]), 3.1e6 / (1000 * LBF))).toBeLessThan(5e-4);
    expect(relative(Number(sides![2]), 5e6 / (1000 * LBF))).toBeLessThan(5e-4);
    // Frequencies and periods are Hz and s in both systems, with the same values.
    expect(await column(table, 'f (Hz)')).toEqual(fSi);
    expect(await table.locator('thead th').allInnerTexts()).toContain('Γ (√(lbf·s²/in))');
    await waitSaved(page);
    await saveScreenshot(page, 'editor-units-us');

    // The setting is the sheet's: it comes back after a reload.
    await page.reload();
    await waitForResults(page);
    expect(await page.getByLabel('Units shown').inputValue()).toBe('us');
    await page.getByLabel('Units shown').selectOption('si');
    await expect.poll(() => note.innerText()).toContain('rᵀMr = 793 t');
    expect(await criterion.innerText()).toBe('3.1 MN vs 5000 kN');
    await waitSaved(page);
  });
});
