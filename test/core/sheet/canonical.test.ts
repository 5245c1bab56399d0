import { createHash } from 'node:crypto';
import { describe, expect, it } from 'vitest';
import {
  canonicalJson,
  canonicalLineOf,
  canonicalText,
  digestSheet,
  ENGINE_VERSION,
  evaluateSheet,
  locateCanonicalLine,
  type Sheet,
} from '../../../core/index';

const sheet: Sheet = {
  blocks: [
    { id: 'intro', kind: 'text', source: 'Floor check  \r\nSee $f_1$.\r\n\r\n' },
    {
      id: 'c1',
      kind: 'calc',
      source: 'k = 24 kN/mm   # storey\nm_1 = 18 t\nf = sqrt(k/m_1)/(2 pi)\n',
    },
    { id: 'k1', kind: 'criteria', source: 'f >= 3 Hz # walking' },
  ],
};

describe('canonical text', () => {
  it('has a header per block, LF endings, trimmed lines and a final newline', () => {
    expect(canonicalText(sheet)).toBe(
      '#% text intro\nFloor check\nSee $f_1$.\n' +
        '#% calc c1\nk = 24 kN/mm   # storey\nm_1 = 18 t\nf = sqrt(k/m_1)/(2 pi)\n' +
        '#% criteria k1\nf >= 3 Hz # walking\n',
    );
  });

  it('converts canonical lines and block lines both ways', () => {
    // Line 1 is the first header; "m_1 = 18 t" is canonical line 6, block c1 line 2.
    expect(locateCanonicalLine(sheet, 6)).toEqual({ blockId: 'c1', blockIndex: 1, line: 2 });
    expect(locateCanonicalLine(sheet, 4)).toEqual({ blockId: 'c1', blockIndex: 1, line: 0 });
    expect(canonicalLineOf(sheet, 'c1', 2)).toBe(6);
    expect(canonicalLineOf(sheet, 'k1', 1)).toBe(9);
    expect(canonicalLineOf(sheet, 'k1', 2)).toBeNull();
    for (let n = 1; n <= 9; n++) {
      const at = locateCanonicalLine(sheet, n)!;
      expect(canonicalLineOf(sheet, at.blockId, at.line)).toBe(n);
    }
    expect(locateCanonicalLine(sheet, 10)).toBeNull();
  });

  it('refuses duplicate ids and ids with spaces', () => {
    expect(() =>
      canonicalText({
        blocks: [
          { id: 'a', kind: 'calc', source: '' },
          { id: 'a', kind: 'text', source: '' },
        ],
      }),
    ).toThrow(/repeats the id "a"/);
    expect(() => canonicalText({ blocks: [{ id: 'a b', kind: 'calc', source: '' }] })).toThrow(
      /invalid id/,
    );
  });
});

describe('canonical JSON and digests', () => {
  it('sorts keys, prints numbers round-trip exact and refuses non-finite numbers', () => {
    expect(canonicalJson({ b: 1, a: [0.1 + 0.2, -0, 'x'], c: undefined })).toBe(
      '{"a":[0.30000000000000004,0,"x"],"b":1}',
    );
    expect(() => canonicalJson({ a: Infinity })).toThrow(/finite/);
  });

  it('digests with SHA-256 (checked against node:crypto)', () => {
    const r = evaluateSheet(sheet);
    const d = digestSheet(sheet, r);
    expect(d.digests.canonicalText).toBe(
      createHash('sha256').update(d.canonicalText, 'utf8').digest('hex'),
    );
    expect(d.digests.results).toBe(
      createHash('sha256').update(d.resultsJson, 'utf8').digest('hex'),
    );
    expect(d.engineVersion).toBe(ENGINE_VERSION);
  });

  it('gives byte-identical outputs for the same sheet evaluated twice', () => {
    const a = digestSheet(sheet, evaluateSheet(sheet));
    const b = digestSheet(structuredClone(sheet), evaluateSheet(structuredClone(sheet)));
    expect(b.resultsJson).toBe(a.resultsJson);
    expect(b.digests).toEqual(a.digests);
  });

  it('changes the results digest when a value changes and not when only whitespace does', () => {
    const a = digestSheet(sheet, evaluateSheet(sheet));
    const edited: Sheet = structuredClone(sheet);
    edited.blocks[1]!.source = edited.blocks[1]!.source.replace('18 t', '19 t');
    const b = digestSheet(edited, evaluateSheet(edited));
    expect(b.digests.results).not.toBe(a.digests.results);
    const spaced: Sheet = structuredClone(sheet);
    spaced.blocks[2]!.source += '   \n\n';
    expect(digestSheet(spaced, evaluateSheet(spaced)).digests).toEqual(a.digests);
  });
});
