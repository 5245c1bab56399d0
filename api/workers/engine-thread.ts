/**
 * A worker thread running one of this folder's `*.worker` files: the compiled file beside the
 * bundle that starts it (dist/server/, scripts/build-server.mjs), or from source through tsx.
 * A thread does not take `--import tsx` from execArgv, so from source it starts from a one-line
 * entry that registers tsx's loader first, then imports the TypeScript file.
 */
import { readFileSync } from 'node:fs';
import { createRequire } from 'node:module';
import { dirname, join } from 'node:path';
import { pathToFileURL } from 'node:url';
import { Worker, type WorkerOptions } from 'node:worker_threads';

/** Compiled (every bundle and worker file together in dist/server/) or from source. */
const COMPILED = import.meta.url.endsWith('.js');

/** tsx's ESM API entry, from its package's export map (`import.meta.resolve` trips tsx itself). */
function tsxApi(): string {
  const require = createRequire(import.meta.url);
  const manifest = require.resolve('tsx/package.json');
  const pkg = JSON.parse(readFileSync(manifest, 'utf8')) as {
    exports: Record<string, { import: { default: string } }>;
  };
  return pathToFileURL(join(dirname(manifest), pkg.exports['./esm/api']!.import.default)).href;
}

/**
 * Starts `<name>.worker.js` (compiled) or `<name>.worker.ts` (source) as a thread.
 * @example engineThread('dense-helper', { workerData })
 */
export function engineThread(name: string, options: WorkerOptions): Worker {
  const file = new URL(`./${name}.worker.${COMPILED ? 'js' : 'ts'}`, import.meta.url).href;
  if (COMPILED) return new Worker(new URL(file), options);
  const entry = `import(${JSON.stringify(tsxApi())}).then((tsx) => { tsx.register(); return import(${JSON.stringify(file)}); });`;
  return new Worker(entry, { ...options, eval: true });
}
