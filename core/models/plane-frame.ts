import { EngineError } from '../errors';
import { sparseSymmetricFromTriplets } from '../linalg/sparse';
import type { SparseSymmetricMatrix } from '../linalg/types';

/** A node of a plane frame, coordinates in m. */
export interface PlaneFrameNode {
  readonly x: number;
  readonly y: number;
}

/** An Euler–Bernoulli frame member between two nodes (0-based node indices), SI units. */
export interface PlaneFrameMember {
  readonly from: number;
  readonly to: number;
  /** Young's modulus, Pa. */
  readonly E: number;
  /** Cross-section area, m². */
  readonly A: number;
  /** Second moment of area about the out-of-plane axis, m⁴. */
  readonly I: number;
  /** Mass per length, kg/m. */
  readonly massPerLength: number;
}

/** Restrained degrees of freedom of one node (true = fixed). */
export interface PlaneFrameSupport {
  readonly node: number;
  readonly ux?: boolean;
  readonly uy?: boolean;
  readonly rz?: boolean;
}

/** A lumped mass (kg) and optional rotary inertia (kg·m²) at a node. */
export interface PlaneFrameLumpedMass {
  readonly node: number;
  readonly mass: number;
  readonly rotaryInertia?: number;
}

export interface PlaneFrameInput {
  readonly nodes: readonly PlaneFrameNode[];
  readonly members: readonly PlaneFrameMember[];
  readonly supports?: readonly PlaneFrameSupport[];
  readonly lumpedMasses?: readonly PlaneFrameLumpedMass[];
}

/** The assembled model on the free degrees of freedom. */
export interface PlaneFrameModel {
  readonly K: SparseSymmetricMatrix;
  readonly M: SparseSymmetricMatrix;
  /** Number of free degrees of freedom. */
  readonly n: number;
  /** `dofIndex[3·node + c]` (c = 0 ux, 1 uy, 2 rz): index in K and M, or −1 when restrained. */
  readonly dofIndex: Int32Array;
  /** Label of each free DOF, e.g. `"N3 uy"` (1-based node number). */
  readonly dofLabels: readonly string[];
  /** Influence vectors: 1 on every free ux (resp. uy) DOF, 0 elsewhere. */
  readonly influence: { readonly ux: Float64Array; readonly uy: Float64Array };
}

const COMPONENTS = ['ux', 'uy', 'rz'] as const;

/**
 * Assembles the stiffness and consistent mass matrices of a plane frame of Euler–Bernoulli members
 * (axial bar plus Hermite cubic bending; consistent mass m L/6·[2 1; 1 2] axially and
 * m L/420·[156 22L 54 −13L; …] in bending — Przemieniecki, *Theory of Matrix Structural
 * Analysis*, 1968, ch. 5 and 11; Cook et al., *Concepts and Applications of FEA*, from memory).
 * DOF layout per node: ux, uy, rz; supports remove DOFs; lumped masses add to the diagonal.
 *
 * @throws EngineError INVALID_MODEL naming the member or node for unknown nodes, zero length,
 *   non-positive E, A, I or negative mass.
 * @example
 * const m = buildPlaneFrame({ nodes: [{x:0,y:0},{x:0,y:3}], members: [{from:0,to:1,E:210e9,A:1e-2,I:1e-4,massPerLength:80}], supports: [{node:0,ux:true,uy:true,rz:true}] });
 */
export function buildPlaneFrame(input: PlaneFrameInput): PlaneFrameModel {
  const { nodes, members } = input;
  const nn = nodes.length;
  nodes.forEach((p, k) => {
    if (!Number.isFinite(p.x) || !Number.isFinite(p.y)) {
      throw new EngineError(
        'INVALID_MODEL',
        `Node ${k + 1} has a coordinate that is not a number.`,
        {
          node: k + 1,
        },
      );
    }
  });
  const fixed = new Uint8Array(3 * nn);
  for (const s of input.supports ?? []) {
    checkNode(s.node, nn, 'A support');
    if (s.ux) fixed[3 * s.node] = 1;
    if (s.uy) fixed[3 * s.node + 1] = 1;
    if (s.rz) fixed[3 * s.node + 2] = 1;
  }
  const dofIndex = new Int32Array(3 * nn).fill(-1);
  const dofLabels: string[] = [];
  let n = 0;
  for (let d = 0; d < 3 * nn; d++) {
    if (!fixed[d]) {
      dofIndex[d] = n++;
      dofLabels.push(`N${Math.floor(d / 3) + 1} ${COMPONENTS[d % 3]}`);
    }
  }
  const kr: number[] = [];
  const kc: number[] = [];
  const kv: number[] = [];
  const mr: number[] = [];
  const mc: number[] = [];
  const mv: number[] = [];
  const ke = new Float64Array(36);
  const me = new Float64Array(36);
  const map = new Int32Array(6);
  members.forEach((mem, e) => {
    const where = `Member ${e + 1}`;
    checkNode(mem.from, nn, where);
    checkNode(mem.to, nn, where);
    const a = nodes[mem.from]!;
    const b = nodes[mem.to]!;
    const L = Math.hypot(b.x - a.x, b.y - a.y);
    if (!(L > 0)) {
      throw new EngineError('INVALID_MODEL', `${where} has zero length (both ends at one point).`, {
        member: e + 1,
      });
    }
    for (const [name, v] of [
      ['E', mem.E],
      ['A', mem.A],
      ['I', mem.I],
    ] as const) {
      if (!(v > 0) || !Number.isFinite(v)) {
        throw new EngineError('INVALID_MODEL', `${where}: ${name} must be positive, got ${v}.`, {
          member: e + 1,
          field: name,
        });
      }
    }
    if (!(mem.massPerLength >= 0) || !Number.isFinite(mem.massPerLength)) {
      throw new EngineError(
        'INVALID_MODEL',
        `${where}: mass per length must be zero or positive, got ${mem.massPerLength}.`,
        { member: e + 1, field: 'massPerLength' },
      );
    }
    planeFrameElement(
      mem.E,
      mem.A,
      mem.I,
      mem.massPerLength,
      L,
      (b.x - a.x) / L,
      (b.y - a.y) / L,
      ke,
      me,
    );
    for (let c = 0; c < 3; c++) {
      map[c] = dofIndex[3 * mem.from + c]!;
      map[3 + c] = dofIndex[3 * mem.to + c]!;
    }
    for (let i = 0; i < 6; i++) {
      const gi = map[i]!;
      if (gi < 0) continue;
      for (let j = 0; j <= i; j++) {
        const gj = map[j]!;
        if (gj < 0) continue;
        kr.push(gi);
        kc.push(gj);
        kv.push(ke[i * 6 + j]!);
        mr.push(gi);
        mc.push(gj);
        mv.push(me[i * 6 + j]!);
      }
    }
  });
  for (const lm of input.lumpedMasses ?? []) {
    checkNode(lm.node, nn, 'A lumped mass');
    if (!(lm.mass >= 0) || !((lm.rotaryInertia ?? 0) >= 0)) {
      throw new EngineError(
        'INVALID_MODEL',
        `The lumped mass at node ${lm.node + 1} must be zero or positive.`,
        { node: lm.node + 1 },
      );
    }
    for (let c = 0; c < 3; c++) {
      const g = dofIndex[3 * lm.node + c]!;
      const v = c < 2 ? lm.mass : (lm.rotaryInertia ?? 0);
      if (g >= 0 && v > 0) {
        mr.push(g);
        mc.push(g);
        mv.push(v);
      }
    }
  }
  const K = sparseSymmetricFromTriplets(n, kr, kc, kv);
  const M = sparseSymmetricFromTriplets(n, mr, mc, mv);
  const ux = new Float64Array(n);
  const uy = new Float64Array(n);
  for (let node = 0; node < nn; node++) {
    const gx = dofIndex[3 * node]!;
    const gy = dofIndex[3 * node + 1]!;
    if (gx >= 0) ux[gx] = 1;
    if (gy >= 0) uy[gy] = 1;
  }
  return { K, M, n, dofIndex, dofLabels, influence: { ux, uy } };
}

function checkNode(node: number, nn: number, where: string): void {
  if (!Number.isInteger(node) || node < 0 || node >= nn) {
    throw new EngineError(
      'INVALID_MODEL',
      `${where} refers to node ${node + 1}, but the frame has nodes 1 to ${nn}.`,
      { node: node + 1 },
    );
  }
}

/**
 * Global 6×6 stiffness and consistent mass of a plane Euler–Bernoulli frame member with direction
 * cosines (c, s), DOFs (u1, v1, θ1, u2, v2, θ2), row-major into `ke` and `me`.
 */
export function planeFrameElement(
  E: number,
  A: number,
  I: number,
  m: number,
  L: number,
  c: number,
  s: number,
  ke: Float64Array,
  me: Float64Array,
): void {
  const kl = new Float64Array(36);
  const ml = new Float64Array(36);
  const ea = (E * A) / L;
  const k1 = (12 * E * I) / L ** 3;
  const k2 = (6 * E * I) / L ** 2;
  const k3 = (4 * E * I) / L;
  const k4 = (2 * E * I) / L;
  const setSym = (t: Float64Array, i: number, j: number, v: number): void => {
    t[i * 6 + j] = v;
    t[j * 6 + i] = v;
  };
  setSym(kl, 0, 0, ea);
  setSym(kl, 3, 3, ea);
  setSym(kl, 0, 3, -ea);
  setSym(kl, 1, 1, k1);
  setSym(kl, 4, 4, k1);
  setSym(kl, 1, 4, -k1);
  setSym(kl, 1, 2, k2);
  setSym(kl, 1, 5, k2);
  setSym(kl, 2, 4, -k2);
  setSym(kl, 4, 5, -k2);
  setSym(kl, 2, 2, k3);
  setSym(kl, 5, 5, k3);
  setSym(kl, 2, 5, k4);
  const ma = (m * L) / 6;
  const mb = (m * L) / 420;
  setSym(ml, 0, 0, 2 * ma);
  setSym(ml, 3, 3, 2 * ma);
  setSym(ml, 0, 3, ma);
  setSym(ml, 1, 1, 156 * mb);
  setSym(ml, 4, 4, 156 * mb);
  setSym(ml, 1, 4, 54 * mb);
  setSym(ml, 1, 2, 22 * L * mb);
  setSym(ml, 4, 5, -22 * L * mb);
  setSym(ml, 1, 5, -13 * L * mb);
  setSym(ml, 2, 4, 13 * L * mb);
  setSym(ml, 2, 2, 4 * L * L * mb);
  setSym(ml, 5, 5, 4 * L * L * mb);
  setSym(ml, 2, 5, -3 * L * L * mb);
  // T maps global to local: local = T · global, per node [[c, s, 0], [−s, c, 0], [0, 0, 1]].
  const T = new Float64Array(36);
  for (const o of [0, 3]) {
    T[(o + 0) * 6 + o] = c;
    T[(o + 0) * 6 + o + 1] = s;
    T[(o + 1) * 6 + o] = -s;
    T[(o + 1) * 6 + o + 1] = c;
    T[(o + 2) * 6 + o + 2] = 1;
  }
  transformCongruent(kl, T, 6, ke);
  transformCongruent(ml, T, 6, me);
}

/** out = Tᵀ · A · T for n×n row-major matrices. */
export function transformCongruent(
  A: Float64Array,
  T: Float64Array,
  n: number,
  out: Float64Array,
): void {
  const tmp = new Float64Array(n * n);
  for (let i = 0; i < n; i++) {
    for (let j = 0; j < n; j++) {
      let s = 0;
      for (let k = 0; k < n; k++) s += A[i * n + k]! * T[k * n + j]!;
      tmp[i * n + j] = s;
    }
  }
  for (let i = 0; i < n; i++) {
    for (let j = 0; j < n; j++) {
      let s = 0;
      for (let k = 0; k < n; k++) s += T[k * n + i]! * tmp[k * n + j]!;
      out[i * n + j] = s;
    }
  }
}
