/**
 * Junction update, one-conductor fast path, temporally blocked: each junction is advanced nB
 * steps per visit before the next junction is visited.
 *
 * Per junction j and step n in [n0, n0 + nB) the update is exactly junctionStepScalar.ts:
 *   w_q = (1 - f_q) buf_q[(n - k_q) & mask_q] + f_q buf_q[(n - k_q - 1) & mask_q]   incident wave
 *   r[nu_q] += (2 / Z_q) w_q,  r[e] += c_e s_n[slot_e],  x_n = K r,  u_q = x_n[nu_q] - w_q
 * with u_q written at (n & mask_out_q). w, s and x are at t_n.
 *
 * Why the order may change: a wave written at step m is read at m + k_q with k_q >= kMin, so with
 * nB <= kMin every wave a junction reads inside the block was written before the block began
 * (temporal blocking; the partition bound of DESIGN.md applied within one thread). The ring of a
 * mode with delay k must hold at least k + nB + 1 slots (mask + 1 >= k + nB + 1; the engine's
 * nextPow2(k + 2) is the case nB = 1), or a write inside the block overwrites a slot still to be
 * read: writes at steps m in [n0, n0 + nB) and reads at m' in [n0 - k - 1, n0 + nB - 1 - k] differ
 * by at most k + nB. The arithmetic per junction and step is the same
 * sequence of operations as junctionStepScalar, so results are bit-identical to it.
 *
 * Time levels in the strided arrays: step n uses slot[slotOff + (n - n0) slotStride + exSlot[e]]
 * (source values for each step of the block, filled by the caller) and writes
 * x[xOff + (n - n0) xStride + jX[j] + r] (xStride = 0 keeps only the last step's x).
 * Reference: Wolf and Lam, "A data locality optimizing algorithm", PLDI 1991 (loop tiling /
 * time skewing, from memory); the update itself as in junctionStepScalar.ts.
 */

/**
 * Advances junctions [j0, j1) by nB steps, n0 .. n0 + nB - 1.
 * @param nB steps per visit, at most the shortest delay kMin (and ring length >= k + nB + 1).
 * @returns the number of junction steps done, (j1 - j0) nB.
 * @example junctionStepScalarBlocked(0, nJ, 0, 5, ...arrays) // 5 nJ, same state as 5 calls of junctionStepScalar
 */
export function junctionStepScalarBlocked(
  j0: number, j1: number, n0: number, nB: number,
  jPort: Int32Array, jX: Int32Array, jK: Int32Array, jEx: Int32Array,
  pIn: Int32Array, pInMask: Int32Array, pK: Int32Array, pF: Float64Array, pOut: Int32Array, pOutMask: Int32Array,
  pNode: Int32Array, pY2: Float64Array,
  exRow: Int32Array, exSlot: Int32Array, exCoef: Float64Array, slot: Float64Array, slotStride: number, slotOff: number,
  mat: Float64Array, wave: Float64Array, rhs: Float64Array,
  inc: Float64Array, x: Float64Array, xStride: number, xOff: number,
): number {
  const n1 = n0 + nB;
  for (let j = j0; j < j1; j++) {
    const p0 = jPort[j];
    const p1 = jPort[j + 1];
    const xj = jX[j];
    const R = jX[j + 1] - xj;
    const e0 = jEx[j];
    const e1 = jEx[j + 1];
    const k0 = jK[j];
    let sRow = slotOff;
    let xRow = xOff + xj;
    for (let n = n0; n < n1; n++) {
      for (let r = 0; r < R; r++) rhs[r] = 0;
      for (let q = p0; q < p1; q++) {
        const mask = pInMask[q];
        const base = pIn[q];
        const i1 = n - pK[q];
        const f = pF[q];
        const w = (1 - f) * wave[base + (i1 & mask)] + f * wave[base + ((i1 - 1) & mask)];
        inc[q] = w;
        rhs[pNode[q]] += pY2[q] * w;
      }
      for (let e = e0; e < e1; e++) rhs[exRow[e]] += exCoef[e] * slot[sRow + exSlot[e]];
      let k = k0;
      for (let r = 0; r < R; r++) {
        let acc = 0;
        for (let c = 0; c < R; c++) acc += mat[k + c] * rhs[c];
        x[xRow + r] = acc;
        k += R;
      }
      for (let q = p0; q < p1; q++) wave[pOut[q] + (n & pOutMask[q])] = x[xRow + pNode[q]] - inc[q];
      sRow += slotStride;
      xRow += xStride;
    }
  }
  return (j1 - j0) * nB;
}
