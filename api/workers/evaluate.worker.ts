/**
 * The evaluation worker: runs the sheet engine on one sheet and posts progress back on the
 * MessagePort it was handed, sharing dense eigensolves with its own helper threads (a
 * DenseTeam). Loaded by piscina in a worker thread through tsx. A second task,
 * `describeMatrixTask`, reads an uploaded matrix file off the API's main thread.
 */
import { availableParallelism } from 'node:os';
import type { MessagePort } from 'node:worker_threads';
import {
  DENSE_PARTS,
  describeMatrixText,
  evaluateSheet,
  type MatrixAnalysis,
  type Sheet,
  type SheetResults,
  type SheetUpload,
} from '../../core/index';
import { createDenseTeam, type ThreadTeam } from './dense-team';
import { createLogger } from '../http/logger';

export interface EvaluateTask {
  sheet: Sheet;
  uploads: SheetUpload[];
  maxMatrixEntries?: number;
  /** Memory one modes block's solve may use (a share of the worker's limit), bytes. */
  memoryLimitBytes?: number;
  /** How to raise it, for the refusal's message. */
  memoryLimitAdvice?: string;
  /** Progress messages ({ type: 'progress', progress }) go here. */
  port?: MessagePort;
}

/** Typed engine errors lose their class crossing threads: they travel as data. */
export type EvaluateReply =
  | { ok: true; results: SheetResults }
  | { ok: false; error: { code: string; message: string; details?: Record<string, unknown> } };

interface EngineErrorLike {
  name: string;
  code: string;
  message: string;
  details?: Record<string, unknown>;
}

function isEngineError(e: unknown): e is EngineErrorLike {
  return (
    e instanceof Error &&
    (e.name === 'EngineError' || e.name === 'NoConvergenceError') &&
    typeof (e as { code?: unknown }).code === 'string'
  );
}

/**
 * This worker's threads for the dense eigensolver (./dense-team.ts): one per core up to the
 * solver's parts, started with the worker. Null when they cannot start: solves then run on this
 * thread alone, with the same results.
 */
const denseTeam: Promise<ThreadTeam | null> = createDenseTeam(
  Math.min(availableParallelism(), DENSE_PARTS) - 1,
).catch((err: unknown) => {
  createLogger(true).error('dense solver threads unavailable; solving on one thread', err);
  return null;
});

export default async function evaluateTask(task: EvaluateTask): Promise<EvaluateReply> {
  const { port } = task;
  const team = await denseTeam;
  // The time limit starts when the evaluation does, not while the worker was still loading.
  port?.postMessage({ type: 'start' });
  try {
    const results = evaluateSheet(task.sheet, {
      ...(team ? { denseTeam: team } : {}),
      uploads: task.uploads,
      ...(task.maxMatrixEntries ? { maxMatrixEntries: task.maxMatrixEntries } : {}),
      ...(task.memoryLimitBytes ? { memoryLimitBytes: task.memoryLimitBytes } : {}),
      ...(task.memoryLimitAdvice ? { memoryLimitAdvice: task.memoryLimitAdvice } : {}),
      ...(port
        ? {
            onProgress: (progress) => port.postMessage({ type: 'progress', progress }),
            now: () => Date.now(),
          }
        : {}),
    });
    return { ok: true, results };
  } catch (err) {
    if (isEngineError(err)) {
      return {
        ok: false,
        error: {
          code: err.code,
          message: err.message,
          ...(err.details ? { details: err.details } : {}),
        },
      };
    }
    throw err;
  } finally {
    // Messages on one port keep their order: 'done' tells the pool every progress event is in.
    port?.postMessage({ type: 'done' });
    port?.close();
  }
}

/** An uploaded file to describe: its text (decoded on the main thread), format and name. */
export interface DescribeMatrixTask {
  text: string;
  format: 'matrix-market' | 'csv';
  name: string;
}

/** The analysis, or the engine's refusal as data (EngineError loses its class crossing threads). */
export type DescribeMatrixReply =
  | { ok: true; shape: MatrixAnalysis }
  | { ok: false; error: { code: string; message: string; details?: Record<string, unknown> } };

/** Reads a matrix file with the engine's readers (core's describeMatrixText), in the worker. */
export function describeMatrixTask(task: DescribeMatrixTask): DescribeMatrixReply {
  try {
    return { ok: true, shape: describeMatrixText(task.text, task.format, task.name) };
  } catch (err) {
    if (isEngineError(err)) {
      return {
        ok: false,
        error: {
          code: err.code,
          message: err.message,
          ...(err.details ? { details: err.details } : {}),
        },
      };
    }
    throw err;
  }
}
