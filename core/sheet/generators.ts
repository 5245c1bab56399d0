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
import {
  buildPlaneFrame,
  type PlaneFrameMember,
  type PlaneFrameSupport,
} from '../models/plane-frame';
import { storeyChain } from '../models/storey-chain';
import type { ModelMatrices } from '../models/types';
import { generatedMatrix, GENERATED_ENTRY_MAX_DOFS } from './large-matrix';
import { getMatrixEntryLimit, registerSheetFunctions, sheetMath } from './math';

/** Engine matrices (SI) behind the mathjs matrices generators return, for exact hand-over. */
export const ENGINE_MATRICES = new WeakMap<object, SymmetricMatrix>();
/** The DOF labels of a generated model's K and M ("w3", "θ3", "N2 ux", "u4"), for the plots. */
export const MATRIX_DOFS = new WeakMap<object, readonly string[]>();

function asList(v: unknown, what: string, fn: string): unknown[] {
  const { math } = sheetMath();
  if (math.isMatrix(v)) return ((v as Matrix).toArray() as unknown[]).flat(2);
  if (Array.isArray(v)) return v.flat(2);
  throw new EngineError('SHEET_EVAL', `${fn}: ${what} must be a list such as [18 t, 18 t, 16 t].`);
}

/** Reference units by name, parsed once: a frame of 5 000 members checks some 30 000 values. */
const REFERENCE_UNITS = new Map<string, Unit>();

function referenceUnit(unit: string): Unit {
  let u = REFERENCE_UNITS.get(unit);
  if (!u) {
    u = sheetMath().math.unit(1, unit);
    REFERENCE_UNITS.set(unit, u);
  }
  return u;
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
  if (!u.equalBase(referenceUnit(unit))) {
    throw new EngineError(
      'SHEET_EVAL',
      `${fn}: ${where} must be ${kind} (for example ${unit}); got ${u.toString()}.`,
    );
  }
  // Every unit asked for here is a plain multiple of SI (no offset): the SI value over the unit's.
  if (typeof u.value !== 'number') return u.toNumber(unit);
  return u.value / referenceUnit(unit).value;
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

/**
 * The sheet value of a generated model: K and M as matrices of quantities up to
 * GENERATED_ENTRY_MAX_DOFS, sparse model-scale matrices (./large-matrix.ts) beyond, built from the
 * generator's sparse assembly without a dense copy.
 */
function modelObject(model: ModelMatrices): Record<string, unknown> {
  const { math } = sheetMath();
  const large = model.dofs.length > GENERATED_ENTRY_MAX_DOFS;
  const K = large
    ? generatedMatrix('K', model.K, 'N/m', model.dofs)
    : toSheetMatrix(model.K, 'N/m');
  const M = large ? generatedMatrix('M', model.M, 'kg', model.dofs) : toSheetMatrix(model.M, 'kg');
  if (!large) {
    MATRIX_DOFS.set(K, model.dofs);
    MATRIX_DOFS.set(M, model.dofs);
  }
  const out: Record<string, unknown> = { K, M, n: model.dofs.length };
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

/**
 * The properties object of a generator call: a plain object with only `keys`, every one of
 * `required` present.
 * @throws EngineError SHEET_EVAL with `notObject` when it is not an object, or naming the
 *   unknown or missing property.
 */
function propsOf(
  props: unknown,
  fn: string,
  notObject: string,
  keys: readonly string[],
  required: readonly string[],
): Record<string, unknown> {
  if (
    props === null ||
    typeof props !== 'object' ||
    Object.getPrototypeOf(props) !== Object.prototype
  ) {
    throw new EngineError('SHEET_EVAL', notObject);
  }
  const p = props as Record<string, unknown>;
  for (const key of Object.keys(p)) {
    if (!keys.includes(key)) {
      throw new EngineError(
        'SHEET_EVAL',
        `${fn}: unknown property "${key}"; the properties are ${keys.join(', ')}.`,
      );
    }
  }
  for (const key of required) {
    if (!(key in p))
      throw new EngineError('SHEET_EVAL', `${fn}: the property "${key}" is missing.`);
  }
  return p;
}

const END_NAMES: BeamEnd[] = ['clamped', 'pinned', 'free', 'guided'];
const BEAM_KEYS = ['E', 'I', 'mass', 'length', 'elements', 'ends', 'lumped'];

/** `beam({E, I, mass, length, elements, ends: "pinned-pinned", lumped?: true})`. */
export function sheetBeam(props: unknown): Record<string, unknown> {
  const fn = 'beam';
  const p = propsOf(
    props,
    fn,
    'beam: give the properties as an object: beam({E: 210 GPa, I: 0.012 m^4, mass: 1.2 t/m, length: 32 m, elements: 20, ends: "pinned-pinned"}).',
    BEAM_KEYS,
    ['E', 'I', 'mass', 'length', 'elements', 'ends'],
  );
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

const FRAME_KEYS = [
  'nodes',
  'members',
  'E',
  'A',
  'I',
  'mass',
  'fixed',
  'pinned',
  'masses',
  'mass_nodes',
];

function rowsOf(v: unknown, what: string, fn: string): unknown[][] {
  const { math } = sheetMath();
  const a = math.isMatrix(v) ? ((v as Matrix).toArray() as unknown[]) : Array.isArray(v) ? v : null;
  if (!a || !a.every((r) => Array.isArray(r))) {
    throw new EngineError(
      'SHEET_EVAL',
      `${fn}: ${what} must be a matrix with one row per item, such as [1, 2; 2, 3].`,
    );
  }
  return a as unknown[][];
}

function nodeNumbers(v: unknown, what: string, count: number, fn: string): number[] {
  if (v === undefined) return [];
  return asList(v, what, fn).map((x, i) => {
    if (typeof x !== 'number' || !Number.isInteger(x) || x < 1 || x > count) {
      throw new EngineError(
        'SHEET_EVAL',
        `${fn}: ${what} entry ${i + 1} must be a node number from 1 to ${count}.`,
      );
    }
    return x - 1;
  });
}

/** A property given once for every member, or once per member. */
function perMember(
  v: unknown,
  count: number,
  unit: string,
  kind: string,
  key: string,
  fn: string,
): number[] {
  const { math } = sheetMath();
  if (math.isMatrix(v) || Array.isArray(v)) {
    const list = asList(v, key, fn);
    if (list.length !== count) {
      throw new EngineError(
        'SHEET_EVAL',
        `${fn}: ${key} has ${list.length} entries but there are ${count} members.`,
      );
    }
    return list.map((x, i) => quantityIn(x, unit, kind, `${key} of member ${i + 1}`, fn));
  }
  const one = quantityIn(v, unit, kind, key, fn);
  return new Array<number>(count).fill(one);
}

/**
 * `plane_frame({nodes: [x, y; …], members: [i, j; …], E, A, I, mass, fixed: [..], pinned: [..],
 * masses: [..], mass_nodes: [..]})`: node numbers are 1-based; E, A, I and mass are one value for
 * all members or a list with one per member; `fixed` nodes lose ux, uy, rz, `pinned` nodes ux, uy.
 */
export function sheetPlaneFrame(props: unknown): Record<string, unknown> {
  const fn = 'plane_frame';
  const p = propsOf(
    props,
    fn,
    'plane_frame: give the frame as an object: plane_frame({nodes: [0 m, 0 m; 0 m, 3.5 m], members: [1, 2], E: 210 GPa, A: 5.4e-3 m^2, I: 8.4e-5 m^4, mass: 42 kg/m, fixed: [1]}).',
    FRAME_KEYS,
    ['nodes', 'members', 'E', 'A', 'I', 'mass'],
  );
  const nodes = rowsOf(p.nodes, 'nodes', fn).map((r, i) => {
    if (r.length !== 2)
      throw new EngineError('SHEET_EVAL', `plane_frame: node ${i + 1} needs x and y.`);
    return {
      x: quantityIn(r[0], 'm', 'a length', `x of node ${i + 1}`, fn),
      y: quantityIn(r[1], 'm', 'a length', `y of node ${i + 1}`, fn),
    };
  });
  const pairs = rowsOf(math2d(p.members), 'members', fn);
  const count = pairs.length;
  const E = perMember(p.E, count, 'Pa', 'a modulus', 'E', fn);
  const A = perMember(p.A, count, 'm^2', 'an area', 'A', fn);
  const I = perMember(p.I, count, 'm^4', 'a second moment of area', 'I', fn);
  const mu = perMember(p.mass, count, 'kg/m', 'a mass per length', 'mass', fn);
  const members: PlaneFrameMember[] = pairs.map((r, i) => {
    const [a, b] = nodeNumbers(r, `member ${i + 1}`, nodes.length, fn);
    if (r.length !== 2 || a === undefined || b === undefined) {
      throw new EngineError('SHEET_EVAL', `plane_frame: member ${i + 1} needs two node numbers.`);
    }
    return { from: a, to: b, E: E[i]!, A: A[i]!, I: I[i]!, massPerLength: mu[i]! };
  });
  const supports: PlaneFrameSupport[] = [
    ...nodeNumbers(p.fixed, 'fixed', nodes.length, fn).map((node) => ({
      node,
      ux: true,
      uy: true,
      rz: true,
    })),
    ...nodeNumbers(p.pinned, 'pinned', nodes.length, fn).map((node) => ({
      node,
      ux: true,
      uy: true,
    })),
  ];
  const massNodes = nodeNumbers(p.mass_nodes, 'mass_nodes', nodes.length, fn);
  const masses =
    p.masses === undefined
      ? []
      : asList(p.masses, 'masses', fn).map((x, i) =>
          quantityIn(x, 'kg', 'a mass', `masses entry ${i + 1}`, fn),
        );
  if (masses.length !== massNodes.length) {
    throw new EngineError(
      'SHEET_EVAL',
      `plane_frame: ${masses.length} masses but ${massNodes.length} mass_nodes; give one node per mass.`,
    );
  }
  const model = buildPlaneFrame({
    nodes,
    members,
    supports,
    lumpedMasses: masses.map((mass, i) => ({ node: massNodes[i]!, mass })),
  });
  return modelObject({
    K: model.K,
    M: model.M,
    dofs: [...model.dofLabels],
    influence: [
      { name: 'ux', vector: model.influence.ux },
      { name: 'uy', vector: model.influence.uy },
    ],
  });
}

/** A single member `[1, 2]` is a vector: make it one row. */
function math2d(v: unknown): unknown {
  const { math } = sheetMath();
  if (math.isMatrix(v) && (v as Matrix).size().length === 1) return [(v as Matrix).toArray()];
  return v;
}

/** Each generator with its signature: a call with another number of arguments is refused by it. */
const GENERATOR_SIGNATURES: Record<string, [(...args: unknown[]) => unknown, string]> = {
  storey_chain: [
    sheetStoreyChain as (...args: unknown[]) => unknown,
    'storey_chain(masses, stiffnesses)',
  ],
  beam: [
    sheetBeam as (...args: unknown[]) => unknown,
    'beam({E, I, mass, length, elements, ends})',
  ],
  plane_frame: [
    sheetPlaneFrame as (...args: unknown[]) => unknown,
    'plane_frame({nodes, members, E, A, I, mass, fixed})',
  ],
};

/** A generator that names its signature when given the wrong number of arguments. */
function withArity(name: string, fn: (...args: unknown[]) => unknown, signature: string) {
  return (...args: unknown[]) => {
    if (args.length !== fn.length) {
      throw new EngineError(
        'SHEET_EVAL',
        `${name} takes ${fn.length} argument${fn.length === 1 ? '' : 's'}, ${signature}; this line gives ${args.length}.`,
        { function: name },
      );
    }
    return fn(...args);
  };
}

registerSheetFunctions(
  Object.fromEntries(
    Object.entries(GENERATOR_SIGNATURES).map(([name, [fn, sig]]) => [
      name,
      withArity(name, fn, sig),
    ]),
  ),
);
