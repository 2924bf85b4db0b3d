/**
 * Junction update, general form (any number of conductors per line end), one time level.
 *
 * For junction j at t_n, with M modal ports, N nodes and Q constraint rows (ideal sources, shorts):
 *   w_p   = (1 - f_p) buf_p[(n - k_p) & mask_p] + f_p buf_p[(n - k_p - 1) & mask_p]    incident wave, mode p
 *   r     = B w + sum_e c_e s[slot_e]                           right-hand side (N + Q)
 *   x     = K r                                                 node voltages and constraint currents
 *   u_p   = sum_i A_pi x_i - w_p                                emitted wave, written at (n & mask_out_p)
 * B = P^T 2 T_I Zm^-1 (line-end Norton sources), K = (nodal + MNA matrix)^-1 and A = T_V^-1 P are
 * built by the compile step. All waves are at t_n; x is at t_n. Ring slots written at step n are
 * read at n + k, k >= 1, so junctions may be visited in any order within a step.
 * Method of characteristics with modal decomposition: C. R. Paul, Analysis of Multiconductor
 * Transmission Lines, 2nd ed., Wiley 2008, ch. 7-8 (from memory).
 *
 * Matrices are stored row-major in `mat` at the junction's offsets: B (N+Q) x M, K (N+Q) x (N+Q),
 * A M x N. `inc` receives w (global modal port index), `x` receives the solution at jX[j].
 */

/**
 * Advances junctions [j0, j1) by one step at step index n.
 * @returns the number of junctions updated.
 */
export function junctionStep(
  j0: number, j1: number, n: number,
  jPort: Int32Array, jX: Int32Array, jN: Int32Array, jB: Int32Array, jK: Int32Array, jA: Int32Array, jEx: Int32Array,
  pIn: Int32Array, pInMask: Int32Array, pK: Int32Array, pF: Float64Array, pOut: Int32Array, pOutMask: Int32Array,
  exRow: Int32Array, exSlot: Int32Array, exCoef: Float64Array, slot: Float64Array,
  mat: Float64Array, wave: Float64Array, rhs: Float64Array,
  inc: Float64Array, x: Float64Array,
): number {
  for (let j = j0; j < j1; j++) {
    const p0 = jPort[j];
    const M = jPort[j + 1] - p0;
    const x0 = jX[j];
    const R = jX[j + 1] - x0;
    const N = jN[j];
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
    let k = jK[j];
    for (let r = 0; r < R; r++) {
      let acc = 0;
      for (let c = 0; c < R; c++) acc += mat[k + c] * rhs[c];
      x[x0 + r] = acc;
      k += R;
    }
    let a = jA[j];
    for (let p = 0; p < M; p++) {
      const q = p0 + p;
      let acc = 0;
      for (let i = 0; i < N; i++) acc += mat[a + i] * x[x0 + i];
      a += N;
      wave[pOut[q] + (n & pOutMask[q])] = acc - inc[q];
    }
  }
  return j1 - j0;
}
