// Markdown for text blocks: `marked` with raw HTML shown as text (never interpreted), links only to
// http(s), mailto and same-site addresses, and $…$ / $$…$$ math rendered by KaTeX.
import katex from 'katex';
import { Marked, type Tokens } from 'marked';

const escapeHtml = (s: string) =>
  s.replace(/&/g, '&amp;').replace(/</g, '&lt;').replace(/>/g, '&gt;').replace(/"/g, '&quot;');

const safeHref = (href: string) => /^(https?:|mailto:|\/|#)/i.test(href.trim());

const marked = new Marked({
  gfm: true,
  breaks: false,
  renderer: {
    html(token: Tokens.HTML | Tokens.Tag) {
      return escapeHtml(token.text);
    },
    link(token: Tokens.Link) {
      const text = this.parser.parseInline(token.tokens);
      if (!safeHref(token.href)) return text;
      return `<a href="${escapeHtml(token.href)}" rel="noopener noreferrer">${text}</a>`;
    },
    image(token: Tokens.Image) {
      // Images are not part of a calculation sheet: show the alternative text.
      return escapeHtml(token.text);
    },
  },
});

const renderMath = (tex: string, displayMode: boolean) =>
  katex.renderToString(tex, { displayMode, throwOnError: false, strict: 'ignore', trust: false });

/** Markdown with math → HTML that is safe to insert (no raw HTML, no script links). */
export function renderMarkdown(source: string): string {
  const math: string[] = [];
  const hold = (html: string) => {
    math.push(html);
    return `MWMATH${math.length - 1}END`;
  };
  const withHolders = source
    .replace(/\$\$([\s\S]+?)\$\$/g, (_m, tex: string) => hold(renderMath(tex, true)))
    .replace(
      /(^|[^\\$])\$([^$\n]+?)\$/g,
      (_m, pre: string, tex: string) => pre + hold(renderMath(tex, false)),
    )
    .replace(/\\\$/g, '$');
  const html = marked.parse(withHolders, { async: false });
  return html.replace(/MWMATH(\d+)END/g, (_m, i: string) => math[Number(i)] ?? '');
}
