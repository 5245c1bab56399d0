// A revision's results tables as a spreadsheet, in the browser: the author opens the seeded frame
// revision (DYN-02 Rev 1, seeds/02_demo_sheets.ts), takes "Tables as spreadsheet (.xlsx)" and the
// file, read back with ExcelJS, holds the modes table the page shows, the spectrum results and the
// criteria, units in the headers.
import ExcelJS from 'exceljs';
import { readFile } from 'node:fs/promises';
import { describe, expect, it } from 'vitest';
import { column, openDemoRevision, relative, useAuthorBrowser } from './editor-helpers';

describe('revision page: tables as spreadsheet (browser)', () => {
  const session = useAuthorBrowser();

  it('downloads DYN-02 Rev 1 as .xlsx with the modes the page shows', async () => {
    const { page } = session();
    await openDemoRevision(page, 'DYN-02', 1);
    const table = page.getByRole('table', { name: /^Modes sway/ });
    await table.waitFor();
    const shown = await column(table, 'f (Hz)');

    const [file] = await Promise.all([
      page.waitForEvent('download'),
      page.getByRole('button', { name: 'Tables as spreadsheet (.xlsx)' }).click(),
    ]);
    expect(file.suggestedFilename()).toBe('DYN-02_Rev1_tables.xlsx');
    const book = new ExcelJS.Workbook();
    await book.xlsx.load((await readFile(await file.path())) as unknown as ArrayBuffer);
    const names = book.worksheets.map((w) => w.name);
    expect(names[0]).toBe('Revision');
    expect(names).toContain('Modes sway');
    expect(names).toContain('Criteria');
    expect(names.some((n) => n.startsWith('Spectrum rsa'))).toBe(true);

    const modes = book.getWorksheet('Modes sway')!;
    const head = (modes.getRow(1).values as unknown[]).slice(1);
    expect(head).toContain('Effective mass (kg)');
    const fCol = head.indexOf('f (Hz)') + 1;
    // The file holds every digit; the page shows 4 significant figures: within 0.05 %.
    shown.forEach((f, i) => {
      expect(relative(Number(modes.getRow(i + 2).getCell(fCol).value), f)).toBeLessThan(5e-4);
    });
    // The four criteria lines of the sheet (two for the mass, two for the spectrum), one row each.
    expect(book.getWorksheet('Criteria')!.rowCount).toBe(1 + 4);
  });
});
