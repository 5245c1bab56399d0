// Browser: a viewer opens a sheet and sees its results, with nothing to edit.
import { describe, expect, it } from 'vitest';
import { demoPeople, launchBrowser, saveScreenshot, signInAs } from '../support/browser';
import { projectHref, waitForResults, useAuthorBrowser } from './editor-helpers';

describe('sheet editor: a viewer (browser)', () => {
  const session = useAuthorBrowser();

  it('shows a viewer the results of a sheet but nothing to edit', async () => {
    const { page } = session();
    // The demo footbridge sheet (seeds) as the author sees it, then as Lena, the viewer.
    await page.goto(await projectHref(page));
    const href = await page
      .getByRole('table', { name: 'Sheets of the project' })
      .getByRole('link', { name: 'DYN-01' })
      .getAttribute('href');
    expect(href).toBeTruthy();
    const lena = await launchBrowser();
    try {
      await signInAs(lena.page, demoPeople.lena);
      await lena.page.goto(href!);
      await lena.page.getByText('Read only').waitFor();
      await waitForResults(lena.page);
      await lena.page.getByRole('list', { name: 'Criteria' }).first().waitFor();
      expect(await lena.page.getByRole('button', { name: /^Delete block/ }).count()).toBe(0);
      expect(await lena.page.getByRole('group', { name: 'Add a block' }).count()).toBe(0);
      const editable = await lena.page.locator('.cm-content[contenteditable="true"]').count();
      expect(editable).toBe(0);
      // The caution once on the screen (DESIGN §12), in the page's footer.
      const caution = lena.page.getByText('Results must be verified by a qualified engineer');
      await caution.first().waitFor();
      expect(await caution.count()).toBe(1);
      await saveScreenshot(lena.page, 'editor-viewer');
    } finally {
      await lena.close();
    }
  });
});
