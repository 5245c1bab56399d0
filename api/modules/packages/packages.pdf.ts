import { existsSync } from 'node:fs';
import { chromium } from 'playwright-core';
import { AppError } from '../../http/errors';

/** Debian's Chromium, the one browser this installation drives (STACK.md). */
export const CHROMIUM_PATH = '/usr/bin/chromium';

const NO_CHROMIUM =
  'This server cannot make PDFs: Chromium (/usr/bin/chromium) is not installed here. Open the ' +
  'print view and use your browser’s Print → Save as PDF instead, or ask your administrator to ' +
  'install Debian’s chromium package.';

// One PDF at a time: each is a whole browser, and the machine is small.
let queue: Promise<unknown> = Promise.resolve();

export interface PdfRequest {
  /**
   * Where Chromium loads the page: this server's own socket address, never the Host header, so
   * a request cannot send the server's browser to another host.
   */
  origin: string;
  /** The address the person reached the server at: printed as the seals' verify addresses. */
  publicOrigin: string;
  /** The client page to print, e.g. /projects/3/package?revisions=4,9. */
  path: string;
  /** The asking person's session cookie: the page shows exactly what they may open. */
  cookie: { name: string; value: string } | null;
}

/**
 * Prints the client's package page to PDF with headless Chromium, as the person's browser would
 * print it (CSS paged media: A4, the title block repeated, "page x of y" across the package).
 */
export function renderPdf(request: PdfRequest, chromiumPath = CHROMIUM_PATH): Promise<Buffer> {
  if (!existsSync(chromiumPath)) {
    return Promise.reject(new AppError(503, 'PDF_UNAVAILABLE', NO_CHROMIUM));
  }
  const run = queue.then(() => render(request, chromiumPath));
  queue = run.catch(() => undefined);
  return run;
}

async function render(
  { origin, publicOrigin, path, cookie }: PdfRequest,
  chromiumPath: string,
): Promise<Buffer> {
  const browser = await chromium.launch({
    executablePath: chromiumPath,
    headless: true,
    args: [
      '--no-sandbox',
      '--disable-gpu',
      '--disable-quic',
      '--no-first-run',
      '--disable-background-networking',
      '--disable-component-update',
      '--disable-sync',
    ],
  });
  try {
    const context = await browser.newContext();
    if (cookie) await context.addCookies([{ ...cookie, url: origin }]);
    const page = await context.newPage();
    // The package page prints verify addresses under this origin (see the client's package route).
    await page.addInitScript((base) => {
      Object.defineProperty(window, 'mwVerifyBase', { value: base });
    }, publicOrigin);
    await page.goto(`${origin}${path}`, { waitUntil: 'load', timeout: 60_000 });
    const state = await page.waitForSelector(
      '[data-package-state="ready"], [data-package-state="error"]',
      {
        timeout: 120_000,
      },
    );
    if ((await state.getAttribute('data-package-state')) === 'error') {
      const message = (await state.innerText()).slice(0, 300);
      throw new AppError(500, 'PDF_FAILED', `The package page could not be composed: ${message}`);
    }
    await page.evaluate(() => document.fonts.ready);
    await page.emulateMedia({ media: 'print' });
    return await page.pdf({ preferCSSPageSize: true, printBackground: true });
  } finally {
    await browser.close();
  }
}
