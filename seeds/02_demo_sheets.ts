import type { Knex } from 'knex';
import { createAppContext } from '../api/app-context';
import { loadConfig } from '../api/config/index';
import { usersRepository } from '../api/modules/users/users.repository';
import { findSheetById, type SheetBlock } from '../api/modules/sheets/sheets.repository';
import type { TemplateKey } from '../api/modules/sheets/sheets.schemas';
import { sheetsService } from '../api/modules/sheets/sheets.service';
import { withDemoClock, type SetDemoClock } from './support/demo-clock';

// The demo sheets of DESIGN §11 in project BW-2611 (Kestrel Quay Footbridge and Pump House),
// authored by Ines Marlow: drafts built from the templates through the sheets service, with the
// template's numbers replaced by this job's (invented) data. The review stages are added by
// seeds/03_*. Safe to re-run: a sheet whose number already exists in the project is left as it is.

interface DemoSheet {
  number: string;
  title: string;
  subject: string;
  template: TemplateKey;
  /** Per block id: lines to replace, keyed by the text the template's line starts with. */
  edits: Record<string, Record<string, string>>;
  /** Blocks the author added after the template's (response analyses of the modes). */
  append?: SheetBlock[];
}

const lines = (...l: string[]) => l.join('\n');

export const demoSheets: DemoSheet[] = [
  {
    number: 'DYN-01',
    title: 'East Basin footbridge — deck natural frequencies',
    subject: 'Vertical and lateral modes of the 31.5 m main span for the pedestrian comfort check',
    template: 'footbridge',
    edits: {
      'deck-data': {
        'L = ': 'L = 31.5 m  # span, bearing to bearing (drawing KQ-S-210 rev C)',
        'I_v = ': 'I_v = 0.052 m^4  # vertical bending, composite box girder',
        'I_h = ': 'I_h = 0.140 m^4  # lateral bending, deck plate and box webs',
        'm = ': 'm = 2.85 t/m  # steel 1.35, slab 1.10, surfacing 0.25, parapets and services 0.15',
      },
    },
  },
  {
    number: 'DYN-02',
    title: 'Pump house — four-storey frame, modal mass participation',
    subject: 'Modes for the response spectrum analysis, east–west direction',
    template: 'four-storey-frame',
    edits: {
      storeys: {
        'h = ': 'h = 3.9 m  # storey height, levels 1 to roof',
        'm_1 = ': 'm_1 = 236 t  # level 1: plant deck',
        'm_2 = ': 'm_2 = 221 t  # level 2',
        'm_3 = ': 'm_3 = 221 t  # level 3',
        'm_4 = ': 'm_4 = 174 t  # roof with tank plinths',
        'k_1 = ': 'k_1 = 342 kN/mm  # storey 1, base to level 1',
        'k_2 = ': 'k_2 = 318 kN/mm',
        'k_3 = ': 'k_3 = 290 kN/mm',
        'k_4 = ': 'k_4 = 226 kN/mm',
      },
    },
    append: [
      {
        id: 'spectrum-scope',
        kind: 'text',
        source: lines(
          '## Response spectrum analysis, east–west',
          '',
          'Site class D, S_DS = 1.0 and S_D1 = 0.55 from the geotechnical report; special steel',
          'moment frame, R = 8, C_d = 5.5, I_e = 1.0. Modal forces are scaled to the equivalent',
          'lateral force base shear; drifts are combined mode by mode and amplified by C_d/I_e.',
        ),
      },
      {
        id: 'elf',
        kind: 'calc',
        source: lines(
          'W_s = (m_1 + m_2 + m_3 + m_4) * 9.80665 m/s^2  # seismic weight',
          'R_f = 8  # special steel moment frame (ASCE 7-16 Table 12.2-1, from memory)',
          'C_d = 5.5  # deflection amplification factor, same table',
          'T_elf = min(T_1, 1.4 * T_a)  # ASCE 7-16 §12.8.2: computed period, at most C_u T_a with C_u = 1.4 (from memory)',
          'C_s = min(1.0 / R_f, 0.55 / (T_elf / (1 s) * R_f))  # ASCE 7-16 Eq. 12.8-2 and 12.8-3 (from memory)',
          'V_elf = C_s * W_s  # ASCE 7-16 Eq. 12.8-1',
        ),
      },
      {
        id: 'spectrum',
        kind: 'response',
        source: lines(
          'modes: sway',
          'analysis: spectrum',
          'spectrum: ASCE 7-16',
          'SDS: 1.0',
          'SD1: 0.55',
          'TL: 8 s',
          'R: 8',
          'Ie: 1.0',
          'damping: 0.05',
          'combine: cqc',
          'heights: h',
          'elf base shear: V_elf',
          'name: rsa',
        ),
      },
      {
        id: 'spectrum-criteria',
        kind: 'criteria',
        source: lines(
          'rsa.V >= rsa.V_elf  # ASCE 7-16 §12.9.1.4.1: modal base shear at least 100 % of V_ELF after scaling (from memory)',
          'C_d * max(rsa.drift_ratio) <= 0.020  # ASCE 7-16 Table 12.12-1, risk category II: 0.020 h_sx, drifts × C_d/I_e (from memory)',
        ),
      },
    ],
  },
  {
    number: 'DYN-03',
    title: 'Pump house — fire-water pump foundation resonance check',
    subject: 'Vertical modes of pump P-02 on its inertia block near the running speed',
    template: 'pump-foundation',
    edits: {
      machine: {
        'n_run = ': 'n_run = 1485 rpm  # running speed of P-02, four-pole motor on 50 Hz',
        'm_block = ': 'm_block = 52.8 t  # inertia block 4.4 m x 2.5 m x 2.0 m',
        'm_machine = ': 'm_machine = 6.9 t  # pump, motor and baseplate, vendor data sheet',
        'k_soil = ': 'k_soil = 640 kN/mm  # vertical soil spring, ground report table 7',
        'k_mount = ': 'k_mount = 310 kN/mm  # grout pads and anchors',
      },
      'near-running-speed': { 'shift: ': 'shift: 1485 rpm  # the running speed of P-02' },
    },
    append: [
      {
        id: 'unbalance',
        kind: 'response',
        source: lines(
          'modes: vert',
          'analysis: harmonic',
          'unbalance: 0.02 kg m  # impeller and coupling at balance grade G 6.3 (ISO 21940-11, from memory)',
          'at: 2  # the machine on its mounts',
          'running speed: n_run',
          'range: [5 Hz, 60 Hz]',
          'damping: 0.05  # soil and grout pads, assumed',
          'dofs: [1, 2]',
          'name: pump_h',
        ),
      },
      {
        id: 'amplitude-criteria',
        kind: 'criteria',
        source: lines(
          'pump_h.separation >= 0.20  # nearest mode at least 20 % from the running speed (ACI 351.3R, from memory)',
          'max(pump_h.v_run) <= 2.5 mm/s  # vibration velocity at the running speed (common practice, no source)',
        ),
      },
    ],
  },
];

export function applyEdits(
  blocks: SheetBlock[],
  edits: DemoSheet['edits'],
  number: string,
): SheetBlock[] {
  return blocks.map((block) => {
    const wanted = edits[block.id];
    if (!wanted) return block;
    const lines = block.source.split('\n');
    for (const [prefix, replacement] of Object.entries(wanted)) {
      const i = lines.findIndex((l) => l.startsWith(prefix));
      if (i < 0) {
        throw new Error(`seed ${number}: block ${block.id} has no line starting "${prefix}"`);
      }
      lines[i] = replacement;
    }
    return { ...block, source: lines.join('\n') };
  });
}

// When Ines started each sheet and when she last saved its draft (days before today, UTC): the
// footbridge first, the pump foundation last (seeds/support).
const STARTED: Record<string, { made: [number, string]; saved: [number, string] }> = {
  'DYN-01': { made: [18, '10:15'], saved: [15, '16:05'] },
  'DYN-02': { made: [7, '11:00'], saved: [4, '15:20'] },
  'DYN-03': { made: [2, '09:30'], saved: [1, '15:40'] },
};

const seedLog = {
  info() {},
  error(message: string) {
    process.stderr.write(`seed 02: ${message}\n`);
  },
};

export async function seed(knex: Knex): Promise<void> {
  await withDemoClock(knex, (db, at) => sheets(db, at));
}

async function sheets(knex: Knex, at: SetDemoClock): Promise<void> {
  const project = (await knex('projects').where({ job_number: 'BW-2611' }).first('id')) as
    { id: number } | undefined;
  const ctx = createAppContext({ db: knex, config: loadConfig(), log: seedLog });
  const ines = await usersRepository.findByEmail(knex, 'ines.marlow@brackwater.example');
  if (!project || !ines) {
    throw new Error('seeds/02_demo_sheets needs project BW-2611 and Ines Marlow from seeds/01.');
  }
  for (const demo of demoSheets) {
    const exists = await knex('sheets')
      .where({ project_id: project.id, number: demo.number })
      .first('id');
    if (exists) continue;
    const when = STARTED[demo.number];
    if (!when) throw new Error(`seed ${demo.number}: no day for it in STARTED`);
    await at(...when.made);
    const sheet = await sheetsService.create(ctx, ines, project.id, {
      number: demo.number,
      title: demo.title,
      subject: demo.subject,
      template: demo.template,
    });
    const current = await findSheetById(knex, sheet.id);
    if (!current) throw new Error(`seed ${demo.number}: the sheet just made is missing`);
    await at(...when.saved);
    await sheetsService.saveDraft(ctx, ines, sheet.id, current.draftVersion, {
      blocks: [
        ...applyEdits(current.draft.blocks, demo.edits, demo.number),
        ...(demo.append ?? []),
      ],
      settings: current.draft.settings,
    });
  }
}
