// Browser: each demo person signs in and sees their projects, and only those.
import { afterAll, beforeAll, beforeEach, describe, expect, it } from 'vitest';
import {
  demoPeople,
  demoProjects,
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

describe('demo people (browser)', () => {
  let session: BrowserSession;

  // One browser for the file (its start-up is the slow part); every test starts signed out.
  beforeAll(async () => {
    session = await launchBrowser();
  });
  beforeEach(async () => {
    await session.signOutLocally();
  });
  afterAll(async () => {
    await session?.close();
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
});
