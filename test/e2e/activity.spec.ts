// The project's activity in sentences: the checker reads who did what to which sheet and
// revision, by number and line, not by database id (demo scenario of seeds/03_demo_review.ts).
import { describe, expect, it } from 'vitest';
import { demoPeople, demoProjects, useSignedInBrowser, saveScreenshot } from '../support/browser';

describe('project activity (browser)', () => {
  const tomaszSession = useSignedInBrowser(demoPeople.tomasz);

  it('names sheets, revisions and lines, and shows no ids or raw keys', async () => {
    const { page } = tomaszSession();
    await page.getByRole('link', { name: demoProjects.footbridge.name }).click();
    const list = page.getByRole('list', { name: 'Activity' });
    await list.waitFor();
    await page.getByRole('button', { name: /Show all \d+ entries/ }).click();
    const text = await list.innerText();
    // The open remark of the seeded check of DYN-02 (seeds/03_demo_review.ts).
    expect(text).toMatch(/Tomasz Reyes made an error remark on DYN-02 Rev 1, line \d+/);
    expect(text).toMatch(/Priya Anand sealed DYN-01 Rev 2\s+seal code [0-9A-Z]{5}-[0-9A-Z]{5}/);
    expect(text).toMatch(/Ines Marlow issued DYN-01 Rev 2 for check/);
    expect(text).toMatch(/Tomasz Reyes returned DYN-01 Rev 1 to the author/);
    expect(text).not.toMatch(/sheet id|revision id|reply id|\bsuperseded:/);
    await saveScreenshot(page, 'project-activity');
  });
});
