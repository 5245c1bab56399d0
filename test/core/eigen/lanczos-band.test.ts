import { describe, expect, it } from 'vitest';
import { lanczos } from '../../../core/eigen/lanczos';
import { checkBandSturm } from '../../../core/eigen/sturm-checks';
import { createShiftedPencil, multiplyLower } from '../../../core/linalg/sparse-ldlt';
import { denseEigenvalues } from '../models/dense-pencil';
import { checkModes, doubled, input, randomPencil } from './pencils';

// Band mode (every mode in [lo, hi)) proves its count by Sturm sequences at both ends, finds the
// second copy of a repeated eigenvalue by a locked run, and warns when the count and the modes
// disagree.

/** Two identical uncoupled blocks: every eigenvalue of the block appears twice. */
function repeatedPencil() {
  const { K, M } = randomPencil(150, 9);
  const ref = denseEigenvalues(K, M); // ml-matrix on one block (REFERENCES.md item 5)
  return { K: doubled(K), M: doubled(M), ref };
}

describe('lanczos band mode', () => {
  it('finds both copies of each repeated eigenvalue in the band and proves the count', () => {
    const { K, M, ref } = repeatedPencil();
    // Band around the 3rd to 5th eigenvalues of one block: six eigenvalues of the doubled pencil.
    const lo = 0.5 * (ref[1]! + ref[2]!);
    const hi = 0.5 * (ref[4]! + ref[5]!);
    const raw = lanczos(input(K, M, 1), { band: { lo, hi } });
    expect(raw.lambdas).toHaveLength(6);
    raw.lambdas.forEach((l, i) => {
      const exact = ref[2 + Math.floor(i / 2)]!;
      // 1e-9 relative: converged to 1e-10, the dense reference loses ~n·ε.
      expect(Math.abs(l - exact) / exact).toBeLessThan(1e-9);
    });
    const chk = checkModes(K, M, raw.lambdas, raw.vectors, multiplyLower);
    expect(chk.residual).toBeLessThan(1e-9);
    expect(chk.orthogonality).toBeLessThan(1e-8);
    // Inertia of K − lo·M and K − hi·M, counted here by a pencil of our own.
    const pencil = createShiftedPencil(K, M);
    const belowLo = pencil.factorize(lo).negativePivots;
    const belowHi = pencil.factorize(hi).negativePivots;
    expect(belowLo).toBe(4);
    expect(belowHi).toBe(10);
    expect(raw.sturm).toEqual({
      shift: hi,
      countBelow: belowHi,
      belowSigma: belowLo,
      found: 6,
      ok: true,
      band: { lo, hi },
    });
    expect(raw.warnings.filter((w) => w.code === 'STURM_MISMATCH')).toEqual([]);
    expect(
      raw.notes.some((n) => n.startsWith('Sturm check of the band') && n.includes('6 found')),
    ).toBe(true);
  });

  it('warns loudly, naming the missing count, when a result is short of the Sturm count', () => {
    const { K, M, ref } = repeatedPencil();
    const lo = 0.5 * (ref[1]! + ref[2]!);
    const hi = 0.5 * (ref[4]! + ref[5]!);
    const pencil = createShiftedPencil(K, M);
    const band = {
      lo,
      hi,
      belowLo: pencil.factorize(lo).negativePivots,
      belowHi: pencil.factorize(hi).negativePivots,
    };
    const full = lanczos(input(K, M, 1), { band: { lo, hi } }).lambdas;
    // Deliberately truncated: one copy of the repeated 4th eigenvalue dropped.
    const truncated = full.filter((_, i) => i !== 3);
    const check = checkBandSturm(band, truncated);
    expect(check.sturm.ok).toBe(false);
    expect(check.sturm.found).toBe(5);
    expect(check.warning?.code).toBe('STURM_MISMATCH');
    expect(check.warning?.message).toContain('counts 6 eigenvalues in it, but 5 were found');
    expect(check.warning?.message).toContain('1 mode is missing');
    // Two missing: the plural, and the count named.
    const two = checkBandSturm(band, truncated.slice(0, 4));
    expect(two.warning?.message).toContain('2 modes are missing');
    // The full result agrees with the count: no warning.
    expect(checkBandSturm(band, full).warning).toBeNull();
  });

  it('proves an empty band by its count and returns no modes', () => {
    const { K, M, ref } = repeatedPencil();
    // Strictly between the 1st and 2nd distinct eigenvalues: nothing inside.
    const lo = ref[0]! + 0.25 * (ref[1]! - ref[0]!);
    const hi = ref[0]! + 0.75 * (ref[1]! - ref[0]!);
    const raw = lanczos(input(K, M, 1), { band: { lo, hi } });
    expect(raw.lambdas).toEqual([]);
    expect(raw.sturm?.ok).toBe(true);
    expect(raw.sturm?.countBelow).toBe(raw.sturm?.belowSigma);
  });
});
