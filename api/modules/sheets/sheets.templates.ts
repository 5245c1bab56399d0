import type { SheetBlock, SheetDraft } from './sheets.repository';
import type { TemplateKey } from './sheets.schemas';

/**
 * The templates a new sheet can start from. Each is a real sheet in the sheet language of
 * core/sheet/README.md with invented but realistic numbers, and criteria that cite their source
 * (REFERENCES.md "Code and guideline values"): clause numbers quoted from memory are marked so.
 */
export interface SheetTemplateInfo {
  key: TemplateKey;
  title: string;
  description: string;
}

interface SheetTemplate extends SheetTemplateInfo {
  blocks: SheetBlock[];
}

const lines = (...l: string[]) => l.join('\n');

const footbridge: SheetTemplate = {
  key: 'footbridge',
  title: 'Footbridge deck frequency check',
  description:
    'A simply supported deck as an Euler–Bernoulli beam: the lowest vertical and lateral modes ' +
    'against the pedestrian comfort thresholds, with a closed-form check of the model.',
  blocks: [
    {
      id: 'scope',
      kind: 'text',
      source: lines(
        '## Deck natural frequencies',
        '',
        'Single span, simply supported on elastomeric bearings. The deck is modelled as an',
        'Euler–Bernoulli beam with Hermite cubic elements and consistent mass, once for vertical',
        'and once for lateral bending. The mass per length includes steelwork, deck slab,',
        'surfacing, parapets and services; pedestrians are not included.',
        '',
        'Closed form for a pinned–pinned beam: $f_1 = \\frac{\\pi}{2L^2}\\sqrt{EI/m}$.',
      ),
    },
    {
      id: 'deck-data',
      kind: 'calc',
      source: lines(
        'L = 28 m  # span, bearing to bearing',
        'E = 210 GPa  # structural steel',
        'I_v = 0.033 m^4  # vertical bending, composite section',
        'I_h = 0.085 m^4  # lateral bending, deck plate and both girders',
        'm = 2.4 t/m  # mass per length',
        'f_hand = pi / (2 * L^2) * sqrt(E * I_v / m)  # closed form, first vertical mode',
      ),
    },
    {
      id: 'deck-models',
      kind: 'calc',
      source: lines(
        'vertical = beam({E: E, I: I_v, mass: m, length: L, elements: 16, ends: "pinned-pinned"})',
        'lateral = beam({E: E, I: I_h, mass: m, length: L, elements: 16, ends: "pinned-pinned"})',
      ),
    },
    {
      id: 'deck-vertical',
      kind: 'modes',
      source: lines(
        'name: deck_v',
        'stiffness: vertical.K',
        'mass: vertical.M',
        'method: inverse',
        'count: 3',
        'normalize: max',
      ),
    },
    {
      id: 'deck-lateral',
      kind: 'modes',
      source: lines(
        'name: deck_h',
        'stiffness: lateral.K',
        'mass: lateral.M',
        'method: inverse',
        'count: 2',
        'normalize: max',
      ),
    },
    {
      id: 'deck-criteria',
      kind: 'criteria',
      source: lines(
        'deck_v.f[1] >= 3.0 Hz  # vertical: pedestrian-bridge guide value 3.0 Hz (from memory)',
        'deck_h.f[1] >= 1.3 Hz  # lateral: pedestrian-bridge guide value 1.3 Hz (from memory)',
        'abs(deck_v.f[1] / f_hand - 1) <= 0.01  # beam model within 1 % of the closed form',
      ),
    },
    {
      id: 'outcome',
      kind: 'text',
      source: lines(
        '### Outcome',
        '',
        'Both lowest frequencies are above the guide values. Walking pedestrians can still excite a',
        'deck whose first vertical frequency is below about 5 Hz, or whose first lateral frequency',
        'is below about 2.5 Hz (common practice; EN 1990 Annex A2 gives such limits, from memory):',
        'where that is so, the deck accelerations are assessed against the comfort class agreed',
        'with the client, in a separate sheet.',
      ),
    },
  ],
};

const fourStoreyFrame: SheetTemplate = {
  key: 'four-storey-frame',
  title: 'Four-storey frame: modal mass participation',
  description:
    'A four-storey shear frame as a storey chain: periods, participation factors and the ' +
    'cumulative effective mass against the 90 % rule of modal response spectrum analysis.',
  blocks: [
    {
      id: 'scope',
      kind: 'text',
      source: lines(
        '## Modes for the response spectrum analysis',
        '',
        'Steel moment frame, four storeys, rigid floor diaphragms. One horizontal direction is',
        'modelled as a shear building: storey masses from the seismic weight (dead load plus the',
        'quasi-permanent part of the imposed load), storey stiffnesses from the frame analysis.',
      ),
    },
    {
      id: 'storeys',
      kind: 'calc',
      source: lines(
        'h = 3.6 m  # storey height',
        'H = 4 * h  # roof above the base',
        'm_1 = 212 t  # level 1',
        'm_2 = 208 t  # level 2',
        'm_3 = 208 t  # level 3',
        'm_4 = 165 t  # roof',
        'k_1 = 310 kN/mm  # storey 1, base to level 1',
        'k_2 = 285 kN/mm',
        'k_3 = 260 kN/mm',
        'k_4 = 205 kN/mm',
        'frame = storey_chain([m_1, m_2, m_3, m_4], [k_1, k_2, k_3, k_4])',
      ),
    },
    {
      id: 'sway',
      kind: 'modes',
      source: lines(
        'name: sway',
        'stiffness: frame.K',
        'mass: frame.M',
        'method: auto',
        'count: 3',
        'direction: x',
        'normalize: mass',
      ),
    },
    {
      id: 'period-check',
      kind: 'calc',
      source: lines(
        'T_1 = sway.T[1]',
        'T_a = 0.0724 * (H / (1 m))^0.8 * 1 s  # ASCE 7-16 Eq. 12.8-7, steel moment frame (from memory)',
        'T_ratio = T_1 / T_a',
      ),
    },
    {
      id: 'mass-criteria',
      kind: 'criteria',
      source: lines(
        'sway.cumulative[3] >= 0.90  # ASCE 7-16 §12.9.1.1 and EN 1998-1 §4.3.3.3.1: the modes used reach 90 % of the mass (from memory)',
        '1 - sway.cumulative[3] <= 0.05  # EN 1998-1 §4.3.3.3.1: the modes left out hold under 5 % together, so none holds more than 5 % (from memory)',
      ),
    },
  ],
};

const pumpFoundation: SheetTemplate = {
  key: 'pump-foundation',
  title: 'Pump foundation resonance check',
  description:
    'A pump on an inertia block on soil springs: the modes nearest the running speed by a ' +
    'shifted solve, checked for separation from the running speed.',
  blocks: [
    {
      id: 'scope',
      kind: 'text',
      source: lines(
        '## Vertical modes near the running speed',
        '',
        'Centrifugal pump and motor on a common baseplate, grouted and anchored to a reinforced',
        'concrete inertia block that bears on the soil. Vertically the system is a two-mass chain:',
        'soil spring, block, baseplate mounting, machine. The modes nearest the running speed are',
        'found with a shifted solve centred on it.',
      ),
    },
    {
      id: 'machine',
      kind: 'calc',
      source: lines(
        'n_run = 1480 rpm  # running speed, four-pole motor on 50 Hz',
        'f_run = n_run to Hz',
        'm_block = 48 t  # inertia block, 4.0 m x 2.5 m x 2.0 m',
        'm_machine = 7.2 t  # pump, motor and baseplate',
        'k_soil = 600 kN/mm  # vertical soil spring under the block, from the ground report',
        'k_mount = 300 kN/mm  # grout pads and anchors, baseplate to block',
        'foundation = storey_chain([m_block, m_machine], [k_soil, k_mount])',
      ),
    },
    {
      id: 'near-running-speed',
      kind: 'modes',
      source: lines(
        'name: vert',
        'stiffness: foundation.K',
        'mass: foundation.M',
        'method: shifted',
        'shift: 1480 rpm  # the running speed',
        'count: 2',
        'normalize: max',
      ),
    },
    {
      id: 'separation',
      kind: 'calc',
      source: lines('r_1 = vert.f[1] / f_run', 'r_2 = vert.f[2] / f_run'),
    },
    {
      id: 'resonance-criteria',
      kind: 'criteria',
      source: lines(
        'abs(r_1 - 1) >= 0.20  # mode 1 at least 20 % from the running speed (common practice)',
        'abs(r_2 - 1) >= 0.20  # mode 2 at least 20 % from the running speed (common practice)',
        'r_1 <= 0.5 or r_1 >= 1.5  # mode 1 below 0.5x or above 1.5x running speed (geotechnical textbooks, from memory)',
      ),
    },
  ],
};

const empty: SheetTemplate = {
  key: 'empty',
  title: 'Empty sheet',
  description: 'One text block to start from.',
  blocks: [{ id: 'b1', kind: 'text', source: '' }],
};

const TEMPLATES: Record<TemplateKey, SheetTemplate> = {
  empty,
  footbridge,
  'four-storey-frame': fourStoreyFrame,
  'pump-foundation': pumpFoundation,
};

/** The templates offered by GET /api/sheet-templates (the empty sheet is implicit). */
export function listTemplates(): SheetTemplateInfo[] {
  return [footbridge, fourStoreyFrame, pumpFoundation].map(({ key, title, description }) => ({
    key,
    title,
    description,
  }));
}

/** A fresh draft from a template (a deep copy, so nobody edits the template itself). */
export function draftFromTemplate(key: TemplateKey): SheetDraft {
  const template = TEMPLATES[key];
  return {
    blocks: template.blocks.map((b) => ({ ...b })),
    settings: { significantFigures: 4 },
  };
}
