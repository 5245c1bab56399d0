import { BLOCK_REFERENCE } from '../../../config/sheet-reference';
import { BLOCK_KINDS, type Block, type BlockKind } from '../api/types';

/** A fresh block id, stable across revisions once saved (its shape: lib/block-ids.ts). */
export function newBlockId(): string {
  const bytes = new Uint8Array(6);
  crypto.getRandomValues(bytes);
  return `b${Array.from(bytes, (b) => b.toString(16).padStart(2, '0')).join('')}`;
}

/** What a new block starts with: the reference's starting points, which evaluate as they are. */
export const BLOCK_STARTERS: Record<BlockKind, string> = Object.fromEntries(
  BLOCK_KINDS.map((kind) => [kind, BLOCK_REFERENCE.find((b) => b.kind === kind)?.starter ?? '']),
) as Record<BlockKind, string>;

export function moveBlock(blocks: readonly Block[], from: number, to: number): Block[] {
  if (to < 0 || to >= blocks.length || from === to) return [...blocks];
  const next = [...blocks];
  const [moved] = next.splice(from, 1);
  if (moved) next.splice(to, 0, moved);
  return next;
}

/**
 * Both versions at once: every block of mine, then every block of theirs that mine does not
 * already hold word for word (their copy of a block I also changed comes in under a new id,
 * straight after mine). Nothing either author wrote is lost.
 */
export function mergeBoth(mine: readonly Block[], theirs: readonly Block[]): Block[] {
  const out: Block[] = [];
  const mineById = new Map(mine.map((b) => [b.id, b]));
  const theirsById = new Map(theirs.map((b) => [b.id, b]));
  for (const block of mine) {
    out.push(block);
    const other = theirsById.get(block.id);
    if (other && (other.source !== block.source || other.kind !== block.kind)) {
      out.push({ ...other, id: newBlockId() });
    }
  }
  for (const block of theirs) {
    if (!mineById.has(block.id)) out.push(block);
  }
  return out;
}

/** A name a matrix block can use for an uploaded file: `frame-K.mtx` → `frame_K`. */
export function matrixNameFor(fileName: string): string {
  const base = fileName
    .replace(/\.[^.]+$/, '')
    .replace(/[^A-Za-z0-9_]+/g, '_')
    .replace(/^_+|_+$/g, '');
  if (!base) return 'A';
  return /^[A-Za-z]/.test(base) ? base : `A_${base}`;
}

/** The starting text of a matrix block that refers to an upload; the unit is for the author. */
export function uploadBlockSource(fileName: string): string {
  const name = matrixNameFor(fileName);
  const looksLikeMass = /(^|[_\-.])(m|mass)([_\-.]|$)/i.test(fileName.replace(/\.[^.]+$/, ''));
  return [
    `name: ${name}`,
    `unit: ${looksLikeMass ? 't' : 'kN/m'}  # the unit of the file's entries: check it`,
    `from: ${fileName}`,
    '',
  ].join('\n');
}
