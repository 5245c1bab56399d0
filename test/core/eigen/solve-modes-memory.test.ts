import { describe, expect, it } from 'vitest';
import { DENSE_METHOD_ARRAYS, solveModes } from '../../../core/eigen/solve-modes';
import { EngineError } from '../../../core/errors';
import { combine, toDense } from '../../../core/linalg/factorize';
import { analyzeSparseLdlt } from '../../../core/linalg/sparse-ldlt';
import type { SparseSymmetricMatrix } from '../../../core/linalg/types';
import { eulerBernoulliBeam } from '../../../core/models/euler-bernoulli-beam';

// solveModes refuses, before allocating, a solve whose arrays would not fit the memory it is
// given (memoryLimitBytes), with the estimate and the limit in the error's details.

/** A clamped–free steel beam (invented properties), 2 DOFs per node. */
function beam(elements: number) {
  const { K, M } = eulerBernoulliBeam({
    E: 210e9,
    I: 8.3e-6,
    massPerLength: 30,
    length: 4,
    elements,
    left: 'clamped',
    right: 'free',
  });
  return { K: K as SparseSymmetricMatrix, M: M as SparseSymmetricMatrix };
}

function refusal(fn: () => unknown): EngineError {
  try {
    fn();
  } catch (e) {
    if (e instanceof EngineError) return e;
    throw e;
  }
  throw new Error('expected a refusal');
}

describe('solveModes memory limit', () => {
  it('refuses the dense method when its n × n arrays exceed the limit', () => {
    const { K, M } = beam(2000); // n = 4000
    const limit = 100 * 2 ** 20;
    const e = refusal(() =>
      solveModes(K, M, { method: 'dense', count: 3, memoryLimitBytes: limit }),
    );
    expect(e.code).toBe('MODEL_TOO_LARGE');
    // The count of arrays the dense method holds, each 4000 × 4000 doubles of 8 bytes.
    expect(e.details).toEqual({
      n: 4000,
      method: 'dense',
      estimateBytes: DENSE_METHOD_ARRAYS * 8 * 4000 * 4000,
      limitBytes: limit,
    });
    // 5 · 8 · 4000² bytes = 640 000 000 B = 610 MB (MiB)
    expect(e.message).toContain('4000-DOF model needs about 610 MB');
    expect(e.message).toContain('more than the 100 MB this evaluation may use');
  });

  it('refuses Lanczos when the sparse factor and the basis exceed the limit, and solves under a larger one', () => {
    const { K, M } = beam(2000);
    const limit = 2 ** 20; // 1 MB
    const e = refusal(() =>
      solveModes(K, M, { method: 'lanczos', count: 10, memoryLimitBytes: limit }),
    );
    expect(e.code).toBe('MODEL_TOO_LARGE');
    // The factor's share, estimated independently by a symbolic analysis of K − σM's pattern.
    const factor = analyzeSparseLdlt(
      combine(K, 1, M, -1) as SparseSymmetricMatrix,
    ).memoryEstimateBytes;
    // Lanczos keeps 2 (m + 1) basis vectors (m = max(2p + 10, p + 20) = 30) and 2p more.
    const vectors = 2 * 31 + 2 * 10;
    expect(e.details?.estimateBytes).toBe(factor + 8 * 4000 * vectors);
    expect(e.details?.limitBytes).toBe(limit);
    expect(e.details?.method).toBe('lanczos');
    expect(e.message).toContain('for the sparse factor of K − σM');
    expect(e.message).toContain(`${vectors} vectors`);
    const free = solveModes(K, M, { method: 'lanczos', count: 10 });
    const bounded = solveModes(K, M, {
      method: 'lanczos',
      count: 10,
      memoryLimitBytes: 64 * 2 ** 20,
    });
    expect(bounded.modes.map((m) => m.lambda)).toEqual(free.modes.map((m) => m.lambda));
  });

  it('refuses subspace, inverse and shifted iteration the same way', () => {
    const { K, M } = beam(2000);
    for (const method of ['subspace', 'inverse', 'shifted'] as const) {
      const e = refusal(() =>
        solveModes(K, M, {
          method,
          count: 4,
          memoryLimitBytes: 2 ** 16,
          ...(method === 'shifted' ? { shift: 1e6 } : {}),
        }),
      );
      expect(e.code).toBe('MODEL_TOO_LARGE');
      expect(e.details?.method).toBe(method);
      expect(e.details?.estimateBytes as number).toBeGreaterThan(2 ** 16);
    }
  });

  it('counts the n × n arrays of a factorization in dense storage', () => {
    const { K, M } = beam(300); // n = 600, dense storage below
    const Kd = toDense(K);
    const Md = toDense(M);
    const limit = 4 * 2 ** 20;
    const e = refusal(() =>
      solveModes(Kd, Md, { method: 'inverse', count: 2, memoryLimitBytes: limit }),
    );
    expect(e.code).toBe('MODEL_TOO_LARGE');
    // 3 arrays of 600 × 600 doubles plus 2p + 6 = 10 vectors of 600.
    expect(e.details?.estimateBytes).toBe(3 * 8 * 600 * 600 + 8 * 600 * 10);
    expect(e.message).toContain('in dense storage');
    const r = solveModes(Kd, Md, { method: 'inverse', count: 2, memoryLimitBytes: 64 * 2 ** 20 });
    expect(r.modes).toHaveLength(2);
  });

  it('refuses a limit that is not positive', () => {
    const { K, M } = beam(10);
    const e = refusal(() => solveModes(K, M, { method: 'lanczos', memoryLimitBytes: 0 }));
    expect(e.code).toBe('INVALID_OPTION');
    expect(e.message).toBe('The memory limit must be positive, got 0.');
  });
});
