/**
 * Types of the eigen engine: the options of `solveModes`, the modal result, and the raw result
 * every method module returns before `solveModes` post-processes it.
 */
import type { ShiftedPencil } from '../linalg/sparse-ldlt/shifted';
import type { DenseTeam } from './dense/team';
import type { SymmetricFactorization, SymmetricMatrix } from '../linalg/types';

/** The methods `solveModes` knows. `subspace` and `lanczos` answer INVALID_OPTION until they exist. */
export type MethodName =
  'auto' | 'inverse' | 'forward' | 'shifted' | 'dense' | 'subspace' | 'lanczos';

/** How shapes are scaled in the result (orthogonality and participation always use mass scaling). */
export type ShapeNormalization = 'mass' | 'max' | { dof: number };

/** Progress reported between iterations. */
export interface SolveProgress {
  stage: string;
  iteration: number;
  modesConverged: number;
  modesWanted: number;
}

/** A direction of ground motion: r in the participation factor Γ = φᵀMr / φᵀMφ. */
export interface InfluenceVector {
  name: string;
  vector: Float64Array;
}

/** Options of `solveModes`. Every field has a default. */
export interface SolveOptions {
  /** Default 'auto' (dense up to 400 DOFs, inverse iteration above, shifted when `shift` is set). */
  method?: MethodName;
  /** Number of modes (default 10, capped at n; `dense` with no count gives all of them). */
  count?: number;
  /** Relative tolerance on λ (default 1e-10). */
  tolerance?: number;
  /** Iteration limit per mode for the iterative methods (default 2000). */
  maxIterations?: number;
  /** Target eigenvalue μ in λ units (rad²/s²) for `shifted`. */
  shift?: number;
  /** Seed of the start vectors (default 1). */
  seed?: number;
  normalize?: ShapeNormalization;
  influence?: InfluenceVector[];
  /** Damping ratio ξ of the highest mode, for the damped critical time step. */
  dampingRatio?: number;
  onProgress?: (p: SolveProgress) => void;
  /** Checked between iterations; when true the solve throws EngineError('CANCELLED'). */
  signal?: { readonly aborted: boolean };
  /**
   * Memory the solve may use, bytes. Before any factorization the method's largest arrays (the
   * sparse factor from its symbolic analysis plus the iteration vectors, or the n × n arrays of
   * the dense method) are estimated and a larger estimate is refused with MODEL_TOO_LARGE
   * (details: n, method, estimateBytes, limitBytes). Not part of the reported options: it bounds
   * the run, not the result.
   */
  memoryLimitBytes?: number;
  /**
   * Threads the dense method may share its heavy steps with (`./dense/team`); the result is the
   * same bit for bit with or without. Not part of the reported options.
   */
  team?: DenseTeam;
}

/** Options after defaults are applied, as reported in the result. */
export interface ResolvedSolveOptions {
  method: MethodName;
  count: number;
  tolerance: number;
  maxIterations: number;
  shift: number | null;
  seed: number;
  normalize: ShapeNormalization;
  dampingRatio: number | null;
}

/** One mode of vibration. */
export interface Mode {
  /** 1-based position in the result (lowest first). */
  index: number;
  lambda: number;
  /** rad/s */
  omega: number;
  frequencyHz: number;
  /** s (Infinity for a rigid-body mode) */
  periodS: number;
  shape: Float64Array;
  /** Backward error ‖Kφ − λMφ‖₂ / ((‖K‖₁ + |λ| ‖M‖₁) ‖φ‖₂). */
  residual: number;
  iterations: number;
  /** λ estimate (Rayleigh quotient) after each iteration. */
  history: number[];
}

/** Participation of the modes in one influence direction. */
export interface Participation {
  name: string;
  /** rᵀMr */
  totalMass: number;
  gamma: number[];
  effectiveMass: number[];
  ratio: number[];
  cumulative: number[];
}

/** What `solveModes` returns. */
export interface ModalResult {
  method: Exclude<MethodName, 'auto'>;
  methodNote: string;
  options: ResolvedSolveOptions;
  n: number;
  modes: Mode[];
  /** max |ΦᵀMΦ − I| with mass-normalized shapes. */
  orthogonality: number;
  participation: Participation[];
  rigidBodyModes: number;
  /** 1-based pairs (i, j), i < j, with T_j / T_i > 0.9. */
  closelySpaced: [number, number][];
  criticalTimeStep?: { dtCr: number; omegaMax: number; dampingRatio?: number; dtCrDamped?: number };
  sturm?: { shift: number; countBelow: number; found: number; ok: boolean };
  /**
   * estimate: λ_max/λ₁ (a lower bound) and digitsLost its log10, the worst case of rounding;
   * relativeError: the largest relative error of the lowest modes estimated after the fact
   * (conditioning.ts), which decides the ILL_CONDITIONED warning; unresolved: that estimate ≥ 1.
   */
  conditioning: {
    estimate: number;
    digitsLost: number;
    relativeError: number;
    unresolved: boolean;
  };
  warnings: { code: string; message: string }[];
}

/**
 * What each method module returns: eigenvalues ascending with M-normalized vectors
 * (φᵀMφ = 1), iterations and ρ history per mode, and notes in words (shifts applied, DOFs
 * dropped). `solveModes` turns this into a `ModalResult`. Subspace iteration and Lanczos plug in
 * as two more modules returning this shape.
 */
export interface RawEigenResult {
  lambdas: number[];
  vectors: Float64Array[];
  iterations: number[];
  histories: number[][];
  notes: string[];
}

/** What `solveModes` hands to every method module. */
export interface MethodInput {
  K: SymmetricMatrix;
  M: SymmetricMatrix;
  count: number;
  tolerance: number;
  maxIterations: number;
  /** Shift σ of K − σM for the inverse family (0 when K is regular and no target is given). */
  shift: number;
  seed: number;
  /** A factorization of K − shift·M when the caller already has one. */
  factorization?: SymmetricFactorization;
  /** The pencil K − σM already analysed (sparse), reused by Lanczos and subspace iteration. */
  pencil?: ShiftedPencil;
  onProgress?: (p: SolveProgress) => void;
  signal?: { readonly aborted: boolean };
  /** Threads the dense method may share its heavy steps with (`./dense/team`). */
  team?: DenseTeam;
}
