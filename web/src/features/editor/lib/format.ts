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
