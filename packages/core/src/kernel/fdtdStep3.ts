/**
 * FDTD segment update for one line of three conductors (n = 3), before the junction solve of step n:
 * the fast path of kernel/fdtdStep.ts (the general loop, its reference), chosen at compile for
 * 3-conductor lines (compile/fdtd.ts, `fdtdKernelFor`). Same discrete update (C. R. Paul,
 * Analysis of Multiconductor Transmission Lines, 2nd ed., the FDTD chapter, from memory):
 *   I_{k+1/2}^{n-1/2} = Ai I_{k+1/2}^{n-3/2} - Bi (V_{k+1}^{n-1} - V_k^{n-1}),  k = 0..N-1
 *   V_k^n             = Av V_k^{n-1} - Bv (I_{k+1/2}^{n-1/2} - I_{k-1/2}^{n-1/2}),  k = 1..N-1
 * then the end histories h as in fdtdStep. Index conventions as there: V[k n + a] is conductor a
 * at node k (at n-1 on entry, interior nodes at n on return; end nodes 0 and N are read, never
 * written), I[k n + a] at cell k (n-3/2 on entry, n-1/2 on return), matrices row-major n x n.
 *
 * Why a separate loop: the matrices (9 values each) are held in locals, the conductor loops
 * are unrolled, and the two sweeps are fused into one (node k is updated right after cell k, from
 * the new currents of cells k-1 and k, which is what the second sweep of fdtdStep reads), so each
 * cell's state is loaded and stored once per step and no scratch copy is needed. Every sum is
 * formed in the order of fdtdStep (row a: ((t_0 + t_1) + ...) with t_b = A_ab x_b - B_ab d_b), so
 * the results are the same numbers as fdtdStep's (a zero may differ in sign: fdtdStep starts its
 * sums from +0). Needs cells >= 1. Generated from one template for n = 1..4.
 * @param n conductors (3; kept so that every FDTD kernel has the signature of fdtdStep).
 * @param cells N >= 1.
 * @param tmp unused here (fdtdStep's scratch).
 * @returns the number of cells updated.
 * @example fdtdStep3(f.n, f.cells, f.Av, f.Bv, f.Ai, f.Bi, f.gm, f.V, f.I, f.iEnd, f.hEnd, f.tmp) // f.cells
 */
export function fdtdStep3(
  n: number, cells: number,
  Av: Float64Array, Bv: Float64Array, Ai: Float64Array, Bi: Float64Array, gm: Float64Array,
  V: Float64Array, I: Float64Array, iEnd: Float64Array, hEnd: Float64Array, tmp: Float64Array,
): number {
  void n;
  void tmp;
  const ai00 = Ai[0], ai01 = Ai[1], ai02 = Ai[2], ai10 = Ai[3], ai11 = Ai[4], ai12 = Ai[5], ai20 = Ai[6], ai21 = Ai[7], ai22 = Ai[8];
  const bi00 = Bi[0], bi01 = Bi[1], bi02 = Bi[2], bi10 = Bi[3], bi11 = Bi[4], bi12 = Bi[5], bi20 = Bi[6], bi21 = Bi[7], bi22 = Bi[8];
  const av00 = Av[0], av01 = Av[1], av02 = Av[2], av10 = Av[3], av11 = Av[4], av12 = Av[5], av20 = Av[6], av21 = Av[7], av22 = Av[8];
  const bv00 = Bv[0], bv01 = Bv[1], bv02 = Bv[2], bv10 = Bv[3], bv11 = Bv[4], bv12 = Bv[5], bv20 = Bv[6], bv21 = Bv[7], bv22 = Bv[8];
  // Cell 0: I_{1/2} from the end node V_0 (not updated here) and V_1.
  let v0 = V[0], v1 = V[1], v2 = V[2];
  let w0 = V[3], w1 = V[4], w2 = V[5];
  let d0 = w0 - v0, d1 = w1 - v1, d2 = w2 - v2;
  let i0 = I[0], i1 = I[1], i2 = I[2];
  let p0 = ai00 * i0 - bi00 * d0 + (ai01 * i1 - bi01 * d1) + (ai02 * i2 - bi02 * d2);
  let p1 = ai10 * i0 - bi10 * d0 + (ai11 * i1 - bi11 * d1) + (ai12 * i2 - bi12 * d2);
  let p2 = ai20 * i0 - bi20 * d0 + (ai21 * i1 - bi21 * d1) + (ai22 * i2 - bi22 * d2);
  I[0] = p0; I[1] = p1; I[2] = p2;
  v0 = w0; v1 = w1; v2 = w2;
  const oEnd = cells * 3;
  for (let o = 3; o < oEnd; o += 3) {
    // Current of cell k from V_k, V_{k+1} at n-1 (v, w) ...
    w0 = V[o + 3]; w1 = V[o + 4]; w2 = V[o + 5];
    d0 = w0 - v0; d1 = w1 - v1; d2 = w2 - v2;
    i0 = I[o]; i1 = I[o + 1]; i2 = I[o + 2];
    const q0 = ai00 * i0 - bi00 * d0 + (ai01 * i1 - bi01 * d1) + (ai02 * i2 - bi02 * d2);
    const q1 = ai10 * i0 - bi10 * d0 + (ai11 * i1 - bi11 * d1) + (ai12 * i2 - bi12 * d2);
    const q2 = ai20 * i0 - bi20 * d0 + (ai21 * i1 - bi21 * d1) + (ai22 * i2 - bi22 * d2);
    I[o] = q0; I[o + 1] = q1; I[o + 2] = q2;
    // ... then node k from the new currents of cells k-1 (p) and k (q).
    d0 = q0 - p0; d1 = q1 - p1; d2 = q2 - p2;
    V[o] = av00 * v0 - bv00 * d0 + (av01 * v1 - bv01 * d1) + (av02 * v2 - bv02 * d2);
    V[o + 1] = av10 * v0 - bv10 * d0 + (av11 * v1 - bv11 * d1) + (av12 * v2 - bv12 * d2);
    V[o + 2] = av20 * v0 - bv20 * d0 + (av21 * v1 - bv21 * d1) + (av22 * v2 - bv22 * d2);
    v0 = w0; v1 = w1; v2 = w2;
    p0 = q0; p1 = q1; p2 = q2;
  }
  // End histories, as in fdtdStep: h_0 = -(gm V_0 + i_0 - 2 I_{1/2}), h_N = -(gm V_N + i_N + 2 I_{N-1/2}).
  const oN = cells * 3;
  const oI = (cells - 1) * 3;
  for (let a = 0; a < 3; a++) {
    let s0 = 0;
    let sN = 0;
    for (let b = 0; b < 3; b++) {
      s0 += gm[a * 3 + b] * V[b];
      sN += gm[a * 3 + b] * V[oN + b];
    }
    hEnd[a] = -(s0 + iEnd[a] - 2 * I[a]);
    hEnd[3 + a] = -(sN + iEnd[3 + a] + 2 * I[oI + a]);
  }
  return cells;
}
