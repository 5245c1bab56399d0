// The values shown after a criterion's label ("12.3 mm vs 25 mm") in the page's unit system. The
// engine writes them in SI and the units written; in US customary each side that is a quantity
// with a US unit is converted from its SI value, both sides of a line in the same unit.
import { usUnitFor, type DisplayUnit, type UnitSystem } from '../../../../core/display-units';
import type { CriterionResult, CriterionSide } from '../../../../core/index';
import { sig } from '../../lib/format';

/**
 * The text after a criterion's label in `system`, to `digits` significant figures for converted
 * sides, or null when the engine showed nothing. SI, and results stored before the sides carried
 * their values, show the engine's text unchanged.
 */
export function criterionText(
  c: Pick<CriterionResult, 'lhs' | 'rhs' | 'values' | 'shown'>,
  system: UnitSystem,
  digits: number,
): string | null {
  const engine = c.lhs !== null && c.rhs !== null ? `${c.lhs} vs ${c.rhs}` : (c.values ?? null);
  if (system === 'si' || !c.shown) return engine;
  const sides = c.shown.filter((p): p is CriterionSide => typeof p !== 'string');
  // One US unit per SI unit in the line, chosen by the largest side, so sides compare at a glance.
  const largest = new Map<string, number>();
  for (const s of sides) {
    if (s.value.type !== 'quantity') continue;
    const m = Math.abs(s.value.si);
    largest.set(s.value.siUnit, Math.max(m, largest.get(s.value.siUnit) ?? 0));
  }
  const units = new Map<string, DisplayUnit | null>();
  for (const [siUnit, m] of largest) units.set(siUnit, usUnitFor(siUnit, m));
  return c.shown
    .map((p) => {
      if (typeof p === 'string') return p;
      if (p.value.type !== 'quantity') return p.display;
      const u = units.get(p.value.siUnit);
      return u ? `${sig(p.value.si / u.si, digits)} ${u.label}` : p.display;
    })
    .join('');
}
