// The evaluation queue, timed: two worker processes (the entry of `npm run worker`) on the
// project's Redis under a queue prefix of their own, and this process as the API side
// (createJobQueue). Latency: the three demo sheets (the templates the demo sheets start from)
// evaluated through the queue one after another, p50 and p95 of `runs` each after one warm-up.
// Throughput: 200 small evaluations queued at once, taken by the two workers.
import { spawn, type ChildProcess } from 'node:child_process';
import { performance } from 'node:perf_hooks';
import { loadQueueConfig } from '../../api/config/index';
import { createLogger } from '../../api/http/logger';
import { draftFromTemplate } from '../../api/modules/sheets/sheets.templates';
import { createJobQueue } from '../../api/workers/job-queue';
import type { Sheet } from '../../core/index';

const TEMPLATES = ['footbridge', 'four-storey-frame', 'pump-foundation'] as const;

function quantile(sorted: number[], q: number): number {
  const i = Math.min(sorted.length - 1, Math.ceil(q * sorted.length) - 1);
  return sorted[Math.max(0, i)]!;
}

/** Starts one worker process (the entry of `npm run worker`) and answers it once it takes jobs. */
export function startWorker(env: NodeJS.ProcessEnv): Promise<ChildProcess> {
  const child = spawn(process.execPath, ['--import', 'tsx', 'api/workers/job-worker.ts'], {
    env: { ...process.env, ...env },
    stdio: ['ignore', 'pipe', 'pipe'],
  });
  let text = '';
  return new Promise((resolve, reject) => {
    child.stdout!.on('data', (chunk: Buffer) => {
      text += chunk.toString();
      if (text.includes('taking jobs')) resolve(child);
    });
    child.stderr!.on('data', (chunk: Buffer) => (text += chunk.toString()));
    child.once('exit', (code) => reject(new Error(`a worker exited (code ${code}): ${text}`)));
  });
}

/** Runs the queue bench and answers its Markdown section. */
export async function benchQueue(runs: number): Promise<string[]> {
  const prefix = `mw:bench-${process.pid}-${Date.now()}`;
  const workers = await Promise.all([
    startWorker({ MW_QUEUE_PREFIX: prefix }),
    startWorker({ MW_QUEUE_PREFIX: prefix }),
  ]);
  const config = { ...loadQueueConfig('modewright_bench'), prefix, maxQueue: 1000 };
  const jobs = createJobQueue(config, createLogger(false));
  const rows: string[] = [];
  try {
    for (const key of TEMPLATES) {
      const sheet = draftFromTemplate(key) as unknown as Sheet;
      await jobs.runner(sheet, [], {});
      const times: number[] = [];
      for (let i = 0; i < runs; i++) {
        const t0 = performance.now();
        const results = await jobs.runner(sheet, [], {});
        times.push(performance.now() - t0);
        if (results.errors.length > 0) {
          throw new Error(`the ${key} sheet has errors: ${JSON.stringify(results.errors)}`);
        }
      }
      times.sort((a, b) => a - b);
      rows.push(
        `| ${key} | ${sheet.blocks.length} | ${runs} | ${quantile(times, 0.5).toFixed(0)} | ${quantile(times, 0.95).toFixed(0)} |`,
      );
      console.log(rows.at(-1));
    }
    const small = (i: number) =>
      ({
        blocks: [{ id: 'c', kind: 'calc', source: `x = ${i} m\ny = 2 x` }],
        settings: { significantFigures: 4 },
      }) as unknown as Sheet;
    const count = 200;
    const t0 = performance.now();
    await Promise.all(Array.from({ length: count }, (_, i) => jobs.runner(small(i), [], {})));
    const seconds = (performance.now() - t0) / 1000;
    const done = await jobs.queue.getJobs(['completed'], 0, -1);
    const byWorker = new Map<string, number>();
    for (const job of done.slice(0, count)) {
      const who = job.processedBy ?? '?';
      byWorker.set(who, (byWorker.get(who) ?? 0) + 1);
    }
    return [
      '## The evaluation queue',
      '',
      `Two worker processes (\`api/workers/job-worker.ts\`, as \`npm run worker\` runs it) on Redis ${config.redisUrl}; this process adds the jobs and waits for their replies as an API process does (createJobQueue). Wall time from adding a job to having its results, one sheet at a time, after one warm-up run each.`,
      '',
      '| demo sheet | blocks | runs | p50 ms | p95 ms |',
      '|---|---|---|---|---|',
      ...rows,
      '',
      `Throughput: ${count} small evaluations (two calculation lines each) queued at once took ${seconds.toFixed(2)} s with 2 workers: ${(count / seconds).toFixed(0)} evaluations/s (split between the workers: ${[...byWorker.values()].join(' and ')}).`,
      '',
    ];
  } finally {
    await jobs.queue.obliterate({ force: true }).catch(() => {});
    await jobs.close();
    for (const w of workers) w.kill('SIGTERM');
  }
}
