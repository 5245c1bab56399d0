/**
 * Types shared by the response analyses: the modal basis they start from and the per-mode damping.
 */
import type { SymmetricMatrix } from '../linalg/types';

/**
 * The modes a response analysis superposes: circular frequencies (rad/s), shapes in any scaling
 * (the analyses divide by φᵀMφ, so mass-, max- or DOF-normalized shapes give the same answers)
 * and the mass matrix they were found with (SI: kg, N/m for K).
 */
export interface ModalBasis {
  omega: readonly number[];
  shapes: readonly Float64Array[];
  M: SymmetricMatrix;
}

/** Modal damping: one ratio for every mode, or one per mode (0 ≤ ζ < 1). */
export type ModalDamping = number | readonly number[];
