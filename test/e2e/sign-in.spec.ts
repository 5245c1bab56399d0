// Browser: a wrong password shows the server's message by the field; protected pages
// send strangers to sign in and back; sign-out ends the session; the form works by keyboard.
import { afterAll, beforeAll, beforeEach, describe, expect, it } from 'vitest';
import {
  baseUrl,
  DEMO_PASSWORD,
  demoPeople,
  fillSignIn,
  launchBrowser,
  saveScreenshot,
  signInAs,
  type BrowserSession,
} from '../support/browser';

describe('sign in (browser)', () => {
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
    await fillSignIn(page, demoPeople.ada.email, DEMO_PASSWORD);
    await page.waitForURL((url) => url.pathname === '/admin');
    await page.getByRole('table', { name: 'People' }).waitFor();
  });

  it('does not follow a redirect to another site after sign-in', async () => {
    const { page } = session;
    // A crafted link must not carry a person off-site once signed in (web/src/config/paths.ts).
    await page.goto('/sign-in?redirectTo=' + encodeURIComponent('//elsewhere.example/phish'));
    await fillSignIn(page, demoPeople.lena.email, DEMO_PASSWORD);
    await page.getByText(`Signed in as ${demoPeople.lena.name}`).waitFor();
    expect(new URL(page.url()).pathname).toBe('/');
    expect(new URL(page.url()).host).toBe(new URL(baseUrl()).host);
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

  it('signs in with the keyboard alone, showing where the focus is', async () => {
    const { page } = session;
    await page.goto('/sign-in');
    await page.getByLabel('E-mail').waitFor();
    // Tab order: e-mail, password, the Sign in button; Enter submits.
    await page.keyboard.press('Tab');
    expect(await page.evaluate(() => document.activeElement?.getAttribute('name'))).toBe('email');
    // The focus ring is a real outline (index.css, :focus-visible), not the browser's none.
    const outline = await page.evaluate(() => {
      const style = getComputedStyle(document.activeElement as Element);
      return { style: style.outlineStyle, width: parseFloat(style.outlineWidth) };
    });
    expect(outline.style).toBe('solid');
    expect(outline.width).toBeGreaterThanOrEqual(2);
    await page.keyboard.type(demoPeople.priya.email);
    await page.keyboard.press('Tab');
    expect(await page.evaluate(() => document.activeElement?.getAttribute('name'))).toBe(
      'password',
    );
    await page.keyboard.type(DEMO_PASSWORD);
    await page.keyboard.press('Enter');
    await page.getByText(`Signed in as ${demoPeople.priya.name}`).waitFor();
  });
});
