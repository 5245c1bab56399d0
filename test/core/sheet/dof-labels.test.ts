import { describe, expect, it } from 'vitest';
import { evaluateSheet, type ModesBlockResult } from '../../../core/index';

// REFERENCES.md item 3, the two-storey shear frame (storey masses 2m and m, storey stiffnesses 2k
// and k): effective masses 8/9 and 1/9 of the total, ω₁² = k/2m, ω₂² = 2k/m (Chopra, Dynamics
// of Structures, chapter 10, from memory). Here it is the x sway (k = 50 kN/mm, m = 100 t) of a
// model with three DOFs per floor (ux, uy, rz) as an analysis program exports it: the y sway is
// the same frame with k = 80 kN/mm and the twist the same with k = 200, m = 200 (uncoupled).
// DOF order: n1.ux n1.uy n1.rz n2.ux n2.uy n2.rz.
const kMtx = [
  '%%MatrixMarket matrix coordinate real symmetric',
  '6 6 9',
  '1 1 150',
  '4 1 -50',
  '4 4 50',
  '2 2 240',
  '5 2 -80',
  '5 5 80',
  '3 3 600',
  '6 3 -200',
  '6 6 200',
  '',
].join('\n');
const mMtx = [
  '%%MatrixMarket matrix coordinate real symmetric',
  '6 6 6',
  '1 1 200',
  '2 2 200',
  '3 3 400',
  '4 4 100',
  '5 5 100',
  '6 6 200',
  '',
].join('\n');
// The DOF map: node, component 1–6 (1 ux, 2 uy, 3 uz, 4 rx, 5 ry, 6 rz).
const dofMap = '1, 1\n1, 2\n1, 6\n2, 1\n2, 2\n2, 6\n';

const uploads = [
  { name: 'tower-k.mtx', text: kMtx },
  { name: 'tower-m.mtx', text: mMtx },
  { name: 'tower-dofs.csv', text: dofMap },
];

function solve(
  modes: string,
  kDofs = 'dofs: per node ux uy rz',
  mDofs = 'dofs: from tower-dofs.csv',
) {
  return evaluateSheet(
    {
      blocks: [
        { id: 'k', kind: 'matrix', source: `name: K\nunit: kN/mm\nfrom: tower-k.mtx\n${kDofs}` },
        { id: 'm', kind: 'matrix', source: `name: M\nunit: t\nfrom: tower-m.mtx\n${mDofs}` },
        { id: 's', kind: 'modes', source: `stiffness: K\nmass: M\nmethod: dense\n${modes}` },
      ],
    },
    { uploads },
  );
}

describe('DOF labels of uploaded matrices', () => {
  it('builds direction x from the labels: effective masses 8/9 and 1/9 (closed form)', () => {
    const r = solve('count: 6\ndirection: x\nname: tower');
    expect(r.errors).toEqual([]);
    const b = r.blocks[2] as ModesBlockResult;
    // ω² = 250, 400, 500, 1000, 1600, 2000 rad²/s² (x, y, twist of the two floors, closed form).
    const lambdas = b.modes.map((m) => m.lambda);
    [250, 400, 500, 1000, 1600, 2000].forEach((l, i) =>
      expect(Math.abs(lambdas[i]! - l) / l).toBeLessThan(1e-10),
    );
    // Relative 1e-10: a dense 6 × 6 solve against the closed form.
    expect(b.modes.map((m) => m.ratio)).toEqual([
      expect.closeTo(8 / 9, 10),
      expect.closeTo(0, 10),
      expect.closeTo(0, 10),
      expect.closeTo(1 / 9, 10),
      expect.closeTo(0, 10),
      expect.closeTo(0, 10),
    ]);
    // rᵀMr = 200 t + 100 t: the floors' mass along x, not the twist's inertia.
    expect(b.participation).toMatchObject({ direction: 'x' });
    expect(b.participation!.mass).toBeCloseTo(300e3, 6);
    expect(b.dofLabels).toEqual(['n1.ux', 'n1.uy', 'n1.rz', 'n2.ux', 'n2.uy', 'n2.rz']);
  });

  it('gives every labelled translation without "direction:" (x and y), 8/9 in each', () => {
    const r = solve('count: 6\nname: tower');
    expect(r.errors).toEqual([]);
    const b = r.blocks[2] as ModesBlockResult;
    const dirs = (b.engine as { participation: { name: string; ratio: number[] }[] }).participation;
    expect(dirs.map((d) => d.name)).toEqual(['x', 'y']);
    expect(dirs[1]!.ratio[1]).toBeCloseTo(8 / 9, 10);
    expect(dirs[1]!.ratio[4]).toBeCloseTo(1 / 9, 10);
  });

  it('states why participation is empty when the direction has no DOFs', () => {
    const r = solve('count: 2\ndirection: z');
    expect(r.errors).toEqual([]);
    const b = r.blocks[2] as ModesBlockResult;
    expect(b.participation).toBeNull();
    expect(b.modes[0]!.ratio).toBeNull();
    expect(b.participationReason).toBe(
      'direction z has no DOFs in this model (its DOF labels have the components ux, uy, rz).',
    );
  });

  it('states why participation is empty when no direction is given', () => {
    const r = evaluateSheet({
      blocks: [
        { id: 'k', kind: 'matrix', source: 'name: K\nunit: kN/m\n2000, -1000\n-1000, 1000' },
        { id: 'm', kind: 'matrix', source: 'name: M\nunit: t\n1, 0\n0, 1' },
        { id: 's', kind: 'modes', source: 'stiffness: K\nmass: M\ncount: 2' },
      ],
    });
    expect(r.errors).toEqual([]);
    expect((r.blocks[2] as ModesBlockResult).participationReason).toMatch(
      /^no direction given: write "direction:"/,
    );
  });

  it('labels a typed matrix with a list and refuses K and M labelled differently', () => {
    const typed = (kLabels: string) =>
      evaluateSheet({
        blocks: [
          {
            id: 'k',
            kind: 'matrix',
            source: `name: K\nunit: kN/m\ndofs: ${kLabels}\n3000, -1000\n-1000, 1000`,
          },
          { id: 'm', kind: 'matrix', source: 'name: M\nunit: t\ndofs: a.ux, b.ux\n2, 0\n0, 1' },
          { id: 's', kind: 'modes', source: 'stiffness: K\nmass: M\ncount: 2\ndirection: x' },
        ],
      });
    const ok = typed('a.ux, b.ux');
    expect(ok.errors).toEqual([]);
    // The item-3 frame with k = 1000 kN/m, m = 1 t: 8/9 in the first mode (relative 1e-10).
    expect((ok.blocks[2] as ModesBlockResult).modes[0]!.ratio).toBeCloseTo(8 / 9, 10);
    const bad = typed('a.ux, b.uy');
    expect(bad.errors).toEqual([
      expect.objectContaining({
        blockId: 's',
        line: 2,
        message:
          'K and M label their DOFs differently: DOF 2 is b.uy in K but b.ux in M. Give both matrix blocks the same "dofs:".',
      }),
    ]);
  });

  it('names the place when the labels and the matrix size disagree', () => {
    const rule = solve('count: 2', 'dofs: per node ux uy uz rx');
    expect(rule.errors[0]).toMatchObject({ blockId: 'k', line: 4, code: 'MATRIX_SIZE_MISMATCH' });
    expect(rule.errors[0]!.message).toBe(
      '"dofs: per node ux uy uz rx" gives 4 DOFs to a node, but K (6×6) has 6 rows: 6 is not a whole number of nodes (1 node and 2 DOFs over). Check the rule against the program\'s export, or give a DOF map.',
    );
    const map = evaluateSheet(
      {
        blocks: [
          {
            id: 'k',
            kind: 'matrix',
            source: 'name: K\nunit: kN/mm\nfrom: tower-k.mtx\ndofs: from short.csv',
          },
        ],
      },
      { uploads: [...uploads, { name: 'short.csv', text: '1, 1\n1, 2\n2, 1\n' }] },
    );
    expect(map.errors).toEqual([
      expect.objectContaining({
        blockId: 'k',
        line: 4,
        code: 'MATRIX_SIZE_MISMATCH',
        message:
          'The DOF map short.csv gives 3 DOF labels but K (6×6) has 6 rows: one label per row of the matrix, in its order.',
      }),
    ]);
  });

  it('says an unlabelled upload has no direction x, never "Unknown name"', () => {
    const r = solve('count: 2\ndirection: x', '', '');
    expect(r.errors).toHaveLength(1);
    expect(r.errors[0]).toMatchObject({ blockId: 's', line: 5 });
    expect(r.errors[0]!.message).toMatch(
      /^"x" is not a direction of this model: K and M have no DOF labels to build it from\./,
    );
  });

  it('labels a model-scale sparse upload with a rule (uniform chain, closed form)', () => {
    // A uniform shear chain of N = 250 floors in x and in y (k = 1000 kN/m, m = 10 t each):
    // 500 DOFs, so the coordinate file stays sparse. Its modes are φ_j = sin((2n−1)jπ/(2N+1)),
    // ω_n² = 4k/m · sin²((2n−1)π/(2(2N+1))) (the fixed–free chain, classical; from memory).
    const N = 250;
    const k = 1000e3;
    const m = 10e3;
    const entries: string[] = [];
    for (let f = 1; f <= N; f++) {
      for (const c of [0, 1]) {
        const i = 2 * (f - 1) + c + 1;
        entries.push(`${i} ${i} ${f < N ? 2 * k : k}`);
        if (f < N) entries.push(`${i + 2} ${i} ${-k}`);
      }
    }
    const big = `%%MatrixMarket matrix coordinate real symmetric\n${2 * N} ${2 * N} ${entries.length}\n${entries.join('\n')}\n`;
    const mass = `%%MatrixMarket matrix coordinate real symmetric\n${2 * N} ${2 * N} ${2 * N}\n${Array.from({ length: 2 * N }, (_, i) => `${i + 1} ${i + 1} ${m}`).join('\n')}\n`;
    const r = evaluateSheet(
      {
        blocks: [
          { id: 'k', kind: 'matrix', source: 'name: K\nfrom: chain-k.mtx\ndofs: per node ux uy' },
          { id: 'm', kind: 'matrix', source: 'name: M\nfrom: chain-m.mtx\ndofs: per node ux uy' },
          {
            id: 's',
            kind: 'modes',
            source: 'stiffness: K\nmass: M\nmethod: lanczos\ncount: 2\ndirection: x',
          },
        ],
      },
      {
        uploads: [
          { name: 'chain-k.mtx', text: big },
          { name: 'chain-m.mtx', text: mass },
        ],
      },
    );
    expect(r.errors).toEqual([]);
    const b = r.blocks[2] as ModesBlockResult;
    expect(b.participation!.mass).toBeCloseTo(N * m, 3);
    // Mode 1 (x and y share ω₁: the first two modes span both); its x share, closed form:
    const phi = Array.from({ length: N }, (_, j) => Math.sin(((j + 1) * Math.PI) / (2 * N + 1)));
    const sum = phi.reduce((a, b2) => a + b2, 0);
    const sq = phi.reduce((a, b2) => a + b2 * b2, 0);
    const ratio1 = (sum * sum) / sq / N;
    // The two lowest modes are one repeated pair (x and y); their x shares add to the x mode's.
    // Tolerance 1e-8 relative: a Lanczos solve at tolerance 1e-10 on λ.
    const pair = b.modes[0]!.ratio! + b.modes[1]!.ratio!;
    expect(Math.abs(pair - ratio1) / ratio1).toBeLessThan(1e-8);
  });
});
