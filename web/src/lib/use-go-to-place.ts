import { useEffect } from 'react';
import { useLocation } from 'react-router-dom';
import { blockEditorContent, goToEditorLine } from './editor-line';
import { markElement, readPlace, whenOnPage, type Place } from './place';

/** The element ids the revision page gives a block and a line of its source. */
export const revisionBlockId = (blockId: string) => `block-${blockId}`;
export const revisionLineId = (blockId: string, line: number) => `line-${blockId}-${line}`;

function revisionTarget(place: Place): HTMLElement | null {
  return document.getElementById(
    place.line === 0 ? revisionBlockId(place.blockId) : revisionLineId(place.blockId, place.line),
  );
}

function remarkCard(remarkId: number): HTMLElement | null {
  return document.querySelector<HTMLElement>(`[data-remark-id="${remarkId}"]`);
}

/**
 * Goes to the place the address names (`?block=…&line=…`, see place.ts) once the screen has
 * drawn it: in the draft's editor, the cursor on the line and the line marked; on a revision,
 * the line marked, and with `remark=…` the remark's card in the remarks list marked and in view.
 * Runs again when the address changes, and after a reload.
 */
export function useGoToPlace(screen: 'editor' | 'revision'): void {
  const { search } = useLocation();
  useEffect(() => {
    const place = readPlace(search);
    if (!place) return;
    if (screen === 'editor') {
      const wait = whenOnPage(() => blockEditorContent(place.blockId));
      void wait.found.then((found) => {
        if (found) void goToEditorLine(place.blockId, place.line, { mark: true });
      });
      return wait.cancel;
    }
    const remarkId = place.remarkId;
    let card: ReturnType<typeof whenOnPage<HTMLElement>> | null = null;
    const line = whenOnPage(() => revisionTarget(place));
    void line.found.then((target) => {
      if (!target) return;
      markElement(target);
      if (remarkId === null) return;
      // The remark's card in the remarks list is what the link is for: it comes into view last.
      card = whenOnPage(() => remarkCard(remarkId));
      void card.found.then((found) => found && markElement(found));
    });
    return () => {
      line.cancel();
      card?.cancel();
    };
  }, [screen, search]);
}
