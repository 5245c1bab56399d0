import { useState } from 'react';
import type { ModesBlockResult } from '../../../../core/index';
import { sig } from '../../lib/format';
import { Table, Td, Th } from '../ui/table';
import { PageControls } from './page-controls';
import { pageBounds, shapeRows } from './shape-rows';

/** Rows per page: a page renders at once however large the model. */
export const SHAPE_PAGE_ROWS = 50;

/**
 * The mode shapes of a model-scale result as a table, one row per DOF and one column per mode, a
 * page at a time; nothing for a model whose shapes fit one page (the plot and the CSV serve it).
 * For a model too large to keep every DOF, the rows are those of evenly spaced nodes and the
 * caption says so.
 */
export function ModeShapesTable({
  result,
  digits = 4,
}: {
  result: ModesBlockResult;
  digits?: number;
}) {
  const [page, setPage] = useState(0);
  const rows = shapeRows(result);
  if (!rows || (rows.shapes.length <= SHAPE_PAGE_ROWS && !rows.preview)) return null;
  const name = result.name ?? 'modes';
  const b = pageBounds(rows.shapes.length, page, SHAPE_PAGE_ROWS);
  const modes = rows.shapes[0]?.length ?? 0;
  return (
    <section aria-label={`Mode shapes of ${name}`} className="flex flex-col gap-1">
      <div className="flex flex-wrap items-center justify-between gap-2 text-xs text-ink-soft">
        <span>
          Mode shapes, rows {(b.from + 1).toLocaleString('en-GB')}–{b.to.toLocaleString('en-GB')} of{' '}
          {rows.shapes.length.toLocaleString('en-GB')}
          {rows.preview
            ? ` (the DOFs of evenly spaced nodes: ${rows.shapes.length.toLocaleString('en-GB')} of ${rows.size.toLocaleString('en-GB')})`
            : ''}
        </span>
        <PageControls
          page={b.page}
          pages={b.pages}
          onPage={setPage}
          label={`mode shapes of ${name}`}
        />
      </div>
      <Table caption={`Mode shapes of ${name}, page ${b.page + 1} of ${b.pages}`}>
        <thead>
          <tr>
            <Th caps={false} className="text-right">
              DOF
            </Th>
            {rows.labels ? <Th caps={false}>Label</Th> : null}
            {Array.from({ length: modes }, (_, j) => (
              <Th key={j} caps={false} className="text-right">
                φ{j + 1}
              </Th>
            ))}
          </tr>
        </thead>
        <tbody className="num">
          {rows.shapes.slice(b.from, b.to).map((row, k) => (
            <tr key={rows.dofs[b.from + k]}>
              <Td className="py-0.5 text-right">{rows.dofs[b.from + k]}</Td>
              {rows.labels ? <Td className="py-0.5">{rows.labels[b.from + k]}</Td> : null}
              {row.map((v, j) => (
                <Td key={j} className="py-0.5 text-right">
                  {sig(v, digits)}
                </Td>
              ))}
            </tr>
          ))}
        </tbody>
      </Table>
    </section>
  );
}
