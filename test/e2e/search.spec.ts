// Browser: the header's search box finds sheets and remark threads in the projects a person may
// open, and its results link to the place. The demo viewer (Lena) is a member of the footbridge
// project only: a sheet with the same word in the offices project stays hidden from her.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Page } from 'playwright-core';
import {
  demoPeople,
  demoProjects,
  launchBrowser,
  saveScreenshot,
  signInAs,
  type BrowserSession,
} from '../support/browser';

const word = `quaysway${Date.now().toString(36)}`;

/**
 * Makes a sheet with a draft through the API from the signed-in page, as the client does; with
 * `issue`, issues it for check too (a viewer reads only issued revisions).
 */
async function sheetWithDraft(
  page: Page,
  jobNumber: string,
  number: string,
  line: string,
  issue = false,
) {
  return page.evaluate(
    async ({ jobNumber, number, line, issue }) => {
      const send = async (method: string, url: string, body: unknown, extra = {}) => {
        const { csrfToken } = (await (await fetch('/api/auth/csrf')).json()) as {
          csrfToken: string;
        };
        const res = await fetch(url, {
          method,
          headers: { 'Content-Type': 'application/json', 'X-CSRF-Token': csrfToken, ...extra },
          body: JSON.stringify(body),
        });
        if (!res.ok) throw new Error(`${method} ${url} answered ${res.status}`);
        return res.json();
      };
      const { projects } = (await (await fetch('/api/projects')).json()) as {
        projects: { id: number; jobNumber: string }[];
      };
      const project = projects.find((p) => p.jobNumber === jobNumber)!;
      const made = (await send('POST', `/api/projects/${project.id}/sheets`, {
        number,
        title: 'Search check',
      })) as { sheet: { id: number; draftVersion: number } };
      await send(
        'PUT',
        `/api/sheets/${made.sheet.id}/draft`,
        {
          blocks: [
            { id: 'intro', kind: 'text', source: 'Search check sheet.' },
            { id: 'loads', kind: 'calc', source: `m = 18 t\nk = 24 kN/mm # ${line}` },
          ],
          settings: { significantFigures: 4 },
        },
        { 'If-Match': `"${made.sheet.draftVersion}"` },
      );
      if (issue) {
        await send('POST', `/api/sheets/${made.sheet.id}/revisions`, { purpose: 'For check' });
      }
      return { projectId: project.id, sheetId: made.sheet.id };
    },
    { jobNumber, number, line, issue },
  );
}

/** The element's box lies within the window (the page scrolled it into view). */
async function inView(page: Page, selector: string): Promise<boolean> {
  return page.locator(selector).evaluate((el) => {
    const box = el.getBoundingClientRect();
    return box.height > 0 && box.top >= 0 && box.bottom <= window.innerHeight;
  });
}

/** The line number a result names ("…, block 2 (calc), line 7:"). */
async function lineOfResult(page: Page, where: RegExp): Promise<number> {
  const text = await page.getByText(where).first().innerText();
  return Number(/line (\d+):/.exec(text)![1]);
}

describe('search (browser)', () => {
  let author: BrowserSession;
  let viewer: BrowserSession;
  const stamp = Date.now().toString(36).toUpperCase();
  let footbridgeSheet: { projectId: number; sheetId: number };

  beforeAll(async () => {
    [author, viewer] = await Promise.all([launchBrowser(), launchBrowser()]);
    await Promise.all([
      signInAs(author.page, demoPeople.ines),
      signInAs(viewer.page, demoPeople.lena),
    ]);
    footbridgeSheet = await sheetWithDraft(
      author.page,
      demoProjects.footbridge.jobNumber,
      `SRCH-${stamp}`,
      `${word} bearing stiffness`,
      true,
    );
    await sheetWithDraft(
      author.page,
      demoProjects.offices.jobNumber,
      `SRCH-${stamp}`,
      `${word} slab`,
    );
  });
  afterAll(async () => {
    await Promise.all([author?.close(), viewer?.close()]);
  });

  it('finds a calc line in both of the author’s projects', async () => {
    const { page } = author;
    await page.goto('/');
    const box = page.getByRole('search').getByLabel('Search sheets and remarks');
    await box.fill(word);
    await box.press('Enter');
    const results = page.getByRole('list', { name: 'Search results' });
    await results.waitFor();
    await page.getByText('2 results').waitFor();
    expect(await results.getByRole('listitem').count()).toBe(2);
    await results.getByText(demoProjects.offices.name).waitFor();
    await results.getByText(demoProjects.footbridge.name).waitFor();
    await results.getByText(`k = 24 kN/mm # ${word} bearing stiffness`).waitFor();
    await saveScreenshot(page, 'search-results');
  });

  it('shows the viewer only her project, and the result opens the revision on the line', async () => {
    const { page } = viewer;
    await page.goto('/');
    const box = page.getByRole('search').getByLabel('Search sheets and remarks');
    await box.fill(`${word} k`);
    await page.getByRole('search').getByRole('button', { name: 'Search' }).click();
    const results = page.getByRole('list', { name: 'Search results' });
    await results.waitFor();
    await page.getByText('1 result', { exact: true }).waitFor();
    await page.getByText('Not searched: k (words need at least 3 characters).').waitFor();
    expect(await results.getByText(demoProjects.offices.name).count()).toBe(0);
    // The draft is not hers to read: the place is in the issued revision.
    await results.getByText('Rev 1, block 2 (calc), line 2:').waitFor();
    await page.setViewportSize({ width: 390, height: 844 });
    await saveScreenshot(page, 'search-results-390');
    await page.setViewportSize({ width: 1280, height: 860 });
    await results.getByRole('link', { name: `SRCH-${stamp} — Search check` }).click();
    await page.waitForURL(/\/revisions\/\d+\?block=loads&line=2$/);
    const marked = page.locator('li.mw-place-mark[data-line="2"]');
    await marked.getByText(`${word} bearing stiffness`).waitFor();
    const back = page.getByRole('link', { name: `← Sheet SRCH-${stamp}` });
    expect(await back.getAttribute('href')).toBe(
      `/projects/${footbridgeSheet.projectId}/sheets/${footbridgeSheet.sheetId}`,
    );
  });

  it('finds the demo remark thread for the viewer and opens the remark on its revision', async () => {
    const { page } = viewer;
    await page.goto('/search?q=KQ-E-402');
    const results = page.getByRole('list', { name: 'Search results' });
    await results.waitFor();
    const reply = results.getByRole('link', { name: /DYN-01 Rev 2 — reply to a remark/ });
    await reply.first().click();
    await page.waitForURL(/\/revisions\/\d+\?block=deck-data&line=\d+&remark=\d+$/);
    const remarkId = new URL(page.url()).searchParams.get('remark');
    const card = `article.mw-place-mark[data-remark-id="${remarkId}"]`;
    await page.locator(card).waitFor();
    expect(await inView(page, card)).toBe(true);
  });

  it('says so when nothing is found', async () => {
    const { page } = viewer;
    await page.goto(`/search?q=${word}nothing`);
    await page.getByText(`Nothing found for “${word}nothing”`).waitFor();
  });
});

// A word on a line of a demo sheet (DYN-01's note on the services mass, seeds/03_demo_review.ts):
// the author's result opens the editor on that line, the viewer's the sealed revision's line.
describe('search results go to the line (browser)', () => {
  const query = 'handrail heating';

  /** The marked place holds the searched words and the page scrolled it into view. */
  async function expectMarked(page: Page, selector: string) {
    await page
      .locator(selector)
      .getByText(/handrail heating/)
      .waitFor();
    expect(await inView(page, selector)).toBe(true);
  }
  let author: BrowserSession;
  let viewer: BrowserSession;

  beforeAll(async () => {
    [author, viewer] = await Promise.all([launchBrowser(), launchBrowser()]);
    await Promise.all([
      signInAs(author.page, demoPeople.ines),
      signInAs(viewer.page, demoPeople.lena),
    ]);
  });
  afterAll(async () => {
    await Promise.all([author?.close(), viewer?.close()]);
  });

  it('opens the author’s editor scrolled to the line, marked, and again after a reload', async () => {
    const { page } = author;
    await page.setViewportSize({ width: 1366, height: 800 });
    await page.goto(`/search?q=${encodeURIComponent(query)}`);
    const line = await lineOfResult(page, /^Draft, block \d+ \(calc\), line \d+:/);
    await page.getByRole('link', { name: /^DYN-01 — East Basin footbridge/ }).click();
    await page.waitForURL(new RegExp(`/projects/\\d+/sheets/\\d+\\?block=deck-data&line=${line}$`));
    const marked = '[data-block-id="deck-data"] .cm-line.mw-place-mark';
    await expectMarked(page, marked);
    await saveScreenshot(page, 'search-place-editor-1366');
    await page.reload();
    await expectMarked(page, marked);
    // The mark is brief.
    await page.locator(marked).waitFor({ state: 'detached', timeout: 10_000 });
  });

  it('opens the viewer’s revision on the line at 390 px', async () => {
    const { page } = viewer;
    await page.setViewportSize({ width: 390, height: 844 });
    await page.goto(`/search?q=${encodeURIComponent(query)}`);
    const line = await lineOfResult(page, /^Rev \d+, block \d+ \(calc\), line \d+:/);
    await page.getByRole('link', { name: /^DYN-01 — East Basin footbridge/ }).click();
    await page.waitForURL(new RegExp(`/revisions/\\d+\\?block=deck-data&line=${line}$`));
    const marked = `li.mw-place-mark[data-line="${line}"]`;
    await expectMarked(page, marked);
    await saveScreenshot(page, 'search-place-revision-390');
    await page.reload();
    await expectMarked(page, marked);
  });
});
