/**
 * Junction update, fast path for junctions whose line ends all have one conductor.
 *
 * Same update as junctionStep.ts with T_V = T_I = 1: port p (a line end on node nu_p, impedance
 * Z_p) contributes r[nu_p] += (2 / Z_p) w_p, and emits u_p = x[nu_p] - w_p. w at t_n, x at t_n.
 * Bewley's lattice view of the same update: L. V. Bewley, Traveling Waves on Transmission Systems,
 * 1933 (from memory). junctionStep.ts stays the reference this loop is tested against.
 */

/**
 * Advances junctions [j0, j1) by one step at step index n.
 * @returns the number of junctions updated.
 */
export function junctionStepScalar(
  j0: number, j1: number, n: number,
  jPort: Int32Array, jX: Int32Array, jK: Int32Array, jEx: Int32Array,
  pIn: Int32Array, pInMask: Int32Array, pK: Int32Array, pF: Float64Array, pOut: Int32Array, pOutMask: Int32Array,
  pNode: Int32Array, pY2: Float64Array,
  exRow: Int32Array, exSlot: Int32Array, exCoef: Float64Array, slot: Float64Array,
  mat: Float64Array, wave: Float64Array, rhs: Float64Array,
  inc: Float64Array, x: Float64Array,
): number {
  for (let j = j0; j < j1; j++) {
    const p0 = jPort[j];
    const p1 = jPort[j + 1];
    const x0 = jX[j];
    const R = jX[j + 1] - x0;
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
    for (let e = jEx[j]; e < jEx[j + 1]; e++) rhs[exRow[e]] += exCoef[e] * slot[exSlot[e]];
    let k = jK[j];
    for (let r = 0; r < R; r++) {
      let acc = 0;
      for (let c = 0; c < R; c++) acc += mat[k + c] * rhs[c];
      x[x0 + r] = acc;
      k += R;
    }
    for (let q = p0; q < p1; q++) wave[pOut[q] + (n & pOutMask[q])] = x[x0 + pNode[q]] - inc[q];
  }
  return j1 - j0;
}
