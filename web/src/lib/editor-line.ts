import type { StateEffect } from '@codemirror/state';
import type { EditorView } from '@codemirror/view';
import { PLACE_MARK_CLASS, PLACE_MARK_MS } from './place';

/** The block card of a draft's editor: the editor marks each card with data-block-id. */
export function blockCard(blockId: string): HTMLElement | null {
  return document.querySelector<HTMLElement>(`[data-block-id="${CSS.escape(blockId)}"]`);
}

/** The CodeMirror content of a block card, once the editor has drawn it. */
export function blockEditorContent(blockId: string): HTMLElement | null {
  return blockCard(blockId)?.querySelector<HTMLElement>('.cm-content') ?? null;
}

type Marker = (view: EditorView, line: number | null) => void;
let marker: Promise<Marker> | null = null;

/**
 * A line decoration the editor did not set up itself: added to a view the first time it is
 * needed (StateEffect.appendConfig), so going to a place needs nothing from the editor's code.
 */
function loadMarker(): Promise<Marker> {
  marker ??= Promise.all([import('@codemirror/view'), import('@codemirror/state')]).then(
    ([{ Decoration, EditorView }, { StateEffect: Effect, StateField }]) => {
      const setMark = Effect.define<number | null>();
      const lineMark = Decoration.line({ class: PLACE_MARK_CLASS });
      const field = StateField.define({
        create: () => Decoration.none,
        update(marks, tr) {
          let next = marks.map(tr.changes);
          for (const e of tr.effects) {
            if (!e.is(setMark)) continue;
            next =
              e.value === null
                ? Decoration.none
                : Decoration.set([lineMark.range(tr.state.doc.line(e.value).from)]);
          }
          return next;
        },
        provide: (f) => EditorView.decorations.from(f),
      });
      const ready = new WeakSet<EditorView>();
      return (view, line) => {
        const effects: StateEffect<unknown>[] = [setMark.of(line)];
        if (!ready.has(view)) {
          ready.add(view);
          effects.unshift(Effect.appendConfig.of(field));
        }
        view.dispatch({ effects });
      };
    },
  );
  return marker;
}

/**
 * Puts the cursor of the draft's editor at the start of a line of a block, scrolls it to the
 * middle of the screen and, with `mark`, marks the line for a moment. False when the draft no
 * longer has the block; a line past the end goes to the last line.
 */
export async function goToEditorLine(
  blockId: string,
  line: number,
  { mark = false }: { mark?: boolean } = {},
): Promise<boolean> {
  const content = blockEditorContent(blockId);
  if (!content) return false;
  blockCard(blockId)?.scrollIntoView({ block: 'center' });
  // The editor is loaded already when its blocks are on the page; this only reaches it.
  const { EditorView } = await import('@codemirror/view');
  const view = EditorView.findFromDOM(content);
  if (!view) return false;
  const doc = view.state.doc;
  const target = doc.line(Math.min(Math.max(1, line), doc.lines));
  view.dispatch({
    selection: { anchor: target.from },
    effects: EditorView.scrollIntoView(target.from, { y: 'center' }),
  });
  view.focus();
  if (mark) {
    const setMark = await loadMarker();
    setMark(view, target.number);
    window.setTimeout(() => setMark(view, null), PLACE_MARK_MS);
  }
  return true;
}
