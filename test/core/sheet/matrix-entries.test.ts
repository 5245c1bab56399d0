import { describe, expect, it } from 'vitest';
import {
  evaluateSheet,
  type CalcBlockResult,
  type MatrixBlockResult,
  type MatrixEntries,
  type SheetValue,
} from '../../../core/index';
import { chainMatrixMarket } from '../../support/chain-files';

// A large matrix's nonzero entries as the results list them for the editor's paged table: row,
// column (1-based), value in the matrix's unit, column by column — the order of a Matrix Market
// coordinate file (the open format's own convention) — at most 10 000 of them.

function entriesOf(v: SheetValue | null | undefined): MatrixEntries {
  if (!v || v.type !== 'matrix' || !v.entries) throw new Error('no entries listed');
  return v.entries;
}

/** The listed entry at (row, col), or undefined when it is not listed. */
function at(e: MatrixEntries, row: number, col: number): number | undefined {
  for (let k = 0; k < e.rows.length; k++)
    if (e.rows[k] === row && e.cols[k] === col) return e.values[k];
  return undefined;
}

describe('the nonzero entries of a large matrix', () => {
  it("lists a generated beam's K in N/m against the Euler–Bernoulli element stiffness", () => {
    // 60 elements, clamped–free: 120 DOFs, beyond the 100 of a matrix of entries, so held sparse.
    const E = 210e9;
    const I = 0.02;
    const L = 120;
    const h = L / 60;
    const r = evaluateSheet({
      blocks: [
        {
          id: 'gen',
          kind: 'calc',
          source:
            'deck = beam({E: 210 GPa, I: 0.02 m^4, mass: 1.5 t/m, length: 120 m, elements: 60, ends: "clamped-free"})',
        },
      ],
    });
    expect(r.errors).toEqual([]);
    const line = (r.blocks[0] as CalcBlockResult).lines[0]!;
    if (line.value.type !== 'object') throw new Error('not an object');
    const K = line.value.fields.K!;
    const e = entriesOf(K);
    expect(K).toMatchObject({ type: 'matrix', rows: 120, cols: 120, values: null, unit: 'N/m' });
    expect(e.lowerTriangle).toBe(true);
    // Hermite beam element (w₁, θ₁, w₂, θ₂): EI/h³ · [12, 6h, −12, 6h; 6h, 4h², −6h, 2h²; …]
    // (Przemieniecki, Theory of Matrix Structural Analysis, the beam element, from memory).
    // The first free node joins two elements: K(w,w) = 24 EI/h³, K(θ,θ) = 8 EI/h, K(θ,w) = 0.
    const rel = (a: number | undefined, b: number) => Math.abs(a! - b) / Math.abs(b);
    expect(rel(at(e, 1, 1), (24 * E * I) / h ** 3)).toBeLessThan(1e-12);
    expect(rel(at(e, 2, 2), (8 * E * I) / h)).toBeLessThan(1e-12);
    expect(rel(at(e, 3, 1), (-12 * E * I) / h ** 3)).toBeLessThan(1e-12);
    expect(rel(at(e, 4, 1), (6 * E * I) / h ** 2)).toBeLessThan(1e-12);
    expect(rel(at(e, 4, 2), (2 * E * I) / h)).toBeLessThan(1e-12);
    // K(θ₁, w₁) = 6h − 6h cancels: an entry that is zero is not listed.
    expect(at(e, 2, 1)).toBeUndefined();
    // Column by column, rows ascending within a column, the lower triangle only.
    for (let k = 1; k < e.rows.length; k++) {
      const before =
        e.cols[k - 1]! < e.cols[k]! || (e.cols[k - 1] === e.cols[k] && e.rows[k - 1]! < e.rows[k]!);
      expect(before).toBe(true);
      expect(e.rows[k]!).toBeGreaterThanOrEqual(e.cols[k]!);
    }
    // Listed nonzeros of the lower triangle: per free node w–w and θ–θ (120), θ–w at the tip only
    // (1), 4 couplings to the next node (59 · 4): 357; the whole matrix 2 · 357 − 120 = 594.
    expect(e.total).toBe(357);
    expect(e.rows.length).toBe(357);
    expect(e.nonzeros).toBe(594);
  });

  it("lists an uploaded model's K in the block's unit, the file's own numbers", () => {
    // A 600-mass chain (beyond the 500 rows from which an upload stays sparse), k = 5000 in the
    // file, declared in kN/m: K = tridiag(−k, 2k, −k), k at the free end (REFERENCES.md item 2).
    const n = 600;
    const files = chainMatrixMarket(n, 5000, 2);
    const r = evaluateSheet(
      {
        blocks: [{ id: 'k', kind: 'matrix', source: 'name: K\nunit: kN/m\nfrom: K.mtx' }],
      },
      { uploads: [{ name: 'K.mtx', text: files.K }] },
    );
    expect(r.errors).toEqual([]);
    const block = r.blocks[0] as MatrixBlockResult;
    expect(block.storage).toBe('sparse');
    const e = entriesOf(block.value);
    expect(e.total).toBe(2 * n - 1);
    expect(e.rows.length).toBe(2 * n - 1);
    expect(e.nonzeros).toBe(3 * n - 2);
    // Exact to the last bit: kN/m → N/m → kN/m is × 1000 then ÷ 1000 of integers.
    expect(at(e, 1, 1)).toBe(10_000);
    expect(at(e, 2, 1)).toBe(-5000);
    expect(at(e, n, n)).toBe(5000);
    expect(at(e, 1, 2)).toBeUndefined();
  });

  it('lists a computed matrix beyond the 10 000 entries a result keeps, and keeps at most 10 000', () => {
    const r = evaluateSheet({
      blocks: [
        {
          id: 'c',
          kind: 'calc',
          // 120² = 14 400 entries: 2 kN/m on the diagonal; 150² · (1 + 0) ones: 22 500 nonzeros.
          source: 'D = identity(120) * 2 kN/m\nF = ones(150, 150)',
        },
      ],
    });
    expect(r.errors).toEqual([]);
    const lines = (r.blocks[0] as CalcBlockResult).lines;
    const d = lines[0]!.value;
    expect(d).toMatchObject({ type: 'matrix', rows: 120, cols: 120, values: null, unit: 'kN/m' });
    const e = entriesOf(d);
    expect(e.lowerTriangle).toBe(false);
    expect(e.total).toBe(120);
    expect(e.nonzeros).toBe(120);
    expect(e.values.every((x) => x === 2)).toBe(true);
    expect(e.rows).toEqual(e.cols);
    const f = entriesOf(lines[1]!.value);
    expect(f.total).toBe(22_500);
    expect(f.rows.length).toBe(10_000);
    // column by column: the 10 000th entry is row 100 of column 67 (66 · 150 + 100 = 10 000)
    expect([f.rows.at(-1), f.cols.at(-1)]).toEqual([100, 67]);
  });
});
