/**
 * FDTD segment update for one line of one conductor (n = 1), before the junction solve of step n:
 * the fast path of kernel/fdtdStep.ts (the general loop, its reference), chosen at compile for
 * 1-conductor lines (compile/fdtd.ts, `fdtdKernelFor`). Same discrete update (C. R. Paul,
 * Analysis of Multiconductor Transmission Lines, 2nd ed., the FDTD chapter, from memory):
 *   I_{k+1/2}^{n-1/2} = Ai I_{k+1/2}^{n-3/2} - Bi (V_{k+1}^{n-1} - V_k^{n-1}),  k = 0..N-1
 *   V_k^n             = Av V_k^{n-1} - Bv (I_{k+1/2}^{n-1/2} - I_{k-1/2}^{n-1/2}),  k = 1..N-1
 * then the end histories h as in fdtdStep. Index conventions as there: V[k n + a] is conductor a
 * at node k (at n-1 on entry, interior nodes at n on return; end nodes 0 and N are read, never
 * written), I[k n + a] at cell k (n-3/2 on entry, n-1/2 on return), matrices row-major n x n.
 *
 * Why a separate loop: the matrices (1 value each) are held in locals, the conductor loops
 * are unrolled, and the two sweeps are fused into one (node k is updated right after cell k, from
 * the new currents of cells k-1 and k, which is what the second sweep of fdtdStep reads), so each
 * cell's state is loaded and stored once per step and no scratch copy is needed; here, with one
 * conductor, two cells are done per pass. Every sum is
 * formed in the order of fdtdStep (row a: ((t_0 + t_1) + ...) with t_b = A_ab x_b - B_ab d_b), so
 * the results are the same numbers as fdtdStep's (a zero may differ in sign: fdtdStep starts its
 * sums from +0). Needs cells >= 1. Generated from one template for n = 1..4.
 * @param n conductors (1; kept so that every FDTD kernel has the signature of fdtdStep).
 * @param cells N >= 1.
 * @param tmp unused here (fdtdStep's scratch).
 * @returns the number of cells updated.
 * @example fdtdStep1(f.n, f.cells, f.Av, f.Bv, f.Ai, f.Bi, f.gm, f.V, f.I, f.iEnd, f.hEnd, f.tmp) // f.cells
 */
export function fdtdStep1(
  n: number, cells: number,
  Av: Float64Array, Bv: Float64Array, Ai: Float64Array, Bi: Float64Array, gm: Float64Array,
  V: Float64Array, I: Float64Array, iEnd: Float64Array, hEnd: Float64Array, tmp: Float64Array,
): number {
  void n;
  void tmp;
  const ai00 = Ai[0];
  const bi00 = Bi[0];
  const av00 = Av[0];
  const bv00 = Bv[0];
  // Cell 0: I_{1/2} from the end node V_0 (not updated here) and V_1.
  let v0 = V[0];
  let w0 = V[1];
  let d0 = w0 - v0;
  let i0 = I[0];
  let p0 = ai00 * i0 - bi00 * d0;
  I[0] = p0;
  v0 = w0;
  // Two cells per pass (measured about 1.3 times faster in V8 than one), then the odd one left.
  let o = 1;
  for (; o + 1 < cells; o += 2) {
    // Currents of cells o, o+1 from V_o, V_{o+1}, V_{o+2} at n-1 (v0, w0, w1) ...
    w0 = V[o + 1];
    const w1 = V[o + 2];
    const q0 = ai00 * I[o] - bi00 * (w0 - v0);
    const q1 = ai00 * I[o + 1] - bi00 * (w1 - w0);
    I[o] = q0;
    I[o + 1] = q1;
    // ... then nodes o, o+1 from the new currents of cells o-1 (p0), o (q0), o+1 (q1).
    V[o] = av00 * v0 - bv00 * (q0 - p0);
    V[o + 1] = av00 * w0 - bv00 * (q1 - q0);
    v0 = w1;
    p0 = q1;
  }
  for (; o < cells; o++) {
    w0 = V[o + 1];
    d0 = w0 - v0;
    i0 = I[o];
    const q0 = ai00 * i0 - bi00 * d0;
    I[o] = q0;
    d0 = q0 - p0;
    V[o] = av00 * v0 - bv00 * d0;
    v0 = w0;
    p0 = q0;
  }
  // End histories, as in fdtdStep: h_0 = -(gm V_0 + i_0 - 2 I_{1/2}), h_N = -(gm V_N + i_N + 2 I_{N-1/2}).
  const oN = cells * 1;
  const oI = (cells - 1) * 1;
  for (let a = 0; a < 1; a++) {
    let s0 = 0;
    let sN = 0;
    for (let b = 0; b < 1; b++) {
      s0 += gm[a * 1 + b] * V[b];
      sN += gm[a * 1 + b] * V[oN + b];
    }
    hEnd[a] = -(s0 + iEnd[a] - 2 * I[a]);
    hEnd[1 + a] = -(sN + iEnd[1 + a] + 2 * I[oI + a]);
  }
  return cells;
}
