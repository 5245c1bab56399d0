/**
 * One worker process (`npm run worker`): takes evaluation jobs from the queue on Redis, one at a
 * time, and runs each in its own evaluation thread (./evaluation-pool.ts, one thread) so that
 * this process's event loop stays free to keep the job's lock, pass progress on and hear a cancel.
 *
 * The limits, from the first to the last line of defence:
 * - the engine's own budgets (entries, solve memory) refuse a block before it allocates;
 * - the job's time limit and the thread's heap limit stop the thread, and the job fails with a
 *   message naming the block it was in;
 * - an RSS watchdog: when this whole process's resident memory passes MW_WORKER_RSS_MB, the job
 *   is stopped the same way, and the process exits if the memory does not come back (the
 *   supervisor of `npm start`, or any other, starts a new one).
 * A worker that dies mid-job (kill -9, a machine lost) leaves the job to BullMQ's stalled-job
 * check: another worker takes it again.
 *
 * A job carries the sheet's text and names its uploads by id, size and SHA-256 (no file travels
 * through Redis): the worker reads the bytes from MariaDB through its `JobStore`, inflates no
 * more than the size named, and refuses bytes whose digest differs. The engine's own limits on a
 * file (its size line against the entries actually in it) then apply in the evaluation thread.
 * A background evaluation's results are kept in the results store by the worker that made them.
 */
import { hostname } from 'node:os';
import { Worker, type Job } from 'bullmq';
import {
  EngineError,
  isEngineError,
  type MatrixAnalysis,
  type Sheet,
  type SheetProgress,
  type SheetResults,
} from '../../core/index';
import { loadDbConfig, loadQueueConfig, type QueueConfig } from '../config/index';
import { AppError } from '../http/errors';
import { createLogger, type Logger } from '../http/logger';
import { createEvaluationPool, inBlock } from './evaluation-pool';
import type { UploadReader } from './sheet-runner';
import {
  cancelChannel,
  QUEUE_NAME,
  redisConnection,
  type JobData,
  type JobRefusal,
  type JobReply,
} from './queue';

export interface JobWorker {
  close(): Promise<void>;
}

/** What a worker reads and writes in MariaDB (composed in api/worker-context.ts). */
export interface JobStore {
  /** An upload's text, read by id and checked against the size and digest the job names. */
  readUpload: UploadReader;
  /** Keeps a sheet's results in the results store under `digest` (when the store takes them). */
  keepResults(digest: string, sheet: Sheet, results: SheetResults): Promise<void>;
  close(): Promise<void>;
}

interface Active {
  controller: AbortController;
  /** Why it was stopped from outside the engine. */
  stoppedBy: 'cancel' | 'memory' | null;
  last: SheetProgress | null;
}

function refusalOf(err: unknown): JobRefusal {
  if (err instanceof AppError) {
    return {
      status: err.status,
      code: err.code,
      message: err.message,
      ...(err.field ? { field: err.field } : {}),
      ...(err.details ? { details: err.details } : {}),
    };
  }
  if (isEngineError(err) || err instanceof EngineError) {
    const e = err as EngineError;
    return {
      status: 422,
      code: e.code,
      message: e.message,
      engine: true,
      ...(e.details ? { details: e.details as Record<string, unknown> } : {}),
    };
  }
  throw err;
}

/**
 * Resident memory a worker process holds besides one solve's arrays and its evaluation thread's
 * heap: Node, the engine loaded in two isolates, the job's uploads read from MariaDB (385–440 MB measured
 * after the first evaluation, `npm run bench -- --sheets`), rounded up.
 */
export const WORKER_BASE_MB = 512;

/**
 * The budget of one solve's arrays in a worker process, MB. The factor of K − σM and the
 * iteration vectors are typed arrays, outside the evaluation thread's heap limit
 * (MW_EVAL_MEMORY_MB bounds JavaScript objects only); what bounds them is the process's resident
 * memory (MW_WORKER_RSS_MB). So a solve may use what the resident limit leaves after the thread's
 * full heap and the process's own base, and never less than the 60 % of the heap it had before.
 * @example solveBudgetMb({ rssLimitMb: 1536, memoryLimitMb: 512 }) // 512
 */
export function solveBudgetMb(config: Pick<QueueConfig, 'rssLimitMb' | 'memoryLimitMb'>): number {
  return Math.max(
    0.6 * config.memoryLimitMb,
    config.rssLimitMb - config.memoryLimitMb - WORKER_BASE_MB,
  );
}

/** Starts taking jobs, reading uploads and keeping results through `store`. */
export async function startJobWorker(
  config: QueueConfig,
  log: Logger,
  store: JobStore,
): Promise<JobWorker> {
  const pool = createEvaluationPool({
    threads: 1,
    timeLimitMs: config.timeLimitMs,
    memoryLimitMb: config.memoryLimitMb,
    maxQueue: 4,
    solveMemory: {
      mb: solveBudgetMb(config),
      advice:
        `raise MW_WORKER_RSS_MB (a worker process may hold ${config.rssLimitMb} MB; a solve's ` +
        `arrays may use ${Math.round(solveBudgetMb(config))} MB of it, after the ` +
        `${config.memoryLimitMb} MB heap of its evaluation thread and ${WORKER_BASE_MB} MB for the process)`,
    },
  });
  const active = new Map<string, Active>();

  const subscriber = redisConnection(config.redisUrl, true);
  await subscriber.subscribe(cancelChannel(config.prefix));
  subscriber.on('message', (_channel: string, jobId: string) => {
    const job = active.get(jobId);
    if (job) {
      job.stoppedBy ??= 'cancel';
      job.controller.abort();
    }
  });

  const rssLimit = config.rssLimitMb * 2 ** 20;
  let rssTripped = false;
  const watchdog = setInterval(() => {
    if (process.memoryUsage.rss() <= rssLimit) return;
    if (active.size === 0) {
      if (rssTripped) {
        log.error(
          `worker ${process.pid}: resident memory stays above ${config.rssLimitMb} MB; exiting`,
        );
        process.exit(1);
      }
      return;
    }
    rssTripped = true;
    for (const job of active.values()) {
      job.stoppedBy ??= 'memory';
      job.controller.abort();
    }
  }, 250);
  watchdog.unref();

  const processor = async (job: Job<JobData, JobReply>): Promise<JobReply> => {
    const data = job.data;
    if (data.kind === 'describe') {
      try {
        const shape: MatrixAnalysis = await pool.describeMatrixFile(
          data.text,
          data.format,
          data.name,
        );
        return { ok: true, shape };
      } catch (err) {
        return { ok: false, error: refusalOf(err) };
      }
    }
    const state: Active = { controller: new AbortController(), stoppedBy: null, last: null };
    active.set(job.id!, state);
    try {
      const uploads = await Promise.all(data.uploads.map((ref) => store.readUpload(ref)));
      const results = await pool.run(data.sheet, uploads, {
        signal: state.controller.signal,
        timeLimitMs: data.timeLimitMs,
        onProgress: (progress) => {
          state.last = progress;
          void job.updateProgress(progress as unknown as object).catch(() => {});
        },
      });
      if (data.storeAs) {
        // The results are the job's reply whatever becomes of the store.
        await store
          .keepResults(data.storeAs, data.sheet, results)
          .catch((e: unknown) => log.error(`keeping the results of job ${job.id}`, e));
      }
      return { ok: true, results };
    } catch (err) {
      if (state.stoppedBy === 'memory') {
        const limit = new AppError(
          422,
          'SHEET_LIMIT',
          `The evaluation made its worker pass the ${config.rssLimitMb} MB memory limit of a worker process (MW_WORKER_RSS_MB) and was stopped. Reduce the size of the matrices in the sheet.`,
        );
        return { ok: false, error: refusalOf(inBlock(limit, state.last)) };
      }
      return { ok: false, error: refusalOf(err) };
    } finally {
      active.delete(job.id!);
    }
  };

  const worker = new Worker<JobData, JobReply>(QUEUE_NAME, processor, {
    connection: redisConnection(config.redisUrl, true),
    prefix: config.prefix,
    // Named so that a job says which process on which machine took it.
    name: `${hostname()}:${process.pid}`,
    concurrency: 1,
    stalledInterval: config.stalledIntervalMs,
    lockDuration: config.stalledIntervalMs,
    maxStalledCount: 1,
  });
  worker.on('error', (e) => log.error('queue worker', e));
  await worker.waitUntilReady();

  return {
    close: async () => {
      clearInterval(watchdog);
      await worker.close(true);
      await pool.close();
      subscriber.disconnect();
    },
  };
}

/**
 * A store loaded on the first job that needs it (a job naming an upload, a background result):
 * the database driver and the resources it reads through cost a worker nothing until then.
 */
function lazyStore(load: () => Promise<JobStore>): JobStore {
  let loaded: Promise<JobStore> | null = null;
  const get = () => (loaded ??= load());
  return {
    readUpload: async (ref) => (await get()).readUpload(ref),
    keepResults: async (digest, sheet, results) =>
      (await get()).keepResults(digest, sheet, results),
    close: async () => {
      if (loaded) await (await loaded).close();
    },
  };
}

/** `npm run worker`: one worker process until SIGINT/SIGTERM (or its supervisor goes away). */
async function main(): Promise<void> {
  const log = createLogger(true);
  const config = loadQueueConfig();
  // The worker process's composition root (as server.ts is the API's): its MariaDB access.
  const store = lazyStore(async () =>
    (await import('../worker-context')).createWorkerStore(loadDbConfig()),
  );
  const worker = await startJobWorker(config, log, store);
  process.stdout.write(
    `Modewright worker ${process.pid} taking jobs from ${config.redisUrl} (queue ${config.prefix})\n`,
  );
  let stopping = false;
  const stop = () => {
    if (stopping) return;
    stopping = true;
    worker
      .close()
      .then(() => store.close())
      .then(
        () => process.exit(0),
        () => process.exit(1),
      );
  };
  process.on('SIGINT', stop);
  process.on('SIGTERM', stop);
  // Forked by the supervisor of `npm start`: go when it goes.
  if (process.send) process.on('disconnect', stop);
}

const isEntry = process.argv[1] !== undefined && /job-worker\.(ts|js)$/.test(process.argv[1]);
if (isEntry) {
  main().catch((e: unknown) => {
    process.stderr.write(
      `Modewright worker could not start: ${e instanceof Error ? e.message : String(e)}\n`,
    );
    process.exit(1);
  });
}
