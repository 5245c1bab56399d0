/**
 * The evaluation worker: runs the sheet engine on one sheet and posts progress back on the
 * MessagePort it was handed. Loaded by piscina in a worker thread through tsx.
 */
import type { MessagePort } from 'node:worker_threads';
import { evaluateSheet, type Sheet, type SheetResults, type SheetUpload } from '../../core/index';

export interface EvaluateTask {
  sheet: Sheet;
  uploads: SheetUpload[];
  maxMatrixEntries?: number;
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

export default function evaluateTask(task: EvaluateTask): EvaluateReply {
  const { port } = task;
  // The time limit starts when the evaluation does, not while the worker was still loading.
  port?.postMessage({ type: 'start' });
  try {
    const results = evaluateSheet(task.sheet, {
      uploads: task.uploads,
      ...(task.maxMatrixEntries ? { maxMatrixEntries: task.maxMatrixEntries } : {}),
      ...(port
        ? { onProgress: (progress) => port.postMessage({ type: 'progress', progress }) }
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
