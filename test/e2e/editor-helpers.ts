// Shared steps of the editor's browser tests (test/e2e/editor-*.spec.ts): start a sheet, add and
// type blocks the way an author does, wait for results and saves, read the modes table, and the
// closed form the frame and upload checks compare with.
import { mkdir } from 'node:fs/promises';
import path from 'node:path';
import type { Locator, Page } from 'playwright-core';
import { expect } from 'vitest';
import {
  demoPeople,
  demoProjects,
  useSignedInBrowser,
  type BrowserSession,
} from '../support/browser';

export const FIXTURES = path.resolve(import.meta.dirname, '..', 'fixtures', 'e2e');
// Each run makes its own sheets; the number is unique within the project.
export const RUN = Date.now().toString(36).slice(-5).toUpperCase();

const KIND_LABEL = {
  text: 'text',
  calc: 'calculation',
  matrix: 'matrix',
  modes: 'modes',
  response: 'response',
  criteria: 'criteria',
} as const;
export type Kind = keyof typeof KIND_LABEL;

export async function projectHref(page: Page): Promise<string> {
  await page.goto('/');
  const row = page
    .getByRole('table', { name: 'Projects' })
    .getByRole('row')
    .filter({ hasText: demoProjects.footbridge.jobNumber });
  const href = await row.getByRole('link').first().getAttribute('href');
  if (!href) throw new Error('No link to the footbridge project in the projects table.');
  return href;
}

/** Opens a revision of a demo sheet from the project page, as a person would ("DYN-01", 2). */
export async function openDemoRevision(page: Page, sheet: string, rev: number): Promise<void> {
  await page.goto(await projectHref(page));
  await page.getByRole('link', { name: sheet }).first().click();
  await page
    .getByRole('region', { name: 'Review' })
    .getByRole('link', { name: new RegExp(`^Rev ${rev}`) })
    .click();
  await page.getByRole('heading', { name: new RegExp(`Rev ${rev}$`) }).waitFor();
}

/** Starts an empty sheet from the project page and waits for the editor. */
export async function newSheet(page: Page, number: string, title: string): Promise<string> {
  await page.goto(await projectHref(page));
  await page.getByRole('button', { name: 'New sheet' }).click();
  const dialog = page.getByRole('dialog', { name: 'New sheet' });
  await dialog.getByLabel('Sheet number').fill(number);
  await dialog.getByLabel('Title').fill(title);
  await dialog.getByLabel('Empty sheet').check();
  await dialog.getByRole('button', { name: 'Create sheet' }).click();
  await page.getByRole('heading', { name: new RegExp(`${number}\\s*${title}`) }).waitFor();
  return page.url();
}

export function block(page: Page, index: number, kind: Kind): Locator {
  return page.getByRole('region', { name: `Block ${index}, ${KIND_LABEL[kind]}`, exact: true });
}

export function source(page: Page, index: number, kind: Kind): Locator {
  return page.getByRole('textbox', { name: `Source of block ${index}, ${KIND_LABEL[kind]}` });
}

/** Replaces a block's whole source, as if typed (CodeMirror receives it as input). */
export async function setSource(
  page: Page,
  index: number,
  kind: Kind,
  text: string,
): Promise<void> {
  const editor = source(page, index, kind);
  await editor.click();
  await page.keyboard.press('ControlOrMeta+a');
  await page.keyboard.insertText(text);
  await page.keyboard.press('Escape');
}

export async function blockCount(page: Page): Promise<number> {
  return page.getByRole('list', { name: 'Blocks' }).locator(':scope > li').count();
}

export async function addBlock(page: Page, kind: Kind, text: string): Promise<number> {
  const count = await blockCount(page);
  const label = {
    text: 'Text',
    calc: 'Calculation',
    matrix: 'Matrix',
    modes: 'Modes',
    response: 'Response',
    criteria: 'Criteria',
  }[kind];
  await page
    .getByRole('group', { name: 'Add a block' })
    .getByRole('button', { name: `+ ${label}` })
    .click();
  await setSource(page, count + 1, kind, text);
  return count + 1;
}

/** Waits until the results on screen belong to the text on screen. */
export async function waitForResults(page: Page, timeout = 60_000): Promise<void> {
  await page.getByText('Results up to date').waitFor({ timeout });
}

export async function waitSaved(page: Page, timeout = 20_000): Promise<void> {
  await page.getByTestId('save-state').getByText('Saved', { exact: true }).waitFor({ timeout });
}

/** Numbers of one column of a modes table, read as the engineer sees them. */
export async function column(table: Locator, header: string): Promise<number[]> {
  const headers = await table.locator('thead th').allInnerTexts();
  const i = headers.findIndex((h) => h.trim().toLowerCase() === header.toLowerCase());
  if (i < 0) throw new Error(`No column "${header}" in [${headers.join(', ')}]`);
  const cells = await table.locator(`tbody tr td:nth-child(${i + 1})`).allInnerTexts();
  return cells.map((c) => Number(c.replace('−', '-').replace('%', '').trim()));
}

/**
 * Uniform fixed–free chain of N equal masses m and springs k: λ_n = (4k/m) sin²((2n−1)π/(2(2N+1))),
 * shapes φ_n(j) = sin(j (2n−1)π/(2N+1)) (REFERENCES.md item 2, classical). Effective mass ratio of
 * mode n: (Σ_j φ_n(j))² / (N Σ_j φ_n(j)²) for equal masses (definition of Γ² / total mass).
 */
export function uniformChain(N: number, k: number, m: number) {
  return Array.from({ length: N }, (_, idx) => {
    const n = idx + 1;
    const theta = ((2 * n - 1) * Math.PI) / (2 * (2 * N + 1));
    const lambda = ((4 * k) / m) * Math.sin(theta) ** 2;
    const phi = Array.from({ length: N }, (_, j) =>
      Math.sin(((j + 1) * (2 * n - 1) * Math.PI) / (2 * N + 1)),
    );
    const sum = phi.reduce((a, b) => a + b, 0);
    const sq = phi.reduce((a, b) => a + b * b, 0);
    return { f: Math.sqrt(lambda) / (2 * Math.PI), ratio: (sum * sum) / (N * sq) };
  });
}

export const relative = (a: number, b: number) => Math.abs(a - b) / Math.abs(b);

/**
 * After the fixture pair chain3-K.mtx and chain3-M.mtx was uploaded behind the last of `before`
 * blocks: checks that it became two matrix blocks in that order, then solves them in a modes
 * block named `name` (extra header lines in `extra`) and compares the frequencies with the
 * closed form of the uniform chain (k = 1000 kN/m = 1e6 N/m, m = 1 t = 1000 kg, the fixtures'
 * comments). Returns the modes table.
 */
export async function solveUploadedChain(
  page: Page,
  before: number,
  name: string,
  extra: string[] = [],
): Promise<Locator> {
  await block(page, before + 2, 'matrix').waitFor();
  expect(await source(page, before + 1, 'matrix').innerText()).toContain('from: chain3-K.mtx');
  expect(await source(page, before + 2, 'matrix').innerText()).toContain('from: chain3-M.mtx');
  await addBlock(
    page,
    'modes',
    [`name: ${name}`, 'stiffness: chain3_K', 'mass: chain3_M', ...extra, 'count: 3'].join('\n'),
  );
  await waitForResults(page);
  const table = page.getByRole('table', { name: `Modes of ${name}` });
  const expected = uniformChain(3, 1e6, 1e3);
  const f = await column(table, 'f (Hz)');
  expect(f).toHaveLength(3);
  f.forEach((value, i) => expect(relative(value, expected[i]!.f)).toBeLessThan(5e-4));
  return table;
}

export async function shotPath(name: string): Promise<string> {
  const dir = path.resolve(import.meta.dirname, '..', '..', 'test-results', 'screenshots');
  await mkdir(dir, { recursive: true });
  return path.join(dir, `${name}.png`);
}

/**
 * One Chromium signed in as the demo author for the whole file; leaving an editor with unsaved
 * work asks first, and the tests always leave; a failed test leaves a screenshot.
 */
export function useAuthorBrowser(): () => BrowserSession {
  return useSignedInBrowser(demoPeople.ines);
}

/** The sheet id in an editor address (`/projects/3/sheets/17` → 17). */
export function sheetIdOf(url: string): number {
  const match = /\/sheets\/(\d+)/.exec(new URL(url).pathname);
  if (!match) throw new Error(`No sheet id in ${url}`);
  return Number(match[1]);
}

/** The draft's block sources as the server holds them, read with the page's own session. */
export async function serverDraftSources(page: Page, sheetId: number): Promise<string[]> {
  const response = await page.request.get(`/api/sheets/${sheetId}`);
  if (!response.ok()) throw new Error(`GET /api/sheets/${sheetId}: HTTP ${response.status()}`);
  const body = (await response.json()) as { sheet: { draft: { blocks: { source: string }[] } } };
  return body.sheet.draft.blocks.map((b) => b.source);
}

/** The words of the save indicator in the editor's header. */
export async function saveStateText(page: Page): Promise<string> {
  return (await page.getByTestId('save-state').innerText()).trim();
}
