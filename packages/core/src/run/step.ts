/**
 * One time step, phase by phase. Every phase evaluates at t_n = n dt:
 *   sources   waveform values u(t_n) and load history currents h_n into their slots
 *   switches  re-factor junctions whose conductance changed at t_n
 *   junctions incident waves -> node voltages -> emitted waves (kernels)
 *   parts     branch voltage and current of every lumped part, accept hooks
 * Probes and the ledger run after this, in run.ts, on recorded steps.
 */
import type { Plan } from '../compile/compile.ts';
import { invertInPlace } from '../compile/invert.ts';
import { singularJunction } from '../errors.ts';
import { junctionStep } from '../kernel/junctionStep.ts';
import { junctionStepScalar } from '../kernel/junctionStepScalar.ts';

/** Contiguous ranges of junctions that share a kernel: [start, end, scalar] triples. */
export function kernelRuns(plan: Plan): Int32Array {
  const runs: number[] = [];
  const kind = (j: number): number => (plan.jNonlinear[j] ? 2 : plan.jScalar[j]);
  let start = 0;
  for (let j = 1; j <= plan.nJunctions; j++) {
    if (j === plan.nJunctions || kind(j) !== kind(start)) {
      // Nonlinear junctions are solved by the Newton phase, not by a kernel.
      if (kind(start) !== 2) runs.push(start, j, plan.jScalar[start]);
      start = j;
    }
  }
  return Int32Array.from(runs);
}

/** Phase: sources and load histories at t_n. */
export function phaseSources(plan: Plan, tS: number): void {
  const slot = plan.slot;
  const wf = plan.waveforms;
  for (let w = 0; w < wf.length; w++) slot[wf[w].slot] = wf[w].instance.value(tS);
  const hl = plan.historyLoads;
  for (let k = 0; k < hl.length; k++) {
    const p = hl[k];
    slot[p.slot] = (p.load as { history: () => number }).history();
  }
}

/** Phase: switches. Re-factors a junction when one of its time-varying conductances changed. */
export function phaseSwitches(plan: Plan, tS: number): void {
  const vs = plan.varying;
  for (let k = 0; k < vs.length; k++) {
    const v = vs[k];
    let changed = false;
    // (Time-varying loads at a nonlinear junction are listed in its Newton record instead.)
    for (let i = 0; i < v.loads.length; i++) {
      const l = v.loads[i];
      const g = l.instance.conductanceAt!(tS);
      if (g !== l.g) {
        l.g = g;
        l.part.g = g;
        changed = true;
      }
    }
    if (!changed) continue;
    const R = v.R;
    const a = v.assembled;
    a.set(v.base);
    for (let i = 0; i < v.loads.length; i++) {
      const l = v.loads[i];
      const p = l.rowPlus;
      const m = l.rowMinus;
      if (p >= 0) a[p * R + p] += l.g;
      if (m >= 0) a[m * R + m] += l.g;
      if (p >= 0 && m >= 0) {
        a[p * R + m] -= l.g;
        a[m * R + p] -= l.g;
      }
    }
    const pivot = invertInPlace(R, a, 0, plan.mat, plan.jK[v.junction], plan.work);
    if (!(pivot > 1e-13)) throw singularJunction(plan.scenario.junctions[v.junction].id, `after a switch changed at t = ${tS} s`);
  }
}

/** Phase: junctions [j0, j1) at step n, through the kernel runs. */
export function phaseJunctions(plan: Plan, runs: Int32Array, n: number): void {
  const p = plan;
  for (let r = 0; r < runs.length; r += 3) {
    if (runs[r + 2] === 1) {
      junctionStepScalar(runs[r], runs[r + 1], n, p.jPort, p.jX, p.jK, p.jEx, p.pIn, p.pInMask, p.pK, p.pF, p.pOut, p.pOutMask,
        p.pNode, p.pY2, p.exRow, p.exSlot, p.exCoef, p.slot, p.mat, p.wave, p.rhs, p.inc, p.x);
    } else {
      junctionStep(runs[r], runs[r + 1], n, p.jPort, p.jX, p.jN, p.jB, p.jK, p.jA, p.jEx, p.pIn, p.pInMask, p.pK, p.pF,
        p.pOut, p.pOutMask, p.exRow, p.exSlot, p.exCoef, p.slot, p.mat, p.wave, p.rhs, p.inc, p.x);
    }
  }
}

/**
 * Phase: parts. Fills branch voltage v, current i and source value u of each part at t_n. Loads:
 * i flows plus -> minus through the part. Sources: i is delivered out of the plus terminal into
 * the network.
 */
export function computeParts(plan: Plan, partV: Float64Array, partI: Float64Array, partU: Float64Array): void {
  const x = plan.x;
  const slot = plan.slot;
  const parts = plan.parts;
  for (let k = 0; k < parts.length; k++) {
    const p = parts[k];
    const v = (p.xPlus >= 0 ? x[p.xPlus] : 0) - (p.xMinus >= 0 ? x[p.xMinus] : 0);
    let i = 0;
    let u = 0;
    switch (p.mode) {
      case 'linear':
        i = p.g * v + (p.slot >= 0 ? slot[p.slot] : 0);
        break;
      case 'short':
        i = x[p.xConstraint];
        break;
      case 'nonlinear':
        i = plan.nlCurrent[p.index];
        break;
      case 'vsource':
        u = slot[p.slot];
        i = -x[p.xConstraint];
        break;
      case 'norton':
        u = slot[p.slot];
        i = (u - v) * p.g;
        break;
      case 'isource':
        u = slot[p.slot];
        i = u - p.g * v;
        break;
    }
    partV[p.index] = v;
    partI[p.index] = i;
    partU[p.index] = u;
  }
}

/** Phase: accept hooks of the linear loads, with the branch values of computeParts. */
export function acceptParts(plan: Plan, tS: number, partV: Float64Array, partI: Float64Array, owned?: Uint8Array): void {
  const al = plan.acceptLoads;
  for (let k = 0; k < al.length; k++) {
    const p = al[k];
    if (owned && owned[p.part.junction] === 0) continue;
    (p.load as { accept: (v: number, i: number, t: number) => void }).accept(partV[p.index], partI[p.index], tS);
  }
}
