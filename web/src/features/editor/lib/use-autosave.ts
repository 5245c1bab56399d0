import { useCallback, useEffect, useRef, useState } from 'react';
import { isApiError } from '../../../lib/api-client';
import { saveDraft } from '../api/save-draft';
import type { ConflictingDraft, Draft } from '../api/types';

export type SaveState = 'saved' | 'unsaved' | 'saving' | 'offline' | 'conflict' | 'error';

const DEBOUNCE_MS = 1000;
const OFFLINE_RETRY_MS = 5000;

/**
 * Saves the draft a second after the author stops typing, one request at a time, against the
 * version it was loaded at. A refused stale save becomes `conflict` with the server's draft; a
 * lost connection or a server without its database becomes `offline` and is retried until it
 * goes through.
 */
export function useAutosave({
  sheetId,
  draft,
  initialVersion,
  enabled,
}: {
  sheetId: number | string;
  draft: Draft;
  initialVersion: number;
  enabled: boolean;
}) {
  const [state, setState] = useState<SaveState>('saved');
  const [error, setError] = useState<string | null>(null);
  const [conflict, setConflict] = useState<{ current: ConflictingDraft; message: string } | null>(
    null,
  );
  const version = useRef(initialVersion);
  const saved = useRef(JSON.stringify(draft));
  const latest = useRef(draft);
  const inFlight = useRef(false);
  const timer = useRef<ReturnType<typeof setTimeout> | null>(null);
  const blocked = useRef(false);

  useEffect(() => {
    latest.current = draft;
  });

  const flush = useCallback(async (): Promise<void> => {
    if (!enabled || inFlight.current || blocked.current) return;
    const text = JSON.stringify(latest.current);
    if (text === saved.current) {
      setState('saved');
      return;
    }
    inFlight.current = true;
    setState('saving');
    let failed = false;
    try {
      const result = await saveDraft(sheetId, version.current, JSON.parse(text) as Draft);
      if (result.kind === 'saved') {
        version.current = result.draftVersion;
        saved.current = text;
        setError(null);
        setState(JSON.stringify(latest.current) === text ? 'saved' : 'unsaved');
      } else {
        blocked.current = true;
        setConflict({ current: result.current, message: result.message });
        setState('conflict');
      }
    } catch (e) {
      failed = true;
      // The server or its database cannot be reached: keep the text and try again.
      if (isApiError(e) && (e.status === 0 || e.code === 'DATABASE_UNAVAILABLE')) {
        setState('offline');
        setError(e.message);
        if (timer.current) clearTimeout(timer.current);
        const retryAfter = Number(e.details?.retryAfterSeconds) * 1000;
        timer.current = setTimeout(
          () => void flush(),
          retryAfter > 0 ? retryAfter : OFFLINE_RETRY_MS,
        );
      } else {
        setState('error');
        setError(e instanceof Error ? e.message : 'The draft could not be saved.');
      }
    } finally {
      inFlight.current = false;
    }
    // Typed while the save was in flight: save again. Not after a failure: an unreachable server
    // is retried on its own timer (or when the browser says it is online again), and a refused
    // save waits for the next edit rather than being repeated every second.
    if (!failed && !blocked.current && JSON.stringify(latest.current) !== saved.current) {
      if (timer.current) clearTimeout(timer.current);
      timer.current = setTimeout(() => void flush(), DEBOUNCE_MS);
    }
  }, [enabled, sheetId]);

  const draftText = JSON.stringify(draft);
  useEffect(() => {
    if (!enabled || blocked.current) return;
    if (draftText === saved.current) return;
    setState((s) => (s === 'offline' || s === 'saving' ? s : 'unsaved'));
    if (timer.current) clearTimeout(timer.current);
    timer.current = setTimeout(() => void flush(), DEBOUNCE_MS);
  }, [draftText, enabled, flush]);

  useEffect(() => {
    const online = () => void flush();
    window.addEventListener('online', online);
    return () => {
      window.removeEventListener('online', online);
      if (timer.current) clearTimeout(timer.current);
    };
  }, [flush]);

  /** After the author chose in the conflict dialog: save `draft` over the server's version. */
  const resolve = useCallback(
    (resolvedVersion: number, keepServerText: Draft | null) => {
      version.current = resolvedVersion;
      blocked.current = false;
      setConflict(null);
      if (keepServerText) saved.current = JSON.stringify(keepServerText);
      void flush();
    },
    [flush],
  );

  const dirty = state !== 'saved';
  return { state, error, conflict, resolve, dirty, saveNow: flush };
}
