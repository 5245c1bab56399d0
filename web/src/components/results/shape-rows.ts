// The rows of a modes result's shapes as the plot and the paged table read them: every DOF when
// the result kept the shapes in full, else the engine's preview at evenly spaced nodes. Pure
// functions, tested without a browser (test/web/shape-rows.test.ts).
import type { ModesBlockResult } from '../../../../core/index';

export interface ShapeRows {
  /** Rows of the shapes, columns = modes. */
  shapes: number[][];
  /** The 1-based DOF of each row. */
  dofs: number[];
  /** The DOF label of each row when the model came from a generator. */
  labels: string[] | null;
  /** DOFs of the model (more than the rows when only a preview was kept). */
  size: number;
  /** True when the rows are the preview at evenly spaced nodes. */
  preview: boolean;
}

/** The shapes rows of a modes result, or null when it has none. */
export function shapeRows(result: ModesBlockResult): ShapeRows | null {
  if (result.shapes && result.shapes.length > 0) {
    return {
      shapes: result.shapes,
      dofs: result.shapes.map((_, i) => i + 1),
      labels: result.dofLabels,
      size: result.shapes.length,
      preview: false,
    };
  }
  const p = result.shapePreview;
  if (!p || p.shapes.length === 0) return null;
  return {
    shapes: p.shapes,
    dofs: p.dofs,
    labels: p.dofLabels,
    size: result.size ?? p.dofs[p.dofs.length - 1]!,
    preview: true,
  };
}

/** Rows of one page: `from` (inclusive) and `to` (exclusive), the page clamped to those there are. */
export function pageBounds(
  total: number,
  page: number,
  size: number,
): { page: number; pages: number; from: number; to: number } {
  const pages = Math.max(1, Math.ceil(total / size));
  const p = Math.min(Math.max(0, page), pages - 1);
  return { page: p, pages, from: p * size, to: Math.min(total, (p + 1) * size) };
}

/**
 * At most `most` evenly spaced items, the first and the last kept: what a plot draws of a long
 * series (a line through 20 000 points draws no better than through 800 on a 600-pixel chart).
 */
export function decimate<T>(items: readonly T[], most: number): T[] {
  if (items.length <= most) return [...items];
  const step = Math.ceil((items.length - 1) / Math.max(1, most - 1));
  const out: T[] = [];
  for (let i = 0; i < items.length - 1; i += step) out.push(items[i]!);
  out.push(items[items.length - 1]!);
  return out;
}
