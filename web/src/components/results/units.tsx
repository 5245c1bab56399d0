// The display unit system of the results being shown: the sheet's `settings.units`, provided once
// by the page (editor, revision, compare, print) and read by every table, plot and download.
import { createContext, useContext, useMemo, type ReactNode } from 'react';
import {
  displayUnit,
  toDisplay,
  usUnitFor,
  type QuantityKind,
  type UnitSystem,
} from '../../../../core/display-units';
import type { CalcBlockResult } from '../../../../core/index';
import { massText, sig } from '../../lib/format';

const UnitSystemContext = createContext<UnitSystem>('si');

/** Shows the results inside it in `system` (SI when not given). */
export function UnitSystemProvider({
  system,
  children,
}: {
  system: UnitSystem | undefined;
  children: ReactNode;
}) {
  return <UnitSystemContext.Provider value={system ?? 'si'}>{children}</UnitSystemContext.Provider>;
}

/** What a results view needs to show SI values in the page's unit system. */
export interface Units {
  system: UnitSystem;
  /** The label of a kind's unit: "kip", "mm". */
  unit: (kind: QuantityKind) => string;
  /** An SI value in the kind's display unit (a number, for plots and files). */
  value: (kind: QuantityKind, si: number) => number;
  /** An SI value as text with its unit, to `digits` significant figures: "12.3 kip". */
  text: (kind: QuantityKind, si: number | null | undefined, digits?: number) => string;
}

/** The formatting of one unit system (pure; `useUnits` gives the page's). */
export function unitsFor(system: UnitSystem): Units {
  return {
    system,
    unit: (kind) => displayUnit(kind, system).label,
    value: (kind, si) => toDisplay(si, kind, system) ?? Number.NaN,
    text: (kind, si, digits = 4) => {
      if (si === null || si === undefined) return '—';
      // SI masses keep the engineer's t / kg choice by size.
      if (kind === 'mass' && system === 'si') return massText(si);
      return `${sig(toDisplay(si, kind, system), digits)} ${displayUnit(kind, system).label}`;
    },
  };
}

/** The unit system of the results on this page, with its formatters. */
export function useUnits(): Units {
  const system = useContext(UnitSystemContext);
  return useMemo(() => unitsFor(system), [system]);
}

type CalcLine = CalcBlockResult['lines'][number];

const texUnit = (label: string) =>
  `\\mathrm{${label
    .replace(/·/g, '\\cdot ')
    .replace(/²/g, '^{2}')
    .replace(/³/g, '^{3}')
    .replace(/⁴/g, '^{4}')}}`;

/**
 * A computed calc line's result in US customary units, or null when it stays as the engine wrote
 * it: in SI, for a typed value (nothing substituted: the unit written is kept), and for a kind
 * with no US unit here (Hz, s, rad/s, numbers).
 */
export function usCalcResult(
  line: CalcLine,
  system: UnitSystem,
  digits: number,
): { tex: string; display: string } | null {
  if (system !== 'us' || line.value.type !== 'quantity' || line.latex.substituted === null) {
    return null;
  }
  const u = usUnitFor(line.value.siUnit, line.value.si);
  if (!u) return null;
  const n = sig(line.value.si / u.si, digits);
  return { tex: `${n.replace('−', '-')}\\,${texUnit(u.label)}`, display: `${n} ${u.label}` };
}
