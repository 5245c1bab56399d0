// Compiles the server side to JavaScript once, so that `npm start`, its evaluation workers and
// helper threads, and `npm run solve` run compiled code instead of transpiling at every start.
// Rebuilds only when a source is newer than the last build (or with --force). Plain JavaScript
// on purpose: it runs before anything can be transpiled.
//
//   node scripts/build-server.mjs [--force] [--quiet]
//
// Output (one folder, so every bundle finds the worker files beside it):
//   dist/server/server.js               api/server.ts (the app, listening)
//   dist/server/job-worker.js           api/workers/job-worker.ts (a worker process: npm run worker)
//   dist/server/evaluate.worker.js      api/workers/evaluate.worker.ts (its evaluation thread)
//   dist/server/dense-helper.worker.js  api/workers/dense-helper.worker.ts (dense solver threads)
//   dist/server/read-matrix.worker.js   api/workers/read-matrix.worker.ts (the solve command's reader)
//   dist/server/solve.js                scripts/solve.ts (the engine from the command line)
// Packages stay external (imported from node_modules at run time). scripts/solve.sh (npm run
// solve) applies the same staleness rule with find; change both together.
import { readdirSync, statSync, writeFileSync, existsSync, mkdirSync } from 'node:fs';
import path from 'node:path';
import { build } from 'esbuild';

const root = path.resolve(import.meta.dirname, '..');
const outdir = path.join(root, 'dist', 'server');
const stamp = path.join(outdir, '.built');
const force = process.argv.includes('--force');
const quiet = process.argv.includes('--quiet');

const entryPoints = {
  server: 'api/server.ts',
  'evaluate.worker': 'api/workers/evaluate.worker.ts',
  'job-worker': 'api/workers/job-worker.ts',
  'dense-helper.worker': 'api/workers/dense-helper.worker.ts',
  'read-matrix.worker': 'api/workers/read-matrix.worker.ts',
  solve: 'scripts/solve.ts',
};
const sourceDirs = ['api', 'core'];
const sourceFiles = ['scripts/solve.ts', 'scripts/build-server.mjs', 'package-lock.json'];

/** The newest modification time of the sources, ms. */
function newestSource() {
  let newest = 0;
  const visit = (p) => {
    const st = statSync(p);
    if (st.isDirectory()) {
      for (const name of readdirSync(p)) visit(path.join(p, name));
    } else if (/\.(ts|mjs|json)$/.test(p)) {
      newest = Math.max(newest, st.mtimeMs);
    }
  };
  for (const d of sourceDirs) visit(path.join(root, d));
  for (const f of sourceFiles) visit(path.join(root, f));
  return newest;
}

const stale =
  force ||
  !existsSync(stamp) ||
  Object.keys(entryPoints).some((n) => !existsSync(path.join(outdir, `${n}.js`))) ||
  statSync(stamp).mtimeMs < newestSource();

if (!stale) {
  if (!quiet) console.log('server build is up to date (dist/server)');
} else {
  const started = Date.now();
  mkdirSync(outdir, { recursive: true });
  await build({
    absWorkingDir: root,
    entryPoints,
    outdir,
    bundle: true,
    packages: 'external',
    platform: 'node',
    format: 'esm',
    target: 'node20',
    sourcemap: true,
    logLevel: 'warning',
  });
  writeFileSync(stamp, `${new Date().toISOString()}\n`);
  if (!quiet) console.log(`server built into dist/server in ${Date.now() - started} ms`);
}
