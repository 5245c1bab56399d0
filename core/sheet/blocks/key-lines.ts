/**
 * The `key: value` lines of the modes and response blocks: one key per line, `#` comments, blank
 * lines allowed; each key once. Parse errors are reported at their line and reading goes on.
 */
import { EngineError } from '../../errors';
import { dependencyNote, parseExpression, report, type EvalContext } from '../context';
import { blockLines, splitComment } from '../source';
import type { SheetBlock, SheetLocation } from '../types';

export interface KeyLine {
  value: string;
  line: number;
}

export interface KeyLines<K extends string> {
  keys: Partial<Record<K, KeyLine>>;
  /** True when any line could not be read. */
  bad: boolean;
}

/**
 * Reads a block's `key: value` lines against its list of keys (lower case, words separated by one
 * space), reporting a line that is not `key: value`, an unknown key, a repeated key or an empty
 * value at its line.
 */
export function readKeyLines<K extends string>(
  ctx: EvalContext,
  block: SheetBlock,
  at: (line: number) => SheetLocation,
  known: readonly K[],
  blockWords: string,
  example: string,
): KeyLines<K> {
  const keys: Partial<Record<K, KeyLine>> = {};
  let bad = false;
  const refuse = (line: number, message: string) => {
    report(ctx, at(line), new EngineError('SHEET_PARSE', message));
    bad = true;
  };
  blockLines(block.source).forEach((raw, i) => {
    const line = i + 1;
    const { code } = splitComment(raw);
    if (code.trim() === '') return;
    const kv = /^\s*([A-Za-z][A-Za-z0-9 ]*?)\s*:\s*(.*)$/.exec(code);
    if (!kv) {
      refuse(
        line,
        `Expected "key: value" (for example "${example}"); the keys are ${known.join(', ')}.`,
      );
      return;
    }
    const key = kv[1]!.toLowerCase().replace(/\s+/g, ' ') as K;
    if (!known.includes(key)) {
      refuse(line, `Unknown key "${kv[1]}"; the keys of ${blockWords} are ${known.join(', ')}.`);
      return;
    }
    const seen = keys[key];
    if (seen) {
      refuse(line, `"${key}:" is given twice (first on line ${seen.line}).`);
      return;
    }
    if (kv[2]!.trim() === '') {
      refuse(line, `"${key}:" has no value.`);
      return;
    }
    keys[key] = { value: kv[2]!.trim(), line };
  });
  return { keys, bad };
}

/**
 * The `name:` of a block must be a valid name; reports at its line and returns false otherwise.
 */
export function checkBlockName(
  ctx: EvalContext,
  nameLine: KeyLine | undefined,
  at: (line: number) => SheetLocation,
): boolean {
  if (!nameLine || /^[A-Za-z][A-Za-z0-9_]*$/.test(nameLine.value)) return true;
  report(
    ctx,
    at(nameLine.line),
    new EngineError(
      'SHEET_PARSE',
      `"${nameLine.value}" is not a valid name: use letters, digits and _, starting with a letter.`,
    ),
  );
  return false;
}

/**
 * Reports one note, at the first of `expressionKeys` whose value uses a name that failed above,
 * and returns true: such a block is not evaluated (its other keys would only repeat the note).
 * A value that does not parse is left for the key's own reading to report.
 */
export function reportDependency<K extends string>(
  ctx: EvalContext,
  keys: Partial<Record<K, KeyLine>>,
  expressionKeys: readonly K[],
  at: (line: number) => SheetLocation,
): boolean {
  for (const k of expressionKeys) {
    const kl = keys[k];
    if (!kl) continue;
    let note: EngineError | null;
    try {
      note = dependencyNote(ctx, parseExpression(ctx, kl.value));
    } catch {
      continue;
    }
    if (note) {
      report(ctx, at(kl.line), note);
      return true;
    }
  }
  return false;
}
