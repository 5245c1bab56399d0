// Issue 2, browser: each demo person signs in and sees their projects; a wrong password shows
// the server's message by the field; protected pages send strangers to sign in and back.
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import {
  demoPeople,
  demoProjects,
  fillSignIn,
  launchBrowser,
  saveScreenshot,
  signInAs,
  type BrowserSession,
  type DemoPerson,
} from '../support/browser';

// Who sees what, from the demo scenario of the foundation contract: BW-2611 has Ines, Tomasz,
// Priya and Lena as members; BW-2598 only Ines and Priya; the admin sees every project.
const cases: {
  key: string;
  person: DemoPerson;
  sees: string[];
  doesNotSee: string[];
  role?: string;
}[] = [
  { key: 'ada', person: demoPeople.ada, sees: ['BW-2611', 'BW-2598'], doesNotSee: [] },
  {
    key: 'ines',
    person: demoPeople.ines,
    sees: ['BW-2611', 'BW-2598'],
    doesNotSee: [],
    role: 'Author',
  },
  {
    key: 'tomasz',
    person: demoPeople.tomasz,
    sees: ['BW-2611'],
    doesNotSee: ['BW-2598'],
    role: 'Checker',
  },
  {
    key: 'priya',
    person: demoPeople.priya,
    sees: ['BW-2611', 'BW-2598'],
    doesNotSee: [],
    role: 'Principal',
  },
  {
    key: 'lena',
    person: demoPeople.lena,
    sees: ['BW-2611'],
    doesNotSee: ['BW-2598'],
    role: 'Viewer',
  },
];

describe('sign in (browser)', () => {
  let session: BrowserSession;

  beforeEach(async () => {
    session = await launchBrowser();
  });
  afterEach(async () => {
    await session.close();
  });

  for (const c of cases) {
    it(`signs ${c.person.name} in and lists exactly their projects`, async () => {
      const { page } = session;
      await signInAs(page, c.person);
      expect(new URL(page.url()).pathname).toBe('/');
      const table = page.getByRole('table', { name: 'Projects' });
      await table.waitFor();
      for (const job of c.sees) {
        await expect(table.getByRole('cell', { name: job, exact: true }).count()).resolves.toBe(1);
      }
      for (const job of c.doesNotSee) {
        await expect(table.getByRole('cell', { name: job, exact: true }).count()).resolves.toBe(0);
      }
      if (c.role) {
        // Their role on the footbridge job is shown in the "My roles" column.
        const row = table.getByRole('row').filter({ hasText: demoProjects.footbridge.jobNumber });
        await expect(row.getByText(c.role, { exact: true }).count()).resolves.toBe(1);
      }
      await saveScreenshot(page, `projects-${c.key}`);
    });
  }

  it('shows the server message by the password when the password is wrong', async () => {
    const { page } = session;
    await page.goto('/sign-in');
    await saveScreenshot(page, 'sign-in');
    await fillSignIn(page, demoPeople.tomasz.email, 'not-the-password');
    const alert = page.getByRole('alert');
    await alert.waitFor();
    // The message of the contract: wrong password and unknown e-mail answer alike.
    expect(await alert.textContent()).toContain('The e-mail or password is not right.');
    const password = page.getByLabel('Password');
    expect(await password.getAttribute('aria-invalid')).toBe('true');
    const describedBy = (await password.getAttribute('aria-describedby')) ?? '';
    expect(describedBy.split(' ')).toContain(await alert.getAttribute('id'));
    expect(new URL(page.url()).pathname).toBe('/sign-in');
    await saveScreenshot(page, 'sign-in-wrong-password');

    // An unknown e-mail reads the same, so the page does not reveal who has an account.
    await fillSignIn(page, 'nobody@brackwater.example', 'not-the-password');
    await page
      .getByRole('alert')
      .filter({ hasText: 'The e-mail or password is not right.' })
      .waitFor();
  });

  it('sends a signed-out visitor to sign in and back to the page they asked for', async () => {
    const { page } = session;
    await page.goto('/admin');
    await page.waitForURL((url) => url.pathname === '/sign-in');
    expect(new URL(page.url()).searchParams.get('redirectTo')).toBe('/admin');
    await fillSignIn(page, demoPeople.ada.email, 'modewright-demo');
    await page.waitForURL((url) => url.pathname === '/admin');
    await page.getByRole('table', { name: 'People' }).waitFor();
  });

  it('signs out, and the projects list then asks for sign-in again', async () => {
    const { page } = session;
    await signInAs(page, demoPeople.ines);
    await page.getByRole('button', { name: 'Sign out' }).click();
    await page.waitForURL((url) => url.pathname === '/sign-in');
    await page.goto('/');
    await page.waitForURL((url) => url.pathname === '/sign-in');
    await page.getByRole('heading', { name: 'Sign in' }).waitFor();
  });
});
