import { usUnitFor, type UnitSystem } from '../../../../../core/display-units';
import type { ResultChange } from '../../../../../core/index';

/** A number to six significant figures, as the comparison shows results. */
function six(n: number): string {
  const abs = Math.abs(n);
  const digits =
    abs !== 0 && (abs >= 1e6 || abs < 1e-4) ? n.toExponential(5) : String(Number(n.toPrecision(6)));
  return digits.replace('-', '−');
}

/** A result as the engine wrote it, its number to six significant figures, then its unit. */
export function shownValue(value: string | null): string {
  if (value === null) return '—';
  const match = /^(-?\d+(?:\.\d+)?(?:e[+-]?\d+)?)(\s.*)?$/i.exec(value.trim());
  if (!match) return value;
  const n = Number(match[1]);
  if (!Number.isFinite(n)) return value;
  return `${six(n)}${match[2] ?? ''}`;
}

/**
 * The old and new sides of a result change in `system`. In US customary a quantity with a US
 * unit is converted from its SI value, both sides in the unit the larger one reaches; other
 * results (Hz, ratios, numbers, pass or fail) and SI stay as the engine wrote them.
 */
export function changeValues(r: ResultChange, system: UnitSystem): { old: string; new: string } {
  const o = r.oldValue ?? null;
  const n = r.newValue ?? null;
  const q = [o, n].filter((v) => v?.type === 'quantity') as {
    si: number;
    siUnit: string;
  }[];
  const siUnit = q[0]?.siUnit;
  const unit =
    system === 'us' && siUnit !== undefined && q.every((v) => v.siUnit === siUnit)
      ? usUnitFor(siUnit, Math.max(...q.map((v) => Math.abs(v.si))))
      : null;
  const side = (display: string | null, v: typeof o) =>
    unit && v?.type === 'quantity' ? `${six(v.si / unit.si)} ${unit.label}` : shownValue(display);
  return { old: side(r.old, o), new: side(r.new, n) };
}
