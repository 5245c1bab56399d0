// The notes and warnings under one eigen-solve, shared by the editor and the read-only views.
//
// One engine message is information, not a problem: a fine mesh makes λ_max/λ₁ large, so the
// lowest modes cannot be resolved to the last digit the tolerance asks for. The results are right
// and the Sturm check still proves no mode was missed, so it is shown as a calm note with its
// numbers. Everything else the engine says about a solve (a failed Sturm check, a backward error
// the conditioning does not explain, rigid-body modes, units taken as SI) stays a warning.
import type { ModesBlockResult } from '../../../../core/index';

// The sheet engine passes the solver's warnings on as messages; the conditioning one (the solver's
// ILL_CONDITIONED warning, core/eigen) opens with these words. A warning that carries its code is
// recognised by the code instead.
const CONDITIONING_OPENING = /^(The model's conditioning|Conditioning:) λ_max\/λ₁/;
const EPS = 2 ** -52;

/** One message about a solve, as the sheet engine gives it: its words, or its code and words. */
export type ModesMessage = string | { code?: string; message: string };

export type Conditioning = {
  /** λ_max/λ₁ as the engine estimated it (a lower bound: λ_max ≥ max K_ii/M_ii). */
  estimate: number;
  /** log10 of the estimate: decimal digits of 16 that the model's conditioning costs. */
  digitsLost: number;
  /** The tolerance the solve asked for. */
  tolerance: number | null;
  /** The engine's own words, kept for the details. */
  message: string;
};

function numberField(value: unknown, key: string): number | null {
  if (!value || typeof value !== 'object') return null;
  const v = (value as Record<string, unknown>)[key];
  return typeof v === 'number' && Number.isFinite(v) ? v : null;
}

/**
 * Splits a modes result's messages into the conditioning note (if any) and real warnings. When
 * the conditioning leaves not even one digit of λ₁ (ε·λ_max/λ₁ above 0.1) the lowest modes are not
 * meaningful: that stays a warning.
 */
export function splitModesWarnings(result: {
  warnings: readonly ModesMessage[];
  engine: Record<string, unknown> | null;
}): {
  conditioning: Conditioning | null;
  warnings: string[];
} {
  const warnings: string[] = [];
  let conditioning: Conditioning | null = null;
  const numbers = result.engine?.conditioning;
  const estimate = numberField(numbers, 'estimate') ?? numberField(numbers, 'ratio');
  for (const item of result.warnings) {
    const message = typeof item === 'string' ? item : item.message;
    const code = typeof item === 'string' ? undefined : item.code;
    const isConditioning =
      code === 'ILL_CONDITIONED' || (code === undefined && CONDITIONING_OPENING.test(message));
    const resolved =
      estimate !== null &&
      (numbers as { unresolved?: unknown } | undefined)?.unresolved !== true &&
      estimate * EPS <= 0.1;
    if (isConditioning && resolved) {
      conditioning = {
        estimate,
        digitsLost: numberField(numbers, 'digitsLost') ?? Math.log10(estimate),
        tolerance: numberField(result.engine?.options, 'tolerance'),
        message,
      };
    } else {
      warnings.push(message);
    }
  }
  return { conditioning, warnings };
}

/** 3.2e+9 → "3.2 × 10⁹", as an engineer writes it. */
export function powerOfTen(value: number, digits = 2): string {
  if (!Number.isFinite(value)) return '—';
  const [mantissa = '', exponent = '0'] = value.toExponential(digits - 1).split('e');
  const e = Number(exponent);
  if (e === 0) return mantissa;
  const superscript = String(e)
    .replace('-', '⁻')
    .replace(/\d/g, (d) => '⁰¹²³⁴⁵⁶⁷⁸⁹'[Number(d)] ?? d);
  return `${mantissa} × 10${superscript}`;
}

/**
 * What the conditioning means for the numbers on screen, in words that agree with them. The
 * backward error ‖Kφ − λMφ‖ / ((‖K‖ + |λ|‖M‖)‖φ‖) of a stable solve stays near ε whatever the
 * conditioning; it is the eigenvalue itself whose relative error can reach about
 * (backward error) × λ_max/λ₁ (Parlett, The Symmetric Eigenvalue Problem, ch. 4 — from memory).
 */
export function conditioningWords(
  conditioning: Pick<Conditioning, 'estimate' | 'digitsLost' | 'tolerance'>,
  worstBackwardError: number | null,
): string {
  const { estimate, digitsLost, tolerance } = conditioning;
  // digits of λ₁ that rounding leaves: −log10(ε·λ_max/λ₁), as the engine counts them
  const kept = Math.max(0, Math.floor(-Math.log10(estimate * EPS)));
  const tol = tolerance !== null ? tolerance.toExponential(0).replace('-', '−') : null;
  let words = `λₘₐₓ/λ₁ ≥ ${powerOfTen(estimate)}: at least ${digitsLost.toFixed(1)} of 16 digits are lost to the model, leaving at most ${kept.toFixed(0)} for the lowest modes`;
  words += tol ? `, so their last digits may not reach the tolerance ${tol}.` : '.';
  if (worstBackwardError !== null && Number.isFinite(worstBackwardError)) {
    const worst = powerOfTen(worstBackwardError);
    const bound = powerOfTen(worstBackwardError * estimate);
    words +=
      tolerance !== null && worstBackwardError > tolerance
        ? ` The backward errors above the tolerance (largest ${worst}) are explained by it.`
        : ` The backward errors in the table (largest ${worst}) are small: the solve is accurate for this model; an eigenvalue's relative error can still be about ${worst} × λₘₐₓ/λ₁ ≈ ${bound}.`;
  }
  return `${words} This is usual for a fine mesh; it does not mean a mode was missed.`;
}

/** The conditioning note: what the numbers are and why the results can still be used. */
export function ConditioningNote({
  conditioning,
  worstBackwardError,
  compact = false,
}: {
  conditioning: Conditioning;
  /** The largest backward error of the modes shown beside the note. */
  worstBackwardError: number | null;
  compact?: boolean;
}) {
  return (
    <div
      role="note"
      aria-label="Conditioning"
      className={`rounded-sm border-l-4 border-rule-strong bg-paper-deep/60 px-3 py-1.5 text-ink-soft ${
        compact ? 'text-xs' : 'text-sm'
      }`}
    >
      <p>
        <span className="font-semibold text-ink">Conditioning (information).</span>{' '}
        {conditioningWords(conditioning, worstBackwardError)}
      </p>
      {!compact ? (
        <details className="mt-0.5 text-xs">
          <summary className="cursor-pointer text-ink-faint">The engine’s words</summary>
          <p className="mt-0.5">{conditioning.message}</p>
        </details>
      ) : null}
    </div>
  );
}

/** Real warnings about a solve: in the fail colour, announced to assistive technology. */
export function ModesWarningList({
  warnings,
  compact = false,
}: {
  warnings: readonly string[];
  compact?: boolean;
}) {
  if (warnings.length === 0) return null;
  return (
    <div
      role="group"
      aria-label="Warnings"
      className={`rounded-sm border-l-4 border-fail bg-fail-soft px-3 py-1.5 text-fail ${
        compact ? 'text-xs' : 'text-sm'
      }`}
    >
      <p className="font-semibold">Warning{warnings.length === 1 ? '' : 's'}</p>
      <ul className={warnings.length > 1 ? 'list-disc pl-5' : ''}>
        {warnings.map((w, i) => (
          <li key={i}>{w}</li>
        ))}
      </ul>
    </div>
  );
}

/** Both, in the order an engineer reads them: what needs attention first, then the note. */
export function ModesWarnings({
  result,
  compact = false,
}: {
  result: Pick<ModesBlockResult, 'engine' | 'modes'> & { warnings: readonly ModesMessage[] };
  compact?: boolean;
}) {
  const { conditioning, warnings } = splitModesWarnings(result);
  const errors = result.modes
    .map((m) => m.backwardError)
    .filter((e): e is number => e !== null && Number.isFinite(e));
  const worst = errors.length > 0 ? Math.max(...errors) : null;
  return (
    <>
      <ModesWarningList warnings={warnings} compact={compact} />
      {conditioning ? (
        <ConditioningNote
          conditioning={conditioning}
          worstBackwardError={worst}
          compact={compact}
        />
      ) : null}
    </>
  );
}
