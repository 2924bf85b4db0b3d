/**
 * FDTD segment update for one line, before the junction solve of step n (see compile/fdtd.ts for
 * the scheme and its source). Reads V at n-1 (end nodes included, from the last junction solve),
 * I at n-3/2; writes I at n-1/2, interior V at n, and the end history currents h (into slots).
 * Index conventions: V[k n + a] is conductor a at node k; I[k n + a] at cell k (between nodes k and
 * k+1); matrices row-major n x n.
 * @returns the number of cells updated.
 */
export function fdtdStep(
  n: number, cells: number,
  Av: Float64Array, Bv: Float64Array, Ai: Float64Array, Bi: Float64Array, gm: Float64Array,
  V: Float64Array, I: Float64Array, iEnd: Float64Array, hEnd: Float64Array, tmp: Float64Array,
): number {
  // Currents: I' = Ai I - Bi (V_{k+1} - V_k).
  for (let k = 0; k < cells; k++) {
    const o = k * n;
    for (let a = 0; a < n; a++) {
      let acc = 0;
      for (let b = 0; b < n; b++) acc += Ai[a * n + b] * I[o + b] - Bi[a * n + b] * (V[o + n + b] - V[o + b]);
      tmp[a] = acc;
    }
    for (let a = 0; a < n; a++) I[o + a] = tmp[a];
  }
  // Interior voltages: V' = Av V - Bv (I_{k+1/2} - I_{k-1/2}).
  for (let k = 1; k < cells; k++) {
    const o = k * n;
    for (let a = 0; a < n; a++) {
      let acc = 0;
      for (let b = 0; b < n; b++) acc += Av[a * n + b] * V[o + b] - Bv[a * n + b] * (I[o + b] - I[o - n + b]);
      tmp[a] = acc;
    }
    for (let a = 0; a < n; a++) V[o + a] = tmp[a];
  }
  // End histories: h_0 = -(gm V_0 + i_0 - 2 I_{1/2}), h_N = -(gm V_N + i_N + 2 I_{N-1/2}).
  const oN = cells * n;
  const oI = (cells - 1) * n;
  for (let a = 0; a < n; a++) {
    let s0 = 0;
    let sN = 0;
    for (let b = 0; b < n; b++) {
      s0 += gm[a * n + b] * V[b];
      sN += gm[a * n + b] * V[oN + b];
    }
    hEnd[a] = -(s0 + iEnd[a] - 2 * I[a]);
    hEnd[n + a] = -(sN + iEnd[n + a] + 2 * I[oI + a]);
  }
  return cells;
}
