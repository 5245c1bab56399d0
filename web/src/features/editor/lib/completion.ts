import {
  autocompletion,
  type Completion,
  type CompletionContext,
  type CompletionResult,
} from '@codemirror/autocomplete';
import type { Extension } from '@codemirror/state';
import { hoverTooltip } from '@codemirror/view';
import { functionReference, keyReference } from '../../../config/sheet-reference';
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

/** A key's value as the reference states it, beside the key in the completion list. */
const keyHint = (kind: BlockKind, key: string) => keyReference(kind, key)?.value ?? '';

/** A function's signature beside it, its units and summary in the info panel. */
function functionOption(name: string): Completion {
  const ref = functionReference(name);
  return {
    label: name,
    type: 'function',
    ...(ref
      ? { detail: ref.signature, info: `${ref.summary} Units: ${ref.units}.`.replace(/`/g, '') }
      : {}),
  };
}

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
      if (!before.includes(':')) {
        const word = /[A-Za-z ]*$/.exec(before);
        const from = line.from + (before.length - (word?.[0].trimStart().length ?? 0));
        if (!context.explicit && before.trim() === '') return null;
        return {
          from,
          options: keys.map<Completion>((key) => ({
            label: `${key}: `,
            displayLabel: key,
            detail: keyHint(kind, key),
            info: keyReference(kind, key)?.summary ?? '',
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
        ...SHEET_FUNCTIONS.map(functionOption),
      ],
      validFor: /^[\w.]*$/,
    };
  };
  return autocompletion({ override: [source], activateOnTyping: true, icons: false });
}

/** The reference's words for a name under the pointer: a function's signature or a block key. */
export function referenceAt(kind: BlockKind, lineText: string, column: number): string | null {
  if (kind === 'modes' || kind === 'matrix' || kind === 'response') {
    const colon = lineText.indexOf(':');
    if (colon < 0 || column > colon) return null;
    const key = lineText.slice(0, colon).trim().toLowerCase();
    const ref = keyReference(kind, key);
    return ref
      ? `${ref.key}: ${ref.value}\n${ref.summary}${ref.default ? ` Default: ${ref.default}.` : ' Required.'}`
      : null;
  }
  if (kind !== 'calc' && kind !== 'criteria') return null;
  const hash = lineText.indexOf('#');
  if (hash >= 0 && column >= hash) return null;
  let start = column;
  let end = column;
  while (start > 0 && /\w/.test(lineText[start - 1]!)) start--;
  while (end < lineText.length && /\w/.test(lineText[end]!)) end++;
  const ref = functionReference(lineText.slice(start, end));
  return ref ? `${ref.signature}\n${ref.summary} Units: ${ref.units}.` : null;
}

/** Hover on a function, generator or block key shows its signature and summary. */
export function sheetHover(kind: BlockKind): Extension {
  return hoverTooltip((view, pos) => {
    const line = view.state.doc.lineAt(pos);
    const text = referenceAt(kind, line.text, pos - line.from);
    if (!text) return null;
    return {
      pos,
      above: true,
      create: () => {
        const dom = document.createElement('div');
        dom.className = 'mw-reference-tip';
        dom.setAttribute('role', 'tooltip');
        dom.style.whiteSpace = 'pre-line';
        dom.style.maxWidth = '28rem';
        dom.style.padding = '2px 6px';
        dom.style.fontSize = '12px';
        dom.textContent = text.replace(/`/g, '');
        return { dom };
      },
    };
  });
}
