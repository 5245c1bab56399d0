// Highlighting for our block syntax (core/sheet/README.md), one small stream tokenizer per block
// kind. The colours are the product's own (tailwind.config.ts), kept quiet: ink for names, the
// accent for definitions and keys, a warm brown for units, faint for comments.
import {
  HighlightStyle,
  StreamLanguage,
  syntaxHighlighting,
  type StringStream,
} from '@codemirror/language';
import { tags as t } from '@lezer/highlight';
import type { Extension } from '@codemirror/state';
import { RESPONSE_ANALYSES, RESPONSE_KEYS } from '../../../../../core/vocabulary';
import type { BlockKind } from '../api/types';

export const MODES_KEYS = [
  'stiffness',
  'mass',
  'method',
  'count',
  'shift',
  'tolerance',
  'max iterations',
  'normalize',
  'direction',
  'name',
] as const;

export const MATRIX_KEYS = ['name', 'unit', 'symmetric', 'from', 'dofs'] as const;

/** The keys of a response block, lower case: the engine's own list (core/vocabulary.ts). */
export { RESPONSE_KEYS };

/** Words a response block's keyword keys take. */
export const RESPONSE_CHOICES: Record<string, readonly string[]> = {
  analysis: RESPONSE_ANALYSES,
  spectrum: ['ASCE 7-16', 'EN 1998-1 type 1', 'EN 1998-1 type 2', 'table'],
  combine: ['cqc', 'srss'],
  directional: ['srss', '100-30'],
  ground: ['A', 'B', 'C', 'D', 'E'],
  method: ['exact', 'newmark'],
  'table unit': ['g', 'm/s^2'],
  'record unit': ['g', 'm/s^2'],
};

export const MODES_METHODS = [
  'auto',
  'inverse',
  'forward',
  'shifted',
  'subspace',
  'lanczos',
  'dense',
];

/** Functions the sheet language offers (mathjs built-ins engineers use, and our generators). */
export const SHEET_FUNCTIONS = [
  'sqrt',
  'abs',
  'sin',
  'cos',
  'tan',
  'exp',
  'log',
  'log10',
  'min',
  'max',
  'sum',
  'round',
  'pow',
  'to',
  'in',
  'storey_chain',
  'beam',
  'plane_frame',
  'size',
  'transpose',
  'diag',
  'det',
  'inv',
] as const;

const CONSTANTS = new Set(['pi', 'e', 'g', 'true', 'false', 'Infinity']);
const FUNCTIONS = new Set<string>(SHEET_FUNCTIONS);

type State = { lineStart: boolean; afterNumber: boolean; afterKey: boolean };

function startState(): State {
  return { lineStart: true, afterNumber: false, afterKey: false };
}

/** calc and criteria: mathjs statements with units and `#` comments. */
function expressionToken(stream: StringStream, state: State): string | null {
  if (stream.sol()) {
    state.lineStart = true;
    state.afterNumber = false;
  }
  if (stream.eatSpace()) return null;
  const wasLineStart = state.lineStart;
  state.lineStart = false;
  if (stream.peek() === '#') {
    stream.skipToEnd();
    return 'comment';
  }
  if (stream.match(/^"(?:[^"\\]|\\.)*"?/)) {
    state.afterNumber = false;
    return 'string';
  }
  if (stream.match(/^(?:\d+\.?\d*|\.\d+)(?:[eE][+-]?\d+)?/)) {
    state.afterNumber = true;
    return 'number';
  }
  const word = stream.match(/^[A-Za-z_][\w]*/) as RegExpMatchArray | null;
  if (word) {
    const name = word[0];
    const afterNumber = state.afterNumber;
    state.afterNumber = false;
    // `k1 = …` at the start of a line defines k1.
    if (wasLineStart && stream.match(/^\s*=(?!=)/, false)) return 'def';
    if (stream.match(/^\s*\(/, false)) return FUNCTIONS.has(name) ? 'builtin' : 'variableName';
    if (CONSTANTS.has(name)) return 'atom';
    if (name === 'to' || name === 'in' || name === 'and' || name === 'or' || name === 'not') {
      return 'keyword';
    }
    // A word straight after a number is its unit: `24 kN/mm`, `18 t`.
    if (afterNumber) return 'unit';
    return 'variableName';
  }
  if (stream.match(/^(?:>=|<=|==|!=|[<>=+\-*/^%'])/)) {
    // A unit continues after `/` or `^`: `24 kN/mm`, `2 m^2`.
    if (!(stream.current() === '/' || stream.current() === '^')) state.afterNumber = false;
    else if (state.afterNumber) state.afterNumber = true;
    return 'operator';
  }
  stream.next();
  state.afterNumber = false;
  return null;
}

/** matrix and modes: `key: value` header lines; matrix rows of numbers. */
function keyValueToken(keys: readonly string[]) {
  return (stream: StringStream, state: State): string | null => {
    if (stream.sol()) {
      state.lineStart = true;
      state.afterKey = false;
      state.afterNumber = false;
      const key = stream.match(
        /^\s*([A-Za-z][A-Za-z0-9 ]*?)\s*:/,
        false,
      ) as RegExpMatchArray | null;
      if (key && key[1]) {
        stream.match(/^\s*[A-Za-z][A-Za-z0-9 ]*?(?=\s*:)/);
        state.afterKey = true;
        return keys.includes(key[1].toLowerCase()) ? 'propertyName' : 'invalid';
      }
    }
    if (stream.eatSpace()) return null;
    if (stream.peek() === '#') {
      stream.skipToEnd();
      return 'comment';
    }
    if (state.afterKey && stream.eat(':')) return 'punctuation';
    if (stream.match(/^[+-]?(?:\d+\.?\d*|\.\d+)(?:[eE][+-]?\d+)?/)) {
      state.afterNumber = true;
      return 'number';
    }
    const word = stream.match(/^[A-Za-z_][\w.]*/) as RegExpMatchArray | null;
    if (word) {
      const unit = state.afterNumber;
      state.afterNumber = false;
      if (unit) return 'unit';
      return state.afterKey ? 'string' : 'variableName';
    }
    stream.next();
    return null;
  };
}

const tokenTable = {
  unit: t.unit,
  def: t.definition(t.variableName),
  builtin: t.standard(t.function(t.variableName)),
};

const calcLanguage = StreamLanguage.define<State>({
  name: 'modewright-calc',
  startState,
  token: expressionToken,
  languageData: { commentTokens: { line: '#' } },
  tokenTable,
});

const matrixLanguage = StreamLanguage.define<State>({
  name: 'modewright-matrix',
  startState,
  token: keyValueToken(MATRIX_KEYS),
  languageData: { commentTokens: { line: '#' } },
  tokenTable,
});

const modesLanguage = StreamLanguage.define<State>({
  name: 'modewright-modes',
  startState,
  token: keyValueToken(MODES_KEYS),
  languageData: { commentTokens: { line: '#' } },
  tokenTable,
});

const responseLanguage = StreamLanguage.define<State>({
  name: 'modewright-response',
  startState,
  token: keyValueToken(RESPONSE_KEYS),
  languageData: { commentTokens: { line: '#' } },
  tokenTable,
});

const highlight = HighlightStyle.define([
  { tag: t.comment, color: '#6f7379', fontStyle: 'italic' },
  { tag: t.number, color: '#1d2126' },
  { tag: t.unit, color: '#8a4b12' }, // the palette's caution (tailwind.config.ts)
  { tag: t.definition(t.variableName), color: '#154d42', fontWeight: '600' },
  { tag: t.variableName, color: '#1d2126' },
  { tag: t.standard(t.function(t.variableName)), color: '#1f6b5c' },
  { tag: t.propertyName, color: '#154d42', fontWeight: '600' },
  { tag: t.string, color: '#4a4f57' },
  { tag: [t.atom, t.bool], color: '#5b3f8c' },
  { tag: t.keyword, color: '#1f6b5c', fontWeight: '600' },
  { tag: t.operator, color: '#4a4f57' },
  { tag: t.invalid, color: '#a3261b', textDecoration: 'underline wavy' },
]);

/** The highlighting extension for one block kind; text blocks are plain Markdown. */
export function sheetLanguage(kind: BlockKind): Extension[] {
  const style = syntaxHighlighting(highlight);
  switch (kind) {
    case 'calc':
    case 'criteria':
      return [calcLanguage, style];
    case 'matrix':
      return [matrixLanguage, style];
    case 'modes':
      return [modesLanguage, style];
    case 'response':
      return [responseLanguage, style];
    default:
      return [style];
  }
}
