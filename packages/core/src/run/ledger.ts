/**
 * The energy ledger. Energies are accumulated step by step with the step-centred product
 * dt * ((v_n + v_{n-1}) / 2) * ((i_n + i_{n-1}) / 2), the quadrature that the trapezoidal companion
 * models conserve exactly (a capacitor's accumulated energy equals C v^2 / 2). Averaged voltages
 * and currents obey KVL and KCL at every junction, so by Tellegen's theorem the accumulated
 * energies balance to rounding: delivered = absorbed + stored in the lines, where the line
 * energy is computed independently from the waves in flight,
 * E = sum_m (dt / Z_m) * sum over the k_m intervals in the line of (mean wave)^2, both directions.
 * With fractional delays the interpolated partial interval makes the balance approximate; the
 * residual is reported. FDTD segments (lossy lines) add their field energy (C V^2/2 + L I^2/2 on
 * the grid) to `stored` and the energy dissipated in R and G to `lost`; their half-step stagger
 * leaves a residual of the scheme's order.
 */
import type { LedgerView } from '../plugins/api.ts';
import type { Plan } from '../compile/compile.ts';
import { fdtdStoredEnergy } from './fdtdPhase.ts';

/** Ledger state kept during a run. */
export interface Ledger {
  view: { -readonly [K in keyof LedgerView]: LedgerView[K] } & { delivered: Map<string, number>; absorbed: Map<string, number>; stored: Map<string, number>; lost: Map<string, number> };
  prevV: Float64Array;
  prevI: Float64Array;
  prevU: Float64Array;
  deliveredJ: Float64Array;
  absorbedJ: Float64Array;
  storedLineJ: Float64Array;
}

/** Creates an empty ledger for a plan. */
export function createLedger(plan: Plan): Ledger {
  const nP = plan.parts.length;
  const view = {
    delivered: new Map<string, number>(),
    absorbed: new Map<string, number>(),
    stored: new Map<string, number>(),
    lost: new Map<string, number>(),
    deliveredTotalJ: 0,
    absorbedTotalJ: 0,
    storedTotalJ: 0,
    lostTotalJ: 0,
    residualJ: 0,
  };
  for (const p of plan.parts) {
    if (p.part.role === 'source') view.delivered.set(p.part.id, 0);
    view.absorbed.set(p.part.id, 0);
  }
  for (const l of plan.scenario.lines) {
    view.stored.set(l.id, 0);
    view.lost.set(l.id, 0);
  }
  return {
    view,
    prevV: new Float64Array(nP),
    prevI: new Float64Array(nP),
    prevU: new Float64Array(nP),
    deliveredJ: new Float64Array(nP),
    absorbedJ: new Float64Array(nP),
    storedLineJ: new Float64Array(plan.scenario.lines.length),
  };
}

/**
 * Accumulates one step of part energies (after the parts phase filled v, i, u at t_n).
 * partV, partI: branch voltage and current (loads: plus to minus through the part; sources: the
 * current delivered out of the plus terminal). partU: source EMF value (V or A).
 */
export function accumulateLedger(plan: Plan, led: Ledger, partV: Float64Array, partI: Float64Array, partU: Float64Array): void {
  const dt = plan.dtS;
  const parts = plan.parts;
  for (let p = 0; p < parts.length; p++) {
    const vb = 0.5 * (partV[p] + led.prevV[p]);
    const ib = 0.5 * (partI[p] + led.prevI[p]);
    const ub = 0.5 * (partU[p] + led.prevU[p]);
    const mode = parts[p].mode;
    if (mode === 'linear' || mode === 'short' || mode === 'nonlinear') {
      led.absorbedJ[p] += dt * vb * ib;
    } else if (mode === 'isource') {
      led.deliveredJ[p] += dt * vb * ub;
      led.absorbedJ[p] += dt * vb * (ub - ib);
    } else {
      led.deliveredJ[p] += dt * ub * ib;
      led.absorbedJ[p] += dt * (ub - vb) * ib;
    }
    led.prevV[p] = partV[p];
    led.prevI[p] = partI[p];
    led.prevU[p] = partU[p];
  }
}

function windowEnergy(wave: Float64Array, off: number, mask: number, n: number, k: number, f: number): number {
  let e = 0;
  let prev = wave[off + (n & mask)];
  for (let j = 1; j <= k; j++) {
    const cur = wave[off + ((n - j) & mask)];
    const mid = 0.5 * (prev + cur);
    e += mid * mid;
    prev = cur;
  }
  if (f > 0) {
    const cur = wave[off + ((n - k - 1) & mask)];
    const mid = 0.5 * (prev + cur);
    e += f * mid * mid;
  }
  return e;
}

/** Recomputes line energies from the waves in flight at step n and refreshes the view's totals. */
export function refreshLedgerView(plan: Plan, led: Ledger, n: number): LedgerView {
  const v = led.view;
  let stored = 0;
  let lost = 0;
  plan.fdtd.forEach((f, k) => {
    const id = plan.scenario.lines[f.line].id;
    const e = fdtdStoredEnergy(plan, k);
    led.storedLineJ[f.line] = e;
    v.stored.set(id, e);
    v.lost.set(id, f.lostJ);
    stored += e;
    lost += f.lostJ;
  });
  for (const f of plan.fdLines) {
    // A frequency-dependent line reports the energy that went into it under `lost` (stored or
    // dissipated; its fitted model does not separate them).
    const id = plan.scenario.lines[f.line].id;
    v.lost.set(id, f.absorbedJ);
    lost += f.absorbedJ;
  }
  plan.scenario.lines.forEach((line, l) => {
    if (line.fdtdCells !== undefined || line.frequencyDependent) return;
    const ml = plan.modal[l];
    let e = 0;
    for (let m = 0; m < ml.n; m++) {
      const q = plan.lineModeOff[l] + m;
      const d = plan.delays[q];
      const s = windowEnergy(plan.wave, plan.fwdOff[q], plan.ringMask[q], n, d.k, d.f) +
        windowEnergy(plan.wave, plan.bwdOff[q], plan.ringMask[q], n, d.k, d.f);
      e += (plan.dtS / ml.Zm[m]) * s;
    }
    led.storedLineJ[l] = e;
    v.stored.set(line.id, e);
    stored += e;
  });
  let delivered = 0;
  let absorbed = 0;
  plan.parts.forEach((p, k) => {
    if (p.part.role === 'source') {
      v.delivered.set(p.part.id, led.deliveredJ[k]);
      delivered += led.deliveredJ[k];
    }
    v.absorbed.set(p.part.id, led.absorbedJ[k]);
    absorbed += led.absorbedJ[k];
  });
  v.deliveredTotalJ = delivered;
  v.absorbedTotalJ = absorbed;
  v.storedTotalJ = stored;
  v.lostTotalJ = lost;
  v.residualJ = delivered - absorbed - stored - lost;
  return v;
}
