import type { SparseSymmetricMatrix } from '../types';

/**
 * The adjacency graph of a symmetric matrix (both directions, no self loops), in compressed form:
 * the neighbours of vertex v are `adj[xadj[v] .. xadj[v+1]-1]`, sorted ascending.
 */
export interface AdjacencyGraph {
  readonly n: number;
  readonly xadj: Int32Array;
  readonly adj: Int32Array;
}

/** Builds the symmetric adjacency graph of the lower-triangle CSC pattern of `A`. */
export function adjacencyOf(A: SparseSymmetricMatrix): AdjacencyGraph {
  const { n, colPtr, rowIdx } = A;
  const deg = new Int32Array(n);
  for (let j = 0; j < n; j++) {
    for (let p = colPtr[j]!; p < colPtr[j + 1]!; p++) {
      const i = rowIdx[p]!;
      if (i !== j) {
        deg[i]!++;
        deg[j]!++;
      }
    }
  }
  const xadj = new Int32Array(n + 1);
  for (let v = 0; v < n; v++) xadj[v + 1] = xadj[v]! + deg[v]!;
  const adj = new Int32Array(xadj[n]!);
  const next = xadj.slice(0, n);
  // Column j in ascending order: every vertex first receives its smaller neighbours (from earlier
  // columns), then its larger ones (from its own column), so each list comes out sorted.
  for (let j = 0; j < n; j++) {
    for (let p = colPtr[j]!; p < colPtr[j + 1]!; p++) {
      const i = rowIdx[p]!;
      if (i !== j) {
        adj[next[i]!++] = j;
        adj[next[j]!++] = i;
      }
    }
  }
  return { n, xadj, adj };
}

/**
 * Merges indistinguishable vertices (identical closed neighbourhoods, e.g. the ux/uy/rz degrees of
 * freedom of one node) into one weighted vertex. Returns the quotient graph, the weight of each
 * merged vertex and, for every merged vertex, its original vertices.
 */
export function compressGraph(g: AdjacencyGraph): {
  graph: AdjacencyGraph;
  weight: Int32Array;
  memberPtr: Int32Array;
  members: Int32Array;
} {
  const { n, xadj, adj } = g;
  // Hash of the closed neighbourhood; equal hashes are then compared exactly.
  const hash = new Float64Array(n);
  for (let v = 0; v < n; v++) {
    let h = v + 1;
    let s = (v + 1) * (v + 1);
    for (let p = xadj[v]!; p < xadj[v + 1]!; p++) {
      const u = adj[p]! + 1;
      h += u;
      s = (s + u * u) % 1_000_000_007;
    }
    hash[v] = (h % 1_000_000_007) * 1_000_003 + s + (xadj[v + 1]! - xadj[v]!) * 1e-3;
  }
  const order = Array.from({ length: n }, (_, i) => i);
  order.sort((a, b) => hash[a]! - hash[b]! || a - b);
  const rep = new Int32Array(n).fill(-1);
  const closedEqual = (a: number, b: number): boolean => {
    // Closed neighbourhoods N[a] = adj(a) ∪ {a}; with a, b adjacent they are equal iff
    // adj(a) \ {b} == adj(b) \ {a}.
    const da = xadj[a + 1]! - xadj[a]!;
    const db = xadj[b + 1]! - xadj[b]!;
    if (da !== db) return false;
    let pa = xadj[a]!;
    let pb = xadj[b]!;
    const ea = xadj[a + 1]!;
    const eb = xadj[b + 1]!;
    let adjacent = false;
    while (pa < ea || pb < eb) {
      const x = pa < ea ? adj[pa]! : -1;
      const y = pb < eb ? adj[pb]! : -1;
      if (x === b) {
        adjacent = true;
        pa++;
        continue;
      }
      if (y === a) {
        pb++;
        continue;
      }
      if (x !== y) return false;
      pa++;
      pb++;
    }
    return adjacent;
  };
  for (let s = 0; s < n;) {
    let e = s + 1;
    while (e < n && hash[order[e]!] === hash[order[s]!]) e++;
    for (let a = s; a < e; a++) {
      const va = order[a]!;
      if (rep[va] !== -1) continue;
      rep[va] = va;
      for (let b = a + 1; b < e; b++) {
        const vb = order[b]!;
        if (rep[vb] === -1 && closedEqual(va, vb)) rep[vb] = va;
      }
    }
    s = e;
  }
  const newId = new Int32Array(n).fill(-1);
  let m = 0;
  for (let v = 0; v < n; v++) if (rep[v] === v) newId[v] = m++;
  const weight = new Int32Array(m);
  for (let v = 0; v < n; v++) weight[newId[rep[v]!]!]!++;
  const memberPtr = new Int32Array(m + 1);
  for (let c = 0; c < m; c++) memberPtr[c + 1] = memberPtr[c]! + weight[c]!;
  const members = new Int32Array(n);
  const fill = memberPtr.slice(0, m);
  for (let v = 0; v < n; v++) members[fill[newId[rep[v]!]!]!++] = v;
  // Quotient adjacency: neighbours of the representative, mapped and de-duplicated.
  const mark = new Int32Array(m).fill(-1);
  const cx = new Int32Array(m + 1);
  const tmp: number[] = [];
  const lists: Int32Array[] = [];
  for (let v = 0; v < n; v++) {
    if (rep[v] !== v) continue;
    const c = newId[v]!;
    tmp.length = 0;
    mark[c] = c;
    for (let p = xadj[v]!; p < xadj[v + 1]!; p++) {
      const u = newId[rep[adj[p]!]!]!;
      if (mark[u] !== c) {
        mark[u] = c;
        tmp.push(u);
      }
    }
    lists.push(Int32Array.from(tmp));
    cx[c + 1] = tmp.length;
  }
  for (let c = 0; c < m; c++) cx[c + 1] = cx[c]! + cx[c + 1]!;
  const cadj = new Int32Array(cx[m]!);
  for (let c = 0; c < m; c++) cadj.set(lists[c]!, cx[c]!);
  return { graph: { n: m, xadj: cx, adj: cadj }, weight, memberPtr, members };
}
