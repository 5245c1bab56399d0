// The units results are shown in: SI or US customary. The engine computes in SI and stores SI;
// these tables convert only for display (screens, plots, CSV, spreadsheets, prints). This module
// imports nothing, so the client may import its values as it does core/vocabulary.ts.

/** The display unit systems a sheet may choose (its `settings.units`). */
export const UNIT_SYSTEMS = ['si', 'us'] as const;
export type UnitSystem = (typeof UNIT_SYSTEMS)[number];

/** How each system is named on screen. */
export const UNIT_SYSTEM_LABELS: Record<UnitSystem, string> = {
  si: 'SI (kN, mm, t)',
  us: 'US customary (kip, in, lbf·s²/in)',
};

/**
 * The exact definitions the US customary units rest on, in SI (NIST Special Publication 811,
 * 2008 edition, Appendix B.8 and B.9; the inch, foot and pound are exact by the 1959
 * international agreement, standard gravity by the 3rd CGPM, 1901).
 */
export const NIST_SP811 = {
  /** 1 in = 0.0254 m, exact. */
  inch: 0.0254,
  /** 1 ft = 0.3048 m, exact. */
  foot: 0.3048,
  /** 1 lb (avoirdupois pound, mass) = 0.45359237 kg, exact. */
  pound: 0.45359237,
  /** Standard acceleration of gravity g_n = 9.80665 m/s², exact. */
  standardGravity: 9.80665,
} as const;

const IN = NIST_SP811.inch;
const FT = NIST_SP811.foot;
/** 1 lbf = 1 lb × g_n = 4.4482216152605 N (NIST SP 811, B.8: 4.448 222 E+00). */
const LBF = NIST_SP811.pound * NIST_SP811.standardGravity;
const KIP = 1000 * LBF;

/** One display unit: its label (Unicode), its label in plain ASCII (files), and its size in SI. */
export interface DisplayUnit {
  label: string;
  ascii: string;
  /** The SI value of one of this unit (1 kip = 4448.2216152605 N). */
  si: number;
}

const unit = (label: string, ascii: string, si: number): DisplayUnit => ({ label, ascii, si });

/** The quantities results tables and plots show, each with one unit per system. */
export type QuantityKind =
  | 'frequency'
  | 'period'
  | 'angularFrequency'
  | 'displacement'
  | 'length'
  | 'velocity'
  | 'acceleration'
  | 'force'
  | 'moment'
  | 'mass'
  | 'rootMass'
  | 'stiffness'
  | 'stress';

/**
 * The unit of each kind of result in each system. Frequencies and periods stay Hz and s in both.
 * US factors from NIST SP 811 Appendix B: in, ft, lbf, kip = 1000 lbf, psi = lbf/in², ksi =
 * kip/in², and the mass unit lbf·s²/in (= 175.126835 kg), the one a force in lbf and an
 * acceleration in in/s² imply.
 */
export const DISPLAY_UNITS: Record<UnitSystem, Record<QuantityKind, DisplayUnit>> = {
  si: {
    frequency: unit('Hz', 'Hz', 1),
    period: unit('s', 's', 1),
    angularFrequency: unit('rad/s', 'rad/s', 1),
    displacement: unit('mm', 'mm', 1e-3),
    length: unit('m', 'm', 1),
    velocity: unit('mm/s', 'mm/s', 1e-3),
    acceleration: unit('m/s²', 'm/s^2', 1),
    force: unit('kN', 'kN', 1e3),
    moment: unit('kN·m', 'kN*m', 1e3),
    mass: unit('kg', 'kg', 1),
    rootMass: unit('√kg', 'kg^0.5', 1),
    stiffness: unit('kN/m', 'kN/m', 1e3),
    stress: unit('MPa', 'MPa', 1e6),
  },
  us: {
    frequency: unit('Hz', 'Hz', 1),
    period: unit('s', 's', 1),
    angularFrequency: unit('rad/s', 'rad/s', 1),
    displacement: unit('in', 'in', IN),
    length: unit('ft', 'ft', FT),
    velocity: unit('in/s', 'in/s', IN),
    acceleration: unit('in/s²', 'in/s^2', IN),
    force: unit('kip', 'kip', KIP),
    moment: unit('kip·ft', 'kip*ft', KIP * FT),
    mass: unit('lbf·s²/in', 'lbf*s^2/in', LBF / IN),
    rootMass: unit('√(lbf·s²/in)', '(lbf*s^2/in)^0.5', Math.sqrt(LBF / IN)),
    stiffness: unit('kip/in', 'kip/in', KIP / IN),
    stress: unit('ksi', 'ksi', KIP / (IN * IN)),
  },
};

/**
 * The unit system a sheet's settings ask for: `us` when `settings.units` is `'us'`, SI otherwise
 * (results stored before the setting existed are SI).
 */
export function unitSystemOf(settings: { units?: unknown } | null | undefined): UnitSystem {
  return settings?.units === 'us' ? 'us' : 'si';
}

/** The display unit of a kind of result in a system. */
export function displayUnit(kind: QuantityKind, system: UnitSystem): DisplayUnit {
  return DISPLAY_UNITS[system][kind];
}

/**
 * An SI value in the display unit of its kind: `toDisplay(4448.2216152605, 'force', 'us')` is 1
 * (kip). Null and undefined pass through as null.
 */
export function toDisplay(
  si: number | null | undefined,
  kind: QuantityKind,
  system: UnitSystem,
): number | null {
  if (si === null || si === undefined) return null;
  return si / DISPLAY_UNITS[system][kind].si;
}

/**
 * US customary units for a calc line's computed quantity, by its SI unit as the engine writes it
 * (`kg/s^2`, `(kg m)/s^2`, …), smallest first. The line shows the largest unit its value reaches
 * one of, as the engine picks among kN/MN. Kinds not listed (frequency, time, angles,
 * dimensionless) keep the engine's SI display.
 */
export const US_UNITS_BY_SI: Record<string, readonly DisplayUnit[]> = {
  kg: [unit('lbf·s²/in', 'lbf*s^2/in', LBF / IN)],
  m: [unit('in', 'in', IN), unit('ft', 'ft', FT)],
  'm/s': [unit('in/s', 'in/s', IN)],
  'm/s^2': [unit('in/s²', 'in/s^2', IN)],
  '(kg m)/s^2': [unit('lbf', 'lbf', LBF), unit('kip', 'kip', KIP)],
  'kg/(m s^2)': [unit('psi', 'psi', LBF / (IN * IN)), unit('ksi', 'ksi', KIP / (IN * IN))],
  'kg/s^2': [unit('lbf/in', 'lbf/in', LBF / IN), unit('kip/in', 'kip/in', KIP / IN)],
  '(kg m^2)/s^2': [unit('lbf·ft', 'lbf*ft', LBF * FT), unit('kip·ft', 'kip*ft', KIP * FT)],
  '(kg m^3)/s^2': [unit('kip·in²', 'kip*in^2', KIP * IN * IN)],
  'kg/s': [unit('lbf·s/in', 'lbf*s/in', LBF / IN), unit('kip·s/in', 'kip*s/in', KIP / IN)],
  'kg/m': [unit('lbf·s²/in²', 'lbf*s^2/in^2', LBF / (IN * IN))],
  'm^2': [unit('in²', 'in^2', IN * IN), unit('ft²', 'ft^2', FT * FT)],
  'm^3': [unit('in³', 'in^3', IN ** 3), unit('ft³', 'ft^3', FT ** 3)],
  'm^4': [unit('in⁴', 'in^4', IN ** 4)],
};

/**
 * The US customary unit for a computed quantity of SI unit `siUnit` and SI value `si`, or null
 * when the quantity has none here (Hz, s, rad/s, or a unit not listed): the largest of
 * US_UNITS_BY_SI[siUnit] whose value is at least 1 in magnitude, else the smallest.
 */
export function usUnitFor(siUnit: string, si: number): DisplayUnit | null {
  const candidates = US_UNITS_BY_SI[siUnit];
  if (!candidates || candidates.length === 0) return null;
  let chosen = candidates[0]!;
  for (const c of candidates) if (Math.abs(si) / c.si >= 1) chosen = c;
  return chosen;
}
