/**
 * Reverse Cuthill–McKee ordering for the profile (skyline) factorization.
 * Cuthill & McKee (1969); the reversal is George's (1971); the pseudo-peripheral start node is
 * George & Liu, *Computer Solution of Large Sparse Positive Definite Systems* (1981), §4.3.
 */
import type { SparseSymmetricMatrix } from './types';

/** Adjacency lists (both directions, diagonal left out) of a sparse symmetric pattern. */
function adjacency(A: SparseSymmetricMatrix): { ptr: Int32Array; adj: Int32Array } {
  const n = A.n;
  const deg = new Int32Array(n + 1);
  for (let j = 0; j < n; j++) {
    for (let p = A.colPtr[j] as number; p < (A.colPtr[j + 1] as number); p++) {
      const i = A.rowIdx[p] as number;
      if (i !== j) {
        deg[i + 1] = (deg[i + 1] as number) + 1;
        deg[j + 1] = (deg[j + 1] as number) + 1;
      }
    }
  }
  for (let i = 0; i < n; i++) deg[i + 1] = (deg[i + 1] as number) + (deg[i] as number);
  const next = deg.slice(0, n);
  const adj = new Int32Array(deg[n] as number);
  for (let j = 0; j < n; j++) {
    for (let p = A.colPtr[j] as number; p < (A.colPtr[j + 1] as number); p++) {
      const i = A.rowIdx[p] as number;
      if (i !== j) {
        adj[next[i] as number] = j;
        next[i] = (next[i] as number) + 1;
        adj[next[j] as number] = i;
        next[j] = (next[j] as number) + 1;
      }
    }
  }
  return { ptr: deg, adj };
}

/**
 * Reverse Cuthill–McKee permutation: `perm[k]` is the original index of the k-th unknown in the
 * new order. Disconnected parts are ordered one after another.
 * @example const perm = reverseCuthillMcKee(K);
 */
export function reverseCuthillMcKee(A: SparseSymmetricMatrix): Int32Array {
  const n = A.n;
  const { ptr, adj } = adjacency(A);
  const degree = (v: number) => (ptr[v + 1] as number) - (ptr[v] as number);
  const visited = new Uint8Array(n);
  const order = new Int32Array(n);
  let filled = 0;
  const level = new Int32Array(n);
  const queue = new Int32Array(n);

  // BFS from root restricted to unvisited nodes; returns [depth, last-level node of min degree].
  const bfsDepth = (root: number): [number, number] => {
    const mark = new Map<number, number>();
    let head = 0;
    let tail = 0;
    queue[tail++] = root;
    mark.set(root, 0);
    let depth = 0;
    while (head < tail) {
      const v = queue[head++] as number;
      const lv = mark.get(v) as number;
      depth = Math.max(depth, lv);
      for (let p = ptr[v] as number; p < (ptr[v + 1] as number); p++) {
        const u = adj[p] as number;
        if (!visited[u] && !mark.has(u)) {
          mark.set(u, lv + 1);
          queue[tail++] = u;
        }
      }
    }
    let best = root;
    let bestDeg = Infinity;
    for (let k = 0; k < tail; k++) {
      const v = queue[k] as number;
      if (mark.get(v) === depth && degree(v) < bestDeg) {
        bestDeg = degree(v);
        best = v;
      }
    }
    return [depth, best];
  };

  for (let s = 0; s < n; s++) {
    if (visited[s]) continue;
    // pseudo-peripheral node of this component
    let root = s;
    let [depth, cand] = bfsDepth(root);
    for (let it = 0; it < 5; it++) {
      const [d2, c2] = bfsDepth(cand);
      if (d2 <= depth) break;
      root = cand;
      depth = d2;
      cand = c2;
    }
    // Cuthill–McKee from root
    let head = filled;
    order[filled++] = root;
    visited[root] = 1;
    level[root] = 0;
    while (head < filled) {
      const v = order[head++] as number;
      const nbrs: number[] = [];
      for (let p = ptr[v] as number; p < (ptr[v + 1] as number); p++) {
        const u = adj[p] as number;
        if (!visited[u]) {
          visited[u] = 1;
          nbrs.push(u);
        }
      }
      nbrs.sort((a, b) => degree(a) - degree(b) || a - b);
      for (const u of nbrs) order[filled++] = u;
    }
  }
  order.reverse();
  return order;
}

/**
 * First column of each row of a sparse symmetric matrix under a permutation (its envelope): the
 * row i of the permuted matrix has no entry left of first[i] (George & Liu, *Computer Solution of
 * Large Sparse Positive Definite Systems*, 1981, §4.1).
 * @example envelopeFirst(K, reverseCuthillMcKee(K))
 */
export function envelopeFirst(A: SparseSymmetricMatrix, perm?: Int32Array | null): Int32Array {
  const n = A.n;
  const inv = new Int32Array(n);
  for (let k = 0; k < n; k++) inv[perm ? (perm[k] as number) : k] = k;
  const first = new Int32Array(n);
  for (let i = 0; i < n; i++) first[i] = i;
  for (let j = 0; j < n; j++) {
    for (let p = A.colPtr[j] as number; p < (A.colPtr[j + 1] as number); p++) {
      const a = inv[A.rowIdx[p] as number] as number;
      const b = inv[j] as number;
      const r = a > b ? a : b;
      const c = a > b ? b : a;
      if (c < (first[r] as number)) first[r] = c;
    }
  }
  return first;
}

/**
 * Profile (envelope) size of a sparse symmetric matrix under a permutation: Σ_i (i − first_i + 1),
 * the number of entries a skyline factor stores.
 * @example profileSize(K, reverseCuthillMcKee(K))
 */
export function profileSize(A: SparseSymmetricMatrix, perm?: Int32Array): number {
  const first = envelopeFirst(A, perm);
  let s = 0;
  for (let i = 0; i < A.n; i++) s += i - (first[i] as number) + 1;
  return s;
}
