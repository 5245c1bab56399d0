import {
  autocompletion,
  type Completion,
  type CompletionContext,
  type CompletionResult,
} from '@codemirror/autocomplete';
import type { Extension } from '@codemirror/state';
import type { BlockKind } from '../api/types';
import { MATRIX_KEYS, MODES_KEYS, MODES_METHODS, SHEET_FUNCTIONS } from './sheet-language';
import type { ScopeName } from './scope';

const KEY_HINTS: Record<string, string> = {
  stiffness: 'name of K, e.g. frame.K',
  mass: 'name of M, e.g. frame.M',
  method: MODES_METHODS.join(' | '),
  count: 'number of modes',
  shift: 'target frequency, e.g. 24.5 Hz',
  tolerance: 'e.g. 1e-10',
  'max iterations': 'e.g. 200',
  normalize: 'mass | max | dof <n>',
  direction: 'influence vector for participation',
  name: 'results are bound under this name',
  unit: 'one unit for every entry, e.g. kN/m',
  symmetric: 'yes | no',
  from: 'name of an uploaded file',
};

/**
 * Completion of names in scope (and, in `modes` and `matrix` blocks, of the header keys and the
 * method names). `names(line)` is asked at the cursor's 1-based line so scope is current.
 */
export function sheetCompletion(
  kind: BlockKind,
  names: (line: number) => ScopeName[],
  uploads: () => string[],
): Extension {
  const source = (context: CompletionContext): CompletionResult | null => {
    const line = context.state.doc.lineAt(context.pos);
    const before = line.text.slice(0, context.pos - line.from);
    if (kind === 'modes' || kind === 'matrix') {
      const keys = kind === 'modes' ? MODES_KEYS : MATRIX_KEYS;
      if (!before.includes(':')) {
        const word = /[A-Za-z ]*$/.exec(before);
        const from = line.from + (before.length - (word?.[0].trimStart().length ?? 0));
        if (!context.explicit && before.trim() === '') return null;
        return {
          from,
          options: keys.map<Completion>((key) => ({
            label: `${key}: `,
            displayLabel: key,
            detail: KEY_HINTS[key] ?? '',
            type: 'property',
          })),
          validFor: /^[A-Za-z ]*$/,
        };
      }
      const key = before.slice(0, before.indexOf(':')).trim().toLowerCase();
      const word = context.matchBefore(/[\w.]*/);
      if (!word || (word.from === word.to && !context.explicit)) return null;
      if (key === 'method') {
        return { from: word.from, options: MODES_METHODS.map((m) => ({ label: m, type: 'enum' })) };
      }
      if (key === 'normalize') {
        return {
          from: word.from,
          options: ['mass', 'max', 'dof '].map((m) => ({ label: m, type: 'enum' })),
        };
      }
      if (key === 'from') {
        return {
          from: word.from,
          options: uploads().map((u) => ({ label: u, type: 'text', detail: 'upload' })),
        };
      }
      if (key === 'stiffness' || key === 'mass' || key === 'direction') {
        return {
          from: word.from,
          options: names(line.number).map((n) => ({
            label: n.label,
            detail: n.detail,
            type: 'variable',
          })),
          validFor: /^[\w.]*$/,
        };
      }
      return null;
    }
    if (kind !== 'calc' && kind !== 'criteria') return null;
    if (/#/.test(before)) return null;
    const word = context.matchBefore(/[A-Za-z_][\w.]*/);
    if (!word || (word.from === word.to && !context.explicit)) return null;
    return {
      from: word.from,
      options: [
        ...names(line.number).map<Completion>((n) => ({
          label: n.label,
          detail: n.detail,
          type: 'variable',
          boost: 1,
        })),
        ...SHEET_FUNCTIONS.map<Completion>((f) => ({ label: f, type: 'function' })),
      ],
      validFor: /^[\w.]*$/,
    };
  };
  return autocompletion({ override: [source], activateOnTyping: true, icons: false });
}
