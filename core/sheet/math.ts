/**
 * The one restricted mathjs instance every sheet is evaluated with.
 *
 * Following mathjs' own security guidance (docs/expressions/security.md): the instance is made
 * with `create(all)`, the few units the trade needs are added, and then every function that could
 * reach the parser, create units, change the instance or produce non-deterministic results is
 * replaced by one that refuses with "X is not available in a sheet". The parser itself is kept in
 * a closure, so only the evaluator can parse.
 *
 * The instance is created lazily: importing core/ does not pay mathjs' start-up cost.
 */
import { all, create, type MathJsInstance, type MathNode } from 'mathjs';
import { EngineError } from '../errors';

/** Functions a sheet may not call. Each is replaced by one that throws. */
export const FORBIDDEN_FUNCTIONS = [
  'import',
  'createUnit',
  'evaluate',
  'parse',
  'compile',
  'simplify',
  'simplifyConstant',
  'simplifyCore',
  'rationalize',
  'derivative',
  'resolve',
  'reviver',
  'replacer',
  'chain',
  'parser',
  'help',
  'leafCount',
  'symbolicEqual',
  'random',
  'randomInt',
  'pickRandom',
] as const;

/**
 * Names refused wherever they appear in a sheet expression (checked on the parsed tree before
 * evaluation): the forbidden functions, plus the parts of the instance that change its
 * configuration or build new functions, which cannot be overridden through `import`.
 */
export const FORBIDDEN_NAMES: ReadonlySet<string> = new Set<string>([
  ...FORBIDDEN_FUNCTIONS,
  'config',
  'typed',
  'factory',
  'create',
  'on',
  'off',
  'once',
  'emit',
  'expression',
]);

export interface SheetMath {
  readonly math: MathJsInstance;
  /** The parser, captured before `parse` was disabled for sheets. */
  readonly parse: (expression: string) => MathNode;
}

let instance: SheetMath | undefined;
let matrixEntryLimit = 4_000_000;

/** Sets the largest matrix `zeros`, `ones`, `identity` and `resize` may create (entries). */
export function setMatrixEntryLimit(limit: number): void {
  matrixEntryLimit = limit;
}

/** The current limit on matrix entries. */
export function getMatrixEntryLimit(): number {
  return matrixEntryLimit;
}

/** Functions that allocate a matrix from sizes: checked against the limit before allocating. */
const SIZED_FUNCTIONS = ['zeros', 'ones', 'identity', 'resize'] as const;

function sizeArguments(math: MathJsInstance, args: unknown[]): number[] {
  const out: number[] = [];
  for (const a of args) {
    if (typeof a === 'number') out.push(a);
    else if (Array.isArray(a))
      out.push(...(a.flat(4) as unknown[]).filter((x): x is number => typeof x === 'number'));
    else if (math.isMatrix(a)) {
      out.push(
        ...((a as { toArray(): unknown[] }).toArray().flat(4) as unknown[]).filter(
          (x): x is number => typeof x === 'number',
        ),
      );
    }
  }
  return out;
}
/** Entries a range would hold, from numeric bounds and step (1 when not numbers: mathjs checks). */
function rangeCount(args: unknown[]): number {
  if (typeof args[0] === 'string') {
    // 'start:end' or 'start:step:end'
    const parts = args[0].split(':').map(Number);
    const [a, b, c] = parts;
    return rangeCount(parts.length === 3 ? [a, c, b] : [a, b]);
  }
  const numbers = args.map((a) =>
    typeof a === 'number'
      ? a
      : typeof a === 'object' && a !== null && typeof (a as { value?: unknown }).value === 'number'
        ? (a as { value: number }).value
        : Number.NaN,
  );
  const [start, end, step = 1] = numbers;
  if (start === undefined || end === undefined || !Number.isFinite(start)) return 1;
  if (!Number.isFinite(end) || step === 0) return Infinity;
  return Math.floor(Math.abs((end - start) / step)) + 1;
}
const extraFunctions: Record<string, unknown> = {};

/**
 * Registers functions (the matrix generators) that sheets may call. Must run before the first
 * call of `sheetMath()`; later registrations are refused.
 */
export function registerSheetFunctions(functions: Record<string, unknown>): void {
  if (instance) {
    throw new EngineError('INVALID_OPTION', 'Sheet functions must be registered before first use.');
  }
  Object.assign(extraFunctions, functions);
}

/** Returns the shared restricted instance, creating it on first use. */
export function sheetMath(): SheetMath {
  if (instance) return instance;
  const math = create(all!, { number: 'number', matrix: 'Matrix' });
  // Revolutions per minute, for machine speeds: 1 rpm = 1/60 Hz (SI definition of the minute).
  math.createUnit('rpm', { definition: '1 / min' });
  const parse = math.parse.bind(math) as (expression: string) => MathNode;
  if (Object.keys(extraFunctions).length > 0) math.import(extraFunctions, { override: false });
  const guarded: Record<string, unknown> = {};
  for (const name of SIZED_FUNCTIONS) {
    const original = math[name] as unknown as (...args: unknown[]) => unknown;
    guarded[name] = (...args: unknown[]) => {
      // resize(x, size): only the size counts.
      const dims = sizeArguments(math, name === 'resize' ? args.slice(1, 2) : args);
      const entries = dims.reduce((a, b) => a * Math.max(1, Math.abs(b)), 1);
      if (entries > matrixEntryLimit) {
        throw new EngineError(
          'SHEET_LIMIT',
          `${name}(${dims.join(', ')}) would make ${entries} entries; a sheet value may hold at most ${matrixEntryLimit}.`,
        );
      }
      return original(...args);
    };
  }
  // range(a, b[, step]) and a:b[:step] (a range node calls range): the count is known from the
  // bounds, so a range past the limit is refused before it is made.
  // The parser's a:b includes b (mathjs's range transform); the function range(a, b) does not.
  // Both are guarded, and the transform rides on the guarded function so that import keeps it.
  const range = math.range as unknown as (...args: unknown[]) => unknown;
  const rangeTransform = (
    math.expression as unknown as { transform: { range: (...args: unknown[]) => unknown } }
  ).transform.range;
  const checkRange = (args: unknown[]): void => {
    const entries = rangeCount(args);
    if (entries > matrixEntryLimit) {
      throw new EngineError(
        'SHEET_LIMIT',
        `This range would make ${entries.toExponential(2)} entries; a sheet value may hold at most ${matrixEntryLimit}.`,
      );
    }
  };
  const guardedRange = (...args: unknown[]) => {
    checkRange(args);
    return range(...args);
  };
  guardedRange.transform = (...args: unknown[]) => {
    checkRange(args);
    return rangeTransform(...args);
  };
  guarded.range = guardedRange;
  math.import(guarded, { override: true });
  const refusals: Record<string, () => never> = {};
  for (const name of FORBIDDEN_FUNCTIONS) {
    refusals[name] = () => {
      throw new EngineError('SHEET_EVAL', `${name} is not available in a sheet.`, {
        function: name,
      });
    };
  }
  math.import(refusals, { override: true });
  instance = { math, parse };
  return instance;
}
