import { execFile } from 'node:child_process';
import { existsSync, readFileSync } from 'node:fs';
import { mkdtemp, rm } from 'node:fs/promises';
import net from 'node:net';
import os from 'node:os';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';

// scripts/db.sh against its own throw-away data directory and port, so the shared test database
// is never touched. STACK.md ("MariaDB on loopback without systemd") lists what it must survive.
const root = path.resolve(import.meta.dirname, '..', '..');
let dataDir: string;
let port: number;

interface Run {
  code: number;
  stdout: string;
  stderr: string;
}

function dbsh(command: string, env: Record<string, string> = {}): Promise<Run> {
  return new Promise((resolve) => {
    execFile(
      'bash',
      ['scripts/db.sh', command],
      {
        cwd: root,
        env: { ...process.env, MW_DATA_DIR: dataDir, MW_DB_PORT: String(port), ...env },
        timeout: 120_000,
      },
      (error, stdout, stderr) => {
        const code = error ? Number((error as { code?: unknown }).code ?? 1) : 0;
        resolve({ code, stdout, stderr });
      },
    );
  });
}

function freePort(): Promise<number> {
  return new Promise((resolve, reject) => {
    const server = net.createServer();
    server.once('error', reject);
    server.listen(0, '127.0.0.1', () => {
      const { port: p } = server.address() as net.AddressInfo;
      server.close(() => resolve(p));
    });
  });
}

function serverPid(): number {
  return Number(readFileSync(path.join(dataDir, 'mariadb', 'mariadb.pid'), 'utf8').trim());
}

beforeAll(async () => {
  dataDir = await mkdtemp(path.join(os.tmpdir(), 'mw-dbsh-'));
  port = await freePort();
});

afterAll(async () => {
  await dbsh('stop');
  await rm(dataDir, { recursive: true, force: true });
});

describe('scripts/db.sh', () => {
  it('starts once when two starts race on a fresh data directory', async () => {
    const [a, b] = await Promise.all([dbsh('start'), dbsh('start')]);
    expect(a.code, a.stderr).toBe(0);
    expect(b.code, b.stderr).toBe(0);
    const lines = [a.stdout, b.stdout].join('');
    expect(lines).toContain(`127.0.0.1:${port}`);
    // One of the two found the other's server running.
    expect(lines).toMatch(/already running/);
    expect(existsSync(path.join(dataDir, 'mariadb', '.modewright-initialised'))).toBe(true);
    const status = await dbsh('status');
    expect(status.code).toBe(0);
  });

  it('listens on loopback only, with both databases and the app user', async () => {
    const mysql = await import('mysql2/promise');
    const conn = await mysql.createConnection({
      host: '127.0.0.1',
      port,
      user: 'modewright',
      password: 'modewright-local',
    });
    try {
      const [rows] = await conn.query(
        'select @@bind_address as bind, @@time_zone as tz, @@character_set_server as cs',
      );
      expect(rows).toEqual([{ bind: '127.0.0.1', tz: '+00:00', cs: 'utf8mb4' }]);
      const [dbs] = await conn.query('show databases');
      const names = (dbs as { Database: string }[]).map((d) => d.Database);
      expect(names).toEqual(expect.arrayContaining(['modewright', 'modewright_test']));
    } finally {
      await conn.end();
    }
  });

  it('comes back after kill -9 (stale socket and pid file)', async () => {
    process.kill(serverPid(), 'SIGKILL');
    // The status must say "not running" as soon as the server stops answering.
    let status = await dbsh('status');
    for (let i = 0; i < 50 && status.code === 0; i += 1) {
      await new Promise((r) => setTimeout(r, 100));
      status = await dbsh('status');
    }
    expect(status.code).toBe(3);
    const start = await dbsh('start');
    expect(start.code, start.stderr).toBe(0);
    expect((await dbsh('status')).code).toBe(0);
  });

  it('is a no-op when started again while running', async () => {
    const pid = serverPid();
    const again = await dbsh('start');
    expect(again.code).toBe(0);
    expect(again.stdout).toMatch(/already running/);
    expect(serverPid()).toBe(pid);
  });

  it('refuses to start on a second port while its data directory is served on another', async () => {
    const other = await freePort();
    const res = await dbsh('start', { MW_DB_PORT: String(other) });
    expect(res.code).not.toBe(0);
    expect(res.stderr.trim()).toContain(`already running on 127.0.0.1:${port}, not ${other}`);
    expect(res.stderr).toContain(`MW_DB_PORT=${port} npm run db:stop`);
  });

  it('stops, and says so when already stopped', async () => {
    const stop = await dbsh('stop');
    expect(stop.code, stop.stderr).toBe(0);
    expect(stop.stdout).toMatch(/stopped/);
    expect((await dbsh('status')).code).toBe(3);
    const again = await dbsh('stop');
    expect(again.code).toBe(0);
    expect(again.stdout).toMatch(/not running/);
  });

  it('moves an unfinished data directory aside (never deletes it) and starts afresh', async () => {
    await rm(path.join(dataDir, 'mariadb', '.modewright-initialised'));
    const start = await dbsh('start');
    expect(start.code, start.stderr).toBe(0);
    const aside = /moved it to (\S+)/.exec(start.stdout)?.[1];
    expect(aside).toBeTruthy();
    // The old system tables are still there, beside the new directory.
    expect(existsSync(path.join(aside ?? '', 'mysql'))).toBe(true);
    expect(existsSync(path.join(dataDir, 'mariadb', '.modewright-initialised'))).toBe(true);
    expect((await dbsh('status')).code).toBe(0);
    expect((await dbsh('stop')).code).toBe(0);
  });

  it('refuses in one clear line when the port is taken by another program', async () => {
    const blocker = net.createServer();
    const taken = await new Promise<number>((resolve) =>
      blocker.listen(0, '127.0.0.1', () => resolve((blocker.address() as net.AddressInfo).port)),
    );
    try {
      const res = await dbsh('start', { MW_DB_PORT: String(taken) });
      expect(res.code).toBe(1);
      const lines = res.stderr.trim().split('\n');
      expect(lines).toEqual([
        `db.sh: port ${taken} on 127.0.0.1 is already taken by another program; set MW_DB_PORT to a free port`,
      ]);
    } finally {
      await new Promise((r) => blocker.close(r));
    }
  });
});
