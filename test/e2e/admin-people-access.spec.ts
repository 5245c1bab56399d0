// Browser: an admin edits a person, mails them a one-time reset link (read here from the outbox,
// as the person would from their inbox), the person sets a new password through the link, and
// the admin deactivates them: their open page loses its session at once and sign-in is refused
// with a clear message; reactivating lets them back in.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import {
  DEMO_PASSWORD,
  demoPeople,
  fillSignIn,
  launchBrowser,
  saveScreenshot,
  signInAs,
  type BrowserSession,
} from '../support/browser';

const stamp = Date.now().toString(36);

describe('admin people: edit, reset link, deactivate (browser)', () => {
  let admin: BrowserSession;
  let person: BrowserSession;

  beforeAll(async () => {
    [admin, person] = await Promise.all([launchBrowser(), launchBrowser()]);
    await signInAs(admin.page, demoPeople.ada);
  });
  afterAll(async () => {
    await Promise.all([admin?.close(), person?.close()]);
  });

  it('edits, resets the password by link, deactivates and reactivates a person', async () => {
    const { page } = admin;
    const email = `people.${stamp}@brackwater.example`;
    const name = `Person ${stamp}`;
    await page.goto('/admin');
    const add = page.getByRole('form', { name: 'Add a person' });
    await add.getByLabel('Name').fill(name);
    await add.getByLabel('E-mail').fill(email);
    await add.getByLabel('Initial password').fill(DEMO_PASSWORD);
    await add.getByRole('button', { name: 'Add person' }).click();
    await page.getByText(`${name} can now sign in as ${email}.`).waitFor();

    // Edit: a new name and a licence number.
    const renamed = `Renamed ${stamp}`;
    await page.getByRole('button', { name: `Manage ${name}` }).click();
    const details = page.getByRole('form', { name: `Details of ${name}` });
    await details.getByLabel('Name').fill(renamed);
    await details.getByLabel('Licence no.').fill('PE-5150');
    await details.getByRole('button', { name: 'Save details' }).click();
    await page.getByText(`Saved the details of ${renamed}.`).waitFor();
    const people = page.getByRole('table', { name: 'People' });
    await page.getByLabel('Filter people').fill(email);
    await people.getByRole('cell', { name: renamed, exact: true }).waitFor();
    await people.getByRole('cell', { name: 'PE-5150', exact: true }).waitFor();

    // Reset link through the outbox.
    await page.getByRole('button', { name: 'Send reset link' }).click();
    await page.getByText(`Reset link sent to ${email}`).waitFor();
    const mail = (await (await page.request.get('/api/outbox?limit=20')).json()) as {
      messages: { to: string[]; text: string; subject: string }[];
    };
    const message = mail.messages.find((m) => m.to.includes(email));
    expect(message?.subject).toBe('Set a new Modewright password');
    const link = /(https?:\/\/\S+\/reset-password#[A-Za-z0-9_-]{43})/.exec(message!.text)![1]!;

    const p = person.page;
    await p.goto(link);
    await p.getByRole('heading', { name: 'Set a new password' }).waitFor();
    const newPassword = `fresh-password-${stamp}`;
    await p.getByLabel('New password', { exact: true }).fill(newPassword);
    await p.getByLabel('New password again').fill('something-else-entirely');
    await p.getByRole('button', { name: 'Set password' }).click();
    await p.getByText('The two passwords differ; type the same password twice.').waitFor();
    await p.getByLabel('New password again').fill(newPassword);
    await p.getByRole('button', { name: 'Set password' }).click();
    await p.getByText(`The password of ${email} is set`).waitFor();
    await saveScreenshot(p, 'reset-password-done');
    // The link works once (opened afresh, as from the mail again).
    await p.goto('about:blank');
    await p.goto(link);
    await p.getByLabel('New password', { exact: true }).fill(newPassword);
    await p.getByLabel('New password again').fill(newPassword);
    await p.getByRole('button', { name: 'Set password' }).click();
    await p.getByText('This reset link is not valid').waitFor();

    await signInAs(p, { email, name: renamed }, newPassword);

    // Deactivate: the person's open session ends at once.
    await page.getByRole('button', { name: `Deactivate ${renamed}` }).click();
    await page.getByText(`${renamed} is deactivated; 1 session(s) ended.`).waitFor();
    await people.getByText('Deactivated', { exact: true }).waitFor();
    await saveScreenshot(page, 'admin-person-deactivated');
    expect((await p.request.get('/api/auth/me')).status()).toBe(401);
    await p.reload();
    await p.getByRole('button', { name: 'Sign in' }).waitFor();
    await fillSignIn(p, email, newPassword);
    await p
      .getByText(
        'This account has been deactivated. Ask an administrator of your firm to reactivate it.',
      )
      .waitFor();

    await page.getByRole('button', { name: `Reactivate ${renamed}` }).click();
    await page.getByText(`${renamed} can sign in again.`).waitFor();
    await signInAs(p, { email, name: renamed }, newPassword);
  });
});
