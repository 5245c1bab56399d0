import type { SparseSymmetricMatrix } from '../types';
import { adjacencyOf, compressGraph, type AdjacencyGraph } from './graph';

export interface OrderingOptions {
  /** Subgraphs of at most this many unknowns are not dissected further. Default 64. */
  readonly leafSize?: number;
}

/**
 * A fill-reducing ordering by nested dissection (George 1973; George & Liu, *Computer Solution of
 * Large Sparse Positive Definite Systems*, 1981): the graph is split by a vertex separator taken
 * from a breadth-first level structure rooted at a pseudo-peripheral vertex, the two halves are
 * ordered first (recursively) and the separator last. Separators are thinned by moving vertices
 * that touch only one side. Indistinguishable unknowns (the degrees of freedom of one node) are
 * merged before ordering, so the work is done on the node graph.
 *
 * Returns `perm` with `perm[k]` = the original index of the k-th pivot.
 *
 * @example
 * const perm = orderNestedDissection(A); // then factor P A Pᵀ
 */
export function orderNestedDissection(
  A: SparseSymmetricMatrix,
  options: OrderingOptions = {},
): Int32Array {
  const full = adjacencyOf(A);
  const { graph, weight, memberPtr, members } = compressGraph(full);
  const order = dissect(graph, weight, options.leafSize ?? 64);
  const perm = new Int32Array(A.n);
  let k = 0;
  for (let t = 0; t < order.length; t++) {
    const c = order[t]!;
    for (let p = memberPtr[c]!; p < memberPtr[c + 1]!; p++) perm[k++] = members[p]!;
  }
  return perm;
}

interface Task {
  verts: Int32Array;
  start: number;
}

function dissect(g: AdjacencyGraph, weight: Int32Array, leafSize: number): Int32Array {
  const { n, xadj, adj } = g;
  const out = new Int32Array(n);
  const label = new Int32Array(n); // subset id of each vertex; -1 once placed in the output
  const level = new Int32Array(n).fill(-1);
  const queue = new Int32Array(n);
  let nextLabel = 1;
  label.fill(0);
  const stack: Task[] = [{ verts: Int32Array.from({ length: n }, (_, i) => i), start: 0 }];

  // Breadth-first search from `root` within the vertices labelled `lab`; returns the number of
  // vertices reached (they are queue[0..count-1], level set).
  const bfs = (root: number, lab: number): number => {
    let head = 0;
    let tail = 0;
    queue[tail++] = root;
    level[root] = 0;
    while (head < tail) {
      const v = queue[head++]!;
      const lv = level[v]! + 1;
      for (let p = xadj[v]!; p < xadj[v + 1]!; p++) {
        const u = adj[p]!;
        if (label[u] === lab && level[u] === -1) {
          level[u] = lv;
          queue[tail++] = u;
        }
      }
    }
    return tail;
  };
  const clearLevels = (count: number): void => {
    for (let t = 0; t < count; t++) level[queue[t]!] = -1;
  };
  const place = (verts: Int32Array, start: number): void => {
    out.set(verts, start);
    for (let t = 0; t < verts.length; t++) label[verts[t]!] = -1;
  };

  while (stack.length > 0) {
    const task = stack.pop()!;
    const { verts, start } = task;
    const lab = label[verts[0]!]!;
    let totalWeight = 0;
    for (let t = 0; t < verts.length; t++) totalWeight += weight[verts[t]!]!;
    if (totalWeight <= leafSize || verts.length < 8) {
      place(verts, start);
      continue;
    }
    // Connected components first: each becomes its own task.
    const reached = bfs(verts[0]!, lab);
    if (reached < verts.length) {
      const comp = queue.slice(0, reached);
      clearLevels(reached);
      const compLabel = nextLabel++;
      for (let t = 0; t < comp.length; t++) label[comp[t]!] = compLabel;
      const rest = new Int32Array(verts.length - reached);
      let r = 0;
      for (let t = 0; t < verts.length; t++) if (label[verts[t]!] === lab) rest[r++] = verts[t]!;
      const restLabel = nextLabel++;
      for (let t = 0; t < rest.length; t++) label[rest[t]!] = restLabel;
      stack.push({ verts: comp, start });
      stack.push({ verts: rest, start: start + comp.length });
      continue;
    }
    // Pseudo-peripheral root (George & Liu): restart from a least-connected vertex of the last
    // level while the eccentricity grows.
    let root = queue[reached - 1]!;
    let ecc = level[root]!;
    clearLevels(reached);
    for (let pass = 0; pass < 4; pass++) {
      const cnt = bfs(root, lab);
      const last = level[queue[cnt - 1]!]!;
      let best = queue[cnt - 1]!;
      let bestDeg = Infinity;
      for (let t = cnt - 1; t >= 0 && level[queue[t]!] === last; t--) {
        const v = queue[t]!;
        const d = xadj[v + 1]! - xadj[v]!;
        if (d < bestDeg) {
          bestDeg = d;
          best = v;
        }
      }
      clearLevels(cnt);
      if (pass > 0 && last <= ecc) break;
      ecc = last;
      root = best;
    }
    const cnt = bfs(root, lab);
    const nLevels = level[queue[cnt - 1]!]! + 1;
    if (nLevels < 3) {
      clearLevels(cnt);
      place(verts, start);
      continue;
    }
    const levelWeight = new Float64Array(nLevels);
    for (let t = 0; t < cnt; t++) levelWeight[level[queue[t]!]!]! += weight[queue[t]!]!;
    // The lightest level that leaves both sides with at least 30 % of the rest; the middle level
    // by weight when none qualifies.
    let sepLevel = -1;
    let below = levelWeight[0]!;
    let bestScore = Infinity;
    let middle = 1;
    for (let l = 1; l < nLevels - 1; l++) {
      const s = levelWeight[l]!;
      const above = totalWeight - below - s;
      const rest = totalWeight - s;
      if (below <= totalWeight / 2) middle = l;
      if (Math.min(below, above) >= 0.3 * rest && s < bestScore) {
        bestScore = s;
        sepLevel = l;
      }
      below += s;
    }
    if (sepLevel < 0) sepLevel = middle;
    // side: 0 = A (below), 1 = separator, 2 = B (above); stored in `level` temporarily.
    const side = (v: number): number => {
      const l = level[v]!;
      return l < sepLevel ? 0 : l === sepLevel ? 1 : 2;
    };
    const sideOf = new Int8Array(cnt);
    for (let t = 0; t < cnt; t++) sideOf[t] = side(queue[t]!);
    // Thinning: a separator vertex with no neighbour in B joins A; then one with no neighbour in A
    // joins B. Both moves keep A and B disconnected.
    const sideArr = level; // reuse storage: side codes written back into `level`
    for (let t = 0; t < cnt; t++) sideArr[queue[t]!] = sideOf[t]!;
    for (let pass = 0; pass < 2; pass++) {
      const forbidden = pass === 0 ? 2 : 0;
      const target = pass === 0 ? 0 : 2;
      for (let t = 0; t < cnt; t++) {
        const v = queue[t]!;
        if (sideArr[v] !== 1) continue;
        let touches = false;
        for (let p = xadj[v]!; p < xadj[v + 1]!; p++) {
          const u = adj[p]!;
          if (label[u] === lab && sideArr[u] === forbidden) {
            touches = true;
            break;
          }
        }
        if (!touches) sideArr[v] = target;
      }
    }
    let na = 0;
    let ns = 0;
    for (let t = 0; t < cnt; t++) {
      const s = sideArr[queue[t]!]!;
      if (s === 0) na++;
      else if (s === 1) ns++;
    }
    const nb = cnt - na - ns;
    if (na === 0 || nb === 0) {
      clearLevels(cnt);
      place(verts, start);
      continue;
    }
    const partA = new Int32Array(na);
    const partB = new Int32Array(nb);
    const sep = new Int32Array(ns);
    let ia = 0;
    let ib = 0;
    let is = 0;
    for (let t = 0; t < cnt; t++) {
      const v = queue[t]!;
      const s = sideArr[v]!;
      if (s === 0) partA[ia++] = v;
      else if (s === 1) sep[is++] = v;
      else partB[ib++] = v;
    }
    clearLevels(cnt);
    const labA = nextLabel++;
    const labB = nextLabel++;
    for (let t = 0; t < na; t++) label[partA[t]!] = labA;
    for (let t = 0; t < nb; t++) label[partB[t]!] = labB;
    sep.sort();
    place(sep, start + na + nb);
    stack.push({ verts: partA, start });
    stack.push({ verts: partB, start: start + na });
  }
  return out;
}
