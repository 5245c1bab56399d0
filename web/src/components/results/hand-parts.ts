import type { CalcBlockResult } from '../../../../core/index';

// Two LaTeX strings that read the same: spacing commands, mathjs's `~` spaces and braces ignored,
// and a simple \frac{a}{b} read as a/b (the formula writes a typed `342 kN/mm` as a fraction, the
// result inline).
const FRACTION = /\\frac\{((?:[^{}]|\{[^{}]*\})*)\}\{((?:[^{}]|\{[^{}]*\})*)\}/g;
const squash = (tex: string) => tex.replace(FRACTION, '$1/$2').replace(/\\[,;:!]|~|\s|[{}]/g, '');

/**
 * formula = substitution = result, as written by hand, leaving out a step that only repeats the
 * one before it (`h = 3.6 m` needs no `= 3.6 m` after it).
 */
export function handParts(latex: CalcBlockResult['lines'][number]['latex']): string[] {
  const parts = [latex.formula];
  let last = latex.formula.includes('=')
    ? latex.formula.slice(latex.formula.lastIndexOf('=') + 1)
    : latex.formula;
  if (latex.substituted && squash(latex.substituted) !== squash(last)) {
    parts.push(latex.substituted);
    last = latex.substituted;
  }
  if (squash(latex.result) !== squash(last)) parts.push(latex.result);
  return parts;
}
