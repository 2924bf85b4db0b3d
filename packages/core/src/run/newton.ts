/**
 * Phase: junctions with nonlinear devices, at t_n, by Newton's method on the junction's own
 * small nodal system. Each iteration linearises every device at its present voltage v_d,
 * i ~ i(v_d) + g_d (v - v_d) with g_d = di/dv (a conductance g_d and a current i(v_d) - g_d v_d),
 * solves the linear system in place, and lets the device limit its next voltage (the `limit` hook,
 * e.g. logarithmic limiting of an exponential junction). Converged when every device voltage
 * moves by less than 1e-9 (1 + |v|) V. The emitted waves then follow from the node voltages as
 * in the linear kernels. Newton's method for circuit equations: e.g. L. O. Chua and P.-M. Lin,
 * Computer-Aided Analysis of Electronic Circuits, 1975, ch. 5 (from memory).
 */
import type { NonlinearJunction, Plan } from '../compile/compile.ts';
import { solveInPlace } from '../compile/invert.ts';
import { NumericalError } from '../errors.ts';
import { junctionEmit } from '../kernel/junctionEmit.ts';
import { junctionGather } from '../kernel/junctionGather.ts';

/** Iteration cap of one junction solve. */
export const NEWTON_MAX_ITERATIONS = 200;
const REL_TOL = 1e-9;

function stamp(a: Float64Array, R: number, p: number, m: number, g: number): void {
  if (p >= 0) a[p * R + p] += g;
  if (m >= 0) a[m * R + m] += g;
  if (p >= 0 && m >= 0) {
    a[p * R + m] -= g;
    a[m * R + p] -= g;
  }
}

function solveJunction(plan: Plan, nj: NonlinearJunction, n: number, tS: number): void {
  const p = plan;
  const j = nj.junction;
  const R = nj.R;
  junctionGather(j, n, p.jPort, p.jX, p.jB, p.jEx, p.pIn, p.pInMask, p.pK, p.pF, p.exRow, p.exSlot, p.exCoef, p.slot, p.mat, p.wave, nj.rhs0, p.inc);
  const a = nj.a;
  const b = nj.b;
  const out = nj.out;
  const devs = nj.devices;
  const x0 = p.jX[j];
  let converged = false;
  let it = 0;
  for (; it < NEWTON_MAX_ITERATIONS && !converged; it++) {
    a.set(nj.base);
    b.set(nj.rhs0);
    for (let k = 0; k < nj.varying.length; k++) {
      const l = nj.varying[k];
      stamp(a, R, l.rowPlus, l.rowMinus, l.g);
    }
    for (let k = 0; k < devs.length; k++) {
      const d = devs[k];
      d.instance.evaluate(d.v, tS, out);
      const g = out[1];
      const ieq = out[0] - g * d.v;
      stamp(a, R, d.rowPlus, d.rowMinus, g);
      if (d.rowPlus >= 0) b[d.rowPlus] -= ieq;
      if (d.rowMinus >= 0) b[d.rowMinus] += ieq;
    }
    const pivot = solveInPlace(R, a, b);
    if (!(pivot > 1e-15)) {
      throw new NumericalError('E_NEWTON_SINGULAR', `junction ${p.scenario.junctions[j].id}: the linearised system is singular at t = ${tS.toExponential(4)} s (step ${n}); a device reports zero conductance with no other path to the reference`, { junction: p.scenario.junctions[j].id, step: n, timeS: tS });
    }
    converged = it > 0;
    for (let k = 0; k < devs.length; k++) {
      const d = devs[k];
      let v = (d.rowPlus >= 0 ? b[d.rowPlus] : 0) - (d.rowMinus >= 0 ? b[d.rowMinus] : 0);
      if (d.instance.limit) v = d.instance.limit(v, d.v);
      if (!(Math.abs(v - d.v) <= REL_TOL * (1 + Math.abs(v)))) converged = false;
      d.v = v;
    }
  }
  if (!converged) {
    const names = devs.map((d) => d.part.part.id).join(', ');
    throw new NumericalError('E_NEWTON_NO_CONVERGENCE', `junction ${p.scenario.junctions[j].id}: Newton's method did not converge in ${NEWTON_MAX_ITERATIONS} iterations at t = ${tS.toExponential(4)} s (step ${n}), devices ${names}; a shorter time.step or a device model with a limit hook helps`, { junction: p.scenario.junctions[j].id, step: n, timeS: tS, parts: names });
  }
  for (let r = 0; r < R; r++) p.x[x0 + r] = b[r];
  for (let k = 0; k < devs.length; k++) {
    const d = devs[k];
    d.instance.evaluate(d.v, tS, out);
    d.i = out[0];
    p.nlCurrent[d.part.index] = out[0];
  }
  junctionEmit(j, n, p.jPort, p.jX, p.jN, p.jA, p.pOut, p.pOutMask, p.mat, p.wave, p.inc, p.x);
}

/** Phase: every nonlinear junction at step n. */
export function phaseNonlinear(plan: Plan, n: number, tS: number): void {
  const list = plan.nonlinear;
  for (let k = 0; k < list.length; k++) solveJunction(plan, list[k], n, tS);
}

/** After the parts phase: the accept hook of every device with its converged voltage and current. */
export function acceptNonlinear(plan: Plan, tS: number): void {
  const list = plan.nonlinear;
  for (let k = 0; k < list.length; k++) {
    const devs = list[k].devices;
    for (let m = 0; m < devs.length; m++) {
      const d = devs[m];
      d.instance.accept?.(d.v, d.i, tS);
    }
  }
}
