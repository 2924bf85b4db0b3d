/**
 * FDTD segment update for one line of four conductors (n = 4), before the junction solve of step n:
 * the fast path of kernel/fdtdStep.ts (the general loop, its reference), chosen at compile for
 * 4-conductor lines (compile/fdtd.ts, `fdtdKernelFor`). Same discrete update (C. R. Paul,
 * Analysis of Multiconductor Transmission Lines, 2nd ed., the FDTD chapter, from memory):
 *   I_{k+1/2}^{n-1/2} = Ai I_{k+1/2}^{n-3/2} - Bi (V_{k+1}^{n-1} - V_k^{n-1}),  k = 0..N-1
 *   V_k^n             = Av V_k^{n-1} - Bv (I_{k+1/2}^{n-1/2} - I_{k-1/2}^{n-1/2}),  k = 1..N-1
 * then the end histories h as in fdtdStep. Index conventions as there: V[k n + a] is conductor a
 * at node k (at n-1 on entry, interior nodes at n on return; end nodes 0 and N are read, never
 * written), I[k n + a] at cell k (n-3/2 on entry, n-1/2 on return), matrices row-major n x n.
 *
 * Why a separate loop: the matrices (16 values each) are held in locals and the conductor loops
 * are unrolled, so no scratch copy is needed. The two sweeps stay apart: fused (as for n = 1..3)
 * the loop would hold all four matrices, 64 values, and ran no faster here (measured, V8 of
 * Node 20); each sweep alone holds 32. Every sum is
 * formed in the order of fdtdStep (row a: ((t_0 + t_1) + ...) with t_b = A_ab x_b - B_ab d_b), so
 * the results are the same numbers as fdtdStep's (a zero may differ in sign: fdtdStep starts its
 * sums from +0). Needs cells >= 1. Generated from one template for n = 1..4.
 * @param n conductors (4; kept so that every FDTD kernel has the signature of fdtdStep).
 * @param cells N >= 1.
 * @param tmp unused here (fdtdStep's scratch).
 * @returns the number of cells updated.
 * @example fdtdStep4(f.n, f.cells, f.Av, f.Bv, f.Ai, f.Bi, f.gm, f.V, f.I, f.iEnd, f.hEnd, f.tmp) // f.cells
 */
export function fdtdStep4(
  n: number, cells: number,
  Av: Float64Array, Bv: Float64Array, Ai: Float64Array, Bi: Float64Array, gm: Float64Array,
  V: Float64Array, I: Float64Array, iEnd: Float64Array, hEnd: Float64Array, tmp: Float64Array,
): number {
  void n;
  void tmp;
  const oEnd = cells * 4;
  {
    const ai00 = Ai[0], ai01 = Ai[1], ai02 = Ai[2], ai03 = Ai[3], ai10 = Ai[4], ai11 = Ai[5], ai12 = Ai[6], ai13 = Ai[7], ai20 = Ai[8], ai21 = Ai[9], ai22 = Ai[10], ai23 = Ai[11], ai30 = Ai[12], ai31 = Ai[13], ai32 = Ai[14], ai33 = Ai[15];
    const bi00 = Bi[0], bi01 = Bi[1], bi02 = Bi[2], bi03 = Bi[3], bi10 = Bi[4], bi11 = Bi[5], bi12 = Bi[6], bi13 = Bi[7], bi20 = Bi[8], bi21 = Bi[9], bi22 = Bi[10], bi23 = Bi[11], bi30 = Bi[12], bi31 = Bi[13], bi32 = Bi[14], bi33 = Bi[15];
    // Currents of cells 0..N-1 from V_k, V_{k+1} at n-1.
    for (let o = 0; o < oEnd; o += 4) {
      const d0 = V[o + 4] - V[o], d1 = V[o + 5] - V[o + 1], d2 = V[o + 6] - V[o + 2], d3 = V[o + 7] - V[o + 3];
      const i0 = I[o], i1 = I[o + 1], i2 = I[o + 2], i3 = I[o + 3];
      I[o] = ai00 * i0 - bi00 * d0 + (ai01 * i1 - bi01 * d1) + (ai02 * i2 - bi02 * d2) + (ai03 * i3 - bi03 * d3);
      I[o + 1] = ai10 * i0 - bi10 * d0 + (ai11 * i1 - bi11 * d1) + (ai12 * i2 - bi12 * d2) + (ai13 * i3 - bi13 * d3);
      I[o + 2] = ai20 * i0 - bi20 * d0 + (ai21 * i1 - bi21 * d1) + (ai22 * i2 - bi22 * d2) + (ai23 * i3 - bi23 * d3);
      I[o + 3] = ai30 * i0 - bi30 * d0 + (ai31 * i1 - bi31 * d1) + (ai32 * i2 - bi32 * d2) + (ai33 * i3 - bi33 * d3);
    }
  }
  {
    const av00 = Av[0], av01 = Av[1], av02 = Av[2], av03 = Av[3], av10 = Av[4], av11 = Av[5], av12 = Av[6], av13 = Av[7], av20 = Av[8], av21 = Av[9], av22 = Av[10], av23 = Av[11], av30 = Av[12], av31 = Av[13], av32 = Av[14], av33 = Av[15];
    const bv00 = Bv[0], bv01 = Bv[1], bv02 = Bv[2], bv03 = Bv[3], bv10 = Bv[4], bv11 = Bv[5], bv12 = Bv[6], bv13 = Bv[7], bv20 = Bv[8], bv21 = Bv[9], bv22 = Bv[10], bv23 = Bv[11], bv30 = Bv[12], bv31 = Bv[13], bv32 = Bv[14], bv33 = Bv[15];
    // Interior voltages of nodes 1..N-1 from the new currents.
    for (let o = 4; o < oEnd; o += 4) {
      const d0 = I[o] - I[o - 4], d1 = I[o + 1] - I[o - 3], d2 = I[o + 2] - I[o - 2], d3 = I[o + 3] - I[o - 1];
      const v0 = V[o], v1 = V[o + 1], v2 = V[o + 2], v3 = V[o + 3];
      V[o] = av00 * v0 - bv00 * d0 + (av01 * v1 - bv01 * d1) + (av02 * v2 - bv02 * d2) + (av03 * v3 - bv03 * d3);
      V[o + 1] = av10 * v0 - bv10 * d0 + (av11 * v1 - bv11 * d1) + (av12 * v2 - bv12 * d2) + (av13 * v3 - bv13 * d3);
      V[o + 2] = av20 * v0 - bv20 * d0 + (av21 * v1 - bv21 * d1) + (av22 * v2 - bv22 * d2) + (av23 * v3 - bv23 * d3);
      V[o + 3] = av30 * v0 - bv30 * d0 + (av31 * v1 - bv31 * d1) + (av32 * v2 - bv32 * d2) + (av33 * v3 - bv33 * d3);
    }
  }
  // End histories, as in fdtdStep: h_0 = -(gm V_0 + i_0 - 2 I_{1/2}), h_N = -(gm V_N + i_N + 2 I_{N-1/2}).
  const oN = cells * 4;
  const oI = (cells - 1) * 4;
  for (let a = 0; a < 4; a++) {
    let s0 = 0;
    let sN = 0;
    for (let b = 0; b < 4; b++) {
      s0 += gm[a * 4 + b] * V[b];
      sN += gm[a * 4 + b] * V[oN + b];
    }
    hEnd[a] = -(s0 + iEnd[a] - 2 * I[a]);
    hEnd[4 + a] = -(sN + iEnd[4 + a] + 2 * I[oI + a]);
  }
  return cells;
}
