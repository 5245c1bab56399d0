// Browser: the viewer (Lena, the client's representative) sees the project but none of
// the admin controls, and is refused a project she is not a member of.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import {
  demoPeople,
  demoProjects,
  launchBrowser,
  saveScreenshot,
  signInAs,
  type BrowserSession,
} from '../support/browser';

async function projectHref(session: BrowserSession, jobNumber: string): Promise<string> {
  const row = session.page
    .getByRole('table', { name: 'Projects' })
    .getByRole('row')
    .filter({ hasText: jobNumber });
  const href = await row.getByRole('link').getAttribute('href');
  if (!href) throw new Error(`No link to project ${jobNumber} in the projects table.`);
  return href;
}

describe('viewer (browser)', () => {
  let lena: BrowserSession;
  let officesHref: string;

  beforeAll(async () => {
    // The admin looks up the address of a project Lena is not a member of.
    const ada = await launchBrowser();
    try {
      await signInAs(ada.page, demoPeople.ada);
      officesHref = await projectHref(ada, demoProjects.offices.jobNumber);
    } finally {
      await ada.close();
    }
    lena = await launchBrowser();
    await signInAs(lena.page, demoPeople.lena);
  });
  afterAll(async () => {
    await lena?.close();
  });

  it('shows no admin controls on the projects list', async () => {
    const { page } = lena;
    await page.getByRole('table', { name: 'Projects' }).waitFor();
    expect(await page.getByRole('button', { name: 'New project' }).count()).toBe(0);
    expect(await page.getByRole('link', { name: 'Admin' }).count()).toBe(0);
  });

  it('shows the members of the project but no way to change them', async () => {
    const { page } = lena;
    await page.goto(await projectHref(lena, demoProjects.footbridge.jobNumber));
    await page.getByRole('heading', { name: demoProjects.footbridge.name }).waitFor();
    const members = page.getByRole('table', { name: 'Members' });
    await members.waitFor();
    for (const person of [demoPeople.ines, demoPeople.tomasz, demoPeople.priya, demoPeople.lena]) {
      expect(await members.getByRole('cell', { name: person.name, exact: true }).count()).toBe(1);
    }
    expect(await page.getByRole('button', { name: /Change roles/ }).count()).toBe(0);
    expect(await page.getByRole('button', { name: /^Remove/ }).count()).toBe(0);
    expect(await page.getByRole('form', { name: 'Add a member' }).count()).toBe(0);
    expect(await page.getByRole('button', { name: 'Edit details' }).count()).toBe(0);
    await page
      .getByRole('list', { name: 'Activity' })
      .or(page.getByText('Nothing has happened'))
      .first()
      .waitFor();
    await saveScreenshot(page, 'project-viewer');
  });

  it('refuses the admin page', async () => {
    const { page } = lena;
    await page.goto('/admin');
    await page.getByText('Admins only.').waitFor();
    expect(await page.getByRole('table', { name: 'People' }).count()).toBe(0);
    await saveScreenshot(page, 'admin-refused-viewer');
  });

  it('refuses a project she is not a member of with the server message', async () => {
    const { page } = lena;
    await page.goto(officesHref);
    const alert = page.getByRole('alert').filter({ hasText: 'Could not load this project.' });
    await alert.waitFor();
    expect(await page.getByRole('heading', { name: demoProjects.offices.name }).count()).toBe(0);
  });
});
