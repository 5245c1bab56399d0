/** A CSS string literal of any text: quotes and backslashes escaped, line breaks as spaces. */
export function cssString(text: string): string {
  return `"${text.replace(/[\r\n]+/g, ' ').replace(/[\\"]/g, (c) => `\\${c}`)}"`;
}

/**
 * The @page rule that numbers the printed pages: "DYN-01 · Rev 2 · Page 3 of 7" at the top right
 * of every page, right above the repeated title block. Page counters only count in the page's
 * margin boxes (Chromium prints 0 for counter(page) in the body), so this is where the title
 * block's page number lives.
 */
export function pageMarginCss(label: string): string {
  return `@page { @top-right { content: ${cssString(`${label} · Page `)} counter(page) " of " counter(pages); font: 8pt 'IBM Plex Sans', sans-serif; color: #222; } }`;
}
