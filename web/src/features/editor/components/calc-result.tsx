import type { CalcBlockResult } from '../api/results';
import { Tex } from './tex';

const squash = (tex: string) => tex.replace(/\\[,;:!]|\s|[{}]/g, '');

/**
 * formula = substitution = result, leaving out a step that repeats the one before it
 * (`h = 3.6 m` needs no `= 3.6 m` after it).
 */
function handParts(latex: CalcBlockResult['lines'][number]['latex']): string[] {
  const parts = [latex.formula];
  const rhs = latex.formula.includes('=')
    ? latex.formula.slice(latex.formula.lastIndexOf('=') + 1)
    : latex.formula;
  let last = rhs;
  if (latex.substituted && squash(latex.substituted) !== squash(last)) {
    parts.push(latex.substituted);
    last = latex.substituted;
  }
  if (squash(latex.result) !== squash(last)) parts.push(latex.result);
  return parts;
}

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
            className="flex items-baseline justify-between gap-4 py-1"
            data-line={line.line}
          >
            <span className="min-w-0 overflow-x-auto">
              <Tex tex={parts.join(' = ')} />
              <span className="sr-only"> result {line.display}</span>
            </span>
            {line.comment ? (
              <span className="shrink-0 text-xs text-ink-faint">{line.comment}</span>
            ) : null}
          </li>
        );
      })}
    </ol>
  );
}
