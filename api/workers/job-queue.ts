/**
 * The API's side of the evaluation queue: every evaluation of a sheet and every read of an
 * uploaded matrix file becomes a BullMQ job on Redis, taken by a worker process (./job-worker.ts)
 * on this or any other machine. The API process only adds jobs, relays their progress and waits
 * for their replies: it never evaluates user math nor parses an uploaded file.
 *
 * - Replies and progress arrive through BullMQ's queue events; a poll every two seconds settles
 *   any job whose event was missed (a reconnect, a job removed by another API process).
 * - A caller's AbortSignal cancels: a waiting job is removed, a running one is stopped by its
 *   worker (a message on the cancel channel).
 * - When the whole queue holds `maxQueue` jobs, a new one is refused with 429 and a retry hint;
 *   with no worker connected to Redis, with 503 naming the command that starts one.
 * - Fair shares, for evaluations with an owner (the editor's): a newer evaluation of the same
 *   sheet by the same person replaces their older one still waiting (409 SUPERSEDED to the
 *   older request); each person and each project may have only so many waiting or running
 *   (429 naming the cap); small evaluations go ahead of large solves (BullMQ priorities).
 */
import { randomUUID } from 'node:crypto';
import { Queue, QueueEvents } from 'bullmq';
import {
  EngineError,
  type EngineErrorCode,
  type MatrixAnalysis,
  type Sheet,
  type SheetProgress,
  type SheetResults,
} from '../../core/index';
import type { QueueConfig } from '../config/index';
import { AppError, RateLimitedError } from '../http/errors';
import type { Logger } from '../http/logger';
import {
  cancelChannel,
  jobName,
  ownerOfName,
  QUEUE_NAME,
  redisConnection,
  type JobOwner,
  type DescribeJobReply,
  type EvaluateJobReply,
  type JobData,
  type JobRefusal,
  type JobReply,
  type UploadRef,
} from './queue';
import type { MatrixFileDescriber, SheetRunner } from './sheet-runner';

/** An evaluation job as the editor sees it when it comes back to a sheet. */
export type EvaluationJobView = {
  id: string;
  /** The text that was evaluated. */
  sheet: Sheet;
  progress: SheetProgress | null;
} & (
  | { state: 'waiting' | 'running' }
  | { state: 'done'; results: SheetResults }
  | { state: 'failed'; error: JobRefusal }
);

/**
 * Evaluations not bound to a request (long solves): started, followed by any number of
 * requests, cancelled; closing the page does not stop them. The latest one per person and sheet
 * is remembered for a day.
 */
export interface DetachedEvaluations {
  /** Queues one; its worker keeps the results in the results store under `storeAs`. */
  start(sheet: Sheet, uploads: UploadRef[], owner: JobOwner, storeAs?: string): Promise<string>;
  latest(owner: JobOwner): Promise<EvaluationJobView | null>;
  view(jobId: string): Promise<EvaluationJobView | null>;
  /** Whether `jobId` is the latest evaluation of `owner` (only its owner follows or cancels it). */
  ownedBy(jobId: string, owner: JobOwner): Promise<boolean>;
  /** Waits until the job has its reply (view it then); throws only when it is gone or failed. */
  follow(
    jobId: string,
    options: { signal?: AbortSignal; onProgress?: (progress: SheetProgress) => void },
  ): Promise<void>;
  cancel(jobId: string): Promise<void>;
}

export interface JobQueue {
  runner: SheetRunner;
  describeMatrixFile: MatrixFileDescriber;
  evaluations: DetachedEvaluations;
  /** The BullMQ queue itself (tests and the bench read its counts). */
  queue: Queue<JobData, JobReply>;
  close(): Promise<void>;
}

/** BullMQ priorities (lower goes first): small evaluations ahead of large solves. */
export const SMALL_PRIORITY = 1;
export const LARGE_PRIORITY = 10;

interface Pending {
  settle(reply: JobReply): void;
  fail(err: unknown): void;
  onProgress?: (progress: SheetProgress) => void;
}

/** A refusal stored by a worker, thrown again here with its own class. */
export function refusalError(error: JobRefusal): Error {
  if (error.engine) {
    return new EngineError(error.code as EngineErrorCode, error.message, error.details);
  }
  return new AppError(error.status, error.code, error.message, {
    ...(error.field ? { field: error.field } : {}),
    ...(error.details ? { details: error.details } : {}),
  });
}

function cancelled(): AppError {
  return new AppError(499, 'CANCELLED', 'The evaluation was cancelled.');
}

function superseded(): AppError {
  return new AppError(
    409,
    'SUPERSEDED',
    'A newer evaluation of this sheet by you replaced this one while it was waiting.',
  );
}

/** A job that failed outside the engine: its worker was lost (twice), or crashed. */
function failedError(reason: string): AppError {
  if (/stalled/i.test(reason)) {
    return new AppError(
      503,
      'WORKER_LOST',
      'The worker evaluating this sheet stopped, and so did the one that took it over; evaluate again, or ask the administrator to look at the workers.',
    );
  }
  return new AppError(500, 'WORKER_FAILED', `The evaluation worker failed: ${reason}`);
}

export function createJobQueue(config: QueueConfig, log: Logger): JobQueue {
  const connection = redisConnection(config.redisUrl, false);
  connection.on('error', () => {});
  const queue = new Queue<JobData, JobReply>(QUEUE_NAME, { connection, prefix: config.prefix });
  queue.on('error', (e) => log.error('evaluation queue', e));
  const eventsConnection = redisConnection(config.redisUrl, true);
  const events = new QueueEvents(QUEUE_NAME, {
    connection: eventsConnection,
    prefix: config.prefix,
  });
  events.on('error', (e) => log.error('evaluation queue events', e));
  const ready = Promise.all([queue.waitUntilReady(), events.waitUntilReady()]);
  // Every caller following a job (the request that queued it, an editor that came back to it).
  const pending = new Map<string, Set<Pending>>();
  const each = (jobId: string, f: (p: Pending) => void) => {
    for (const waiter of pending.get(jobId) ?? []) f(waiter);
  };
  const latestKey = (owner: JobOwner) => `${config.prefix}:latest:${owner.userId}:${owner.sheetId}`;
  const supersededKey = (jobId: string) => `${config.prefix}:superseded:${jobId}`;

  /** Why a job is no longer in the queue: replaced by a newer one, or cancelled. */
  async function goneError(jobId: string): Promise<AppError> {
    return (await connection.exists(supersededKey(jobId))) ? superseded() : cancelled();
  }

  /** The ids and owners of the jobs waiting (`waiting`) and running (`active`). */
  async function liveJobs(): Promise<{ id: string; owner: JobOwner | null; waiting: boolean }[]> {
    const [waitingIds, activeIds] = await Promise.all([
      queue.getRanges(['waiting', 'prioritized', 'delayed'], 0, -1),
      queue.getRanges(['active'], 0, -1),
    ]);
    const ids = [...waitingIds, ...activeIds];
    if (ids.length === 0) return [];
    const names = await Promise.all(ids.map((id) => connection.hget(queue.toKey(id), 'name')));
    return ids.map((id, i) => ({
      id,
      owner: ownerOfName(names[i] ?? ''),
      waiting: i < waitingIds.length,
    }));
  }

  /**
   * The fair shares for a new evaluation by `owner`: their older waiting evaluation of the same
   * sheet is removed, then the caps per person and per project are checked.
   */
  async function applyShares(owner: JobOwner): Promise<void> {
    const live = await liveJobs();
    const older = live.filter(
      (j) => j.waiting && j.owner?.userId === owner.userId && j.owner.sheetId === owner.sheetId,
    );
    const replaced = new Set<string>();
    for (const job of older) {
      await connection.set(supersededKey(job.id), '1', 'EX', 600);
      const removed = await queue.remove(job.id).catch(() => 0);
      if (removed) replaced.add(job.id);
    }
    const counted = live.filter((j) => j.owner && !replaced.has(j.id));
    const mine = counted.filter((j) => j.owner!.userId === owner.userId).length;
    if (mine >= config.perPerson) {
      throw new RateLimitedError(
        `You already have ${mine} evaluations waiting or running (the limit per person is ${config.perPerson}); try again when one has finished.`,
        5,
      );
    }
    const project = counted.filter((j) => j.owner!.projectId === owner.projectId).length;
    if (project >= config.perProject) {
      throw new RateLimitedError(
        `This project already has ${project} evaluations waiting or running (the limit per project is ${config.perProject}); try again when one has finished.`,
        5,
      );
    }
  }

  async function settleFromStore(jobId: string): Promise<void> {
    if (!pending.has(jobId)) return;
    // The state first, then the job: a job read before it completed has no reply yet.
    const state = await queue.getJobState(jobId);
    if (state !== 'completed' && state !== 'failed' && state !== 'unknown') return;
    const job = await queue.getJob(jobId);
    if (!job || state === 'unknown') {
      const e = await goneError(jobId);
      each(jobId, (w) => w.fail(e));
      return;
    }
    if (state === 'completed') each(jobId, (w) => w.settle(job.returnvalue));
    else each(jobId, (w) => w.fail(failedError(job.failedReason)));
  }

  events.on('progress', ({ jobId, data }) => {
    each(jobId, (w) => w.onProgress?.(data as unknown as SheetProgress));
  });
  events.on('completed', ({ jobId }) => {
    settleFromStore(jobId).catch((e: unknown) => each(jobId, (w) => w.fail(e)));
  });
  events.on('failed', ({ jobId, failedReason }) => {
    each(jobId, (w) => w.fail(failedError(failedReason)));
  });
  events.on('removed', ({ jobId }) => {
    if (!pending.has(jobId)) return;
    goneError(jobId).then(
      (e) => each(jobId, (w) => w.fail(e)),
      (e: unknown) => each(jobId, (w) => w.fail(e)),
    );
  });
  const poll = setInterval(() => {
    for (const jobId of pending.keys()) {
      settleFromStore(jobId).catch(() => {});
    }
  }, 2000);
  poll.unref();

  let workersSeenAt = 0;
  async function refuseWhenUnserved(): Promise<void> {
    const counts = await queue.getJobCounts('waiting', 'prioritized', 'active', 'delayed');
    const total = Object.values(counts).reduce((a, b) => a + b, 0);
    if (total >= config.maxQueue) {
      const retry = Math.max(1, Math.ceil(config.timeLimitMs / 1000 / 4));
      throw new RateLimitedError(
        `The server is evaluating as many sheets as it can queue; try again in ${retry} s.`,
        retry,
      );
    }
    if (Date.now() - workersSeenAt < 5000) return;
    if ((await queue.getWorkersCount()) === 0) {
      throw new AppError(
        503,
        'NO_WORKERS',
        'No evaluation worker is running, so the sheet cannot be evaluated now. Start one with npm run worker (npm start starts them), then try again.',
      );
    }
    workersSeenAt = Date.now();
  }

  /** Cancels a job: removed while it waits, stopped by its worker once it runs. */
  async function cancel(jobId: string): Promise<void> {
    const job = await queue.getJob(jobId);
    if (!job) return;
    const state = await job.getState();
    if (state === 'waiting' || state === 'prioritized' || state === 'delayed') {
      await job.remove().catch(() => {});
    }
    await connection.publish(cancelChannel(config.prefix), jobId);
  }

  /** Queues a job (after the fair shares and the queue's limits) and answers its id. */
  async function enqueue(data: JobData, owner?: JobOwner): Promise<string> {
    await ready;
    if (owner) await applyShares(owner);
    await refuseWhenUnserved();
    const bytes =
      data.kind === 'describe'
        ? data.text.length
        : data.uploads.reduce((sum, u) => sum + u.size, 0);
    const priority = bytes >= config.largeBytes ? LARGE_PRIORITY : SMALL_PRIORITY;
    const jobId = randomUUID();
    await queue.add(jobName(data.kind, owner), data, {
      jobId,
      priority,
      removeOnComplete: { age: 24 * 3600, count: 500 },
      removeOnFail: { age: 24 * 3600, count: 500 },
    });
    if (owner) await connection.set(latestKey(owner), jobId, 'EX', 24 * 3600);
    return jobId;
  }

  /**
   * Follows a queued job to its reply, passing on its progress. With `cancelOnAbort`, the
   * signal cancels the job itself; without, it only stops following (the job goes on).
   */
  async function follow(
    jobId: string,
    options: {
      signal?: AbortSignal | undefined;
      onProgress?: ((progress: SheetProgress) => void) | undefined;
      cancelOnAbort?: boolean;
    },
  ): Promise<JobReply> {
    let waiter!: Pending;
    const reply = new Promise<JobReply>((resolve, reject) => {
      waiter = {
        settle: resolve,
        fail: reject,
        ...(options.onProgress ? { onProgress: options.onProgress } : {}),
      };
    });
    const set = pending.get(jobId) ?? new Set<Pending>();
    set.add(waiter);
    pending.set(jobId, set);
    const onAbort = () => {
      waiter.fail(cancelled());
      if (options.cancelOnAbort) {
        cancel(jobId).catch((e: unknown) => log.error(`cancelling job ${jobId}`, e));
      }
    };
    options.signal?.addEventListener('abort', onAbort, { once: true });
    // A job that finished before it was followed.
    settleFromStore(jobId).catch(() => {});
    try {
      return await reply;
    } finally {
      set.delete(waiter);
      if (set.size === 0) pending.delete(jobId);
      options.signal?.removeEventListener('abort', onAbort);
    }
  }

  /**
   * A job's data: the sheet and its uploads by id and digest (the worker reads their bytes from
   * MariaDB). `background` jobs (not bound to a request) have the long solve limit.
   */
  const evaluateData = (
    sheet: Sheet,
    uploads: UploadRef[],
    background: boolean,
    storeAs?: string,
  ): JobData => ({
    kind: 'evaluate',
    sheet,
    uploads,
    timeLimitMs: background ? config.solveTimeLimitMs : config.timeLimitMs,
    ...(storeAs ? { storeAs } : {}),
  });

  const runner: SheetRunner = async (sheet, uploads, options) => {
    if (options.signal?.aborted) throw cancelled();
    const jobId = await enqueue(
      evaluateData(sheet, uploads, false, options.storeAs),
      options.owner,
    );
    const reply = (await follow(jobId, { ...options, cancelOnAbort: true })) as EvaluateJobReply;
    if (!reply.ok) throw refusalError(reply.error);
    return reply.results as SheetResults;
  };

  const describeMatrixFile: MatrixFileDescriber = async (text, format, name) => {
    const jobId = await enqueue({
      kind: 'describe',
      text,
      format,
      name,
      timeLimitMs: config.timeLimitMs,
    });
    const reply = (await follow(jobId, {})) as DescribeJobReply;
    if (!reply.ok) throw refusalError(reply.error);
    return reply.shape as MatrixAnalysis;
  };

  /** A job as the editor sees it. */
  async function view(jobId: string): Promise<EvaluationJobView | null> {
    const state = await queue.getJobState(jobId);
    const job = await queue.getJob(jobId);
    if (!job || job.data.kind !== 'evaluate') return null;
    const base = {
      id: jobId,
      sheet: job.data.sheet,
      progress:
        typeof job.progress === 'object' ? (job.progress as unknown as SheetProgress) : null,
    };
    if (state === 'completed') {
      const reply = job.returnvalue as EvaluateJobReply;
      return reply.ok
        ? { ...base, state: 'done', results: reply.results }
        : { ...base, state: 'failed', error: reply.error };
    }
    if (state === 'failed') {
      const e = failedError(job.failedReason);
      return {
        ...base,
        state: 'failed',
        error: { status: e.status, code: e.code, message: e.message },
      };
    }
    return { ...base, state: state === 'active' ? 'running' : 'waiting' };
  }

  const evaluations: DetachedEvaluations = {
    start: (sheet, uploads, owner, storeAs) =>
      enqueue(evaluateData(sheet, uploads, true, storeAs), owner),
    latest: async (owner) => {
      const jobId = await connection.get(latestKey(owner));
      return jobId ? view(jobId) : null;
    },
    view,
    ownedBy: async (jobId, owner) => (await connection.get(latestKey(owner))) === jobId,
    follow: async (jobId, options) => {
      await follow(jobId, options);
    },
    cancel,
  };

  return {
    runner,
    describeMatrixFile,
    evaluations,
    queue,
    close: async () => {
      clearInterval(poll);
      for (const jobId of pending.keys()) {
        each(jobId, (w) => w.fail(new AppError(503, 'SHUTTING_DOWN', 'The server is stopping.')));
      }
      await events.close();
      await queue.close();
      eventsConnection.disconnect();
      connection.disconnect();
    },
  };
}
