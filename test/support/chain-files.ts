// A fixed–free chain of n equal masses m and springs k written as an analysis program would
// export it, as Matrix Market text: K tridiagonal (2k on the diagonal, k at the free end, −k
// beside it, lower triangle stored), M = m I. Its closed form is REFERENCES.md item 2:
// ω_j = 2 √(k/m) sin((2j − 1) π / (2 (2n + 1))).

/** K and M of the chain as 'coordinate real symmetric' Matrix Market text. */
export function chainMatrixMarket(n: number, k: number, m: number): { K: string; M: string } {
  const K = ['%%MatrixMarket matrix coordinate real symmetric', `${n} ${n} ${2 * n - 1}`];
  for (let i = 1; i <= n; i++) {
    K.push(`${i} ${i} ${i === n ? k : 2 * k}`);
    if (i < n) K.push(`${i + 1} ${i} ${-k}`);
  }
  const M = ['%%MatrixMarket matrix coordinate real symmetric', `${n} ${n} ${n}`];
  for (let i = 1; i <= n; i++) M.push(`${i} ${i} ${m}`);
  return { K: K.join('\n') + '\n', M: M.join('\n') + '\n' };
}

/** ω_j of the chain, rad/s (the closed form above). */
export function chainOmega(n: number, k: number, m: number, j: number): number {
  return 2 * Math.sqrt(k / m) * Math.sin(((2 * j - 1) * Math.PI) / (2 * (2 * n + 1)));
}
