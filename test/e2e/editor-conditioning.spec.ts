// Browser: the engine's note that a fine mesh's conditioning λ_max/λ₁ costs digits is
// shown as information with its numbers, in the editor and on the issued revision, while a real
// warning about a solve (here: matrices without units, taken as SI) stays a warning.
import { describe, expect, it } from 'vitest';
import { saveScreenshot } from '../support/browser';
import {
  RUN,
  addBlock,
  column,
  block,
  newSheet,
  shotPath,
  waitForResults,
  waitSaved,
  useAuthorBrowser,
} from './editor-helpers';

// "λmax/λ1 ≥ 7.4 × 10⁸" (max and 1 are subscripts; a lower bound, as the engine estimates it):
// a mantissa, and a power of ten in superscript digits.
const RATIO = /λₘₐₓ\/λ₁ ≥ \d(\.\d)? × 10[⁰¹²³⁴⁵⁶⁷⁸⁹]+/;

describe('sheet editor: conditioning note and solve warnings (browser)', () => {
  const session = useAuthorBrowser();

  it('shows a fine mesh’s conditioning as a note with its numbers, and real warnings as warnings', async () => {
    const { page } = session();
    await newSheet(page, `E2E-K${RUN}`, 'Fine mesh');
    // 100 elements, clamped–free: λ_max/λ₁ grows like the element count to the fourth power
    // (Euler–Bernoulli beam elements), and here it costs λ₁ digits beyond the tolerance: the
    // engine's estimate after the fact (Rayleigh quotient in double-double) puts λ₁'s error near
    // 2e-9 > 1e-10, so it reports the conditioning. (Pinned–pinned, the same mesh keeps λ₁ to
    // 7e-11 and the engine rightly says nothing.)
    await addBlock(
      page,
      'calc',
      'deck = beam({E: 210 GPa, I: 0.02 m^4, mass: 1.5 t/m, length: 120 m, elements: 100, ends: "clamped-free"})',
    );
    const fine = await addBlock(
      page,
      'modes',
      ['name: deck_modes', 'stiffness: deck.K', 'mass: deck.M', 'count: 3'].join('\n'),
    );
    // Typed matrices without a unit: the engine takes them as N/m and kg and says so.
    await addBlock(page, 'matrix', ['name: Kp', '2 -1', '-1 1'].join('\n'));
    await addBlock(page, 'matrix', ['name: Mp', '1 0', '0 1'].join('\n'));
    const plain = await addBlock(
      page,
      'modes',
      ['name: plain', 'stiffness: Kp', 'mass: Mp', 'count: 2'].join('\n'),
    );
    await waitForResults(page);

    const fineBlock = block(page, fine, 'modes');
    await fineBlock.getByRole('table', { name: 'Modes of deck_modes' }).waitFor();
    const note = fineBlock.getByRole('note', { name: 'Conditioning' });
    await note.waitFor();
    const words = await note.innerText();
    expect(words).toMatch(/^Conditioning \(information\)\./);
    expect(words).toMatch(RATIO);
    expect(words).toMatch(
      /at least \d+\.\d of 16 digits are lost to the model, leaving at most \d+ for the lowest modes/,
    );
    expect(words).toContain('tolerance 1e−10');
    // The note agrees with the table beside it: the backward errors shown are near ε, and the
    // note names the largest of them instead of claiming they cannot reach the tolerance.
    const shown = await column(
      fineBlock.getByRole('table', { name: 'Modes of deck_modes' }),
      'Backward error',
    );
    const worst = Math.max(...shown);
    expect(worst).toBeLessThan(1e-10);
    const [mantissa, exponent] = worst.toExponential(1).split('e');
    const superscript = String(Number(exponent))
      .replace('-', '⁻')
      .replace(/\d/g, (d) => '⁰¹²³⁴⁵⁶⁷⁸⁹'[Number(d)]!);
    expect(words).toContain(
      `backward errors in the table (largest ${mantissa} × 10${superscript}) are small`,
    );
    expect(words).not.toMatch(/backward errors cannot reach/);
    // Nothing about the fine mesh is presented as a warning.
    expect(await fineBlock.getByRole('group', { name: 'Warnings' }).count()).toBe(0);
    // The Sturm check still proves no mode was missed.
    await fineBlock.getByText(/no mode missed/).waitFor();

    const plainBlock = block(page, plain, 'modes');
    const warnings = plainBlock.getByRole('group', { name: 'Warnings' });
    await warnings.getByText(/K and M have no units/).waitFor();
    expect(await plainBlock.getByRole('note', { name: 'Conditioning' }).count()).toBe(0);
    await fineBlock.screenshot({ path: await shotPath('editor-conditioning-note') });
    await saveScreenshot(page, 'editor-conditioning');
    await waitSaved(page);

    // The frozen revision reads the same way.
    await page.getByRole('button', { name: 'Issue for check' }).click();
    const form = page.getByRole('form', { name: 'Issue for check' });
    await form.getByRole('button', { name: 'Issue Rev 1' }).click();
    await page.getByRole('heading', { name: /Rev 1$/ }).waitFor({ timeout: 60_000 });
    const frozen = page.getByRole('note', { name: 'Conditioning' });
    await frozen.waitFor();
    expect(await frozen.innerText()).toMatch(RATIO);
    const frozenWarnings = page.getByRole('group', { name: 'Warnings' });
    expect(await frozenWarnings.count()).toBe(1);
    expect(await frozenWarnings.innerText()).toContain('K and M have no units');
    await saveScreenshot(page, 'revision-conditioning');
  });
});
