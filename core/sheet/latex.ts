/**
 * LaTeX of sheet formulas: engineering names (`f_1` → f₁, `k_storey` → k with an upright
 * "storey" subscript, Greek letters by name), units upright, and the "values substituted" form
 * in which every name is replaced by its value with its unit.
 */
import type { MathNode } from 'mathjs';
import { formatValue, quotedTex, texKey, type FormatContext } from './format';

const GREEK = new Set([
  'alpha',
  'beta',
  'gamma',
  'delta',
  'epsilon',
  'zeta',
  'eta',
  'theta',
  'iota',
  'kappa',
  'lambda',
  'mu',
  'nu',
  'xi',
  'pi',
  'rho',
  'sigma',
  'tau',
  'upsilon',
  'phi',
  'chi',
  'psi',
  'omega',
  'Gamma',
  'Delta',
  'Theta',
  'Lambda',
  'Xi',
  'Pi',
  'Sigma',
  'Upsilon',
  'Phi',
  'Psi',
  'Omega',
  'varepsilon',
  'vartheta',
  'varphi',
]);

function namePart(part: string, subscript: boolean): string {
  if (GREEK.has(part)) return `\\${part}`;
  if (/^\d+$/.test(part) || part.length === 1) return part;
  // A letter followed by digits (k1, m12) reads as a subscripted letter.
  const m = /^([A-Za-z])(\d+)$/.exec(part);
  if (m && !subscript) return `${m[1]}_{${m[2]}}`;
  return `\\mathrm{${part}}`;
}

/**
 * LaTeX of a sheet name.
 *
 * @example
 * latexName('f_1') // 'f_{1}'
 * latexName('k_storey') // 'k_{\\mathrm{storey}}'
 * latexName('Delta_t') // '\\Delta_{t}'
 * latexName('omega') // '\\omega'
 */
export function latexName(name: string): string {
  const parts = name.split('_').filter((p) => p !== '');
  if (parts.length === 0) return '\\_';
  const [head, ...subs] = parts as [string, ...string[]];
  const base = namePart(head, false);
  if (subs.length === 0) return base;
  if (base.includes('_{')) return `{${base}}_{${subs.map((s) => namePart(s, true)).join(',')}}`;
  return `${base}_{${subs.map((s) => namePart(s, true)).join(',')}}`;
}

export interface TexContext {
  scope: Map<string, unknown>;
  format: FormatContext;
  /** True: replace names by their values. */
  substitute: boolean;
  /** Set to true when a substitution happened. */
  substituted: { any: boolean };
  isUnitName: (name: string) => boolean;
  evaluate: (node: MathNode) => unknown;
  /** How names were shown on their defining lines (used when the value is still the same). */
  shown?: ReadonlyMap<string, { value: unknown; latex: string }>;
}

const SUBSTITUTION_LIMIT = 16; // entries: larger matrices keep their name in the substituted form

function valueTex(v: unknown, ctx: TexContext): string | null {
  try {
    if (
      ctx.format.math.isMatrix(v) &&
      (v as { size(): number[] }).size().reduce((a, b) => a * b, 1) > SUBSTITUTION_LIMIT
    ) {
      return null;
    }
    if (
      typeof v === 'function' ||
      (v !== null &&
        typeof v === 'object' &&
        !ctx.format.math.isUnit(v) &&
        !ctx.format.math.isMatrix(v))
    ) {
      return null;
    }
    const f = formatValue(v, { ...ctx.format, name: null });
    return parenthesize(v, f.latex, ctx);
  } catch {
    return null;
  }
}

function parenthesize(v: unknown, latex: string, ctx: TexContext): string {
  const needsParens =
    ctx.format.math.isUnit(v) || (typeof v === 'number' && v < 0) || latex.includes('\\times');
  return needsParens ? `\\left(${latex}\\right)` : latex;
}

/** LaTeX of a value as substituted into a formula: parenthesized where it has a unit. */
export function substitutionTex(
  v: unknown,
  latex: string,
  ctx: Pick<TexContext, 'format'>,
): string {
  return parenthesize(v, latex, ctx as TexContext);
}

function objectTex(n: MathNode, options: object): string {
  const props = (n as unknown as { properties: Record<string, MathNode> }).properties;
  const entries = Object.entries(props).map(
    ([key, value]) => `${texKey(key)}{:}\\,${value.toTex({ ...options })}`,
  );
  return `\\{${entries.join(',\\allowbreak\\ ')}\\}`;
}

/** LaTeX of an expression, with names or (when `substitute`) values. */
export function expressionTex(node: MathNode, ctx: TexContext): string {
  const handler = (n: MathNode, options: object): string | undefined => {
    // A quoted word ("pinned-pinned") stays a word: upright, its hyphen not a minus sign.
    if (
      n.type === 'ConstantNode' &&
      typeof (n as unknown as { value: unknown }).value === 'string'
    ) {
      return ` ${quotedTex((n as unknown as { value: string }).value)}`;
    }
    // An object argument ({E: E, I: I_v, …}) as it is written, not as a table; plain braces
    // and \\allowbreak after each entry so a long call wraps in a narrow column.
    if (n.type === 'ObjectNode') return ` ${objectTex(n, options)}`;
    if (n.type === 'FunctionNode') {
      const call = n as unknown as { fn: MathNode; args: MathNode[] };
      if (call.fn.type === 'SymbolNode' && call.args.some((a) => a.type === 'ObjectNode')) {
        const fname = (call.fn as unknown as { name: string }).name.replace(/_/g, '\\_');
        const args = call.args.map((a) =>
          a.type === 'ObjectNode' ? objectTex(a, options) : a.toTex({ ...options }),
        );
        return ` \\mathrm{${fname}}(${args.join(',\\allowbreak\\ ')})`;
      }
    }
    if (n.type === 'SymbolNode') {
      const name = (n as unknown as { name: string }).name;
      if (ctx.scope.has(name)) {
        if (ctx.substitute) {
          const shown = ctx.shown?.get(name);
          const t =
            shown && shown.value === ctx.scope.get(name)
              ? shown.latex
              : valueTex(ctx.scope.get(name), ctx);
          if (t !== null) {
            ctx.substituted.any = true;
            return ` ${t}`;
          }
        }
        return ` ${latexName(name)}`;
      }
      if (ctx.isUnitName(name)) return ` \\mathrm{${name}}`;
      if (name === 'pi' || name === 'e' || name === 'Infinity') return undefined;
      return ` ${latexName(name)}`;
    }
    if (n.type === 'AccessorNode' && ctx.substitute) {
      try {
        const t = valueTex(ctx.evaluate(n), ctx);
        if (t !== null) {
          ctx.substituted.any = true;
          return ` ${t}`;
        }
      } catch {
        return undefined;
      }
    }
    if (n.type === 'FunctionNode') {
      const fn = (n as unknown as { fn: MathNode; args: MathNode[] }).fn;
      const fname = fn.type === 'SymbolNode' ? (fn as unknown as { name: string }).name : null;
      if (fname && (ctx.scope.has(fname) || fname.includes('_'))) {
        const args = (n as unknown as { args: MathNode[] }).args.map((a) =>
          a.toTex({ ...options }),
        );
        return ` \\mathrm{${fname.replace(/_/g, '\\_')}}\\left(${args.join(',')}\\right)`;
      }
    }
    return undefined;
  };
  return node.toTex({ handler, implicit: 'hide', parenthesis: 'auto' } as object);
}
