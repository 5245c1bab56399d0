import { describe, expect, it } from 'vitest';
import {
  evaluateSheet,
  storeyChain,
  writeMatrixMarket,
  type CalcBlockResult,
  type MatrixBlockResult,
  type ModesBlockResult,
  type Sheet,
  type SheetUpload,
  type SheetValue,
} from '../../../core/index';

// Sheets at model scale: a generated beam of 10 000 elements, a 5 000-member plane frame and an
// uploaded 100 000-DOF model evaluate within an evaluation worker's solve budget (60 % of the
// default MW_EVAL_MEMORY_MB = 512), their K and M held sparse with one unit. Memory is asserted
// by the bytes the representation stores, never by timing.

const SOLVE_BUDGET = 0.6 * 512 * 2 ** 20;

// Clamped–free Euler–Bernoulli beam, cos βL cosh βL = −1: β₁L … β₃L (Blevins, Formulas for Natural
// Frequency and Mode Shape, Table 8-1, from memory; the values of REFERENCES.md item 1).
const CLAMPED_FREE = [1.87510407, 4.69409113, 7.85475744];

/** f_n = (β_n L)² √(EI / (m L⁴)) / 2π, Hz. */
function beamFrequency(betaL: number, E: number, I: number, m: number, L: number): number {
  return (betaL ** 2 * Math.sqrt((E * I) / (m * L ** 4))) / (2 * Math.PI);
}

function modesOf(r: ReturnType<typeof evaluateSheet>): ModesBlockResult {
  return r.blocks.find((b): b is ModesBlockResult => b.kind === 'modes')!;
}

/** The field of a calc line's object value (a generator's K or M). */
function field(r: ReturnType<typeof evaluateSheet>, key: string): SheetValue {
  const calc = r.blocks[0] as CalcBlockResult;
  const v = calc.lines[calc.lines.length - 1]!.value;
  if (v.type !== 'object') throw new Error('not an object');
  return v.fields[key]!;
}

/** Bytes a matrix value stores (its sparse representation); fails for a matrix of entries. */
function storedBytes(v: SheetValue): number {
  if (v.type !== 'matrix' || !v.sparse) throw new Error('not a sparse matrix value');
  return v.sparse.bytes;
}

const beamSheet = (elements: number): Sheet => ({
  blocks: [
    {
      id: 'gen',
      kind: 'calc',
      // An invented steel girder: E 210 GPa, I 0.02 m⁴, 1.5 t/m, 120 m, clamped at the left.
      source: `deck = beam({E: 210 GPa, I: 0.02 m^4, mass: 1.5 t/m, length: 120 m, elements: ${elements}, ends: "clamped-free"})`,
    },
    { id: 'm', kind: 'modes', source: 'stiffness: deck.K\nmass: deck.M\ncount: 3\nname: deck_v' },
  ],
});

const girder = (n: number) => beamFrequency(CLAMPED_FREE[n - 1]!, 210e9, 0.02, 1500, 120);

describe('sheets at model scale: generated beams', () => {
  it('holds a 10 000-element beam sparse and solves it within the solve budget', () => {
    const r = evaluateSheet(beamSheet(10_000), { memoryLimitBytes: SOLVE_BUDGET });
    expect(r.errors).toEqual([]);
    const m = modesOf(r);
    expect(m.size).toBe(20_000);
    // Hermite beam with consistent mass: per DOF at most 4 stored entries of the lower triangle
    // (3 nonzeros per row in the band of 4), so K stores ≤ 20 000 · 4 · (8 + 4) + 4 · 20 001
    // bytes ≈ 1.04 MB — against 20 000² quantities of a matrix of entries.
    const bytesK = storedBytes(field(r, 'K'));
    const bytesM = storedBytes(field(r, 'M'));
    expect(bytesK).toBeLessThanOrEqual(20_000 * 4 * 12 + 4 * 20_001);
    expect(bytesM).toBeLessThanOrEqual(20_000 * 4 * 12 + 4 * 20_001);
    const K = field(r, 'K');
    expect(K).toMatchObject({ type: 'matrix', rows: 20_000, cols: 20_000, values: null });
    // 20 000 rows of 3 modes are too many to keep: the shapes at evenly spaced nodes are kept.
    expect(m.shapes).toBeNull();
    expect(m.shapePreview!.shapes.length).toBeLessThanOrEqual(2_000);
    expect(m.shapePreview!.dofLabels!.at(-1)).toBe('θ10001');
    // The free end's deflection is the largest of the first mode (sign fixed to positive).
    const wEnd = m.shapePreview!.dofLabels!.indexOf('w10001');
    expect(m.shapePreview!.shapes[wEnd]![0]).toBeGreaterThan(0);
    // h = 12 mm: λ_max/λ₁ ≈ 3.5e17 is beyond double precision (a fine cantilever). The sheet
    // says so rather than print wrong digits; what it prints is still within 2 % of the closed
    // form (Blevins), which an error in the assembly of K or M would not be.
    expect(m.warnings.map((w) => w.code)).toContain('ILL_CONDITIONED');
    expect(Math.abs(m.modes[0]!.frequency / girder(1) - 1)).toBeLessThan(0.02);
  });

  it('solves a 1 000-element beam (2 000 DOFs, past the heap of a sheet of quantities) to the handbook digits', () => {
    const r = evaluateSheet(beamSheet(1_000), { memoryLimitBytes: SOLVE_BUDGET });
    expect(r.errors).toEqual([]);
    const m = modesOf(r);
    // β_n L to 9 digits; the discretization error of 1 000 Hermite elements is far smaller, but
    // λ_max/λ₁ ≈ 3.5e13 costs digits in double precision: relative 1e-5 on f.
    for (let n = 1; n <= 3; n++) {
      expect(Math.abs(m.modes[n - 1]!.frequency / girder(n) - 1)).toBeLessThan(1e-5);
    }
    expect(storedBytes(field(r, 'K'))).toBeLessThanOrEqual(2_000 * 4 * 12 + 4 * 2_001);
  });

  it('keeps small generated models as matrices of quantities a formula can index', () => {
    const r = evaluateSheet({
      blocks: [
        {
          id: 'gen',
          kind: 'calc',
          source:
            'deck = beam({E: 210 GPa, I: 8.3e-6 m^4, mass: 30 kg/m, length: 4 m, elements: 50, ends: "clamped-free"})\nk11 = deck.K[1, 1]',
        },
      ],
    });
    expect(r.errors).toEqual([]);
    const line = (r.blocks[0] as CalcBlockResult).lines[1]!;
    // 12 EI/h³ + 12 EI/h³ (two elements meet at node 2), h = 4 m / 50: Hermite stiffness.
    const kc = (12 * 210e9 * 8.3e-6) / 0.08 ** 3;
    expect(line.value.type).toBe('quantity');
    expect(Math.abs((line.value as { si: number }).si / (2 * kc) - 1)).toBeLessThan(1e-12);
  });

  it('refuses a formula on a sparse model matrix, naming it as written', () => {
    const r = evaluateSheet({
      blocks: [
        { id: 'gen', kind: 'calc', source: `${beamSheet(200).blocks[0]!.source}\nK2 = 2 * deck.K` },
      ],
    });
    expect(r.errors).toHaveLength(1);
    expect(r.errors[0]).toMatchObject({ blockId: 'gen', line: 2, code: 'SHEET_EVAL' });
    expect(r.errors[0]!.message).toMatch(
      /^deck\.K is a large sparse matrix \(400 × 400, \d+ nonzeros\) kept for the eigen solver/,
    );
  });
});

describe('sheets at model scale: a 5 000-member plane frame', () => {
  it('builds a 5 000-member column sparse and finds its sway frequency', () => {
    // A 60 m mast of 5 000 equal members, fixed at its foot (invented): axial and bending DOFs,
    // 15 000 in all. Its sway modes are those of the clamped–free beam (Blevins, as above).
    const r = evaluateSheet(
      {
        blocks: [
          {
            id: 'gen',
            kind: 'calc',
            source: [
              'n_m = 5000',
              'y = (reshape(cumsum(ones(n_m + 1)), [n_m + 1, 1]) - 1) * (60 m / n_m)',
              'xy = concat(0 * y, y, 2)',
              'a = reshape(cumsum(ones(n_m)), [n_m, 1])',
              'ends = concat(a, a + 1, 2)',
              'mast = plane_frame({nodes: xy, members: ends, E: 210 GPa, A: 0.01 m^2, I: 2e-4 m^4, mass: 80 kg/m, fixed: [1]})',
            ].join('\n'),
          },
          {
            id: 'm',
            kind: 'modes',
            source: 'stiffness: mast.K\nmass: mast.M\ncount: 2\nname: sway',
          },
        ],
      },
      { memoryLimitBytes: SOLVE_BUDGET },
    );
    expect(r.errors).toEqual([]);
    const m = modesOf(r);
    expect(m.size).toBe(15_000);
    // Per DOF at most 6 stored lower-triangle entries (3 DOFs per node, two members): 12 bytes each.
    expect(storedBytes(field(r, 'K'))).toBeLessThanOrEqual(15_000 * 6 * 12 + 4 * 15_001);
    const f1 = beamFrequency(CLAMPED_FREE[0]!, 210e9, 2e-4, 80, 60);
    // Members of 12 mm: beyond double precision as for the fine beam above; flagged, and within 2 %.
    expect(m.warnings.map((w) => w.code)).toContain('ILL_CONDITIONED');
    expect(Math.abs(m.modes[0]!.frequency / f1 - 1)).toBeLessThan(0.02);
    expect(m.shapePreview!.dofLabels!.some((l) => l.endsWith('ux'))).toBe(true);
  });
});

/**
 * Matrix Market files of a uniform storey chain (fixed base, free top): n masses m (t), springs k
 * (kN/m), written by the engine's writer as an analysis program would export them.
 */
function chainUploads(n: number, k: number, m: number): SheetUpload[] {
  const chain = storeyChain({
    masses: new Array<number>(n).fill(m),
    stiffnesses: new Array<number>(n).fill(k),
  });
  return [
    { name: 'K.mtx', text: writeMatrixMarket(chain.K) },
    { name: 'M.mtx', text: writeMatrixMarket(chain.M) },
  ];
}

describe('sheets at model scale: an uploaded 100 000-DOF model', () => {
  it('solves an uploaded 100 000-mass chain against its closed form', () => {
    const n = 100_000;
    const r = evaluateSheet(
      {
        blocks: [
          { id: 'k', kind: 'matrix', source: 'name: K\nunit: kN/m\nfrom: K.mtx' },
          { id: 'mm', kind: 'matrix', source: 'name: M\nunit: t\nfrom: M.mtx' },
          { id: 'm', kind: 'modes', source: 'stiffness: K\nmass: M\ncount: 3\nname: chain' },
        ],
      },
      { uploads: chainUploads(n, 5000, 2), memoryLimitBytes: SOLVE_BUDGET },
    );
    expect(r.errors).toEqual([]);
    const K = r.blocks[0] as MatrixBlockResult;
    expect(K.storage).toBe('sparse');
    expect(K.nonzeros).toBe(3 * n - 2);
    // Lower triangle 2n − 1 entries of 12 bytes plus n + 1 column pointers.
    expect(storedBytes(K.value!)).toBe((2 * n - 1) * 12 + 4 * (n + 1));
    // Fixed–free chain: λ_n = (4k/m) sin²((2n−1)π / (2(2N+1))) (REFERENCES.md item 2, classical),
    // k = 5e6 N/m, m = 2000 kg. λ_max/λ₁ ≈ 1.6e10 leaves about 6 digits: relative 1e-5.
    const m = modesOf(r);
    for (let j = 1; j <= 3; j++) {
      const lambda =
        ((4 * 5e6) / 2000) * Math.sin(((2 * j - 1) * Math.PI) / (2 * (2 * n + 1))) ** 2;
      expect(Math.abs(m.modes[j - 1]!.lambda / lambda - 1)).toBeLessThan(1e-5);
    }
    expect(m.shapePreview!.dofs.at(-1)).toBe(n);
    expect(m.shapePreview!.shapes.length).toBeLessThanOrEqual(2_000);
  });
});
