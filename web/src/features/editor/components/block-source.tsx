import { linter, lintGutter, setDiagnostics, type Diagnostic } from '@codemirror/lint';
import { Prec } from '@codemirror/state';
import { EditorView, keymap } from '@codemirror/view';
import CodeMirror from '@uiw/react-codemirror';
import { useCallback, useEffect, useMemo, useRef, useState } from 'react';
import type { SheetIssue } from '../api/results';
import type { BlockKind } from '../api/types';
import { sheetCompletion, sheetHover } from '../lib/completion';
import type { ScopeName } from '../lib/scope';
import { sheetLanguage } from '../lib/sheet-language';

// The editor's own look: JetBrains Mono (CodeMirror's base theme would force `monospace`),
// paper background, a thin gutter, the product's accent for the cursor and the selection.
const theme = EditorView.theme({
  '&': { fontSize: '13px', backgroundColor: '#fbf9f3', color: '#1d2126' },
  // Ligatures off: the author sees `>=` as typed, not as one glyph.
  '.cm-scroller': {
    fontFamily: '"JetBrains Mono", ui-monospace, monospace',
    lineHeight: '1.55',
    fontVariantLigatures: 'none',
  },
  '.cm-content': { caretColor: '#154d42', padding: '4px 0' },
  '.cm-gutters': {
    backgroundColor: '#f4f0e6',
    color: '#6f7379',
    borderRight: '1px solid #d6cfbf',
  },
  '.cm-activeLine': { backgroundColor: 'rgba(31, 107, 92, 0.05)' },
  '.cm-activeLineGutter': { backgroundColor: 'rgba(31, 107, 92, 0.10)' },
  '&.cm-focused': { outline: 'none' },
  '&.cm-focused .cm-selectionBackground, .cm-selectionBackground': {
    backgroundColor: 'rgba(31, 107, 92, 0.18) !important',
  },
  '.cm-tooltip': {
    fontFamily: '"IBM Plex Sans", system-ui, sans-serif',
    border: '1px solid #a89f8b',
    backgroundColor: '#fbf9f3',
  },
  '.cm-tooltip-autocomplete ul li[aria-selected]': { backgroundColor: '#1f6b5c', color: '#fbf9f3' },
  '.cm-diagnostic-error': { borderLeft: '4px solid #a3261b' },
  '.cm-lintRange-error': {
    backgroundImage: 'none',
    textDecoration: 'underline wavy #a3261b',
    textUnderlineOffset: '3px',
  },
});

// Stable objects: a new one on every render would make the wrapper reconfigure the editor.
const EDITING_SETUP = {
  lineNumbers: true,
  foldGutter: false,
  highlightActiveLine: true,
  highlightActiveLineGutter: true,
  autocompletion: false,
  searchKeymap: false,
  syntaxHighlighting: false,
  bracketMatching: true,
  closeBrackets: true,
  lintKeymap: true,
};
const READ_ONLY_SETUP = {
  ...EDITING_SETUP,
  highlightActiveLine: false,
  highlightActiveLineGutter: false,
};

export type BlockSourceProps = {
  blockId: string;
  kind: BlockKind;
  value: string;
  readOnly: boolean;
  issues: readonly SheetIssue[];
  onChange: (value: string) => void;
  names: (line: number) => ScopeName[];
  uploads: () => string[];
  onMove: (delta: -1 | 1) => void;
  label: string;
  /** Remarks of the latest revision not closed yet, at their line, shown in the gutter. */
  remarks?: readonly RemarkMark[];
};

/** A remark to show at a line of the block (the line of the revision it was made on). */
export type RemarkMark = { line: number; message: string };

const NO_REMARKS: readonly RemarkMark[] = [];

/** One block's source in CodeMirror, with our highlighting, completion and errors at their line. */
export function BlockSource({
  kind,
  value,
  readOnly,
  issues,
  onChange,
  names,
  uploads,
  onMove,
  label,
  remarks = NO_REMARKS,
}: BlockSourceProps) {
  // The view is state, not a ref: the wrapper creates it in an effect of its own, possibly after
  // the errors and remarks arrived, and they must be set on it once it exists.
  const [view, setView] = useState<EditorView | null>(null);
  // Completion and the move keys read the latest callbacks without reconfiguring the editor.
  const live = useRef({ names, uploads, onMove, onChange });
  useEffect(() => {
    live.current = { names, uploads, onMove, onChange };
  });
  // A stable handler: a new one on every render would make the wrapper reconfigure the editor.
  const handleChange = useCallback((next: string) => live.current.onChange(next), []);

  const extensions = useMemo(
    () => [
      ...sheetLanguage(kind),
      sheetCompletion(
        kind,
        (line) => live.current.names(line),
        () => live.current.uploads(),
      ),
      sheetHover(kind),
      theme,
      // The lint state is part of the configuration from the start (no lint source of its own:
      // the diagnostics come from the server's evaluation), so they survive a reconfigure.
      linter(null),
      lintGutter(),
      EditorView.lineWrapping,
      EditorView.contentAttributes.of({ 'aria-label': label }),
      Prec.highest(
        keymap.of([
          { key: 'Mod-Shift-ArrowUp', run: () => (live.current.onMove(-1), true) },
          { key: 'Mod-Shift-ArrowDown', run: () => (live.current.onMove(1), true) },
        ]),
      ),
    ],
    [kind, label],
  );

  // Errors (and notes) from the last evaluation, marked at their line; the message shows on hover.
  useEffect(() => {
    if (view === null) return;
    const doc = view.state.doc;
    const diagnostics: Diagnostic[] = issues.map((issue) => {
      const lineNo = Math.min(Math.max(issue.line, 1), doc.lines);
      const line = doc.line(lineNo);
      const from =
        issue.line === 0 ? 0 : line.from + (line.text.length - line.text.trimStart().length);
      const to = issue.line === 0 ? doc.line(1).to : line.to;
      return {
        from,
        to: Math.max(to, from),
        // A line left unevaluated by an error above is marked as information, not as an error.
        severity: issue.severity === 'note' ? 'info' : 'error',
        message: issue.line > 0 ? `Line ${issue.line}: ${issue.message}` : issue.message,
        source: issue.code,
      };
    });
    // Remarks to act on: an information mark in the gutter, the remark on hover.
    for (const remark of remarks) {
      const line = doc.line(Math.min(Math.max(remark.line, 1), doc.lines));
      diagnostics.push({
        from: line.from,
        to: line.from,
        severity: 'info',
        message: remark.message,
        source: 'remark',
      });
    }
    view.dispatch(setDiagnostics(view.state, diagnostics));
  }, [issues, remarks, value, view]);

  return (
    <CodeMirror
      value={value}
      onChange={handleChange}
      extensions={extensions}
      editable={!readOnly}
      readOnly={readOnly}
      theme="none"
      basicSetup={readOnly ? READ_ONLY_SETUP : EDITING_SETUP}
      onCreateEditor={(created) => setView(created)}
      className="overflow-hidden rounded-sm border border-rule"
    />
  );
}
