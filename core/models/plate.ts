import { EngineError } from '../errors';
import { sparseSymmetricFromTriplets } from '../linalg/sparse';
import type { SparseSymmetricMatrix } from '../linalg/types';

export interface PlaneStressPlateInput {
  /** Length along x and height along y, m. */
  readonly lengthX: number;
  readonly lengthY: number;
  /** Thickness, m. */
  readonly thickness: number;
  /** Young's modulus (Pa), Poisson's ratio, density (kg/m³). */
  readonly E: number;
  readonly nu: number;
  readonly density: number;
  /** Elements along x and along y. */
  readonly nx: number;
  readonly ny: number;
  /** `'x0'` (default): every node on x = 0 is fixed in ux and uy; `'none'`: a free plate. */
  readonly clamp?: 'x0' | 'none';
}

export interface PlaneStressPlateModel {
  readonly K: SparseSymmetricMatrix;
  readonly M: SparseSymmetricMatrix;
  readonly n: number;
  /** `dofIndex[2·node + c]` (c = 0 ux, 1 uy), node = i·(ny+1) + j at (i·dx, j·dy); −1 if fixed. */
  readonly dofIndex: Int32Array;
  readonly influence: { readonly ux: Float64Array; readonly uy: Float64Array };
  /** Total mass ρ·t·Lx·Ly, kg. */
  readonly totalMass: number;
}

/**
 * A rectangular plate in plane stress meshed with nx × ny equal bilinear quadrilaterals (Q4),
 * stiffness and consistent mass integrated with 2 × 2 Gauss points (Zienkiewicz & Taylor, *The
 * Finite Element Method*, vol. 1; Cook et al., *Concepts and Applications of FEA*, from memory).
 * DOF layout per node ux, uy; nodes numbered along y first.
 *
 * @throws EngineError INVALID_MODEL naming the field for non-positive sizes or properties,
 *   ν outside (−1, 0.5), or a mesh below 1 × 1.
 * @example
 * const plate = buildPlaneStressPlate({ lengthX: 2, lengthY: 1, thickness: 0.01, E: 210e9, nu: 0.3, density: 7850, nx: 100, ny: 50 });
 */
export function buildPlaneStressPlate(input: PlaneStressPlateInput): PlaneStressPlateModel {
  const { lengthX, lengthY, thickness: t, E, nu, density: rho, nx, ny } = input;
  for (const [field, v] of [
    ['lengthX', lengthX],
    ['lengthY', lengthY],
    ['thickness', t],
    ['E', E],
    ['density', rho],
  ] as const) {
    if (!(v > 0) || !Number.isFinite(v)) {
      throw new EngineError('INVALID_MODEL', `Plate: ${field} must be positive, got ${v}.`, {
        field,
      });
    }
  }
  if (!(nu > -1 && nu < 0.5)) {
    throw new EngineError(
      'INVALID_MODEL',
      `Plate: Poisson's ratio must lie in (−1, 0.5), got ${nu}.`,
      {
        field: 'nu',
      },
    );
  }
  for (const [field, v] of [
    ['nx', nx],
    ['ny', ny],
  ] as const) {
    if (!Number.isInteger(v) || v < 1) {
      throw new EngineError(
        'INVALID_MODEL',
        `Plate: ${field} must be a whole number ≥ 1, got ${v}.`,
        {
          field,
        },
      );
    }
  }
  const dx = lengthX / nx;
  const dy = lengthY / ny;
  const { ke, me } = quadElement(dx, dy, t, E, nu, rho);
  const nodesY = ny + 1;
  const nNodes = (nx + 1) * nodesY;
  const clampX0 = (input.clamp ?? 'x0') === 'x0';
  const dofIndex = new Int32Array(2 * nNodes).fill(-1);
  let n = 0;
  for (let node = 0; node < nNodes; node++) {
    const i = Math.floor(node / nodesY);
    if (clampX0 && i === 0) continue;
    dofIndex[2 * node] = n++;
    dofIndex[2 * node + 1] = n++;
  }
  // Each element adds its 36 lower-triangle entries (8×8 symmetric) to both matrices.
  const nEl = nx * ny;
  const cap = nEl * 36;
  const rows = new Int32Array(cap);
  const cols = new Int32Array(cap);
  const kv = new Float64Array(cap);
  const mv = new Float64Array(cap);
  let q = 0;
  const map = new Int32Array(8);
  for (let i = 0; i < nx; i++) {
    for (let j = 0; j < ny; j++) {
      // Corner order counter-clockwise: (i,j), (i+1,j), (i+1,j+1), (i,j+1).
      const corners = [
        i * nodesY + j,
        (i + 1) * nodesY + j,
        (i + 1) * nodesY + j + 1,
        i * nodesY + j + 1,
      ];
      for (let a = 0; a < 4; a++) {
        map[2 * a] = dofIndex[2 * corners[a]!]!;
        map[2 * a + 1] = dofIndex[2 * corners[a]! + 1]!;
      }
      for (let r = 0; r < 8; r++) {
        const gr = map[r]!;
        if (gr < 0) continue;
        for (let c = 0; c <= r; c++) {
          const gc = map[c]!;
          if (gc < 0) continue;
          rows[q] = gr;
          cols[q] = gc;
          kv[q] = ke[r * 8 + c]!;
          mv[q] = me[r * 8 + c]!;
          q++;
        }
      }
    }
  }
  const K = sparseSymmetricFromTriplets(
    n,
    rows.subarray(0, q),
    cols.subarray(0, q),
    kv.subarray(0, q),
  );
  const M = sparseSymmetricFromTriplets(
    n,
    rows.subarray(0, q),
    cols.subarray(0, q),
    mv.subarray(0, q),
  );
  const ux = new Float64Array(n);
  const uy = new Float64Array(n);
  for (let node = 0; node < nNodes; node++) {
    const g = dofIndex[2 * node]!;
    if (g >= 0) {
      ux[g] = 1;
      uy[g + 1] = 1;
    }
  }
  return { K, M, n, dofIndex, influence: { ux, uy }, totalMass: rho * t * lengthX * lengthY };
}

/**
 * 8×8 stiffness and consistent mass of a dx × dy rectangular Q4 element in plane stress, DOFs
 * (u1, v1, …, u4, v4) at corners (0,0), (dx,0), (dx,dy), (0,dy), 2 × 2 Gauss integration.
 */
export function quadElement(
  dx: number,
  dy: number,
  t: number,
  E: number,
  nu: number,
  rho: number,
): { ke: Float64Array; me: Float64Array } {
  const ke = new Float64Array(64);
  const me = new Float64Array(64);
  const c = E / (1 - nu * nu);
  const D = [c, c * nu, 0, c * nu, c, 0, 0, 0, (c * (1 - nu)) / 2];
  const g = 1 / Math.sqrt(3);
  const xi = [-1, 1, 1, -1];
  const eta = [-1, -1, 1, 1];
  const detJ = (dx * dy) / 4;
  const B = new Float64Array(24);
  const N = new Float64Array(4);
  for (const gx of [-g, g]) {
    for (const gy of [-g, g]) {
      for (let a = 0; a < 4; a++) {
        N[a] = ((1 + xi[a]! * gx) * (1 + eta[a]! * gy)) / 4;
        const dNdx = ((xi[a]! * (1 + eta[a]! * gy)) / 4) * (2 / dx);
        const dNdy = ((eta[a]! * (1 + xi[a]! * gx)) / 4) * (2 / dy);
        // B rows: εx, εy, γxy.
        B[0 * 8 + 2 * a] = dNdx;
        B[0 * 8 + 2 * a + 1] = 0;
        B[1 * 8 + 2 * a] = 0;
        B[1 * 8 + 2 * a + 1] = dNdy;
        B[2 * 8 + 2 * a] = dNdy;
        B[2 * 8 + 2 * a + 1] = dNdx;
      }
      const w = detJ * t; // Gauss weights are 1
      for (let r = 0; r < 8; r++) {
        for (let s = 0; s < 8; s++) {
          let v = 0;
          for (let p = 0; p < 3; p++) {
            let db = 0;
            for (let k = 0; k < 3; k++) db += D[p * 3 + k]! * B[k * 8 + s]!;
            v += B[p * 8 + r]! * db;
          }
          ke[r * 8 + s]! += w * v;
        }
      }
      for (let a = 0; a < 4; a++) {
        for (let b = 0; b < 4; b++) {
          const v = rho * w * N[a]! * N[b]!;
          me[2 * a * 8 + 2 * b]! += v;
          me[(2 * a + 1) * 8 + 2 * b + 1]! += v;
        }
      }
    }
  }
  return { ke, me };
}
