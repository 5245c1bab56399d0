import { describe, expect, it } from 'vitest';
import { placeQuery, readPlace } from '../../web/src/lib/place';
import { paths } from '../../web/src/config/paths';

// The one address scheme of a place in a sheet or a revision (?block=…&line=…[&remark=…]).

describe('placeQuery and readPlace', () => {
  it('writes a block and line, and reads them back', () => {
    expect(placeQuery({ blockId: 'deck-data', line: 6 })).toBe('?block=deck-data&line=6');
    expect(readPlace('?block=deck-data&line=6')).toEqual({
      blockId: 'deck-data',
      line: 6,
      remarkId: null,
    });
  });

  it('carries a remark beside its block and line', () => {
    const q = placeQuery({ blockId: 'b1', line: 0, remarkId: 42 });
    expect(q).toBe('?block=b1&line=0&remark=42');
    expect(readPlace(q)).toEqual({ blockId: 'b1', line: 0, remarkId: 42 });
  });

  it('escapes a block id that is not a plain word', () => {
    const q = placeQuery({ blockId: 'a&b=c d', line: 2 });
    // application/x-www-form-urlencoded as the WHATWG URL Standard serializes it (space as +).
    expect(q).toBe('?block=a%26b%3Dc+d&line=2');
    expect(readPlace(q)).toMatchObject({ blockId: 'a&b=c d', line: 2 });
  });

  it('reads no place from an address without one, or with a line that is not a line number', () => {
    expect(readPlace('')).toBeNull();
    expect(readPlace('?q=heating')).toBeNull();
    expect(readPlace('?block=b1&line=-1')).toBeNull();
    expect(readPlace('?block=b1&line=2.5')).toBeNull();
    expect(readPlace('?block=b1&line=x')).toBeNull();
    // A remark id that is not a number is left out; the line still counts.
    expect(readPlace('?block=b1&line=3&remark=x')).toEqual({
      blockId: 'b1',
      line: 3,
      remarkId: null,
    });
  });
});

describe('paths with a place', () => {
  it('puts the place on the editor’s and the revision’s addresses', () => {
    expect(paths.sheet.href(1, 4, { blockId: 'intro', line: 12 })).toBe(
      '/projects/1/sheets/4?block=intro&line=12',
    );
    expect(paths.sheet.href(1, 4)).toBe('/projects/1/sheets/4');
    expect(paths.revision.href(9, { blockId: 'intro', line: 2, remarkId: 5 })).toBe(
      '/revisions/9?block=intro&line=2&remark=5',
    );
  });
});
