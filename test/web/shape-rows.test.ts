// The rows of mode shapes the plot and the paged table read (web/src/components/results/shape-rows.ts),
// on real evaluations of the engine.
import { describe, expect, it } from 'vitest';
import { evaluateSheet, type ModesBlockResult } from '../../core/index';
import { decimate, pageBounds, shapeRows } from '../../web/src/components/results/shape-rows';

function beamModes(elements: number): ModesBlockResult {
  const r = evaluateSheet({
    blocks: [
      {
        id: 'gen',
        kind: 'calc',
        source: `deck = beam({E: 210 GPa, I: 0.02 m^4, mass: 1.5 t/m, length: 120 m, elements: ${elements}, ends: "pinned-pinned"})`,
      },
      { id: 'm', kind: 'modes', source: 'stiffness: deck.K\nmass: deck.M\ncount: 2' },
    ],
  });
  return r.blocks[1] as ModesBlockResult;
}

describe('shapeRows', () => {
  it('reads every DOF of a result that kept its shapes', () => {
    const rows = shapeRows(beamModes(20))!;
    // Pinned–pinned: 21 nodes × 2 DOFs less the two end deflections.
    expect(rows).toMatchObject({ size: 40, preview: false });
    expect(rows.dofs).toEqual(Array.from({ length: 40 }, (_, i) => i + 1));
    expect(rows.labels![0]).toBe('θ1');
  });

  it('reads the preview at evenly spaced nodes of a model-scale result', () => {
    const rows = shapeRows(beamModes(6000))!;
    expect(rows.preview).toBe(true);
    expect(rows.size).toBe(12_000);
    expect(rows.shapes.length).toBeLessThanOrEqual(2_000);
    // Both ends kept, and each kept node with all its DOFs.
    expect(rows.labels![0]).toBe('θ1');
    expect(rows.labels!.at(-1)).toBe('θ6001');
    expect(rows.labels!.filter((l) => l.startsWith('w')).length).toBe(
      rows.labels!.filter((l) => l.startsWith('θ')).length - 2,
    );
  });
});

describe('pageBounds', () => {
  it('clamps the page to those there are', () => {
    expect(pageBounds(120, 0, 50)).toEqual({ page: 0, pages: 3, from: 0, to: 50 });
    expect(pageBounds(120, 7, 50)).toEqual({ page: 2, pages: 3, from: 100, to: 120 });
    expect(pageBounds(0, 0, 50)).toEqual({ page: 0, pages: 1, from: 0, to: 0 });
  });
});

describe('decimate', () => {
  it('keeps at most the number asked, first and last included', () => {
    const xs = Array.from({ length: 20_001 }, (_, i) => i);
    const d = decimate(xs, 800);
    expect(d.length).toBeLessThanOrEqual(800);
    expect(d[0]).toBe(0);
    expect(d.at(-1)).toBe(20_000);
    expect(decimate([1, 2, 3], 800)).toEqual([1, 2, 3]);
  });
});
