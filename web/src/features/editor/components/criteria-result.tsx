import type { CriteriaBlockResult } from '../api/results';

/** Each acceptance criterion with its label, both sides, and whether it passed. */
export function CriteriaResult({ result }: { result: CriteriaBlockResult }) {
  if (result.criteria.length === 0) return null;
  return (
    <ul className="flex flex-col gap-1" aria-label="Criteria">
      {result.criteria.map((c) => (
        <li
          key={c.line}
          data-line={c.line}
          className={`flex items-baseline gap-3 rounded-sm border-l-4 px-2 py-1 text-sm ${
            c.pass ? 'border-pass bg-pass-soft' : 'border-fail bg-fail-soft'
          }`}
        >
          <span className={`w-14 shrink-0 font-semibold ${c.pass ? 'text-pass' : 'text-fail'}`}>
            {c.pass ? 'Passed' : 'Failed'}
          </span>
          <span className="min-w-0 flex-1">{c.label}</span>
          {c.lhs !== null && c.rhs !== null ? (
            <span className="num shrink-0 text-xs text-ink-soft">
              {c.lhs} vs {c.rhs}
            </span>
          ) : c.values ? (
            <span className="num shrink-0 text-xs text-ink-soft">{c.values}</span>
          ) : null}
        </li>
      ))}
    </ul>
  );
}
