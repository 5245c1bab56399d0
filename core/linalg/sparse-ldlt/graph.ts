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
  // Indistinguishable vertices are adjacent (each lies in the other's closed neighbourhood), so
  // each vertex is compared only with its smaller neighbours of equal degree and equal hash.
  const hash = new Float64Array(n);
  for (let v = 0; v < n; v++) {
    let h = v;
    for (let p = xadj[v]!; p < xadj[v + 1]!; p++) h += adj[p]!;
    hash[v] = h;
  }
  const rep = new Int32Array(n).fill(-1);
  const closedEqual = (a: number, b: number): boolean => {
    // With a, b adjacent: N[a] = N[b] iff adj(a) \ {b} == adj(b) \ {a}.
    let pa = xadj[a]!;
    let pb = xadj[b]!;
    const ea = xadj[a + 1]!;
    const eb = xadj[b + 1]!;
    while (pa < ea || pb < eb) {
      const x = pa < ea ? adj[pa]! : -1;
      const y = pb < eb ? adj[pb]! : -1;
      if (x === b) {
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
    return true;
  };
  for (let v = 0; v < n; v++) {
    rep[v] = v;
    const dv = xadj[v + 1]! - xadj[v]!;
    for (let p = xadj[v]!; p < xadj[v + 1]!; p++) {
      const u = adj[p]!;
      if (u >= v) break; // sorted lists: only smaller neighbours
      if (rep[u] !== u || hash[u] !== hash[v] || xadj[u + 1]! - xadj[u]! !== dv) continue;
      if (closedEqual(u, v)) {
        rep[v] = u;
        break;
      }
    }
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
