/**
 * The mode shapes a result keeps when a model is too large to keep them in full: the rows of
 * evenly spaced nodes (every DOF of each node kept, so a beam's w and θ stay together), the two
 * ends always included. The plot and the paged table of the shapes read these rows; the full
 * shapes stay with the engine for the blocks below.
 */
import type { ShapePreview } from './types';

/** Most rows a shape preview keeps. */
export const SHAPE_PREVIEW_ROWS = 2_000;

/** The node a generated model's DOF label belongs to: "w3" → 3, "N2 ux" → 2, "u4" → 4. */
function nodeOf(label: string): number | null {
  const m = /^N(\d+)\s+\S+$/.exec(label) ?? /^[^\d\s]+(\d+)$/.exec(label);
  return m ? Number(m[1]) : null;
}

/** At most `most` evenly spaced items of 0…count−1, the first and the last included. */
function evenly(count: number, most: number): number[] {
  if (count <= most) return Array.from({ length: count }, (_, i) => i);
  const step = Math.ceil((count - 1) / Math.max(1, most - 1));
  const out: number[] = [];
  for (let i = 0; i < count - 1; i += step) out.push(i);
  out.push(count - 1);
  return out;
}

/**
 * The 0-based rows to keep of n DOFs: by node when every label names one, else evenly spaced.
 * @example previewRows(20000, labels, 2000) // the DOFs of every 10th node of a beam
 */
export function previewRows(
  n: number,
  labels: readonly string[] | null,
  maxRows: number = SHAPE_PREVIEW_ROWS,
): number[] {
  if (n <= maxRows) return Array.from({ length: n }, (_, i) => i);
  const nodes = labels && labels.length === n ? labels.map(nodeOf) : null;
  if (!nodes || nodes.some((x) => x === null)) return evenly(n, maxRows);
  const distinct = [...new Set(nodes as number[])].sort((a, b) => a - b);
  const perNode = Math.ceil(n / distinct.length);
  const most = Math.max(2, Math.floor(maxRows / perNode));
  const keep = new Set(evenly(distinct.length, most).map((i) => distinct[i]!));
  const rows: number[] = [];
  nodes.forEach((node, i) => {
    if (keep.has(node!)) rows.push(i);
  });
  return rows;
}

/**
 * The preview of mode shapes (`shapes[mode][dof]`) at the rows `previewRows` picks.
 * @example shapePreview(result.modes.map((m) => m.shape), labels)
 */
export function shapePreview(
  shapes: readonly ArrayLike<number>[],
  n: number,
  labels: readonly string[] | null,
): ShapePreview {
  const rows = previewRows(n, labels);
  return {
    dofs: rows.map((i) => i + 1),
    shapes: rows.map((i) => shapes.map((s) => s[i]!)),
    dofLabels: labels && labels.length === n ? rows.map((i) => labels[i]!) : null,
  };
}
