// Browser: with no mail server configured, everyone reads the mail sent to them on the Mail
// page (the demo checker has the issue of each revision for check), and the admin's Outbox shows
// every message of the installation.
import { afterAll, beforeAll, beforeEach, describe, expect, it } from 'vitest';
import {
  demoPeople,
  launchBrowser,
  saveScreenshot,
  signInAs,
  type BrowserSession,
  type DemoPerson,
} from '../support/browser';
import type { Page } from 'playwright-core';

/** Signs a person in and opens the mail page from the main navigation. */
async function openMail(page: Page, person: DemoPerson, link: string, heading: string) {
  await signInAs(page, person);
  await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: link }).click();
  await page.getByRole('heading', { name: heading }).waitFor();
}

describe('mail (browser)', () => {
  let session: BrowserSession;

  beforeAll(async () => {
    session = await launchBrowser();
  });
  beforeEach(async () => {
    await session.signOutLocally();
  });
  afterAll(async () => {
    await session?.close();
  });

  it('shows the checker the messages addressed to them, and only those', async () => {
    const { page } = session;
    await openMail(page, demoPeople.tomasz, 'Mail', 'Your mail');
    await page.getByText(`The messages sent to ${demoPeople.tomasz.email}.`).waitFor();
    const list = page.getByRole('list', { name: 'Messages' });
    await list
      .getByRole('button', { name: /issued for check/ })
      .first()
      .waitFor();
    const items = list.getByRole('listitem');
    const count = await items.count();
    expect(count).toBeGreaterThan(0);
    for (let i = 0; i < count; i++) {
      expect(await items.nth(i).innerText()).toContain(demoPeople.tomasz.email);
    }
    // A message opens to its text, which carries the engineering caution (DESIGN §12).
    await list
      .getByRole('button', { name: /issued for check/ })
      .first()
      .click();
    await list
      .getByText(/verified by a qualified engineer/)
      .first()
      .waitFor();
    await saveScreenshot(page, 'mail-checker');
    // …and links to the sheet it is about.
    await list.getByRole('link', { name: 'Open the sheet' }).first().click();
    await page.waitForURL(/\/projects\/\d+\/sheets\/\d+$/);
    await page.getByRole('region', { name: 'Review' }).waitFor();
  });

  it("gives the admin every message under Outbox, the author's among them", async () => {
    const { page } = session;
    await openMail(page, demoPeople.ada, 'Outbox', 'Outbox');
    const list = page.getByRole('list', { name: 'Messages' });
    await list.getByText(demoPeople.ines.email).first().waitFor();
    await list.getByText(demoPeople.tomasz.email).first().waitFor();
  });
});
