import { Link } from 'react-router-dom';
import { Button } from '../../../components/ui/button';
import type { SheetResults } from '../api/results';
import type { SheetDetail } from '../api/types';
import type { SaveState } from '../lib/use-autosave';
import type { EvaluationState } from '../lib/use-evaluation';

const STATUS_LABELS: Record<string, string> = {
  draft: 'Draft',
  in_check: 'In check',
  returned: 'Returned',
  checked: 'Checked',
  sealed: 'Sealed',
};

const SAVE_LABELS: Record<SaveState, string> = {
  saved: 'Saved',
  unsaved: 'Unsaved changes',
  saving: 'Saving…',
  offline: 'Not saved — cannot reach the server; retrying',
  conflict: 'Not saved — changed elsewhere',
  error: 'Not saved',
};

/** The sheet's title block, its criteria count, and the state of saving and evaluating. */
export function SheetHeader({
  sheet,
  projectHref,
  results,
  stale,
  evaluation,
  saveState,
  saveError,
  readOnly,
  onRun,
  onCancel,
}: {
  sheet: SheetDetail;
  projectHref: string;
  results: SheetResults | null;
  stale: boolean;
  evaluation: EvaluationState;
  saveState: SaveState;
  saveError: string | null;
  readOnly: boolean;
  /** Absent for someone who may not have the sheet evaluated: no Run button then. */
  onRun?: () => void;
  onCancel: () => void;
}) {
  const running = evaluation.phase === 'running';
  return (
    <>
      {/* The project and subject scroll away; the sticky part is the title line and the status,
          one or two lines on a phone. */}
      <div className="-mb-2 flex flex-col gap-0.5">
        <Link to={projectHref} className="self-start text-xs text-accent-strong hover:underline">
          {sheet.projectJobNumber} · {sheet.projectName}
        </Link>
        {sheet.subject ? <p className="text-sm text-ink-soft">{sheet.subject}</p> : null}
      </div>
      <header className="sticky top-0 z-20 -mx-2 border-b border-rule bg-paper/95 px-2 py-1 backdrop-blur sm:py-2">
        <div className="flex min-w-0 items-baseline gap-x-3 gap-y-1 sm:flex-wrap">
          <h1 className="min-w-0 truncate text-base font-semibold text-ink sm:text-lg sm:whitespace-normal">
            <span className="num mr-2">{sheet.number}</span>
            {sheet.title}
          </h1>
          <span className="shrink-0 rounded-sm border border-rule-strong px-1.5 text-xs text-ink-soft">
            {STATUS_LABELS[sheet.status] ?? sheet.status}
            {sheet.latestRevision ? ` · Rev ${sheet.latestRevision.number}` : ''}
          </span>
          {readOnly ? <span className="shrink-0 text-xs text-ink-faint">Read only</span> : null}
        </div>
        <div
          className="mt-1 flex flex-wrap items-center gap-x-3 gap-y-1 text-sm sm:gap-x-4"
          aria-label="Sheet status"
        >
          {results ? (
            <p className="flex items-center gap-3" data-testid="criteria-summary">
              <span className="font-medium text-pass">{results.summary.passed} passed</span>
              <span
                className={`font-medium ${results.summary.failed > 0 ? 'text-fail' : 'text-ink-soft'}`}
              >
                {results.summary.failed} failed
              </span>
              {results.summary.errors > 0 ? (
                <span className="font-medium text-fail">
                  {results.summary.errors} error{results.summary.errors === 1 ? '' : 's'}
                </span>
              ) : null}
            </p>
          ) : (
            <p className="text-ink-faint">Not evaluated yet</p>
          )}
          {/* Run / Cancel before the status, so the changing progress text never moves it */}
          <div className="flex items-center gap-2">
            {running ? (
              <Button variant="danger" className="py-0.5" onClick={onCancel}>
                Cancel
              </Button>
            ) : onRun ? (
              <Button variant="secondary" className="py-0.5" onClick={onRun}>
                Run
              </Button>
            ) : null}
          </div>
          <p role="status" aria-live="polite" className="flex items-center gap-2">
            {running ? (
              <>
                <span
                  aria-hidden="true"
                  className="size-3 animate-spin rounded-full border-2 border-accent border-t-transparent"
                />
                {evaluation.progress?.fraction !== null &&
                evaluation.progress?.fraction !== undefined ? (
                  <progress
                    className="h-1.5 w-24 accent-accent"
                    max={1}
                    value={evaluation.progress.fraction}
                    aria-label="Evaluation progress"
                  />
                ) : null}
                <span>{evaluation.progress?.message ?? 'Evaluating…'}</span>
              </>
            ) : evaluation.phase === 'cancelled' ? (
              <span className="font-medium text-ink">Evaluation cancelled — results are stale</span>
            ) : evaluation.phase === 'failed' ? (
              <span className="text-fail">{evaluation.message}</span>
            ) : stale ? (
              <span className="font-medium text-ink">Results are stale</span>
            ) : results ? (
              <span className="text-ink-faint">Results up to date</span>
            ) : null}
          </p>
          {!readOnly ? (
            <p
              className={`ml-auto text-xs ${
                saveState === 'saved'
                  ? 'text-ink-faint'
                  : saveState === 'error' || saveState === 'conflict' || saveState === 'offline'
                    ? 'font-medium text-fail'
                    : 'text-ink-soft'
              }`}
              title={saveError ?? undefined}
              data-testid="save-state"
            >
              {SAVE_LABELS[saveState]}
              {saveState === 'error' && saveError ? `: ${saveError}` : ''}
            </p>
          ) : null}
        </div>
      </header>
    </>
  );
}
