// Browser: a project's calculation package. The demo viewer opens it from the project page; by
// default it binds the latest sealed revision of each sheet (DYN-01 Rev 2 of the demo among them); she adds
// a revision in check, downloads the PDF the server prints with Chromium, and the PDF is read
// back with poppler's pdfinfo and pdftotext: its page count, "page x of y" running across the
// whole package, the seal code on the cover and on its sheet, and the record of check. The
// browser's own print of the same page is read the same way.
import { execFileSync } from 'node:child_process';
import { writeFile } from 'node:fs/promises';
import os from 'node:os';
import path from 'node:path';
import { describe, expect, it } from 'vitest';
import {
  A4_WIDTH_PX,
  baseUrl,
  paperWidths,
  demoPeople,
  demoProjects,
  useSignedInBrowser,
  saveScreenshot,
} from '../support/browser';

function pdfPages(file: string): number {
  const info = execFileSync('pdfinfo', [file], { encoding: 'utf8' });
  const match = /^Pages:\s+(\d+)$/m.exec(info);
  if (!match) throw new Error(`pdfinfo printed no page count:\n${info}`);
  return Number(match[1]);
}

function pdfText(file: string): string {
  return execFileSync('pdftotext', ['-layout', file, '-'], { encoding: 'utf8' });
}

const occurrences = (text: string, needle: string) => text.split(needle).length - 1;

describe('calculation package (browser)', () => {
  const lenaSession = useSignedInBrowser(demoPeople.lena);
  /** Pages of the browser's own print at desktop width, for the phone's print to match. */
  let desktopPrintPages = 0;

  it('binds the sealed sheets, adds a chosen revision, and prints one PDF with pages numbered across it', async () => {
    const { page } = lenaSession();
    await page
      .getByRole('table', { name: 'Projects' })
      .getByRole('link', { name: demoProjects.footbridge.name })
      .click();
    await page.getByRole('link', { name: 'Calculation package' }).click();
    const cover = page.getByRole('region', { name: 'Cover' });
    await cover.getByRole('heading', { name: 'Calculation package' }).waitFor();
    await cover.getByText(demoProjects.footbridge.jobNumber, { exact: true }).waitFor();

    // The default: only the demo's sealed sheet, DYN-01 Rev 2, with its seal code.
    const sheets = cover.getByRole('table', { name: 'Sheets in this package' });
    const dyn01 = sheets.getByRole('row').filter({ hasText: 'DYN-01' });
    await dyn01.waitFor();
    // Every sheet bound by default is sealed (other browser tests may have sealed more sheets).
    const codes = await sheets.locator('tbody tr td:nth-child(6)').allInnerTexts();
    expect(codes.length).toBeGreaterThanOrEqual(1);
    for (const code of codes) expect(code).toMatch(/^[0-9A-HJKMNP-TV-Z]{5}-[0-9A-HJKMNP-TV-Z]{5}$/);
    expect(await dyn01.getByRole('cell').nth(2).innerText()).toBe('Rev 2');
    const sealCode = await dyn01.getByRole('cell').nth(5).innerText();
    expect(sealCode).toMatch(/^[0-9A-HJKMNP-TV-Z]{5}-[0-9A-HJKMNP-TV-Z]{5}$/);
    await page
      .getByRole('img', { name: new RegExp(`QR code of .*/verify/${sealCode}$`) })
      .waitFor();
    await page.getByRole('region', { name: 'Record of check — DYN-01 Rev 2' }).waitFor();

    // Add DYN-02's revision in check: the package grows by its pages and says it is preliminary.
    const choose = page.getByLabel(/^Revision of DYN-02/);
    const options = await choose.locator('option').allInnerTexts();
    const inCheck = options.find((o) => /^Rev \d+ — In check/.test(o));
    expect(inCheck, options.join(' | ')).toBeDefined();
    await choose.selectOption({ label: inCheck! });
    await sheets.getByRole('row').filter({ hasText: 'DYN-02' }).waitFor();
    await page.getByText('This package includes revisions that are not sealed').waitFor();
    await page.locator('[data-package-state="ready"]').waitFor();
    await saveScreenshot(page, 'package');

    const [download] = await Promise.all([
      page.waitForEvent('download', { timeout: 120_000 }),
      page.getByRole('link', { name: 'Download PDF' }).click(),
    ]);
    expect(download.suggestedFilename()).toBe(
      `${demoProjects.footbridge.jobNumber}-calculation-package.pdf`,
    );
    const file = await download.path();
    // Kept beside the screenshots for a person to look at.
    await download.saveAs(
      path.resolve(import.meta.dirname, '..', '..', 'test-results', 'package.pdf'),
    );
    const pages = pdfPages(file);
    // A cover page and at least one page for each of the two sheets.
    expect(pages).toBeGreaterThanOrEqual(3);
    const text = pdfText(file);
    expect(text).toContain(`Page 1 of ${pages}`);
    expect(text).toContain(`Page ${pages} of ${pages}`);
    expect(occurrences(text, 'Page ')).toBeGreaterThanOrEqual(pages);
    // The seal code on the cover's list and on its sheet (the seal box and the history table).
    expect(occurrences(text, sealCode)).toBeGreaterThanOrEqual(3);
    // The QR code's caption: the verify address the person reached the server at.
    expect(text).toContain(`Scan to check this seal at ${baseUrl()}/verify/${sealCode}`);
    expect(text).toContain('Record of check — DYN-01 Rev 2');
    expect(text).toMatch(/Record of check — DYN-02 Rev \d+/);
    expect(text).toContain('PRELIMINARY — NOT FOR CONSTRUCTION');
    expect(text).toContain('Results must be verified by a qualified engineer');

    // The browser's own print of the same page.
    await page.emulateMedia({ media: 'print' });
    const own = path.join(os.tmpdir(), `modewright-package-${Date.now()}.pdf`);
    await writeFile(own, await page.pdf({ preferCSSPageSize: true, printBackground: true }));
    await page.emulateMedia({ media: 'screen' });
    const ownPages = pdfPages(own);
    desktopPrintPages = ownPages;
    const ownText = pdfText(own);
    expect(ownText).toContain(`Page ${ownPages} of ${ownPages}`);
    expect(occurrences(ownText, sealCode)).toBeGreaterThanOrEqual(3);
    expect(ownText).not.toContain('Download PDF');
  });

  it('shows the whole A4 page at phone width without sideways scrolling, and prints the same pages', async () => {
    const { page } = lenaSession();
    await page.setViewportSize({ width: 390, height: 844 });
    await page.reload();
    await page.getByRole('region', { name: 'Cover' }).waitFor();
    await page.locator('[data-package-state="ready"]').waitFor();
    const phone = await paperWidths(page);
    expect(phone.page).toBeLessThanOrEqual(390);
    // Still laid out as A4 (±1 px of rounding), only drawn smaller to fit the width.
    expect(Math.abs(phone.paper - A4_WIDTH_PX)).toBeLessThanOrEqual(1);
    expect(phone.shown).toBeLessThanOrEqual(390);
    // The controls above the paper keep their own size (compared with the desktop's below).
    const button = page.getByRole('button', { name: 'Print or save as PDF' });
    const phoneButton = (await button.boundingBox())!.height;
    await saveScreenshot(page, 'package-390');

    // Paper is paper: printed from the phone, the same A4 pages as from the desktop.
    expect(desktopPrintPages).toBeGreaterThan(0);
    await page.emulateMedia({ media: 'print' });
    const own = path.join(os.tmpdir(), `modewright-package-390-${Date.now()}.pdf`);
    await writeFile(own, await page.pdf({ preferCSSPageSize: true, printBackground: true }));
    await page.emulateMedia({ media: 'screen' });
    expect(pdfPages(own)).toBe(desktopPrintPages);

    await page.setViewportSize({ width: 1366, height: 860 });
    const desktop = await paperWidths(page);
    expect(desktop.page).toBeLessThanOrEqual(1366);
    expect(Math.abs(desktop.shown - A4_WIDTH_PX)).toBeLessThanOrEqual(1);
    expect(Math.abs(phoneButton - (await button.boundingBox())!.height)).toBeLessThanOrEqual(1);
    await saveScreenshot(page, 'package-1366');
    await page.setViewportSize({ width: 1280, height: 860 });
  });
});
