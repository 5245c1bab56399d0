import { useCallback, useEffect, useRef, useState } from 'react';
import { isApiError } from '../../../lib/api-client';
import { evaluateStream, type EvaluationProgress } from '../api/evaluate';
import type { SheetResults } from '../api/results';
import type { Draft } from '../api/types';

const DEBOUNCE_MS = 700;

export type EvaluationState =
  | { phase: 'idle' }
  | { phase: 'running'; progress: EvaluationProgress | null; startedAt: number }
  | { phase: 'cancelled' }
  | { phase: 'failed'; message: string };

function readResults(body: { results: unknown }): SheetResults | null {
  const r = body.results as Partial<SheetResults> | undefined;
  if (!r || !Array.isArray(r.blocks)) return null;
  return {
    engineVersion: r.engineVersion ?? '',
    significantFigures: r.significantFigures ?? 4,
    blocks: r.blocks,
    errors: Array.isArray(r.errors) ? r.errors : [],
    summary: r.summary ?? { passed: 0, failed: 0, errors: 0 },
  };
}

/**
 * Evaluates the draft on the server as the author types (700 ms after the last keystroke), one
 * evaluation at a time: a newer text cancels the older request. Results stay on screen, marked
 * stale, until the new ones arrive.
 */
export function useEvaluation(sheetId: number | string, draft: Draft) {
  const [results, setResults] = useState<SheetResults | null>(null);
  const [evaluatedText, setEvaluatedText] = useState<string | null>(null);
  const [state, setState] = useState<EvaluationState>({ phase: 'idle' });
  const controller = useRef<AbortController | null>(null);
  const timer = useRef<ReturnType<typeof setTimeout> | null>(null);
  const latest = useRef(draft);
  useEffect(() => {
    latest.current = draft;
  });

  const run = useCallback(async () => {
    if (timer.current) clearTimeout(timer.current);
    controller.current?.abort();
    const mine = new AbortController();
    controller.current = mine;
    const text = JSON.stringify(latest.current);
    setState({ phase: 'running', progress: null, startedAt: Date.now() });
    try {
      const body = await evaluateStream(
        sheetId,
        JSON.parse(text) as Draft,
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
        setState({ phase: 'failed', message: 'The server sent results this editor cannot read.' });
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
  }, [sheetId]);

  const cancel = useCallback(() => {
    if (timer.current) clearTimeout(timer.current);
    controller.current?.abort();
  }, []);

  const draftText = JSON.stringify(draft);
  useEffect(() => {
    if (draftText === evaluatedText) return;
    if (timer.current) clearTimeout(timer.current);
    timer.current = setTimeout(() => void run(), DEBOUNCE_MS);
    return () => {
      if (timer.current) clearTimeout(timer.current);
    };
    // evaluatedText is read, not watched: a finished evaluation must not start another.
    // eslint-disable-next-line react-hooks/exhaustive-deps
  }, [draftText, run]);

  useEffect(() => () => controller.current?.abort(), []);

  const stale = results !== null && evaluatedText !== draftText;
  return { results, state, stale, run, cancel };
}
