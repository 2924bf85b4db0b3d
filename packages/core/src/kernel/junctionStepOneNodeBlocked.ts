/**
 * Junction update, temporally blocked, fast path for one-conductor junctions with a single node
 * and no constraint row (R = 1: line ends, resistors and Norton / current sources on one node).
 *
 * The update of junctionStepScalarBlocked.ts with R = 1, K = [K00] and every pNode = 0:
 *   r = 0 + sum_q (2 / Z_q) w_q + sum_e c_e s_n[slot_e],  x_n = 0 + K00 r,  u_q = x_n - w_q
 * with the right-hand side held in a local instead of rhs[0] and K00 read once per visit. The
 * operations and their order are those of junctionStepScalar.ts (including the 0 + that starts
 * each sum), so results are bit-identical to it; junctionStepScalarBlocked stays the reference
 * this loop is tested against. Time levels and strides as in junctionStepScalarBlocked.ts; needs
 * nB <= kMin and rings of at least k + nB + 1 slots.
 */

/**
 * Advances one-node junctions [j0, j1) by nB steps, n0 .. n0 + nB - 1.
 * @returns the number of junction steps done, (j1 - j0) nB.
 * @example junctionStepOneNodeBlocked(0, nJ, 0, 5, ...arrays) // 5 nJ
 */
export function junctionStepOneNodeBlocked(
  j0: number, j1: number, n0: number, nB: number,
  jPort: Int32Array, jX: Int32Array, jK: Int32Array, jEx: Int32Array,
  pIn: Int32Array, pInMask: Int32Array, pK: Int32Array, pF: Float64Array, pOut: Int32Array, pOutMask: Int32Array,
  pY2: Float64Array,
  exRow: Int32Array, exSlot: Int32Array, exCoef: Float64Array, slot: Float64Array, slotStride: number, slotOff: number,
  mat: Float64Array, wave: Float64Array,
  inc: Float64Array, x: Float64Array, xStride: number, xOff: number,
): number {
  const n1 = n0 + nB;
  for (let j = j0; j < j1; j++) {
    const p0 = jPort[j];
    const p1 = jPort[j + 1];
    const e0 = jEx[j];
    const e1 = jEx[j + 1];
    const K00 = mat[jK[j]];
    let sRow = slotOff;
    let xi = xOff + jX[j];
    for (let n = n0; n < n1; n++) {
      let r = 0;
      for (let q = p0; q < p1; q++) {
        const mask = pInMask[q];
        const base = pIn[q];
        const i1 = n - pK[q];
        const f = pF[q];
        const w = (1 - f) * wave[base + (i1 & mask)] + f * wave[base + ((i1 - 1) & mask)];
        inc[q] = w;
        r += pY2[q] * w;
      }
      for (let e = e0; e < e1; e++) r += exCoef[e] * slot[sRow + exSlot[e]];
      const xn = 0 + K00 * r;
      x[xi] = xn;
      for (let q = p0; q < p1; q++) wave[pOut[q] + (n & pOutMask[q])] = xn - inc[q];
      sRow += slotStride;
      xi += xStride;
    }
  }
  return (j1 - j0) * nB;
}
