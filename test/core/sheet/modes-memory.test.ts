import { describe, expect, it } from 'vitest';
import { evaluateSheet, type ModesBlockResult, type Sheet } from '../../../core/index';

// A modes block whose solve would exceed the evaluation's memory limit is refused at its line,
// with the estimate, the limit and what to do, and the blocks below go on.

const beamSheet = (modes: string): Sheet => ({
  blocks: [
    {
      id: 'model',
      kind: 'calc',
      // 60 Hermite elements, clamped–free: 120 DOFs (invented steel member).
      source:
        'deck = beam({E: 210 GPa, I: 8.3e-6 m^4, mass: 30 kg/m, length: 4 m, elements: 60, ends: "clamped-free"})',
    },
    { id: 'solve', kind: 'modes', source: modes },
    { id: 'after', kind: 'calc', source: 'x = 2 m' },
  ],
});

describe('modes blocks under a memory limit', () => {
  it('refuses the dense method at its method line with the estimate and the limit', () => {
    const r = evaluateSheet(
      beamSheet('stiffness: deck.K\nmass: deck.M\nmethod: dense\ncount: 3\nname: deck_modes'),
      { memoryLimitBytes: 0.5 * 2 ** 20, memoryLimitAdvice: 'raise MW_EVAL_MEMORY_MB' },
    );
    // 5 arrays of 120 × 120 doubles: 5 · 8 · 120² bytes = 563 kB (core/eigen/solve-modes.ts).
    expect(r.errors).toEqual([
      {
        blockId: 'solve',
        blockIndex: 1,
        line: 3,
        code: 'MODEL_TOO_LARGE',
        message:
          'The model is too large for the memory this evaluation may use: the dense solve of 120 ' +
          'DOFs needs about 563 kB, more than the limit of 512 kB. Use fewer DOFs (a coarser ' +
          'mesh), a different method (lanczos or subspace, which find the lowest modes without ' +
          'n × n arrays), or raise MW_EVAL_MEMORY_MB.',
      },
    ]);
    expect((r.blocks[1] as ModesBlockResult).ok).toBe(false);
    expect(r.blocks[2]!.ok).toBe(true);
  });

  it('points at the stiffness line when no method is written, and solves within a larger limit', () => {
    const source = 'stiffness: deck.K\nmass: deck.M\ncount: 3';
    const refused = evaluateSheet(beamSheet(source), { memoryLimitBytes: 0.25 * 2 ** 20 });
    expect(refused.errors).toHaveLength(1);
    expect(refused.errors[0]).toMatchObject({ blockId: 'solve', line: 1, code: 'MODEL_TOO_LARGE' });
    expect(refused.errors[0]!.message).toContain('more than the limit of 256 kB');
    expect(refused.errors[0]!.message).toContain('or ask for a larger memory limit.');
    const solved = evaluateSheet(beamSheet(source), { memoryLimitBytes: 64 * 2 ** 20 });
    expect(solved.errors).toEqual([]);
    const unlimited = evaluateSheet(beamSheet(source));
    expect(solved.blocks[1]).toEqual(unlimited.blocks[1]);
  });
});
