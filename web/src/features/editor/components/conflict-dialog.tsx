import { useEffect, useRef } from 'react';
import { Button } from '../../../components/ui/button';
import { formatUtc } from '../../../lib/format';
import type { Block, ConflictingDraft } from '../api/types';
import { KIND_LABELS } from './block-card';

function Version({
  title,
  blocks,
  note,
}: {
  title: string;
  blocks: readonly Block[];
  note: string;
}) {
  return (
    <section aria-label={title} className="flex min-w-0 flex-1 flex-col gap-1">
      <h3 className="text-sm font-semibold">{title}</h3>
      <p className="text-xs text-ink-soft">{note}</p>
      <div className="max-h-[50vh] overflow-auto rounded-sm border border-rule bg-paper-sheet p-2">
        {blocks.map((b, i) => (
          <div key={b.id} className="mb-2">
            <p className="text-[11px] font-semibold tracking-wide text-ink-faint uppercase">
              {i + 1}. {KIND_LABELS[b.kind]}
            </p>
            <pre className="font-mono text-xs whitespace-pre-wrap">{b.source || ' '}</pre>
          </div>
        ))}
      </div>
    </section>
  );
}

/**
 * Someone saved this sheet after it was loaded here. Both versions side by side; the author keeps
 * theirs, the other, or both (every block of each), and nothing is thrown away unseen.
 */
export function ConflictDialog({
  mine,
  theirs,
  message,
  onKeepMine,
  onKeepTheirs,
  onKeepBoth,
  busy,
}: {
  mine: readonly Block[];
  theirs: ConflictingDraft;
  message: string;
  onKeepMine: () => void;
  onKeepTheirs: () => void;
  onKeepBoth: () => void;
  busy: boolean;
}) {
  const ref = useRef<HTMLDivElement>(null);
  useEffect(() => {
    ref.current?.focus();
  }, []);
  return (
    <div className="fixed inset-0 z-50 flex items-center justify-center bg-ink/40 p-4">
      <div
        ref={ref}
        tabIndex={-1}
        role="dialog"
        aria-modal="true"
        aria-labelledby="conflict-title"
        className="flex max-h-full w-full max-w-5xl flex-col gap-3 rounded-sm border border-rule-strong bg-paper p-4 shadow-sheet"
      >
        <h2 id="conflict-title" className="text-base font-semibold">
          This draft was changed elsewhere
        </h2>
        <p className="text-sm text-ink-soft">
          {message} Keeping both puts their blocks after yours, so you can merge them by hand;
          keeping theirs can be undone.
        </p>
        <div className="flex flex-col gap-3 md:flex-row">
          <Version
            title="Your version"
            blocks={mine}
            note="What you have on this screen, not yet saved."
          />
          <Version
            title="Their version"
            blocks={theirs.blocks}
            note={`Saved ${formatUtc(theirs.updatedAt)} by ${theirs.updatedBy.name} (version ${theirs.draftVersion}).`}
          />
        </div>
        <div className="flex flex-wrap justify-end gap-2">
          <Button variant="secondary" onClick={onKeepTheirs} disabled={busy}>
            Keep their version
          </Button>
          <Button variant="secondary" onClick={onKeepBoth} disabled={busy}>
            Keep both
          </Button>
          <Button onClick={onKeepMine} busy={busy}>
            Keep my version
          </Button>
        </div>
      </div>
    </div>
  );
}
