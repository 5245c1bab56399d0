/**
 * A place in a sheet's draft or in a revision, as a link names it: `?block=<block id>&line=<n>`,
 * and for a remark `?remark=<id>` beside them. The query survives a reload and a shared link;
 * line 0 is the whole block, as a remark on the block records it.
 */
export type Place = { blockId: string; line: number; remarkId: number | null };

/** The query string of a place, with its leading `?`. */
export function placeQuery(place: {
  blockId: string;
  line: number;
  remarkId?: number | null;
}): string {
  const q = new URLSearchParams({ block: place.blockId, line: String(place.line) });
  if (place.remarkId != null) q.set('remark', String(place.remarkId));
  return `?${q.toString()}`;
}

/** The place a location's query names, or null when it names none (or not a sane one). */
export function readPlace(search: string | URLSearchParams): Place | null {
  const q = typeof search === 'string' ? new URLSearchParams(search) : search;
  const blockId = q.get('block');
  const line = Number(q.get('line') ?? '0');
  const remark = q.get('remark');
  if (!blockId || !Number.isInteger(line) || line < 0) return null;
  const remarkId = remark !== null && /^\d+$/.test(remark) ? Number(remark) : null;
  return { blockId, line, remarkId };
}

/** How long a place stays marked after the page went there. */
export const PLACE_MARK_MS = 4000;

/** The class of a marked element outside the editor (index.css fades it out). */
export const PLACE_MARK_CLASS = 'mw-place-mark';

/** Scrolls an element to the middle of the screen and marks it for a moment. */
export function markElement(element: HTMLElement, scroll = true): void {
  if (scroll) element.scrollIntoView({ block: 'center' });
  element.classList.add(PLACE_MARK_CLASS);
  window.setTimeout(() => element.classList.remove(PLACE_MARK_CLASS), PLACE_MARK_MS);
}

/**
 * Resolves with the first element `find` returns once it is on the page (the screen may still be
 * loading its data or its code), or null after `timeoutMs`.
 */
export function whenOnPage<T extends Element>(
  find: () => T | null,
  timeoutMs = 15000,
): { found: Promise<T | null>; cancel: () => void } {
  let observer: MutationObserver | null = null;
  let timer = 0;
  let settle: (value: T | null) => void = () => {};
  const found = new Promise<T | null>((resolve) => {
    settle = (value) => {
      observer?.disconnect();
      window.clearTimeout(timer);
      resolve(value);
    };
    const now = find();
    if (now) return settle(now);
    observer = new MutationObserver(() => {
      const el = find();
      if (el) settle(el);
    });
    observer.observe(document.body, { childList: true, subtree: true });
    timer = window.setTimeout(() => settle(null), timeoutMs);
  });
  return { found, cancel: () => settle(null) };
}
