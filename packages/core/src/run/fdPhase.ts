/**
 * Phases of the frequency-dependent lines at step n (line/fdLine.ts, line/fdModal.ts,
 * compile/fdRuntime.ts). Before the junctions: per mode the waves arriving at each end (the other
 * end's f delayed by tau, interpolated), filtered by H' (b), and the Yc history (j); the modal
 * histories h = j - b are taken to phase currents Ti h in the end's slots; each end is then the
 * Norton branch i = G v + Ti h of its junction. After the junctions: the modal end voltages
 * vm = Tv^-1 v, per mode the Yc convolution's new input, the modal current im = g vm + j - b and
 * the outgoing wave f = im + (yc * vm); the phase currents i = Ti im. All at t_n; from rest, with
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
    const nc = f.n;
    for (let m = 0; m < nc; m++) {
      const md = f.modes[m];
      const p = md.p;
      const mask = p.mask;
      const ia = n - p.k;
      const u0 = (1 - p.frac) * md.ring[md.rOff + (ia & mask)] + p.frac * md.ring[md.rOff + ((ia - 1) & mask)];
      const u1 = (1 - p.frac) * md.ring[ia & mask] + p.frac * md.ring[(ia - 1) & mask];
      const b0 = p.hD * u0 + recursiveConvolutionStep(p.hN, p.hNc, md.prev[0], u0, p.hC, 0, md.hState, 0);
      const b1 = p.hD * u1 + recursiveConvolutionStep(p.hN, p.hNc, md.prev[1], u1, p.hC, 0, md.hState, md.nHS);
      const j0 = recursiveConvolutionHistory(p.ycN, p.ycNc, md.prev[2], p.ycC, 0, md.ycState, 0);
      const j1 = recursiveConvolutionHistory(p.ycN, p.ycNc, md.prev[3], p.ycC, 0, md.ycState, md.nYcS);
      md.b[0] = b0;
      md.b[1] = b1;
      md.j[0] = j0;
      md.j[1] = j1;
      md.prev[0] = u0;
      md.prev[1] = u1;
      f.h[m] = j0 - b0;
      f.h[nc + m] = j1 - b1;
    }
    const Ti = f.Ti;
    for (let e = 0; e < 2; e++) {
      for (let a = 0; a < nc; a++) {
        let s = 0;
        for (let m = 0; m < nc; m++) s += Ti[a * nc + m] * f.h[e * nc + m];
        slot[f.slotBase + e * nc + a] = s;
      }
    }
  }
}

/** After the junctions of step n. */
export function phaseFdAfter(plan: Plan, n: number): void {
  const list = plan.fdLines;
  const x = plan.x;
  const dt = plan.dtS;
  for (let k = 0; k < list.length; k++) {
    const f = list[k];
    const nc = f.n;
    const TvInv = f.TvInv;
    const Ti = f.Ti;
    let power = 0;
    for (let e = 0; e < 2; e++) {
      const o = e * nc;
      for (let a = 0; a < nc; a++) f.iEnd[o + a] = 0;
      for (let m = 0; m < nc; m++) {
        const md = f.modes[m];
        const p = md.p;
        let vm = 0;
        for (let a = 0; a < nc; a++) vm += TvInv[m * nc + a] * x[f.xEnd[o + a]];
        recursiveConvolutionAddInput(p.ycN, p.ycNc, vm, p.ycC, 0, md.ycState, e * md.nYcS);
        const y = p.g * vm + md.j[e];
        const im = y - md.b[e];
        md.ring[e * md.rOff + (n & p.mask)] = im + y;
        md.prev[2 + e] = vm;
        for (let a = 0; a < nc; a++) f.iEnd[o + a] += Ti[a * nc + m] * im;
      }
      // Energy into the line, by the step-centred product of the ledger (run/ledger.ts).
      for (let a = 0; a < nc; a++) {
        const v = x[f.xEnd[o + a]];
        const i = f.iEnd[o + a];
        power += 0.5 * (v + f.vPrev[o + a]) * 0.5 * (i + f.iPrev[o + a]);
        f.iPrev[o + a] = i;
        f.vPrev[o + a] = v;
      }
    }
    f.absorbedJ += dt * power;
  }
}
