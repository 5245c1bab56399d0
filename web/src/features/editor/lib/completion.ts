import {
  autocompletion,
  type Completion,
  type CompletionContext,
  type CompletionResult,
} from '@codemirror/autocomplete';
import type { Extension } from '@codemirror/state';
import type { BlockKind } from '../api/types';
import {
  MATRIX_KEYS,
  MODES_KEYS,
  MODES_METHODS,
  RESPONSE_CHOICES,
  RESPONSE_KEYS,
  SHEET_FUNCTIONS,
} from './sheet-language';
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

const RESPONSE_HINTS: Record<string, string> = {
  modes: 'name of a modes block above',
  analysis: 'spectrum | harmonic | history | walking',
  damping: 'ratio, e.g. 0.05, or one per mode',
  name: 'results are bound under this name',
  spectrum: 'ASCE 7-16 | EN 1998-1 type 1|2 | table',
  sds: 'S_DS in g (ASCE 7-16)',
  sd1: 'S_D1 in g (ASCE 7-16)',
  tl: 'T_L, e.g. 8 s',
  r: 'response modification coefficient R',
  ie: 'importance factor I_e',
  ground: 'A–E (EN 1998-1)',
  ag: 'a_g, e.g. 2.5 m/s^2 or 0.25 (× g)',
  q: 'behaviour factor (design spectrum)',
  table: 'uploaded CSV or two-column matrix',
  'table unit': 'g | m/s^2',
  combine: 'cqc | srss',
  direction: 'a direction of the modes, e.g. x or x, y',
  directional: 'srss | 100-30',
  heights: 'storey heights, e.g. 3.5 m',
  'elf base shear': 'V_ELF to scale to, e.g. 1450 kN',
  'elf share': '1.0 (ASCE 7-16) or 0.85',
  force: 'force per DOF, e.g. [0, 0, 5 kN]; walking P_o',
  unbalance: 'm·e, e.g. 12 kg m',
  at: 'DOF number',
  'running speed': 'e.g. 1480 rpm',
  range: 'e.g. [2 Hz, 60 Hz]',
  points: 'frequencies in the range',
  rayleigh: 'two frequencies, e.g. [8 Hz, 40 Hz]',
  dofs: 'DOF numbers, e.g. [1, 3]',
  record: 'uploaded CSV or two-column matrix (t, value)',
  'record unit': 'g | m/s^2 (ground record)',
  step: 'time step, e.g. 0.005 s',
  duration: 'end time, e.g. 20 s',
  method: 'exact | newmark',
  mode: 'mode number (walking)',
  limit: 'acceleration limit, e.g. 0.7 m/s^2',
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
    if (kind === 'modes' || kind === 'matrix' || kind === 'response') {
      const keys: readonly string[] =
        kind === 'modes' ? MODES_KEYS : kind === 'response' ? RESPONSE_KEYS : MATRIX_KEYS;
      const hints = kind === 'response' ? RESPONSE_HINTS : KEY_HINTS;
      if (!before.includes(':')) {
        const word = /[A-Za-z ]*$/.exec(before);
        const from = line.from + (before.length - (word?.[0].trimStart().length ?? 0));
        if (!context.explicit && before.trim() === '') return null;
        return {
          from,
          options: keys.map<Completion>((key) => ({
            label: `${key}: `,
            displayLabel: key,
            detail: hints[key] ?? '',
            type: 'property',
          })),
          validFor: /^[A-Za-z ]*$/,
        };
      }
      const key = before.slice(0, before.indexOf(':')).trim().toLowerCase();
      const word = context.matchBefore(/[\w.]*/);
      if (!word || (word.from === word.to && !context.explicit)) return null;
      if (kind === 'response' && RESPONSE_CHOICES[key]) {
        return {
          from: word.from,
          options: RESPONSE_CHOICES[key].map((m) => ({ label: m, type: 'enum' })),
        };
      }
      if (kind === 'response' && (key === 'table' || key === 'record')) {
        return {
          from: word.from,
          options: [
            ...uploads().map((u) => ({ label: u, type: 'text', detail: 'upload' })),
            ...names(line.number).map((n) => ({
              label: n.label,
              detail: n.detail,
              type: 'variable',
            })),
          ],
        };
      }
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
      if (key === 'stiffness' || key === 'mass' || key === 'direction' || key === 'modes') {
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
