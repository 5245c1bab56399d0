/**
 * Types of a sheet's source and of its evaluated results. Every result type is plain JSON
 * (numbers, strings, booleans, arrays, objects), so results can be stored, hashed, diffed and sent
 * to the client as they are. See core/sheet/README.md for the block syntax.
 */
import type { UnitSystem } from '../display-units';
import type { DenseTeam } from '../eigen/dense/team';
import type { WalkingResult } from '../response/walking';

import { BLOCK_KINDS, type BlockKind } from '../vocabulary';

export { BLOCK_KINDS, type BlockKind };

/** One block of a sheet's source. `id` is stable across revisions. */
export interface SheetBlock {
  id: string;
  kind: BlockKind;
  source: string;
}

export interface SheetSettings {
  /** Significant figures of displayed results, 1–15. Default 4. */
  significantFigures?: number;
  /**
   * The units results are shown in: SI (default) or US customary. Display only: evaluation,
   * stored results and digests are SI and the same for both.
   */
  units?: UnitSystem;
}

/** A sheet's source: ordered blocks and its settings. */
export interface Sheet {
  blocks: SheetBlock[];
  settings?: SheetSettings;
}

/** A file uploaded with the sheet, referred to from a matrix block by `from: <name>`. */
export interface SheetUpload {
  name: string;
  text: string;
}

/** Where a message points: block (by id and 0-based index) and 1-based line within the block. */
export interface SheetLocation {
  blockId: string;
  blockIndex: number;
  /** 1-based line within the block's source; 0 for the block as a whole. */
  line: number;
}

/** An error found while parsing or evaluating a sheet. Evaluation continues where it can. */
export interface SheetIssue extends SheetLocation {
  message: string;
  /** UPPER_SNAKE code: SHEET_PARSE, SHEET_EVAL, SHEET_LIMIT, NOT_EVALUATED or an engine code. */
  code: string;
  /**
   * 'note' for a line or block left unevaluated because a name it uses failed above (code
   * NOT_EVALUATED): the error that caused it is reported once where it happened, and the note
   * names it, so one slip does not read as a wave of errors. Absent for an error.
   */
  severity?: 'note';
  /** With a note: the failed name the line uses. */
  dependsOn?: string;
}

/**
 * A value as the results carry it. Quantities are given in their display unit (`value`, `unit`)
 * and in SI base units (`si`, `siUnit`), so diffs compare like with like.
 */
export type SheetValue =
  | { type: 'number'; value: number }
  | { type: 'quantity'; value: number; unit: string; si: number; siUnit: string }
  | { type: 'boolean'; value: boolean }
  | { type: 'string'; value: string }
  | {
      type: 'vector';
      length: number;
      /** Entries in `unit`; omitted (null) when the vector is larger than the display limit. */
      values: number[] | null;
      unit: string | null;
    }
  | {
      type: 'matrix';
      rows: number;
      cols: number;
      /** Rows of entries in `unit`; null when larger than the display limit. */
      values: number[][] | null;
      unit: string | null;
      /**
       * A model-scale matrix held sparse (typed arrays, one unit): its nonzeros (both triangles)
       * and the bytes its representation stores. Absent for matrices of entries.
       */
      sparse?: { nonzeros: number; bytes: number };
      /**
       * The nonzero entries, for a matrix whose `values` are not listed (too large): a page at a
       * time in the editor. Absent for matrices listed in full, and before 0.5.3.
       */
      entries?: MatrixEntries;
    }
  | { type: 'object'; fields: Record<string, SheetValue> }
  | { type: 'function'; signature: string };

/**
 * Nonzero entries of a large matrix, column by column: 1-based `rows` and `cols` and `values` in
 * the matrix's unit, at most a fixed number of them (ENTRY_LIST_LIMIT) out of `total`. For a
 * symmetric sparse matrix, its lower triangle (`lowerTriangle`).
 */
export interface MatrixEntries {
  rows: number[];
  cols: number[];
  values: number[];
  /** The nonzeros there are (of the lower triangle when `lowerTriangle`). */
  total: number;
  /** Nonzeros of the whole matrix (both triangles); explicit zeros of a sparse matrix not counted. */
  nonzeros: number;
  lowerTriangle: boolean;
}

/** LaTeX of one calc line, as an engineer writes it by hand. */
export interface CalcLatex {
  /** The statement as written: `f_{1}=\frac{\sqrt{k}}{2\pi}`. */
  formula: string;
  /** The right-hand side with the values of the names substituted; null when nothing was. */
  substituted: string | null;
  /** The result with its unit: `5.812\,\mathrm{Hz}`. */
  result: string;
}

export interface CalcLineResult {
  /** 1-based line within the block. */
  line: number;
  /** The line's source without its comment. */
  source: string;
  comment: string | null;
  /** The name assigned, when the line is an assignment. */
  name: string | null;
  latex: CalcLatex;
  value: SheetValue;
  /** Plain-text result, e.g. `5.812 Hz`. */
  display: string;
}

export interface CriterionResult {
  line: number;
  source: string;
  /** The line's comment, or its expression when it has none. */
  label: string;
  pass: boolean;
  /** For comparisons: both sides in display form. */
  lhs: string | null;
  rhs: string | null;
  /**
   * For criteria joined with and / or / not: the expression with each comparison's sides in
   * display form (`0.6546 <= 0.5 or 0.6546 >= 1.5`); absent on results stored before 0.4.1.
   */
  values?: string | null;
  /**
   * The text shown after the label as operator words and sides, each side with its value (SI in
   * `si`, `siUnit`), so a client can show the sides in another unit system: `[lhs, ' vs ', rhs]`
   * for a comparison, `values` cut into its parts for a compound criterion, null when nothing is
   * shown; absent on results stored before 0.5.1's display units.
   */
  shown?: (string | CriterionSide)[] | null;
  latex: string;
}

/** One side of a comparison in a criterion: its display text and its value. */
export interface CriterionSide {
  display: string;
  value: SheetValue;
}

/** The worst asymmetry of a square matrix: 1-based row and column, values, relative size. */
export interface Asymmetry {
  row: number;
  col: number;
  upper: number;
  lower: number;
  /** |a_ij − a_ji| / max |a|. */
  relative: number;
}

/** One row of a modes table. */
export interface ModeRow {
  mode: number;
  lambda: number;
  omega: number;
  frequency: number;
  /** null for a rigid-body mode (infinite period). */
  period: number | null;
  gamma: number | null;
  effectiveMass: number | null;
  ratio: number | null;
  cumulative: number | null;
  backwardError: number | null;
  iterations: number | null;
}

interface BlockResultBase {
  blockId: string;
  blockIndex: number;
  /** False when any line of the block has an error. */
  ok: boolean;
}

export interface TextBlockResult extends BlockResultBase {
  kind: 'text';
}

export interface CalcBlockResult extends BlockResultBase {
  kind: 'calc';
  lines: CalcLineResult[];
}

export interface MatrixBlockResult extends BlockResultBase {
  kind: 'matrix';
  name: string | null;
  unit: string | null;
  origin: 'inline' | 'upload';
  rows: number;
  cols: number;
  /** Declared by `symmetric:`; default true. */
  mustBeSymmetric: boolean;
  symmetric: boolean;
  asymmetry: Asymmetry | null;
  value: SheetValue | null;
  /** Set for a large uploaded model matrix, kept sparse (absent otherwise, and before 0.4.2). */
  storage?: 'sparse';
  /** Nonzeros of a sparse matrix (both triangles). */
  nonzeros?: number;
}

/**
 * Mode shapes at evenly spaced nodes, kept when the model is too large for `shapes` (at most
 * 2 000 rows): what the plot and the paged table of a model-scale result show.
 */
export interface ShapePreview {
  /** The 1-based DOF of each row. */
  dofs: number[];
  /** Rows of the shapes at those DOFs, columns = modes, normalized as asked. */
  shapes: number[][];
  /** The DOF labels of those rows when the model came from a generator. */
  dofLabels: string[] | null;
}

/** One warning of a modes block: its code (for the screen to classify) and its words. */
export interface ModesWarning {
  code: string;
  message: string;
}

export interface ModesBlockResult extends BlockResultBase {
  kind: 'modes';
  name: string | null;
  /** The method asked for and the method the engine used. */
  method: string | null;
  methodUsed: string | null;
  size: number | null;
  modes: ModeRow[];
  /** Mode shapes, columns = modes, in the normalization asked for; null above the display limit. */
  shapes: number[][] | null;
  /**
   * The DOF of each row of `shapes` when K came from a model generator ("w3" and "θ3" of a beam,
   * "N2 ux" of a plane frame, "u4" of a storey chain); null for typed or uploaded matrices.
   */
  dofLabels: string[] | null;
  /** Set when `shapes` is null for size: the shapes at evenly spaced nodes (absent otherwise). */
  shapePreview?: ShapePreview;
  sturm: { shift: number; count: number; found: number; missed: boolean } | null;
  /**
   * The mass the effective masses are shares of: rᵀMr for the (first) direction, kg, with its
   * name; absent without a direction (and on results before engine 0.4.3).
   */
  participation?: { direction: string; mass: number } | null;
  /**
   * Why Γ, effective mass and cumulative are empty when `participation` is null ("no direction
   * given", "direction x has no DOFs in this model …"); absent on older results.
   */
  participationReason?: string | null;
  criticalTimeStep: number | null;
  /**
   * What the reader should know about the solve, each with an UPPER_SNAKE code: the engine's
   * (ILL_CONDITIONED, STURM_MISMATCH, REPEATED_BEYOND_COUNT, …) and the sheet's (UNITS_ASSUMED_SI).
   */
  warnings: ModesWarning[];
  /** ρ per iteration for each mode, for the convergence plot. */
  histories: number[][];
  /** The remaining fields of the engine's result, as JSON. */
  engine: Record<string, unknown> | null;
}

export interface CriteriaBlockResult extends BlockResultBase {
  kind: 'criteria';
  criteria: CriterionResult[];
}

/** The analyses a response block runs. */
export type ResponseAnalysis = 'spectrum' | 'harmonic' | 'history' | 'walking';

/** One direction of a response-spectrum analysis (SI: m/s², kg, N, m, N·m). */
export interface SpectrumDirectionResult {
  direction: string;
  description: string;
  combination: 'srss' | 'cqc';
  modes: {
    mode: number;
    period: number;
    damping: number;
    sa: number;
    gamma: number;
    effectiveMass: number;
    baseShear: number;
  }[];
  baseShear: number;
  scaledBaseShear: number;
  scaling: { elfBaseShear: number; share: number; factor: number } | null;
  displacement: number[];
  storeys: {
    force: number[];
    shear: number[];
    overturning: number[];
    drift: number[];
    driftRatio: number[];
  } | null;
  closeModes: [number, number][];
  massRatio: number;
}

export interface SpectrumResponseData {
  directions: SpectrumDirectionResult[];
  /** Across directions (two or more): the rule and the combined displacements and drifts. */
  combined: { rule: 'srss' | '100-30'; displacement: number[]; drift: number[] | null } | null;
  /** The spectrum for the plot, (T s, S_a m/s²), and the modes' periods to mark on it. */
  curve: [number, number][];
  periods: number[];
}

export interface HarmonicResponseData {
  load: string;
  /** Forcing frequencies, Hz. */
  frequencies: number[];
  damping: number[];
  dofs: { dof: number; label: string; amplitude: number[]; phase: number[]; velocity: number[] }[];
  runningSpeed: number | null;
  /** Response at the running speed per DOF (m, m/s, rad). */
  atRunning: { dof: number; amplitude: number; velocity: number; phase: number }[] | null;
  /** The modes' frequencies, Hz, to mark on the plot. */
  modeFrequencies: number[];
  /** Smallest |f_n − f_run| / f_run over the modes; null without a running speed. */
  separation: number | null;
}

export interface HistoryResponseData {
  method: 'exact' | 'newmark';
  load: 'force' | 'ground';
  step: number;
  steps: number;
  /** Times of the stored points, s (every `stride`-th step, at most 2 000 points). */
  time: number[];
  stride: number;
  dofs: { dof: number; label: string; displacement: number[]; peak: number; time: number }[];
  baseShear: { values: number[]; peak: number; time: number } | null;
  dtCr: number;
  dtCrDamped: number;
}

/** A walking check as the sheet shows it: the analysis result, the DOF's label and the limit. */
export interface WalkingResponseData extends Omit<WalkingResult, 'method'> {
  label: string;
  limit: number | null;
  pass: boolean | null;
}

export interface ResponseBlockResult extends BlockResultBase {
  kind: 'response';
  name: string | null;
  analysis: ResponseAnalysis | null;
  /** The modes result analysed. */
  modes: string | null;
  /** The published method and clauses, shown beside the results. */
  method: string | null;
  /** Notes on what was assumed (influence vector, modes left out, scaling). */
  notes: string[];
  /** The caution shown with every response result (DESIGN §12). */
  caution: string;
  spectrum?: SpectrumResponseData;
  harmonic?: HarmonicResponseData;
  history?: HistoryResponseData;
  walking?: WalkingResponseData;
}

export type BlockResult =
  | TextBlockResult
  | CalcBlockResult
  | MatrixBlockResult
  | ModesBlockResult
  | ResponseBlockResult
  | CriteriaBlockResult;

/** Everything an evaluation produces. Deterministic for the same sheet and uploads. */
export interface SheetResults {
  engineVersion: string;
  significantFigures: number;
  blocks: BlockResult[];
  errors: SheetIssue[];
  /** `errors` counts errors only; the notes of lines they left unevaluated are not counted. */
  summary: { passed: number; failed: number; errors: number };
}

/**
 * Progress of an evaluation: reported as each block starts and, while a modes block solves, from
 * the eigen solver (throttled by EvaluateOptions.now when given), with its stage and modes converged.
 */
export interface SheetProgress {
  blockIndex: number;
  blockId: string;
  blockCount: number;
  kind: BlockKind;
  message: string;
  /** While a modes block solves: the method's stage, e.g. "inverse iteration". */
  stage?: string;
  iteration?: number;
  modesConverged?: number;
  modesWanted?: number;
}

export interface EvaluateOptions {
  uploads?: SheetUpload[];
  onProgress?: (progress: SheetProgress) => void;
  /**
   * A clock in milliseconds (core has none of its own): with it, a solve's progress is passed on
   * at most every PROGRESS_INTERVAL_MS (and on each newly converged mode); without it, every report.
   */
  now?: () => number;
  /** Polled between lines; when it returns true evaluation stops with a CANCELLED error. */
  isCancelled?: () => boolean;
  /** Largest matrix a single value may hold (entries). Default 4 000 000. */
  maxMatrixEntries?: number;
  /**
   * Memory one modes block's solve may use, bytes (no limit by default). A solve whose estimate
   * exceeds it is refused with MODEL_TOO_LARGE at the block's `method:` line (else its
   * `stiffness:` line), naming the estimate and the limit, instead of running out of memory.
   */
  memoryLimitBytes?: number;
  /** How to raise that limit, ending the refusal's advice (e.g. "raise MW_EVAL_MEMORY_MB …"). */
  memoryLimitAdvice?: string;
  /** Threads the dense eigensolver may share its heavy steps with (results are the same). */
  denseTeam?: DenseTeam;
}
