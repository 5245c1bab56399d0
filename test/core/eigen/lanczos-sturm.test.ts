import { describe, expect, it } from 'vitest';
import { lanczos } from '../../../core/eigen/lanczos';
import { solveModes } from '../../../core/eigen/solve-modes';
import type { SparseSymmetricMatrix } from '../../../core/linalg/types';
import { input } from './pencils';

// Lowest-p mode: when locked runs cannot make up the Sturm count, Lanczos says how many modes
// are missing (warnings and notes), and solveModes reports the mismatch once.

/** Diagonal pencil K = diag(values), M = I: the eigenvalues are the values (exact). */
function diagonal(values: number[]): { K: SparseSymmetricMatrix; M: SparseSymmetricMatrix } {
  const n = values.length;
  const colPtr = Int32Array.from({ length: n + 1 }, (_, i) => i);
  const rowIdx = Int32Array.from({ length: n }, (_, i) => i);
  return {
    K: { kind: 'sparse-symmetric', n, colPtr, rowIdx, values: Float64Array.from(values) },
    M: { kind: 'sparse-symmetric', n, colPtr, rowIdx, values: new Float64Array(n).fill(1) },
  };
}

describe('lanczos Sturm check (lowest modes)', () => {
  it('says so when the count asked for cuts through a repeated eigenvalue', () => {
    // λ = 1 thirty times, then 2, 3, …: twelve modes asked for are twelve of the thirty copies.
    const values = [
      ...new Array<number>(30).fill(1),
      ...Array.from({ length: 200 }, (_, i) => i + 2),
    ];
    const { K, M } = diagonal(values);
    const raw = lanczos(input(K, M, 12));
    expect(raw.lambdas).toHaveLength(12);
    for (const l of raw.lambdas) expect(Math.abs(l - 1)).toBeLessThan(1e-9);
    // Sturm count just above λ = 1: all thirty copies (exact, from the diagonal).
    expect(raw.sturm!.countBelow - raw.sturm!.belowSigma).toBe(30);
    expect(raw.sturm!.ok).toBe(false);
    expect(raw.warnings).toHaveLength(1);
    const w = raw.warnings[0]!;
    expect(w.code).toBe('REPEATED_BEYOND_COUNT');
    expect(w.message).toContain('counts 30 eigenvalues up to just above λ_12 = 1.00000 rad²/s²');
    expect(w.message).toContain('with 18 more copies at it');
    expect(w.message).toContain('ask for at least 30 modes');
    expect(raw.notes).toContain(w.message);

    // solveModes gives that verdict once, in place of its generic "missing" message.
    const r = solveModes(K, M, { method: 'lanczos', count: 12 });
    const sturmWarnings = r.warnings.filter(
      (x) => x.code === 'STURM_MISMATCH' || x.code === 'REPEATED_BEYOND_COUNT',
    );
    expect(sturmWarnings).toEqual([w]);
    expect(r.methodNote).not.toContain('repeated past the count');
  });

  it('agrees and warns of nothing when locked runs find every copy', () => {
    // λ = 1 twelve times among distinct values, twelve modes asked for: every copy is found.
    const values = [
      ...new Array<number>(12).fill(1),
      ...Array.from({ length: 48 }, (_, i) => i + 2),
    ];
    const { K, M } = diagonal(values);
    const raw = lanczos(input(K, M, 12));
    for (const l of raw.lambdas) expect(Math.abs(l - 1)).toBeLessThan(1e-9);
    expect(raw.lambdas).toHaveLength(12);
    expect(raw.sturm).toMatchObject({ countBelow: 12, found: 12, ok: true });
    expect(raw.warnings).toEqual([]);
  });
});
