import { readFileSync } from 'node:fs';
import { readSymmetricMatrix } from './core/linalg/matrix-io';
import { createShiftedPencil } from './core/linalg/sparse-ldlt/shifted';
import { supernodalStructure } from './core/linalg/sparse-ldlt/multifrontal';
import type { SparseSymmetricMatrix } from './core/linalg/types';
const K = readSymmetricMatrix(readFileSync('bench-results/plate-224x112.K.mtx', 'utf8')) as SparseSymmetricMatrix;
const M = readSymmetricMatrix(readFileSync('bench-results/plate-224x112.M.mtx', 'utf8')) as SparseSymmetricMatrix;
const pen = createShiftedPencil(K, M);
let t0 = performance.now();
const sym = pen.symbolic();
console.log('symbolic', (performance.now() - t0).toFixed(0), 'ms, nnzL', sym.factorNonzeros, 'flops', (sym as any).flops ?? (sym as any).flopCount);
const st = supernodalStructure(sym);
const ns = st.first.length - 1;
let schur = 0, piv = 0; const hist = new Map<number, number>();
for (let s = 0; s < ns; s++) { const np = st.first[s + 1]! - st.first[s]!; const nf = st.rowPtr[s + 1]! - st.rowPtr[s]!; const nu = nf - np; schur += nu * (nu + 1) / 2 * np * 2; piv += np * nf * np; const b = np < 4 ? np : np < 16 ? 8 : np < 64 ? 32 : 128; hist.set(b, (hist.get(b) ?? 0) + nu * nu * np); }
console.log('supernodes', ns, 'schur flops', (schur / 1e9).toFixed(2), 'G, pivot flops', (piv / 1e9).toFixed(2), 'G; schur by np bucket', [...hist].map(([k, v]) => `${k}:${(v / 1e9).toFixed(2)}`).join(' '));
let F;
for (let r = 0; r < 3; r++) { t0 = performance.now(); F = pen.factorize(0); console.log('numeric', (performance.now() - t0).toFixed(0), 'ms'); }
const b = new Float64Array(K.n).fill(1);
for (let r = 0; r < 3; r++) { t0 = performance.now(); for (let q = 0; q < 10; q++) F!.solve(b); console.log('10 solves', (performance.now() - t0).toFixed(0), 'ms'); }
