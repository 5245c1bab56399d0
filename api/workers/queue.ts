/**
 * What the API processes and the worker processes agree on about the evaluation queue: its name,
 * the data of a job, the reply a worker stores, and the Redis connections. Every evaluation of a
 * sheet and every read of an uploaded matrix file is one BullMQ job on Redis; any worker process
 * on any machine that reaches the same Redis may take it.
 */
import { Redis, type RedisOptions } from 'ioredis';
import type { MatrixAnalysis, Sheet, SheetResults } from '../../core/index';

export const QUEUE_NAME = 'evaluations';

/** The Redis channel a worker listens on for "stop this job" (the job id is the message). */
export function cancelChannel(prefix: string): string {
  return `${prefix}:cancel`;
}

/** Who asked for a job: the fairness rules count jobs by person and by project. */
export interface JobOwner {
  userId: number;
  projectId: number;
  sheetId: number;
}

/**
 * A job's name carries its kind and owner (`evaluate|7|3|12`), so the fairness rules read the
 * names of the queued jobs and never their data (which holds the sheet's text).
 */
export function jobName(kind: JobData['kind'], owner?: JobOwner): string {
  return owner ? `${kind}|${owner.userId}|${owner.projectId}|${owner.sheetId}` : kind;
}

export function ownerOfName(name: string): JobOwner | null {
  const [, userId, projectId, sheetId] = name.split('|');
  if (sheetId === undefined) return null;
  return { userId: Number(userId), projectId: Number(projectId), sheetId: Number(sheetId) };
}

/**
 * An uploaded matrix file as a job names it: never its text. The worker reads the stored bytes
 * from MariaDB by `id`, inflating no more than `size` bytes, and refuses them unless their
 * SHA-256 is `sha256` (the digest the results store's key was made with).
 */
export interface UploadRef {
  id: number;
  /** The name a matrix block's `from:` gives. */
  name: string;
  /** Bytes of the file as uploaded. */
  size: number;
  /** SHA-256 of those bytes, hex. */
  sha256: string;
}

export interface EvaluateJobData {
  kind: 'evaluate';
  sheet: Sheet;
  uploads: UploadRef[];
  owner?: JobOwner;
  /** The time limit of this job, ms. */
  timeLimitMs: number;
  /**
   * The results store's key for this sheet (background evaluations): the worker keeps the
   * results under it, so that the editor's next look at the unchanged sheet needs no job.
   */
  storeAs?: string;
}

export interface DescribeJobData {
  kind: 'describe';
  text: string;
  format: 'matrix-market' | 'csv';
  name: string;
  timeLimitMs: number;
}

export type JobData = EvaluateJobData | DescribeJobData;

/** A refusal, as data: an AppError of the worker (status) or an engine error (engine: true). */
export interface JobRefusal {
  status: number;
  code: string;
  message: string;
  engine?: boolean;
  field?: string;
  details?: Record<string, unknown>;
}

export type EvaluateJobReply =
  { ok: true; results: SheetResults } | { ok: false; error: JobRefusal };
export type DescribeJobReply =
  { ok: true; shape: MatrixAnalysis } | { ok: false; error: JobRefusal };
export type JobReply = EvaluateJobReply | DescribeJobReply;

/**
 * A connection for BullMQ. Workers and event listeners block on Redis, so they retry forever
 * (`blocking`); the API's queue fails a command fast when Redis is away, so a request gets an
 * answer.
 */
export function redisConnection(url: string, blocking: boolean): Redis {
  const options: RedisOptions = blocking
    ? { maxRetriesPerRequest: null }
    : { maxRetriesPerRequest: 1, connectTimeout: 5000 };
  return new Redis(url, options);
}
