// Browser: a viewer (the client's representative) opens a sheet: the unissued draft is withheld,
// nothing runs or edits, and the issued revisions open with their results; the sheet's history
// shows what was issued, not the firm's working record.
import { describe, expect, it } from 'vitest';
import { demoPeople, launchBrowser, saveScreenshot, signInAs } from '../support/browser';
import { projectHref, useAuthorBrowser } from './editor-helpers';

describe('sheet editor: a viewer (browser)', () => {
  const session = useAuthorBrowser();

  it('shows a viewer the issued revisions of a sheet, not its draft, and nothing to edit or run', async () => {
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
      await lena.page.getByTestId('draft-withheld').waitFor();
      expect(await lena.page.getByRole('button', { name: /^Run/ }).count()).toBe(0);
      expect(await lena.page.locator('.cm-content').count()).toBe(0);
      // The sheet's history: issued and sealed, not the remarks or the refused seal.
      const history = lena.page.getByRole('list', { name: 'History of the sheet' });
      await history
        .getByText(/sealed the revision/)
        .first()
        .waitFor();
      expect(
        await history.getByText(/added a remark|was refused a seal|saved the draft/).count(),
      ).toBe(0);
      await saveScreenshot(lena.page, 'editor-viewer-sheet');
      // The sealed revision opens with its results.
      await lena.page
        .getByRole('region', { name: 'Review' })
        .getByRole('link', { name: /^Rev 2/ })
        .click();
      await lena.page.getByRole('heading', { name: /Rev 2$/ }).waitFor();
      await lena.page.getByRole('list', { name: 'Criteria' }).first().waitFor();
      expect(await lena.page.getByRole('link', { name: 'Compare with the draft' }).count()).toBe(0);
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
