import { describe, expect, it } from 'vitest';
import { diffSheets, evaluateSheet, mapLine, type Sheet } from '../../../core/index';

const base: Sheet = {
  blocks: [
    { id: 'intro', kind: 'text', source: 'Pump foundation.' },
    {
      id: 'data',
      kind: 'calc',
      source: 'k = 24 kN/mm\nm_1 = 18 t\nf = sqrt(k/m_1)/(2 pi)\nT = 1/f',
    },
    { id: 'checks', kind: 'criteria', source: 'f >= 5 Hz  # above 5 Hz\nT < 1 s  # period' },
    { id: 'notes', kind: 'text', source: 'End.' },
  ],
};

function edit(fn: (s: Sheet) => void): Sheet {
  const s = structuredClone(base);
  fn(s);
  return s;
}

describe('diffSheets', () => {
  it('finds no changes between a sheet and itself', () => {
    const d = diffSheets(base, structuredClone(base));
    expect(d.blocks.every((b) => b.status === 'unchanged')).toBe(true);
    expect(d.summary).toEqual({
      added: 0,
      removed: 0,
      changed: 0,
      moved: 0,
      resultsChanged: 0,
      flipped: 0,
    });
  });

  it('reports an edited line as a hunk, and the result changes with their relative change', () => {
    const next = edit((s) => (s.blocks[1]!.source = s.blocks[1]!.source.replace('18 t', '36 t')));
    const d = diffSheets(base, next, evaluateSheet(base), evaluateSheet(next));
    const data = d.blocks.find((b) => b.blockId === 'data')!;
    expect(data.status).toBe('changed');
    expect(data.hunks).toEqual([
      {
        oldStart: 2,
        oldCount: 1,
        newStart: 2,
        newCount: 1,
        removed: ['m_1 = 18 t'],
        added: ['m_1 = 36 t'],
      },
    ]);
    // Doubling the mass divides f by √2 (f ∝ 1/√m): relative change 1/√2 − 1.
    const f = d.results.find((r) => r.blockId === 'data' && r.key === 'f')!;
    expect(f.old).toBe('5.812 Hz');
    expect(f.new).toBe('4.109 Hz');
    expect(Math.abs(f.relativeChange! - (1 / Math.SQRT2 - 1))).toBeLessThan(1e-12);
    // 5.81 Hz ≥ 5 Hz passed; 4.11 Hz fails: the criterion flipped.
    expect(d.flipped).toEqual([
      { blockId: 'checks', label: 'above 5 Hz', line: 1, was: true, now: false },
    ]);
  });

  it('keeps a criterion whose comment alone changed as the same criterion, with no result change', () => {
    const next = edit(
      (s) => (s.blocks[2]!.source = 'f >= 5 Hz  # above 5 Hz, clear of walking\nT < 1 s  # period'),
    );
    const d = diffSheets(base, next, evaluateSheet(base), evaluateSheet(next));
    const checks = d.blocks.find((b) => b.blockId === 'checks')!;
    expect(checks.status).toBe('changed');
    expect(checks.hunks).toHaveLength(1);
    expect(checks.hunks[0]).toMatchObject({ oldCount: 1, newCount: 1 });
    // Still passes under its new label: nothing removed, nothing added, nothing flipped.
    expect(d.results.filter((r) => r.blockId === 'checks')).toEqual([]);
    expect(d.flipped).toEqual([]);
  });

  it('pairs a criterion whose expression changed under the same comment, and reports its flip', () => {
    // f = 5.812 Hz (k = 24 kN/mm, m = 18 t): ≥ 5 Hz passes, ≥ 6 Hz fails.
    const next = edit((s) => (s.blocks[2]!.source = 'f >= 6 Hz  # above 5 Hz\nT < 1 s  # period'));
    const d = diffSheets(base, next, evaluateSheet(base), evaluateSheet(next));
    expect(d.results.filter((r) => r.blockId === 'checks')).toEqual([
      {
        blockId: 'checks',
        key: 'criterion above 5 Hz',
        line: 1,
        old: 'pass',
        new: 'fail',
        relativeChange: null,
      },
    ]);
    expect(d.flipped).toEqual([
      { blockId: 'checks', label: 'above 5 Hz', line: 1, was: true, now: false },
    ]);
  });

  it('reports added, removed and moved blocks', () => {
    const next = edit((s) => {
      const notes = s.blocks.pop()!;
      s.blocks.splice(1, 0, notes); // moved up
      s.blocks.splice(0, 1); // intro removed
      s.blocks.push({ id: 'extra', kind: 'calc', source: 'x = 2 m' });
    });
    const d = diffSheets(base, next);
    const status = Object.fromEntries(d.blocks.map((b) => [b.blockId, b.status]));
    expect(status).toEqual({
      notes: 'moved',
      data: 'unchanged',
      checks: 'unchanged',
      extra: 'added',
      intro: 'removed',
    });
    expect(d.summary).toMatchObject({ added: 1, removed: 1, moved: 1, changed: 0 });
  });
});

describe('mapLine', () => {
  it('keeps an unchanged line when lines are inserted above it', () => {
    const next = edit(
      (s) => (s.blocks[1]!.source = '# storey 1\ng_0 = 9.81 m/s^2\n' + s.blocks[1]!.source),
    );
    expect(mapLine(base, next, { blockId: 'data', line: 3 })).toEqual({
      status: 'same',
      blockId: 'data',
      line: 5,
    });
  });

  it('says a line changed when it was edited in place', () => {
    const next = edit((s) => (s.blocks[1]!.source = s.blocks[1]!.source.replace('18 t', '19 t')));
    expect(mapLine(base, next, { blockId: 'data', line: 2 })).toEqual({
      status: 'changed',
      blockId: 'data',
      line: 2,
    });
    expect(mapLine(base, next, { blockId: 'data', line: 3 })).toEqual({
      status: 'same',
      blockId: 'data',
      line: 3,
    });
  });

  it('says a deleted line is gone and shifts the lines below it', () => {
    const next = edit(
      (s) => (s.blocks[1]!.source = 'k = 24 kN/mm\nf = sqrt(k/m_1)/(2 pi)\nT = 1/f'),
    );
    expect(mapLine(base, next, { blockId: 'data', line: 2 })).toEqual({ status: 'gone' });
    expect(mapLine(base, next, { blockId: 'data', line: 4 })).toEqual({
      status: 'same',
      blockId: 'data',
      line: 3,
    });
  });

  it('follows a line moved within its block and into another block', () => {
    const within = edit(
      (s) => (s.blocks[1]!.source = 'm_1 = 18 t\nk = 24 kN/mm\nf = sqrt(k/m_1)/(2 pi)\nT = 1/f'),
    );
    const a = mapLine(base, within, { blockId: 'data', line: 1 });
    const b = mapLine(base, within, { blockId: 'data', line: 2 });
    // One of the two swapped lines is in the common subsequence, the other is found as moved.
    expect([a, b]).toEqual([
      { status: 'same', blockId: 'data', line: 2 },
      { status: 'same', blockId: 'data', line: 1 },
    ]);
    const across = edit((s) => {
      s.blocks[1]!.source = 'k = 24 kN/mm\nm_1 = 18 t\nf = sqrt(k/m_1)/(2 pi)';
      s.blocks.splice(2, 0, { id: 'period', kind: 'calc', source: 'T = 1/f' });
    });
    expect(mapLine(base, across, { blockId: 'data', line: 4 })).toEqual({
      status: 'same',
      blockId: 'period',
      line: 1,
    });
  });

  it('follows blocks that moved, and says lines of a removed block are gone', () => {
    const next = edit((s) => {
      s.blocks.reverse();
      s.blocks = s.blocks.filter((b) => b.id !== 'intro');
    });
    expect(mapLine(base, next, { blockId: 'checks', line: 2 })).toEqual({
      status: 'same',
      blockId: 'checks',
      line: 2,
    });
    expect(mapLine(base, next, { blockId: 'intro', line: 1 })).toEqual({ status: 'gone' });
    expect(mapLine(base, next, { blockId: 'checks', line: 0 })).toEqual({
      status: 'same',
      blockId: 'checks',
      line: 0,
    });
  });
});
