import type { Block, BlockKind } from '../api/types';

export type OutlineEntry = {
  id: string;
  /** 1-based, as the block cards number them. */
  index: number;
  kind: BlockKind;
  /** A few words that tell the block apart from its neighbours. */
  title: string;
};

/** A long sheet gets an outline; a short one is read at a glance without it. */
export const OUTLINE_MIN_BLOCKS = 5;

const MAX_TITLE = 60;

function clip(text: string): string {
  const t = text.trim().replace(/\s+/g, ' ');
  return t.length > MAX_TITLE ? `${t.slice(0, MAX_TITLE - 1)}…` : t;
}

function lines(source: string): string[] {
  return source.split(/\r?\n/).filter((l) => l.trim() !== '');
}

function headerValue(source: string, key: string): string | null {
  for (const line of lines(source)) {
    const match = new RegExp(`^\\s*${key}\\s*:\\s*([^#]*)`).exec(line);
    if (match?.[1]?.trim()) return match[1].trim();
  }
  return null;
}

function titleOf(block: Block): string {
  const all = lines(block.source);
  switch (block.kind) {
    case 'text': {
      const heading = all.find((l) => /^\s*#{1,6}\s/.test(l));
      const first = heading ?? all[0];
      return first ? clip(first.replace(/^\s*#{1,6}\s*/, '').replace(/\$+/g, '')) : '(empty)';
    }
    case 'calc': {
      // The names it defines, in order: what the blocks below will use.
      const names = all
        .map((l) => /^\s*([A-Za-z_][A-Za-z0-9_]*)\s*=(?!=)/.exec(l)?.[1])
        .filter((n): n is string => Boolean(n));
      if (names.length === 0) return all[0] ? clip(all[0]) : '(empty)';
      return clip(names.length > 4 ? `${names.slice(0, 4).join(', ')}, …` : names.join(', '));
    }
    case 'matrix': {
      const from = headerValue(block.source, 'from');
      const name = headerValue(block.source, 'name') ?? 'unnamed';
      return clip(from ? `${name} (from ${from})` : name);
    }
    case 'modes':
      return clip(headerValue(block.source, 'name') ?? 'modes');
    case 'criteria': {
      const labels = all.map((l) => l.split('#')[1]?.trim()).filter((l): l is string => !!l);
      const count = all.filter((l) => !/^\s*#/.test(l)).length;
      const first = labels[0];
      return clip(
        `${count} criteri${count === 1 ? 'on' : 'a'}${first ? `: ${first}${count > 1 ? ', …' : ''}` : ''}`,
      );
    }
    default:
      return '';
  }
}

/** One entry per block, in sheet order, for the outline of a long sheet. */
export function sheetOutline(blocks: readonly Block[]): OutlineEntry[] {
  return blocks.map((block, i) => ({
    id: block.id,
    index: i + 1,
    kind: block.kind,
    title: titleOf(block),
  }));
}

/** The element id of a block's card, which the outline links to. */
export function blockAnchor(blockId: string): string {
  return `block-${blockId}`;
}
