// Browser: the admin screen lists the people of the installation and adds one, who can
// then sign in and sees the empty state of a person in no project.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import {
  DEMO_PASSWORD,
  demoPeople,
  launchBrowser,
  saveScreenshot,
  signInAs,
  type BrowserSession,
} from '../support/browser';

// An e-mail of its own per run, so runs against the same test database do not collide.
const stamp = Date.now().toString(36).toUpperCase();

describe('admin people (browser)', () => {
  let ada: BrowserSession;

  beforeAll(async () => {
    ada = await launchBrowser();
    await signInAs(ada.page, demoPeople.ada);
  });
  afterAll(async () => {
    await ada?.close();
  });

  it('lists the people and adds one on the admin screen, who can then sign in', async () => {
    const { page } = ada;
    await page.getByRole('link', { name: 'Admin' }).click();
    const people = page.getByRole('table', { name: 'People' });
    await people.waitFor();
    // Every demo person is listed; the filter narrows the list to one.
    const filter = page.getByLabel('Filter people');
    for (const person of Object.values(demoPeople)) {
      await filter.fill(person.email);
      await people.getByRole('cell', { name: person.email, exact: true }).waitFor();
      expect(await people.getByRole('row').count()).toBe(2); // header + the person
    }
    // The principal's licence number and jurisdiction from the demo scenario.
    await filter.fill(demoPeople.priya.email);
    await people.getByRole('cell', { name: 'SE-20417', exact: true }).waitFor();
    await people.getByRole('cell', { name: 'Harbour County Building Authority' }).waitFor();

    const email = `e2e.${stamp.toLowerCase()}@brackwater.example`;
    const form = page.getByRole('form', { name: 'Add a person' });
    await form.getByLabel('Name').fill(`Test Person ${stamp}`);
    await form.getByLabel('E-mail').fill(email);
    await form.getByLabel('Initial password').fill(DEMO_PASSWORD);
    await form.getByRole('button', { name: 'Add person' }).click();
    await filter.fill(email);
    await people.getByRole('cell', { name: email, exact: true }).waitFor();
    await saveScreenshot(page, 'admin');

    // The same browser, signed out: the newcomer signs in with the password the admin set.
    await ada.signOutLocally();
    await signInAs(page, { email, name: `Test Person ${stamp}` });
    // A person in no project sees the empty state, not an empty table.
    await page.getByText('No projects yet').waitFor();
    await saveScreenshot(page, 'projects-empty');
  });
});
