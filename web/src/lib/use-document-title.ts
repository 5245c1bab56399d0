import { useEffect } from 'react';

/** Sets the browser tab's title while the page is shown: "<what> · Modewright". */
export function useDocumentTitle(what: string): void {
  useEffect(() => {
    document.title = `${what} · Modewright`;
  }, [what]);
}
