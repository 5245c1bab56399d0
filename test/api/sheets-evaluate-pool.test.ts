import { uploadsService } from '../../api/modules/uploads/uploads.service';
import { readingUploads } from '../../api/workers/sheet-runner';
import type { AddressInfo } from 'node:net';
import type { Server } from 'node:http';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createSheetsRouter } from '../../api/modules/sheets/sheets.routes';
import { createEvaluationPool, type EvaluationPool } from '../../api/workers/evaluation-pool';
import {
  createTestApp,
  mountBeforeApi,
  signedIn,
  type ApiClient,
  type TestApp,
} from '../support/api-app';
import { createProjectTeam, unique } from '../support/factories';

// Sheet evaluation through the worker pool: a client that disconnects from the event stream
// cancels the solve (the pool's own tests cover determinism across workers and the limits).

let t: TestApp;
let pool: EvaluationPool;
let server: Server;
let base: string;
let author: ApiClient;
let projectId: number;

beforeAll(async () => {
  t = await createTestApp();
  // A solve may use 0.001 % of the worker's 512 MB (5.4 kB): tiny on purpose, so that a modes
  // block of 20 DOFs is refused; the calc-only sheet below never solves.
  pool = createEvaluationPool({
    threads: 1,
    timeLimitMs: 60_000,
    memoryLimitMb: 512,
    solveMemoryShare: 1e-5,
  });
  // the app's own sheets router runs the engine in-process until createApp hands it the pool
  mountBeforeApi(
    t,
    createSheetsRouter({
      ...t.ctx,
      runner: readingUploads((ref) => uploadsService.readUpload(t.db, ref), pool.run),
    }),
  );
  const team = await createProjectTeam(t.db);
  projectId = team.project.id;
  author = await signedIn(t.app, team.author);
  server = t.app.listen(0, '127.0.0.1');
  await new Promise<void>((resolve) => server.once('listening', () => resolve()));
  base = `http://127.0.0.1:${(server.address() as AddressInfo).port}`;
});

afterAll(async () => {
  await new Promise<void>((resolve) => (server ? server.close(() => resolve()) : resolve()));
  await pool?.close();
  await t?.close();
});

async function newSheet(template: string) {
  const res = await author.post(`/api/projects/${projectId}/sheets`, {
    number: `POOL-${unique()}`,
    title: 'Pool',
    template,
  });
  expect(res.status).toBe(201);
  return res.body.sheet as { id: number; draft: { blocks: unknown[] } };
}

describe('POST /api/sheets/:sheetId/evaluate/stream on the worker pool', () => {
  it('stops the solve when the client disconnects', async () => {
    const sheet = await newSheet('four-storey-frame');
    // Slow on purpose: four products of 1500 × 1500 dense matrices (seconds to minutes).
    const blocks = [
      { id: 'first', kind: 'calc', source: 'x = 1 m' },
      { id: 'heavy', kind: 'calc', source: 'A = ones(1500, 1500)\nB = A * A * A * A * A' },
    ];
    const controller = new AbortController();
    const res = await fetch(`${base}/api/sheets/${sheet.id}/evaluate/stream`, {
      method: 'POST',
      headers: {
        'Content-Type': 'application/json',
        'X-CSRF-Token': author.csrfToken,
        Cookie: cookieOf(author),
      },
      body: JSON.stringify({ blocks, settings: { significantFigures: 4 } }),
      signal: controller.signal,
    });
    expect(res.status).toBe(200);
    expect(res.headers.get('content-type')).toContain('text/event-stream');
    const reader = res.body!.pipeThrough(new TextDecoderStream()).getReader();
    let text = '';
    // Wait until the worker reports the heavy block, then hang up.
    while (!text.includes('"blockId":"heavy"')) {
      const { value, done } = await reader.read();
      if (done) throw new Error(`stream ended early: ${text}`);
      text += value;
    }
    expect(text).toContain('event: progress');
    const hungUpAt = Date.now();
    controller.abort();
    await reader.cancel().catch(() => {});
    // Cancelled: the only worker is free again within seconds (the pool terminates it), long
    // before the products would finish.
    while (pool.stats().running > 0) {
      expect(Date.now() - hungUpAt).toBeLessThan(10_000);
      await new Promise((r) => setTimeout(r, 50));
    }
  });
});

describe('POST /api/sheets/:sheetId/evaluate on the worker pool, under its memory budget', () => {
  it('answers the modes block refusal with the estimate and limit, and the worker serves the next evaluation', async () => {
    const sheet = await newSheet('four-storey-frame');
    const list = (k: number, v: string) => Array.from({ length: k }, () => v).join(', ');
    const chain = (storeys: number) => [
      {
        id: 'model',
        kind: 'calc',
        source: `frame = storey_chain([${list(storeys, '20 t')}], [${list(storeys, '30 kN/mm')}])`,
      },
      { id: 'solve', kind: 'modes', source: 'stiffness: frame.K\nmass: frame.M\nmethod: dense' },
    ];
    // Warm the worker (a text of its own, which no stored result answers), then count the
    // threads started from here on.
    const warm = await author.post(`/api/sheets/${sheet.id}/evaluate`, {
      blocks: [{ id: 'x', kind: 'calc', source: `x = 1 m  # warm ${Date.now()}` }],
      settings: { significantFigures: 4 },
    });
    expect(warm.status).toBe(200);
    const started = pool.stats().workersStarted;
    expect(pool.stats().limits.solveMemoryBytes).toBe(Math.floor(1e-5 * 512 * 2 ** 20));

    const refused = await author.post(`/api/sheets/${sheet.id}/evaluate`, {
      blocks: chain(20),
      settings: { significantFigures: 4 },
    });
    expect(refused.status).toBe(200);
    // 5 arrays of 20 × 20 doubles = 16 kB against 0.001 % of 512 MB = 5.4 kB.
    expect(refused.body.results.errors).toEqual([
      {
        blockId: 'solve',
        blockIndex: 1,
        line: 3,
        code: 'MODEL_TOO_LARGE',
        message:
          'The model is too large for the memory this evaluation may use: the dense solve of 20 ' +
          'DOFs needs about 16 kB, more than the limit of 5 kB. Use fewer DOFs (a coarser mesh), ' +
          'a different method (lanczos or subspace, which find the lowest modes without n × n ' +
          'arrays), or raise MW_EVAL_MEMORY_MB (each evaluation worker has 512 MB, of which a ' +
          'solve may use 0.001 %).',
      },
    ]);

    // Two storeys fit (8 · 8 · 2² bytes = 256 B): the same worker answers.
    const next = await author.post(`/api/sheets/${sheet.id}/evaluate`, {
      blocks: chain(2),
      settings: { significantFigures: 4 },
    });
    expect(next.status).toBe(200);
    expect(next.body.results.errors).toEqual([]);
    expect(next.body.results.blocks[1].modes).toHaveLength(2);
    expect(pool.stats().workersStarted).toBe(started);
  });
});

/** The session cookie the supertest agent holds, for a plain fetch. */
function cookieOf(client: ApiClient): string {
  const jar = (
    client.agent as unknown as {
      jar: { getCookies(a: unknown): { name: string; value: string }[] };
    }
  ).jar;
  const cookies = jar.getCookies({
    domain: '127.0.0.1',
    path: '/',
    secure: false,
    script: false,
  });
  return cookies.map((c) => `${c.name}=${c.value}`).join('; ');
}
