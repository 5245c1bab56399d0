import { randomBytes } from 'node:crypto';
import os from 'node:os';
import { mkdirSync, readFileSync, writeFileSync } from 'node:fs';
import path from 'node:path';

/** Everything the server reads from the environment, with the defaults of DEVELOPERS.md. */
export interface AppConfig {
  host: string;
  port: number;
  db: { host: string; port: number; name: string; user: string; password: string };
  sessionSecret: string;
  /** Mount Vite in middleware mode (hot reload) instead of serving dist/client. */
  dev: boolean;
  secureCookies: boolean;
  /** Reverse proxies in front of the server whose X-Forwarded-For is believed (0: none). */
  trustProxyHops: number;
  /** Sign-in attempts allowed per client IP and e-mail within signinWindowMs. */
  signinLimit: number;
  /** Failed sign-ins allowed per client IP, whatever the e-mail, within signinWindowMs. */
  signinAddressLimit: number;
  signinWindowMs: number;
  /** Wrong current passwords (password change, seal) allowed per person within signinWindowMs. */
  passwordCheckLimit: number;
  dataDir: string;
  /** Folder of the built client; served with an SPA fallback when present. */
  clientDir: string;
  /** Log one line per request to stdout. */
  logRequests: boolean;
  /** Largest JSON body accepted, in bytes. */
  bodyLimitBytes: number;
  /**
   * Largest matrix file accepted by an upload, in bytes (MW_UPLOAD_LIMIT_BYTES, default 64 MiB:
   * the K or the M of a 50 000-DOF 3D frame is about 34 MB of Matrix Market text).
   */
  uploadLimitBytes: number;
  /** The evaluation queue (Redis) the API adds jobs to and the workers take them from. */
  queue: QueueConfig;
  /**
   * Worker processes `npm start` runs and restarts beside the API (MW_WORKERS; default one per
   * core; 0 for an API machine whose workers run elsewhere).
   */
  workers: number;
}

/** The evaluation queue: shared by the API processes and the worker processes. */
export interface QueueConfig {
  /** MW_REDIS_URL, else the project's own Redis on 127.0.0.1:MW_REDIS_PORT (6407). */
  redisUrl: string;
  /**
   * Key prefix (MW_QUEUE_PREFIX, default `mw:<database>`): one queue per database, so the test
   * and the demo queue never mix.
   */
  prefix: string;
  /**
   * Time limit of one evaluation bound to a request (POST /evaluate, its stream, issue and seal)
   * and of an upload's parse, ms (MW_EVAL_TIME_LIMIT_MS, default 30 000).
   */
  timeLimitMs: number;
  /**
   * Time limit of an evaluation in the background (the editor's long solves, not bound to a
   * request), ms (MW_SOLVE_TIME_LIMIT_MS, default 30 minutes).
   */
  solveTimeLimitMs: number;
  /** Heap limit of each worker's evaluation thread, MB (MW_EVAL_MEMORY_MB, default 512). */
  memoryLimitMb: number;
  /** Resident memory of a worker process beyond which its job is stopped, MB (MW_WORKER_RSS_MB). */
  rssLimitMb: number;
  /** Jobs (waiting and running) the whole queue accepts before answering 429 (MW_EVAL_MAX_QUEUE). */
  maxQueue: number;
  /** How often workers look for jobs whose worker died, ms (MW_QUEUE_STALLED_MS, default 30 000). */
  stalledIntervalMs: number;
  /** Evaluations one person may have waiting or running (MW_QUEUE_PER_PERSON, default 3). */
  perPerson: number;
  /** Evaluations one project may have waiting or running (MW_QUEUE_PER_PROJECT, default 8). */
  perProject: number;
  /**
   * Uploads (bytes, all of a sheet's) from which an evaluation is a large solve and waits behind
   * the small ones (MW_QUEUE_LARGE_BYTES, default 1 MiB).
   */
  largeBytes: number;
}

/** The queue's settings from the environment (the worker processes read only these). */
export function loadQueueConfig(dbName = process.env.MW_DB_NAME ?? 'modewright'): QueueConfig {
  const memoryLimitMb = intFromEnv('MW_EVAL_MEMORY_MB', 512);
  return {
    redisUrl: process.env.MW_REDIS_URL || `redis://127.0.0.1:${intFromEnv('MW_REDIS_PORT', 6407)}`,
    prefix: process.env.MW_QUEUE_PREFIX || `mw:${dbName}`,
    timeLimitMs: intFromEnv('MW_EVAL_TIME_LIMIT_MS', 30_000),
    solveTimeLimitMs: intFromEnv('MW_SOLVE_TIME_LIMIT_MS', 30 * 60_000),
    memoryLimitMb,
    rssLimitMb: intFromEnv('MW_WORKER_RSS_MB', 2 * memoryLimitMb + 512),
    maxQueue: intFromEnv('MW_EVAL_MAX_QUEUE', 64),
    stalledIntervalMs: intFromEnv('MW_QUEUE_STALLED_MS', 30_000),
    perPerson: intFromEnv('MW_QUEUE_PER_PERSON', 3),
    perProject: intFromEnv('MW_QUEUE_PER_PROJECT', 8),
    largeBytes: intFromEnv('MW_QUEUE_LARGE_BYTES', 1024 * 1024),
  };
}

/** The database settings from the environment (the API's, and the worker processes'). */
export function loadDbConfig(): AppConfig['db'] {
  return {
    host: process.env.MW_DB_HOST ?? '127.0.0.1',
    port: intFromEnv('MW_DB_PORT', 3407),
    name: process.env.MW_DB_NAME ?? 'modewright',
    user: process.env.MW_DB_USER ?? 'modewright',
    password: process.env.MW_DB_PASSWORD ?? 'modewright-local',
  };
}

export const projectRoot = path.resolve(import.meta.dirname, '..', '..');

function intFromEnv(name: string, fallback: number): number {
  const raw = process.env[name];
  if (raw === undefined || raw === '') return fallback;
  const value = Number(raw);
  if (!Number.isInteger(value) || value <= 0) {
    throw new Error(`Environment variable ${name} must be a positive whole number, got "${raw}".`);
  }
  return value;
}

function resolveDataDir(): string {
  const dir = process.env.MW_DATA_DIR ?? '.data';
  return path.isAbsolute(dir) ? dir : path.join(projectRoot, dir);
}

/**
 * The session secret: MW_SESSION_SECRET, or a random one generated once and kept in
 * <dataDir>/session-secret so that sessions survive restarts.
 */
function loadSessionSecret(dataDir: string): string {
  const fromEnv = process.env.MW_SESSION_SECRET;
  if (fromEnv) return fromEnv;
  const file = path.join(dataDir, 'session-secret');
  try {
    const stored = readFileSync(file, 'utf8').trim();
    if (stored.length >= 32) return stored;
  } catch {
    // not there yet: made below
  }
  mkdirSync(dataDir, { recursive: true });
  const secret = randomBytes(32).toString('hex');
  try {
    writeFileSync(file, secret + '\n', { mode: 0o600, flag: 'wx' });
    return secret;
  } catch {
    // another process wrote it first: use theirs
    return readFileSync(file, 'utf8').trim();
  }
}

export function loadConfig(overrides: Partial<AppConfig> = {}): AppConfig {
  const dataDir = overrides.dataDir ?? resolveDataDir();
  const base: AppConfig = {
    host: process.env.MW_HOST ?? '127.0.0.1',
    port: intFromEnv('MW_PORT', 5180),
    db: loadDbConfig(),
    sessionSecret: overrides.sessionSecret ?? loadSessionSecret(dataDir),
    dev: process.env.MW_DEV === '1',
    secureCookies: process.env.MW_SECURE_COOKIES === '1',
    trustProxyHops:
      process.env.MW_TRUST_PROXY && process.env.MW_TRUST_PROXY !== '0'
        ? intFromEnv('MW_TRUST_PROXY', 1)
        : 0,
    signinLimit: intFromEnv('MW_SIGNIN_LIMIT', 10),
    signinAddressLimit: intFromEnv('MW_SIGNIN_ADDRESS_LIMIT', 20),
    signinWindowMs: 15 * 60 * 1000,
    passwordCheckLimit: intFromEnv('MW_PASSWORD_CHECK_LIMIT', 5),
    dataDir,
    clientDir: path.join(projectRoot, 'dist', 'client'),
    logRequests: process.env.MW_LOG_REQUESTS !== '0',
    bodyLimitBytes: 1024 * 1024,
    uploadLimitBytes: intFromEnv('MW_UPLOAD_LIMIT_BYTES', 64 * 1024 * 1024),
    workers:
      process.env.MW_WORKERS === '0' ? 0 : intFromEnv('MW_WORKERS', os.availableParallelism()),
    queue: loadQueueConfig(overrides.db?.name ?? process.env.MW_DB_NAME ?? 'modewright'),
  };
  return { ...base, ...overrides, db: { ...base.db, ...overrides.db } };
}
