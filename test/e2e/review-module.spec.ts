// The revision page as the demo people meet it: on a 390 px phone it keeps to the screen. The
// screenshots go to test-results/screenshots/review-module-*.png.
import type { Page } from 'playwright-core';
import { afterAll, afterEach, describe, expect, it } from 'vitest';
import {
  demoPeople,
  launchBrowser,
  saveScreenshot,
  signInAs,
  type BrowserSession,
} from '../support/browser';
import { openDemoRevision } from './editor-helpers';

const pageWidth = (page: Page) => page.evaluate(() => document.documentElement.scrollWidth);

describe('the revision page and its review actions (browser)', () => {
  const sessions: BrowserSession[] = [];
  const open = async (who: (typeof demoPeople)[keyof typeof demoPeople]) => {
    const s = await launchBrowser();
    sessions.push(s);
    await signInAs(s.page, who);
    return s;
  };
  afterEach(async ({ task }) => {
    if (task.result?.state === 'fail') {
      for (const [i, s] of sessions.entries()) {
        await saveScreenshot(s.page, `review-module-failed-${i}`).catch(() => undefined);
      }
    }
  });
  afterAll(async () => {
    for (const s of sessions) await s.close();
  });

  it('keeps the seeded frame revision within a 390 px phone screen, results and remarks included', async () => {
    const { page } = await open(demoPeople.tomasz);
    await openDemoRevision(page, 'DYN-02', 1);
    await page
      .getByRole('complementary', { name: 'Remarks' })
      .getByRole('article')
      .first()
      .waitFor();
    await saveScreenshot(page, 'review-module-revision-1280');
    await page.setViewportSize({ width: 390, height: 844 });
    await expect.poll(() => pageWidth(page)).toBeLessThanOrEqual(390);
    // The modes table is there and scrolls in its own box rather than widening the page.
    const modes = page.getByRole('table', { name: /^Modes/ }).first();
    await modes.waitFor();
    expect((await modes.boundingBox())?.width ?? 0).toBeGreaterThan(0);
    await saveScreenshot(page, 'review-module-revision-390');
  });
});
