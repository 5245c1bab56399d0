import katex from 'katex';
import { useMemo } from 'react';

/** One piece of LaTeX rendered by KaTeX (editor, revisions, comparisons, prints); LaTeX it cannot read shows as its source. */
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
