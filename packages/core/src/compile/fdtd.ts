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
import { fdtdStep } from '../kernel/fdtdStep.ts';
import { fdtdStep1 } from '../kernel/fdtdStep1.ts';
import { fdtdStep2 } from '../kernel/fdtdStep2.ts';
import { fdtdStep3 } from '../kernel/fdtdStep3.ts';
import { fdtdStep4 } from '../kernel/fdtdStep4.ts';

/** The signature every FDTD segment kernel shares (kernel/fdtdStep.ts). */
export type FdtdKernel = typeof fdtdStep;

const UNROLLED: ReadonlyArray<FdtdKernel> = [fdtdStep1, fdtdStep2, fdtdStep3, fdtdStep4];

/**
 * The kernel that steps a uniform segment of n conductors: the unrolled fast path for n = 1..4
 * (kernel/fdtdStep1.ts .. fdtdStep4.ts, same numbers as the general loop), the general loop
 * kernel/fdtdStep.ts otherwise. Chosen once at compile, never inside the step.
 * @param n conductors (>= 1).
 * @example fdtdKernelFor(4) === fdtdStep4 // true; fdtdKernelFor(6) === fdtdStep // true
 */
export function fdtdKernelFor(n: number): FdtdKernel {
  return UNROLLED[n - 1] ?? fdtdStep;
}

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
  /**
   * End Norton conductance g and the history factor gm = C dz/dt - G dz/2, 2 x n x n: end 0's
   * matrix, then end N's (the same for a uniform segment, whose kernels read the first).
   */
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
  /** Per-unit-length R, L, G, C for the ledger (a uniform segment; a varying one has `lumped`). */
  R: Float64Array;
  L: Float64Array;
  G: Float64Array;
  C: Float64Array;
  /** Scratch of n values. */
  tmp: Float64Array;
  /** Energy lost in R and G so far [J]. */
  lostJ: number;
  /** The kernel chosen at compile for this segment (fdtdKernelFor, or fdtdStepVarying). */
  step: FdtdKernel;
  /**
   * A line whose parameters vary (compile/fdtdProfile.ts): lumped L dz, R dz per cell (N x n x n)
   * and C, G per node ((N + 1) x n x n) for the ledger.
   */
  lumped?: { Lc: Float64Array; Rc: Float64Array; Cn: Float64Array; Gn: Float64Array };
  /** A varying line's node positions from the from end [m] (N + 1); a uniform one has k dzM. */
  zNodeM?: Float64Array;
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

/** The matrix for both ends: a then a again. */
function twice(a: Float64Array): Float64Array {
  const out = new Float64Array(2 * a.length);
  out.set(a);
  out.set(a, a.length);
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
    g: twice(flat(C.clone().mul(dz / dtS).add(G.clone().mul(dz / 2)))),
    gm: twice(flat(C.clone().mul(dz / dtS).sub(G.clone().mul(dz / 2)))),
    V: new Float64Array((cells + 1) * n),
    I: new Float64Array(cells * n),
    iEnd: new Float64Array(2 * n),
    hEnd: new Float64Array(2 * n),
    slotBase,
    xEnd: new Int32Array(2 * n).fill(-1),
    R: l.R, L: l.L, G: l.G, C: l.C,
    tmp: new Float64Array(n),
    lostJ: 0,
    step: fdtdKernelFor(n),
  };
}
