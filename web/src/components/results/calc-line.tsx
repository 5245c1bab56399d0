import type { CalcBlockResult } from '../../../../core/index';
import type { UnitSystem } from '../../../../core/display-units';
import { handParts } from './hand-parts';
import { Tex } from './tex';
import { usCalcResult } from './units';

/**
 * One calc line as written by hand (formula = substitution = result), with a computed result in
 * the page's unit system: in US customary a computed quantity ends "= … kip/in" after the SI
 * result the engine wrote, so the check of the arithmetic stays in the units it was done in.
 */
export function CalcLineTex({
  line,
  system,
  digits,
}: {
  line: CalcBlockResult['lines'][number];
  system: UnitSystem;
  digits: number;
}) {
  const us = usCalcResult(line, system, digits);
  const parts = handParts(line.latex);
  if (us) parts.push(us.tex);
  return (
    <>
      <Tex tex={parts.join(' = ')} />
      <span className="sr-only"> result {us ? us.display : line.display}</span>
    </>
  );
}
