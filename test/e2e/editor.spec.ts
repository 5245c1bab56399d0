// Issue 6, browser: the author builds sheets in the editor — a three-storey frame from storey data
// with its modes, mass ratios and a failing criterion; a Matrix Market pair uploaded and solved; a
// non-symmetric matrix with its error at the line; the same sheet in two tabs with the conflict
// resolved without losing either text; a long solve cancelled. Screenshots of each block kind go
// to test-results/screenshots/.
import path from 'node:path';
import type { Locator, Page } from 'playwright-core';
import { afterAll, afterEach, beforeAll, describe, expect, it } from 'vitest';
import {
  demoPeople,
  demoProjects,
  launchBrowser,
  saveScreenshot,
  signInAs,
  type BrowserSession,
} from '../support/browser';

const FIXTURES = path.resolve(import.meta.dirname, '..', 'fixtures', 'e2e');
// Each run makes its own sheets; the number is unique within the project.
const RUN = Date.now().toString(36).slice(-5).toUpperCase();

const KIND_LABEL = {
  text: 'text',
  calc: 'calculation',
  matrix: 'matrix',
  modes: 'modes',
  criteria: 'criteria',
} as const;
type Kind = keyof typeof KIND_LABEL;

async function projectHref(page: Page): Promise<string> {
  await page.goto('/');
  const row = page
    .getByRole('table', { name: 'Projects' })
    .getByRole('row')
    .filter({ hasText: demoProjects.footbridge.jobNumber });
  const href = await row.getByRole('link').first().getAttribute('href');
  if (!href) throw new Error('No link to the footbridge project in the projects table.');
  return href;
}

/** Starts an empty sheet from the project page and waits for the editor. */
async function newSheet(page: Page, number: string, title: string): Promise<string> {
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

function block(page: Page, index: number, kind: Kind): Locator {
  return page.getByRole('region', { name: `Block ${index}, ${KIND_LABEL[kind]}`, exact: true });
}

function source(page: Page, index: number, kind: Kind): Locator {
  return page.getByRole('textbox', { name: `Source of block ${index}, ${KIND_LABEL[kind]}` });
}

/** Replaces a block's whole source, as if typed (CodeMirror receives it as input). */
async function setSource(page: Page, index: number, kind: Kind, text: string): Promise<void> {
  const editor = source(page, index, kind);
  await editor.click();
  await page.keyboard.press('ControlOrMeta+a');
  await page.keyboard.insertText(text);
  await page.keyboard.press('Escape');
}

async function blockCount(page: Page): Promise<number> {
  return page.getByRole('list', { name: 'Blocks' }).locator(':scope > li').count();
}

async function addBlock(page: Page, kind: Kind, text: string): Promise<number> {
  const count = await blockCount(page);
  const label = {
    text: 'Text',
    calc: 'Calculation',
    matrix: 'Matrix',
    modes: 'Modes',
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
async function waitForResults(page: Page, timeout = 60_000): Promise<void> {
  await page.getByText('Results up to date').waitFor({ timeout });
}

async function waitSaved(page: Page, timeout = 20_000): Promise<void> {
  await page.getByTestId('save-state').getByText('Saved', { exact: true }).waitFor({ timeout });
}

/** Numbers of one column of a modes table, read as the engineer sees them. */
async function column(table: Locator, header: string): Promise<number[]> {
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
function uniformChain(N: number, k: number, m: number) {
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

const relative = (a: number, b: number) => Math.abs(a - b) / Math.abs(b);

describe('sheet editor (browser)', () => {
  let ines: BrowserSession;

  beforeAll(async () => {
    ines = await launchBrowser();
    // Leaving an editor with unsaved work asks first; the tests always leave.
    ines.context.on('page', (p) => p.on('dialog', (d) => void d.accept()));
    ines.page.on('dialog', (d) => void d.accept());
    await signInAs(ines.page, demoPeople.ines);
  });
  afterEach(async ({ task }) => {
    if (task.result?.state === 'fail')
      await saveScreenshot(ines.page, `failed-${task.name.slice(0, 40)}`);
  });
  afterAll(async () => {
    await ines?.close();
  });

  it('builds a three-storey frame from storey data, solves it and shows a failing criterion', async () => {
    const { page } = ines;
    await newSheet(page, `E2E-F${RUN}`, 'Three-storey frame');
    const textIndex = await addBlock(
      page,
      'text',
      '## Three-storey frame\n\nShear building, equal storeys: $k = 30\\,\\mathrm{kN/mm}$.',
    );
    const calcIndex = await addBlock(
      page,
      'calc',
      [
        'm_s = 20 t  # each floor',
        'k_s = 30 kN/mm  # each storey',
        'frame = storey_chain([m_s, m_s, m_s], [k_s, k_s, k_s])',
        'f_hand = sqrt(k_s / m_s) / (2 pi)',
      ].join('\n'),
    );
    await addBlock(
      page,
      'modes',
      [
        'name: sway',
        'stiffness: frame.K',
        'mass: frame.M',
        'method: dense',
        'count: 3',
        'direction: x',
      ].join('\n'),
    );
    await waitForResults(page);

    const table = page.getByRole('table', { name: 'Modes of sway' });
    await table.waitFor();
    // Closed form (REFERENCES.md item 2) with k = 30 kN/mm = 3e7 N/m, m = 20 t = 2e4 kg.
    const expected = uniformChain(3, 3e7, 2e4);
    const f = await column(table, 'f (Hz)');
    expect(f).toHaveLength(3);
    // The table shows 4 significant figures: agree to 0.05 % (half a unit in the 4th figure).
    f.forEach((value, i) => expect(relative(value, expected[i]!.f)).toBeLessThan(5e-4));
    // Mass ratios to the shown 0.1 %: within 0.06 percentage points.
    const ratios = await column(table, 'Eff. mass');
    ratios.forEach((value, i) =>
      expect(Math.abs(value - 100 * expected[i]!.ratio)).toBeLessThan(0.06),
    );
    const cumulative = await column(table, 'Cumulative');
    expect(Math.abs(cumulative[2]! - 100)).toBeLessThan(0.06);
    await page.getByText(/Sturm check/).waitFor();
    await page.getByRole('figure', { name: 'Mode shapes' }).waitFor();
    await saveScreenshot(page, 'editor-modes');

    // A criterion that cannot pass: the first frequency is ≈ 2.7 Hz.
    await addBlock(
      page,
      'criteria',
      [
        'sway.cumulative[3] >= 0.90  # 90 % of the mass',
        'sway.f[1] >= 5 Hz  # deliberately strict',
      ].join('\n'),
    );
    await waitForResults(page);
    const criteria = page.getByRole('list', { name: 'Criteria' });
    await criteria
      .getByRole('listitem')
      .filter({ hasText: 'deliberately strict' })
      .getByText('Failed')
      .waitFor();
    await criteria
      .getByRole('listitem')
      .filter({ hasText: '90 % of the mass' })
      .getByText('Passed')
      .waitFor();
    const summary = page.getByTestId('criteria-summary');
    expect(await summary.innerText()).toMatch(/1 passed\s*1 failed/);
    await waitSaved(page);
    await saveScreenshot(page, 'editor-criteria');

    // The calc block: formula, substitution, result rendered by KaTeX.
    await block(page, calcIndex, 'calc').locator('.katex').first().waitFor();
    await block(page, calcIndex, 'calc').screenshot({ path: await shotPath('editor-calc') });
    await block(page, textIndex, 'text').screenshot({ path: await shotPath('editor-text') });
  });

  it('uploads a Matrix Market pair and solves it', async () => {
    const { page } = ines;
    await newSheet(page, `E2E-U${RUN}`, 'Uploaded chain');
    const before = await blockCount(page);
    await page
      .getByLabel('Upload K or M file…')
      .setInputFiles([path.join(FIXTURES, 'chain3-K.mtx'), path.join(FIXTURES, 'chain3-M.mtx')]);
    await block(page, before + 2, 'matrix').waitFor();
    expect(await source(page, before + 1, 'matrix').innerText()).toContain('from: chain3-K.mtx');
    expect(await source(page, before + 2, 'matrix').innerText()).toContain('from: chain3-M.mtx');
    await addBlock(
      page,
      'modes',
      ['name: chain', 'stiffness: chain3_K', 'mass: chain3_M', 'method: inverse', 'count: 3'].join(
        '\n',
      ),
    );
    await waitForResults(page);
    const table = page.getByRole('table', { name: 'Modes of chain' });
    // k = 1000 kN/m = 1e6 N/m, m = 1 t = 1000 kg in the fixtures' comments.
    const expected = uniformChain(3, 1e6, 1e3);
    const f = await column(table, 'f (Hz)');
    f.forEach((value, i) => expect(relative(value, expected[i]!.f)).toBeLessThan(5e-4));
    await block(page, before + 1, 'matrix')
      .getByText(/3 × 3/)
      .waitFor();
    await saveScreenshot(page, 'editor-matrix-upload');
    await waitSaved(page);
  });

  it('shows a non-symmetric matrix as an error at its line', async () => {
    const { page } = ines;
    await newSheet(page, `E2E-S${RUN}`, 'Typed matrix');
    const at = await addBlock(page, 'matrix', ['name: A', 'unit: kN/m', '4 1', '2 3'].join('\n'));
    await waitForResults(page);
    const errors = page.getByRole('list', { name: `Errors in block ${at}, matrix` });
    // The worst asymmetry is A[1,2] = 1 against A[2,1] = 2; the engine points at the row of the
    // lower entry, line 4 of the block.
    await errors.getByText(/Line 4:.*not symmetric/).waitFor();
    const underline = block(page, at, 'matrix').locator('.cm-lintRange-error').first();
    await underline.waitFor();
    // The message shows on hover over the underlined line.
    await underline.hover();
    await page
      .locator('.cm-tooltip-lint')
      .getByText(/not symmetric/)
      .waitFor();
    await block(page, at, 'matrix').screenshot({ path: await shotPath('editor-matrix-error') });
    await waitSaved(page);
  });

  it('resolves an edit of the same sheet in two tabs without losing either text', async () => {
    const { page, context } = ines;
    const url = await newSheet(page, `E2E-C${RUN}`, 'Two tabs');
    const at = await addBlock(page, 'text', 'Base text.');
    await waitSaved(page);
    const other = await context.newPage();
    try {
      await other.goto(url);
      await source(other, at, 'text').waitFor();
      await setSource(page, at, 'text', 'Written in the first tab.');
      await waitSaved(page);
      await setSource(other, at, 'text', 'Written in the second tab.');
      const dialog = other.getByRole('dialog', { name: 'This draft was changed elsewhere' });
      await dialog.waitFor({ timeout: 20_000 });
      await dialog
        .getByRole('region', { name: 'Your version' })
        .getByText('Written in the second tab.')
        .waitFor();
      await dialog
        .getByRole('region', { name: 'Their version' })
        .getByText('Written in the first tab.')
        .waitFor();
      await saveScreenshot(other, 'editor-conflict');
      await dialog.getByRole('button', { name: 'Keep both' }).click();
      await waitSaved(other);
      // Reloaded from the server, the sheet holds both texts.
      await other.reload();
      await source(other, at + 1, 'text').waitFor();
      expect(await source(other, at, 'text').innerText()).toContain('Written in the second tab.');
      expect(await source(other, at + 1, 'text').innerText()).toContain(
        'Written in the first tab.',
      );
    } finally {
      await other.close();
    }
  });

  it('duplicates, moves by keyboard and by drag, and deletes with undo', async () => {
    const { page } = ines;
    await newSheet(page, `E2E-B${RUN}`, 'Block order');
    const first = await addBlock(page, 'calc', 'a_1 = 1 m  # first');
    await addBlock(page, 'calc', 'b_1 = 2 m  # second');
    const sources = async () =>
      page.getByRole('list', { name: 'Blocks' }).locator('.cm-content').allInnerTexts();

    await page.getByRole('button', { name: `Duplicate block ${first}, calculation` }).click();
    expect((await sources()).slice(first - 1)).toEqual([
      'a_1 = 1 m  # first',
      'a_1 = 1 m  # first',
      'b_1 = 2 m  # second',
    ]);

    // Keyboard: focus the last block's handle and press ↑ twice.
    const last = first + 2;
    await page
      .getByRole('button', { name: `Move block ${last}, calculation (drag, or arrow keys)` })
      .focus();
    await page.keyboard.press('ArrowUp');
    await page.keyboard.press('ArrowUp');
    expect((await sources()).slice(first - 1)).toEqual([
      'b_1 = 2 m  # second',
      'a_1 = 1 m  # first',
      'a_1 = 1 m  # first',
    ]);

    // Drag: the first of them (b_1) onto the last place.
    await page
      .getByRole('button', { name: `Move block ${first}, calculation (drag, or arrow keys)` })
      .dragTo(block(page, last, 'calc'));
    expect((await sources()).slice(first - 1)).toEqual([
      'a_1 = 1 m  # first',
      'a_1 = 1 m  # first',
      'b_1 = 2 m  # second',
    ]);

    await page.getByRole('button', { name: `Delete block ${last}, calculation` }).click();
    expect((await sources()).slice(first - 1)).toEqual([
      'a_1 = 1 m  # first',
      'a_1 = 1 m  # first',
    ]);
    await page.getByRole('button', { name: 'Undo' }).click();
    expect((await sources()).slice(first - 1)).toEqual([
      'a_1 = 1 m  # first',
      'a_1 = 1 m  # first',
      'b_1 = 2 m  # second',
    ]);
    await waitSaved(page);
  });

  it('shows a viewer the results of a sheet but nothing to edit', async () => {
    const { page } = ines;
    // The demo footbridge sheet (seeds) as the author sees it, then as Lena, the viewer.
    await page.goto(await projectHref(page));
    const href = await page
      .getByRole('table', { name: 'Sheets of the project' })
      .getByRole('link', { name: 'DYN-01' })
      .getAttribute('href');
    expect(href).toBeTruthy();
    const lena = await launchBrowser();
    try {
      await signInAs(lena.page, demoPeople.lena);
      await lena.page.goto(href!);
      await lena.page.getByText('Read only').waitFor();
      await waitForResults(lena.page);
      await lena.page.getByRole('list', { name: 'Criteria' }).first().waitFor();
      expect(await lena.page.getByRole('button', { name: /^Delete block/ }).count()).toBe(0);
      expect(await lena.page.getByRole('group', { name: 'Add a block' }).count()).toBe(0);
      const editable = await lena.page.locator('.cm-content[contenteditable="true"]').count();
      expect(editable).toBe(0);
      await lena.page.getByTestId('sheet-caution').waitFor();
      await saveScreenshot(lena.page, 'editor-viewer');
    } finally {
      await lena.close();
    }
  });

  // 200 DOFs and 40 modes by inverse iteration with deflation take ~13 s on this machine (2
  // cores): long enough to cancel, small enough in memory (dense 200 × 200) to harm nothing.
  it('cancels a long solve', async () => {
    const { page } = ines;
    await newSheet(page, `E2E-L${RUN}`, 'Long solve');
    await addBlock(
      page,
      'calc',
      'girder = beam({E: 210 GPa, I: 0.02 m^4, mass: 1.5 t/m, length: 120 m, elements: 100, ends: "pinned-pinned"})',
    );
    await addBlock(
      page,
      'modes',
      ['name: long', 'stiffness: girder.K', 'mass: girder.M', 'method: inverse', 'count: 40'].join(
        '\n',
      ),
    );
    const cancel = page.getByRole('button', { name: 'Cancel', exact: true });
    await cancel.waitFor({ timeout: 20_000 });
    await saveScreenshot(page, 'editor-long-solve');
    await cancel.click();
    await page.getByText('Evaluation cancelled — results are stale').waitFor();
    expect(await page.getByRole('table', { name: 'Modes of long' }).count()).toBe(0);
    await page.getByRole('button', { name: 'Run', exact: true }).waitFor();
    await waitSaved(page, 60_000);
  });
});

async function shotPath(name: string): Promise<string> {
  const { mkdir } = await import('node:fs/promises');
  const dir = path.resolve(import.meta.dirname, '..', '..', 'test-results', 'screenshots');
  await mkdir(dir, { recursive: true });
  return path.join(dir, `${name}.png`);
}
