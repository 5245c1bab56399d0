/** One cell of a CSV file: text, a number (written so it reads back exactly) or empty. */
export type CsvCell = string | number | null;

/**
 * CSV text (RFC 4180): comma-separated, CRLF line ends, a field quoted when it holds a comma, a
 * quote or a line break. Numbers are written in full (JavaScript's shortest round-trip form, e.g.
 * 3.0717935468710734 or 1.2e-11), so a spreadsheet gets the values the engine computed, not the
 * figures shown on screen; null and non-finite numbers are empty fields.
 */
export function csvText(rows: readonly (readonly CsvCell[])[]): string {
  return rows.map((row) => row.map(csvField).join(',')).join('\r\n') + '\r\n';
}

function csvField(cell: CsvCell): string {
  if (cell === null) return '';
  if (typeof cell === 'number') return Number.isFinite(cell) ? String(cell) : '';
  return /[",\r\n]/.test(cell) ? `"${cell.replace(/"/g, '""')}"` : cell;
}
