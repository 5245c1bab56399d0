import { useCallback, useEffect, useMemo, useRef, useState, type DragEvent } from 'react';
import { Link } from 'react-router-dom';
import { Alert, QueryError } from '../../../components/ui/alert';
import { paths } from '../../../config/paths';
import { Spinner } from '../../../components/ui/spinner';
import { UnitSystemProvider } from '../../../components/results/units';
import {
  UNIT_SYSTEM_LABELS,
  UNIT_SYSTEMS,
  type UnitSystem,
} from '../../../../../core/display-units';
import { useSheet } from '../api/get-sheet';
import type { SheetIssue } from '../api/results';
import {
  BLOCK_KINDS,
  type Block,
  type BlockKind,
  type Draft,
  type SheetDetail,
} from '../api/types';
import { useUploads } from '../api/uploads';
import { BLOCK_STARTERS, mergeBoth, moveBlock, newBlockId } from '../lib/blocks';
import { namesInScope } from '../lib/scope';
import { useAutosave } from '../lib/use-autosave';
import { useEvaluation } from '../lib/use-evaluation';
import { EVALUATING_ROLES } from '../../../../../core/vocabulary';
import { BlockCard, KIND_LABELS } from './block-card';
import type { RemarkMark } from './block-source';
import { ConflictDialog } from './conflict-dialog';
import { SheetHeader } from './sheet-header';
import { SheetOutline } from './sheet-outline';
import { UploadZone } from './upload-zone';

type Undo = { label: string; blocks: Block[] };

const NO_ISSUES: SheetIssue[] = [];

const FROZEN_WORDS: Record<string, string> = {
  in_check: 'in check',
  checked: 'signed off',
  sealed: 'sealed',
};

/** The sheet editor on the draft: loads the sheet, then hands it to the editing surface. */
export function SheetEditor({
  sheetId,
  projectHref,
  remarks,
}: {
  sheetId: number;
  projectHref: (projectId: number) => string;
  /** Remarks to act on, by block id, shown in the gutter of their block. */
  remarks?: ReadonlyMap<string, readonly RemarkMark[]>;
}) {
  const query = useSheet(sheetId);
  if (query.isPending) return <Spinner label="Loading the sheet…" />;
  if (query.isError) {
    return <QueryError what="the sheet" error={query.error} onRetry={() => void query.refetch()} />;
  }
  if (query.data.sheet.draftHidden) {
    return (
      <WithheldDraft
        sheet={query.data.sheet}
        projectHref={projectHref(query.data.sheet.projectId)}
      />
    );
  }
  return (
    <EditorSurface
      key={query.data.sheet.id}
      sheet={query.data.sheet}
      projectHref={projectHref(query.data.sheet.projectId)}
      {...(remarks ? { remarks } : {})}
    />
  );
}

/**
 * A viewer's sheet: its name and where it stands, and the issued revisions (listed below by the
 * route); the unissued draft is the firm's working copy and the server withholds it.
 */
function WithheldDraft({ sheet, projectHref }: { sheet: SheetDetail; projectHref: string }) {
  useEffect(() => {
    document.title = `${sheet.number} ${sheet.title} · Modewright`;
  }, [sheet.number, sheet.title]);
  return (
    <header className="flex flex-col gap-1 rounded-sm border border-rule bg-paper-sheet px-5 py-4 shadow-sheet">
      <Link to={projectHref} className="text-sm text-accent-strong hover:underline">
        ← {sheet.projectJobNumber} {sheet.projectName}
      </Link>
      <h1 className="text-xl font-semibold text-ink">
        {sheet.number} {sheet.title}
      </h1>
      <p className="text-sm text-ink-soft" data-testid="draft-withheld">
        {sheet.latestRevision
          ? `Issued revisions are listed below; open one to read it with its results and remarks.`
          : 'Nothing has been issued yet: the sheet is being prepared.'}{' '}
        The working draft between issues is the engineers’ and is not shown to viewers.
      </p>
    </header>
  );
}

function EditorSurface({
  sheet,
  projectHref,
  remarks,
}: {
  sheet: SheetDetail;
  projectHref: string;
  remarks?: ReadonlyMap<string, readonly RemarkMark[]>;
}) {
  // The draft is the author's working copy in every state: a sealed or checked revision stays as it
  // is, and what is typed here becomes the next revision when it is issued (a newer seal
  // supersedes the older one).
  const canEdit = sheet.myRoles.includes('author');
  // An admin outside the project reads the draft but, like a viewer, queues no evaluation.
  const canEvaluate = EVALUATING_ROLES.some((role) => sheet.myRoles.includes(role));
  const [blocks, setBlocks] = useState<Block[]>(sheet.draft.blocks);
  const [settings, setSettings] = useState(sheet.draft.settings ?? { significantFigures: 4 });
  const [undo, setUndo] = useState<Undo | null>(null);
  const [dragFrom, setDragFrom] = useState<number | null>(null);
  const [dropAt, setDropAt] = useState<number | null>(null);
  const draft: Draft = useMemo(() => ({ blocks, settings }), [blocks, settings]);

  const save = useAutosave({
    sheetId: sheet.id,
    draft,
    initialVersion: sheet.draftVersion,
    enabled: canEdit,
  });
  const evaluation = useEvaluation(sheet.id, draft, canEvaluate);
  const uploads = useUploads(sheet.id);
  const uploadNames = useRef<string[]>([]);
  useEffect(() => {
    uploadNames.current = uploads.data?.uploads.map((u) => u.name) ?? [];
  }, [uploads.data]);

  // Leaving with work the server does not have yet asks first.
  useEffect(() => {
    if (!save.dirty) return;
    const warn = (event: BeforeUnloadEvent) => {
      event.preventDefault();
      event.returnValue = '';
    };
    window.addEventListener('beforeunload', warn);
    return () => window.removeEventListener('beforeunload', warn);
  }, [save.dirty]);

  useEffect(() => {
    document.title = `${sheet.number} ${sheet.title} · Modewright`;
  }, [sheet.number, sheet.title]);

  const issuesByBlock = useMemo(() => {
    const map = new Map<string, SheetIssue[]>();
    for (const issue of evaluation.results?.errors ?? []) {
      const list = map.get(issue.blockId) ?? [];
      list.push(issue);
      map.set(issue.blockId, list);
    }
    return map;
  }, [evaluation.results]);
  const errorCounts = useMemo(
    () =>
      new Map(
        [...issuesByBlock].map(([id, list]) => [
          id,
          list.filter((i) => i.severity !== 'note').length,
        ]),
      ),
    [issuesByBlock],
  );

  const update = useCallback((id: string, source: string) => {
    setBlocks((current) => current.map((b) => (b.id === id ? { ...b, source } : b)));
  }, []);

  const move = useCallback((from: number, to: number) => {
    setBlocks((current) => moveBlock(current, from, to));
    // Keep the keyboard where the block went.
    requestAnimationFrame(() => {
      const cards = document.querySelectorAll<HTMLElement>(
        '[data-block-id] header button[draggable]',
      );
      cards[to]?.focus();
    });
  }, []);

  // Appends unless told where: several uploads in a row land in the order they finished.
  const add = (kind: BlockKind, source = BLOCK_STARTERS[kind], at?: number) => {
    const block: Block = { id: newBlockId(), kind, source };
    setBlocks((current) => {
      const i = at ?? current.length;
      return [...current.slice(0, i), block, ...current.slice(i)];
    });
  };

  const remove = (index: number) => {
    const block = blocks[index];
    if (!block) return;
    setUndo({ label: `${KIND_LABELS[block.kind]} block ${index + 1} deleted.`, blocks });
    setBlocks((current) => current.filter((_, i) => i !== index));
  };

  const duplicate = (index: number) => {
    const block = blocks[index];
    if (!block) return;
    add(block.kind, block.source, index + 1);
  };

  const onDrop = (index: number) => (event: DragEvent) => {
    event.preventDefault();
    if (dragFrom !== null && event.dataTransfer.types.includes('application/x-modewright-block')) {
      move(dragFrom, index);
    }
    setDragFrom(null);
    setDropAt(null);
  };

  const results = evaluation.results;
  const conflict = save.conflict;

  return (
    <UnitSystemProvider system={settings.units}>
      <div className="flex flex-col gap-3">
        <SheetHeader
          sheet={sheet}
          projectHref={projectHref}
          results={results}
          stale={evaluation.stale}
          evaluation={evaluation.state}
          saveState={save.state}
          saveError={save.error}
          readOnly={!canEdit}
          {...(canEvaluate ? { onRun: () => void evaluation.run() } : {})}
          onCancel={evaluation.cancel}
        />

        {canEdit &&
        sheet.latestRevision &&
        sheet.status !== 'draft' &&
        sheet.status !== 'returned' ? (
          <p className="text-sm text-ink-soft" data-testid="next-revision-note">
            Rev {sheet.latestRevision.number} is {FROZEN_WORDS[sheet.status] ?? 'issued'} and stays
            as it is; changes here go into Rev {sheet.latestRevision.number + 1} when it is issued.
          </p>
        ) : null}

        <SheetOutline blocks={blocks} errorsByBlock={errorCounts} />

        {undo ? (
          <div
            role="status"
            className="flex items-center gap-3 rounded-sm border border-rule-strong bg-paper-deep px-3 py-1.5 text-sm"
          >
            <span>{undo.label}</span>
            <button
              type="button"
              className="font-medium text-accent-strong underline underline-offset-2"
              onClick={() => {
                setBlocks(undo.blocks);
                setUndo(null);
              }}
            >
              Undo
            </button>
            <button
              type="button"
              className="ml-auto text-xs text-ink-faint hover:text-ink"
              onClick={() => setUndo(null)}
              aria-label="Dismiss"
            >
              ✕
            </button>
          </div>
        ) : null}

        <UploadZone
          sheetId={sheet.id}
          enabled={canEdit}
          onUploaded={(source) => add('matrix', source)}
        >
          <ol className="flex flex-col gap-3" aria-label="Blocks">
            {blocks.map((block, index) => (
              <li key={block.id}>
                <BlockCard
                  block={block}
                  index={index}
                  count={blocks.length}
                  readOnly={!canEdit}
                  result={results?.blocks.find((r) => r.blockId === block.id)}
                  issues={issuesByBlock.get(block.id) ?? NO_ISSUES}
                  {...(remarks?.get(block.id) ? { remarks: remarks.get(block.id)! } : {})}
                  stale={evaluation.stale}
                  digits={settings.significantFigures}
                  fileStem={`${sheet.number}_draft`}
                  names={(line) => namesInScope(blocks, index, line, results?.blocks)}
                  uploads={() => uploadNames.current}
                  onChange={(source) => update(block.id, source)}
                  onMove={(delta) => move(index, index + delta)}
                  onDuplicate={() => duplicate(index)}
                  onDelete={() => remove(index)}
                  onDragStart={(event) => {
                    event.dataTransfer.setData('application/x-modewright-block', block.id);
                    event.dataTransfer.effectAllowed = 'move';
                    const card = (event.currentTarget as HTMLElement).closest('section');
                    if (card) event.dataTransfer.setDragImage(card, 16, 16);
                    setDragFrom(index);
                  }}
                  onDragOver={(event) => {
                    if (dragFrom === null) return;
                    event.preventDefault();
                    event.dataTransfer.dropEffect = 'move';
                    setDropAt(index);
                  }}
                  onDrop={onDrop(index)}
                  dropTarget={dropAt === index && dragFrom !== null && dragFrom !== index}
                />
              </li>
            ))}
          </ol>
          {blocks.length === 0 ? (
            <p className="rounded-sm border border-dashed border-rule-strong px-4 py-6 text-center text-sm text-ink-soft">
              This sheet has no blocks yet.
              {canEdit ? ' Add one below, or drop a K or M file here.' : ''}
            </p>
          ) : null}
        </UploadZone>

        {canEdit ? (
          <div
            className="flex flex-wrap items-center gap-2 text-sm"
            role="group"
            aria-label="Add a block"
          >
            <span className="text-ink-soft">Add</span>
            {BLOCK_KINDS.map((kind) => (
              <button
                key={kind}
                type="button"
                onClick={() => add(kind)}
                className="rounded-sm border border-rule-strong bg-paper-sheet px-2 py-0.5 hover:bg-paper-deep"
              >
                + {KIND_LABELS[kind]}
              </button>
            ))}
            <Link
              to={paths.reference.href()}
              target="_blank"
              className="text-xs text-accent-strong underline underline-offset-2"
            >
              Sheet reference
            </Link>
            <label className="ml-auto flex items-center gap-1 text-xs text-ink-soft">
              Significant figures
              <input
                type="number"
                min={1}
                max={15}
                value={settings.significantFigures}
                onChange={(e) => {
                  const n = Math.round(Number(e.target.value));
                  if (n >= 1 && n <= 15) setSettings((s) => ({ ...s, significantFigures: n }));
                }}
                className="w-12 rounded-sm border border-rule-strong bg-paper-sheet px-1 py-0.5"
              />
            </label>
            <label className="flex items-center gap-1 text-xs text-ink-soft">
              Units shown
              <select
                value={settings.units ?? 'si'}
                onChange={(e) =>
                  setSettings((s) => ({ ...s, units: e.target.value as UnitSystem }))
                }
                className="rounded-sm border border-rule-strong bg-paper-sheet px-1 py-0.5"
              >
                {UNIT_SYSTEMS.map((u) => (
                  <option key={u} value={u}>
                    {UNIT_SYSTEM_LABELS[u]}
                  </option>
                ))}
              </select>
            </label>
          </div>
        ) : null}

        {save.state === 'error' && save.error ? (
          <Alert title="The draft was not saved.">{save.error}</Alert>
        ) : null}

        {/* The caution is the page's own, in the footer of every signed-in screen: once per screen. */}
        {conflict ? (
          <ConflictDialog
            mine={blocks}
            theirs={conflict.current}
            message={conflict.message}
            busy={save.state === 'saving'}
            onKeepMine={() => save.resolve(conflict.current.draftVersion, null)}
            onKeepTheirs={() => {
              setUndo({ label: 'Your version was replaced by theirs.', blocks });
              setBlocks(conflict.current.blocks);
              setSettings(conflict.current.settings ?? settings);
              save.resolve(conflict.current.draftVersion, {
                blocks: conflict.current.blocks,
                settings: conflict.current.settings ?? settings,
              });
            }}
            onKeepBoth={() => {
              setBlocks(mergeBoth(blocks, conflict.current.blocks));
              save.resolve(conflict.current.draftVersion, null);
            }}
          />
        ) : null}
      </div>
    </UnitSystemProvider>
  );
}
