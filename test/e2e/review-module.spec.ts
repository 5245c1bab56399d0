// The revision page as the demo people meet it: on a 390 px phone it keeps to the screen; a failed
// criterion is named in its header and beside the sign-off; return and sign-off ask once more and
// take a covering note (and, at sign-off, what the revision is checked for); the author answers on
// a returned revision and may edit or withdraw her reply until someone acts on it; each digest says
// what it covers. Screenshots: test-results/screenshots/review-module-*.png.
import type { Page } from 'playwright-core';
import { afterAll, afterEach, describe, expect, it } from 'vitest';
import {
  demoPeople,
  launchBrowser,
  saveScreenshot,
  signInAs,
  type BrowserSession,
} from '../support/browser';
import {
  RUN,
  addBlock,
  newSheet,
  openDemoRevision,
  waitForResults,
  waitSaved,
} from './editor-helpers';

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

  it('takes a sheet with a failed criterion through return, answers, and sign-off for construction', async () => {
    const ines = await open(demoPeople.ines);
    const tomasz = await open(demoPeople.tomasz);
    const status = (page: Page) => page.getByTestId('revision-status');

    // The author: f = √(k/m)/2π = √(2000e3/5000)/2π = 3.183 Hz (closed form) fails a 5 Hz check.
    await newSheet(ines.page, `RM-${RUN}`, 'Skid frequency');
    const calc = await addBlock(
      ines.page,
      'calc',
      'k = 2000 kN/m\nm_s = 5 t\nf = sqrt(k / m_s) / (2 * pi)',
    );
    await addBlock(ines.page, 'criteria', 'f >= 5 Hz  # clear of the pump speed');
    await waitForResults(ines.page);
    await waitSaved(ines.page);
    const issue = async (n: number) => {
      await ines.page.getByRole('button', { name: 'Issue for check' }).click();
      const form = ines.page.getByRole('form', { name: 'Issue for check' });
      await form.getByLabel('Purpose').fill('For check');
      await form.getByRole('button', { name: `Issue Rev ${n}` }).click();
      await ines.page
        .getByRole('heading', { name: new RegExp(`Rev ${n}$`) })
        .waitFor({ timeout: 60_000 });
      return ines.page.url();
    };
    const sheetUrl = ines.page.url();
    const rev1 = await issue(1);

    // The checker reads the failed criterion in the header, remarks and returns with a note.
    const t = tomasz.page;
    await t.goto(rev1);
    expect(await t.getByTestId('failed-criteria').innerText()).toBe(
      '1 failed criterion: clear of the pump speed',
    );
    await t.getByRole('button', { name: `Remark on line 2 of Block ${calc} (calc)` }).click();
    const remarkForm = t.getByRole('form', { name: `Remark on Block ${calc} (calc), line 2` });
    await remarkForm.getByLabel('Remark').fill('Is the skid base in the 5 t?');
    await remarkForm.getByRole('button', { name: 'Add remark' }).click();
    await t.getByLabel('1 remark on line 2').waitFor();
    await t.getByRole('button', { name: 'Return to author…' }).click();
    const returning = t.getByRole('form', { name: 'Return Rev 1 to the author' });
    // Nothing happens until the second step; Cancel leaves the revision in check.
    await returning.getByRole('button', { name: 'Cancel' }).click();
    expect(await status(t).innerText()).toBe('In check');
    await t.getByRole('button', { name: 'Return to author…' }).click();
    await returning.getByLabel('Note to the author (optional)').fill('One question on the mass.');
    await returning.getByRole('button', { name: 'Return Rev 1' }).click();
    await expect.poll(() => status(t).innerText()).toBe('Returned');
    expect(await t.getByTestId('check-note').innerText()).toBe('One question on the mass.');

    // The author answers on the returned Rev 1, edits the answer, withdraws it, answers again.
    const i = ines.page;
    await i.goto(rev1);
    const remarks = i.getByRole('complementary', { name: 'Remarks' });
    await remarks.getByLabel('Reply').fill('Yes, included.');
    await remarks.getByRole('button', { name: 'Send reply' }).click();
    await remarks.getByTestId('remark-state').getByText('Answered', { exact: true }).waitFor();
    await remarks.getByRole('button', { name: 'Edit', exact: true }).click();
    const edit = remarks.getByRole('form', { name: 'Edit your reply' });
    await edit.getByLabel('Your reply').fill('Yes, the skid base (0.6 t) is included.');
    await edit.getByRole('button', { name: 'Save the reply' }).click();
    await remarks.getByText('Yes, the skid base (0.6 t) is included.').waitFor();
    await remarks.getByText(/, edited .* UTC$/).waitFor();
    await saveScreenshot(i, 'review-module-reply-edited-1280');
    await remarks.getByRole('button', { name: 'Withdraw', exact: true }).click();
    await remarks.getByRole('button', { name: 'Withdraw the reply' }).click();
    await remarks.getByTestId('remark-state').getByText('Open', { exact: true }).waitFor();
    expect(await remarks.getByRole('list', { name: 'Replies' }).count()).toBe(0);
    await remarks.getByLabel('Reply').fill('Yes, the skid base is included.');
    await remarks.getByRole('button', { name: 'Send reply' }).click();
    await remarks.getByTestId('remark-state').getByText('Answered', { exact: true }).waitFor();
    await i.goto(sheetUrl);
    const rev2 = await issue(2);

    // The checker closes the carried remark and signs off for construction, the failure named.
    await t.goto(rev2);
    await t
      .getByRole('complementary', { name: 'Remarks' })
      .getByRole('button', { name: 'Close remark' })
      .click();
    await t.getByRole('button', { name: 'Sign off…' }).click();
    expect(await t.getByTestId('actions-failed-criteria').innerText()).toContain(
      'This revision records 1 failed criterion: clear of the pump speed.',
    );
    const signing = t.getByRole('form', { name: 'Sign off Rev 2' });
    await signing.getByLabel(/Checked for/).fill('For construction');
    await signing
      .getByLabel('Note (optional)')
      .fill('Frequency below the pump check: recorded as found.');
    await saveScreenshot(t, 'review-module-sign-off-1280');
    await signing.getByRole('button', { name: 'Sign off Rev 2' }).click();
    await expect.poll(() => status(t).innerText()).toBe('Checked');
    expect(await t.getByTestId('revision-purpose').innerText()).toBe(
      'For construction (set at sign-off; issued “For check”)',
    );

    // Each digest names what it covers.
    await t.getByText('Digests').click();
    const digests = t.getByLabel('Digests', { exact: true });
    expect(await digests.innerText()).toMatch(
      /Text digest — SHA-256 of the sheet’s canonical text/,
    );
    expect(await digests.innerText()).toMatch(
      /Results digest — SHA-256 of the results frozen at issue/,
    );
    await t.setViewportSize({ width: 390, height: 844 });
    await expect.poll(() => pageWidth(t)).toBeLessThanOrEqual(390);
    await saveScreenshot(t, 'review-module-signed-off-390');
  });
});
