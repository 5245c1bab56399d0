import { useCallback, useRef } from 'react';

/** An A4 sheet's width in CSS pixels (210 mm at 96 px to the inch). */
export const A4_WIDTH_PX = (210 * 96) / 25.4;

/**
 * Shows the paper whole on a screen narrower than A4 (a phone): the page keeps its A4 layout and
 * is scaled to the width of its container through `--mw-fit` (print.css zooms `.mw-print` by it,
 * on screen only), so what is seen is what prints; `--mw-unfit` keeps the controls above the
 * paper at their own size. The printed page and the server's PDF never see either.
 */
export function useFitToWidth(): (element: HTMLElement | null) => void {
  const observer = useRef<ResizeObserver | null>(null);
  return useCallback((element: HTMLElement | null) => {
    observer.current?.disconnect();
    observer.current = null;
    const container = element?.parentElement;
    if (!element || !container) return;
    const fit = () => {
      const scale = Math.min(1, container.clientWidth / A4_WIDTH_PX);
      element.style.setProperty('--mw-fit', String(scale));
      element.style.setProperty('--mw-unfit', String(1 / scale));
    };
    fit();
    observer.current = new ResizeObserver(fit);
    observer.current.observe(container);
  }, []);
}
