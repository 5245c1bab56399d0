import http from 'node:http';
import type { AddressInfo } from 'node:net';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { AppOptions } from '../../api/app';
import { createTeamApp, type TestApp } from '../support/api-app';
import { unique } from '../support/factories';
import { CURRENT_VERSION, generateFuzzCases, type FuzzCase } from '../support/fuzz/generate';

// The fuzz suite: seeded hostile inputs (test/support/fuzz/) against the sheet evaluate route,
// the draft save, uploads and sign-in, over real HTTP to the app in this process. Every answer
// must be below 500 and, when it is an error, in the one error shape naming its place; a body
// past its size limit must be refused with 413; the server must still answer afterwards. The
// figures (inputs, time, worst latency) are printed, not asserted (speed is npm run bench's).

const SEED = Number(process.env.MW_FUZZ_SEED ?? 20261203);
const COUNT = Number(process.env.MW_FUZZ_CASES ?? 3000);
const IN_FLIGHT = 6;
/** Replays only these cases (MW_FUZZ_ONLY=12,345), e.g. the ones a failure names. */
const ONLY = process.env.MW_FUZZ_ONLY
  ? new Set(process.env.MW_FUZZ_ONLY.split(',').map(Number))
  : null;
const UPLOAD_LIMIT = 256 * 1024;

let t: TestApp;
let server: http.Server;
let base = '';
let author = { cookie: '', csrf: '' };
let stranger = { cookie: '', csrf: '' };
let sheetId = 0;
let uploadSheetId = 0;
let draftVersion = 1;

interface Session {
  cookie: string;
  csrf: string;
}

function cookieOf(res: Response, previous = ''): string {
  const set = res.headers.getSetCookie().map((c) => c.split(';')[0]);
  return set.length > 0 ? set.join('; ') : previous;
}

async function session(email?: string, password?: string): Promise<Session> {
  const first = await fetch(`${base}/api/auth/csrf`);
  const s = {
    cookie: cookieOf(first),
    csrf: ((await first.json()) as { csrfToken: string }).csrfToken,
  };
  if (!email) return s;
  const res = await fetch(`${base}/api/auth/sign-in`, {
    method: 'POST',
    headers: { 'Content-Type': 'application/json', Cookie: s.cookie, 'X-CSRF-Token': s.csrf },
    body: JSON.stringify({ email, password }),
  });
  expect(res.status).toBe(200);
  return {
    cookie: cookieOf(res, s.cookie),
    csrf: ((await res.json()) as { csrfToken: string }).csrfToken,
  };
}

async function call(
  s: Session,
  method: string,
  path: string,
  headers: Record<string, string>,
  body?: Buffer,
): Promise<{ status: number; text: string; ms: number }> {
  const started = performance.now();
  const res = await fetch(`${base}${path}`, {
    method,
    headers: { ...headers, Cookie: s.cookie, 'X-CSRF-Token': s.csrf },
    ...(body ? { body: new Uint8Array(body) } : {}),
  });
  const text = await res.text();
  return { status: res.status, text, ms: performance.now() - started };
}

const json = { 'Content-Type': 'application/json' };
const evalBody = (source: string) =>
  Buffer.from(JSON.stringify({ blocks: [{ id: 'c', kind: 'calc', source }] }));

beforeAll(async () => {
  let team;
  ({ t, team } = await createTeamApp([], {
    signinLimit: 1_000_000,
    signinAddressLimit: 1_000_000,
    uploadLimitBytes: UPLOAD_LIMIT,
  } as AppOptions));
  server = http.createServer(t.app);
  await new Promise<void>((resolve) => server.listen(0, '127.0.0.1', resolve));
  base = `http://127.0.0.1:${(server.address() as AddressInfo).port}`;
  author = await session(team.author.email, team.author.password);
  stranger = await session();
  const make = async (title: string) => {
    const res = await call(
      author,
      'POST',
      `/api/projects/${team.project.id}/sheets`,
      {
        'Content-Type': 'application/json',
      },
      Buffer.from(JSON.stringify({ number: `FZ-${unique()}`, title })),
    );
    expect(res.status).toBe(201);
    return (JSON.parse(res.text) as { sheet: { id: number; draftVersion: number } }).sheet;
  };
  const sheet = await make('Fuzz target');
  sheetId = sheet.id;
  draftVersion = sheet.draftVersion;
  uploadSheetId = (await make('Fuzz uploads')).id;
  // Start the evaluation workers (one per core) before the clock: their start-up is not a fuzz
  // input's latency.
  const warm = await Promise.all(
    [1, 2].map(() =>
      call(author, 'POST', `/api/sheets/${sheetId}/evaluate`, json, evalBody('x = 1')),
    ),
  );
  expect(warm.map((w) => w.status)).toEqual([200, 200]);
}, 120_000);

afterAll(async () => {
  await new Promise((resolve) => server?.close(resolve));
  await t?.close();
});

/** An error names its place: a field, a line, or words that say which part of the request. */
function namesPlace(error: {
  field?: unknown;
  message: string;
  details?: { line?: unknown };
}): boolean {
  if (typeof error.field === 'string' && error.field !== '') return true;
  if (typeof error.details?.line === 'number') return true;
  return /\bline \d+|\bblock\b|request body|JSON|UTF-8|If-Match|multipart|form field|\bfile\b|e-mail|password|draft|sheet/i.test(
    error.message,
  );
}

/** What a run keeps of a case: never its body, which may be a megabyte. */
interface Seen {
  index: number;
  route: FuzzCase['route'];
  kind: string;
}

interface Failure extends Seen {
  status: number;
  why: string;
  body: string;
  answer: string;
}

function check(c: FuzzCase, status: number, text: string): string | null {
  if (status >= 500) return 'a 5xx answer';
  if (c.overLimit && status !== 413) return 'a body past its limit was not refused with 413';
  let body: unknown;
  try {
    body = JSON.parse(text);
  } catch {
    return 'an answer that is not JSON';
  }
  if (status >= 400) {
    const error = (body as { error?: { code?: unknown; message?: unknown } }).error;
    if (typeof error?.code !== 'string' || typeof error.message !== 'string') {
      return 'an error not in the one error shape';
    }
    if (status === 429) return null;
    if (!namesPlace(error as { message: string })) return 'an error that does not name its place';
    return null;
  }
  if (c.route === 'evaluate') {
    const errors = (body as { results?: { errors?: unknown[] } }).results?.errors ?? [];
    for (const e of errors as { blockId?: unknown; line?: unknown; message?: unknown }[]) {
      if (
        typeof e.blockId !== 'string' ||
        typeof e.line !== 'number' ||
        typeof e.message !== 'string'
      ) {
        return 'a sheet error without its block and line';
      }
    }
  }
  if (c.route === 'draft') {
    const v = (body as { draftVersion?: unknown }).draftVersion;
    if (typeof v === 'number') draftVersion = Math.max(draftVersion, v);
  }
  return null;
}

describe('fuzz: evaluate, draft, upload and sign-in routes', () => {
  it(`answers ${COUNT} seeded hostile inputs without a 5xx, each error naming its place`, async () => {
    const cases = generateFuzzCases(SEED, COUNT, {
      sheetId,
      uploadSheetId,
      bodyLimitBytes: t.config.bodyLimitBytes,
      uploadLimitBytes: UPLOAD_LIMIT,
      email: 'nobody@example.com',
    });
    const failures: Failure[] = [];
    const latencies: { ms: number; c: Seen }[] = [];
    const statuses = new Map<number, number>();
    const byRoute = new Map<string, number>();
    const started = performance.now();
    const lane = async () => {
      // The lanes share one generator: each takes the next case as it is made.
      for (const c of cases) {
        if (ONLY && !ONLY.has(c.index)) continue;
        const seen: Seen = { index: c.index, route: c.route, kind: c.kind };
        if (process.env.MW_FUZZ_TRACE) {
          (await import('node:fs')).appendFileSync(
            process.env.MW_FUZZ_TRACE,
            `${c.index} ${c.route} ${c.kind} ${c.body.subarray(0, 150).toString('utf8').replace(/\n/g, '\\n')}\n`,
          );
        }
        byRoute.set(c.route, (byRoute.get(c.route) ?? 0) + 1);
        const headers = { ...c.headers };
        if (headers['If-Match'] === CURRENT_VERSION) headers['If-Match'] = `"${draftVersion}"`;
        const who = c.route === 'sign-in' ? stranger : author;
        const res = await call(who, c.method, c.path, headers, c.body);
        latencies.push({ ms: res.ms, c: seen });
        statuses.set(res.status, (statuses.get(res.status) ?? 0) + 1);
        const why = check(c, res.status, res.text);
        if (why) {
          const body = c.body.subarray(0, 200).toString('utf8');
          failures.push({ ...seen, status: res.status, why, body, answer: res.text.slice(0, 300) });
        }
      }
    };
    await Promise.all(Array.from({ length: IN_FLIGHT }, lane));
    const seconds = (performance.now() - started) / 1000;

    latencies.sort((a, b) => b.ms - a.ms);
    if (process.env.MW_FUZZ_TRACE) {
      const slow = latencies
        .slice(0, 15)
        .map((l) => `${l.ms.toFixed(0)} ms ${l.c.index} ${l.c.kind}`);
      (await import('node:fs')).appendFileSync(
        process.env.MW_FUZZ_TRACE,
        `SLOWEST\n${slow.join('\n')}\n`,
      );
    }
    const worst = latencies[0]!;
    const median = latencies[Math.floor(latencies.length / 2)]!.ms;
    console.log(
      [
        `fuzz seed ${SEED}: ${latencies.length} inputs in ${seconds.toFixed(1)} s (${IN_FLIGHT} in flight)`,
        `  routes: ${[...byRoute].map(([r, n]) => `${r} ${n}`).join(', ')}`,
        `  statuses: ${[...statuses]
          .sort((a, b) => a[0] - b[0])
          .map(([s, n]) => `${s}×${n}`)
          .join(', ')}`,
        `  latency: median ${median.toFixed(0)} ms, worst ${worst.ms.toFixed(0)} ms (${worst.c.route}, ${worst.c.kind}, case ${worst.c.index})`,
      ].join('\n'),
    );
    // One example of each kind of failure, so a run names every distinct fault.
    const distinct = new Map<string, Failure>();
    for (const f of failures) {
      const key = `${f.route}|${f.why}|${f.status}|${f.answer.slice(0, 60)}`;
      if (!distinct.has(key)) distinct.set(key, f);
    }
    expect([...distinct.values()].slice(0, 20), `${failures.length} failing cases`).toEqual([]);

    // Still up, and still right: the author is signed in and a sheet evaluates.
    const me = await call(author, 'GET', '/api/auth/me', {});
    expect(me.status).toBe(200);
    const ok = await call(
      author,
      'POST',
      `/api/sheets/${sheetId}/evaluate`,
      json,
      evalBody('x = 2 * 3'),
    );
    expect(ok.status).toBe(200);
    expect(JSON.parse(ok.text).results.errors).toEqual([]);
  }, 240_000);
});
