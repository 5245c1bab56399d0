import { spawnSync, type SpawnSyncReturns } from 'node:child_process';
import { join } from 'node:path';

/**
 * Runs one benchmark problem in its own process (./case.ts): builds it, writes its Matrix Market
 * files into `outDir` and, with `runs` above 0, times our kernels; its last stdout line is JSON.
 */
export function spawnCase(name: string, runs: number, outDir: string): SpawnSyncReturns<string> {
  return spawnSync(
    process.execPath,
    [
      '--import',
      'tsx',
      '--max-old-space-size=8192',
      join('scripts', 'bench', 'case.ts'),
      name,
      String(runs),
      outDir,
    ],
    { encoding: 'utf8', maxBuffer: 1 << 30 },
  );
}
