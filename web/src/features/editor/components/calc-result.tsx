import type { CalcBlockResult } from '../api/results';
import { handParts, Tex } from '../../../components/results';

/** Each calc line as written by hand: the formula, the values substituted, the result. */
export function CalcResult({ result }: { result: CalcBlockResult }) {
  if (result.lines.length === 0) return null;
  return (
    <ol className="divide-y divide-rule/60" aria-label="Calculation results">
      {result.lines.map((line) => {
        const parts = handParts(line.latex);
        return (
          <li
            key={line.line}
            className="flex flex-wrap items-baseline justify-between gap-x-4 py-1"
            data-line={line.line}
          >
            <span className="min-w-0 overflow-x-auto">
              <Tex tex={parts.join(' = ')} />
              <span className="sr-only"> result {line.display}</span>
            </span>
            {line.comment ? (
              <span className="min-w-0 text-xs text-ink-faint">{line.comment}</span>
            ) : null}
          </li>
        );
      })}
    </ol>
  );
}
