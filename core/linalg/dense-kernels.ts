/**
 * The one matrix-product kernel: C += s · P U on row-major blocks, where a row of C is updated
 * with a combination of `terms` rows of U. It serves the rank-2k update of the dense solver's
 * blocked tridiagonalization and both products of its compact-WY back-transformation, the Schur
 * complements of the sparse LDLᵀ's large fronts, and ΦᵀMΦ over many modes.
 *
 * Register blocking: sixteen rows of C and eight rows of U per pass keep 128 coefficients of P in
 * locals (most of them spilled to the stack, from where they reload at L1 speed) and update
 * sixteen entries of C from eight loads of U; the rows left over go eight, four and one at a time
 * with four rows of U. The shape was chosen by measuring 2 × 4 up to 16 × 16 blocks on the 2-core
 * development machine (Node 20): 16 × 8 about 9.5 GFlop/s, 8 × 8 about 8.5, 8 × 4 about 7 (on
 * 968 × 32 × 500 and 32 × 960 × 500 products held in cache), against about 1 GFlop/s for a
 * rank-one-at-a-time loop. Larger blocks lost to the size of the loop body.
 */

/** Where a row-major block starts and how far apart its rows are. */
export interface Block {
  readonly data: Float64Array;
  readonly offset: number;
  readonly stride: number;
}

/**
 * C[i, c] += s · Σ_k P[i, k] · U[k, c] for i < rows, k < terms, c0 ≤ c < c1.
 * @example multiplyAdd(C, P, U, n, 32, 0, n, -1); // C −= P U
 */
export function multiplyAdd(
  C: Block,
  P: Block,
  U: Block,
  rows: number,
  terms: number,
  c0: number,
  c1: number,
  s: number,
): void {
  const cd = C.data;
  const pd = P.data;
  const ud = U.data;
  const cs = C.stride;
  const ps = P.stride;
  const us = U.stride;
  let i = 0;
  for (; i + 15 < rows; i += 16) {
    const r0 = C.offset + i * cs;
    const q0 = P.offset + i * ps;
    const r1 = r0 + cs;
    const q1 = q0 + ps;
    const r2 = r1 + cs;
    const q2 = q1 + ps;
    const r3 = r2 + cs;
    const q3 = q2 + ps;
    const r4 = r3 + cs;
    const q4 = q3 + ps;
    const r5 = r4 + cs;
    const q5 = q4 + ps;
    const r6 = r5 + cs;
    const q6 = q5 + ps;
    const r7 = r6 + cs;
    const q7 = q6 + ps;
    const r8 = r7 + cs;
    const q8 = q7 + ps;
    const r9 = r8 + cs;
    const q9 = q8 + ps;
    const r10 = r9 + cs;
    const q10 = q9 + ps;
    const r11 = r10 + cs;
    const q11 = q10 + ps;
    const r12 = r11 + cs;
    const q12 = q11 + ps;
    const r13 = r12 + cs;
    const q13 = q12 + ps;
    const r14 = r13 + cs;
    const q14 = q13 + ps;
    const r15 = r14 + cs;
    const q15 = q14 + ps;
    let k = 0;
    for (; k + 7 < terms; k += 8) {
      const u = U.offset + k * us;
      const a0_0 = s * (pd[q0 + k] as number);
      const a0_1 = s * (pd[q0 + k + 1] as number);
      const a0_2 = s * (pd[q0 + k + 2] as number);
      const a0_3 = s * (pd[q0 + k + 3] as number);
      const a0_4 = s * (pd[q0 + k + 4] as number);
      const a0_5 = s * (pd[q0 + k + 5] as number);
      const a0_6 = s * (pd[q0 + k + 6] as number);
      const a0_7 = s * (pd[q0 + k + 7] as number);
      const a1_0 = s * (pd[q1 + k] as number);
      const a1_1 = s * (pd[q1 + k + 1] as number);
      const a1_2 = s * (pd[q1 + k + 2] as number);
      const a1_3 = s * (pd[q1 + k + 3] as number);
      const a1_4 = s * (pd[q1 + k + 4] as number);
      const a1_5 = s * (pd[q1 + k + 5] as number);
      const a1_6 = s * (pd[q1 + k + 6] as number);
      const a1_7 = s * (pd[q1 + k + 7] as number);
      const a2_0 = s * (pd[q2 + k] as number);
      const a2_1 = s * (pd[q2 + k + 1] as number);
      const a2_2 = s * (pd[q2 + k + 2] as number);
      const a2_3 = s * (pd[q2 + k + 3] as number);
      const a2_4 = s * (pd[q2 + k + 4] as number);
      const a2_5 = s * (pd[q2 + k + 5] as number);
      const a2_6 = s * (pd[q2 + k + 6] as number);
      const a2_7 = s * (pd[q2 + k + 7] as number);
      const a3_0 = s * (pd[q3 + k] as number);
      const a3_1 = s * (pd[q3 + k + 1] as number);
      const a3_2 = s * (pd[q3 + k + 2] as number);
      const a3_3 = s * (pd[q3 + k + 3] as number);
      const a3_4 = s * (pd[q3 + k + 4] as number);
      const a3_5 = s * (pd[q3 + k + 5] as number);
      const a3_6 = s * (pd[q3 + k + 6] as number);
      const a3_7 = s * (pd[q3 + k + 7] as number);
      const a4_0 = s * (pd[q4 + k] as number);
      const a4_1 = s * (pd[q4 + k + 1] as number);
      const a4_2 = s * (pd[q4 + k + 2] as number);
      const a4_3 = s * (pd[q4 + k + 3] as number);
      const a4_4 = s * (pd[q4 + k + 4] as number);
      const a4_5 = s * (pd[q4 + k + 5] as number);
      const a4_6 = s * (pd[q4 + k + 6] as number);
      const a4_7 = s * (pd[q4 + k + 7] as number);
      const a5_0 = s * (pd[q5 + k] as number);
      const a5_1 = s * (pd[q5 + k + 1] as number);
      const a5_2 = s * (pd[q5 + k + 2] as number);
      const a5_3 = s * (pd[q5 + k + 3] as number);
      const a5_4 = s * (pd[q5 + k + 4] as number);
      const a5_5 = s * (pd[q5 + k + 5] as number);
      const a5_6 = s * (pd[q5 + k + 6] as number);
      const a5_7 = s * (pd[q5 + k + 7] as number);
      const a6_0 = s * (pd[q6 + k] as number);
      const a6_1 = s * (pd[q6 + k + 1] as number);
      const a6_2 = s * (pd[q6 + k + 2] as number);
      const a6_3 = s * (pd[q6 + k + 3] as number);
      const a6_4 = s * (pd[q6 + k + 4] as number);
      const a6_5 = s * (pd[q6 + k + 5] as number);
      const a6_6 = s * (pd[q6 + k + 6] as number);
      const a6_7 = s * (pd[q6 + k + 7] as number);
      const a7_0 = s * (pd[q7 + k] as number);
      const a7_1 = s * (pd[q7 + k + 1] as number);
      const a7_2 = s * (pd[q7 + k + 2] as number);
      const a7_3 = s * (pd[q7 + k + 3] as number);
      const a7_4 = s * (pd[q7 + k + 4] as number);
      const a7_5 = s * (pd[q7 + k + 5] as number);
      const a7_6 = s * (pd[q7 + k + 6] as number);
      const a7_7 = s * (pd[q7 + k + 7] as number);
      const a8_0 = s * (pd[q8 + k] as number);
      const a8_1 = s * (pd[q8 + k + 1] as number);
      const a8_2 = s * (pd[q8 + k + 2] as number);
      const a8_3 = s * (pd[q8 + k + 3] as number);
      const a8_4 = s * (pd[q8 + k + 4] as number);
      const a8_5 = s * (pd[q8 + k + 5] as number);
      const a8_6 = s * (pd[q8 + k + 6] as number);
      const a8_7 = s * (pd[q8 + k + 7] as number);
      const a9_0 = s * (pd[q9 + k] as number);
      const a9_1 = s * (pd[q9 + k + 1] as number);
      const a9_2 = s * (pd[q9 + k + 2] as number);
      const a9_3 = s * (pd[q9 + k + 3] as number);
      const a9_4 = s * (pd[q9 + k + 4] as number);
      const a9_5 = s * (pd[q9 + k + 5] as number);
      const a9_6 = s * (pd[q9 + k + 6] as number);
      const a9_7 = s * (pd[q9 + k + 7] as number);
      const a10_0 = s * (pd[q10 + k] as number);
      const a10_1 = s * (pd[q10 + k + 1] as number);
      const a10_2 = s * (pd[q10 + k + 2] as number);
      const a10_3 = s * (pd[q10 + k + 3] as number);
      const a10_4 = s * (pd[q10 + k + 4] as number);
      const a10_5 = s * (pd[q10 + k + 5] as number);
      const a10_6 = s * (pd[q10 + k + 6] as number);
      const a10_7 = s * (pd[q10 + k + 7] as number);
      const a11_0 = s * (pd[q11 + k] as number);
      const a11_1 = s * (pd[q11 + k + 1] as number);
      const a11_2 = s * (pd[q11 + k + 2] as number);
      const a11_3 = s * (pd[q11 + k + 3] as number);
      const a11_4 = s * (pd[q11 + k + 4] as number);
      const a11_5 = s * (pd[q11 + k + 5] as number);
      const a11_6 = s * (pd[q11 + k + 6] as number);
      const a11_7 = s * (pd[q11 + k + 7] as number);
      const a12_0 = s * (pd[q12 + k] as number);
      const a12_1 = s * (pd[q12 + k + 1] as number);
      const a12_2 = s * (pd[q12 + k + 2] as number);
      const a12_3 = s * (pd[q12 + k + 3] as number);
      const a12_4 = s * (pd[q12 + k + 4] as number);
      const a12_5 = s * (pd[q12 + k + 5] as number);
      const a12_6 = s * (pd[q12 + k + 6] as number);
      const a12_7 = s * (pd[q12 + k + 7] as number);
      const a13_0 = s * (pd[q13 + k] as number);
      const a13_1 = s * (pd[q13 + k + 1] as number);
      const a13_2 = s * (pd[q13 + k + 2] as number);
      const a13_3 = s * (pd[q13 + k + 3] as number);
      const a13_4 = s * (pd[q13 + k + 4] as number);
      const a13_5 = s * (pd[q13 + k + 5] as number);
      const a13_6 = s * (pd[q13 + k + 6] as number);
      const a13_7 = s * (pd[q13 + k + 7] as number);
      const a14_0 = s * (pd[q14 + k] as number);
      const a14_1 = s * (pd[q14 + k + 1] as number);
      const a14_2 = s * (pd[q14 + k + 2] as number);
      const a14_3 = s * (pd[q14 + k + 3] as number);
      const a14_4 = s * (pd[q14 + k + 4] as number);
      const a14_5 = s * (pd[q14 + k + 5] as number);
      const a14_6 = s * (pd[q14 + k + 6] as number);
      const a14_7 = s * (pd[q14 + k + 7] as number);
      const a15_0 = s * (pd[q15 + k] as number);
      const a15_1 = s * (pd[q15 + k + 1] as number);
      const a15_2 = s * (pd[q15 + k + 2] as number);
      const a15_3 = s * (pd[q15 + k + 3] as number);
      const a15_4 = s * (pd[q15 + k + 4] as number);
      const a15_5 = s * (pd[q15 + k + 5] as number);
      const a15_6 = s * (pd[q15 + k + 6] as number);
      const a15_7 = s * (pd[q15 + k + 7] as number);
      for (let c = c0; c < c1; c++) {
        const u0 = ud[u + c] as number;
        const u1 = ud[u + us + c] as number;
        const u2 = ud[u + 2 * us + c] as number;
        const u3 = ud[u + 3 * us + c] as number;
        const u4 = ud[u + 4 * us + c] as number;
        const u5 = ud[u + 5 * us + c] as number;
        const u6 = ud[u + 6 * us + c] as number;
        const u7 = ud[u + 7 * us + c] as number;
        cd[r0 + c] =
          (cd[r0 + c] as number) +
          (a0_0 * u0 +
            a0_1 * u1 +
            (a0_2 * u2 + a0_3 * u3) +
            (a0_4 * u4 + a0_5 * u5 + (a0_6 * u6 + a0_7 * u7)));
        cd[r1 + c] =
          (cd[r1 + c] as number) +
          (a1_0 * u0 +
            a1_1 * u1 +
            (a1_2 * u2 + a1_3 * u3) +
            (a1_4 * u4 + a1_5 * u5 + (a1_6 * u6 + a1_7 * u7)));
        cd[r2 + c] =
          (cd[r2 + c] as number) +
          (a2_0 * u0 +
            a2_1 * u1 +
            (a2_2 * u2 + a2_3 * u3) +
            (a2_4 * u4 + a2_5 * u5 + (a2_6 * u6 + a2_7 * u7)));
        cd[r3 + c] =
          (cd[r3 + c] as number) +
          (a3_0 * u0 +
            a3_1 * u1 +
            (a3_2 * u2 + a3_3 * u3) +
            (a3_4 * u4 + a3_5 * u5 + (a3_6 * u6 + a3_7 * u7)));
        cd[r4 + c] =
          (cd[r4 + c] as number) +
          (a4_0 * u0 +
            a4_1 * u1 +
            (a4_2 * u2 + a4_3 * u3) +
            (a4_4 * u4 + a4_5 * u5 + (a4_6 * u6 + a4_7 * u7)));
        cd[r5 + c] =
          (cd[r5 + c] as number) +
          (a5_0 * u0 +
            a5_1 * u1 +
            (a5_2 * u2 + a5_3 * u3) +
            (a5_4 * u4 + a5_5 * u5 + (a5_6 * u6 + a5_7 * u7)));
        cd[r6 + c] =
          (cd[r6 + c] as number) +
          (a6_0 * u0 +
            a6_1 * u1 +
            (a6_2 * u2 + a6_3 * u3) +
            (a6_4 * u4 + a6_5 * u5 + (a6_6 * u6 + a6_7 * u7)));
        cd[r7 + c] =
          (cd[r7 + c] as number) +
          (a7_0 * u0 +
            a7_1 * u1 +
            (a7_2 * u2 + a7_3 * u3) +
            (a7_4 * u4 + a7_5 * u5 + (a7_6 * u6 + a7_7 * u7)));
        cd[r8 + c] =
          (cd[r8 + c] as number) +
          (a8_0 * u0 +
            a8_1 * u1 +
            (a8_2 * u2 + a8_3 * u3) +
            (a8_4 * u4 + a8_5 * u5 + (a8_6 * u6 + a8_7 * u7)));
        cd[r9 + c] =
          (cd[r9 + c] as number) +
          (a9_0 * u0 +
            a9_1 * u1 +
            (a9_2 * u2 + a9_3 * u3) +
            (a9_4 * u4 + a9_5 * u5 + (a9_6 * u6 + a9_7 * u7)));
        cd[r10 + c] =
          (cd[r10 + c] as number) +
          (a10_0 * u0 +
            a10_1 * u1 +
            (a10_2 * u2 + a10_3 * u3) +
            (a10_4 * u4 + a10_5 * u5 + (a10_6 * u6 + a10_7 * u7)));
        cd[r11 + c] =
          (cd[r11 + c] as number) +
          (a11_0 * u0 +
            a11_1 * u1 +
            (a11_2 * u2 + a11_3 * u3) +
            (a11_4 * u4 + a11_5 * u5 + (a11_6 * u6 + a11_7 * u7)));
        cd[r12 + c] =
          (cd[r12 + c] as number) +
          (a12_0 * u0 +
            a12_1 * u1 +
            (a12_2 * u2 + a12_3 * u3) +
            (a12_4 * u4 + a12_5 * u5 + (a12_6 * u6 + a12_7 * u7)));
        cd[r13 + c] =
          (cd[r13 + c] as number) +
          (a13_0 * u0 +
            a13_1 * u1 +
            (a13_2 * u2 + a13_3 * u3) +
            (a13_4 * u4 + a13_5 * u5 + (a13_6 * u6 + a13_7 * u7)));
        cd[r14 + c] =
          (cd[r14 + c] as number) +
          (a14_0 * u0 +
            a14_1 * u1 +
            (a14_2 * u2 + a14_3 * u3) +
            (a14_4 * u4 + a14_5 * u5 + (a14_6 * u6 + a14_7 * u7)));
        cd[r15 + c] =
          (cd[r15 + c] as number) +
          (a15_0 * u0 +
            a15_1 * u1 +
            (a15_2 * u2 + a15_3 * u3) +
            (a15_4 * u4 + a15_5 * u5 + (a15_6 * u6 + a15_7 * u7)));
      }
    }
    for (; k < terms; k++) {
      const u = U.offset + k * us;
      const a0 = s * (pd[q0 + k] as number);
      const a1 = s * (pd[q1 + k] as number);
      const a2 = s * (pd[q2 + k] as number);
      const a3 = s * (pd[q3 + k] as number);
      const a4 = s * (pd[q4 + k] as number);
      const a5 = s * (pd[q5 + k] as number);
      const a6 = s * (pd[q6 + k] as number);
      const a7 = s * (pd[q7 + k] as number);
      const a8 = s * (pd[q8 + k] as number);
      const a9 = s * (pd[q9 + k] as number);
      const a10 = s * (pd[q10 + k] as number);
      const a11 = s * (pd[q11 + k] as number);
      const a12 = s * (pd[q12 + k] as number);
      const a13 = s * (pd[q13 + k] as number);
      const a14 = s * (pd[q14 + k] as number);
      const a15 = s * (pd[q15 + k] as number);
      for (let c = c0; c < c1; c++) {
        const v = ud[u + c] as number;
        cd[r0 + c] = (cd[r0 + c] as number) + a0 * v;
        cd[r1 + c] = (cd[r1 + c] as number) + a1 * v;
        cd[r2 + c] = (cd[r2 + c] as number) + a2 * v;
        cd[r3 + c] = (cd[r3 + c] as number) + a3 * v;
        cd[r4 + c] = (cd[r4 + c] as number) + a4 * v;
        cd[r5 + c] = (cd[r5 + c] as number) + a5 * v;
        cd[r6 + c] = (cd[r6 + c] as number) + a6 * v;
        cd[r7 + c] = (cd[r7 + c] as number) + a7 * v;
        cd[r8 + c] = (cd[r8 + c] as number) + a8 * v;
        cd[r9 + c] = (cd[r9 + c] as number) + a9 * v;
        cd[r10 + c] = (cd[r10 + c] as number) + a10 * v;
        cd[r11 + c] = (cd[r11 + c] as number) + a11 * v;
        cd[r12 + c] = (cd[r12 + c] as number) + a12 * v;
        cd[r13 + c] = (cd[r13 + c] as number) + a13 * v;
        cd[r14 + c] = (cd[r14 + c] as number) + a14 * v;
        cd[r15 + c] = (cd[r15 + c] as number) + a15 * v;
      }
    }
  }
  for (; i + 7 < rows; i += 8) {
    const r0 = C.offset + i * cs;
    const q0 = P.offset + i * ps;
    const r1 = r0 + cs;
    const q1 = q0 + ps;
    const r2 = r1 + cs;
    const q2 = q1 + ps;
    const r3 = r2 + cs;
    const q3 = q2 + ps;
    const r4 = r3 + cs;
    const q4 = q3 + ps;
    const r5 = r4 + cs;
    const q5 = q4 + ps;
    const r6 = r5 + cs;
    const q6 = q5 + ps;
    const r7 = r6 + cs;
    const q7 = q6 + ps;
    let k = 0;
    for (; k + 3 < terms; k += 4) {
      const u = U.offset + k * us;
      const a00 = s * (pd[q0 + k] as number);
      const a01 = s * (pd[q0 + k + 1] as number);
      const a02 = s * (pd[q0 + k + 2] as number);
      const a03 = s * (pd[q0 + k + 3] as number);
      const a10 = s * (pd[q1 + k] as number);
      const a11 = s * (pd[q1 + k + 1] as number);
      const a12 = s * (pd[q1 + k + 2] as number);
      const a13 = s * (pd[q1 + k + 3] as number);
      const a20 = s * (pd[q2 + k] as number);
      const a21 = s * (pd[q2 + k + 1] as number);
      const a22 = s * (pd[q2 + k + 2] as number);
      const a23 = s * (pd[q2 + k + 3] as number);
      const a30 = s * (pd[q3 + k] as number);
      const a31 = s * (pd[q3 + k + 1] as number);
      const a32 = s * (pd[q3 + k + 2] as number);
      const a33 = s * (pd[q3 + k + 3] as number);
      const a40 = s * (pd[q4 + k] as number);
      const a41 = s * (pd[q4 + k + 1] as number);
      const a42 = s * (pd[q4 + k + 2] as number);
      const a43 = s * (pd[q4 + k + 3] as number);
      const a50 = s * (pd[q5 + k] as number);
      const a51 = s * (pd[q5 + k + 1] as number);
      const a52 = s * (pd[q5 + k + 2] as number);
      const a53 = s * (pd[q5 + k + 3] as number);
      const a60 = s * (pd[q6 + k] as number);
      const a61 = s * (pd[q6 + k + 1] as number);
      const a62 = s * (pd[q6 + k + 2] as number);
      const a63 = s * (pd[q6 + k + 3] as number);
      const a70 = s * (pd[q7 + k] as number);
      const a71 = s * (pd[q7 + k + 1] as number);
      const a72 = s * (pd[q7 + k + 2] as number);
      const a73 = s * (pd[q7 + k + 3] as number);
      for (let c = c0; c < c1; c++) {
        const u0 = ud[u + c] as number;
        const u1 = ud[u + us + c] as number;
        const u2 = ud[u + 2 * us + c] as number;
        const u3 = ud[u + 3 * us + c] as number;
        cd[r0 + c] = (cd[r0 + c] as number) + (a00 * u0 + a01 * u1 + (a02 * u2 + a03 * u3));
        cd[r1 + c] = (cd[r1 + c] as number) + (a10 * u0 + a11 * u1 + (a12 * u2 + a13 * u3));
        cd[r2 + c] = (cd[r2 + c] as number) + (a20 * u0 + a21 * u1 + (a22 * u2 + a23 * u3));
        cd[r3 + c] = (cd[r3 + c] as number) + (a30 * u0 + a31 * u1 + (a32 * u2 + a33 * u3));
        cd[r4 + c] = (cd[r4 + c] as number) + (a40 * u0 + a41 * u1 + (a42 * u2 + a43 * u3));
        cd[r5 + c] = (cd[r5 + c] as number) + (a50 * u0 + a51 * u1 + (a52 * u2 + a53 * u3));
        cd[r6 + c] = (cd[r6 + c] as number) + (a60 * u0 + a61 * u1 + (a62 * u2 + a63 * u3));
        cd[r7 + c] = (cd[r7 + c] as number) + (a70 * u0 + a71 * u1 + (a72 * u2 + a73 * u3));
      }
    }
    for (; k < terms; k++) {
      const u = U.offset + k * us;
      const a0 = s * (pd[q0 + k] as number);
      const a1 = s * (pd[q1 + k] as number);
      const a2 = s * (pd[q2 + k] as number);
      const a3 = s * (pd[q3 + k] as number);
      const a4 = s * (pd[q4 + k] as number);
      const a5 = s * (pd[q5 + k] as number);
      const a6 = s * (pd[q6 + k] as number);
      const a7 = s * (pd[q7 + k] as number);
      for (let c = c0; c < c1; c++) {
        const v = ud[u + c] as number;
        cd[r0 + c] = (cd[r0 + c] as number) + a0 * v;
        cd[r1 + c] = (cd[r1 + c] as number) + a1 * v;
        cd[r2 + c] = (cd[r2 + c] as number) + a2 * v;
        cd[r3 + c] = (cd[r3 + c] as number) + a3 * v;
        cd[r4 + c] = (cd[r4 + c] as number) + a4 * v;
        cd[r5 + c] = (cd[r5 + c] as number) + a5 * v;
        cd[r6 + c] = (cd[r6 + c] as number) + a6 * v;
        cd[r7 + c] = (cd[r7 + c] as number) + a7 * v;
      }
    }
  }
  for (; i + 3 < rows; i += 4) {
    const r0 = C.offset + i * cs;
    const q0 = P.offset + i * ps;
    const r1 = r0 + cs;
    const q1 = q0 + ps;
    const r2 = r1 + cs;
    const q2 = q1 + ps;
    const r3 = r2 + cs;
    const q3 = q2 + ps;
    let k = 0;
    for (; k + 3 < terms; k += 4) {
      const u = U.offset + k * us;
      const a00 = s * (pd[q0 + k] as number);
      const a01 = s * (pd[q0 + k + 1] as number);
      const a02 = s * (pd[q0 + k + 2] as number);
      const a03 = s * (pd[q0 + k + 3] as number);
      const a10 = s * (pd[q1 + k] as number);
      const a11 = s * (pd[q1 + k + 1] as number);
      const a12 = s * (pd[q1 + k + 2] as number);
      const a13 = s * (pd[q1 + k + 3] as number);
      const a20 = s * (pd[q2 + k] as number);
      const a21 = s * (pd[q2 + k + 1] as number);
      const a22 = s * (pd[q2 + k + 2] as number);
      const a23 = s * (pd[q2 + k + 3] as number);
      const a30 = s * (pd[q3 + k] as number);
      const a31 = s * (pd[q3 + k + 1] as number);
      const a32 = s * (pd[q3 + k + 2] as number);
      const a33 = s * (pd[q3 + k + 3] as number);
      for (let c = c0; c < c1; c++) {
        const u0 = ud[u + c] as number;
        const u1 = ud[u + us + c] as number;
        const u2 = ud[u + 2 * us + c] as number;
        const u3 = ud[u + 3 * us + c] as number;
        cd[r0 + c] = (cd[r0 + c] as number) + (a00 * u0 + a01 * u1 + (a02 * u2 + a03 * u3));
        cd[r1 + c] = (cd[r1 + c] as number) + (a10 * u0 + a11 * u1 + (a12 * u2 + a13 * u3));
        cd[r2 + c] = (cd[r2 + c] as number) + (a20 * u0 + a21 * u1 + (a22 * u2 + a23 * u3));
        cd[r3 + c] = (cd[r3 + c] as number) + (a30 * u0 + a31 * u1 + (a32 * u2 + a33 * u3));
      }
    }
    for (; k < terms; k++) {
      const u = U.offset + k * us;
      const a0 = s * (pd[q0 + k] as number);
      const a1 = s * (pd[q1 + k] as number);
      const a2 = s * (pd[q2 + k] as number);
      const a3 = s * (pd[q3 + k] as number);
      for (let c = c0; c < c1; c++) {
        const v = ud[u + c] as number;
        cd[r0 + c] = (cd[r0 + c] as number) + a0 * v;
        cd[r1 + c] = (cd[r1 + c] as number) + a1 * v;
        cd[r2 + c] = (cd[r2 + c] as number) + a2 * v;
        cd[r3 + c] = (cd[r3 + c] as number) + a3 * v;
      }
    }
  }
  for (; i < rows; i++) {
    const r0 = C.offset + i * cs;
    const q0 = P.offset + i * ps;
    let k = 0;
    for (; k + 3 < terms; k += 4) {
      const u = U.offset + k * us;
      const a00 = s * (pd[q0 + k] as number);
      const a01 = s * (pd[q0 + k + 1] as number);
      const a02 = s * (pd[q0 + k + 2] as number);
      const a03 = s * (pd[q0 + k + 3] as number);
      for (let c = c0; c < c1; c++) {
        const u0 = ud[u + c] as number;
        const u1 = ud[u + us + c] as number;
        const u2 = ud[u + 2 * us + c] as number;
        const u3 = ud[u + 3 * us + c] as number;
        cd[r0 + c] = (cd[r0 + c] as number) + (a00 * u0 + a01 * u1 + (a02 * u2 + a03 * u3));
      }
    }
    for (; k < terms; k++) {
      const u = U.offset + k * us;
      const a0 = s * (pd[q0 + k] as number);
      for (let c = c0; c < c1; c++) {
        const v = ud[u + c] as number;
        cd[r0 + c] = (cd[r0 + c] as number) + a0 * v;
      }
    }
  }
}
