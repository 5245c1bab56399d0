import type { CalcBlockResult } from '../api/results';
import { CalcLineTex } from '../../../components/results/calc-line';
import { useUnits } from '../../../components/results/units';

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
        </li>
      ))}
    </ol>
  );
}
