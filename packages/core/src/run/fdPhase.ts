/**
 * Phases of the frequency-dependent lines at step n (line/fdLine.ts). Before the junctions: the
 * waves arriving at each end (the other end's f delayed by tau, interpolated), filtered by H'
 * (b), and the Yc history (j), into the end's slot as j - b; each end is then the Norton branch
 * i = g v + j - b of its junction. After the junctions: the end voltages, the Yc convolution's new
 * input, the end currents and the outgoing waves f = i + (yc * v). All at t_n; from rest, with
 * every input taken as zero before t = 0 (the same first-step convention as the trapezoidal
 * companions).
 */
import type { Plan } from '../compile/compile.ts';
import { recursiveConvolutionAddInput, recursiveConvolutionHistory, recursiveConvolutionStep } from '../kernel/recursiveConvolution.ts';

/** Before the junctions of step n. */
export function phaseFdBefore(plan: Plan, n: number): void {
  const list = plan.fdLines;
  const slot = plan.slot;
  for (let k = 0; k < list.length; k++) {
    const f = list[k];
    const p = f.p;
    const mask = p.mask;
    const ia = n - p.k;
    const u0 = (1 - p.frac) * f.ring[f.rOff + (ia & mask)] + p.frac * f.ring[f.rOff + ((ia - 1) & mask)];
    const u1 = (1 - p.frac) * f.ring[ia & mask] + p.frac * f.ring[(ia - 1) & mask];
    const b0 = p.hD * u0 + recursiveConvolutionStep(p.hN, p.hNc, f.prev[0], u0, p.hC, 0, f.hState, 0);
    const b1 = p.hD * u1 + recursiveConvolutionStep(p.hN, p.hNc, f.prev[1], u1, p.hC, 0, f.hState, f.nHS);
    const j0 = recursiveConvolutionHistory(p.ycN, p.ycNc, f.prev[2], p.ycC, 0, f.ycState, 0);
    const j1 = recursiveConvolutionHistory(p.ycN, p.ycNc, f.prev[3], p.ycC, 0, f.ycState, f.nYcS);
    f.b[0] = b0;
    f.b[1] = b1;
    f.j[0] = j0;
    f.j[1] = j1;
    f.prev[0] = u0;
    f.prev[1] = u1;
    slot[f.slotBase] = j0 - b0;
    slot[f.slotBase + 1] = j1 - b1;
  }
}

/** After the junctions of step n. */
export function phaseFdAfter(plan: Plan, n: number): void {
  const list = plan.fdLines;
  const x = plan.x;
  const dt = plan.dtS;
  for (let k = 0; k < list.length; k++) {
    const f = list[k];
    const p = f.p;
    for (let e = 0; e < 2; e++) {
      const v = x[f.xEnd[e]];
      recursiveConvolutionAddInput(p.ycN, p.ycNc, v, p.ycC, 0, f.ycState, e * f.nYcS);
      const y = p.g * v + f.j[e];
      const i = y - f.b[e];
      f.ring[e * f.rOff + (n & p.mask)] = i + y;
      // Energy into the line, by the step-centred product of the ledger (run/ledger.ts).
      f.absorbedJ += dt * 0.5 * (v + f.prev[2 + e]) * 0.5 * (i + f.iPrev[e]);
      f.iPrev[e] = i;
      f.iEnd[e] = i;
      f.prev[2 + e] = v;
    }
  }
}
