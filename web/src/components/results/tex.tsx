import katex from 'katex';
import { useMemo } from 'react';

/** Read-only LaTeX for revisions, comparisons and prints; unreadable LaTeX shows as its source. */
export function Tex({ tex, display = false }: { tex: string; display?: boolean }) {
  const html = useMemo(
    () =>
      katex.renderToString(tex, {
        displayMode: display,
        throwOnError: false,
        strict: 'ignore',
        trust: false,
        output: 'htmlAndMathml',
      }),
    [tex, display],
  );
  // KaTeX escapes its input and `trust: false` refuses \href and friends.
  return <span className="tex" dangerouslySetInnerHTML={{ __html: html }} />;
}
