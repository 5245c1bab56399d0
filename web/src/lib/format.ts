/** ISO-8601 UTC from the server → "2026-12-01 22:40 UTC" (engineers' records are in UTC). */
export function formatUtc(iso: string): string {
  const d = new Date(iso);
  if (Number.isNaN(d.getTime())) return iso;
  const pad = (n: number) => String(n).padStart(2, '0');
  return (
    `${d.getUTCFullYear()}-${pad(d.getUTCMonth() + 1)}-${pad(d.getUTCDate())} ` +
    `${pad(d.getUTCHours())}:${pad(d.getUTCMinutes())} UTC`
  );
}

/** A number to `digits` significant figures, without trailing noise; exponents for extremes. */
export function sig(value: number | null | undefined, digits = 4): string {
  if (value === null || value === undefined || Number.isNaN(value)) return '—';
  if (!Number.isFinite(value)) return value > 0 ? '∞' : '−∞';
  if (value === 0) return '0';
  const abs = Math.abs(value);
  if (abs >= 1e6 || abs < 1e-4)
    return value.toExponential(Math.max(0, digits - 1)).replace('-', '−');
  return Number(value.toPrecision(digits)).toString().replace('-', '−');
}

/** A ratio 0–1 as a percentage with one decimal. */
export function percent(value: number | null | undefined): string {
  if (value === null || value === undefined || !Number.isFinite(value)) return '—';
  return `${(value * 100).toFixed(1)} %`;
}

/**
 * A participation factor beside the others of its table: "≈ 0" when it is below a millionth of
 * the largest (rounding of a mode that does not move in that direction, such as an antisymmetric
 * mode of a symmetric span), else `sig`.
 */
export function participationFactor(
  value: number | null | undefined,
  all: readonly (number | null | undefined)[],
  digits = 4,
): string {
  if (value === null || value === undefined || !Number.isFinite(value)) return sig(value, digits);
  const largest = Math.max(
    0,
    ...all.map((g) => (g !== null && g !== undefined && Number.isFinite(g) ? Math.abs(g) : 0)),
  );
  return largest > 0 && Math.abs(value) <= 1e-6 * largest ? '≈ 0' : sig(value, digits);
}

/** A mass in kg as an engineer writes it: tonnes from 1 t up (4 figures), else kg. */
export function massText(kg: number): string {
  return Math.abs(kg) >= 1000 ? `${sig(kg / 1000, 4)} t` : `${sig(kg, 4)} kg`;
}
