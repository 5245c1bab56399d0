import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { solveModes } from '../../../core/eigen/solve-modes';
import type { DenseMatrix } from '../../../core/linalg/types';

// Reference eigenvalues written by `npm run fixtures` (scripts/fixtures/generate.ts), which records
// the tool and version of each: ml-matrix always, scipy.linalg.eigh when it was present.
interface Fixture {
  name: string;
  n: number;
  K: number[];
  M: number[];
  references: { tool: string; version: string; eigenvalues: number[] }[];
}
const { fixtures } = JSON.parse(
  readFileSync(join(__dirname, '..', '..', 'fixtures', 'engine', 'random-pencils.json'), 'utf8'),
) as { fixtures: Fixture[] };

const dense = (n: number, a: number[]): DenseMatrix => ({
  kind: 'dense',
  rows: n,
  cols: n,
  data: Float64Array.from(a),
});

describe('reference fixtures (ml-matrix, scipy)', () => {
  for (const f of fixtures) {
    for (const ref of f.references) {
      it(`${f.name}: dense and inverse match ${ref.tool} ${ref.version} to 1e-10 relative`, () => {
        const K = dense(f.n, f.K);
        const M = dense(f.n, f.M);
        const all = solveModes(K, M, { method: 'dense' });
        expect(all.modes).toHaveLength(f.n);
        all.modes.forEach((m, i) =>
          expect(Math.abs(m.lambda / (ref.eigenvalues[i] as number) - 1)).toBeLessThan(1e-10),
        );
        // inverse iteration on the lowest 3 of a generic random pencil (gaps are what they are:
        // allow the iteration limit to be generous)
        const low = solveModes(K, M, { method: 'inverse', count: 3, maxIterations: 20000 });
        low.modes.forEach((m, i) =>
          expect(Math.abs(m.lambda / (ref.eigenvalues[i] as number) - 1)).toBeLessThan(1e-10),
        );
      });
    }
  }
});
