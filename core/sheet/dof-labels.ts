/**
 * DOF labels of typed and uploaded matrices (`dofs:` of a matrix block), and the influence
 * vectors a modes block's `direction:` builds from them.
 *
 * A label is `<node>.<component>`: `n12.ux`. The components of an analysis model's nodes are the
 * usual six, in the usual order of a node's DOF numbers (common practice): 1 ux, 2 uy, 3 uz (the
 * translations along x, y, z), 4 rx, 5 ry, 6 rz (the rotations about them). `dofs:` takes
 *
 * - a rule: `per node ux uy uz rx ry rz` — DOFs 1–6 are node 1's, 7–12 node 2's, …;
 * - a DOF map: `from <upload>` — an uploaded CSV or Matrix Market array of two columns, one row
 *   per DOF of the matrix, in its order: node number, component number 1–6 (as above);
 * - the labels themselves, for a typed matrix: `n1.ux, n2.ux, n3.ux`.
 *
 * `direction: x` then gives 1 at every `ux` DOF and 0 elsewhere: the rigid-body translation of
 * the nodes along x with the ground, with no rotation (Chopra, Dynamics of Structures, §9.4,
 * influence vectors). Any other component name (`w`) is a direction of its own.
 */
import { EngineError } from '../errors';

/** The components numbered 1–6 in a DOF map, in the order of a node's DOFs. */
export const DOF_COMPONENTS = ['ux', 'uy', 'uz', 'rx', 'ry', 'rz'] as const;

const COMPONENT = /^[A-Za-z][A-Za-z0-9_]*$/;
const LABEL = /^([A-Za-z0-9_]+)\.([A-Za-z][A-Za-z0-9_]*)$/;

function refuse(message: string): never {
  throw new EngineError('SHEET_PARSE', message);
}

/**
 * Labels from a rule: `components` repeated for nodes 1, 2, … up to `n` DOFs.
 * @throws EngineError MATRIX_SIZE_MISMATCH when `n` is not a whole number of nodes.
 * @example dofLabelsFromRule(['ux', 'rz'], 4) // ['n1.ux', 'n1.rz', 'n2.ux', 'n2.rz']
 */
export function dofLabelsFromRule(
  components: readonly string[],
  n: number,
  what: string,
): string[] {
  const k = components.length;
  if (n % k !== 0) {
    const nodes = Math.floor(n / k);
    const over = n % k;
    throw new EngineError(
      'MATRIX_SIZE_MISMATCH',
      `"dofs: per node ${components.join(' ')}" gives ${k} DOFs to a node, but ${what} has ${n} ` +
        `rows: ${n} is not a whole number of nodes (${nodes} node${nodes === 1 ? '' : 's'} and ` +
        `${over} DOF${over === 1 ? '' : 's'} over). Check the rule against the program's export, or give a DOF map.`,
    );
  }
  const out: string[] = [];
  for (let node = 1; node <= n / k; node++) for (const c of components) out.push(`n${node}.${c}`);
  return out;
}

/**
 * Labels from a DOF map: one row `[node, component 1–6]` per DOF. `line(i)` names the file's line
 * of row i in messages.
 * @throws EngineError SHEET_PARSE naming the row of a bad node or component number.
 * @example dofLabelsFromMap([[12, 1], [12, 6]], 'frame-dofs.csv') // ['n12.ux', 'n12.rz']
 */
export function dofLabelsFromMap(rows: readonly (readonly number[])[], file: string): string[] {
  return rows.map((r, i) => {
    if (r.length !== 2) {
      refuse(`${file}: a DOF map has two columns (node, component 1–6); it has ${r.length}.`);
    }
    const [node, comp] = r as [number, number];
    if (!Number.isInteger(node) || node < 0) {
      refuse(`${file}, row ${i + 1}: the node number ${node} is not a whole number.`);
    }
    const c = DOF_COMPONENTS[comp - 1];
    if (!Number.isInteger(comp) || !c) {
      refuse(
        `${file}, row ${i + 1}: the component ${comp} is not 1–6 (1 ux, 2 uy, 3 uz, 4 rx, 5 ry, 6 rz).`,
      );
    }
    return `n${node}.${c}`;
  });
}

/** Labels written out: `n1.ux, n2.ux` (commas or spaces). */
export function dofLabelsFromList(text: string): string[] {
  const labels = text.split(/[\s,]+/).filter((t) => t !== '');
  for (const l of labels) {
    if (!LABEL.test(l)) {
      refuse(`"${l}" is not a DOF label: write node.component, for example n12.ux.`);
    }
  }
  return labels;
}

/** The components of a rule `per node ux uy uz`, or null when the text is not a rule. */
export function ruleComponents(text: string): string[] | null {
  const m = /^per\s+node\s+(.+)$/i.exec(text.trim());
  if (!m) return null;
  const comps = m[1]!.split(/[\s,]+/).filter((t) => t !== '');
  for (const c of comps) {
    if (!COMPONENT.test(c)) refuse(`"${c}" is not a component name (for example ux, uy, rz).`);
  }
  const dup = comps.find((c, i) => comps.indexOf(c) !== i);
  if (dup) refuse(`"${dup}" is given twice in the rule; each component once per node.`);
  return comps;
}

/** Refuses a repeated label, naming both DOFs. */
export function checkDistinct(labels: readonly string[]): void {
  const seen = new Map<string, number>();
  labels.forEach((l, i) => {
    const first = seen.get(l);
    if (first !== undefined) {
      refuse(`The DOF label ${l} is given to DOF ${first + 1} and to DOF ${i + 1}; each DOF once.`);
    }
    seen.set(l, i);
  });
}

/** The component of a label (after its last dot), or null. */
function componentOf(label: string): string | null {
  return LABEL.exec(label)?.[2] ?? null;
}

/** The direction a component moves the model along: `ux` → `x`; others are their own. */
function directionOf(component: string): string | null {
  if (/^u[xyz]$/i.test(component)) return component.slice(1).toLowerCase();
  if (/^r[xyz]$/i.test(component)) return null;
  return component;
}

/**
 * The directions labelled DOFs offer: x, y, z for the translations present, in that order, then
 * any other component (rotations are not ground-motion directions).
 * @example labelledDirections(['n1.ux', 'n1.rz', 'n2.ux']) // ['x']
 */
export function labelledDirections(labels: readonly string[]): string[] {
  const out = new Set<string>();
  for (const l of labels) {
    const c = componentOf(l);
    const d = c ? directionOf(c) : null;
    if (d) out.add(d);
  }
  const order = ['x', 'y', 'z'];
  return [...out].sort((a, b) => {
    const ia = order.indexOf(a);
    const ib = order.indexOf(b);
    return (ia < 0 ? 3 : ia) - (ib < 0 ? 3 : ib) || a.localeCompare(b);
  });
}

/**
 * The influence vector of `direction` over labelled DOFs: 1 at each DOF that moves along it
 * (`ux` for x, or the component named), 0 elsewhere (Chopra §9.4). All zeros when none does.
 * @example labelledInfluence(['n1.ux', 'n1.rz', 'n2.ux'], 'x') // Float64Array [1, 0, 1]
 */
export function labelledInfluence(labels: readonly string[], direction: string): Float64Array {
  const d = direction.toLowerCase();
  return Float64Array.from(labels, (l) => {
    const c = componentOf(l);
    return c !== null && directionOf(c)?.toLowerCase() === d ? 1 : 0;
  });
}

/** The distinct components of labelled DOFs, for messages. */
export function labelledComponents(labels: readonly string[]): string[] {
  return [...new Set(labels.map((l) => componentOf(l)).filter((c): c is string => c !== null))];
}
