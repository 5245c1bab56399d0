import { formatUtc } from '../../../lib/format';

type Person = { name: string } | null;

/** The parts of a revision's remark the printed record shows (the remarks endpoint's shape). */
export type PrintRemark = {
  id: number;
  blockId: string;
  line: number;
  type: string;
  text: string;
  state: string;
  carriedFrom: { revisionNumber: number; line: number } | null;
  /** Whether the line it points at changed since it was carried (absent: not known). */
  lineChanged?: boolean;
  author: Person;
  createdAt: string;
  closedBy: Person;
  closedAt: string | null;
  replies: PrintReply[];
  /** For a carried remark, the thread on the earlier revisions, oldest first. */
  earlier?: { revisionNumber: number; replies: PrintReply[] }[];
};

type PrintReply = { id: number; text: string; author: Person; createdAt: string };

/** The remarks as the package can give them: still coming, refused, or here. */
export type PrintRemarks =
  | { status: 'loading' }
  | { status: 'error'; message: string }
  | { status: 'ready'; remarks: readonly PrintRemark[] };

const WORDS: Record<string, string> = {
  error: 'Error',
  query: 'Query',
  editorial: 'Editorial',
  open: 'Open',
  answered: 'Answered',
  closed: 'Closed',
};

const day = (at: string) => formatUtc(at).slice(0, 10);

/**
 * The record of the check printed after the sheet: every remark of the revision in sheet order,
 * where it points, its type and state, who raised and closed it, and the replies.
 */
export function RemarksRecord({
  revisionNumber,
  remarks,
  blocks,
  title,
}: {
  revisionNumber: number;
  remarks: PrintRemarks;
  blocks: readonly { id: string; kind: string }[];
  /** The heading and the region's name (the package names the sheet too). */
  title?: string;
}) {
  const label = title ?? 'Check remarks';
  const heading = (
    <h2 className="mt-4 mb-1 break-after-avoid text-[11pt] font-semibold">
      {title ?? `Check remarks on Rev ${revisionNumber}`}
    </h2>
  );
  if (remarks.status === 'loading') {
    return (
      <section aria-label={label}>
        {heading}
        <p className="text-[8.5pt]">Loading the remarks…</p>
      </section>
    );
  }
  if (remarks.status === 'error') {
    return (
      <section aria-label={label}>
        {heading}
        <p className="text-[8.5pt]">The remarks could not be included: {remarks.message}</p>
      </section>
    );
  }
  const order = new Map(blocks.map((b, i) => [b.id, i]));
  const sorted = [...remarks.remarks].sort(
    (a, b) =>
      (order.get(a.blockId) ?? Infinity) - (order.get(b.blockId) ?? Infinity) ||
      a.line - b.line ||
      a.id - b.id,
  );
  return (
    <section aria-label={label} className="break-before-auto">
      {heading}
      {sorted.length === 0 ? (
        <p className="text-[8.5pt]">No remarks were made on this revision.</p>
      ) : (
        <ol className="flex flex-col gap-1.5 text-[8.5pt]">
          {sorted.map((r) => {
            const index = order.get(r.blockId);
            const where =
              index === undefined
                ? `A block no longer in the sheet, line ${r.line}`
                : `Block ${index + 1} (${blocks[index]!.kind}), line ${r.line}`;
            return (
              <li key={r.id} className="break-inside-avoid border-t border-black/30 pt-1">
                <p>
                  <strong>{where}</strong> · {WORDS[r.type] ?? r.type} · {WORDS[r.state] ?? r.state}
                  {r.carriedFrom
                    ? ` · carried from Rev ${r.carriedFrom.revisionNumber}, line ${r.carriedFrom.line}${r.lineChanged ? ' (line changed since)' : ''}`
                    : ''}
                </p>
                <p>
                  {r.text}{' '}
                  <span className="text-black/60">
                    — {r.author?.name ?? 'unknown'}, {day(r.createdAt)}
                  </span>
                </p>
                {r.replies.length > 0 || (r.earlier ?? []).some((e) => e.replies.length > 0) ? (
                  <ul className="mt-0.5 flex flex-col gap-0.5 border-l-2 border-black/30 pl-2">
                    {[
                      ...(r.earlier ?? []).flatMap((e) =>
                        e.replies.map((reply) => ({ ...reply, on: e.revisionNumber })),
                      ),
                      ...r.replies.map((reply) => ({ ...reply, on: null })),
                    ].map((reply) => (
                      <li key={reply.id}>
                        {reply.on !== null ? `Reply on Rev ${reply.on}` : 'Reply'}: {reply.text}{' '}
                        <span className="text-black/60">
                          — {reply.author?.name ?? 'unknown'}, {day(reply.createdAt)}
                        </span>
                      </li>
                    ))}
                  </ul>
                ) : null}
                {r.closedBy && r.closedAt ? (
                  <p className="text-black/60">
                    Closed by {r.closedBy.name}, {day(r.closedAt)}
                  </p>
                ) : null}
              </li>
            );
          })}
        </ol>
      )}
    </section>
  );
}
