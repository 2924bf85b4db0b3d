/**
 * First half of the general junction update for one junction, used where the solve in between is
 * not a fixed matrix (Newton's method on junctions with nonlinear parts). At t_n:
 *   w_p = (1 - f_p) buf_p[(n - k_p) & mask_p] + f_p buf_p[(n - k_p - 1) & mask_p]
 *   r   = B w + sum_e c_e s[slot_e]
 * Same arithmetic and order as junctionStep.ts, which it is tested against.
 * @returns the number of right-hand-side rows written.
 */
export function junctionGather(
  j: number, n: number,
  jPort: Int32Array, jX: Int32Array, jB: Int32Array, jEx: Int32Array,
  pIn: Int32Array, pInMask: Int32Array, pK: Int32Array, pF: Float64Array,
  exRow: Int32Array, exSlot: Int32Array, exCoef: Float64Array, slot: Float64Array,
  mat: Float64Array, wave: Float64Array, rhs: Float64Array, inc: Float64Array,
): number {
  const p0 = jPort[j];
  const M = jPort[j + 1] - p0;
  const R = jX[j + 1] - jX[j];
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
  for (let e = jEx[j]; e < jEx[j + 1]; e++) rhs[exRow[e]] += exCoef[e] * slot[exSlot[e]];
  return R;
}
