import {
  columnFilteringFeature,
  createColumnHelper,
  createFilteredRowModel,
  createSortedRowModel,
  filterFn_includesString,
  globalFilteringFeature,
  rowSortingFeature,
  sortFn_alphanumeric,
  sortFn_datetime,
  sortFn_text,
  tableFeatures,
  useTable,
  type SortingState,
} from '@tanstack/react-table';
import { useMemo, useState } from 'react';
import { Link } from 'react-router-dom';
import { QueryError } from '../../../components/ui/alert';
import { Button } from '../../../components/ui/button';
import { EmptyState } from '../../../components/ui/empty-state';
import { Spinner } from '../../../components/ui/spinner';
import { formatUtc } from '../../../lib/format';
import { useSheets } from '../api/get-sheets';
import { STATUS_LABELS, type SheetStatus, type SheetSummary } from '../api/types';
import { NewSheetDialog } from './new-sheet-dialog';

const features = tableFeatures({
  rowSortingFeature,
  columnFilteringFeature,
  globalFilteringFeature,
  sortedRowModel: createSortedRowModel(),
  filteredRowModel: createFilteredRowModel(),
  sortFns: { alphanumeric: sortFn_alphanumeric, text: sortFn_text, datetime: sortFn_datetime },
  filterFns: { includesString: filterFn_includesString },
});

const helper = createColumnHelper<typeof features, SheetSummary>();

const STATUS_TONE: Record<SheetStatus, string> = {
  draft: 'border-rule-strong text-ink-soft',
  in_check: 'border-caution text-caution',
  returned: 'border-fail text-fail',
  checked: 'border-accent text-accent-strong',
  sealed: 'border-pass bg-pass-soft text-pass',
};

/**
 * The sheets of a project: number, title, status, latest revision, who changed it and when;
 * sortable by any column, filtered by words and by status.
 */
export function SheetsTable({
  projectId,
  canCreate,
  sheetHref,
}: {
  projectId: number;
  canCreate: boolean;
  sheetHref: (projectId: number, sheetId: number) => string;
}) {
  const query = useSheets(projectId);
  const [sorting, setSorting] = useState<SortingState>([{ id: 'number', desc: false }]);
  const [globalFilter, setGlobalFilter] = useState('');
  const [status, setStatus] = useState<'' | SheetStatus>('');
  const [creating, setCreating] = useState(false);

  const columns = useMemo(
    () =>
      helper.columns([
        helper.accessor('number', {
          header: 'Sheet',
          sortFn: 'alphanumeric',
          cell: (info) => (
            <Link
              to={sheetHref(projectId, info.row.original.id)}
              className="num font-medium text-accent-strong hover:underline"
            >
              {info.getValue()}
            </Link>
          ),
        }),
        helper.accessor('title', {
          header: 'Title',
          sortFn: 'text',
          cell: (info) => (
            <span>
              {info.getValue()}
              {info.row.original.subject ? (
                <span className="block text-xs text-ink-faint">{info.row.original.subject}</span>
              ) : null}
            </span>
          ),
        }),
        helper.accessor((row) => STATUS_LABELS[row.status] ?? row.status, {
          id: 'status',
          header: 'Status',
          sortFn: 'text',
          cell: (info) => (
            <span
              className={`inline-block rounded-sm border px-1.5 text-xs font-medium ${STATUS_TONE[info.row.original.status] ?? ''}`}
            >
              {info.getValue()}
            </span>
          ),
        }),
        helper.accessor((row) => row.latestRevision?.number ?? 0, {
          id: 'revision',
          header: 'Latest revision',
          cell: (info) =>
            info.row.original.latestRevision ? (
              <span className="num">Rev {info.row.original.latestRevision.number}</span>
            ) : (
              <span className="text-ink-faint">none</span>
            ),
        }),
        helper.accessor((row) => row.updatedBy?.name ?? '', {
          id: 'updatedBy',
          header: 'Changed by',
          sortFn: 'text',
        }),
        helper.accessor('updatedAt', {
          header: 'Changed',
          sortFn: 'datetime',
          cell: (info) => <span className="num text-xs">{formatUtc(info.getValue())}</span>,
        }),
      ]),
    [projectId, sheetHref],
  );

  const all = query.data?.sheets;
  const data = useMemo(
    () => (all ?? []).filter((s) => !status || s.status === status),
    [all, status],
  );

  const table = useTable({
    features,
    columns,
    data,
    state: { sorting, globalFilter },
    onSortingChange: setSorting,
    onGlobalFilterChange: setGlobalFilter,
    globalFilterFn: 'includesString',
    getColumnCanGlobalFilter: (column) => column.id !== 'updatedAt' && column.id !== 'revision',
  });

  const toolbar = (
    <div className="mb-3 flex flex-wrap items-end gap-3">
      <label className="flex flex-col gap-1 text-sm">
        <span className="font-medium">Filter</span>
        <input
          type="search"
          value={globalFilter}
          onChange={(e) => setGlobalFilter(e.target.value)}
          placeholder="Number, title, person…"
          className="w-64 rounded-sm border border-rule-strong bg-paper-sheet px-2 py-1"
        />
      </label>
      <label className="flex flex-col gap-1 text-sm">
        <span className="font-medium">Status</span>
        <select
          value={status}
          onChange={(e) => setStatus(e.target.value as '' | SheetStatus)}
          className="rounded-sm border border-rule-strong bg-paper-sheet px-2 py-1"
        >
          <option value="">Any</option>
          {(Object.keys(STATUS_LABELS) as SheetStatus[]).map((s) => (
            <option key={s} value={s}>
              {STATUS_LABELS[s]}
            </option>
          ))}
        </select>
      </label>
      {canCreate ? (
        <Button className="ml-auto" onClick={() => setCreating(true)}>
          New sheet
        </Button>
      ) : null}
    </div>
  );

  let body;
  if (query.isPending) body = <Spinner label="Loading sheets…" />;
  else if (query.isError)
    body = (
      <QueryError what="the sheets" error={query.error} onRetry={() => void query.refetch()} />
    );
  else if (query.data.sheets.length === 0)
    body = (
      <EmptyState title="No sheets yet.">
        {canCreate ? 'Start one, empty or from a template.' : 'The authors have not started one.'}
      </EmptyState>
    );
  else {
    const rows = table.getRowModel().rows;
    body = (
      <div className="overflow-x-auto">
        <table className="w-full border-collapse text-left text-sm">
          <caption className="sr-only">Sheets of the project</caption>
          <thead>
            {table.getHeaderGroups().map((group) => (
              <tr key={group.id}>
                {group.headers.map((header) => {
                  const sorted = header.column.getIsSorted();
                  return (
                    <th
                      key={header.id}
                      scope="col"
                      aria-sort={
                        sorted === 'asc' ? 'ascending' : sorted === 'desc' ? 'descending' : 'none'
                      }
                      className="border-b border-ink/70 px-3 py-2 text-xs font-semibold tracking-wide text-ink-soft uppercase"
                    >
                      <button
                        type="button"
                        onClick={header.column.getToggleSortingHandler()}
                        className="inline-flex items-center gap-1 uppercase hover:text-ink"
                      >
                        <table.FlexRender header={header} />
                        <span aria-hidden="true" className="text-[10px]">
                          {sorted === 'asc' ? '▲' : sorted === 'desc' ? '▼' : '↕'}
                        </span>
                      </button>
                    </th>
                  );
                })}
              </tr>
            ))}
          </thead>
          <tbody>
            {rows.map((row) => (
              <tr key={row.id} className="hover:bg-paper-deep/50">
                {row.getAllCells().map((cell) => (
                  <td key={cell.id} className="border-b border-rule px-3 py-1.5 align-top">
                    <table.FlexRender cell={cell} />
                  </td>
                ))}
              </tr>
            ))}
            {rows.length === 0 ? (
              <tr>
                <td colSpan={6} className="px-3 py-4 text-center text-ink-soft">
                  No sheet matches the filter.
                </td>
              </tr>
            ) : null}
          </tbody>
        </table>
      </div>
    );
  }

  return (
    <div>
      {toolbar}
      {body}
      {creating ? (
        <NewSheetDialog
          projectId={projectId}
          onClose={() => setCreating(false)}
          sheetHref={sheetHref}
        />
      ) : null}
    </div>
  );
}
