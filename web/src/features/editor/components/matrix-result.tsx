import type { MatrixBlockResult } from '../api/results';
import { sig } from '../../../lib/format';
import { MatrixEntriesTable } from '../../../components/results/matrix-entries-table';

const PREVIEW = 6;

/** A matrix's name, size and unit, its symmetry, and the top-left corner of its entries. */
export function MatrixResult({ result, digits }: { result: MatrixBlockResult; digits: number }) {
  // A block that failed before its matrix was read has nothing to describe: its error says it.
  if (!result.ok && result.rows === 0) return null;
  const values = result.value?.type === 'matrix' ? result.value.values : null;
  const rows = values ? values.slice(0, PREVIEW) : [];
  return (
    <div className="flex flex-col gap-2 text-sm">
      <p>
        <span className="font-mono font-semibold">{result.name ?? 'unnamed'}</span>
        <span className="text-ink-soft">
          {' '}
          — {result.rows} × {result.cols}
          {result.unit ? (
            <>
              , in <span className="font-mono">{result.unit}</span>
            </>
          ) : null}
          {result.origin === 'upload' ? ', from an uploaded file' : null}
          {result.storage === 'sparse' && result.nonzeros !== undefined
            ? `; kept sparse (${result.nonzeros.toLocaleString('en-GB')} nonzeros) for the eigen solver`
            : null}
        </span>
        {result.rows === result.cols ? (
          <span className={`ml-2 text-xs ${result.symmetric ? 'text-pass' : 'text-fail'}`}>
            {result.symmetric ? 'symmetric' : 'not symmetric'}
          </span>
        ) : null}
      </p>
      {result.asymmetry && !result.symmetric ? (
        <p className="text-fail">
          Worst asymmetry at row {result.asymmetry.row}, column {result.asymmetry.col}:{' '}
          {sig(result.asymmetry.upper, digits)} against {sig(result.asymmetry.lower, digits)} (
          {sig(result.asymmetry.relative * 100, 2)} % of the largest entry).
        </p>
      ) : null}
      {rows.length > 0 ? (
        <table
          className="w-auto self-start border-collapse font-mono text-xs"
          aria-label={`Preview of ${result.name ?? 'matrix'}`}
        >
          <tbody>
            {rows.map((row, i) => (
              <tr key={i}>
                {row.slice(0, PREVIEW).map((v, j) => (
                  <td
                    key={j}
                    className={`px-2 py-0.5 text-right ${v === 0 ? 'text-ink-faint' : ''}`}
                  >
                    {sig(v, digits)}
                  </td>
                ))}
                {row.length > PREVIEW ? <td className="px-2 text-ink-faint">…</td> : null}
              </tr>
            ))}
            {values && values.length > PREVIEW ? (
              <tr>
                <td colSpan={PREVIEW} className="px-2 text-ink-faint">
                  ⋮ {values.length - PREVIEW} more rows
                </td>
              </tr>
            ) : null}
          </tbody>
        </table>
      ) : result.value?.type === 'matrix' && !values ? (
        result.value.entries ? (
          <MatrixEntriesTable name={result.name ?? 'matrix'} value={result.value} digits={digits} />
        ) : (
          <p className="text-xs text-ink-faint">
            Too large to preview; evaluate the sheet again to list its nonzero entries.
          </p>
        )
      ) : null}
    </div>
  );
}
