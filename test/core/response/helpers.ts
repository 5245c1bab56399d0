import {
  denseFromRows,
  solveModes,
  type ModalBasis,
  type SymmetricMatrix,
} from '../../../core/index';

/** All modes of K, M (dense solve), as a modal basis with mass-normalized shapes. */
export function basisOf(K: SymmetricMatrix, M: SymmetricMatrix, count?: number): ModalBasis {
  const r = solveModes(K, M, { method: 'dense', ...(count ? { count } : {}) });
  return { omega: r.modes.map((m) => m.omega), shapes: r.modes.map((m) => m.shape), M };
}

export function dense(rows: number[][]): SymmetricMatrix {
  return denseFromRows(rows);
}

export function diag(xs: number[]): SymmetricMatrix {
  return denseFromRows(xs.map((x, i) => xs.map((_, j) => (i === j ? x : 0))));
}

/** A single-DOF basis: mass m (kg), circular frequency ω (rad/s). */
export function sdof(m: number, omega: number): ModalBasis {
  return { omega: [omega], shapes: [Float64Array.of(1 / Math.sqrt(m))], M: diag([m]) };
}
