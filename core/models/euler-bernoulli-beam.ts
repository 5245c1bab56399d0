/**
 * A uniform Euler–Bernoulli beam meshed with two-node Hermite cubic elements (deflection w and
 * rotation θ at each node). Element matrices: Przemieniecki, *Theory of Matrix Structural
 * Analysis* (1968), and Cook et al., *Concepts and Applications of Finite Element Analysis*, 4th
 * ed., §11.2 (from memory):
 *
 *   k = EI/h³ [12 6h −12 6h; 6h 4h² −6h 2h²; −12 −6h 12 −6h; 6h 2h² −6h 4h²]
 *   m = ρA h/420 [156 22h 54 −13h; 22h 4h² 13h −3h²; 54 13h 156 −22h; −13h −3h² −22h 4h²]
 *
 * Lumped mass puts mh/2 on each end deflection and no rotary inertia (the rotations are then
 * massless DOFs, which the inverse and dense methods handle).
 */
import { EngineError } from '../errors';
import { sparseSymmetricFromTriplets } from '../linalg/sparse';
import type { ModelMatrices } from './types';
import { positiveNumber } from './validate';

/** End conditions: clamped (w = θ = 0), pinned (w = 0), free, guided (θ = 0, sliding). */
export type BeamEnd = 'clamped' | 'pinned' | 'free' | 'guided';

/** Input of `eulerBernoulliBeam` in SI numbers: Pa, m⁴, kg/m, m. */
export interface BeamInput {
  E: number;
  I: number;
  massPerLength: number;
  length: number;
  elements: number;
  left: BeamEnd;
  right: BeamEnd;
  mass?: 'consistent' | 'lumped';
}

const ENDS: BeamEnd[] = ['clamped', 'pinned', 'free', 'guided'];

/**
 * Assembles K and M with the end conditions applied (restrained DOFs removed).
 * @throws EngineError INVALID_MODEL naming the field for a non-positive property, a bad element
 *   count (whole number 1…100 000) or an unknown end condition.
 * @example eulerBernoulliBeam({ E: 210e9, I: 8.3e-6, massPerLength: 30, length: 4, elements: 20, left: 'clamped', right: 'free' })
 */
export function eulerBernoulliBeam(input: BeamInput): ModelMatrices {
  const E = positiveNumber(input.E, 'E', "Young's modulus E");
  const I = positiveNumber(input.I, 'I', 'The second moment of area I');
  const m = positiveNumber(input.massPerLength, 'massPerLength', 'The mass per length');
  const L = positiveNumber(input.length, 'length', 'The beam length');
  const ne = input.elements;
  if (!Number.isInteger(ne) || ne < 1 || ne > 100000) {
    throw new EngineError(
      'INVALID_MODEL',
      `The number of elements must be a whole number from 1 to 100 000, got ${String(ne)}.`,
      {
        field: 'elements',
      },
    );
  }
  for (const side of ['left', 'right'] as const) {
    if (!ENDS.includes(input[side])) {
      throw new EngineError(
        'INVALID_MODEL',
        `The ${side} end must be clamped, pinned, free or guided, got '${String(input[side])}'.`,
        { field: side },
      );
    }
  }
  const lumped = (input.mass ?? 'consistent') === 'lumped';
  if (input.mass !== undefined && input.mass !== 'consistent' && input.mass !== 'lumped') {
    throw new EngineError(
      'INVALID_MODEL',
      `Mass must be 'consistent' or 'lumped', got '${String(input.mass)}'.`,
      {
        field: 'mass',
      },
    );
  }
  const h = L / ne;
  const nn = ne + 1;
  const full = 2 * nn;
  const restrained = new Uint8Array(full);
  const apply = (node: number, end: BeamEnd) => {
    if (end === 'clamped' || end === 'pinned') restrained[2 * node] = 1;
    if (end === 'clamped' || end === 'guided') restrained[2 * node + 1] = 1;
  };
  apply(0, input.left);
  apply(nn - 1, input.right);
  const map = new Int32Array(full).fill(-1);
  const dofs: string[] = [];
  const positions: number[] = [];
  for (let d = 0; d < full; d++) {
    if (restrained[d]) continue;
    map[d] = dofs.length;
    const node = d >> 1;
    dofs.push(`${d % 2 === 0 ? 'w' : 'θ'}${node + 1}`);
    positions.push(node * h);
  }
  const n = dofs.length;
  const kc = (E * I) / h ** 3;
  const ke = [
    [12, 6 * h, -12, 6 * h],
    [6 * h, 4 * h * h, -6 * h, 2 * h * h],
    [-12, -6 * h, 12, -6 * h],
    [6 * h, 2 * h * h, -6 * h, 4 * h * h],
  ].map((row) => row.map((x) => x * kc));
  const mc = (m * h) / 420;
  const me = lumped
    ? [
        [(m * h) / 2, 0, 0, 0],
        [0, 0, 0, 0],
        [0, 0, (m * h) / 2, 0],
        [0, 0, 0, 0],
      ]
    : [
        [156, 22 * h, 54, -13 * h],
        [22 * h, 4 * h * h, 13 * h, -3 * h * h],
        [54, 13 * h, 156, -22 * h],
        [-13 * h, -3 * h * h, -22 * h, 4 * h * h],
      ].map((row) => row.map((x) => x * mc));
  const kr: number[] = [];
  const kcols: number[] = [];
  const kv: number[] = [];
  const mr: number[] = [];
  const mcols: number[] = [];
  const mv: number[] = [];
  for (let e = 0; e < ne; e++) {
    const g = [2 * e, 2 * e + 1, 2 * e + 2, 2 * e + 3].map((d) => map[d] as number);
    for (let a = 0; a < 4; a++) {
      const ga = g[a] as number;
      if (ga < 0) continue;
      for (let b = 0; b <= a; b++) {
        const gb = g[b] as number;
        if (gb < 0) continue;
        kr.push(ga);
        kcols.push(gb);
        kv.push((ke[a] as number[])[b] as number);
        const mab = (me[a] as number[])[b] as number;
        if (mab !== 0 || a === b) {
          mr.push(ga);
          mcols.push(gb);
          mv.push(mab);
        }
      }
    }
  }
  const K = sparseSymmetricFromTriplets(n, kr, kcols, kv);
  const M = sparseSymmetricFromTriplets(n, mr, mcols, mv);
  const transverse = new Float64Array(n);
  dofs.forEach((d, i) => {
    if (d.startsWith('w')) transverse[i] = 1;
  });
  return { K, M, dofs, influence: [{ name: 'transverse', vector: transverse }], positions };
}
