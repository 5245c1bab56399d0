// The server without its database, in the browser: this worktree's MariaDB is stopped while an
// author types; the app shows a calm banner, keeps the text, and saves it by itself once MariaDB
// is back (scripts/db.sh restarts it; afterAll restarts it whatever happened).
import { execFileSync } from 'node:child_process';
import path from 'node:path';
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
  serverDraftSources,
  setSource,
  sheetIdOf,
  source,
  waitSaved,
} from './editor-helpers';

const root = path.resolve(import.meta.dirname, '..', '..');
const BANNER = /The server cannot reach its database; your typing is kept and will be saved/;

function db(action: 'start' | 'stop'): void {
  execFileSync('bash', ['scripts/db.sh', action], {
    cwd: root,
    stdio: ['ignore', 'pipe', 'pipe'],
    timeout: 120_000,
  });
}

describe('the database going away while an author types (browser)', () => {
  let session: BrowserSession | undefined;

  beforeAll(async () => {
    session = await launchBrowser();
    await signInAs(session.page, demoPeople.ines);
  });
  afterEach(async ({ task }) => {
    if (session && task.result?.state === 'fail') {
      await saveScreenshot(session.page, `failed-${task.name.slice(0, 40)}`);
    }
  });
  afterAll(async () => {
    db('start');
    await session?.close();
  });

  it('shows the banner, keeps the typing, and saves it when the database is back', async () => {
    const p = session!.page;
    const url = await newSheet(p, `E2E-DB${RUN}`, 'Database away');
    const sheetId = sheetIdOf(url);
    const at = await addBlock(p, 'calc', 'k_1 = 24 kN/mm  # before');
    await waitSaved(p);

    db('stop');
    try {
      await setSource(p, at, 'calc', 'k_1 = 30 kN/mm  # typed while the database was away');
      const banner = p.getByRole('status').filter({ hasText: BANNER });
      await banner.waitFor({ timeout: 20_000 });
      expect(await source(p, at, 'calc').innerText()).toContain('# typed while the database');
      await saveScreenshot(p, 'database-unavailable-banner');
      await p.setViewportSize({ width: 390, height: 844 });
      await saveScreenshot(p, 'database-unavailable-banner-390');
      await p.setViewportSize({ width: 1280, height: 900 });
    } finally {
      db('start');
    }
    // Back: the retry saves without another keystroke, and the banner goes.
    await waitSaved(p, 40_000);
    await p.getByText(BANNER).waitFor({ state: 'detached', timeout: 20_000 });
    expect(await serverDraftSources(p, sheetId)).toContain(
      'k_1 = 30 kN/mm  # typed while the database was away',
    );
  });
});
