/**
 * FDTD (leapfrog) segments for lines with losses, and for lines that ask for one. The
 * telegrapher's equations on a staggered grid (C. R. Paul, Analysis of Multiconductor
 * Transmission Lines, 2nd ed., Wiley 2008, the FDTD chapter, from memory): N cells of length dz,
 * voltages V_k at nodes k = 0..N and integer steps n, currents I_{k+1/2} at cell centres and half
 * steps n - 1/2, losses by the average of the two time levels (second order):
 *   (L/dt + R/2) I^{n-1/2} = (L/dt - R/2) I^{n-3/2} - (V_{k+1}^{n-1} - V_k^{n-1}) / dz
 *   (C/dt + G/2) V_k^n     = (C/dt - G/2) V_k^{n-1} - (I_{k+1/2}^{n-1/2} - I_{k-1/2}^{n-1/2}) / dz
 * Each end node carries half a cell, integrated by the trapezoidal rule with the terminal current
 * i (into the line) at integer steps, so the end looks to its junction like a Norton branch:
 *   i_0^n = g V_0^n + h_0,  g = C dz/dt + G dz/2,  h_0 = -[(C dz/dt - G dz/2) V_0^{n-1} + i_0^{n-1} - 2 I_{1/2}^{n-1/2}]
 *   i_N^n = g V_N^n + h_N,  h_N = -[(C dz/dt - G dz/2) V_N^{n-1} + i_N^{n-1} + 2 I_{N-1/2}^{n-1/2}]
 * Stable when dt <= dz / v_max (the Courant condition, checked at compile).
 */
import { Matrix, inverse } from 'ml-matrix';
import type { ResolvedLine } from '../model.ts';

/** One FDTD segment: matrices n x n row-major, state arrays flat. */
export interface FdtdLine {
  line: number;
  n: number;
  cells: number;
  dzM: number;
  /** V update: V' = Av V - Bv (I_{k+1/2} - I_{k-1/2}). */
  Av: Float64Array;
  Bv: Float64Array;
  /** I update: I' = Ai I - Bi (V_{k+1} - V_k). */
  Ai: Float64Array;
  Bi: Float64Array;
  /** End Norton conductance g and the history factor gm = C dz/dt - G dz/2. */
  g: Float64Array;
  gm: Float64Array;
  /** Node voltages (N + 1) x n at the last solved step, cell currents N x n at the last half step. */
  V: Float64Array;
  I: Float64Array;
  /** Terminal currents into the line at the two ends, 2 x n, and their history terms. */
  iEnd: Float64Array;
  hEnd: Float64Array;
  /** Slot of the history current of conductor k at end e: slotBase + e n + k. */
  slotBase: number;
  /** Global x index of the node of conductor k at end e: xEnd[e n + k]. */
  xEnd: Int32Array;
  /** Per-unit-length R, L, G, C for the ledger. */
  R: Float64Array;
  L: Float64Array;
  G: Float64Array;
  C: Float64Array;
  /** Scratch of n values. */
  tmp: Float64Array;
  /** Energy lost in R and G so far [J]. */
  lostJ: number;
}

function mat(a: Float64Array, n: number): Matrix {
  const m = new Matrix(n, n);
  for (let i = 0; i < n; i++) for (let j = 0; j < n; j++) m.set(i, j, a[i * n + j]);
  return m;
}

function flat(m: Matrix): Float64Array {
  const n = m.rows;
  const out = new Float64Array(n * n);
  for (let i = 0; i < n; i++) for (let j = 0; j < n; j++) out[i * n + j] = m.get(i, j);
  return out;
}

/** Builds the segment of a line for time step dt [s]. */
export function createFdtdLine(l: ResolvedLine, cells: number, dtS: number, slotBase: number): FdtdLine {
  const n = l.conductors.length;
  const dz = l.lengthM / cells;
  const C = mat(l.C, n);
  const G = mat(l.G, n);
  const L = mat(l.L, n);
  const R = mat(l.R, n);
  const cp = C.clone().mul(1 / dtS).add(G.clone().mul(0.5));
  const cm = C.clone().mul(1 / dtS).sub(G.clone().mul(0.5));
  const lp = L.clone().mul(1 / dtS).add(R.clone().mul(0.5));
  const lm = L.clone().mul(1 / dtS).sub(R.clone().mul(0.5));
  const cpi = inverse(cp);
  const lpi = inverse(lp);
  return {
    line: l.index, n, cells, dzM: dz,
    Av: flat(cpi.mmul(cm)), Bv: flat(cpi.mul(1 / dz)),
    Ai: flat(lpi.mmul(lm)), Bi: flat(lpi.mul(1 / dz)),
    g: flat(C.clone().mul(dz / dtS).add(G.clone().mul(dz / 2))),
    gm: flat(C.clone().mul(dz / dtS).sub(G.clone().mul(dz / 2))),
    V: new Float64Array((cells + 1) * n),
    I: new Float64Array(cells * n),
    iEnd: new Float64Array(2 * n),
    hEnd: new Float64Array(2 * n),
    slotBase,
    xEnd: new Int32Array(2 * n).fill(-1),
    R: l.R, L: l.L, G: l.G, C: l.C,
    tmp: new Float64Array(n),
    lostJ: 0,
  };
}
