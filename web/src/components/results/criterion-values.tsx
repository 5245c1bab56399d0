import type { UnitSystem } from '../../../../core/display-units';
import type { CriterionResult } from '../../../../core/index';
import { criterionText } from './criterion-text';

/** The sides of one criterion ("0.4921 in vs 0.9843 in") in `system`; nothing when none shown. */
export function CriterionValues({
  criterion,
  system,
  digits,
  className = 'font-mono text-xs text-ink-soft',
}: {
  criterion: CriterionResult;
  system: UnitSystem;
  digits: number;
  className?: string;
}) {
  const text = criterionText(criterion, system, digits);
  return text === null ? null : (
    <span className={className} data-testid="criterion-values">
      {text}
    </span>
  );
}
