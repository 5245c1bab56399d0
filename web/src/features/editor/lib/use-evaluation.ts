import { useCallback, useEffect, useRef, useState } from 'react';
import { isApiError } from '../../../lib/api-client';
import {
  cancelEvaluation,
  followEvaluation,
  latestEvaluation,
  startEvaluation,
  type EvaluationProgress,
  type EvaluationJob,
  type EvaluationStarted,
} from '../api/evaluate';
import type { SheetResults } from '../api/results';
import type { Draft } from '../api/types';

const DEBOUNCE_MS = 700;

export type EvaluationState =
  | { phase: 'idle' }
  | { phase: 'running'; progress: EvaluationProgress | null; startedAt: number }
  | { phase: 'cancelled' }
  | { phase: 'failed'; message: string };

/** The results of a finished job (the contract leaves their blocks open; read as the engine's). */
function readResults(job: EvaluationJob | EvaluationStarted['job']): SheetResults | null {
  const r = ('results' in job ? job.results : undefined) as Partial<SheetResults> | undefined;
  if (!r || !Array.isArray(r.blocks)) return null;
  return {
    engineVersion: r.engineVersion ?? '',
    significantFigures: r.significantFigures ?? 4,
    blocks: r.blocks,
    errors: Array.isArray(r.errors) ? r.errors : [],
    summary: r.summary ?? { passed: 0, failed: 0, errors: 0 },
  };
}

/** The text of a draft as the server keeps it, for comparing a job's draft with the editor's. */
function draftKey(draft: Draft | EvaluationJob['draft']): string {
  return JSON.stringify({
    blocks: draft.blocks.map(({ id, kind, source }) => ({ id, kind, source })),
    settings: { significantFigures: draft.settings?.significantFigures },
  });
}

/**
 * Evaluates the draft on the server as the author types (700 ms after the last keystroke), one
 * evaluation at a time: a newer text cancels the older one. Results stay on screen, marked
 * stale, until the new ones arrive. Each evaluation is a job on the server that goes on when the
 * page closes: coming back to the sheet with the same text shows it running, then its results.
 * An unchanged text is answered from the server's results store at once. With `enabled` false
 * (someone who may not have the sheet evaluated) nothing is asked of the server.
 */
export function useEvaluation(sheetId: number | string, draft: Draft, enabled = true) {
  const [results, setResults] = useState<SheetResults | null>(null);
  const [evaluatedText, setEvaluatedText] = useState<string | null>(null);
  const [state, setState] = useState<EvaluationState>({ phase: 'idle' });
  const controller = useRef<AbortController | null>(null);
  const job = useRef<string | null>(null);
  const timer = useRef<ReturnType<typeof setTimeout> | null>(null);
  // Until the server has said whether an evaluation of this text is already running or done.
  const [resuming, setResuming] = useState(true);
  const latest = useRef(draft);
  useEffect(() => {
    latest.current = draft;
  });

  /** Follows job `jobId` (evaluating `text`) to its results, as the current evaluation. */
  const follow = useCallback(
    async (jobId: string, text: string, mine: AbortController) => {
      try {
        const body: EvaluationJob = await followEvaluation(
          sheetId,
          jobId,
          mine.signal,
          (progress) => {
            if (controller.current === mine) {
              setState({ phase: 'running', progress, startedAt: Date.now() });
            }
          },
        );
        if (controller.current !== mine) return;
        const read = readResults(body);
        if (read) {
          setResults(read);
          setEvaluatedText(text);
          setState({ phase: 'idle' });
        } else {
          setState({
            phase: 'failed',
            message: 'The server sent results this editor cannot read.',
          });
        }
      } catch (error) {
        if (controller.current !== mine) return;
        if (mine.signal.aborted) {
          setState({ phase: 'cancelled' });
          return;
        }
        setState({
          phase: 'failed',
          message:
            isApiError(error) || error instanceof Error ? error.message : 'The evaluation failed.',
        });
      } finally {
        if (controller.current === mine && mine.signal.aborted) controller.current = null;
      }
    },
    [sheetId],
  );

  /** Stops following the current evaluation and, with `stop`, the evaluation itself. */
  const drop = useCallback(
    (stop: boolean) => {
      controller.current?.abort();
      const jobId = job.current;
      job.current = null;
      if (stop && jobId) void cancelEvaluation(sheetId, jobId).catch(() => {});
    },
    [sheetId],
  );

  const run = useCallback(async () => {
    if (timer.current) clearTimeout(timer.current);
    drop(true);
    const mine = new AbortController();
    controller.current = mine;
    const draftNow = latest.current;
    const text = JSON.stringify(draftNow);
    setState({ phase: 'running', progress: null, startedAt: Date.now() });
    let started: Awaited<ReturnType<typeof startEvaluation>>;
    try {
      started = await startEvaluation(sheetId, draftNow);
    } catch (error) {
      if (controller.current !== mine) return;
      setState({
        phase: 'failed',
        message:
          isApiError(error) || error instanceof Error ? error.message : 'The evaluation failed.',
      });
      return;
    }
    const jobId = started.id;
    if (controller.current !== mine) {
      // A newer text or a cancel came while it was being queued.
      if (jobId) void cancelEvaluation(sheetId, jobId).catch(() => {});
      return;
    }
    // An unchanged text: the server answered from its results store, no job to follow.
    if (started.state === 'done' || !jobId) {
      const read = readResults(started);
      controller.current = null;
      if (read) {
        setResults(read);
        setEvaluatedText(text);
        setState({ phase: 'idle' });
      } else {
        setState({ phase: 'failed', message: 'The server sent results this editor cannot read.' });
      }
      return;
    }
    job.current = jobId;
    await follow(jobId, text, mine);
  }, [sheetId, drop, follow]);

  // Coming back to the sheet: the latest evaluation of this very text, running or done.
  useEffect(() => {
    if (!enabled) return;
    let live = true;
    latestEvaluation(sheetId)
      .then((found) => {
        if (!live || !found || controller.current) return;
        const text = JSON.stringify(latest.current);
        if (draftKey(found.draft) !== draftKey(latest.current)) return;
        if (found.state === 'done') {
          const read = readResults(found);
          if (read) {
            setResults(read);
            setEvaluatedText(text);
          }
        } else if ((found.state === 'waiting' || found.state === 'running') && found.id) {
          const mine = new AbortController();
          controller.current = mine;
          job.current = found.id;
          setEvaluatedText(text);
          setState({ phase: 'running', progress: null, startedAt: Date.now() });
          void follow(found.id, text, mine);
        }
      })
      .catch(() => {})
      .finally(() => {
        if (live) setResuming(false);
      });
    return () => {
      live = false;
    };
  }, [sheetId, follow, enabled]);

  const cancel = useCallback(() => {
    if (timer.current) clearTimeout(timer.current);
    drop(true);
  }, [drop]);

  const draftText = JSON.stringify(draft);
  useEffect(() => {
    if (!enabled || resuming || draftText === evaluatedText) return;
    if (timer.current) clearTimeout(timer.current);
    timer.current = setTimeout(() => void run(), DEBOUNCE_MS);
    return () => {
      if (timer.current) clearTimeout(timer.current);
    };
    // evaluatedText is read, not watched: a finished evaluation must not start another.
    // eslint-disable-next-line react-hooks/exhaustive-deps
  }, [draftText, run, resuming, enabled]);

  // Leaving the page stops following only: the evaluation goes on, and is there on return.
  useEffect(() => () => controller.current?.abort(), []);

  const stale = results !== null && evaluatedText !== draftText;
  return { results, state, stale, run, cancel };
}
