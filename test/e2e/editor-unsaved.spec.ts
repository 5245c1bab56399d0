// Browser: an edit made while the server cannot be reached is kept, the editor says it is
// not saved and retries, and it reaches the server once the network is back; leaving the page with
// work the server does not have asks first (the browser's leave-page dialog), and does not once it
// is saved.
import type { Dialog, Route } from 'playwright-core';
import { afterAll, afterEach, beforeAll, describe, expect, it } from 'vitest';
import {
  demoPeople,
  launchBrowser,
  saveScreenshot,
  signInAs,
  type BrowserSession,
} from '../support/browser';
import {
  RUN,
  addBlock,
  newSheet,
  saveStateText,
  serverDraftSources,
  setSource,
  sheetIdOf,
  source,
  waitSaved,
} from './editor-helpers';

const DRAFT_SAVES = '**/api/sheets/*/draft';
const NOT_SAVED = 'Not saved — cannot reach the server; retrying';

describe('sheet editor: unsaved work (browser)', () => {
  let session: BrowserSession | undefined;
  // Every dialog the page opened, in order; each is accepted so the page can go on.
  const dialogs: string[] = [];
  const record = (dialog: Dialog) => {
    dialogs.push(dialog.type());
    void dialog.accept();
  };

  beforeAll(async () => {
    session = await launchBrowser();
    session.page.on('dialog', record);
    await signInAs(session.page, demoPeople.ines);
  });
  afterEach(async ({ task }) => {
    if (session && task.result?.state === 'fail') {
      await saveScreenshot(session.page, `failed-${task.name.slice(0, 40)}`);
    }
    await session?.page.unrouteAll({ behavior: 'ignoreErrors' });
    await session?.context.setOffline(false);
  });
  afterAll(async () => {
    await session?.close();
  });
  const page = () => {
    if (!session) throw new Error('The browser is not started yet.');
    return session.page;
  };

  it('keeps an edit made while the server is unreachable, retries, and saves it when it is back', async () => {
    const p = page();
    const url = await newSheet(p, `E2E-O${RUN}`, 'Offline edit');
    const sheetId = sheetIdOf(url);
    const at = await addBlock(p, 'calc', 'k_1 = 24 kN/mm  # before');
    await waitSaved(p);

    // The server stops answering draft saves, as when the connection drops.
    let refused = 0;
    await p.route(DRAFT_SAVES, async (route: Route) => {
      refused += 1;
      await route.abort('internetdisconnected');
    });
    await setSource(p, at, 'calc', 'k_1 = 36 kN/mm  # written offline');
    await p.getByTestId('save-state').getByText(NOT_SAVED).waitFor({ timeout: 20_000 });
    // It tries again by itself (every 5 s), without another keystroke.
    await expect.poll(() => refused, { timeout: 30_000, interval: 250 }).toBeGreaterThanOrEqual(2);
    expect(await saveStateText(p)).toBe(NOT_SAVED);
    // The edit is on screen and not yet on the server.
    expect(await source(p, at, 'calc').innerText()).toContain('# written offline');
    expect(await serverDraftSources(p, sheetId)).not.toContain('k_1 = 36 kN/mm  # written offline');
    await saveScreenshot(p, 'editor-offline-retrying');

    // The network comes back: the next retry saves, and the server has the edit.
    await p.unroute(DRAFT_SAVES);
    await waitSaved(p, 30_000);
    expect(await serverDraftSources(p, sheetId)).toContain('k_1 = 36 kN/mm  # written offline');
    await p.reload();
    await source(p, at, 'calc').waitFor();
    expect(await source(p, at, 'calc').innerText()).toContain('# written offline');
  });

  it('saves at once when the browser reports it is online again', async () => {
    const p = page();
    const url = await newSheet(p, `E2E-N${RUN}`, 'Browser offline');
    const sheetId = sheetIdOf(url);
    const at = await addBlock(p, 'text', 'Before the network went.');
    await waitSaved(p);

    await session!.context.setOffline(true);
    await setSource(p, at, 'text', 'Typed with the network off.');
    await p.getByTestId('save-state').getByText(NOT_SAVED).waitFor({ timeout: 20_000 });
    await session!.context.setOffline(false);
    // The browser's "online" event starts a save without waiting for the 5 s retry.
    await waitSaved(p, 4_000);
    expect(await serverDraftSources(p, sheetId)).toContain('Typed with the network off.');
  });

  it('asks before leaving a page with unsaved work, and not once it is saved', async () => {
    const p = page();
    await newSheet(p, `E2E-L${RUN}`, 'Leave page');
    const at = await addBlock(p, 'text', 'Saved text.');
    await waitSaved(p);

    // Saved: leaving does not ask.
    dialogs.length = 0;
    await p.reload();
    await source(p, at, 'text').waitFor();
    expect(dialogs).toEqual([]);

    // Unsaved (the save cannot get through): leaving asks.
    await p.route(DRAFT_SAVES, (route: Route) => route.abort('internetdisconnected'));
    await setSource(p, at, 'text', 'Not on the server yet.');
    await p.getByTestId('save-state').getByText(NOT_SAVED).waitFor({ timeout: 20_000 });
    await p.reload();
    expect(dialogs).toEqual(['beforeunload']);
    await source(p, at, 'text').waitFor();
  });
});
