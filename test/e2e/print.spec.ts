// Browser: the printed package reads as a calculation: a text block's Markdown is set as
// headings and paragraphs with its formulas typeset, not printed as source; calc, modes and
// criteria blocks keep their numbered source lines above their results. Printed to PDF by Chromium,
// every page is numbered ("Page n of N") and the check remarks follow the sheet (pdftotext, from
// Debian's poppler-utils, reads the PDF back).
import { execFileSync } from 'node:child_process';
import { mkdtemp, readFile } from 'node:fs/promises';
import os from 'node:os';
import path from 'node:path';
import { describe, expect, it } from 'vitest';
import { A4_WIDTH_PX, paperWidths, saveScreenshot } from '../support/browser';
import { openDemoRevision, useAuthorBrowser } from './editor-helpers';

describe('print view (browser)', () => {
  const session = useAuthorBrowser();

  it('prints a text block as set text and a calc block as numbered lines', async () => {
    const { page } = session();
    await openDemoRevision(page, 'DYN-01', 2);
    await page.getByRole('link', { name: 'Print' }).first().click();

    // The demo sheet's first block (seeds/02_demo_sheets.ts) opens "## Deck natural frequencies".
    const text = page.getByRole('region', { name: 'Block 1 (text)' });
    await text.getByRole('heading', { name: 'Deck natural frequencies', level: 2 }).waitFor();
    expect(await text.innerText()).not.toContain('##');
    expect(await text.locator('.katex').count()).toBeGreaterThan(0);

    const calc = page.getByRole('region', { name: 'Block 2 (calc)' });
    expect(await calc.locator('pre').innerText()).toMatch(/^\s+1 {2}L = 31\.5 m/);
    await saveScreenshot(page, 'print-dyn-01');
    // Paper has no downloads.
    expect(await page.getByRole('button', { name: 'Modes table' }).count()).toBe(0);
  });

  it('offers the modes of a revision as CSV, named by sheet, revision and block', async () => {
    const { page } = session();
    await openDemoRevision(page, 'DYN-01', 2);
    const [file] = await Promise.all([
      page.waitForEvent('download'),
      page.getByRole('button', { name: 'Modes table' }).first().click(),
    ]);
    expect(file.suggestedFilename()).toBe('DYN-01_Rev2_deck_v_modes.csv');
    const rows = (await readFile(await file.path(), 'utf8'))
      .trim()
      .split('\r\n')
      .map((line) => line.split(','));
    // count: 3 in the demo's deck_v block; f₁ in full, the 3.072 Hz the page shows to 4 figures.
    expect(rows).toHaveLength(4);
    expect(rows[0]![1]).toBe('f (Hz)');
    expect(Number(rows[1]![1]).toPrecision(4)).toBe('3.072');
    expect(rows[1]![1]!.length).toBeGreaterThan(8);
  });
});

describe('print view: page numbers and the record of the check (browser)', () => {
  const session = useAuthorBrowser();

  it('numbers every printed page above the title block and prints the remarks after the sheet', async () => {
    const { page } = session();
    await openDemoRevision(page, 'DYN-01', 2);
    await page.getByRole('link', { name: 'Print' }).first().click();

    // The demo's Rev 2 (seeds/03_demo_review.ts) carries Tomasz's query on the services mass
    // from Rev 1, answered by Ines and closed by him.
    const record = page.getByRole('region', { name: 'Check remarks' });
    await record.getByRole('heading', { name: 'Check remarks on Rev 2' }).waitFor();
    const words = await record.innerText();
    expect(words).toMatch(/Block \d+ \(calc\), line \d+ · Query · Closed · carried from Rev 1/);
    expect(words).toContain('KQ-E-402');
    expect(words).toMatch(/Reply on Rev 1: Agreed: services are 0\.20 t\/m[^\n]*— Ines Marlow/);
    expect(words).toContain('Reply: Checked against KQ-E-402: agreed.');
    expect(words).toContain('Closed by Tomasz Reyes');
    const titleBlock = page.getByRole('group', { name: 'Title block' });
    expect(await titleBlock.innerText()).not.toContain('see foot of page');

    // Chromium's own print to PDF, read back as text: "Page n of N" on every page, n = 1…N.
    const pdf = path.join(await mkdtemp(path.join(os.tmpdir(), 'mw-print-')), 'dyn-01.pdf');
    await page.emulateMedia({ media: 'print' });
    await page.pdf({ path: pdf, format: 'A4', preferCSSPageSize: true });
    await page.emulateMedia({ media: 'screen' });
    const text = execFileSync('pdftotext', ['-layout', pdf, '-'], { encoding: 'utf8' });
    const pages = text.split('\f').filter((p) => p.trim() !== '');
    expect(pages.length).toBeGreaterThan(1);
    pages.forEach((p, i) =>
      expect(p).toContain(`DYN-01 · Rev 2 · Page ${i + 1} of ${pages.length}`),
    );
    // The record comes after the calculation and before the caution.
    const at = (s: string) => text.indexOf(s);
    expect(at('Check remarks on Rev 2')).toBeGreaterThan(at('Calculation'));
    expect(at('Caution.')).toBeGreaterThan(at('Check remarks on Rev 2'));
    await saveScreenshot(page, 'print-dyn-01-remarks');

    // At phone width the A4 page is shown whole (laid out 210 mm wide, drawn to fit) with no
    // sideways scrolling, and printing from the phone gives the same pages.
    await page.setViewportSize({ width: 390, height: 844 });
    const phone = await paperWidths(page);
    expect(phone.page).toBeLessThanOrEqual(390);
    expect(Math.abs(phone.paper - A4_WIDTH_PX)).toBeLessThanOrEqual(1); // ±1 px of rounding
    expect(phone.shown).toBeLessThanOrEqual(390);
    await saveScreenshot(page, 'print-dyn-01-390');
    const small = path.join(path.dirname(pdf), 'dyn-01-390.pdf');
    await page.emulateMedia({ media: 'print' });
    await page.pdf({ path: small, format: 'A4', preferCSSPageSize: true });
    await page.emulateMedia({ media: 'screen' });
    const smallPages = execFileSync('pdftotext', ['-layout', small, '-'], { encoding: 'utf8' })
      .split('\f')
      .filter((p) => p.trim() !== '');
    expect(smallPages.length).toBe(pages.length);
    await page.setViewportSize({ width: 1280, height: 860 });
  });
});
