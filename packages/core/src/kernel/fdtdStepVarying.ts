/**
 * FDTD segment update for a line whose parameters vary along it, before the junction solve of
 * step n: the scheme of kernel/fdtdStep.ts with a matrix per cell and per node (see
 * compile/fdtdProfile.ts for the discretisation and its source). Reads V at n-1 (end nodes
 * included, from the last junction solve), I at n-3/2; writes I at n-1/2, interior V at n, and the
 * end history currents h:
 *   I_{k+1/2}^{n-1/2} = Ai_k I_{k+1/2}^{n-3/2} - Bi_k (V_{k+1}^{n-1} - V_k^{n-1}),  k = 0..N-1
 *   V_k^n             = Av_k V_k^{n-1} - Bv_k (I_{k+1/2}^{n-1/2} - I_{k-1/2}^{n-1/2}),  k = 1..N-1
 *   h_0 = -(gm_0 V_0 + i_0 - 2 I_{1/2}),  h_N = -(gm_N V_N + i_N + 2 I_{N-1/2})
 * Index conventions: V[k n + a] is conductor a at node k; I[k n + a] at cell k (between nodes k
 * and k+1); Ai, Bi hold cell k's n x n matrix (row-major) at k n^2; Av, Bv node k's at k n^2, of
 * which nodes 0 and N are never read (their voltages come from the junctions); gm holds end 0's
 * matrix, then end N's. Every sum is formed in the order of fdtdStep, so with the same matrix in
 * every cell and node the results are fdtdStep's, number for number (tested).
 * @param n conductors; @param cells N >= 1; @param tmp scratch of n values.
 * @returns the number of cells updated.
 * @example fdtdStepVarying(f.n, f.cells, f.Av, f.Bv, f.Ai, f.Bi, f.gm, f.V, f.I, f.iEnd, f.hEnd, f.tmp) // f.cells
 */
export function fdtdStepVarying(
  n: number, cells: number,
  Av: Float64Array, Bv: Float64Array, Ai: Float64Array, Bi: Float64Array, gm: Float64Array,
  V: Float64Array, I: Float64Array, iEnd: Float64Array, hEnd: Float64Array, tmp: Float64Array,
): number {
  const nn = n * n;
  // Currents: I' = Ai_k I - Bi_k (V_{k+1} - V_k).
  for (let k = 0; k < cells; k++) {
    const o = k * n;
    const m = k * nn;
    for (let a = 0; a < n; a++) {
      let acc = 0;
      const r = m + a * n;
      for (let b = 0; b < n; b++) acc += Ai[r + b] * I[o + b] - Bi[r + b] * (V[o + n + b] - V[o + b]);
      tmp[a] = acc;
    }
    for (let a = 0; a < n; a++) I[o + a] = tmp[a];
  }
  // Interior voltages: V' = Av_k V - Bv_k (I_{k+1/2} - I_{k-1/2}).
  for (let k = 1; k < cells; k++) {
    const o = k * n;
    const m = k * nn;
    for (let a = 0; a < n; a++) {
      let acc = 0;
      const r = m + a * n;
      for (let b = 0; b < n; b++) acc += Av[r + b] * V[o + b] - Bv[r + b] * (I[o + b] - I[o - n + b]);
      tmp[a] = acc;
    }
    for (let a = 0; a < n; a++) V[o + a] = tmp[a];
  }
  // End histories, each end with its own gm.
  const oN = cells * n;
  const oI = (cells - 1) * n;
  for (let a = 0; a < n; a++) {
    let s0 = 0;
    let sN = 0;
    for (let b = 0; b < n; b++) {
      s0 += gm[a * n + b] * V[b];
      sN += gm[nn + a * n + b] * V[oN + b];
    }
    hEnd[a] = -(s0 + iEnd[a] - 2 * I[a]);
    hEnd[n + a] = -(sN + iEnd[n + a] + 2 * I[oI + a]);
  }
  return cells;
}
