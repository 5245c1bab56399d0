// The in-app reference of the sheet language: every block kind, every key of a modes and a matrix
// block, every function and generator a calc line offers, each with its signature, units and a
// short example. One data module feeds the reference page, the editor's completion and hover,
// and the starting text of new blocks; test/web/sheet-reference.test.ts evaluates every example
// through the sheet engine (core) so this cannot drift from it.
//
// To document a new block kind, append to BLOCK_REFERENCE — and, if it has `key: value` lines, a
// key list like MODES_KEY_REFERENCE with its entry in KEY_REFERENCE; a new function or generator
// is one more entry in FUNCTION_REFERENCE. The response block's keys are the engine's own list
// (core/vocabulary.ts), so a key added there is a type error here until it is documented.
import { RESPONSE_KEYS, type ResponseKey } from '../../../core/vocabulary';

/** A block of an example, in sheet order; the last one is what the example shows. */
export type ExampleBlock = {
  kind: 'text' | 'calc' | 'matrix' | 'modes' | 'response' | 'criteria';
  source: string;
};

export type BlockReference = {
  kind: string;
  /** The name on the "+ …" button and the block card. */
  label: string;
  summary: string;
  /** What a new block of this kind starts with: it evaluates as it is (empty for free text). */
  starter: string;
  /** What the starter reads from above it, if anything (a response block reads a modes block). */
  starterAbove?: ExampleBlock[];
  example: ExampleBlock[];
};

export type KeyReference = {
  key: string;
  value: string;
  /** What applies when the key is left out; null when the key is required. */
  default: string | null;
  summary: string;
};

export type FunctionReference = {
  name: string;
  group: 'generator' | 'math' | 'matrix' | 'units';
  signature: string;
  units: string;
  summary: string;
  /** Calc lines; the example's blocks are evaluated in order. */
  example: ExampleBlock[];
};

const chain = 'frame = storey_chain([20 t, 20 t, 18 t], [30 kN/mm, 30 kN/mm, 25 kN/mm])';

/** The starting point of a new modes block: a two-DOF model that solves, to replace with K, M. */
export const MODES_STARTER = [
  'name: modes',
  'stiffness: [2, -1; -1, 1] * 1000 kN/m  # replace with your K, e.g. frame.K',
  'mass: [1, 0; 0, 1] * 1 t  # replace with your M, e.g. frame.M',
  'method: auto',
  'count: 2',
  'direction: [1, 1]  # influence vector: one entry per DOF',
  '',
].join('\n');

/** The starting point of a new matrix block: a 2 × 2 symmetric stiffness in kN/m. */
export const MATRIX_STARTER = ['name: K2', 'unit: kN/m', '2000, -1000', '-1000, 1000', ''].join(
  '\n',
);

/**
 * The starting point of a new response block: a response-spectrum analysis of the modes a new
 * Modes block starts with (ASCE 7-16 §11.4.6 design spectrum, parameters to replace).
 */
export const RESPONSE_STARTER = [
  'modes: modes  # the name of a modes block above',
  'analysis: spectrum',
  'spectrum: ASCE 7-16',
  'SDS: 1.0',
  'SD1: 0.6',
  'TL: 8 s',
  'R: 8',
  'damping: 0.05',
  'combine: cqc',
  'name: rsa',
  '',
].join('\n');

export const BLOCK_REFERENCE: BlockReference[] = [
  {
    kind: 'text',
    label: 'Text',
    summary:
      'Markdown with $…$ and $$…$$ formulas. Headings name the sheet’s parts in the outline.',
    starter: '',
    example: [
      { kind: 'text', source: '## Deck\n\nClosed form: $f_1 = \\frac{\\pi}{2L^2}\\sqrt{EI/m}$.' },
    ],
  },
  {
    kind: 'calc',
    label: 'Calculation',
    summary:
      'One statement per line, units carried throughout; each line is shown as the formula, the values substituted and the result. `#` starts a comment.',
    starter: '',
    example: [
      {
        kind: 'calc',
        source: 'k_1 = 24 kN/mm  # storey\nm_1 = 18 t\nf_1 = sqrt(k_1 / m_1) / (2 pi)',
      },
    ],
  },
  {
    kind: 'matrix',
    label: 'Matrix',
    summary:
      'A named matrix with one unit for its entries: header lines, then rows of numbers (spaces or commas), or `from:` an uploaded Matrix Market or CSV file.',
    starter: MATRIX_STARTER,
    example: [{ kind: 'matrix', source: MATRIX_STARTER }],
  },
  {
    kind: 'modes',
    label: 'Modes',
    summary:
      'An eigen-solve of K φ = λ M φ on the server. Results are bound under `name` for the blocks below: f (Hz), T (s), omega, lambda, phi, gamma, meff, ratio, cumulative, dt_cr (forward).',
    starter: MODES_STARTER,
    example: [
      { kind: 'calc', source: chain },
      {
        kind: 'modes',
        source:
          'name: sway\nstiffness: frame.K\nmass: frame.M\nmethod: dense\ncount: 3\ndirection: x',
      },
    ],
  },
  {
    kind: 'response',
    label: 'Response',
    summary:
      'An analysis of a modes result above it: `analysis: spectrum` (ASCE 7-16, EN 1998-1 or a table; SRSS or CQC; base shear, storey forces, drifts, ELF scaling), `harmonic` (steady state at a running speed), `history` (modal time history under a force or ground record) or `walking` (AISC DG11 floor or footbridge acceleration). Results are bound under `name`: rsa.V, rsa.drift_ratio, pump.u_run, deck.a.',
    starter: RESPONSE_STARTER,
    starterAbove: [{ kind: 'modes', source: MODES_STARTER }],
    example: [
      { kind: 'calc', source: chain },
      {
        kind: 'modes',
        source:
          'name: frame\nstiffness: frame.K\nmass: frame.M\nmethod: dense\ncount: 3\ndirection: x',
      },
      {
        kind: 'response',
        source:
          'modes: frame\nanalysis: spectrum\nspectrum: ASCE 7-16\nSDS: 1.0\nSD1: 0.6\nTL: 8 s\nR: 8\ndamping: 0.05\nheights: 3.5 m\nname: rsa',
      },
    ],
  },
  {
    kind: 'criteria',
    label: 'Criteria',
    summary:
      'One acceptance criterion per line, true or false; its comment is its label. The sheet header counts passes and fails.',
    starter: '',
    example: [
      { kind: 'calc', source: 'f_1 = 5.8 Hz' },
      { kind: 'criteria', source: 'f_1 >= 3 Hz  # walking comfort, vertical (common practice)' },
    ],
  },
];

export const MODES_KEY_REFERENCE: KeyReference[] = [
  {
    key: 'stiffness',
    value: 'a square matrix: K, frame.K',
    default: null,
    summary: 'K, in force per length (N/m, kN/m) or consistent SI units.',
  },
  {
    key: 'mass',
    value: 'a square matrix: M, frame.M',
    default: null,
    summary: 'M, in mass units (kg, t); weights are refused with a hint to divide by g.',
  },
  {
    key: 'method',
    value: 'auto | inverse | forward | shifted | subspace | lanczos | dense',
    default: 'auto',
    summary:
      'inverse: lowest modes; forward: highest (critical time step); shifted: nearest the shift; subspace, lanczos: many modes of large models; dense: every mode, the reference.',
  },
  {
    key: 'count',
    value: 'a whole number',
    default: '3',
    summary:
      'How many modes; at most the model’s degrees of freedom (a larger count is refused, naming both: write the number of DOFs for every mode).',
  },
  {
    key: 'shift',
    value: 'a frequency: 24.5 Hz, 1480 rpm, 150 rad/s',
    default: '0',
    summary: 'The target of shifted inverse iteration and Lanczos: λ = (2πf)².',
  },
  {
    key: 'tolerance',
    value: 'a relative tolerance: 1e-10',
    default: '1e-10',
    summary: 'Convergence of λ between iterations.',
  },
  {
    key: 'max iterations',
    value: 'a whole number: 200',
    default: 'the method’s own',
    summary: 'Per mode; past it the solve stops with the partial results and how far they got.',
  },
  {
    key: 'normalize',
    value: 'mass | max | dof <n>',
    default: 'mass',
    summary: 'φᵀMφ = 1, the largest component = 1, or DOF n = 1.',
  },
  {
    key: 'direction',
    value:
      'a direction name (x; a generator’s transverse) or an influence vector ([1, 1, 1], frame.r)',
    default: 'every direction of the generator or of the DOF labels',
    summary:
      'The ground-motion direction for participation factors and effective masses. An uploaded model gets its directions from DOF labels (`dofs:` of its matrix blocks): `direction: x` is 1 at every ux DOF. Without a direction the Γ and mass columns are empty and the table says why.',
  },
  {
    key: 'name',
    value: 'a name: sway',
    default: 'modes',
    summary: 'The results are bound under it: sway.f[1], sway.cumulative[3].',
  },
];

export const MATRIX_KEY_REFERENCE: KeyReference[] = [
  {
    key: 'name',
    value: 'a name: K',
    default: null,
    summary: 'The name the matrix is bound to for the blocks below.',
  },
  {
    key: 'unit',
    value: 'a unit: kN/m, t, kg',
    default: 'none (plain numbers)',
    summary: 'One unit for every entry.',
  },
  {
    key: 'symmetric',
    value: 'yes | no',
    default: 'yes for a square matrix',
    summary: 'Asymmetry above 1e-9 of the largest entry is an error naming where, unless no.',
  },
  {
    key: 'from',
    value: 'the name of an uploaded file',
    default: 'rows typed below the header',
    summary: 'Matrix Market (coordinate or array) or CSV (rows or i,j,value triplets).',
  },
  {
    key: 'dofs',
    value: 'per node ux uy uz rx ry rz | from <DOF map upload> | n1.ux, n2.ux',
    default: 'none (no named directions)',
    summary:
      'Labels the rows of a square matrix, one per DOF, so a modes block can build `direction: x`. See “DOF labels of an uploaded model” below.',
  },
];

/** A topic that spans blocks, with an example that evaluates with the uploads it names. */
export type TopicReference = {
  id: string;
  title: string;
  /** Paragraphs; `code` is set as code. */
  paragraphs: string[];
  /** The files the example reads, as a person would upload them. */
  uploads: { name: string; text: string }[];
  example: ExampleBlock[];
};

/**
 * How an uploaded model gets its directions. The example is REFERENCES.md item 3, the two-storey
 * frame (masses 2m, m; stiffnesses 2k, k), with three DOFs per floor: its x sway has effective
 * masses 8/9 and 1/9 of the 300 t.
 */
export const TOPIC_REFERENCE: TopicReference[] = [
  {
    id: 'dof-labels',
    title: 'DOF labels of an uploaded model',
    paragraphs: [
      'Participation needs an influence vector: which DOFs move with the ground along a direction. A generator knows its DOFs; an uploaded K and M are only numbers. Label their rows with `dofs:` in the matrix block, one label `node.component` per DOF, in one of three ways:',
      '`dofs: per node ux uy rz` — a rule: DOFs 1–3 are node 1’s (n1.ux, n1.uy, n1.rz), 4–6 node 2’s, and so on. The matrix size must be a whole number of nodes.',
      '`dofs: from tower-dofs.csv` — a DOF map uploaded beside the matrix: one row per DOF, in the matrix’s order, giving the node number and the component number 1–6 (1 ux, 2 uy, 3 uz, 4 rx, 5 ry, 6 rz), as analysis programs number a node’s DOFs.',
      '`dofs: n1.ux, n2.ux` — the labels written out, for a typed matrix.',
      'Then `direction: x` in the modes block is 1 at every ux DOF and 0 elsewhere (rotations included): the model translating rigidly with the ground. Without `direction:`, every translation the labels have (x, y, z) is used. K and M must carry the same labels; labels that do not match the matrix size are refused at the `dofs:` line, with both numbers.',
    ],
    uploads: [
      {
        name: 'tower-k.mtx',
        text: '%%MatrixMarket matrix coordinate real symmetric\n% kN/mm; DOFs n1.ux n1.uy n1.rz n2.ux n2.uy n2.rz\n6 6 9\n1 1 150\n4 1 -50\n4 4 50\n2 2 240\n5 2 -80\n5 5 80\n3 3 600\n6 3 -200\n6 6 200\n',
      },
      {
        name: 'tower-m.mtx',
        text: '%%MatrixMarket matrix coordinate real symmetric\n% t (and t m² for the twist)\n6 6 6\n1 1 200\n2 2 200\n3 3 400\n4 4 100\n5 5 100\n6 6 200\n',
      },
      { name: 'tower-dofs.csv', text: '1, 1\n1, 2\n1, 6\n2, 1\n2, 2\n2, 6\n' },
    ],
    example: [
      {
        kind: 'matrix',
        source: 'name: K\nunit: kN/mm\nfrom: tower-k.mtx\ndofs: per node ux uy rz',
      },
      { kind: 'matrix', source: 'name: M\nunit: t\nfrom: tower-m.mtx\ndofs: from tower-dofs.csv' },
      {
        kind: 'modes',
        source: 'name: tower\nstiffness: K\nmass: M\nmethod: dense\ncount: 6\ndirection: x',
      },
      { kind: 'criteria', source: 'tower.cumulative[4] >= 0.9  # 90 % of the x mass' },
    ],
  },
];

const key = (value: string, fallback: string | null, summary: string) => ({
  value,
  default: fallback,
  summary,
});

/**
 * Each key of a response block (core/sheet/blocks/response.ts; core/sheet/README.md), keyed by the
 * engine's own list so none can be left out. Which analysis reads a key is said in its summary.
 */
const RESPONSE_KEY_WORDS: Record<ResponseKey, Omit<KeyReference, 'key'>> = {
  modes: key('the name of a modes block above: frame', null, 'The modes the analysis uses.'),
  analysis: key('spectrum | harmonic | history | walking', null, 'Which analysis runs.'),
  damping: key(
    'a ratio (0.05) or one per mode ([0.05, 0.05, 0.02])',
    null,
    'Modal damping ratios; with `rayleigh:` the ratio at both of its frequencies.',
  ),
  name: key('a name: rsa', 'response', 'The results are bound under it: rsa.V, rsa.drift[1].'),
  spectrum: key(
    'ASCE 7-16 | EN 1998-1 type 1 | EN 1998-1 type 2 | table',
    null,
    'Spectrum analysis: the design spectrum (ASCE 7-16 §11.4.6; EN 1998-1 §3.2.2.2, design §3.2.2.5 with `q:`) or a table.',
  ),
  sds: key('a number in g: 1.0', null, 'ASCE 7-16: S_DS, the short-period design acceleration.'),
  sd1: key('a number in g: 0.6', null, 'ASCE 7-16: S_D1, the one-second design acceleration.'),
  tl: key('a time: 8 s', null, 'ASCE 7-16: T_L, the long-period transition period.'),
  r: key(
    'a number: 8',
    '1',
    'ASCE 7-16: the response modification coefficient R (forces × I_e/R).',
  ),
  ie: key('a number: 1.25', '1', 'ASCE 7-16: the importance factor I_e.'),
  ground: key('A | B | C | D | E', null, 'EN 1998-1: the ground type (Tables 3.2, 3.3).'),
  ag: key(
    'an acceleration: 2.5 m/s^2, or 0.25 (× g)',
    null,
    'EN 1998-1: the design ground acceleration a_g.',
  ),
  q: key('a number: 3.9', 'the elastic spectrum', 'EN 1998-1: the behaviour factor q.'),
  table: key(
    'an uploaded CSV or a two-column matrix above',
    null,
    'spectrum: table: period (s), pseudo-acceleration; an optional header line.',
  ),
  'table unit': key('g | m/s^2', 'g', 'The unit of the table’s accelerations.'),
  combine: key('cqc | srss', 'cqc', 'Modal combination (CQC: Der Kiureghian 1981).'),
  direction: key(
    'a direction of the modes: x, or x, y',
    'the modes block’s direction',
    'Spectrum: the directions analysed; history: the direction of a ground record.',
  ),
  directional: key('srss | 100-30', 'srss', 'Spectrum: how two directions combine.'),
  heights: key(
    'a storey height (3.5 m) or one per floor',
    'none (no storey results)',
    'Spectrum: gives storey forces, shears, overturning moments and drifts, mode by mode.',
  ),
  'elf base shear': key(
    'a force: 1450 kN',
    'no scaling',
    'Spectrum: the ELF base shear the modal base shear is scaled up to (ASCE 7-16 §12.9.1.4).',
  ),
  'elf share': key(
    'a share: 1.0 or 0.85',
    '1.0',
    'Spectrum: the share of the ELF base shear to reach.',
  ),
  force: key(
    'one force per DOF: [0, 0, 5 kN]; walking: P_o',
    'walking: 0.29 kN',
    'Harmonic: the force amplitude; history: the pattern the record scales; walking: P_o (0.41 kN for footbridges).',
  ),
  unbalance: key(
    'a mass × eccentricity: 12 kg m',
    null,
    'Harmonic: a rotating unbalance at `at:` (force m·e·Ω²), instead of `force:`.',
  ),
  at: key(
    'a DOF number: 3',
    'walking: the largest component',
    'Harmonic: where the unbalance acts; walking: where the walker is.',
  ),
  'running speed': key(
    'a frequency: 1480 rpm, 24.7 Hz',
    'none',
    'Harmonic: the machine’s running speed; gives u_run and the separation.',
  ),
  range: key(
    'two frequencies: [2 Hz, 60 Hz]',
    '0 to 1.5 × the highest mode or running speed',
    'Harmonic: the frequency range of the response curve.',
  ),
  points: key('a whole number, 10 to 5000', '400', 'Harmonic: frequencies in the range.'),
  rayleigh: key(
    'two frequencies: [8 Hz, 40 Hz]',
    'none (modal damping)',
    'Harmonic: Rayleigh damping C = αM + βK with `damping:` at both frequencies.',
  ),
  dofs: key(
    'DOF numbers: [1, 3] (at most 12)',
    'harmonic: where the force acts; history: the last DOF',
    'Harmonic and history: the DOFs reported.',
  ),
  record: key(
    'an uploaded CSV or two-column matrix (t s, value)',
    null,
    'History: a ground acceleration, or with `force:` a factor on that force.',
  ),
  'record unit': key('g | m/s^2', 'g', 'History: the unit of a ground record.'),
  step: key(
    'a time: 0.005 s',
    'the record’s smallest step',
    'History: the integration step (at most 200 000 steps).',
  ),
  duration: key('a time: 20 s', 'the record’s length', 'History: the end time.'),
  method: key(
    'exact | newmark',
    'exact',
    'History: piecewise-linear exact (Nigam & Jennings 1969) or Newmark average acceleration.',
  ),
  mode: key('a mode number: 1', '1', 'Walking: the mode the walker excites.'),
  limit: key(
    'an acceleration: 0.7 m/s^2',
    'none',
    'Walking: the limit the peak acceleration is checked against (AISC DG11 Table 4.1; EN 1990 A2).',
  ),
};

export const RESPONSE_KEY_REFERENCE: KeyReference[] = RESPONSE_KEYS.map((k) => ({
  key: k,
  ...RESPONSE_KEY_WORDS[k],
}));

/** The keys of each block kind that has `key: value` lines. */
export const KEY_REFERENCE: Record<string, KeyReference[]> = {
  modes: MODES_KEY_REFERENCE,
  matrix: MATRIX_KEY_REFERENCE,
  response: RESPONSE_KEY_REFERENCE,
};

const calc = (source: string): ExampleBlock[] => [{ kind: 'calc', source }];

export const FUNCTION_REFERENCE: FunctionReference[] = [
  {
    name: 'storey_chain',
    group: 'generator',
    signature: 'storey_chain(masses, stiffnesses)',
    units: 'masses in mass units, stiffnesses in force/length; gives K (N/m), M (kg)',
    summary:
      'A shear building on a fixed base, floor 1 lowest. Returns {K, M, n, r, influence}; direction x.',
    example: calc(chain),
  },
  {
    name: 'beam',
    group: 'generator',
    signature: 'beam({E, I, mass, length, elements, ends, lumped?})',
    units: 'E in Pa, I in m⁴, mass per length, length; gives K and M in consistent SI units',
    summary:
      'An Euler–Bernoulli beam of Hermite elements; ends "<left>-<right>" of clamped, pinned, free, guided. Direction transverse.',
    example: calc(
      'deck = beam({E: 210 GPa, I: 0.012 m^4, mass: 1.2 t/m, length: 32 m, elements: 20, ends: "pinned-pinned"})',
    ),
  },
  {
    name: 'plane_frame',
    group: 'generator',
    signature:
      'plane_frame({nodes, members, E, A, I, mass, fixed?, pinned?, masses?, mass_nodes?})',
    units: 'coordinates in length, E in Pa, A in m², I in m⁴, mass per length',
    summary: 'A plane frame of beam-column members; 1-based node numbers; directions ux and uy.',
    example: calc(
      'portal = plane_frame({nodes: [0 m, 0 m; 0 m, 3.5 m; 6 m, 3.5 m; 6 m, 0 m], members: [1, 2; 2, 3; 3, 4], E: 210 GPa, A: 5.4e-3 m^2, I: 8.4e-5 m^4, mass: 42 kg/m, fixed: [1, 4]})',
    ),
  },
  {
    name: 'sqrt',
    group: 'math',
    signature: 'sqrt(x)',
    units: 'the unit’s square root',
    summary: 'Square root.',
    example: calc('omega = sqrt(30 kN/mm / 20 t)'),
  },
  {
    name: 'abs',
    group: 'math',
    signature: 'abs(x)',
    units: 'as x',
    summary: 'Absolute value.',
    example: calc('d = abs(-12 mm)'),
  },
  {
    name: 'sin',
    group: 'math',
    signature: 'sin(angle)',
    units: 'angle in rad or deg',
    summary: 'Sine.',
    example: calc('s = sin(30 deg)'),
  },
  {
    name: 'cos',
    group: 'math',
    signature: 'cos(angle)',
    units: 'angle in rad or deg',
    summary: 'Cosine.',
    example: calc('c = cos(pi / 3)'),
  },
  {
    name: 'tan',
    group: 'math',
    signature: 'tan(angle)',
    units: 'angle in rad or deg',
    summary: 'Tangent.',
    example: calc('t_1 = tan(45 deg)'),
  },
  {
    name: 'exp',
    group: 'math',
    signature: 'exp(x)',
    units: 'x without unit',
    summary: 'e to the power x.',
    example: calc('decay = exp(-0.05 * 2 pi)'),
  },
  {
    name: 'log',
    group: 'math',
    signature: 'log(x) or log(x, base)',
    units: 'x without unit',
    summary: 'Natural logarithm, or to a base.',
    example: calc('delta = log(1.37)'),
  },
  {
    name: 'log10',
    group: 'math',
    signature: 'log10(x)',
    units: 'x without unit',
    summary: 'Logarithm to base 10.',
    example: calc('digits = log10(5.6e7)'),
  },
  {
    name: 'min',
    group: 'math',
    signature: 'min(a, b, …) or min(list)',
    units: 'all of one dimension',
    summary: 'The smallest.',
    example: calc('f_min = min(3.1 Hz, 2.9 Hz)'),
  },
  {
    name: 'max',
    group: 'math',
    signature: 'max(a, b, …) or max(list)',
    units: 'all of one dimension',
    summary: 'The largest.',
    example: calc('k_max = max([24 kN/mm, 30 kN/mm])'),
  },
  {
    name: 'sum',
    group: 'math',
    signature: 'sum(list)',
    units: 'all of one dimension',
    summary: 'The sum of a list.',
    example: calc('m_total = sum([20 t, 20 t, 18 t])'),
  },
  {
    name: 'round',
    group: 'math',
    signature: 'round(x) or round(x, digits)',
    units: 'x without unit',
    summary: 'Rounds to whole numbers or to digits.',
    example: calc('n = round(2.718, 2)'),
  },
  {
    name: 'pow',
    group: 'math',
    signature: 'pow(x, p)',
    units: 'the unit to the power p',
    summary: 'x to the power p (also x^p).',
    example: calc('I_1 = pow(0.3 m, 4) / 12'),
  },
  {
    name: 'to',
    group: 'units',
    signature: 'value to unit',
    units: 'any unit of the same dimension',
    summary: 'Converts and keeps the unit asked for (also `in`).',
    example: calc('k_si = 24 kN/mm to N/m'),
  },
  {
    name: 'in',
    group: 'units',
    signature: 'value in unit',
    units: 'any unit of the same dimension',
    summary: 'The same as `to`.',
    example: calc('n_rpm = 24.5 Hz in rpm'),
  },
  {
    name: 'size',
    group: 'matrix',
    signature: 'size(A)',
    units: '—',
    summary: 'Rows and columns of a matrix.',
    example: calc('s = size([1, 2; 3, 4])'),
  },
  {
    name: 'transpose',
    group: 'matrix',
    signature: 'transpose(A)',
    units: 'as A',
    summary: 'The transpose (also A’).',
    example: calc('At = transpose([1, 2; 3, 4])'),
  },
  {
    name: 'diag',
    group: 'matrix',
    signature: 'diag(list) or diag(A)',
    units: 'as the entries',
    summary: 'A diagonal matrix from a list, or the diagonal of a matrix.',
    example: calc('M_d = diag([20, 20, 18]) * 1 t'),
  },
  {
    name: 'det',
    group: 'matrix',
    signature: 'det(A)',
    units: 'the unit to the power n',
    summary: 'Determinant of a square matrix.',
    example: calc('d_K = det([2, -1; -1, 1])'),
  },
  {
    name: 'inv',
    group: 'matrix',
    signature: 'inv(A)',
    units: 'the inverse unit',
    summary: 'Inverse of a square matrix.',
    example: calc('F = inv([2, -1; -1, 1] * 1000 kN/m)'),
  },
  {
    name: 'zeros',
    group: 'matrix',
    signature: 'zeros(n) or zeros(rows, cols)',
    units: '—',
    summary: 'A vector or matrix of zeros (bounded: 4 000 000 entries).',
    example: calc('z = zeros(3)'),
  },
  {
    name: 'ones',
    group: 'matrix',
    signature: 'ones(n) or ones(rows, cols)',
    units: '—',
    summary:
      'A vector or matrix of ones: the influence vector of a model whose DOFs all move with the ground.',
    example: calc('r = ones(3)'),
  },
  {
    name: 'identity',
    group: 'matrix',
    signature: 'identity(n)',
    units: '—',
    summary: 'The n × n identity.',
    example: calc('M_1 = identity(2) * 1 t'),
  },
];

/** A function's or generator's entry by name, for completion and hover. */
export function functionReference(name: string): FunctionReference | undefined {
  return FUNCTION_REFERENCE.find((f) => f.name === name);
}

/** A key's entry in a block kind, for completion and hover. */
export function keyReference(kind: string, key: string): KeyReference | undefined {
  return KEY_REFERENCE[kind]?.find((k) => k.key === key);
}
