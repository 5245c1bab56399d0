// Browser: after a seal the author keeps working on the draft: the sealed revision stays
// as it is and the editor says the changes go into the next revision.
import { describe, expect, it } from 'vitest';
import { saveScreenshot } from '../support/browser';
import { projectHref, useAuthorBrowser } from './editor-helpers';

describe('sheet editor: the draft after a seal (browser)', () => {
  const session = useAuthorBrowser();

  it('lets the author edit the draft of a sealed sheet towards the next revision', async () => {
    const { page } = session();
    await page.goto(await projectHref(page));
    // The demo's footbridge sheet: Rev 2 sealed (seeds/03_demo_review.ts).
    await page.getByRole('link', { name: 'DYN-01' }).first().click();
    await page.getByRole('heading', { name: /DYN-01/ }).waitFor();
    await page
      .getByTestId('next-revision-note')
      .getByText(
        'Rev 2 is sealed and stays as it is; changes here go into Rev 3 when it is issued.',
      )
      .waitFor();
    expect(await page.getByText('Read only', { exact: true }).count()).toBe(0);
    await page.getByRole('group', { name: 'Add a block' }).waitFor();
    const editor = page.getByRole('textbox', { name: 'Source of block 2, calculation' });
    expect(await editor.getAttribute('contenteditable')).toBe('true');
    await page.getByRole('button', { name: 'Issue for check' }).waitFor();
    await saveScreenshot(page, 'editor-after-seal');
  });
});
