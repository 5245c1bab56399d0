import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import {
  createSheetWithDraft,
  createTeamApp,
  type ApiClient,
  type TestApp,
} from '../support/api-app';
import { asText, parseEvents } from '../support/event-stream';

// Evaluations not bound to a request: started, followed by server-sent events, found again as
// the person's latest, cancelled; only their owner follows or cancels them. Done by the test
// worker process of the global setup.

let t: TestApp;
let clients: Record<'author' | 'checker' | 'outsider', ApiClient>;
let sheetId: number;
const settings = { significantFigures: 4 };
// Two storeys, 2m and m over 2k and k (Chopra ch. 10, from memory): ω₁² = k/(2m).
const frame = [
  {
    id: 'data',
    kind: 'calc',
    source: 'frame = storey_chain([200 t, 100 t], [100 kN/mm, 50 kN/mm])',
  },
  { id: 'm', kind: 'modes', source: 'stiffness: frame.K\nmass: frame.M\ncount: 2\nname: sway' },
];

function events(client: ApiClient, jobId: string) {
  return asText(client.get(`/api/sheets/${sheetId}/evaluations/${jobId}/events`));
}

beforeAll(async () => {
  let team: { project: { id: number } };
  ({ t, team, clients } = await createTeamApp(['author', 'checker', 'outsider']));
  sheetId = (
    await createSheetWithDraft(clients.author, team.project.id, { number: 'BG-1', title: 'Bg' }, [])
  ).id;
});

afterAll(async () => {
  await t?.close();
});

describe('evaluations in the background', () => {
  it('starts one, follows it to its results and finds it again as the latest', async () => {
    const start = await clients.author.post(`/api/sheets/${sheetId}/evaluations`, {
      blocks: frame,
      settings,
    });
    expect(start.status).toBe(202);
    const jobId = start.body.job.id as string;
    const res = await events(clients.author, jobId);
    expect(res.status).toBe(200);
    const list = parseEvents(res.body as string);
    const result = list.at(-1)!;
    expect(result.event).toBe('result');
    const job = result.data as { state: string; results: { errors: unknown[] }; digests: object };
    expect(job.state).toBe('done');
    expect(job.results.errors).toEqual([]);
    expect(job.digests).toBeTruthy();

    const latest = await clients.author.get(`/api/sheets/${sheetId}/evaluations/latest`);
    expect(latest.status).toBe(200);
    expect(latest.body.job).toMatchObject({ id: jobId, state: 'done', draft: { blocks: frame } });
    // ω₁ = √(k/2m) with k = 50e6 N/m, m = 100e3 kg (the closed form of the two-storey chain);
    // relative 1e-9: the engine's default tolerance on λ is 1e-10.
    const f1 = Math.sqrt(50e6 / 200e3) / (2 * Math.PI);
    const blocks = latest.body.job.results.blocks as {
      name?: string;
      modes?: { frequency: number }[];
    }[];
    const sway = blocks.find((b) => b.name === 'sway')!.modes!;
    expect(Math.abs(sway[0]!.frequency / f1 - 1)).toBeLessThan(1e-9);
  });

  it('keeps it to its owner: another member gets 404, an outsider 403', async () => {
    const start = await clients.author.post(`/api/sheets/${sheetId}/evaluations`, {
      blocks: frame,
      settings,
    });
    const jobId = start.body.job.id as string;
    expect((await events(clients.checker, jobId)).status).toBe(404);
    expect(
      (await clients.checker.delete(`/api/sheets/${sheetId}/evaluations/${jobId}`)).status,
    ).toBe(404);
    expect((await clients.checker.get(`/api/sheets/${sheetId}/evaluations/latest`)).body.job).toBe(
      null,
    );
    const outsider = await clients.outsider.post(`/api/sheets/${sheetId}/evaluations`, {
      blocks: frame,
      settings,
    });
    expect(outsider.status).toBe(403);
    await events(clients.author, jobId);
  });

  it('cancels a running one at its owner’s request', async () => {
    const start = await clients.author.post(`/api/sheets/${sheetId}/evaluations`, {
      blocks: [{ id: 'slow', kind: 'calc', source: 'A = ones(800, 800)\nB = A * A * A * A * A' }],
      settings,
    });
    const jobId = start.body.job.id as string;
    let state = '';
    while (state !== 'running') {
      state = (await clients.author.get(`/api/sheets/${sheetId}/evaluations/latest`)).body.job
        .state;
      await new Promise((r) => setTimeout(r, 100));
    }
    expect(
      (await clients.author.delete(`/api/sheets/${sheetId}/evaluations/${jobId}`)).status,
    ).toBe(204);
    const res = await events(clients.author, jobId);
    const last = parseEvents(res.body as string).at(-1)!;
    expect(last.event).toBe('error');
    expect(last.data).toMatchObject({ error: { code: 'CANCELLED' } });
  });
});
