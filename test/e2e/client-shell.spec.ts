// Browser: the built client loads nothing from outside its own server (fonts bundled),
// keeps to the strict Content Security Policy, and every page carries the caution of DESIGN §12.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import {
  baseUrl,
  demoPeople,
  demoProjects,
  launchBrowser,
  signInAs,
  type BrowserSession,
} from '../support/browser';

// DESIGN.md §12, as the shell words it (web/src/config/words.ts).
const CAUTION_START = 'Results must be verified by a qualified engineer';

describe('client shell (browser)', () => {
  let session: BrowserSession;
  const requests: string[] = [];
  const cspMessages: string[] = [];

  beforeAll(async () => {
    session = await launchBrowser();
    session.page.on('request', (r) => requests.push(r.url()));
    session.page.on('console', (m) => {
      if (/Content Security Policy/i.test(m.text())) cspMessages.push(m.text());
    });
  });
  afterAll(async () => {
    await session?.close();
  });

  it('shows the caution on the sign-in page and on every signed-in page', async () => {
    const { page } = session;
    await page.goto('/sign-in');
    await page.getByText(CAUTION_START).waitFor();
    // The demo sign-ins are printed by npm start, never shown on the page.
    expect(await page.getByText('modewright-demo').count()).toBe(0);
    expect(await page.getByText(demoPeople.ada.email).count()).toBe(0);

    await signInAs(page, demoPeople.priya);
    await page.getByText(CAUTION_START).waitFor();
    await page
      .getByRole('table', { name: 'Projects' })
      .getByRole('link', { name: demoProjects.footbridge.name })
      .click();
    await page.getByRole('heading', { name: demoProjects.footbridge.name }).waitFor();
    await page.getByText(CAUTION_START).waitFor();
    // The header shows the job number under our label.
    await page.getByText('Job no.').first().waitFor();
    await page.getByText(demoProjects.footbridge.jobNumber, { exact: true }).first().waitFor();
  });

  it('answers an unknown address and a missing project in words', async () => {
    const { page } = session;
    await page.goto('/no/such/page');
    await page.getByRole('heading', { name: 'Page not found' }).waitFor();
    // Project ids are integers from 1; this one is far beyond any the tests create.
    await page.goto('/projects/987654321');
    const alert = page.getByRole('alert').filter({ hasText: 'Could not load this project.' });
    await alert.waitFor();
    // The server's own message is shown under the title, not a bare status code.
    const text = (await alert.textContent()) ?? '';
    expect(
      text.replace('Could not load this project.', '').replace('Try again', '').trim(),
    ).not.toBe('');
    expect(text).not.toMatch(/HTTP 404/);
  });

  it('bundles its fonts and loads them from its own server', async () => {
    const { page } = session;
    const fonts = await page.evaluate(async () => {
      await document.fonts.ready;
      // Ask for both faces explicitly: a face is only fetched once text needs it.
      await document.fonts.load('16px "IBM Plex Sans"');
      await document.fonts.load('16px "JetBrains Mono"');
      return {
        sans: document.fonts.check('16px "IBM Plex Sans"'),
        mono: document.fonts.check('16px "JetBrains Mono"'),
        loaded: [...document.fonts].filter((f) => f.status === 'loaded').map((f) => f.family),
      };
    });
    expect(fonts.sans).toBe(true);
    expect(fonts.mono).toBe(true);
    expect(fonts.loaded.some((f) => f.includes('IBM Plex Sans'))).toBe(true);
    expect(fonts.loaded.some((f) => f.includes('JetBrains Mono'))).toBe(true);
    const fontRequests = requests.filter((u) => /\.woff2?(\?|$)/.test(u));
    expect(fontRequests.length).toBeGreaterThan(0);
    for (const u of fontRequests) expect(new URL(u).pathname.startsWith('/assets/')).toBe(true);
  });

  it('requests nothing from another origin and breaks no CSP rule', async () => {
    const origin = new URL(baseUrl()).origin;
    const foreign = requests.filter((u) => !u.startsWith('data:') && new URL(u).origin !== origin);
    expect(foreign).toEqual([]);
    expect(cspMessages).toEqual([]);
    expect(requests.length).toBeGreaterThan(5);
  });
});
