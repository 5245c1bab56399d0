/**
 * The ρ axis: automatic, with as many figures as its ticks need to differ; a history that hardly
 * moves (a method that converged at once, such as Lanczos) gets a small band around its value
 * instead of ticks that all read the same.
 */
export function rhoAxis(history: readonly number[]): {
  domain: [number | 'auto', number | 'auto'];
  digits: number;
} {
  if (history.length === 0) return { domain: ['auto', 'auto'], digits: 4 };
  const lo = Math.min(...history);
  const hi = Math.max(...history);
  const scale = Math.max(Math.abs(lo), Math.abs(hi));
  if (scale === 0) return { domain: ['auto', 'auto'], digits: 4 };
  const range = hi - lo;
  if (range <= 1e-6 * scale) {
    const pad = 1e-4 * scale;
    return { domain: [lo - pad, hi + pad], digits: 7 };
  }
  // at least four figures; enough that ticks a fraction of the range apart still differ
  const digits = Math.min(10, Math.max(4, Math.ceil(Math.log10(scale / range)) + 1));
  return { domain: ['auto', 'auto'], digits };
}
