import type { CalcBlockResult } from '../api/results';
import { CalcLineTex } from '../../../components/results/calc-line';
import { useUnits } from '../../../components/results/units';
import {
  largeMatrices,
  MatrixEntriesTable,
} from '../../../components/results/matrix-entries-table';

/** Each calc line as written by hand: the formula, the values substituted, the result. */
export function CalcResult({ result, digits }: { result: CalcBlockResult; digits: number }) {
  const units = useUnits();
  if (result.lines.length === 0) return null;
  return (
    <ol className="divide-y divide-rule/60" aria-label="Calculation results">
      {result.lines.map((line) => (
        <li
          key={line.line}
          className="flex flex-wrap items-baseline justify-between gap-x-4 py-1"
          data-line={line.line}
        >
          <span className="min-w-0 overflow-x-auto">
            <CalcLineTex line={line} system={units.system} digits={digits} />
          </span>
          {line.comment ? (
            <span className="min-w-0 text-xs text-ink-faint">{line.comment}</span>
          ) : null}
          <LargeMatrixEntries name={line.name ?? `line ${line.line}`} line={line} digits={digits} />
        </li>
      ))}
    </ol>
  );
}

/**
 * The entries of the large matrices a line made (a matrix too large to list, the K and M of a
 * generated model), folded under the line: a paged table each once opened.
 */
function LargeMatrixEntries({
  name,
  line,
  digits,
}: {
  name: string;
  line: CalcBlockResult['lines'][number];
  digits: number;
}) {
  const matrices = largeMatrices(name, line.value);
  if (matrices.length === 0) return null;
  return (
    <details className="w-full min-w-0 basis-full text-sm">
      <summary className="cursor-pointer text-xs text-ink-soft">
        Entries of {matrices.map((m) => m.name).join(' and ')}
      </summary>
      <div className="mt-1 flex flex-col gap-3">
        {matrices.map((m) => (
          <MatrixEntriesTable key={m.name} name={m.name} value={m.value} digits={digits} />
        ))}
      </div>
    </details>
  );
}
