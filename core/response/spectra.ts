/**
 * Design spectra as functions of the period: pseudo-acceleration S_a(T) in m/s².
 *
 * - ASCE 7-16 §11.4.6 (from memory): T₀ = 0.2 S_D1/S_DS, T_S = S_D1/S_DS;
 *   S_a = S_DS(0.4 + 0.6 T/T₀) below T₀, S_DS to T_S, S_D1/T to T_L, S_D1 T_L/T² beyond; in g.
 *   Divided by R/I_e for design forces (§12.9.1.2, from memory).
 * - EN 1998-1 §3.2.2.2 elastic spectrum S_e(T) with η = √(10/(5+ξ)) ≥ 0.55 (ξ in %), and the
 *   design spectrum S_d(T) of §3.2.2.5 for a behaviour factor q (lower bound β·a_g, β = 0.2);
 *   S, T_B, T_C, T_D from Tables 3.2 (type 1) and 3.3 (type 2) (from memory: check against the
 *   edition and National Annex you cite).
 * - A table of (T, S_a) points, linearly interpolated in T.
 */
import { EngineError } from '../errors';

/** Standard gravity, m/s² (exact by definition; NIST SP 811). */
export const STANDARD_GRAVITY = 9.80665;

/** A spectrum: its description in words and S_a(T) in m/s². */
export interface Spectrum {
  description: string;
  /** The published method, with its clause, shown beside the results. */
  source: string;
  /** Pseudo-acceleration in m/s² at period T (s). Throws for a period outside a table. */
  sa(T: number): number;
  /** Sample points for a plot: (T, S_a) from 0 to `upTo` seconds. */
  points(upTo: number): [number, number][];
}

function sample(sa: (T: number) => number, upTo: number, count = 200): [number, number][] {
  const out: [number, number][] = [];
  for (let i = 0; i <= count; i++) {
    const T = (upTo * i) / count;
    out.push([T, sa(T)]);
  }
  return out;
}

function positive(x: number, what: string): void {
  if (!(x > 0) || !Number.isFinite(x)) {
    throw new EngineError('INVALID_OPTION', `${what} must be a positive number (got ${x}).`);
  }
}

/** Parameters of the ASCE 7-16 §11.4.6 design spectrum. */
export interface AsceSpectrumParams {
  /** Design spectral acceleration at short periods, in g. */
  sds: number;
  /** Design spectral acceleration at 1 s, in g. */
  sd1: number;
  /** Long-period transition period T_L, s. */
  tl: number;
  /** Response modification coefficient R (1 for the elastic spectrum). */
  r?: number;
  /** Importance factor I_e (default 1). */
  ie?: number;
}

/**
 * ASCE 7-16 §11.4.6 design response spectrum, divided by R/I_e (from memory).
 * @example asceSpectrum({ sds: 1, sd1: 0.6, tl: 8 }).sa(0.3) // 9.80665 (plateau)
 */
export function asceSpectrum(p: AsceSpectrumParams): Spectrum {
  positive(p.sds, 'S_DS');
  positive(p.sd1, 'S_D1');
  positive(p.tl, 'T_L');
  const r = p.r ?? 1;
  const ie = p.ie ?? 1;
  positive(r, 'R');
  positive(ie, 'I_e');
  const t0 = (0.2 * p.sd1) / p.sds;
  const ts = p.sd1 / p.sds;
  const factor = (STANDARD_GRAVITY * ie) / r;
  const sa = (T: number) => {
    let g: number;
    if (T < t0) g = p.sds * (0.4 + (0.6 * T) / t0);
    else if (T <= ts) g = p.sds;
    else if (T <= p.tl) g = p.sd1 / T;
    else g = (p.sd1 * p.tl) / (T * T);
    return g * factor;
  };
  return {
    description: `ASCE 7-16 design spectrum: S_DS = ${p.sds} g, S_D1 = ${p.sd1} g, T_L = ${p.tl} s, R = ${r}, I_e = ${ie} (T₀ = ${t0.toPrecision(3)} s, T_S = ${ts.toPrecision(3)} s)`,
    source: 'ASCE 7-16 §11.4.6, forces × I_e/R (§12.9.1)',
    sa,
    points: (upTo) => sample(sa, upTo),
  };
}

/** Ground types of EN 1998-1 §3.2.1. */
export type GroundType = 'A' | 'B' | 'C' | 'D' | 'E';

/** S, T_B, T_C, T_D per ground type: Tables 3.2 (type 1) and 3.3 (type 2), from memory. */
export const EN1998_GROUND: Record<1 | 2, Record<GroundType, [number, number, number, number]>> = {
  1: {
    A: [1.0, 0.15, 0.4, 2.0],
    B: [1.2, 0.15, 0.5, 2.0],
    C: [1.15, 0.2, 0.6, 2.0],
    D: [1.35, 0.2, 0.8, 2.0],
    E: [1.4, 0.15, 0.5, 2.0],
  },
  2: {
    A: [1.0, 0.05, 0.25, 1.2],
    B: [1.35, 0.05, 0.25, 1.2],
    C: [1.5, 0.1, 0.25, 1.2],
    D: [1.8, 0.1, 0.3, 1.2],
    E: [1.6, 0.05, 0.25, 1.2],
  },
};

/** Parameters of the EN 1998-1 horizontal spectrum. */
export interface EurocodeSpectrumParams {
  type: 1 | 2;
  ground: GroundType;
  /** Design ground acceleration on type A ground a_g, m/s². */
  ag: number;
  /** Viscous damping ratio (0.05 for 5 %), for η of the elastic spectrum. */
  damping?: number;
  /** Behaviour factor q: with it, the design spectrum of §3.2.2.5; without, the elastic one. */
  q?: number;
}

/**
 * EN 1998-1 §3.2.2.2 elastic (or, with q, §3.2.2.5 design) horizontal spectrum (from memory).
 * @example eurocodeSpectrum({ type: 1, ground: 'C', ag: 2.5 }).sa(0.4) // 2.5 · 1.15 · 2.5
 */
export function eurocodeSpectrum(p: EurocodeSpectrumParams): Spectrum {
  positive(p.ag, 'a_g');
  const row = EN1998_GROUND[p.type]?.[p.ground];
  if (!row) {
    throw new EngineError(
      'INVALID_OPTION',
      `Ground type "${p.ground}" is not one of A, B, C, D, E (EN 1998-1 Table 3.1).`,
    );
  }
  const [S, tb, tc, td] = row;
  const xi = (p.damping ?? 0.05) * 100;
  const eta = Math.max(Math.sqrt(10 / (5 + xi)), 0.55);
  const ag = p.ag;
  let sa: (T: number) => number;
  let description: string;
  let source: string;
  if (p.q === undefined) {
    sa = (T) => {
      if (T < tb) return ag * S * (1 + (T / tb) * (eta * 2.5 - 1));
      if (T <= tc) return ag * S * eta * 2.5;
      if (T <= td) return ag * S * eta * 2.5 * (tc / T);
      return ag * S * eta * 2.5 * ((tc * td) / (T * T));
    };
    description = `EN 1998-1 elastic spectrum, type ${p.type}, ground ${p.ground}: a_g = ${ag} m/s², S = ${S}, T_B = ${tb} s, T_C = ${tc} s, T_D = ${td} s, η = ${eta.toPrecision(3)}`;
    source = 'EN 1998-1 §3.2.2.2, Tables 3.2/3.3 (from memory)';
  } else {
    const q = p.q;
    positive(q, 'q');
    const floor = 0.2 * ag;
    sa = (T) => {
      if (T < tb) return ag * S * (2 / 3 + (T / tb) * (2.5 / q - 2 / 3));
      if (T <= tc) return (ag * S * 2.5) / q;
      if (T <= td) return Math.max(((ag * S * 2.5) / q) * (tc / T), floor);
      return Math.max(((ag * S * 2.5) / q) * ((tc * td) / (T * T)), floor);
    };
    description = `EN 1998-1 design spectrum, type ${p.type}, ground ${p.ground}: a_g = ${ag} m/s², S = ${S}, T_B = ${tb} s, T_C = ${tc} s, T_D = ${td} s, q = ${q}, β = 0.2`;
    source = 'EN 1998-1 §3.2.2.5, Tables 3.2/3.3 (from memory)';
  }
  return { description, source, sa, points: (upTo) => sample(sa, upTo) };
}

/**
 * A spectrum given as points (T in s ascending, S_a in m/s²), linearly interpolated in T. A
 * period outside the table is refused (INVALID_OPTION, details.period).
 * @example tableSpectrum([[0, 2], [1, 4]]).sa(0.5) // 3
 */
export function tableSpectrum(points: readonly (readonly [number, number])[]): Spectrum {
  if (points.length < 2) {
    throw new EngineError('INVALID_OPTION', 'A spectrum table needs at least two rows.');
  }
  points.forEach(([T, a], i) => {
    if (!Number.isFinite(T) || !Number.isFinite(a) || T < 0 || a < 0) {
      throw new EngineError(
        'INVALID_OPTION',
        `Row ${i + 1} of the spectrum table (${T}, ${a}) is not a period ≥ 0 and an acceleration ≥ 0.`,
        { row: i + 1 },
      );
    }
    if (i > 0 && !(T > points[i - 1]![0])) {
      throw new EngineError(
        'INVALID_OPTION',
        `The periods of the spectrum table must increase: row ${i + 1} (${T} s) follows ${points[i - 1]![0]} s.`,
        { row: i + 1 },
      );
    }
  });
  const first = points[0]![0];
  const last = points[points.length - 1]![0];
  const sa = (T: number) => {
    if (T < first - 1e-12 || T > last + 1e-12) {
      throw new EngineError(
        'INVALID_OPTION',
        `The period ${T.toPrecision(4)} s is outside the spectrum table (${first} s to ${last} s).`,
        { period: T },
      );
    }
    let k = 1;
    while (k < points.length - 1 && points[k]![0] < T) k++;
    const [t0, a0] = points[k - 1]!;
    const [t1, a1] = points[k]!;
    return a0 + ((a1 - a0) * (Math.min(Math.max(T, t0), t1) - t0)) / (t1 - t0);
  };
  return {
    description: `A table of ${points.length} points, ${first} s to ${last} s, linear in period`,
    source: 'the table given, linearly interpolated in period',
    sa,
    points: () => points.map(([T, a]) => [T, a] as [number, number]),
  };
}

/**
 * Reads a two-column table from CSV text: an optional header row, then two numbers per line
 * (commas, semicolons, tabs or spaces between; blank lines and lines starting with `#` skipped).
 * `columns` names them for the messages ("period (s) and pseudo-acceleration").
 * @throws EngineError MATRIX_FILE_INVALID naming the file and line.
 * @example readTwoColumns('t,a\n0,0\n0.01,0.2\n', 'rec.csv', 'time (s) and acceleration')
 */
export function readTwoColumns(text: string, name: string, columns: string): [number, number][] {
  const out: [number, number][] = [];
  let header = true;
  text.split(/\r?\n/).forEach((raw, i) => {
    const line = raw.trim();
    if (line === '' || line.startsWith('#')) return;
    const cells = line.split(/[,;\t ]+/).filter((c) => c !== '');
    const nums = cells.map(Number);
    const numeric = cells.length > 0 && nums.every((x) => Number.isFinite(x));
    if (!numeric && header) {
      header = false; // a header row
      return;
    }
    header = false;
    if (!numeric || cells.length !== 2) {
      throw new EngineError(
        'MATRIX_FILE_INVALID',
        `${name}, line ${i + 1}: expected two numbers, ${columns}; got "${line}".`,
        { line: i + 1 },
      );
    }
    out.push([nums[0]!, nums[1]!]);
  });
  if (out.length < 2) {
    throw new EngineError(
      'MATRIX_FILE_INVALID',
      `${name}: the table needs at least two rows of ${columns}.`,
    );
  }
  return out;
}

/**
 * Reads a spectrum table from CSV text: an optional header row, then `period, S_a` per line. The
 * values are returned as written (the caller applies the acceleration unit).
 * @throws EngineError MATRIX_FILE_INVALID naming the file and line.
 * @example readSpectrumTable('T,Sa\n0,2\n1,4\n', 'S.csv') // [[0, 2], [1, 4]]
 */
export function readSpectrumTable(text: string, name = 'spectrum file'): [number, number][] {
  return readTwoColumns(text, name, 'period (s) and pseudo-acceleration');
}
