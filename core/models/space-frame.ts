import { EngineError } from '../errors';
import { sparseSymmetricFromTriplets } from '../linalg/sparse';
import type { SparseSymmetricMatrix } from '../linalg/types';
import { transformCongruent } from './plane-frame';

/** Section and material of a 3D beam-column, SI units. */
export interface SpaceSection {
  readonly E: number;
  readonly G: number;
  readonly A: number;
  /** Second moment about local y (bending in the local x–z plane), m⁴. */
  readonly Iy: number;
  /** Second moment about local z (bending in the local x–y plane), m⁴. */
  readonly Iz: number;
  /** Torsion constant, m⁴. */
  readonly J: number;
  /** Density, kg/m³ (mass per length = ρA; rotary inertia of twist ρ(Iy + Iz)). */
  readonly density: number;
}

export interface BuildingFrameInput {
  readonly baysX: number;
  readonly baysY: number;
  readonly storeys: number;
  /** Bay width, m (both directions). */
  readonly bayWidth: number;
  /** Storey height, m. */
  readonly storeyHeight: number;
  readonly column: SpaceSection;
  readonly beam: SpaceSection;
  /** Slab mass per floor area, kg/m², lumped at floor nodes by tributary area (ux, uy, uz). */
  readonly floorMassPerArea: number;
}

export interface BuildingFrameModel {
  readonly K: SparseSymmetricMatrix;
  readonly M: SparseSymmetricMatrix;
  readonly n: number;
  /** Free DOFs are the 6 of every node above the base: ux uy uz rx ry rz, node-major. */
  readonly nodesPerFloor: number;
  readonly influence: { readonly ux: Float64Array; readonly uy: Float64Array };
  readonly elements: number;
}

/** Steel sections used by the benchmark building (typical wide-flange sizes, common practice). */
export const STEEL_BUILDING_DEFAULTS: BuildingFrameInput = {
  baysX: 20,
  baysY: 20,
  storeys: 20,
  bayWidth: 6,
  storeyHeight: 3.5,
  column: { E: 210e9, G: 81e9, A: 0.03, Iy: 3.5e-4, Iz: 1.0e-3, J: 5e-6, density: 7850 },
  beam: { E: 210e9, G: 81e9, A: 0.012, Iy: 2e-5, Iz: 5e-4, J: 1.5e-6, density: 7850 },
  floorMassPerArea: 600,
};

/**
 * A regular 3D building frame: columns at every grid point, beams along x and y at every floor,
 * base clamped, slab mass lumped at floor nodes. Members are 12-DOF Euler–Bernoulli beam-columns
 * with consistent mass (Przemieniecki, *Theory of Matrix Structural Analysis*, 1968, ch. 5 and 11,
 * from memory).
 *
 * @throws EngineError INVALID_MODEL naming the field for non-positive counts or properties.
 * @example
 * const b = buildBuildingFrame({ ...STEEL_BUILDING_DEFAULTS, baysX: 2, baysY: 2, storeys: 3 });
 */
export function buildBuildingFrame(input: BuildingFrameInput): BuildingFrameModel {
  const { baysX, baysY, storeys, bayWidth: w, storeyHeight: h } = input;
  for (const [field, v] of [
    ['baysX', baysX],
    ['baysY', baysY],
    ['storeys', storeys],
  ] as const) {
    if (!Number.isInteger(v) || v < 1) {
      throw new EngineError('INVALID_MODEL', `Building: ${field} must be a whole number ≥ 1.`, {
        field,
      });
    }
  }
  if (!(w > 0) || !(h > 0) || !(input.floorMassPerArea >= 0)) {
    throw new EngineError(
      'INVALID_MODEL',
      'Building: bay width and storey height must be positive, floor mass zero or positive.',
    );
  }
  const px = baysX + 1;
  const py = baysY + 1;
  const perFloor = px * py;
  const n = 6 * perFloor * storeys;
  // Node (ix, iy, level); level 0 is the clamped base and carries no DOFs.
  const dof0 = (ix: number, iy: number, level: number): number =>
    level === 0 ? -1 : 6 * ((level - 1) * perFloor + iy * px + ix);
  const nEl = perFloor * storeys + storeys * (baysX * py + baysY * px);
  const cap = nEl * 78 + n;
  const rows = new Int32Array(cap);
  const cols = new Int32Array(cap);
  const kv = new Float64Array(cap);
  const mv = new Float64Array(cap);
  let q = 0;
  const ke = new Float64Array(144);
  const me = new Float64Array(144);
  const map = new Int32Array(12);
  const add = (a: number, b: number, dir: 'x' | 'y' | 'z', sec: SpaceSection, L: number): void => {
    spaceFrameElement(sec, L, dir, ke, me);
    for (let c = 0; c < 6; c++) {
      map[c] = a < 0 ? -1 : a + c;
      map[6 + c] = b + c;
    }
    for (let r = 0; r < 12; r++) {
      const gr = map[r]!;
      if (gr < 0) continue;
      for (let c = 0; c <= r; c++) {
        const gc = map[c]!;
        if (gc < 0) continue;
        rows[q] = gr;
        cols[q] = gc;
        kv[q] = ke[r * 12 + c]!;
        mv[q] = me[r * 12 + c]!;
        q++;
      }
    }
  };
  for (let level = 1; level <= storeys; level++) {
    for (let iy = 0; iy < py; iy++) {
      for (let ix = 0; ix < px; ix++) {
        add(dof0(ix, iy, level - 1), dof0(ix, iy, level), 'z', input.column, h);
        if (ix + 1 < px) add(dof0(ix, iy, level), dof0(ix + 1, iy, level), 'x', input.beam, w);
        if (iy + 1 < py) add(dof0(ix, iy, level), dof0(ix, iy + 1, level), 'y', input.beam, w);
        // Slab mass by tributary area: a quarter bay per adjacent panel.
        const panelsX = (ix > 0 ? 1 : 0) + (ix < baysX ? 1 : 0);
        const panelsY = (iy > 0 ? 1 : 0) + (iy < baysY ? 1 : 0);
        const mass = (input.floorMassPerArea * panelsX * panelsY * w * w) / 4;
        const d = dof0(ix, iy, level);
        for (let c = 0; c < 3; c++) {
          rows[q] = d + c;
          cols[q] = d + c;
          kv[q] = 0;
          mv[q] = mass;
          q++;
        }
      }
    }
  }
  const r = rows.subarray(0, q);
  const c = cols.subarray(0, q);
  const K = sparseSymmetricFromTriplets(n, r, c, kv.subarray(0, q));
  const M = sparseSymmetricFromTriplets(n, r, c, mv.subarray(0, q));
  const ux = new Float64Array(n);
  const uy = new Float64Array(n);
  for (let node = 0; node < n / 6; node++) {
    ux[6 * node] = 1;
    uy[6 * node + 1] = 1;
  }
  return { K, M, n, nodesPerFloor: perFloor, influence: { ux, uy }, elements: nEl };
}

/**
 * Global 12×12 stiffness and consistent mass of a 3D beam-column along a global axis. Local axes:
 * along x → (y, z) = (Z, −Y); along y → (y, z) = (Z, X); along z (columns) → (y, z) = (X, Y).
 */
export function spaceFrameElement(
  sec: SpaceSection,
  L: number,
  dir: 'x' | 'y' | 'z',
  ke: Float64Array,
  me: Float64Array,
): void {
  const kl = new Float64Array(144);
  const ml = new Float64Array(144);
  const s = (t: Float64Array, i: number, j: number, v: number): void => {
    t[i * 12 + j] = v;
    t[j * 12 + i] = v;
  };
  const { E, G, A, Iy, Iz, J, density: rho } = sec;
  const ea = (E * A) / L;
  const gj = (G * J) / L;
  s(kl, 0, 0, ea);
  s(kl, 6, 6, ea);
  s(kl, 0, 6, -ea);
  s(kl, 3, 3, gj);
  s(kl, 9, 9, gj);
  s(kl, 3, 9, -gj);
  // Bending in the x–y plane (v, θz), Iz.
  const z1 = (12 * E * Iz) / L ** 3;
  const z2 = (6 * E * Iz) / L ** 2;
  s(kl, 1, 1, z1);
  s(kl, 7, 7, z1);
  s(kl, 1, 7, -z1);
  s(kl, 1, 5, z2);
  s(kl, 1, 11, z2);
  s(kl, 5, 7, -z2);
  s(kl, 7, 11, -z2);
  s(kl, 5, 5, (4 * E * Iz) / L);
  s(kl, 11, 11, (4 * E * Iz) / L);
  s(kl, 5, 11, (2 * E * Iz) / L);
  // Bending in the x–z plane (w, θy), Iy; dw/dx = −θy flips the coupling signs.
  const y1 = (12 * E * Iy) / L ** 3;
  const y2 = (6 * E * Iy) / L ** 2;
  s(kl, 2, 2, y1);
  s(kl, 8, 8, y1);
  s(kl, 2, 8, -y1);
  s(kl, 2, 4, -y2);
  s(kl, 2, 10, -y2);
  s(kl, 4, 8, y2);
  s(kl, 8, 10, y2);
  s(kl, 4, 4, (4 * E * Iy) / L);
  s(kl, 10, 10, (4 * E * Iy) / L);
  s(kl, 4, 10, (2 * E * Iy) / L);
  const m = rho * A;
  const ma = (m * L) / 6;
  s(ml, 0, 0, 2 * ma);
  s(ml, 6, 6, 2 * ma);
  s(ml, 0, 6, ma);
  const mt = (rho * (Iy + Iz) * L) / 6;
  s(ml, 3, 3, 2 * mt);
  s(ml, 9, 9, 2 * mt);
  s(ml, 3, 9, mt);
  const mb = (m * L) / 420;
  s(ml, 1, 1, 156 * mb);
  s(ml, 7, 7, 156 * mb);
  s(ml, 1, 7, 54 * mb);
  s(ml, 1, 5, 22 * L * mb);
  s(ml, 7, 11, -22 * L * mb);
  s(ml, 1, 11, -13 * L * mb);
  s(ml, 5, 7, 13 * L * mb);
  s(ml, 5, 5, 4 * L * L * mb);
  s(ml, 11, 11, 4 * L * L * mb);
  s(ml, 5, 11, -3 * L * L * mb);
  s(ml, 2, 2, 156 * mb);
  s(ml, 8, 8, 156 * mb);
  s(ml, 2, 8, 54 * mb);
  s(ml, 2, 4, -22 * L * mb);
  s(ml, 8, 10, 22 * L * mb);
  s(ml, 2, 10, 13 * L * mb);
  s(ml, 4, 8, -13 * L * mb);
  s(ml, 4, 4, 4 * L * L * mb);
  s(ml, 10, 10, 4 * L * L * mb);
  s(ml, 4, 10, -3 * L * L * mb);
  // R: rows are the local axes in global components.
  const R =
    dir === 'x'
      ? [1, 0, 0, 0, 0, 1, 0, -1, 0]
      : dir === 'y'
        ? [0, 1, 0, 0, 0, 1, 1, 0, 0]
        : [0, 0, 1, 1, 0, 0, 0, 1, 0];
  const T = new Float64Array(144);
  for (let b = 0; b < 4; b++) {
    for (let i = 0; i < 3; i++) {
      for (let j = 0; j < 3; j++) T[(3 * b + i) * 12 + 3 * b + j] = R[i * 3 + j]!;
    }
  }
  transformCongruent(kl, T, 12, ke);
  transformCongruent(ml, T, 12, me);
}
