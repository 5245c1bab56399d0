import { CriterionValues } from '../../../components/results/criterion-values';
import { useUnits } from '../../../components/results/units';
import type { CriteriaBlockResult } from '../api/results';

/**
 * Each acceptance criterion with its label, both sides in the sheet's unit system, and whether it
 * passed.
 */
export function CriteriaResult({
  result,
  digits,
}: {
  result: CriteriaBlockResult;
  digits: number;
}) {
  const units = useUnits();
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
          <CriterionValues
            criterion={c}
            system={units.system}
            digits={digits}
            className="num shrink-0 text-xs text-ink-soft"
          />
        </li>
      ))}
    </ul>
  );
}
