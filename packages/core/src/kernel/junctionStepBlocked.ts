/**
 * Junction update, general form (any number of conductors per line end), temporally blocked:
 * each junction is advanced nB steps per visit before the next junction is visited.
 *
 * Per junction j and step n in [n0, n0 + nB) the update is exactly junctionStep.ts:
 *   w_p = (1 - f_p) buf_p[(n - k_p) & mask_p] + f_p buf_p[(n - k_p - 1) & mask_p]
 *   r = B w + sum_e c_e s_n[slot_e],  x_n = K r,  u_p = sum_i A_pi x_n,i - w_p  at (n & mask_out_p)
 * Valid when nB <= the shortest delay kMin and every ring holds at least k + nB + 1 slots (see
 * junctionStepScalarBlocked.ts for the argument). Same operations in the same order per junction
 * and step as junctionStep, so results are bit-identical to it.
 *
 * Strided time levels: slot[slotOff + (n - n0) slotStride + exSlot[e]],
 * x[xOff + (n - n0) xStride + jX[j] + r] (xStride = 0 keeps the last step only).
 * Method of characteristics with modal decomposition: C. R. Paul, Analysis of Multiconductor
 * Transmission Lines, 2nd ed., Wiley 2008, ch. 7-8 (from memory).
 */

/**
 * Advances junctions [j0, j1) by nB steps, n0 .. n0 + nB - 1.
 * @param nB steps per visit, at most the shortest delay (and ring length >= k + nB + 1).
 * @returns the number of junction steps done, (j1 - j0) nB.
 * @example junctionStepBlocked(0, nJ, 0, 5, ...arrays) // 5 nJ, same state as 5 calls of junctionStep
 */
export function junctionStepBlocked(
  j0: number, j1: number, n0: number, nB: number,
  jPort: Int32Array, jX: Int32Array, jN: Int32Array, jB: Int32Array, jK: Int32Array, jA: Int32Array, jEx: Int32Array,
  pIn: Int32Array, pInMask: Int32Array, pK: Int32Array, pF: Float64Array, pOut: Int32Array, pOutMask: Int32Array,
  exRow: Int32Array, exSlot: Int32Array, exCoef: Float64Array, slot: Float64Array, slotStride: number, slotOff: number,
  mat: Float64Array, wave: Float64Array, rhs: Float64Array,
  inc: Float64Array, x: Float64Array, xStride: number, xOff: number,
): number {
  const n1 = n0 + nB;
  for (let j = j0; j < j1; j++) {
    const p0 = jPort[j];
    const M = jPort[j + 1] - p0;
    const xj = jX[j];
    const R = jX[j + 1] - xj;
    const N = jN[j];
    const e0 = jEx[j];
    const e1 = jEx[j + 1];
    let sRow = slotOff;
    let xRow = xOff + xj;
    for (let n = n0; n < n1; n++) {
      for (let p = 0; p < M; p++) {
        const q = p0 + p;
        const mask = pInMask[q];
        const base = pIn[q];
        const i1 = n - pK[q];
        const f = pF[q];
        inc[q] = (1 - f) * wave[base + (i1 & mask)] + f * wave[base + ((i1 - 1) & mask)];
      }
      let b = jB[j];
      for (let r = 0; r < R; r++) {
        let acc = 0;
        for (let p = 0; p < M; p++) acc += mat[b + p] * inc[p0 + p];
        rhs[r] = acc;
        b += M;
      }
      for (let e = e0; e < e1; e++) rhs[exRow[e]] += exCoef[e] * slot[sRow + exSlot[e]];
      let k = jK[j];
      for (let r = 0; r < R; r++) {
        let acc = 0;
        for (let c = 0; c < R; c++) acc += mat[k + c] * rhs[c];
        x[xRow + r] = acc;
        k += R;
      }
      let a = jA[j];
      for (let p = 0; p < M; p++) {
        const q = p0 + p;
        let acc = 0;
        for (let i = 0; i < N; i++) acc += mat[a + i] * x[xRow + i];
        a += N;
        wave[pOut[q] + (n & pOutMask[q])] = acc - inc[q];
      }
      sRow += slotStride;
      xRow += xStride;
    }
  }
  return (j1 - j0) * nB;
}
