// The compare view's source rows and remark count (web/src/features/compare/lib/hunk-rows.ts).
import { describe, expect, it } from 'vitest';
import { hunkRows, lineEdit, remarkThreads } from '../../web/src/features/compare/lib/hunk-rows';

describe('hunkRows', () => {
  it('shows a line replaced by one line as one changed line with its edit marked', () => {
    const rows = hunkRows({
      oldStart: 3,
      oldCount: 1,
      newStart: 3,
      newCount: 1,
      removed: ['f >= 5 Hz  # above 5 Hz'],
      added: ['f >= 5 Hz  # above 5 Hz, clear of walking'],
    });
    expect(rows).toEqual([
      {
        kind: 'changed',
        oldLine: 3,
        newLine: 3,
        prefix: 'f >= 5 Hz  # above 5 Hz',
        removed: '',
        added: ', clear of walking',
        suffix: '',
      },
    ]);
  });

  it('keeps lines beyond the pairs as removed or added', () => {
    const rows = hunkRows({
      oldStart: 2,
      oldCount: 1,
      newStart: 2,
      newCount: 2,
      removed: ['m = 2.85 t/m'],
      added: ['m = 2.90 t/m', '# services 0.20 t/m'],
    });
    expect(rows.map((r) => r.kind)).toEqual(['changed', 'added']);
    expect(rows[1]).toEqual({ kind: 'added', newLine: 3, text: '# services 0.20 t/m' });
  });
});

describe('lineEdit', () => {
  it('finds the differing middle without overlapping the common start and end', () => {
    expect(lineEdit('aa', 'aaa')).toEqual({ prefix: 'aa', removed: '', added: 'a', suffix: '' });
    expect(lineEdit('m = 2.85 t/m', 'm = 2.90 t/m')).toEqual({
      prefix: 'm = 2.',
      removed: '85',
      added: '90',
      suffix: ' t/m',
    });
  });
});

describe('remarkThreads', () => {
  it('counts a carried remark and the remark it came from once', () => {
    expect(
      remarkThreads([
        { id: 7, carriedFrom: null },
        { id: 9, carriedFrom: { remarkId: 7 } },
        { id: 10, carriedFrom: null },
      ]),
    ).toBe(2);
  });

  it('counts a carried remark whose origin is not in the list', () => {
    expect(remarkThreads([{ id: 9, carriedFrom: { remarkId: 7 } }])).toBe(1);
  });
});
