/**
 * The fuzz suite's generator: hostile requests to the sheet evaluate route, the draft save, the
 * uploads route and sign-in, from one seed. Each case is plain data (method, path, headers, body
 * bytes), so a failing case can be printed and replayed. See README.md beside this file.
 */
import { Random } from './random';

export type FuzzRoute = 'evaluate' | 'draft' | 'upload' | 'sign-in';

export interface FuzzCase {
  index: number;
  route: FuzzRoute;
  /** Which generator made it, for the tally. */
  kind: string;
  method: 'POST' | 'PUT';
  path: string;
  headers: Record<string, string>;
  body: Buffer;
  /** Larger than the route's size limit: must be refused with 413, never accepted. */
  overLimit: boolean;
}

export interface FuzzTargets {
  sheetId: number;
  uploadSheetId: number;
  bodyLimitBytes: number;
  uploadLimitBytes: number;
  /** A real account's e-mail, so some sign-ins reach the password check. */
  email: string;
}

/** The draft save's If-Match is replaced by the sheet's current version when it says this. */
export const CURRENT_VERSION = '{{current}}';

const ASCII =
  'abcdefghijklmnopqrstuvwxyzABCDEFGHIJKLMNOPQRSTUVWXYZ0123456789 _+-*/^()[],;:.=<>!?"\'`\\{}|&%$#@~\t';
const UNICODE = 'αβγδωΩπ°µ·×÷−≤≥√∑∫éñøß中文😀\u200b\u202e\ufeff\u0000\u0007';

const HOSTILE_EXPRESSIONS = [
  'x = 1e308^1e308',
  'x = 2^1e6',
  'x = factorial(171)',
  'x = NaN',
  'x = Infinity',
  'x = -Infinity * 0',
  'x = 0/0',
  'x = 1/0',
  'x = log(0)',
  'x = sqrt(-1)',
  'x = 1e-400',
  'x = 5e-324 / 1e10',
  'x = 10^-400',
  'x = 3 kN + 2 m',
  'x = 3 kN/mm^999',
  'x = 1 furlong',
  'x = import("fs")',
  'x = evaluate("1+1")',
  'x = parse("1")',
  'x = createUnit("foo")',
  'x = [1, 2; 3]',
  'x = ones(100000, 100000)',
  'x = zeros(1e9)',
  'x = range(1, 1e9)',
  'x = 1:1e8',
  'f(a) = f(a)\ny = f(1)',
  'a = a + 1',
  'x = "\\u0000"',
  'x = {}.constructor',
  'x = storey_chain([1 t], [0 kN/mm])',
  'x = storey_chain([], [])',
  'x = storey_chain([1e308 t, 1 t], [1 kN/mm, 1e308 kN/mm])',
  'x = 1 kN to m',
  'x = sum(1, 2',
  'x == = 3',
  '= 3',
  'x = 3 # a comment with ### hashes',
  'x = [[1]] * [[1, 2]]',
  'x = det([1, 2; 3, 4])',
  'x = inv([0, 0; 0, 0])',
  'x = 9007199254740993',
  'x = 1e999 m',
  'x = -0',
];

function hostileExpression(r: Random): string {
  const roll = r.int(0, 9);
  if (roll <= 4) return r.pick(HOSTILE_EXPRESSIONS);
  if (roll === 5) {
    const depth = r.int(100, 3000);
    return `x = ${'('.repeat(depth)}1${')'.repeat(depth)}`;
  }
  if (roll === 6) return `x = 1${' + 1'.repeat(r.int(100, 5000))}`;
  if (roll === 7) return `${r.text(r.int(1, 200), 'abcxyz_')} = ${r.text(r.int(1, 40), ASCII)}`;
  if (roll === 8) return r.text(r.int(0, 300), ASCII + UNICODE);
  return `x = ${r.int(-9, 9)}e${r.int(-400, 400)} ${r.pick(['', 'kN', 'm', 't', 'kN/mm', 'Hz', 's^-2', 'kg*m^2'])}`;
}

function matrixSource(r: Random): string {
  const n = r.int(0, 6);
  const junk = ['NaN', 'inf', '1e999', '', 'abc', '1,2', '--1', '0x10', '1e-400', '  '];
  const rows = Array.from({ length: n }, () =>
    Array.from({ length: r.chance(0.2) ? r.int(0, 8) : n }, () =>
      r.chance(0.2) ? r.pick(junk) : String(r.int(-5000, 5000)),
    ).join(r.pick([', ', ',', ' ', ';'])),
  );
  const head = r.pick([
    'name: K\nunit: kN/m',
    'name: M\nunit: t',
    'name: K',
    `name: ${r.text(r.int(0, 80), ASCII)}`,
    'unit: furlong',
    `from: ${r.pick(['missing.mtx', '../../etc/passwd', 'k.csv', r.text(20, ASCII)])}`,
    `name: K\nsize: ${r.pick(['4294967296', '-1', '1e9', 'x'])}`,
  ]);
  return `${head}\n\n${rows.join('\n')}`;
}

function modesSource(r: Random): string {
  const pick = (values: string[]) => r.pick(values);
  return [
    `stiffness: ${pick(['K', 'frame.K', 'M', 'x', '', 'K K', '[1]'])}`,
    `mass: ${pick(['M', 'frame.M', 'K', 'y', ''])}`,
    `count: ${pick(['1', '2', '0', '-1', '1e9', 'abc', '4294967296', ''])}`,
    r.chance(0.5)
      ? `method: ${pick(['dense', 'lanczos', 'inverse', 'subspace', 'magic', ''])}`
      : '',
    r.chance(0.3) ? `tolerance: ${pick(['1e-300', '0', '-1', 'NaN', '1e300'])}` : '',
    r.chance(0.3) ? `max iterations: ${pick(['0', '1e12', '-5', 'x'])}` : '',
    `name: ${pick(['s', 'modes', '', '1bad', 'a b'])}`,
  ]
    .filter(Boolean)
    .join('\n');
}

const SETUP_BLOCKS = [
  { id: 'k', kind: 'matrix', source: 'name: K\nunit: kN/m\n\n2000, -1000\n-1000, 1000' },
  { id: 'm', kind: 'matrix', source: 'name: M\nunit: t\n\n10, 0\n0, 10' },
];

function hostileBlock(r: Random, i: number): { id: string; kind: string; source: string } {
  const kind = r.pick(['calc', 'calc', 'calc', 'matrix', 'modes', 'text', 'criteria']);
  const id = `b${i}`;
  switch (kind) {
    case 'calc':
      return {
        id,
        kind,
        source: Array.from({ length: r.int(1, 4) }, () => hostileExpression(r)).join('\n'),
      };
    case 'matrix':
      return { id, kind, source: matrixSource(r) };
    case 'modes':
      return { id, kind, source: modesSource(r) };
    case 'criteria':
      return {
        id,
        kind,
        source: r.pick(['f > 3 Hz', 'x <', 'a_max < 0.5 m/s^2', r.text(50, ASCII)]),
      };
    default:
      return { id, kind, source: r.text(r.int(0, 500), ASCII + UNICODE) };
  }
}

/** A JSON value of the wrong shape for a draft: the schema must refuse it with a field. */
function wrongShapeDraft(r: Random): unknown {
  const block = () => ({ id: 'a', kind: 'calc', source: 'x = 1' });
  return r.pick<() => unknown>([
    () => ({ blocks: 'x' }),
    () => ({ blocks: [1, 2, 3] }),
    () => ({ blocks: [{ ...block(), id: 5 }] }),
    () => ({ blocks: [{ ...block(), kind: 'spreadsheet' }] }),
    () => ({ blocks: [{ ...block(), source: null }] }),
    () => ({ blocks: [{ ...block(), id: 'has space' }] }),
    () => ({ blocks: [block(), block()] }),
    () => ({
      blocks: [block()],
      settings: { significantFigures: r.pick(['4', 0, 99, 1.5, -1, null]) },
    }),
    () => ({ blocks: Array.from({ length: 501 }, (_, i) => ({ ...block(), id: `a${i}` })) }),
    () => ({ blocks: [{ ...block(), source: 'x'.repeat(400_001) }] }),
    () => ({}),
    () => null,
    () => [],
    () => 'blocks',
    () => 42,
    () => ({
      blocks: [{ ...block(), __proto__: { polluted: true } }],
      constructor: { prototype: {} },
    }),
  ])();
}

function malformedJson(r: Random): string {
  const good = JSON.stringify({ blocks: [{ id: 'a', kind: 'calc', source: 'x = 1' }] });
  return r.pick<() => string>([
    () => good.slice(0, r.int(0, good.length - 1)),
    () => `${good}}}`,
    () => good.replace(/"/g, "'"),
    () => '{"blocks": [NaN]}',
    () => '{"blocks": [1,]}',
    () => '\ufeff' + good,
    () => '',
    () => '{"blocks": "\\ud800"}',
    () => `{"blocks":[{"id":"a","kind":"calc","source":"x = \\udc00 1\\ny = 2"}]}`,
    () => `${'['.repeat(r.int(1000, 20000))}${']'.repeat(r.int(0, 20000))}`,
    () => `{"a":${'{"a":'.repeat(r.int(100, 5000))}1${'}'.repeat(r.int(0, 5000))}}`,
    () => '{"blocks": [{"id": "a", "kind": "calc", "source": "x = 1"}], "blocks": 5}',
    () => r.text(r.int(1, 200), ASCII + UNICODE),
  ])();
}

const JSON_TYPES = [
  'application/json',
  'application/json',
  'application/json',
  'application/json; charset=utf-8',
  'application/json; charset=latin1',
  'application/json; charset=utf-16',
  'application/json; charset="iso-8859-1"',
  'text/plain',
  'application/x-www-form-urlencoded',
  'multipart/form-data; boundary=zzz',
];

function jsonBody(
  r: Random,
  targets: FuzzTargets,
  makeValid: () => unknown,
): { kind: string; headers: Record<string, string>; body: Buffer; overLimit: boolean } {
  const roll = r.int(0, 99);
  let kind: string;
  let text: string;
  let overLimit = false;
  if (roll < 55) {
    kind = 'hostile-content';
    text = JSON.stringify(makeValid());
  } else if (roll < 72) {
    kind = 'wrong-shape';
    text = JSON.stringify(wrongShapeDraft(r)) ?? 'null';
  } else if (roll < 90) {
    kind = 'malformed-json';
    text = malformedJson(r);
  } else {
    kind = 'over-limit';
    overLimit = true;
    const pad = targets.bodyLimitBytes + r.int(1, 64 * 1024);
    text = JSON.stringify({ blocks: [{ id: 'a', kind: 'text', source: 'y'.repeat(pad) }] });
  }
  const type =
    kind === 'over-limit' || (kind === 'hostile-content' && r.chance(0.9))
      ? 'application/json'
      : r.pick(JSON_TYPES);
  return {
    kind: `${kind} (${type.split(';')[0]})`,
    headers: { 'Content-Type': type },
    body: Buffer.from(text, 'utf8'),
    overLimit,
  };
}

function sheetBody(r: Random): unknown {
  const blocks = [
    ...(r.chance(0.5) ? SETUP_BLOCKS : []),
    ...Array.from({ length: r.int(1, 4) }, (_, i) => hostileBlock(r, i)),
  ];
  const body: Record<string, unknown> = { blocks };
  if (r.chance(0.3)) body.settings = { significantFigures: r.int(1, 15) };
  return body;
}

function evaluateCase(r: Random, t: FuzzTargets): Omit<FuzzCase, 'index'> {
  const b = jsonBody(r, t, () => sheetBody(r));
  return {
    route: 'evaluate',
    method: 'POST',
    path: `/api/sheets/${t.sheetId}/evaluate`,
    ...b,
  };
}

function draftCase(r: Random, t: FuzzTargets): Omit<FuzzCase, 'index'> {
  const b = jsonBody(r, t, () => sheetBody(r));
  const ifMatch = r.pick([
    CURRENT_VERSION,
    CURRENT_VERSION,
    CURRENT_VERSION,
    '"999999999"',
    'W/"1"',
    '*',
    'abc',
    '"-1"',
    '"1e3"',
    '',
  ]);
  return {
    route: 'draft',
    method: 'PUT',
    path: `/api/sheets/${t.sheetId}/draft`,
    ...b,
    headers: { ...b.headers, ...(ifMatch ? { 'If-Match': ifMatch } : {}) },
  };
}

function matrixMarketFile(r: Random): string {
  const banner = r.pick([
    '%%MatrixMarket matrix coordinate real symmetric',
    '%%MatrixMarket matrix coordinate real general',
    '%%MatrixMarket matrix array real general',
    '%%MatrixMarket matrix coordinate pattern symmetric',
    '%%MatrixMarket matrix array pattern general',
    '%%MatrixMarket matrix coordinate complex hermitian',
    '%%MatrixMarket vector coordinate real general',
    '%MatrixMarket matrix coordinate real symmetric',
    '',
  ]);
  const n = r.int(1, 5);
  const size = r.pick([
    `${n} ${n} ${n}`,
    `${n} ${n}`,
    '4294967296 4294967296 1',
    '10000001 10000001 1',
    '99999999999999999999 1 1',
    '-1 -1 1',
    '0 0 0',
    '1e3 1e3 1',
    'a b c',
    `${n} ${n + 1} ${n}`,
    `${n} ${n} 4294967296`,
  ]);
  const entries = Array.from({ length: r.int(0, 8) }, () =>
    [
      r.pick([String(r.int(1, n)), '0', String(n + 1), '-1', '1.5', '4294967296', 'x']),
      r.pick([String(r.int(1, n)), '0', String(n + 2), '']),
      r.pick([String(r.int(-100, 100)), 'NaN', 'inf', '1e999', '-1e999', '1e-400', 'abc', '']),
    ].join(r.pick([' ', '\t', '  ', ','])),
  );
  return [banner, r.chance(0.3) ? '% comment' : '', size, ...entries].join(r.pick(['\n', '\r\n']));
}

function csvFile(r: Random): string {
  const triplets = r.chance(0.4);
  const head = triplets ? ['i,j,value'] : [];
  const rows = Array.from({ length: r.int(0, 6) }, () =>
    triplets
      ? [
          r.pick(['1', '2', '0', '4294967296', '10000001', '-3', 'a']),
          r.pick(['1', '2', '0', '99999999999', '']),
          r.pick(['1', '2.5', 'NaN', '1e999', '"3"', '']),
        ].join(',')
      : Array.from({ length: r.int(0, 5) }, () =>
          r.pick(['1', '-2', '0', 'NaN', 'inf', '1e999', '"4"', ' ', 'x']),
        ).join(r.pick([',', ';', ', '])),
  );
  return [...head, ...rows].join('\n');
}

function fileName(r: Random, ext: string): string {
  return r.pick([
    `k${r.int(0, 1e6)}${ext}`,
    `k\u0000${r.int(0, 99)}${ext}`,
    `../../${r.int(0, 99)}${ext}`,
    `${r.text(r.int(0, 300), 'abcdefgh')}${ext}`,
    `${r.text(r.int(1, 20), UNICODE)}${ext}`,
    '',
    `k${r.int(0, 99)}.exe`,
    `k${r.int(0, 99)}`,
  ]);
}

interface Part {
  name: string;
  filename?: string;
  type?: string;
  content: Buffer;
}

function multipart(boundary: string, parts: Part[], close: boolean): Buffer {
  const chunks: Buffer[] = [];
  for (const p of parts) {
    const disposition =
      p.filename === undefined
        ? `form-data; name="${p.name}"`
        : `form-data; name="${p.name}"; filename="${p.filename.replace(/"/g, '%22')}"`;
    chunks.push(
      Buffer.from(
        `--${boundary}\r\nContent-Disposition: ${disposition}\r\nContent-Type: ${p.type ?? 'text/plain'}\r\n\r\n`,
        'utf8',
      ),
      p.content,
      Buffer.from('\r\n'),
    );
  }
  if (close) chunks.push(Buffer.from(`--${boundary}--\r\n`));
  return Buffer.concat(chunks);
}

function uploadCase(r: Random, t: FuzzTargets): Omit<FuzzCase, 'index'> {
  const boundary = `fuzz${r.int(0, 1e9)}`;
  const roll = r.int(0, 99);
  const path = `/api/sheets/${t.uploadSheetId}/uploads`;
  const mtx = r.chance(0.6);
  let content = Buffer.from(mtx ? matrixMarketFile(r) : csvFile(r), 'utf8');
  let kind = mtx ? 'lying-matrix-market' : 'lying-csv';
  let type = `multipart/form-data; boundary=${boundary}`;
  let overLimit = false;
  let parts: Part[] = [{ name: 'file', filename: fileName(r, mtx ? '.mtx' : '.csv'), content }];
  if (roll >= 70 && roll < 78) {
    kind = 'binary-file';
    content = Buffer.from(Array.from({ length: r.int(0, 2000) }, () => r.int(0, 255)));
    parts = [{ name: 'file', filename: fileName(r, '.mtx'), content }];
  } else if (roll >= 78 && roll < 84) {
    kind = 'cut-off-multipart';
    const whole = multipart(boundary, parts, false);
    return {
      route: 'upload',
      kind,
      method: 'POST',
      path,
      headers: { 'Content-Type': type },
      body: whole.subarray(0, r.int(0, whole.length)),
      overLimit,
    };
  } else if (roll >= 84 && roll < 89) {
    kind = 'wrong-form';
    parts = r.pick<Part[]>([
      [{ name: 'upload', filename: 'k.mtx', content }],
      [
        { name: 'file', filename: 'a.mtx', content },
        { name: 'file', filename: 'b.mtx', content },
      ],
      Array.from({ length: 14 }, (_, i) => ({ name: `f${i}`, content: Buffer.from('x') })),
      [],
    ]);
  } else if (roll >= 89 && roll < 94) {
    kind = 'wrong-content-type';
    type = r.pick([
      'multipart/form-data',
      'application/json',
      'text/plain',
      `multipart/form-data; boundary=${boundary}x`,
      'multipart/mixed; boundary=' + boundary,
    ]);
  } else if (roll >= 94) {
    kind = 'over-limit';
    overLimit = true;
    const big = t.uploadLimitBytes + r.int(1, 32 * 1024);
    parts = [
      { name: 'file', filename: `big${r.int(0, 1e6)}.mtx`, content: Buffer.alloc(big, 0x31) },
    ];
  }
  return {
    route: 'upload',
    kind,
    method: 'POST',
    path,
    headers: { 'Content-Type': type },
    body: multipart(boundary, parts, true),
    overLimit,
  };
}

function signInCase(r: Random, t: FuzzTargets): Omit<FuzzCase, 'index'> {
  const roll = r.int(0, 99);
  let kind: string;
  let text: string;
  let type = 'application/json';
  let overLimit = false;
  if (roll < 45) {
    kind = 'wrong-types';
    text = JSON.stringify(
      r.pick<() => unknown>([
        () => ({ email: 5, password: 'x' }),
        () => ({ email: t.email, password: [] }),
        () => ({ email: t.email }),
        () => ({ password: 'x' }),
        () => ({ email: null, password: null }),
        () => ({ email: { $ne: '' }, password: { $gt: '' } }),
        () => ({ email: r.text(r.int(200, 5000), ASCII), password: 'x' }),
        () => ({ email: 'not-an-address', password: 'x' }),
        () => ({ email: t.email, password: '' }),
        () => ({ email: t.email, password: 'p'.repeat(r.int(300, 100_000)) }),
        () => [t.email, 'x'],
        () => 'sign me in',
      ])(),
    );
  } else if (roll < 75) {
    kind = 'malformed-json';
    text = malformedJson(r);
  } else if (roll < 88) {
    kind = 'charset-or-type';
    type = r.pick(JSON_TYPES.slice(4));
    text = JSON.stringify({ email: t.email, password: 'wrong-password' });
  } else if (roll < 94) {
    kind = 'lone-surrogate';
    text = `{"email":"a\\ud800@example.com","password":"\\udfff"}`;
  } else if (roll < 99) {
    kind = 'over-limit';
    overLimit = true;
    text = JSON.stringify({ email: t.email, password: 'p'.repeat(t.bodyLimitBytes + 10) });
  } else {
    // A well-formed wrong guess reaches the password hash (few: argon2 is slow on purpose).
    kind = 'wrong-password';
    text = JSON.stringify({
      email: r.pick([t.email, `nobody${r.int(0, 1e6)}@example.com`]),
      password: r.text(12, ASCII),
    });
  }
  return {
    route: 'sign-in',
    kind,
    method: 'POST',
    path: '/api/auth/sign-in',
    headers: { 'Content-Type': type },
    body: Buffer.from(text, 'utf8'),
    overLimit,
  };
}

/**
 * `count` cases from `seed`, spread over the four routes (evaluations a little fewer: each one
 * runs the sheet engine in a worker). Made one at a time: the bodies past their limit are large,
 * and a run keeps only the case in flight.
 */
export function* generateFuzzCases(
  seed: number,
  count: number,
  targets: FuzzTargets,
): Generator<FuzzCase> {
  const r = new Random(seed);
  const makers: [number, (r: Random, t: FuzzTargets) => Omit<FuzzCase, 'index'>][] = [
    [0.22, evaluateCase],
    [0.3, draftCase],
    [0.26, uploadCase],
    [0.22, signInCase],
  ];
  for (let index = 0; index < count; index++) {
    let x = r.next();
    let make = makers[makers.length - 1]![1];
    for (const [share, m] of makers) {
      if (x < share) {
        make = m;
        break;
      }
      x -= share;
    }
    yield { index, ...make(r, targets) };
  }
}
