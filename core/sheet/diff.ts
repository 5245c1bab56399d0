/**
 * Diffs between two sheets (source and results) and the re-anchoring of a line of the old sheet
 * in the new one, which remarks use to carry over to the next revision.
 *
 * Blocks are matched by id. A block present in both whose position relative to the other common
 * blocks changed is "moved" (the longest common subsequence of ids stays in place). Lines within
 * a block are diffed with the `diff` package (Myers' algorithm on whole lines).
 */
import { diffArrays } from 'diff';
import { blockLines } from './source';
import type {
  BlockKind,
  BlockResult,
  ResponseBlockResult,
  Sheet,
  SheetResults,
  SheetValue,
} from './types';

/** One run of changed lines within a block (1-based line numbers; count 0 for pure inserts). */
export interface LineHunk {
  oldStart: number;
  oldCount: number;
  newStart: number;
  newCount: number;
  removed: string[];
  added: string[];
}

export interface BlockChange {
  blockId: string;
  kind: BlockKind;
  status: 'added' | 'removed' | 'changed' | 'moved' | 'unchanged';
  /** True when the block changed place (it may also have changed lines). */
  moved: boolean;
  /** True when the kind changed (the lines are then compared as they are). */
  kindChanged: boolean;
  oldIndex: number | null;
  newIndex: number | null;
  hunks: LineHunk[];
}

export interface ResultChange {
  blockId: string;
  /** The name assigned, `line N`, `criterion N`, or `mode N f` for a modes table. */
  key: string;
  /** Line in the new sheet (null when the result is gone). */
  line: number | null;
  old: string | null;
  new: string | null;
  /** (new − old) / |old| in SI units, when both are numbers of the same dimension. */
  relativeChange: number | null;
  /**
   * The two values (SI in `si`, `siUnit`), so a client can show them in another unit system;
   * absent when neither side has a value (a criterion's pass or fail).
   */
  oldValue?: SheetValue | null;
  newValue?: SheetValue | null;
}

export interface CriterionFlip {
  blockId: string;
  label: string;
  line: number;
  was: boolean;
  now: boolean;
}

export interface SheetDiff {
  blocks: BlockChange[];
  results: ResultChange[];
  flipped: CriterionFlip[];
  summary: {
    added: number;
    removed: number;
    changed: number;
    moved: number;
    resultsChanged: number;
    flipped: number;
  };
}

function lineHunks(oldLines: string[], newLines: string[]): LineHunk[] {
  const hunks: LineHunk[] = [];
  let o = 1;
  let n = 1;
  let cur: LineHunk | null = null;
  for (const part of diffArrays(oldLines, newLines)) {
    if (!part.added && !part.removed) {
      if (cur) hunks.push(cur);
      cur = null;
      o += part.count;
      n += part.count;
      continue;
    }
    if (!cur) cur = { oldStart: o, oldCount: 0, newStart: n, newCount: 0, removed: [], added: [] };
    if (part.removed) {
      cur.removed.push(...part.value);
      cur.oldCount += part.count;
      o += part.count;
    } else {
      cur.added.push(...part.value);
      cur.newCount += part.count;
      n += part.count;
    }
  }
  if (cur) hunks.push(cur);
  return hunks;
}

/**
 * Per-block source changes between two sheets, in the order of the new sheet followed by the
 * removed blocks.
 */
export function diffBlocks(oldSheet: Sheet, newSheet: Sheet): BlockChange[] {
  const oldIds = oldSheet.blocks.map((b) => b.id);
  const newIds = newSheet.blocks.map((b) => b.id);
  const oldSet = new Set(oldIds);
  const newSet = new Set(newIds);
  const commonOld = oldIds.filter((id) => newSet.has(id));
  const commonNew = newIds.filter((id) => oldSet.has(id));
  const inPlace = new Set<string>();
  for (const part of diffArrays(commonOld, commonNew)) {
    if (!part.added && !part.removed) part.value.forEach((id) => inPlace.add(id));
  }
  const out: BlockChange[] = [];
  newSheet.blocks.forEach((nb, newIndex) => {
    const oldIndex = oldIds.indexOf(nb.id);
    if (oldIndex < 0) {
      out.push({
        blockId: nb.id,
        kind: nb.kind,
        status: 'added',
        moved: false,
        kindChanged: false,
        oldIndex: null,
        newIndex,
        hunks: lineHunks([], blockLines(nb.source)),
      });
      return;
    }
    const ob = oldSheet.blocks[oldIndex]!;
    const hunks = lineHunks(blockLines(ob.source), blockLines(nb.source));
    const moved = !inPlace.has(nb.id);
    const kindChanged = ob.kind !== nb.kind;
    const changed = hunks.length > 0 || kindChanged;
    out.push({
      blockId: nb.id,
      kind: nb.kind,
      status: changed ? 'changed' : moved ? 'moved' : 'unchanged',
      moved,
      kindChanged,
      oldIndex,
      newIndex,
      hunks,
    });
  });
  oldSheet.blocks.forEach((ob, oldIndex) => {
    if (newSet.has(ob.id)) return;
    out.push({
      blockId: ob.id,
      kind: ob.kind,
      status: 'removed',
      moved: false,
      kindChanged: false,
      oldIndex,
      newIndex: null,
      hunks: lineHunks(blockLines(ob.source), []),
    });
  });
  return out;
}

interface Entry {
  key: string;
  line: number;
  display: string;
  value: SheetValue | null;
  /**
   * What pairs this entry with its counterpart on the other side, strongest first. A criterion is
   * known by its expression, then by its label (its comment): a comment edited leaves the same
   * criterion, an expression edited under the same comment too.
   */
  identities: string[];
}

/** The expression of a criterion line, without its comment. */
function criterionExpression(source: string): string {
  return (source.split('#')[0] ?? '').trim();
}

/**
 * Pairs new entries with old ones: first by each one's strongest identity, then by the next, each
 * old entry used once. Returns old entry by new entry.
 */
function pairEntries(oldEntries: Entry[], newEntries: Entry[]): Map<Entry, Entry> {
  const pairs = new Map<Entry, Entry>();
  const used = new Set<Entry>();
  const depth = Math.max(0, ...oldEntries.concat(newEntries).map((e) => e.identities.length));
  for (let level = 0; level < depth; level++) {
    const free = new Map<string, Entry[]>();
    for (const o of oldEntries) {
      const id = o.identities[level];
      if (id === undefined || used.has(o)) continue;
      free.set(id, [...(free.get(id) ?? []), o]);
    }
    for (const n of newEntries) {
      const id = n.identities[level];
      if (id === undefined || pairs.has(n)) continue;
      const o = free.get(id)?.shift();
      if (o) {
        pairs.set(n, o);
        used.add(o);
      }
    }
  }
  return pairs;
}

function quantityEntry(key: string, si: number, siUnit: string, shown: string): Entry {
  return {
    key,
    line: 0,
    display: `${si} ${shown}`,
    value: { type: 'quantity', value: si, unit: shown, si, siUnit },
    identities: [key],
  };
}

/** The headline numbers of a response block, in SI, for comparing revisions. */
function responseEntries(b: ResponseBlockResult): Entry[] {
  const out: Entry[] = [];
  for (const d of b.spectrum?.directions ?? []) {
    out.push(quantityEntry(`base shear ${d.direction}`, d.scaledBaseShear, '(kg m)/s^2', 'N'));
    d.displacement.forEach((u, i) =>
      out.push(quantityEntry(`displacement ${d.direction} ${i + 1}`, u, 'm', 'm')),
    );
    d.storeys?.drift.forEach((u, i) =>
      out.push(quantityEntry(`drift ${d.direction} ${i + 1}`, u, 'm', 'm')),
    );
  }
  for (const a of b.harmonic?.atRunning ?? []) {
    out.push(quantityEntry(`amplitude at running speed DOF ${a.dof}`, a.amplitude, 'm', 'm'));
  }
  for (const d of b.history?.dofs ?? []) {
    out.push(quantityEntry(`peak displacement ${d.label}`, d.peak, 'm', 'm'));
  }
  if (b.history?.baseShear) {
    out.push(quantityEntry('peak base shear', b.history.baseShear.peak, '(kg m)/s^2', 'N'));
  }
  if (b.walking) {
    out.push(quantityEntry('walking acceleration', b.walking.acceleration, 'm/s^2', 'm/s^2'));
  }
  return out;
}

function entriesOf(b: BlockResult): Entry[] {
  switch (b.kind) {
    case 'calc':
      return b.lines.map((l) => {
        const key = l.name ?? `line ${l.line}`;
        return { key, line: l.line, display: l.display, value: l.value, identities: [key] };
      });
    case 'matrix':
      return b.value && b.name
        ? [
            {
              key: b.name,
              line: 0,
              display: JSON.stringify(b.value),
              value: b.value,
              identities: [b.name],
            },
          ]
        : [];
    case 'modes':
      return b.modes.flatMap((m) => [
        {
          key: `mode ${m.mode} f`,
          identities: [`mode ${m.mode} f`],
          line: 0,
          display: `${m.frequency} Hz`,
          value: {
            type: 'quantity',
            value: m.frequency,
            unit: 'Hz',
            si: m.frequency,
            siUnit: 's^-1',
          } as SheetValue,
        },
        ...(m.ratio === null
          ? []
          : [
              {
                key: `mode ${m.mode} ratio`,
                identities: [`mode ${m.mode} ratio`],
                line: 0,
                display: String(m.ratio),
                value: { type: 'number', value: m.ratio } as SheetValue,
              },
            ]),
      ]);
    case 'response':
      return responseEntries(b);
    case 'criteria':
      return b.criteria.map((c) => ({
        key: `criterion ${c.label}`,
        line: c.line,
        display: c.pass ? 'pass' : 'fail',
        value: null,
        identities: [`expression ${criterionExpression(c.source)}`, `label ${c.label}`],
      }));
    default:
      return [];
  }
}

function relative(a: SheetValue | null, b: SheetValue | null): number | null {
  if (!a || !b) return null;
  let x: number | null = null;
  let y: number | null = null;
  if (a.type === 'number' && b.type === 'number') [x, y] = [a.value, b.value];
  if (a.type === 'quantity' && b.type === 'quantity' && a.siUnit === b.siUnit)
    [x, y] = [a.si, b.si];
  if (x === null || y === null || x === 0) return null;
  return (y - x) / Math.abs(x);
}

/** The values of a result change that has any (a criterion's pass/fail has none). */
function sideValues(
  oldValue: SheetValue | null,
  newValue: SheetValue | null,
): Pick<ResultChange, 'oldValue' | 'newValue'> {
  return oldValue === null && newValue === null ? {} : { oldValue, newValue };
}

/** Result changes between two evaluations: values that changed and criteria that flipped. */
export function diffResults(
  oldResults: SheetResults,
  newResults: SheetResults,
): { results: ResultChange[]; flipped: CriterionFlip[] } {
  const results: ResultChange[] = [];
  const flipped: CriterionFlip[] = [];
  const oldById = new Map(oldResults.blocks.map((b) => [b.blockId, b]));
  const newIds = new Set(newResults.blocks.map((b) => b.blockId));
  for (const nb of newResults.blocks) {
    const ob = oldById.get(nb.blockId);
    const oldList = ob ? entriesOf(ob) : [];
    const newList = entriesOf(nb);
    const pairs = pairEntries(oldList, newList);
    const paired = new Set(pairs.values());
    for (const e of newList) {
      const o = pairs.get(e);
      if (o && o.display === e.display) continue;
      results.push({
        blockId: nb.blockId,
        key: e.key,
        line: e.line || null,
        old: o?.display ?? null,
        new: e.display,
        relativeChange: relative(o?.value ?? null, e.value),
        ...sideValues(o?.value ?? null, e.value),
      });
    }
    for (const o of oldList) {
      if (!paired.has(o))
        results.push({
          blockId: nb.blockId,
          key: o.key,
          line: null,
          old: o.display,
          new: null,
          relativeChange: null,
          ...sideValues(o.value, null),
        });
    }
    if (ob && ob.kind === 'criteria' && nb.kind === 'criteria') {
      // The same pairing as the entries: by expression, then by label.
      for (const [i, c] of nb.criteria.entries()) {
        const o = pairs.get(newList[i]!);
        const w = o ? ob.criteria[oldList.indexOf(o)] : undefined;
        if (w && w.pass !== c.pass)
          flipped.push({
            blockId: nb.blockId,
            label: c.label,
            line: c.line,
            was: w.pass,
            now: c.pass,
          });
      }
    }
  }
  for (const ob of oldResults.blocks) {
    if (newIds.has(ob.blockId)) continue;
    for (const e of entriesOf(ob))
      results.push({
        blockId: ob.blockId,
        key: e.key,
        line: null,
        old: e.display,
        new: null,
        relativeChange: null,
        ...sideValues(e.value, null),
      });
  }
  return { results, flipped };
}

/**
 * The full diff of two sheets; with both evaluations, the result changes too.
 *
 * @example
 * const d = diffSheets(rev1, rev2, results1, results2);
 * d.blocks.filter((b) => b.status !== 'unchanged');
 */
export function diffSheets(
  oldSheet: Sheet,
  newSheet: Sheet,
  oldResults?: SheetResults,
  newResults?: SheetResults,
): SheetDiff {
  const blocks = diffBlocks(oldSheet, newSheet);
  const r =
    oldResults && newResults ? diffResults(oldResults, newResults) : { results: [], flipped: [] };
  return {
    blocks,
    results: r.results,
    flipped: r.flipped,
    summary: {
      added: blocks.filter((b) => b.status === 'added').length,
      removed: blocks.filter((b) => b.status === 'removed').length,
      changed: blocks.filter((b) => b.status === 'changed').length,
      moved: blocks.filter((b) => b.moved).length,
      resultsChanged: r.results.length,
      flipped: r.flipped.length,
    },
  };
}

export type MappedLine =
  | { status: 'same'; blockId: string; line: number }
  | { status: 'changed'; blockId: string; line: number }
  | { status: 'gone' };

interface LineMatch {
  /** old line (1-based) → new line, for unchanged lines. */
  same: Map<number, number>;
  /** old line → new line for lines replaced within a hunk. */
  replaced: Map<number, number>;
  /** new lines that are additions (not matched to an old line). */
  added: Set<number>;
}

function matchLines(oldLines: string[], newLines: string[]): LineMatch {
  const same = new Map<number, number>();
  const replaced = new Map<number, number>();
  const added = new Set<number>();
  let o = 1;
  let n = 1;
  for (const h of lineHunks(oldLines, newLines)) {
    while (o < h.oldStart) same.set(o++, n++);
    for (let k = 0; k < h.oldCount; k++) {
      if (h.newCount > 0) replaced.set(h.oldStart + k, h.newStart + Math.min(k, h.newCount - 1));
    }
    for (let k = 0; k < h.newCount; k++) added.add(h.newStart + k);
    o = h.oldStart + h.oldCount;
    n = h.newStart + h.newCount;
  }
  while (o <= oldLines.length) same.set(o++, n++);
  return { same, replaced, added };
}

/**
 * Maps a line of the old sheet to the new one: `same` when the line is there unchanged (also when
 * it moved, within its block or to another block, and its text is found once among the new
 * lines), `changed` when it was edited in place, `gone` when it was deleted or its block removed.
 * Line 0 (a block's header) maps to the header of the same block.
 */
export function mapLine(
  oldSheet: Sheet,
  newSheet: Sheet,
  at: { blockId: string; line: number },
): MappedLine {
  const ob = oldSheet.blocks.find((b) => b.id === at.blockId);
  if (!ob) return { status: 'gone' };
  const oldLines = blockLines(ob.source);
  if (at.line === 0) {
    return newSheet.blocks.some((b) => b.id === at.blockId)
      ? { status: 'same', blockId: at.blockId, line: 0 }
      : { status: 'gone' };
  }
  if (!Number.isInteger(at.line) || at.line < 1 || at.line > oldLines.length)
    return { status: 'gone' };
  const text = oldLines[at.line - 1]!;
  const nb = newSheet.blocks.find((b) => b.id === at.blockId);
  let match: LineMatch | null = null;
  if (nb) {
    match = matchLines(oldLines, blockLines(nb.source));
    const s = match.same.get(at.line);
    if (s !== undefined) return { status: 'same', blockId: nb.id, line: s };
  }
  // Moved: the same text appears exactly once among the added lines of the new sheet.
  if (text.trim() !== '') {
    const found: { blockId: string; line: number }[] = [];
    for (const b of newSheet.blocks) {
      const old = oldSheet.blocks.find((x) => x.id === b.id);
      const newLines = blockLines(b.source);
      const added =
        b === nb && match
          ? match.added
          : old
            ? matchLines(blockLines(old.source), newLines).added
            : new Set(newLines.map((_, i) => i + 1));
      for (const l of added) if (newLines[l - 1] === text) found.push({ blockId: b.id, line: l });
    }
    if (found.length === 1) return { status: 'same', ...found[0]! };
  }
  if (nb && match) {
    const r = match.replaced.get(at.line);
    if (r !== undefined) return { status: 'changed', blockId: nb.id, line: r };
  }
  return { status: 'gone' };
}
