// Browser: Matrix Market files dragged from the desktop and dropped on the sheet are
// uploaded, each becomes a matrix block that refers to it, and a modes block solves them.
import { readFile } from 'node:fs/promises';
import path from 'node:path';
import { describe, expect, it } from 'vitest';
import { saveScreenshot } from '../support/browser';
import {
  FIXTURES,
  RUN,
  blockCount,
  newSheet,
  solveUploadedChain,
  useAuthorBrowser,
  waitSaved,
} from './editor-helpers';

describe('sheet editor: files dropped on the sheet (browser)', () => {
  const session = useAuthorBrowser();

  it('uploads a dropped Matrix Market pair and solves it', async () => {
    const { page } = session();
    await newSheet(page, `E2E-D${RUN}`, 'Dropped chain');
    const before = await blockCount(page);
    const files = await Promise.all(
      ['chain3-K.mtx', 'chain3-M.mtx'].map(async (name) => ({
        name,
        text: await readFile(path.join(FIXTURES, name), 'utf8'),
      })),
    );

    // The files arrive as the browser hands them over from the desktop: a DataTransfer holding
    // File objects, carried by dragenter, dragover and drop on the blocks.
    const target = page.getByRole('list', { name: 'Blocks' });
    const transfer = await page.evaluateHandle((list) => {
      const dt = new DataTransfer();
      for (const f of list) dt.items.add(new File([f.text], f.name, { type: 'text/plain' }));
      return dt;
    }, files);
    await target.dispatchEvent('dragenter', { dataTransfer: transfer });
    await target.dispatchEvent('dragover', { dataTransfer: transfer });
    await page.getByText('Drop to upload as a matrix block').waitFor();
    await saveScreenshot(page, 'editor-drop-over');
    await target.dispatchEvent('drop', { dataTransfer: transfer });
    await expect.poll(() => page.getByText('Drop to upload as a matrix block').count()).toBe(0);

    // Both uploads finished in the order they were dropped (one at a time), and solve.
    await solveUploadedChain(page, before, 'dropped');
    await waitSaved(page);
  });

  it('leaves the sheet as it was when the drop holds no files', async () => {
    const { page } = session();
    await newSheet(page, `E2E-E${RUN}`, 'Dropped text');
    const before = await blockCount(page);
    const target = page.getByRole('list', { name: 'Blocks' });
    const transfer = await page.evaluateHandle(() => {
      const dt = new DataTransfer();
      dt.setData('text/plain', '1 2 3');
      return dt;
    });
    await target.dispatchEvent('dragover', { dataTransfer: transfer });
    expect(await page.getByText('Drop to upload as a matrix block').count()).toBe(0);
    await target.dispatchEvent('drop', { dataTransfer: transfer });
    expect(await page.getByRole('status').filter({ hasText: 'Uploading…' }).count()).toBe(0);
    expect(await blockCount(page)).toBe(before);
  });
});
