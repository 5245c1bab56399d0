import type { ModesBlockResult } from '../../../../core/index';
import { DISPLAY_UNITS, toDisplay, type UnitSystem } from '../../../../core/display-units';
import { csvText } from '../../lib/csv';

/**
 * The modes table of a modes block as CSV, every value in full: one row per mode, in SI or with
 * Γ and the effective mass in US customary units. The headers name the quantity and its unit in
 * plain ASCII, so any spreadsheet reads them.
 */
export function modesCsv(result: ModesBlockResult, system: UnitSystem = 'si'): string {
  const units = DISPLAY_UNITS[system];
  return csvText([
    [
      'mode',
      'f (Hz)',
      'T (s)',
      'omega (rad/s)',
      'lambda (rad^2/s^2)',
      `Gamma (${units.rootMass.ascii})`,
      `effective mass (${units.mass.ascii})`,
      'effective mass ratio',
      'cumulative ratio',
      'backward error',
      'iterations',
    ],
    ...result.modes.map((m) => [
      m.mode,
      m.frequency,
      m.period,
      m.omega,
      m.lambda,
      toDisplay(m.gamma, 'rootMass', system),
      toDisplay(m.effectiveMass, 'mass', system),
      m.ratio,
      m.cumulative,
      m.backwardError,
      m.iterations ? m.iterations : null,
    ]),
  ]);
}

/**
 * The mode shapes as CSV: one row per degree of freedom (named by the model's DOF label when it
 * came from a generator, else numbered from 1), one column per mode, in the block's normalization.
 * Null when the result holds no shapes (above the display limit).
 */
export function shapesCsv(result: ModesBlockResult): string | null {
  const shapes = result.shapes;
  if (!shapes || shapes.length === 0) return null;
  const count = shapes[0]?.length ?? 0;
  return csvText([
    ['dof', ...Array.from({ length: count }, (_, j) => `mode ${j + 1}`)],
    ...shapes.map((row, i) => [result.dofLabels?.[i] ?? String(i + 1), ...row]),
  ]);
}
