// The outline of a long sheet (web/src/features/editor/lib/outline.ts): pure, run without a browser.
import { describe, expect, it } from 'vitest';
import type { Block } from '../../web/src/features/editor/api/types';
import { blockAnchor, sheetOutline } from '../../web/src/features/editor/lib/outline';

const b = (id: string, kind: Block['kind'], source: string): Block => ({ id, kind, source });

describe('sheetOutline', () => {
  it('names each block by what it holds, in sheet order', () => {
    const entries = sheetOutline([
      b('b1', 'text', '\n## Deck natural frequencies\n\nSingle span.'),
      b('b2', 'calc', 'E = 210 GPa  # steel\nI = 0.012 m^4\nf == 3\ndeck = beam({})'),
      b('b3', 'matrix', 'name: K\nunit: kN/m\nfrom: frame-K.mtx'),
      b('b4', 'modes', 'stiffness: K\nmass: M\nname: sway  # lateral'),
      b('b5', 'criteria', 'sway.f[1] >= 3 Hz  # walking comfort\nsway.cumulative[3] >= 0.9'),
    ]);
    expect(entries.map((e) => [e.index, e.kind, e.title])).toEqual([
      [1, 'text', 'Deck natural frequencies'],
      [2, 'calc', 'E, I, deck'],
      [3, 'matrix', 'K (from frame-K.mtx)'],
      [4, 'modes', 'sway'],
      [5, 'criteria', '2 criteria: walking comfort, …'],
    ]);
  });

  it('says (empty) for an empty block and clips a long title', () => {
    const [empty, long] = sheetOutline([
      b('b1', 'text', ''),
      b('b2', 'text', `# ${'x'.repeat(100)}`),
    ]);
    expect(empty!.title).toBe('(empty)');
    expect(long!.title).toHaveLength(60);
    expect(long!.title.endsWith('…')).toBe(true);
  });

  it('links to the block card by its stable id', () => {
    expect(blockAnchor('b1a2')).toBe('block-b1a2');
  });
});
