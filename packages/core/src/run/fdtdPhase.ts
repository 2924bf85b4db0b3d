/**
 * Phases of the FDTD segments. Before the junctions of step n: currents to n-1/2, interior
 * voltages to n, end history currents into their slots (kernel/fdtdStep.ts, or the fast path
 * chosen at compile, f.step). After the junctions:
 * the end voltages at n from the junction solution, and the terminal currents i = g V + h.
 */
import type { Plan } from '../compile/compile.ts';

/** Before the junctions of step n. */
export function phaseFdtdBefore(plan: Plan): void {
  const list = plan.fdtd;
  const slot = plan.slot;
  for (let k = 0; k < list.length; k++) {
    const f = list[k];
    f.step(f.n, f.cells, f.Av, f.Bv, f.Ai, f.Bi, f.gm, f.V, f.I, f.iEnd, f.hEnd, f.tmp);
    for (let i = 0; i < 2 * f.n; i++) slot[f.slotBase + i] = f.hEnd[i];
  }
}

/** After the junctions of step n. Accumulates the energy lost in R and G over the step [J]. */
export function phaseFdtdAfter(plan: Plan): void {
  const list = plan.fdtd;
  const x = plan.x;
  const dt = plan.dtS;
  for (let k = 0; k < list.length; k++) {
    const f = list[k];
    const n = f.n;
    const oN = f.cells * n;
    for (let a = 0; a < n; a++) {
      f.V[a] = x[f.xEnd[a]];
      f.V[oN + a] = x[f.xEnd[n + a]];
    }
    for (let e = 0; e < 2; e++) {
      const o = e === 0 ? 0 : oN;
      const og = e * n * n;
      for (let a = 0; a < n; a++) {
        let acc = f.hEnd[e * n + a];
        for (let b = 0; b < n; b++) acc += f.g[og + a * n + b] * f.V[o + b];
        f.iEnd[e * n + a] = acc;
      }
    }
    if (f.lumped) {
      f.lostJ += dt * lumpedLoss(f);
      continue;
    }
    // Losses over the step: dt dz (I^T R I over cells + V^T G V over nodes, end nodes half).
    let p = 0;
    for (let c = 0; c < f.cells; c++) {
      const o = c * n;
      for (let a = 0; a < n; a++) for (let b = 0; b < n; b++) p += f.I[o + a] * f.R[a * n + b] * f.I[o + b];
    }
    for (let c = 0; c <= f.cells; c++) {
      const o = c * n;
      const w = c === 0 || c === f.cells ? 0.5 : 1;
      for (let a = 0; a < n; a++) for (let b = 0; b < n; b++) p += w * f.V[o + a] * f.G[a * n + b] * f.V[o + b];
    }
    f.lostJ += dt * f.dzM * p;
  }
}

/** Sum of x_k^T M_k x_k over `count` blocks (x: n per block, M: n x n per block) [the units of M x^2]. */
function quadratic(n: number, count: number, M: Float64Array, x: Float64Array): number {
  const nn = n * n;
  let s = 0;
  for (let c = 0; c < count; c++) {
    const o = c * n;
    const m = c * nn;
    for (let a = 0; a < n; a++) for (let b = 0; b < n; b++) s += x[o + a] * M[m + a * n + b] * x[o + b];
  }
  return s;
}

/** Power lost in a varying segment [W]: I^T (R dz) I over cells plus V^T Gn V over nodes. */
function lumpedLoss(f: Plan['fdtd'][number]): number {
  const m = f.lumped!;
  return quadratic(f.n, f.cells, m.Rc, f.I) + quadratic(f.n, f.cells + 1, m.Gn, f.V);
}

/** Energy stored in an FDTD segment now [J]: C V^2 / 2 over nodes (ends half) plus L I^2 / 2 over cells. */
export function fdtdStoredEnergy(plan: Plan, k: number): number {
  const f = plan.fdtd[k];
  const n = f.n;
  if (f.lumped) return 0.5 * (quadratic(n, f.cells + 1, f.lumped.Cn, f.V) + quadratic(n, f.cells, f.lumped.Lc, f.I));
  let e = 0;
  for (let c = 0; c <= f.cells; c++) {
    const o = c * n;
    const w = c === 0 || c === f.cells ? 0.5 : 1;
    for (let a = 0; a < n; a++) for (let b = 0; b < n; b++) e += w * f.V[o + a] * f.C[a * n + b] * f.V[o + b];
  }
  for (let c = 0; c < f.cells; c++) {
    const o = c * n;
    for (let a = 0; a < n; a++) for (let b = 0; b < n; b++) e += f.I[o + a] * f.L[a * n + b] * f.I[o + b];
  }
  return 0.5 * f.dzM * e;
}
