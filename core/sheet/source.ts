/**
 * A sheet's source as lines: normalization, comments, the canonical text and the conversion
 * between canonical line numbers and (block, line) locations.
 *
 * Canonical text: for each block a header line `#% <kind> <id>`, then the block's source lines
 * with CR LF turned into LF, trailing whitespace trimmed and trailing blank lines dropped; every
 * line ends with LF. Block line numbers count from 1 within the block and are the same in the
 * canonical text, the evaluator's messages and the remarks.
 */
import { EngineError } from '../errors';
import { BLOCK_KINDS, type Sheet, type SheetBlock } from './types';

/** The header line that opens a block in the canonical text. */
export const CANONICAL_HEADER_PREFIX = '#% ';

/** Splits a block's source into its normalized lines (see the module comment). */
export function blockLines(source: string): string[] {
  const lines = source
    .replace(/\r\n?/g, '\n')
    .split('\n')
    .map((l) => l.replace(/[ \t\f\v\u00a0]+$/u, ''));
  while (lines.length > 0 && lines[lines.length - 1] === '') lines.pop();
  return lines;
}

/** Checks the shape of a sheet: ids present, unique, without spaces; known kinds. */
export function validateSheet(sheet: Sheet): void {
  if (!sheet || !Array.isArray(sheet.blocks)) {
    throw new EngineError('SHEET_PARSE', 'A sheet must have a list of blocks.');
  }
  const seen = new Set<string>();
  sheet.blocks.forEach((b, i) => {
    if (typeof b.id !== 'string' || !/^[A-Za-z0-9_.:-]{1,64}$/.test(b.id)) {
      throw new EngineError(
        'SHEET_PARSE',
        `Block ${i + 1} has an invalid id: ids are 1–64 letters, digits or _ . : - without spaces.`,
        { blockIndex: i },
      );
    }
    if (seen.has(b.id)) {
      throw new EngineError('SHEET_PARSE', `Block ${i + 1} repeats the id "${b.id}".`, {
        blockIndex: i,
        blockId: b.id,
      });
    }
    seen.add(b.id);
    if (!BLOCK_KINDS.includes(b.kind)) {
      throw new EngineError(
        'SHEET_PARSE',
        `Block "${b.id}" has an unknown kind "${String(b.kind)}"; the kinds are ${BLOCK_KINDS.join(', ')}.`,
        { blockIndex: i, blockId: b.id },
      );
    }
    if (typeof b.source !== 'string') {
      throw new EngineError('SHEET_PARSE', `Block "${b.id}" has no source text.`, {
        blockIndex: i,
        blockId: b.id,
      });
    }
  });
}

/**
 * Splits a line into code and comment at the first `#` outside a string literal.
 * Returns the code with trailing spaces trimmed and the comment text (trimmed) or null.
 */
export function splitComment(line: string): { code: string; comment: string | null } {
  let quote: string | null = null;
  for (let i = 0; i < line.length; i++) {
    const c = line[i];
    if (quote) {
      if (c === '\\') i++;
      else if (c === quote) quote = null;
    } else if (c === '"' || c === "'") {
      quote = c;
    } else if (c === '#') {
      return { code: line.slice(0, i).trimEnd(), comment: line.slice(i + 1).trim() };
    }
  }
  return { code: line.trimEnd(), comment: null };
}

/** The header line of a block in the canonical text. */
export function canonicalHeader(block: Pick<SheetBlock, 'id' | 'kind'>): string {
  return `${CANONICAL_HEADER_PREFIX}${block.kind} ${block.id}`;
}

/**
 * The canonical text of a sheet (see the module comment). Byte-identical for the same blocks.
 *
 * @example
 * canonicalText({ blocks: [{ id: 'b1', kind: 'calc', source: 'k = 2 kN/mm  \r\n' }] })
 * // '#% calc b1\nk = 2 kN/mm\n'
 */
export function canonicalText(sheet: Sheet): string {
  validateSheet(sheet);
  let out = '';
  for (const b of sheet.blocks) {
    out += canonicalHeader(b) + '\n';
    for (const l of blockLines(b.source)) out += l + '\n';
  }
  return out;
}

/**
 * Converts a 1-based line of the canonical text to its block and line. A header line gives
 * line 0 of its block. Returns null past the end.
 */
export function locateCanonicalLine(
  sheet: Sheet,
  canonicalLine: number,
): { blockId: string; blockIndex: number; line: number } | null {
  let start = 1;
  for (let i = 0; i < sheet.blocks.length; i++) {
    const b = sheet.blocks[i]!;
    const n = blockLines(b.source).length;
    if (canonicalLine >= start && canonicalLine <= start + n) {
      return { blockId: b.id, blockIndex: i, line: canonicalLine - start };
    }
    start += n + 1;
  }
  return null;
}

/**
 * Converts a block and 1-based line within it (0 for its header) to the line of the canonical
 * text. Returns null when the block or line does not exist.
 */
export function canonicalLineOf(sheet: Sheet, blockId: string, line: number): number | null {
  let start = 1;
  for (const b of sheet.blocks) {
    const n = blockLines(b.source).length;
    if (b.id === blockId) {
      return Number.isInteger(line) && line >= 0 && line <= n ? start + line : null;
    }
    start += n + 1;
  }
  return null;
}
