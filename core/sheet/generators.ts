/**
 * Matrix generators callable from calc lines. Arguments carry units; results are objects with
 * `K` (N/m), `M` (kg), `r` (influence vector of the ground motion), `n` (DOFs) — matrices with
 * units, so `modes` blocks can name `frame.K` and `frame.M`.
 *
 * ```
 * frame = storey_chain([18 t, 18 t, 16 t], [24 kN/mm, 24 kN/mm, 20 kN/mm])
 * deck = beam({E: 210 GPa, I: 0.012 m^4, mass: 1.2 t/m, length: 32 m, elements: 20, ends: "pinned-pinned"})
 * ```
 * A beam's K and M mix translations and rotations; they are given in consistent SI units (N, m,
 * rad, kg) and labelled N/m and kg, which is what the K/M unit check needs.
 */
import type { Matrix, Unit } from 'mathjs';
import { EngineError } from '../errors';
import { toDense } from '../linalg/factorize';
import type { SymmetricMatrix } from '../linalg/types';
import { eulerBernoulliBeam, type BeamEnd } from '../models/euler-bernoulli-beam';
import { storeyChain } from '../models/storey-chain';
import type { ModelMatrices } from '../models/types';
import { getMatrixEntryLimit, registerSheetFunctions, sheetMath } from './math';

/** Engine matrices (SI) behind the mathjs matrices generators return, for exact hand-over. */
export const ENGINE_MATRICES = new WeakMap<object, SymmetricMatrix>();

function asList(v: unknown, what: string, fn: string): unknown[] {
  const { math } = sheetMath();
  if (math.isMatrix(v)) return ((v as Matrix).toArray() as unknown[]).flat(2);
  if (Array.isArray(v)) return v.flat(2);
  throw new EngineError('SHEET_EVAL', `${fn}: ${what} must be a list such as [18 t, 18 t, 16 t].`);
}

function quantityIn(v: unknown, unit: string, kind: string, where: string, fn: string): number {
  const { math } = sheetMath();
  if (!math.isUnit(v)) {
    throw new EngineError(
      'SHEET_EVAL',
      `${fn}: ${where} must be ${kind} with a unit (for example ${unit}); got ${typeof v === 'number' ? `the plain number ${v}` : 'something else'}.`,
    );
  }
  const u = v as Unit;
  if (!u.equalBase(math.unit(1, unit))) {
    throw new EngineError(
      'SHEET_EVAL',
      `${fn}: ${where} must be ${kind} (for example ${unit}); got ${u.toString()}.`,
    );
  }
  return u.toNumber(unit);
}

function toSheetMatrix(A: SymmetricMatrix, unit: string): Matrix {
  const { math } = sheetMath();
  const n = A.kind === 'dense' ? A.rows : A.n;
  if (n * n > getMatrixEntryLimit()) {
    throw new EngineError(
      'SHEET_LIMIT',
      `The model has ${n} DOFs: its ${n}×${n} matrices exceed the ${getMatrixEntryLimit()} entries a sheet value may hold.`,
    );
  }
  const d = toDense(A);
  const u = math.unit(1, unit);
  const rows: Unit[][] = [];
  for (let i = 0; i < n; i++) {
    const row: Unit[] = [];
    for (let j = 0; j < n; j++) row.push(math.multiply(d.data[i * n + j]!, u) as Unit);
    rows.push(row);
  }
  const m = math.matrix(rows as unknown as number[][]);
  ENGINE_MATRICES.set(m, A);
  return m;
}

function modelObject(model: ModelMatrices): Record<string, unknown> {
  const { math } = sheetMath();
  const out: Record<string, unknown> = {
    K: toSheetMatrix(model.K, 'N/m'),
    M: toSheetMatrix(model.M, 'kg'),
    n: model.dofs.length,
  };
  const first = model.influence[0];
  if (first) out.r = math.matrix(Array.from(first.vector));
  const influence: Record<string, unknown> = {};
  for (const inf of model.influence) influence[inf.name] = math.matrix(Array.from(inf.vector));
  if (model.influence.length > 0) out.influence = influence;
  return out;
}

/** `storey_chain(masses, stiffnesses)`: floor masses (lowest first) and storey stiffnesses. */
export function sheetStoreyChain(masses: unknown, stiffnesses: unknown): Record<string, unknown> {
  const fn = 'storey_chain';
  const m = asList(masses, 'the floor masses', fn).map((x, i) =>
    quantityIn(x, 'kg', 'a mass', `mass ${i + 1}`, fn),
  );
  const k = asList(stiffnesses, 'the storey stiffnesses', fn).map((x, i) =>
    quantityIn(x, 'N/m', 'a stiffness', `stiffness ${i + 1}`, fn),
  );
  return modelObject(storeyChain({ masses: m, stiffnesses: k }));
}

const END_NAMES: BeamEnd[] = ['clamped', 'pinned', 'free', 'guided'];
const BEAM_KEYS = ['E', 'I', 'mass', 'length', 'elements', 'ends', 'lumped'];

/** `beam({E, I, mass, length, elements, ends: "pinned-pinned", lumped?: true})`. */
export function sheetBeam(props: unknown): Record<string, unknown> {
  const fn = 'beam';
  if (
    props === null ||
    typeof props !== 'object' ||
    Object.getPrototypeOf(props) !== Object.prototype
  ) {
    throw new EngineError(
      'SHEET_EVAL',
      'beam: give the properties as an object: beam({E: 210 GPa, I: 0.012 m^4, mass: 1.2 t/m, length: 32 m, elements: 20, ends: "pinned-pinned"}).',
    );
  }
  const p = props as Record<string, unknown>;
  for (const key of Object.keys(p)) {
    if (!BEAM_KEYS.includes(key)) {
      throw new EngineError(
        'SHEET_EVAL',
        `beam: unknown property "${key}"; the properties are ${BEAM_KEYS.join(', ')}.`,
      );
    }
  }
  for (const key of ['E', 'I', 'mass', 'length', 'elements', 'ends']) {
    if (!(key in p)) throw new EngineError('SHEET_EVAL', `beam: the property "${key}" is missing.`);
  }
  const ends = String(p.ends).split('-');
  if (ends.length !== 2 || !ends.every((e) => END_NAMES.includes(e as BeamEnd))) {
    throw new EngineError(
      'SHEET_EVAL',
      `beam: ends must be two of ${END_NAMES.join(', ')} joined by "-", such as "pinned-pinned" (got "${String(p.ends)}").`,
    );
  }
  if (typeof p.elements !== 'number') {
    throw new EngineError('SHEET_EVAL', 'beam: elements must be a whole number.');
  }
  const model = eulerBernoulliBeam({
    E: quantityIn(p.E, 'Pa', 'a modulus', 'E', fn),
    I: quantityIn(p.I, 'm^4', 'a second moment of area', 'I', fn),
    massPerLength: quantityIn(p.mass, 'kg/m', 'a mass per length', 'mass', fn),
    length: quantityIn(p.length, 'm', 'a length', 'length', fn),
    elements: p.elements,
    left: ends[0] as BeamEnd,
    right: ends[1] as BeamEnd,
    mass: p.lumped === true ? 'lumped' : 'consistent',
  });
  return modelObject(model);
}

registerSheetFunctions({ storey_chain: sheetStoreyChain, beam: sheetBeam });
