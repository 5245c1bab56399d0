import { useState } from 'react';
import type { SheetValue } from '../../../../core/index';
import { sig } from '../../lib/format';
import { Table, Td, Th } from '../ui/table';
import { PageControls } from './page-controls';
import { pageBounds } from './shape-rows';

/** Entries per page: a page renders at once however large the matrix. */
export const ENTRY_PAGE_ROWS = 50;

type MatrixValue = Extract<SheetValue, { type: 'matrix' }>;

const count = (n: number) => n.toLocaleString('en-GB');

/**
 * The nonzero entries of a large matrix (row, column, value in its unit), a page at a time, under
 * its size and nonzeros; nothing for a matrix whose entries are listed in full or that carries no
 * entries (results made before they were kept).
 */
export function MatrixEntriesTable({
  name,
  value,
  digits = 4,
}: {
  name: string;
  value: MatrixValue;
  digits?: number;
}) {
  const [page, setPage] = useState(0);
  const e = value.entries;
  if (!e) return null;
  const listed = e.rows.length;
  const b = pageBounds(listed, page, ENTRY_PAGE_ROWS);
  const unit = value.unit ? ` (${value.unit})` : '';
  return (
    <section aria-label={`Entries of ${name}`} className="flex min-w-0 max-w-xl flex-col gap-1">
      <div className="flex flex-wrap items-center justify-between gap-2 text-xs text-ink-soft">
        <span>
          {name}: {count(value.rows)} × {count(value.cols)}, {count(e.nonzeros)} nonzeros
          {e.lowerTriangle ? ' (symmetric: the lower triangle is listed)' : ''}.{' '}
          {listed > 0
            ? `Entries ${count(b.from + 1)}–${count(b.to)} of ${count(e.total)}`
            : 'Every entry is zero.'}
          {listed < e.total ? ` (the first ${count(listed)} are kept in the results)` : ''}
        </span>
        <PageControls page={b.page} pages={b.pages} onPage={setPage} label={`entries of ${name}`} />
      </div>
      {listed > 0 ? (
        <Table caption={`Nonzero entries of ${name}, page ${b.page + 1} of ${b.pages}`}>
          <thead>
            <tr>
              <Th caps={false} className="text-right">
                Row
              </Th>
              <Th caps={false} className="text-right">
                Column
              </Th>
              <Th caps={false} className="text-right">
                Value{unit}
              </Th>
            </tr>
          </thead>
          <tbody className="num">
            {e.values.slice(b.from, b.to).map((v, k) => (
              <tr key={b.from + k}>
                <Td className="py-0.5 text-right">{e.rows[b.from + k]}</Td>
                <Td className="py-0.5 text-right">{e.cols[b.from + k]}</Td>
                <Td className="py-0.5 text-right">{sig(v, digits)}</Td>
              </tr>
            ))}
          </tbody>
        </Table>
      ) : null}
    </section>
  );
}

/**
 * The large matrices inside a value with their names: the value itself, or the fields of an
 * object (`deck.K`, `deck.M` of a generated model), one level of nesting deep.
 */
export function largeMatrices(
  name: string,
  value: SheetValue,
): { name: string; value: MatrixValue }[] {
  if (value.type === 'matrix') return value.entries ? [{ name, value }] : [];
  if (value.type !== 'object') return [];
  return Object.entries(value.fields).flatMap(([key, f]) =>
    f.type === 'matrix' && f.entries ? [{ name: `${name}.${key}`, value: f }] : [],
  );
}
