// A revision's results tables as an .xlsx workbook (ExcelJS): one worksheet per modes block and
// per response analysis, one for the criteria, and a first sheet naming the revision, its units and
// the caution. Values are written in full (not rounded to the sheet's figures) in the revision's
// display unit system; every header names its unit.
import ExcelJS from 'exceljs';
import {
  DISPLAY_UNITS,
  UNIT_SYSTEM_LABELS,
  toDisplay,
  type QuantityKind,
  type UnitSystem,
} from '../../../core/display-units';
import type {
  BlockResult,
  ModesBlockResult,
  ResponseBlockResult,
  SheetResults,
} from '../../../core/index';

export interface SpreadsheetInput {
  firm: string;
  project: { jobNumber: string; name: string };
  sheet: { number: string; title: string };
  revision: { number: number; status: string; engineVersion: string };
  system: UnitSystem;
  results: SheetResults;
  caution: string;
}

type Cell = string | number | boolean | null;
interface Table {
  name: string;
  head: string[];
  rows: Cell[][];
}

/** Header text "Base shear (kip)" for a kind of quantity in the system (plain ASCII units). */
const header = (label: string, kind: QuantityKind, system: UnitSystem) =>
  `${label} (${DISPLAY_UNITS[system][kind].ascii})`;

const at = <T>(list: readonly T[], i: number): T | null => list[i] ?? null;

function modesTable(r: ModesBlockResult, system: UnitSystem): Table {
  const v = (kind: QuantityKind, si: number | null) => toDisplay(si, kind, system);
  return {
    name: `Modes ${r.name ?? r.blockIndex + 1}`,
    head: [
      'Mode',
      'f (Hz)',
      'T (s)',
      'omega (rad/s)',
      'lambda (rad^2/s^2)',
      header('Gamma', 'rootMass', system),
      header('Effective mass', 'mass', system),
      'Effective mass ratio',
      'Cumulative ratio',
      'Backward error',
      'Iterations',
    ],
    rows: r.modes.map((m) => [
      m.mode,
      m.frequency,
      m.period,
      m.omega,
      m.lambda,
      v('rootMass', m.gamma),
      v('mass', m.effectiveMass),
      m.ratio,
      m.cumulative,
      m.backwardError,
      m.iterations,
    ]),
  };
}

function responseTables(r: ResponseBlockResult, system: UnitSystem): Table[] {
  const v = (kind: QuantityKind, si: number | null | undefined) => toDisplay(si, kind, system);
  const h = (label: string, kind: QuantityKind) => header(label, kind, system);
  const name = r.name ?? String(r.blockIndex + 1);
  const tables: Table[] = [];
  for (const d of r.spectrum?.directions ?? []) {
    tables.push({
      name: `Spectrum ${name} ${d.direction}`,
      head: [
        'Mode',
        'T (s)',
        'Damping ratio',
        h('S_a', 'acceleration'),
        h('Gamma', 'rootMass'),
        h('Effective mass', 'mass'),
        h('Modal base shear', 'force'),
      ],
      rows: d.modes.map((m) => [
        m.mode,
        m.period,
        m.damping,
        v('acceleration', m.sa),
        v('rootMass', m.gamma),
        v('mass', m.effectiveMass),
        v('force', m.baseShear),
      ]),
    });
    tables.push({
      name: `Storeys ${name} ${d.direction}`,
      head: [
        'Storey',
        h('Force', 'force'),
        h('Shear', 'force'),
        h('Overturning moment', 'moment'),
        h('Drift', 'displacement'),
        'Drift ratio',
        h('Displacement', 'displacement'),
      ],
      rows: d.displacement.map((u, i) => [
        i + 1,
        v('force', d.storeys ? at(d.storeys.force, i) : null),
        v('force', d.storeys ? at(d.storeys.shear, i) : null),
        v('moment', d.storeys ? at(d.storeys.overturning, i) : null),
        v('displacement', d.storeys ? at(d.storeys.drift, i) : null),
        d.storeys ? at(d.storeys.driftRatio, i) : null,
        v('displacement', u),
      ]),
    });
  }
  const hm = r.harmonic;
  if (hm) {
    tables.push({
      name: `Harmonic ${name}`,
      head: [
        'DOF',
        h('Largest amplitude', 'displacement'),
        'At (Hz)',
        h('Amplitude at running speed', 'displacement'),
        h('Velocity at running speed', 'velocity'),
        'Phase lag (deg)',
      ],
      rows: hm.dofs.map((d, i) => {
        const max = Math.max(...d.amplitude);
        const run = hm.atRunning?.[i];
        return [
          d.label,
          v('displacement', max),
          at(hm.frequencies, d.amplitude.indexOf(max)),
          v('displacement', run?.amplitude),
          v('velocity', run?.velocity),
          run ? (run.phase * 180) / Math.PI : null,
        ];
      }),
    });
  }
  const hs = r.history;
  if (hs) {
    tables.push({
      name: `History ${name}`,
      head: ['Response', 'Peak', 'Unit', 'Time of peak (s)'],
      rows: [
        ...hs.dofs.map((d): Cell[] => [
          `Displacement ${d.label}`,
          v('displacement', d.peak),
          DISPLAY_UNITS[system].displacement.ascii,
          d.time,
        ]),
        ...(hs.baseShear
          ? [
              [
                'Base shear',
                v('force', hs.baseShear.peak),
                DISPLAY_UNITS[system].force.ascii,
                hs.baseShear.time,
              ],
            ]
          : []),
      ],
    });
  }
  const w = r.walking;
  if (w) {
    tables.push({
      name: `Walking ${name}`,
      head: [
        'Mode',
        'f (Hz)',
        h('P_o', 'force'),
        'Damping ratio',
        h('Modal mass', 'mass'),
        h('W', 'force'),
        h('a_p', 'acceleration'),
        'a_p/g',
        h('Limit', 'acceleration'),
        'Within limit',
      ],
      rows: [
        [
          w.mode,
          w.frequency,
          v('force', w.force),
          w.damping,
          v('mass', w.modalMass),
          v('force', w.weight),
          v('acceleration', w.acceleration),
          w.ratio,
          v('acceleration', w.limit),
          w.pass,
        ],
      ],
    });
  }
  return tables;
}

function criteriaTable(blocks: readonly BlockResult[]): Table | null {
  const rows: Cell[][] = [];
  for (const b of blocks) {
    if (b.kind !== 'criteria') continue;
    for (const c of b.criteria) {
      rows.push([b.blockIndex + 1, c.line, c.label, c.pass ? 'pass' : 'fail', c.lhs, c.rhs]);
    }
  }
  if (rows.length === 0) return null;
  return {
    name: 'Criteria',
    head: ['Block', 'Line', 'Criterion', 'Result', 'Left side', 'Right side'],
    rows,
  };
}

/** The tables of a revision's results, in order: modes and response blocks, then criteria. */
export function revisionTables(results: SheetResults, system: UnitSystem): Table[] {
  const tables: Table[] = [];
  for (const b of results.blocks) {
    if (b.kind === 'modes' && b.modes.length > 0) tables.push(modesTable(b, system));
    if (b.kind === 'response' && b.ok) tables.push(...responseTables(b, system));
  }
  const criteria = criteriaTable(results.blocks);
  if (criteria) tables.push(criteria);
  return tables;
}

/** A worksheet name Excel accepts: at most 31 characters, none of []:*?/\, unique. */
function sheetName(wanted: string, taken: Set<string>): string {
  const base = wanted.replace(/[[\]:*?/\\]/g, '_').slice(0, 31);
  let name = base;
  for (let n = 2; taken.has(name.toLowerCase()); n += 1) {
    name = `${base.slice(0, 31 - String(n).length - 1)} ${n}`;
  }
  taken.add(name.toLowerCase());
  return name;
}

/** The workbook of a revision's results tables, as .xlsx bytes. */
export async function revisionWorkbook(input: SpreadsheetInput): Promise<Buffer> {
  const book = new ExcelJS.Workbook();
  book.creator = input.firm;
  const taken = new Set<string>();
  const about = book.addWorksheet(sheetName('Revision', taken));
  about.addRows([
    ['Firm', input.firm],
    ['Project', `${input.project.jobNumber} ${input.project.name}`],
    ['Sheet', `${input.sheet.number} ${input.sheet.title}`],
    ['Revision', `Rev ${input.revision.number} (${input.revision.status.replace('_', ' ')})`],
    ['Units', UNIT_SYSTEM_LABELS[input.system]],
    ['Engine', input.revision.engineVersion],
    ['Caution', input.caution],
  ]);
  about.getColumn(1).font = { bold: true };
  about.getColumn(1).width = 12;
  about.getColumn(2).width = 80;
  for (const table of revisionTables(input.results, input.system)) {
    const ws = book.addWorksheet(sheetName(table.name, taken));
    ws.addRow(table.head).font = { bold: true };
    ws.addRows(table.rows);
    ws.columns.forEach((c, i) => (c.width = Math.max(10, (table.head[i] ?? '').length + 2)));
    ws.views = [{ state: 'frozen', ySplit: 1 }];
  }
  return Buffer.from(await book.xlsx.writeBuffer());
}
