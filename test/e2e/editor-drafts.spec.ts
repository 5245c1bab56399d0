// Browser: drafts that are never lost — the same sheet edited in two tabs and the
// conflict resolved keeping both texts; blocks duplicated, moved by keyboard and by drag, deleted
// and restored with undo.
import { describe, expect, it } from 'vitest';
import { saveScreenshot } from '../support/browser';
import {
  RUN,
  addBlock,
  block,
  newSheet,
  setSource,
  source,
  waitSaved,
  useAuthorBrowser,
} from './editor-helpers';

describe('sheet editor: drafts and blocks (browser)', () => {
  const session = useAuthorBrowser();

  it('resolves an edit of the same sheet in two tabs without losing either text', async () => {
    const { page, context } = session();
    const url = await newSheet(page, `E2E-C${RUN}`, 'Two tabs');
    const at = await addBlock(page, 'text', 'Base text.');
    await waitSaved(page);
    const other = await context.newPage();
    try {
      await other.goto(url);
      await source(other, at, 'text').waitFor();
      await setSource(page, at, 'text', 'Written in the first tab.');
      await waitSaved(page);
      await setSource(other, at, 'text', 'Written in the second tab.');
      const dialog = other.getByRole('dialog', { name: 'This draft was changed elsewhere' });
      await dialog.waitFor({ timeout: 20_000 });
      await dialog
        .getByRole('region', { name: 'Your version' })
        .getByText('Written in the second tab.')
        .waitFor();
      await dialog
        .getByRole('region', { name: 'Their version' })
        .getByText('Written in the first tab.')
        .waitFor();
      await saveScreenshot(other, 'editor-conflict');
      await dialog.getByRole('button', { name: 'Keep both' }).click();
      await waitSaved(other);
      // Reloaded from the server, the sheet holds both texts.
      await other.reload();
      await source(other, at + 1, 'text').waitFor();
      expect(await source(other, at, 'text').innerText()).toContain('Written in the second tab.');
      expect(await source(other, at + 1, 'text').innerText()).toContain(
        'Written in the first tab.',
      );
    } finally {
      await other.close();
    }
  });

  it('duplicates, moves by keyboard and by drag, and deletes with undo', async () => {
    const { page } = session();
    await newSheet(page, `E2E-B${RUN}`, 'Block order');
    const first = await addBlock(page, 'calc', 'a_1 = 1 m  # first');
    await addBlock(page, 'calc', 'b_1 = 2 m  # second');
    const sources = async () =>
      page.getByRole('list', { name: 'Blocks' }).locator('.cm-content').allInnerTexts();

    await page.getByRole('button', { name: `Duplicate block ${first}, calculation` }).click();
    expect((await sources()).slice(first - 1)).toEqual([
      'a_1 = 1 m  # first',
      'a_1 = 1 m  # first',
      'b_1 = 2 m  # second',
    ]);

    // Keyboard: focus the last block's handle and press ↑ twice.
    const last = first + 2;
    await page
      .getByRole('button', { name: `Move block ${last}, calculation (drag, or arrow keys)` })
      .focus();
    await page.keyboard.press('ArrowUp');
    await page.keyboard.press('ArrowUp');
    expect((await sources()).slice(first - 1)).toEqual([
      'b_1 = 2 m  # second',
      'a_1 = 1 m  # first',
      'a_1 = 1 m  # first',
    ]);

    // Drag: the first of them (b_1) onto the last place.
    await page
      .getByRole('button', { name: `Move block ${first}, calculation (drag, or arrow keys)` })
      .dragTo(block(page, last, 'calc'));
    expect((await sources()).slice(first - 1)).toEqual([
      'a_1 = 1 m  # first',
      'a_1 = 1 m  # first',
      'b_1 = 2 m  # second',
    ]);

    await page.getByRole('button', { name: `Delete block ${last}, calculation` }).click();
    expect((await sources()).slice(first - 1)).toEqual([
      'a_1 = 1 m  # first',
      'a_1 = 1 m  # first',
    ]);
    await page.getByRole('button', { name: 'Undo' }).click();
    expect((await sources()).slice(first - 1)).toEqual([
      'a_1 = 1 m  # first',
      'a_1 = 1 m  # first',
      'b_1 = 2 m  # second',
    ]);
    await waitSaved(page);
  });
});
