// Browser helpers for test/e2e: Debian's Chromium driven by playwright-core, a fresh profile for
// every launch (so no cookie leaks between people), demo sign-ins, and screenshots.
import { existsSync } from 'node:fs';
import { mkdir, mkdtemp, rm } from 'node:fs/promises';
import os from 'node:os';
import path from 'node:path';
import { afterAll, afterEach, beforeAll, inject } from 'vitest';
import { chromium, type BrowserContext, type Page } from 'playwright-core';

declare module 'vitest' {
  export interface ProvidedContext {
    /** The real app started by test/support/e2e-global-setup.ts, e.g. http://127.0.0.1:40123 */
    e2eBaseUrl: string;
  }
}

export const CHROMIUM_PATH = '/usr/bin/chromium';
const SCREENSHOT_DIR = path.resolve(import.meta.dirname, '..', '..', 'test-results', 'screenshots');

/** The demo scenario of the seeds (DESIGN.md §11, the foundation contract). */
export const DEMO_PASSWORD = 'modewright-demo';
export const demoPeople = {
  ada: { name: 'Ada Brennan', email: 'ada.brennan@brackwater.example', isAdmin: true },
  ines: { name: 'Ines Marlow', email: 'ines.marlow@brackwater.example', isAdmin: false },
  tomasz: { name: 'Tomasz Reyes', email: 'tomasz.reyes@brackwater.example', isAdmin: false },
  priya: { name: 'Priya Anand', email: 'priya.anand@brackwater.example', isAdmin: false },
  lena: { name: 'Lena Ostrowski', email: 'lena.ostrowski@kestrelquay.example', isAdmin: false },
} as const;
export type DemoPerson = (typeof demoPeople)[keyof typeof demoPeople];

export const demoProjects = {
  footbridge: { jobNumber: 'BW-2611', name: 'Kestrel Quay Footbridge and Pump House' },
  offices: { jobNumber: 'BW-2598', name: 'Linden Row Offices — Floor Vibration' },
} as const;

export function baseUrl(): string {
  return inject('e2eBaseUrl');
}

export type BrowserSession = {
  context: BrowserContext;
  page: Page;
  /** Forgets every cookie, so the next sign-in starts from a signed-out browser. */
  signOutLocally(): Promise<void>;
  close(): Promise<void>;
};

/** Launches Chromium exactly as STACK.md ("Browser") says, with a new temporary profile. */
export async function launchBrowser(): Promise<BrowserSession> {
  if (!existsSync(CHROMIUM_PATH)) {
    throw new Error(
      `${CHROMIUM_PATH} is missing: install Debian's chromium package (npm test does this).`,
    );
  }
  const profile = await mkdtemp(path.join(os.tmpdir(), 'modewright-e2e-'));
  const context = await chromium.launchPersistentContext(profile, {
    executablePath: CHROMIUM_PATH,
    args: [
      '--headless',
      '--no-sandbox',
      '--disable-gpu',
      '--disable-quic',
      '--no-first-run',
      '--disable-background-networking',
      '--disable-component-update',
      '--disable-sync',
    ],
    viewport: { width: 1280, height: 860 },
    baseURL: baseUrl(),
  });
  // Generous: two shared cores and argon2 sign-ins make single steps take seconds at busy times.
  context.setDefaultTimeout(30_000);
  const page = context.pages()[0] ?? (await context.newPage());
  return {
    context,
    page,
    async signOutLocally() {
      // Leave the app first: a request still in flight (a sheet page's evaluation) could set the
      // session cookie again after it was cleared.
      await page.goto('about:blank');
      // A response already under way when the page left may still set the cookie: clear until
      // the store stays empty.
      for (let attempt = 0; attempt < 10; attempt++) {
        await context.clearCookies();
        await page.waitForTimeout(150);
        if ((await context.cookies()).length === 0) break;
      }
    },
    async close() {
      await context.close();
      await rm(profile, { recursive: true, force: true });
    },
  };
}

/** Opens the sign-in page and signs in; resolves once the signed-in shell is showing. */
export async function signInAs(
  page: Page,
  person: { email: string; name: string },
  password: string = DEMO_PASSWORD,
): Promise<void> {
  await page.goto('/sign-in');
  const email = page.getByLabel('E-mail');
  try {
    await email.waitFor({ timeout: 10_000 });
  } catch {
    // The form waits for the session check (GET /api/auth/me). Seen once in a full run: the
    // form never came. Load the page once more, and if the form is still missing say where the
    // browser is and what it shows, so a failure can be told apart from a slow server.
    await page.reload();
    try {
      await email.waitFor({ timeout: 15_000 });
    } catch {
      const text = (await page.locator('body').innerText()).slice(0, 300);
      throw new Error(`No sign-in form at ${page.url()} after a reload; the page shows: ${text}`);
    }
  }
  await fillSignIn(page, person.email, password);
  await page.getByText(`Signed in as ${person.name}`).waitFor();
}

export async function fillSignIn(page: Page, email: string, password: string): Promise<void> {
  await page.getByLabel('E-mail').fill(email);
  await page.getByLabel('Password').fill(password);
  await page.getByRole('button', { name: 'Sign in' }).click();
}

/**
 * Saves a screenshot to test-results/screenshots/<name>.png: the whole page, unless it has grown
 * very tall (a test database full of rows), when the top 2400 px tell the story.
 */
export async function saveScreenshot(page: Page, name: string): Promise<string> {
  await mkdir(SCREENSHOT_DIR, { recursive: true });
  const file = path.join(SCREENSHOT_DIR, `${name}.png`);
  const height = await page.evaluate(() => document.documentElement.scrollHeight);
  const width = page.viewportSize()?.width ?? 1280;
  await page.screenshot({
    path: file,
    timeout: 45_000,
    ...(height <= 2400
      ? { fullPage: true }
      : { fullPage: true, clip: { x: 0, y: 0, width, height: 2400 } }),
  });
  return file;
}

/**
 * One browser for a describe block, signed in as `person` before its tests (dialogs accepted), a
 * screenshot of a failed test, closed after them; the returned function gives the session.
 */
export function useSignedInBrowser(person: { email: string; name: string }): () => BrowserSession {
  let browser: BrowserSession | undefined;
  beforeAll(async () => {
    browser = await launchBrowser();
    browser.context.on('page', (p) => p.on('dialog', (d) => void d.accept()));
    browser.page.on('dialog', (d) => void d.accept());
    await signInAs(browser.page, person);
  });
  afterEach(async ({ task }) => {
    if (browser && task.result?.state === 'fail') {
      await saveScreenshot(browser.page, `failed-${task.name.slice(0, 40)}`);
    }
  });
  afterAll(async () => {
    await browser?.close();
  });
  return () => {
    if (!browser) throw new Error('The browser is not started yet.');
    return browser;
  };
}

/** An A4 sheet's width in CSS pixels: 210 mm at 96 px to the inch (CSS Values 4, absolute units). */
export const A4_WIDTH_PX = (210 * 96) / 25.4;

/**
 * The page's laid-out width, and the print preview's paper (`.mw-print`): its width in its own
 * layout and the width it is drawn at on the screen.
 */
export async function paperWidths(
  page: Page,
): Promise<{ page: number; paper: number; shown: number }> {
  return page.evaluate(() => {
    const paper = document.querySelector<HTMLElement>('.mw-print')!;
    return {
      page: document.documentElement.scrollWidth,
      paper: paper.offsetWidth,
      shown: paper.getBoundingClientRect().width,
    };
  });
}
