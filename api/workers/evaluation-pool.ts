/**
 * The pool of worker threads that evaluates sheets, so the event loop never blocks on a solve.
 *
 * - Sized to the cores (`os.availableParallelism()`), at least one thread.
 * - A time limit per evaluation (an AbortSignal that fires `timeLimitMs` after the worker starts
 *   the evaluation, so a worker still loading mathjs does not eat the budget) and a memory limit
 *   per worker (piscina `resourceLimits`): a worker that hits either is terminated and piscina
 *   starts a fresh one; the server keeps serving.
 * - Cancellation: the caller's AbortSignal (the route aborts when the client disconnects).
 * - Progress: the worker posts SheetProgress on a MessagePort, relayed to `onProgress`.
 * - A bounded queue: when `maxQueue` evaluations wait, `run` rejects with a 429 carrying a retry
 *   hint in seconds.
 * - A memory budget for the engine: `solveMemoryShare` (default 60 %) of the worker's memory
 *   limit, or `solveMemory` when given, is handed to each evaluation, so a modes block whose solve would not fit is refused
 *   with MODEL_TOO_LARGE at its line (estimate and limit in MB) and the worker lives on, instead
 *   of being killed for running out of memory.
 * - A second task kind: `describeMatrixFile` reads an uploaded matrix file in a worker, so a
 *   large upload (seconds of parsing) never blocks the event loop. Same threads, queue and
 *   limits as the evaluations.
 *
 * Under `npm start` the worker is compiled JavaScript (dist/server/evaluate.worker.js); from
 * source (Vitest, `npm run dev`) it is TypeScript loaded with `--import tsx`.
 */
import os from 'node:os';
import { MessageChannel } from 'node:worker_threads';
import { Piscina } from 'piscina';
import {
  EngineError,
  type EngineErrorCode,
  type MatrixAnalysis,
  type Sheet,
  type SheetProgress,
  type SheetResults,
  type SheetUpload,
} from '../../core/index';
import { AppError, RateLimitedError } from '../http/errors';
import type {
  DescribeMatrixReply,
  DescribeMatrixTask,
  EvaluateReply,
  EvaluateTask,
} from './evaluate.worker';

export interface EvaluationPoolOptions {
  /** Worker threads; default the number of cores. */
  threads?: number;
  /** Time limit per evaluation, ms; default 30 000. */
  timeLimitMs?: number;
  /** Old-generation heap limit per worker, MB; default 512. */
  memoryLimitMb?: number;
  /** Evaluations that may wait for a thread; default 16. Beyond that: 429. */
  maxQueue?: number;
  /** Largest matrix value a sheet may hold (entries); default the engine's 4 000 000. */
  maxMatrixEntries?: number;
  /** Start one worker at once (default true); false starts workers on the first evaluation. */
  warm?: boolean;
  /**
   * Share of `memoryLimitMb` one modes block's solve may use (default 0.6): the rest is left for
   * the sheet's own values (matrices with units), the results and the engine's code.
   */
  solveMemoryShare?: number;
  /**
   * The budget of one solve's arrays, MB, instead of `solveMemoryShare` of the heap limit, with
   * the setting that bounds it named in the refusal's advice. A solve's factor and vectors are
   * typed arrays, whose memory lies outside the thread's heap and its limit: a worker process
   * bounds them by its resident memory instead (./job-worker.ts, solveBudgetMb).
   */
  solveMemory?: { mb: number; advice: string };
}

export interface RunOptions {
  signal?: AbortSignal;
  onProgress?: (progress: SheetProgress) => void;
  /** This evaluation's time limit, ms; default the pool's. */
  timeLimitMs?: number;
}

export interface EvaluationPool {
  /** Evaluates a sheet in a worker. Same contract as the sheets module's SheetRunner. */
  run(sheet: Sheet, uploads: SheetUpload[], options?: RunOptions): Promise<SheetResults>;
  /**
   * Reads an uploaded matrix file in a worker (core's describeMatrixText): its analysis, or the
   * engine's EngineError naming the line; a file that takes too long or too much memory is a
   * 422 MATRIX_FILE_INVALID.
   */
  describeMatrixFile(
    text: string,
    format: 'matrix-market' | 'csv',
    name: string,
  ): Promise<MatrixAnalysis>;
  stats(): {
    threads: number;
    queued: number;
    running: number;
    completed: number;
    /** Worker threads started since the pool was made (a killed worker is replaced by a new one). */
    workersStarted: number;
    /** Matrix files read in the workers, and how many are being read now. */
    describes: { completed: number; running: number };
    limits: {
      threads: number;
      timeLimitMs: number;
      memoryLimitMb: number;
      maxQueue: number;
      solveMemoryBytes: number;
    };
  };
  close(): Promise<void>;
}

/**
 * Compiled (scripts/build-server.mjs puts every bundle in dist/server/, the worker beside the
 * server) or from source through tsx (Vitest, `npm run dev`): the worker file and how to load it.
 */
const COMPILED = import.meta.url.endsWith('.js');
const WORKER_FILE = new URL(
  COMPILED ? './evaluate.worker.js' : './evaluate.worker.ts',
  import.meta.url,
).href;

/** Creates the pool. Close it when the server stops. */
export function createEvaluationPool(options: EvaluationPoolOptions = {}): EvaluationPool {
  const threads = Math.max(1, options.threads ?? os.availableParallelism());
  const timeLimitMs = options.timeLimitMs ?? 30_000;
  const memoryLimitMb = options.memoryLimitMb ?? 512;
  const maxQueue = options.maxQueue ?? 16;
  const share = options.solveMemoryShare ?? 0.6;
  if (!(share > 0 && share <= 1)) {
    throw new Error(`solveMemoryShare must lie in (0, 1], got ${share}.`);
  }
  const solveMemoryBytes = Math.floor((options.solveMemory?.mb ?? share * memoryLimitMb) * 2 ** 20);
  const memoryAdvice =
    options.solveMemory?.advice ??
    `raise MW_EVAL_MEMORY_MB (each evaluation worker has ${memoryLimitMb} MB, of which a ` +
      `solve may use ${Number((share * 100).toPrecision(3))} %)`;
  const piscina = new Piscina({
    filename: WORKER_FILE,
    minThreads: options.warm === false ? 0 : 1,
    maxThreads: threads,
    maxQueue,
    // Keep idle workers: mathjs costs ~1.5 s to load in each new thread.
    idleTimeout: 10 * 60 * 1000,
    execArgv: COMPILED ? [] : ['--import', 'tsx'],
    resourceLimits: {
      maxOldGenerationSizeMb: memoryLimitMb,
      maxYoungGenerationSizeMb: Math.max(16, Math.min(64, Math.floor(memoryLimitMb / 8))),
    },
  });
  // A worker that is terminated mid-task emits 'error' on the pool; the task's promise already
  // carries it, so the pool event needs no more than a listener.
  piscina.on('error', () => {});
  let workersStarted = 0;
  piscina.on('workerCreate', () => {
    workersStarted++;
  });
  let running = 0;
  let describing = 0;
  let described = 0;

  async function run(
    sheet: Sheet,
    uploads: SheetUpload[],
    runOptions: RunOptions = {},
  ): Promise<SheetResults> {
    if (piscina.queueSize >= maxQueue) {
      throw queueFull(timeLimitMs);
    }
    const controller = new AbortController();
    const limitMs = runOptions.timeLimitMs ?? timeLimitMs;
    let reason: 'time' | 'cancel' | null = null;
    let timer: NodeJS.Timeout | undefined;
    // The block being evaluated: a limit that stops the worker names it.
    let current: SheetProgress | null = null;
    const startClock = () => {
      timer ??= setTimeout(() => {
        reason = 'time';
        controller.abort();
      }, limitMs);
    };
    const onCancel = () => {
      reason ??= 'cancel';
      controller.abort();
    };
    if (runOptions.signal?.aborted) onCancel();
    runOptions.signal?.addEventListener('abort', onCancel, { once: true });
    const { port1, port2 } = new MessageChannel();
    // Progress travels on its own port and may arrive after the result: wait for 'done'.
    let markDone: () => void = () => {};
    const done = new Promise<void>((resolve) => (markDone = resolve));
    port1.on('message', (msg: { type: string; progress: SheetProgress }) => {
      if (msg.type === 'start') startClock();
      else if (msg.type === 'progress') {
        current = msg.progress;
        runOptions.onProgress?.(msg.progress);
      } else if (msg.type === 'done') markDone();
    });
    const task: EvaluateTask = {
      sheet,
      uploads,
      port: port2,
      memoryLimitBytes: solveMemoryBytes,
      memoryLimitAdvice: memoryAdvice,
    };
    if (options.maxMatrixEntries) task.maxMatrixEntries = options.maxMatrixEntries;
    running++;
    let reply: EvaluateReply;
    try {
      reply = (await piscina.run(task, {
        signal: controller.signal,
        transferList: [port2],
      })) as EvaluateReply;
      let grace: NodeJS.Timeout | undefined;
      await Promise.race([done, new Promise((r) => (grace = setTimeout(r, 2000)))]);
      clearTimeout(grace);
    } catch (err) {
      throw inBlock(translate(err, reason, limitMs, memoryLimitMb), current);
    } finally {
      running--;
      if (timer) clearTimeout(timer);
      runOptions.signal?.removeEventListener('abort', onCancel);
      port1.close();
    }
    if (reply.ok) return reply.results;
    const { code, message, details } = reply.error;
    throw new AppError(code === 'CANCELLED' ? 499 : 422, code, message, details ? { details } : {});
  }

  async function describeMatrixFile(
    text: string,
    format: 'matrix-market' | 'csv',
    name: string,
  ): Promise<MatrixAnalysis> {
    if (piscina.queueSize >= maxQueue) throw queueFull(timeLimitMs);
    const controller = new AbortController();
    let timedOut = false;
    const timer = setTimeout(() => {
      timedOut = true;
      controller.abort();
    }, timeLimitMs);
    const task: DescribeMatrixTask = { text, format, name };
    describing++;
    let reply: DescribeMatrixReply;
    try {
      reply = (await piscina.run(task, {
        name: 'describeMatrixTask',
        signal: controller.signal,
      })) as DescribeMatrixReply;
    } catch (err) {
      if (timedOut) {
        throw new AppError(
          422,
          'MATRIX_FILE_INVALID',
          `${name}: reading the file took longer than the ${timeLimitMs / 1000} s limit and was stopped.`,
          { field: 'file', details: { line: 0, file: name } },
        );
      }
      const e = err as { code?: string; message?: string };
      if (
        e?.code === 'ERR_WORKER_OUT_OF_MEMORY' ||
        /out of memory|heap limit/i.test(e?.message ?? '')
      ) {
        throw new AppError(
          422,
          'MATRIX_FILE_INVALID',
          `${name}: reading the file needed more than the ${memoryLimitMb} MB memory limit of an evaluation worker (MW_EVAL_MEMORY_MB).`,
          { field: 'file', details: { line: 0, file: name } },
        );
      }
      throw translate(err, null, timeLimitMs, memoryLimitMb);
    } finally {
      clearTimeout(timer);
      describing--;
    }
    described++;
    if (reply.ok) return reply.shape;
    const { code, message, details } = reply.error;
    throw new EngineError(code as EngineErrorCode, message, details);
  }

  return {
    run,
    describeMatrixFile,
    stats: () => ({
      threads: piscina.threads.length,
      queued: piscina.queueSize,
      running,
      completed: piscina.completed,
      workersStarted,
      describes: { completed: described, running: describing },
      limits: { threads, timeLimitMs, memoryLimitMb, maxQueue, solveMemoryBytes },
    }),
    close: () => piscina.destroy(),
  };
}

/**
 * A limit that stopped the worker (time, memory) names the block it was in: the message starts
 * with the block's number and kind, and the details carry its id and index.
 */
export function inBlock(err: unknown, at: SheetProgress | null): unknown {
  if (!at || !(err instanceof AppError) || err.code !== 'SHEET_LIMIT') return err;
  return new AppError(
    err.status,
    err.code,
    `Block ${at.blockIndex + 1} (${at.kind}): ${err.message}`,
    { details: { ...err.details, blockId: at.blockId, blockIndex: at.blockIndex } },
  );
}

function queueFull(timeLimitMs: number): RateLimitedError {
  const retry = Math.max(1, Math.ceil(timeLimitMs / 1000 / 4));
  return new RateLimitedError(
    `The server is evaluating as many sheets as it can queue; try again in ${retry} s.`,
    retry,
  );
}

function translate(
  err: unknown,
  reason: 'time' | 'cancel' | null,
  timeLimitMs: number,
  memoryLimitMb: number,
): unknown {
  const e = err as { name?: string; message?: string; code?: string };
  if (reason === 'time') {
    return new AppError(
      422,
      'SHEET_LIMIT',
      `The evaluation took longer than the ${timeLimitMs / 1000} s limit and was stopped. Reduce the model size or the number of modes asked for.`,
    );
  }
  if (reason === 'cancel') return new AppError(499, 'CANCELLED', 'The evaluation was cancelled.');
  if (
    e?.code === 'ERR_WORKER_OUT_OF_MEMORY' ||
    /out of memory|heap limit/i.test(e?.message ?? '')
  ) {
    return new AppError(
      422,
      'SHEET_LIMIT',
      `The evaluation needed more than the ${memoryLimitMb} MB memory limit and was stopped. Reduce the size of the matrices in the sheet.`,
    );
  }
  if (e?.message === 'Task queue is at limit') return queueFull(timeLimitMs);
  return err;
}
