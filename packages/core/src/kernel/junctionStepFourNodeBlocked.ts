/**
 * Junction update, temporally blocked, fast path for junctions with exactly four nodes and no
 * constraint row (R = N = 4: four-conductor line ends, resistors and Norton / current sources).
 *
 * The update of junctionStepBlocked.ts with R = N = 4, written with the four right-hand sides, the
 * 4 x 4 matrix K and the four node voltages in locals (K read once per visit, not once per step)
 * and the fixed-size loops unrolled:
 *   w_p = (1 - f_p) buf_p[(n - k_p) & mask_p] + f_p buf_p[(n - k_p - 1) & mask_p]
 *   r_i = 0 + sum_p B_ip w_p (+ sources),  x_i = 0 + sum_c K_ic r_c,  u_p = 0 + sum_i A_pi x_i - w_p
 * Each sum runs in the same order as in junctionStep.ts (p ascending, c ascending, starting from
 * 0), so results are bit-identical to it; junctionStepBlocked stays the reference this loop is
 * tested against. Time levels and strides as in junctionStepBlocked.ts; needs nB <= kMin and
 * rings of at least k + nB + 1 slots. Method of characteristics with modal decomposition:
 * C. R. Paul, Analysis of Multiconductor Transmission Lines, 2nd ed., Wiley 2008, ch. 7-8 (from memory).
 */

/**
 * Advances four-node junctions [j0, j1) by nB steps, n0 .. n0 + nB - 1.
 * @returns the number of junction steps done, (j1 - j0) nB.
 * @example junctionStepFourNodeBlocked(0, nJ, 0, 5, ...arrays) // 5 nJ
 */
export function junctionStepFourNodeBlocked(
  j0: number, j1: number, n0: number, nB: number,
  jPort: Int32Array, jX: Int32Array, jB: Int32Array, jK: Int32Array, jA: Int32Array, jEx: Int32Array,
  pIn: Int32Array, pInMask: Int32Array, pK: Int32Array, pF: Float64Array, pOut: Int32Array, pOutMask: Int32Array,
  exRow: Int32Array, exSlot: Int32Array, exCoef: Float64Array, slot: Float64Array, slotStride: number, slotOff: number,
  mat: Float64Array, wave: Float64Array,
  inc: Float64Array, x: Float64Array, xStride: number, xOff: number,
): number {
  const n1 = n0 + nB;
  for (let j = j0; j < j1; j++) {
    const p0 = jPort[j];
    const M = jPort[j + 1] - p0;
    const e0 = jEx[j];
    const e1 = jEx[j + 1];
    const b0 = jB[j];
    const b1 = b0 + M;
    const b2 = b1 + M;
    const b3 = b2 + M;
    const a0 = jA[j];
    const k = jK[j];
    const K00 = mat[k], K01 = mat[k + 1], K02 = mat[k + 2], K03 = mat[k + 3];
    const K10 = mat[k + 4], K11 = mat[k + 5], K12 = mat[k + 6], K13 = mat[k + 7];
    const K20 = mat[k + 8], K21 = mat[k + 9], K22 = mat[k + 10], K23 = mat[k + 11];
    const K30 = mat[k + 12], K31 = mat[k + 13], K32 = mat[k + 14], K33 = mat[k + 15];
    let sRow = slotOff;
    let xi = xOff + jX[j];
    for (let n = n0; n < n1; n++) {
      let r0 = 0;
      let r1 = 0;
      let r2 = 0;
      let r3 = 0;
      for (let p = 0; p < M; p++) {
        const q = p0 + p;
        const mask = pInMask[q];
        const base = pIn[q];
        const i1 = n - pK[q];
        const f = pF[q];
        const w = (1 - f) * wave[base + (i1 & mask)] + f * wave[base + ((i1 - 1) & mask)];
        inc[q] = w;
        r0 += mat[b0 + p] * w;
        r1 += mat[b1 + p] * w;
        r2 += mat[b2 + p] * w;
        r3 += mat[b3 + p] * w;
      }
      for (let e = e0; e < e1; e++) {
        const v = exCoef[e] * slot[sRow + exSlot[e]];
        const row = exRow[e];
        if (row === 0) r0 += v;
        else if (row === 1) r1 += v;
        else if (row === 2) r2 += v;
        else r3 += v;
      }
      const x0 = 0 + K00 * r0 + K01 * r1 + K02 * r2 + K03 * r3;
      const x1 = 0 + K10 * r0 + K11 * r1 + K12 * r2 + K13 * r3;
      const x2 = 0 + K20 * r0 + K21 * r1 + K22 * r2 + K23 * r3;
      const x3 = 0 + K30 * r0 + K31 * r1 + K32 * r2 + K33 * r3;
      x[xi] = x0;
      x[xi + 1] = x1;
      x[xi + 2] = x2;
      x[xi + 3] = x3;
      let a = a0;
      for (let p = 0; p < M; p++) {
        const q = p0 + p;
        const u = 0 + mat[a] * x0 + mat[a + 1] * x1 + mat[a + 2] * x2 + mat[a + 3] * x3;
        a += 4;
        wave[pOut[q] + (n & pOutMask[q])] = u - inc[q];
      }
      sRow += slotStride;
      xi += xStride;
    }
  }
  return (j1 - j0) * nB;
}
