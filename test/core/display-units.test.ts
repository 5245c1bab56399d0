// The display unit systems (core/display-units.ts): US customary factors checked against the
// conversion table of NIST Special Publication 811 (2008 edition), Appendix B.8/B.9, which gives
// each factor to 7 significant figures (so a relative tolerance of 5e-7 below), and the engine's
// results unchanged by the setting.
import { describe, expect, it } from 'vitest';
import {
  DISPLAY_UNITS,
  NIST_SP811,
  evaluateSheet,
  toDisplay,
  unitSystemOf,
  usUnitFor,
  type CalcBlockResult,
  type Sheet,
} from '../../core/index';

const rel = (a: number, b: number) => Math.abs(a - b) / Math.abs(b);
const SEVEN_FIGURES = 5e-7;
const us = DISPLAY_UNITS.us;

describe('DISPLAY_UNITS against NIST SP 811 Appendix B', () => {
  it('holds the exact definitions of the inch, foot, pound and g_n (NIST SP 811, B.8, exact)', () => {
    expect(NIST_SP811.inch).toBe(0.0254);
    expect(NIST_SP811.foot).toBe(0.3048);
    expect(NIST_SP811.pound).toBe(0.45359237);
    expect(NIST_SP811.standardGravity).toBe(9.80665);
    expect(us.displacement.si).toBe(0.0254);
    expect(us.length.si).toBe(0.3048);
  });

  it('gives the force units of NIST SP 811 B.8: lbf 4.448 222 E+00 N, kip 4.448 222 E+03 N', () => {
    expect(rel(us.force.si, 4.448222e3)).toBeLessThan(SEVEN_FIGURES);
    expect(rel(usUnitFor('(kg m)/s^2', 1)!.si, 4.448222)).toBeLessThan(SEVEN_FIGURES);
    // lbf = lb × g_n exactly (NIST SP 811 B.8 footnote: 4.4482216152605 N), relative 1e-15.
    expect(rel(us.force.si / 1000, 4.4482216152605)).toBeLessThan(1e-15);
  });

  it('gives psi 6.894 757 E+03 Pa and ksi 6.894 757 E+06 Pa (NIST SP 811 B.8)', () => {
    expect(rel(us.stress.si, 6.894757e6)).toBeLessThan(SEVEN_FIGURES);
    expect(rel(usUnitFor('kg/(m s^2)', 1)!.si, 6.894757e3)).toBeLessThan(SEVEN_FIGURES);
  });

  it('gives lbf/in 1.751 268 E+02 N/m and kip/in 1.751 268 E+05 N/m (NIST SP 811 B.8)', () => {
    expect(rel(usUnitFor('kg/s^2', 1)!.si, 1.751268e2)).toBeLessThan(SEVEN_FIGURES);
    expect(rel(us.stiffness.si, 1.751268e5)).toBeLessThan(SEVEN_FIGURES);
  });

  it('gives ft·lbf 1.355 818 E+00 J, so kip·ft 1.355 818 E+03 N·m (NIST SP 811 B.8)', () => {
    expect(rel(us.moment.si, 1.355818e3)).toBeLessThan(SEVEN_FIGURES);
    expect(rel(usUnitFor('(kg m^2)/s^2', 1)!.si, 1.355818)).toBeLessThan(SEVEN_FIGURES);
  });

  it('gives the mass unit lbf·s²/in as lbf / (in/s²) = 175.1268 kg (NIST SP 811 B.8 lbf and in)', () => {
    // 4.448 222 N / 0.0254 m/s² from the two table entries, to their 7 figures.
    expect(rel(us.mass.si, 4.448222 / 0.0254)).toBeLessThan(SEVEN_FIGURES);
    expect(rel(us.rootMass.si ** 2, us.mass.si)).toBeLessThan(1e-15);
  });

  it('gives in/s² 2.54 E-02 m/s² and in² 6.4516 E-04 m² (NIST SP 811 B.8, exact)', () => {
    expect(us.acceleration.si).toBe(0.0254);
    expect(rel(usUnitFor('m^2', 1e-4)!.si, 6.4516e-4)).toBeLessThan(1e-15);
  });

  it('keeps frequencies, periods and circular frequencies in Hz, s and rad/s in both systems', () => {
    for (const system of ['si', 'us'] as const) {
      expect(DISPLAY_UNITS[system].frequency).toMatchObject({ label: 'Hz', si: 1 });
      expect(DISPLAY_UNITS[system].period).toMatchObject({ label: 's', si: 1 });
      expect(DISPLAY_UNITS[system].angularFrequency).toMatchObject({ label: 'rad/s', si: 1 });
    }
    expect(usUnitFor('s^-1', 3)).toBeNull();
    expect(usUnitFor('s', 3)).toBeNull();
  });

  it('converts an SI value to the display unit and reads the setting', () => {
    // 1 kip = 4448.2216152605 N exactly (NIST SP 811 B.8), relative 1e-15.
    expect(rel(toDisplay(4448.2216152605, 'force', 'us')!, 1)).toBeLessThan(1e-15);
    expect(toDisplay(2500, 'force', 'si')).toBe(2.5);
    expect(toDisplay(null, 'force', 'us')).toBeNull();
    expect(unitSystemOf({ units: 'us' })).toBe('us');
    expect(unitSystemOf({})).toBe('si');
    expect(unitSystemOf(undefined)).toBe('si');
  });

  it('picks lbf below one kip and kip from one kip up, as the engine picks N and kN', () => {
    expect(usUnitFor('(kg m)/s^2', 100)!.label).toBe('lbf');
    expect(usUnitFor('(kg m)/s^2', 5000)!.label).toBe('kip');
    expect(usUnitFor('m', 0.1)!.label).toBe('in');
    expect(usUnitFor('m', 3.6)!.label).toBe('ft');
  });
});

describe('evaluateSheet with settings.units', () => {
  const blocks: Sheet['blocks'] = [
    {
      id: 'data',
      kind: 'calc',
      source:
        'm_0 = 100 t\nk_0 = 50 kN/mm\nF = k_0 * 2 mm\nframe = storey_chain([2 m_0, m_0], [2 k_0, k_0])',
    },
    {
      id: 'solve',
      kind: 'modes',
      source: 'stiffness: frame.K\nmass: frame.M\ncount: 2\nname: floor',
    },
    { id: 'check', kind: 'criteria', source: 'floor.f[1] >= 1 Hz # common practice' },
  ];

  it('gives the same SI results for the same sheet shown in SI and in US customary units', () => {
    const si = evaluateSheet({ blocks, settings: { significantFigures: 4, units: 'si' } });
    const usc = evaluateSheet({ blocks, settings: { significantFigures: 4, units: 'us' } });
    expect(si.errors).toEqual([]);
    expect(usc).toEqual(si);
  });

  it('names every computed quantity by an SI unit the US table knows (force, stiffness, mass)', () => {
    const r = evaluateSheet({ blocks });
    const lines = (r.blocks[0] as CalcBlockResult).lines;
    const force = lines[2]!.value;
    expect(force.type).toBe('quantity');
    if (force.type !== 'quantity') return;
    // F = 50 kN/mm × 2 mm = 100 kN = 22.48089 kip (NIST SP 811 B.8, 1 kip = 4.448 222 kN).
    const kip = usUnitFor(force.siUnit, force.si)!;
    expect(kip.label).toBe('kip');
    expect(rel(force.si / kip.si, 100 / 4.448222)).toBeLessThan(SEVEN_FIGURES);
    const mass = lines[0]!.value;
    const stiffness = lines[1]!.value;
    if (mass.type !== 'quantity' || stiffness.type !== 'quantity') throw new Error('quantities');
    expect(usUnitFor(mass.siUnit, mass.si)!.label).toBe('lbf·s²/in');
    expect(usUnitFor(stiffness.siUnit, stiffness.si)!.label).toBe('kip/in');
  });
});
