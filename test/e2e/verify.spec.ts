// Browser: the public verify page without signing in — the code box, an empty box
// refused at its field, and a code no seal has reported as unknown (not as "does not match").
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { launchBrowser, saveScreenshot, type BrowserSession } from '../support/browser';

describe('verify page, signed out (browser)', () => {
  let visitor: BrowserSession;
  beforeAll(async () => {
    visitor = await launchBrowser();
  });
  afterAll(async () => {
    await visitor?.close();
  });

  it('asks for a code when the box is empty, without going to the server', async () => {
    const { page } = visitor;
    // Reached from the sign-in page, as a building official holding a printed sheet would.
    await page.goto('/sign-in');
    await page.getByRole('link', { name: 'Verify its seal' }).click();
    await page.getByRole('heading', { name: 'Verify a sealed calculation' }).waitFor();
    // No sign-in: the page is not sent to /sign-in.
    expect(new URL(page.url()).pathname).toBe('/verify');
    await page.getByRole('button', { name: 'Verify' }).click();
    await page.getByText('Type the seal code printed in the seal block').waitFor();
    expect(await page.getByLabel('Seal code').getAttribute('aria-invalid')).toBe('true');
  });

  it('reports a code no seal has as unknown', async () => {
    const { page } = visitor;
    await page.getByLabel('Seal code').fill('ZZZZZ-ZZZZZ');
    await page.getByRole('button', { name: 'Verify' }).click();
    await expect.poll(() => page.getByTestId('verdict').innerText()).toBe('Unknown code');
    expect(page.url()).toContain('/verify/ZZZZZ-ZZZZZ');
    await page.getByText('No seal has the code ZZZZZ-ZZZZZ.').waitFor();
    // Nothing of a sheet is shown for an unknown code.
    expect(await page.getByText('Principal', { exact: true }).count()).toBe(0);
    await saveScreenshot(page, 'verify-unknown');
  });
});
