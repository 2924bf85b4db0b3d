import { describe, expect, it } from 'vitest';
import loads, {
  capacitorLoad, inductorLoad, openLoad, parallelRlcLoad, resistorLoad, seriesRlcLoad, shortLoad, timedSwitchLoad,
} from '../index.ts';
import { makeLinear, maxError, stepCurrentDriven, stepThroughResistor, stepVoltageDriven } from './circuits.ts';

/*
 * Reference solutions (classic analytic results of linear circuit theory, any circuits text):
 *  - RC driven through R by a ramp vs = V0 t/T from rest: v_C = (V0/T)(t - tau (1 - e^{-t/tau})), tau = RC.
 *  - RL, the dual: i_L = (V0/(R T))(t - tau (1 - e^{-t/tau})), tau = L/R.
 *  - series RLC driven by the ramp vs = V0 t/T from rest (i(0) = 0, di/dt(0) = 0):
 *    i = (C V0/T)(1 - e^{-a t}(cos(w t) + (a/w) sin(w t))), a = R/(2L), w = sqrt(1/(LC) - a^2).
 *  - parallel RLC driven by the current ramp is = I0 t/T from rest, the dual:
 *    v = (L I0/T)(1 - e^{-a t}(cos(w t) + (a/w) sin(w t))), a = 1/(2RC), w = sqrt(1/(LC) - a^2).
 * Error bound: the trapezoidal rule has local error -(dt^3/12) y''' and global error O(dt^2)
 * (E. Hairer, S. P. Norsett, G. Wanner, Solving Ordinary Differential Equations I, 2nd ed.,
 * Springer 1993, ch. II; from memory). For a stable first-order system of time constant tau the
 * global error is then bounded to leading order by (dt^2/12) tau max|y'''|; tests allow 1.5 times
 * that for the higher-order terms. Halving dt must divide the error by 4: the ratio is checked
 * within [3.8, 4.2] (at dt = tau/20 the O(dt^3) terms shift it by a few per cent at most).
 */

const V0 = 1;
const T = 5e-9;
const ramp = (t: number): number => (V0 * t) / T;

function firstOrderRamp(tau: number, scale: number) {
  return (t: number): number => scale * (t - tau * (1 - Math.exp(-t / tau)));
}

function secondOrderRamp(final: number, a: number, w: number) {
  return (t: number): number => final * (1 - Math.exp(-a * t) * (Math.cos(w * t) + (a / w) * Math.sin(w * t)));
}

describe('loads', () => {
  it('lists the eight standard loads in a fixed order', () => {
    expect(loads.map((l) => l.type)).toEqual(['resistor', 'capacitor', 'inductor', 'series-rlc', 'parallel-rlc', 'short', 'open', 'timed-switch']);
  });
});

describe('resistorLoad', () => {
  it('has the conductance 1/R and no history', () => {
    const r = makeLinear(resistorLoad, { resistance: 50 }, 1e-9);
    expect(r.conductanceS).toBe(0.02);
    expect(r.history).toBeUndefined();
  });
});

describe('capacitorLoad', () => {
  const R = 50;
  const C = 20e-12;
  const tau = R * C;
  const exact = firstOrderRamp(tau, V0 / T);
  const run = (dt: number) => {
    const cap = makeLinear(capacitorLoad, { capacitance: C, initialVoltage: 0 }, dt);
    return { cap, out: stepThroughResistor(cap, ramp, R, dt, Math.round(10e-9 / dt)) };
  };
  it('charges through a resistor as the exact RC ramp response, within the trapezoidal error bound', () => {
    const dt = tau / 20;
    const { out } = run(dt);
    const bound = 1.5 * ((dt * dt) / 12) * tau * (V0 / (T * tau * tau)); // max|v'''| = V0/(T tau^2) at t = 0
    const err = maxError(out.v, exact, dt);
    expect(err).toBeLessThan(bound);
    expect(err).toBeGreaterThan(0);
  });
  it('is second-order accurate: halving dt divides the error by 4', () => {
    const e1 = maxError(run(tau / 20).out.v, exact, tau / 20);
    const e2 = maxError(run(tau / 40).out.v, exact, tau / 40);
    expect(e1 / e2).toBeGreaterThan(3.8);
    expect(e1 / e2).toBeLessThan(4.2);
  });
  it('stores C v^2 / 2, equal to the energy delivered to it and to the exact value', () => {
    const dt = tau / 40;
    const { cap, out } = run(dt);
    // Energy in by the step-centred product the ledger uses; the trapezoidal companion conserves
    // it exactly, so the two agree to rounding (1e-12 relative).
    let w = 0;
    for (let k = 1; k < out.v.length; k++) w += dt * 0.5 * (out.v[k] + out.v[k - 1]) * 0.5 * (out.i[k] + out.i[k - 1]);
    const vEnd = out.v[out.v.length - 1];
    const e = cap.storedEnergyJ!();
    expect(Math.abs(e - 0.5 * C * vEnd * vEnd)).toBeLessThanOrEqual(1e-15 * e);
    expect(Math.abs(w - e)).toBeLessThanOrEqual(1e-12 * e);
    // Against the exact v(10 ns): relative error 2 dv/v, dv within the bound of the test above.
    const vx = exact(10e-9);
    expect(Math.abs(e - 0.5 * C * vx * vx) / e).toBeLessThan(1e-3);
  });
  it('starts from its initial voltage', () => {
    const cap = makeLinear(capacitorLoad, { capacitance: 1e-9, initialVoltage: 2 }, 1e-9);
    const out = stepCurrentDriven(cap, () => 0, 1e-9, 3);
    expect(Array.from(out.v)).toEqual([2, 2, 2, 2]);
    expect(cap.storedEnergyJ!()).toBe(2e-9);
  });
});

describe('inductorLoad', () => {
  const R = 50;
  const L = 50e-9;
  const tau = L / R;
  const exact = firstOrderRamp(tau, V0 / (R * T));
  const run = (dt: number) => {
    const ind = makeLinear(inductorLoad, { inductance: L, initialCurrent: 0 }, dt);
    return { ind, out: stepThroughResistor(ind, ramp, R, dt, Math.round(10e-9 / dt)) };
  };
  it('follows the exact RL ramp response within the trapezoidal error bound', () => {
    const dt = tau / 20;
    const { ind, out } = run(dt);
    const bound = 1.5 * ((dt * dt) / 12) * tau * (V0 / (R * T * tau * tau));
    const err = maxError(out.i, exact, dt);
    expect(err).toBeLessThan(bound);
    const iEnd = out.i[out.i.length - 1];
    expect(Math.abs(ind.storedEnergyJ!() - 0.5 * L * iEnd * iEnd)).toBeLessThanOrEqual(1e-15 * ind.storedEnergyJ!());
  });
  it('is second-order accurate: halving dt divides the error by 4', () => {
    const e1 = maxError(run(tau / 20).out.i, exact, tau / 20);
    const e2 = maxError(run(tau / 40).out.i, exact, tau / 40);
    expect(e1 / e2).toBeGreaterThan(3.8);
    expect(e1 / e2).toBeLessThan(4.2);
  });
  it('keeps its initial current with no voltage across it', () => {
    const ind = makeLinear(inductorLoad, { inductance: 1e-6, initialCurrent: 0.5 }, 1e-9);
    const out = stepVoltageDriven(ind, () => 0, 1e-9, 3);
    expect(Array.from(out.i)).toEqual([0.5, 0.5, 0.5, 0.5]);
  });
});

describe('seriesRlcLoad', () => {
  const R = 20;
  const L = 100e-9;
  const C = 100e-12;
  const a = R / (2 * L);
  const w = Math.sqrt(1 / (L * C) - a * a);
  const exact = secondOrderRamp((C * V0) / T, a, w);
  const period = (2 * Math.PI) / w;
  const run = (dt: number) => {
    const rlc = makeLinear(seriesRlcLoad, { resistance: R, inductance: L, capacitance: C, initialCurrent: 0, initialVoltage: 0 }, dt);
    return stepVoltageDriven(rlc, ramp, dt, Math.round((3 * period) / dt));
  };
  it('follows the exact underdamped series RLC ramp response, second order in dt', () => {
    const dt = period / 200;
    const e1 = maxError(run(dt).i, exact, dt);
    const e2 = maxError(run(dt / 2).i, exact, dt / 2);
    // Trapezoidal phase error over 3 periods: (w dt)^2 / 12 per radian, 6 pi rad, times the
    // amplitude C V0 / T = 20 mA: 0.1 % of it at dt = period / 200 (leading order, allow 1.5x).
    const bound = 1.5 * (((w * dt) ** 2) / 12) * 6 * Math.PI * ((C * V0) / T);
    expect(e1).toBeLessThan(bound);
    expect(e1 / e2).toBeGreaterThan(3.8);
    expect(e1 / e2).toBeLessThan(4.2);
  });
  it('reduces to series RC when the inductance is left out', () => {
    const Rs = 50;
    const Cs = 20e-12;
    const tau = Rs * Cs;
    const dt = tau / 20;
    const rc = makeLinear(seriesRlcLoad, { resistance: Rs, capacitance: Cs, initialCurrent: 0, initialVoltage: 0 }, dt);
    const out = stepVoltageDriven(rc, ramp, dt, 200);
    // Series RC across a ramp: i = C dv_C/dt with v_C the RC ramp response: i = (C V0/T)(1 - e^{-t/tau}).
    const iExact = (t: number): number => ((Cs * V0) / T) * (1 - Math.exp(-t / tau));
    const bound = 1.5 * ((dt * dt) / 12) * tau * ((Cs * V0) / (T * tau ** 3));
    expect(maxError(out.i, iExact, dt)).toBeLessThan(bound);
  });
  it('rejects R = 0 with neither L nor C, naming the parameter', () => {
    expect(() => makeLinear(seriesRlcLoad, { resistance: 0, initialCurrent: 0, initialVoltage: 0 }, 1e-9)).toThrow(/resistance/);
  });
});

describe('parallelRlcLoad', () => {
  const R = 200;
  const L = 100e-9;
  const C = 100e-12;
  const I0 = 0.01;
  const a = 1 / (2 * R * C);
  const w = Math.sqrt(1 / (L * C) - a * a);
  const exact = secondOrderRamp((L * I0) / T, a, w);
  const period = (2 * Math.PI) / w;
  const run = (dt: number) => {
    const rlc = makeLinear(parallelRlcLoad, { resistance: R, inductance: L, capacitance: C, initialVoltage: 0, initialCurrent: 0 }, dt);
    return stepCurrentDriven(rlc, (t) => (I0 * t) / T, dt, Math.round((3 * period) / dt));
  };
  it('follows the exact underdamped parallel RLC response to a current ramp, second order in dt', () => {
    const dt = period / 200;
    const e1 = maxError(run(dt).v, exact, dt);
    const e2 = maxError(run(dt / 2).v, exact, dt / 2);
    const bound = 1.5 * (((w * dt) ** 2) / 12) * 6 * Math.PI * ((L * I0) / T);
    expect(e1).toBeLessThan(bound);
    expect(e1 / e2).toBeGreaterThan(3.8);
    expect(e1 / e2).toBeLessThan(4.2);
  });
  it('stores L i_L^2 / 2 + C v^2 / 2 equal to the energy delivered minus the energy dissipated in R', () => {
    const dt = period / 200;
    const rlc = makeLinear(parallelRlcLoad, { resistance: R, inductance: L, capacitance: C, initialVoltage: 0, initialCurrent: 0 }, dt);
    const out = stepCurrentDriven(rlc, (t) => (I0 * t) / T, dt, 600);
    let win = 0;
    let wr = 0;
    for (let k = 1; k < out.v.length; k++) {
      const vb = 0.5 * (out.v[k] + out.v[k - 1]);
      win += dt * vb * 0.5 * (out.i[k] + out.i[k - 1]);
      wr += (dt * vb * vb) / R;
    }
    const e = rlc.storedEnergyJ!();
    // Trapezoidal companions conserve the step-centred energy exactly: agreement to rounding.
    expect(Math.abs(win - wr - e)).toBeLessThanOrEqual(1e-12 * win);
  });
  it('rejects an empty parallel set', () => {
    expect(() => makeLinear(parallelRlcLoad, { initialVoltage: 0, initialCurrent: 0 }, 1e-9)).toThrow(/at least one/);
  });
});

describe('shortLoad', () => {
  it('is an ideal short for the engine', () => {
    const inst = shortLoad.create({} as never, { dtS: 1e-9, endS: 1, id: 's', warn: () => {} });
    expect(inst).toEqual({ kind: 'short' });
  });
});

describe('openLoad', () => {
  it('has zero conductance and no history', () => {
    const o = makeLinear(openLoad, {}, 1e-9);
    expect(o.conductanceS).toBe(0);
    expect(o.history).toBeUndefined();
  });
});

describe('timedSwitchLoad', () => {
  it('steps between 1/offResistance and 1/onResistance at closeAt and openAt', () => {
    const s = makeLinear(timedSwitchLoad, { closeAt: 1e-6, openAt: 3e-6, onResistance: 0.01, offResistance: 1e6 }, 1e-9);
    expect(s.conductanceS).toBe(1e-6);
    expect(s.conductanceAt!(0.999e-6)).toBe(1e-6);
    expect(s.conductanceAt!(1e-6)).toBe(100);
    expect(s.conductanceAt!(2.9e-6)).toBe(100);
    expect(s.conductanceAt!(3e-6)).toBe(1e-6);
  });
  it('is closed from the start with closeAt = 0 and no openAt', () => {
    const s = makeLinear(timedSwitchLoad, { closeAt: 0, onResistance: 1e-3, offResistance: 1e9 }, 1e-9);
    expect(s.conductanceS).toBe(1000);
    expect(s.conductanceAt!(1)).toBe(1000);
  });
  it('rejects openAt not after closeAt', () => {
    expect(() => makeLinear(timedSwitchLoad, { closeAt: 2e-6, openAt: 1e-6, onResistance: 1e-3, offResistance: 1e9 }, 1e-9)).toThrow(/openAt/);
  });
});

describe('admittance hooks', () => {
  it('give the textbook admittances of R, C, L and series and parallel RLC', async () => {
    // Y = 1/R, j w C, 1/(j w L); series RLC resonates at w0 = 1/sqrt(LC) with Y = 1/R (circuit
    // theory, common practice).
    const { resistorLoad, capacitorLoad, inductorLoad, seriesRlcLoad, parallelRlcLoad } = await import('../index.ts');
    const ctx = { dtS: 1e-9, endS: 1e-6, id: 'x', warn: () => {} };
    const out = new Float64Array(2);
    const w = 2 * Math.PI * 1e6;
    const y = async (plugin: any, params: any): Promise<[number, number]> => {
      const inst = await plugin.create(params, ctx);
      inst.admittance(w, out);
      return [out[0], out[1]];
    };
    expect(await y(resistorLoad, { resistance: 50 })).toEqual([0.02, 0]);
    const [, bc] = await y(capacitorLoad, { capacitance: 1e-9, initialVoltage: 0 });
    expect(Math.abs(bc - w * 1e-9)).toBeLessThan(1e-18);
    const [, bl] = await y(inductorLoad, { inductance: 1e-6, initialCurrent: 0 });
    expect(Math.abs(bl + 1 / (w * 1e-6))).toBeLessThan(1e-15);
    const L = 1e-6;
    const C = 1 / (w * w * L);
    const [gs, bs] = await y(seriesRlcLoad, { resistance: 10, inductance: L, capacitance: C, initialCurrent: 0, initialVoltage: 0 });
    expect(Math.abs(gs - 0.1)).toBeLessThan(1e-12);
    expect(Math.abs(bs)).toBeLessThan(1e-9);
    const [gp, bp] = await y(parallelRlcLoad, { resistance: 10, inductance: L, capacitance: C, initialCurrent: 0, initialVoltage: 0 });
    expect(Math.abs(gp - 0.1)).toBeLessThan(1e-12);
    expect(Math.abs(bp)).toBeLessThan(1e-9);
  });
});

describe('admittanceAt hooks', () => {
  it('give the Laplace-domain admittances 1/R, sC, 1/(sL), series and parallel RLC at complex s', async () => {
    // Circuit theory (common practice): Y(s) = 1/R, s C, 1/(s L), 1/(R + s L + 1/(s C)),
    // 1/R + s C + 1/(s L), here at s = sigma + j omega evaluated with complex arithmetic by hand;
    // at sigma = 0 the hook must equal `admittance` (the analytic continuation agrees on the axis).
    const { resistorLoad, capacitorLoad, inductorLoad, seriesRlcLoad, parallelRlcLoad, openLoad } = await import('../index.ts');
    const ctx = { dtS: 1e-9, endS: 1e-6, id: 'x', warn: () => {} };
    const out = new Float64Array(2);
    const axis = new Float64Array(2);
    const sr = 3e5, si = 2 * Math.PI * 1e5;
    const inv = (a: number, b: number): [number, number] => [a / (a * a + b * b), -b / (a * a + b * b)];
    const R = 10, L = 1e-6, C = 1e-9;
    const cases: Array<[any, any, [number, number]]> = [
      [resistorLoad, { resistance: 50 }, [0.02, 0]],
      [openLoad, {}, [0, 0]],
      [capacitorLoad, { capacitance: C, initialVoltage: 0 }, [sr * C, si * C]],
      [inductorLoad, { inductance: L, initialCurrent: 0 }, inv(sr * L, si * L)],
      [seriesRlcLoad, { resistance: R, inductance: L, capacitance: C, initialCurrent: 0, initialVoltage: 0 },
        (() => { const [a, b] = inv(sr * C, si * C); return inv(R + sr * L + a, si * L + b); })()],
      [parallelRlcLoad, { resistance: R, inductance: L, capacitance: C, initialCurrent: 0, initialVoltage: 0 },
        (() => { const [a, b] = inv(sr * L, si * L); return [1 / R + sr * C + a, si * C + b] as [number, number]; })()],
    ];
    for (const [plugin, params, want] of cases) {
      const inst = await plugin.create(params, ctx);
      inst.admittanceAt(sr, si, out);
      const scale = Math.hypot(want[0], want[1]) || 1;
      expect(Math.abs(out[0] - want[0]) / scale).toBeLessThan(1e-13);
      expect(Math.abs(out[1] - want[1]) / scale).toBeLessThan(1e-13);
      inst.admittanceAt(0, si, out);
      inst.admittance(si, axis);
      expect(Math.abs(out[0] - axis[0]) + Math.abs(out[1] - axis[1])).toBeLessThanOrEqual(1e-15 * (Math.hypot(axis[0], axis[1]) || 1));
    }
  });
});
