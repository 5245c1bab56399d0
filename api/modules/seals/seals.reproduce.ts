/**
 * The reproduction check of sealing: a fresh evaluation must give the stored results. Numbers
 * agree when |a − b| ≤ 1e-9 · max(|a|, |b|) (relative 1e-9 on every number, as the issue
 * states; exact zeros must stay zero); every other value must be identical.
 */
export const REPRODUCE_RELATIVE_TOLERANCE = 1e-9;

export interface MovedValue {
  /** Where, in words: the block id and line when the value belongs to one. */
  where: string;
  blockId: string | null;
  line: number | null;
  path: string;
  stored: unknown;
  fresh: unknown;
  /** |a − b| / max(|a|, |b|) for numbers, null otherwise. */
  relativeChange: number | null;
}

const MAX_LISTED = 25;

function describe(blockId: string | null, line: number | null, path: string): string {
  if (blockId === null) return path;
  return line === null ? `block ${blockId} (${path})` : `block ${blockId}, line ${line} (${path})`;
}

export function compareResults(
  stored: unknown,
  fresh: unknown,
  tolerance = REPRODUCE_RELATIVE_TOLERANCE,
): { moved: MovedValue[]; total: number } {
  const moved: MovedValue[] = [];
  let total = 0;
  const push = (m: Omit<MovedValue, 'where'>) => {
    total++;
    if (moved.length < MAX_LISTED) moved.push({ ...m, where: describe(m.blockId, m.line, m.path) });
  };
  const walk = (
    a: unknown,
    b: unknown,
    path: string,
    blockId: string | null,
    line: number | null,
  ) => {
    if (typeof a === 'number' && typeof b === 'number') {
      if (a === b) return;
      const scale = Math.max(Math.abs(a), Math.abs(b));
      const rel = Math.abs(a - b) / scale;
      if (!(rel <= tolerance))
        push({ blockId, line, path, stored: a, fresh: b, relativeChange: rel });
      return;
    }
    if (Array.isArray(a) && Array.isArray(b)) {
      if (a.length !== b.length) {
        push({
          blockId,
          line,
          path: `${path}.length`,
          stored: a.length,
          fresh: b.length,
          relativeChange: null,
        });
        return;
      }
      a.forEach((v, i) => walk(v, b[i], `${path}[${i}]`, blockId, line));
      return;
    }
    if (
      a !== null &&
      b !== null &&
      typeof a === 'object' &&
      typeof b === 'object' &&
      !Array.isArray(a) &&
      !Array.isArray(b)
    ) {
      const ao = a as Record<string, unknown>;
      const bo = b as Record<string, unknown>;
      const here = {
        blockId: typeof ao.blockId === 'string' ? ao.blockId : blockId,
        line: typeof ao.line === 'number' ? ao.line : line,
      };
      const keys = new Set([...Object.keys(ao), ...Object.keys(bo)]);
      for (const k of [...keys].sort()) {
        walk(ao[k], bo[k], path === '' ? k : `${path}.${k}`, here.blockId, here.line);
      }
      return;
    }
    if (a !== b)
      push({ blockId, line, path, stored: a ?? null, fresh: b ?? null, relativeChange: null });
  };
  walk(stored, fresh, '', null, null);
  return { moved, total };
}
