/**
 * Second half of the general junction update for one junction: with node voltages x at t_n,
 *   u_p = sum_i A_pi x_i - w_p, written to the outgoing ring at (n & mask_out_p).
 * Same arithmetic and order as junctionStep.ts, which it is tested against.
 * @returns the number of modal ports written.
 */
export function junctionEmit(
  j: number, n: number,
  jPort: Int32Array, jX: Int32Array, jN: Int32Array, jA: Int32Array,
  pOut: Int32Array, pOutMask: Int32Array,
  mat: Float64Array, wave: Float64Array, inc: Float64Array, x: Float64Array,
): number {
  const p0 = jPort[j];
  const M = jPort[j + 1] - p0;
  const N = jN[j];
  const x0 = jX[j];
  let a = jA[j];
  for (let p = 0; p < M; p++) {
    const q = p0 + p;
    let acc = 0;
    for (let i = 0; i < N; i++) acc += mat[a + i] * x[x0 + i];
    a += N;
    wave[pOut[q] + (n & pOutMask[q])] = acc - inc[q];
  }
  return M;
}
