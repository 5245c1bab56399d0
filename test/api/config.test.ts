import { mkdtemp, readFile, stat } from 'node:fs/promises';
import os from 'node:os';
import path from 'node:path';
import { afterEach, describe, expect, it } from 'vitest';
import { loadConfig } from '../../api/config/index';

const saved = { ...process.env };

afterEach(() => {
  for (const key of Object.keys(process.env)) {
    if (key.startsWith('MW_') && !(key in saved)) delete process.env[key];
  }
  Object.assign(process.env, saved);
});

describe('loadConfig', () => {
  it('uses the defaults of the foundation contract', async () => {
    for (const key of Object.keys(process.env)) if (key.startsWith('MW_')) delete process.env[key];
    const dataDir = await mkdtemp(path.join(os.tmpdir(), 'mw-config-'));
    const config = loadConfig({ dataDir });
    expect(config.host).toBe('127.0.0.1');
    expect(config.port).toBe(5180);
    expect(config.db).toEqual({
      host: '127.0.0.1',
      port: 3407,
      name: 'modewright',
      user: 'modewright',
      password: 'modewright-local',
    });
    expect(config.dev).toBe(false);
    expect(config.secureCookies).toBe(false);
    expect(config.signinLimit).toBe(10);
    expect(config.signinWindowMs).toBe(15 * 60 * 1000);
    expect(config.trustProxyHops).toBe(0);
    expect(config.uploadLimitBytes).toBe(64 * 1024 * 1024);
  });

  it('reads the MW_* variables', async () => {
    Object.assign(process.env, {
      MW_HOST: '0.0.0.0',
      MW_PORT: '6001',
      MW_DB_PORT: '3555',
      MW_DB_NAME: 'modewright_other',
      MW_DEV: '1',
      MW_SECURE_COOKIES: '1',
      MW_SIGNIN_LIMIT: '4',
      MW_TRUST_PROXY: '2',
      MW_SESSION_SECRET: 'from-the-environment',
      MW_UPLOAD_LIMIT_BYTES: '52428800',
    });
    const config = loadConfig();
    expect(config).toMatchObject({
      host: '0.0.0.0',
      port: 6001,
      dev: true,
      secureCookies: true,
      signinLimit: 4,
      trustProxyHops: 2,
      sessionSecret: 'from-the-environment',
      uploadLimitBytes: 52428800,
    });
    expect(config.db).toMatchObject({ port: 3555, name: 'modewright_other' });
  });

  it('names the variable when a number is not a number', () => {
    process.env.MW_PORT = 'eighty';
    expect(() => loadConfig({ sessionSecret: 'x' })).toThrow(
      'Environment variable MW_PORT must be a positive whole number, got "eighty".',
    );
  });

  it('makes a session secret once, keeps it private in the data directory, and reuses it', async () => {
    delete process.env.MW_SESSION_SECRET;
    const dataDir = await mkdtemp(path.join(os.tmpdir(), 'mw-config-'));
    const first = loadConfig({ dataDir }).sessionSecret;
    const second = loadConfig({ dataDir }).sessionSecret;
    // 32 random bytes as hex: 64 characters.
    expect(first).toMatch(/^[0-9a-f]{64}$/);
    expect(second).toBe(first);
    const file = path.join(dataDir, 'session-secret');
    expect((await readFile(file, 'utf8')).trim()).toBe(first);
    expect((await stat(file)).mode & 0o077).toBe(0);
  });
});
