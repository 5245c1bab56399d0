import { afterAll, describe, expect, it } from 'vitest';
import { loadQueueConfig } from '../../api/config/index';
import { createEvaluationPool, type EvaluationPool } from '../../api/workers/evaluation-pool';
import { solveBudgetMb, WORKER_BASE_MB } from '../../api/workers/job-worker';
import type { ModesBlockResult, Sheet } from '../../core/index';
import { chainMatrixMarket, chainOmega } from '../support/chain-files';

// A solve's factor and vectors are typed arrays: their memory lies outside the evaluation
// thread's heap limit (Node's worker resourceLimits bound the JavaScript heap, not ArrayBuffers),
// so a worker process gives the solve a budget from its resident-memory limit, not from the heap.

const pools: EvaluationPool[] = [];
afterAll(async () => {
  await Promise.all(pools.map((p) => p.close()));
});

// A fixed–free chain of 200 000 masses uploaded as Matrix Market files; 10 modes by Lanczos keep
// 2 · (30 + 1) + 2 · 10 = 82 vectors of 200 000 numbers: 131 MB of arrays, beyond a 128 MB heap.
const n = 200_000;
const count = 10;
const files = chainMatrixMarket(n, 5000, 2);
const sheet = {
  blocks: [
    { id: 'k', kind: 'matrix', source: 'name: K\nunit: N/m\nfrom: K.mtx' },
    { id: 'mm', kind: 'matrix', source: 'name: M\nunit: kg\nfrom: M.mtx' },
    { id: 'm', kind: 'modes', source: `stiffness: K\nmass: M\ncount: ${count}\nname: chain` },
  ],
} as unknown as Sheet;
const uploads = [
  { name: 'K.mtx', text: files.K },
  { name: 'M.mtx', text: files.M },
];

describe("a worker's budget for a solve", () => {
  it('is what the resident limit leaves after the heap and the process, by default 512 MB', () => {
    const config = loadQueueConfig('budget_test');
    // Defaults (api/config): heap 512 MB, resident 2 · 512 + 512 = 1536 MB.
    expect(solveBudgetMb({ rssLimitMb: 1536, memoryLimitMb: 512 })).toBe(
      1536 - 512 - WORKER_BASE_MB,
    );
    expect(solveBudgetMb(config)).toBe(config.rssLimitMb - config.memoryLimitMb - WORKER_BASE_MB);
    // A resident limit set close to the heap never lowers it below 60 % of the heap.
    expect(solveBudgetMb({ rssLimitMb: 600, memoryLimitMb: 512 })).toBeCloseTo(0.6 * 512, 9);
  });

  it('lets a thread with a 128 MB heap solve with 131 MB of arrays, which 60 % of the heap refuses', async () => {
    const byHeap = createEvaluationPool({ threads: 1, timeLimitMs: 120_000, memoryLimitMb: 128 });
    const byResident = createEvaluationPool({
      threads: 1,
      timeLimitMs: 120_000,
      memoryLimitMb: 128,
      solveMemory: { mb: 256, advice: 'raise MW_WORKER_RSS_MB' },
    });
    pools.push(byHeap, byResident);

    const refused = await byHeap.run(sheet, uploads);
    const error = refused.errors.find((e) => e.blockId === 'm');
    expect(error?.code).toBe('MODEL_TOO_LARGE');

    const solved = await byResident.run(sheet, uploads);
    expect(solved.errors).toEqual([]);
    const modes = solved.blocks.find((b): b is ModesBlockResult => b.kind === 'modes')!;
    // ω_j = 2 √(k/m) sin((2j − 1)π / (2(2n + 1))), REFERENCES.md item 2; 1e-6 relative.
    expect(modes.modes).toHaveLength(count);
    for (let j = 1; j <= count; j++) {
      const omega = chainOmega(n, 5000, 2, j);
      expect(Math.abs(modes.modes[j - 1]!.omega - omega) / omega).toBeLessThan(1e-6);
    }
  }, 240_000);
});
