import { describe, expect, it } from 'vitest';
import type { NonlinearLoadInstance } from '@skein/core';
import { diodeLoad, limitExponentialStep, thermalVoltage, tvsClampLoad } from '../index.ts';
import { current, expectClose, makeLoad, newtonSolve, slope, testContext } from './helpers.ts';

const IS = 1e-14;
const VT = thermalVoltage(300);

describe('thermalVoltage', () => {
  it('is kT/q, 25.852 mV at 300 K', () => {
    // CODATA 2018: k = 1.380649e-23 J/K, q = 1.602176634e-19 C (exact) -> 25.8520 mV.
    expect(thermalVoltage(300)).toBeCloseTo(0.025852, 6);
  });
});

describe('diodeLoad', () => {
  it('follows the Shockley equation at several points, forward and reverse', () => {
    // W. Shockley, Bell Syst. Tech. J. 28 (1949): i = Is (exp(v/(n Vt)) - 1). Same formula in
    // double precision: agreement to 1e-12 relative (a few rounding steps).
    for (const n of [1, 1.8]) {
      const d = makeLoad(diodeLoad, { saturationCurrent: IS, emissionCoefficient: n });
      for (const v of [-5, -0.1, 0, 0.2, 0.5, 0.65, 0.75]) {
        expectClose(`i(${v} V), n = ${n}`, current(d, v), IS * Math.expm1(v / (n * VT)), 1e-12, 1e-30);
      }
    }
  });

  it('has di/dv equal to a central finite difference of i(v), with and without series resistance', () => {
    // Central difference error ~ h^2 i'''/6: with h = 1e-6 V and i'''/i' <= 1/Vt^2 that is below
    // 1e-9 relative; rounding adds ~1e-16 * i / h = 1e-10 relative. Tolerance 1e-7.
    for (const rs of [0, 0.5]) {
      const d = makeLoad(diodeLoad, { saturationCurrent: IS, seriesResistance: rs });
      for (const v of [-1, 0.3, 0.6, 0.7, 0.9, 2]) {
        const h = 1e-6;
        const fd = (current(d, v + h) - current(d, v - h)) / (2 * h);
        expectClose(`di/dv(${v} V), Rs = ${rs}`, slope(d, v), fd, 1e-7, 1e-25);
      }
    }
  });

  it('solves the series resistance exactly: i = Is (exp((v - i Rs)/Vt) - 1)', () => {
    const rs = 0.5;
    const d = makeLoad(diodeLoad, { saturationCurrent: IS, seriesResistance: rs });
    for (const v of [0.5, 0.8, 1.5, 10]) {
      const i = current(d, v);
      // The residual of the implicit equation, relative to i; the junction voltage is solved to 1e-15.
      expectClose(`implicit equation at ${v} V`, IS * Math.expm1((v - i * rs) / VT), i, 1e-9);
    }
    // At 10 V nearly all the excess drops across Rs: i ~ (10 - ~0.8)/0.5 ~ 18.4 A.
    expect(current(d, 10)).toBeGreaterThan(18);
  });

  it('adds the junction capacitance current C dv/dt under v = a t^2 (trapezoidal companion, exact for it)', () => {
    // Reverse bias, v = a t^2 from rest: i_C = 2 a C t. The trapezoidal rule
    // (i_n + i_{n-1})/2 = C (v_n - v_{n-1})/dt holds exactly for it with i_C(0) = 0 (consistent
    // start), so i = -Is (1 - e^{v/Vt}) + 2 a C t to rounding (tolerance 1e-9 relative).
    const c = 100e-12;
    const dt = 1e-9;
    const a = -1e15; // V/s^2
    const d = makeLoad(diodeLoad, { saturationCurrent: IS, junctionCapacitance: c }, testContext(dt));
    const out = new Float64Array(2);
    for (let k = 0; k <= 20; k++) {
      const t = k * dt;
      const v = a * t * t;
      d.evaluate(v, t, out);
      if (k > 0) expectClose(`i at step ${k}`, out[0], IS * Math.expm1(v / VT) + 2 * a * c * t, 1e-9);
      d.accept?.(v, out[0], t);
    }
    const v20 = a * (20 * dt) ** 2;
    expectClose('stored energy C v^2/2', d.storedEnergyJ?.() ?? 0, 0.5 * c * v20 * v20, 1e-12);
  });

  it('converges by Newton against a resistor and a source from bad starts in under 50 iterations to 1e-12 A', () => {
    // 5 V behind 1 kohm into the diode. Reference: the exact solution with the Lambert W function,
    // i = (n Vt / R) W(Is R/(n Vt) exp((Vs + Is R)/(n Vt))) - Is (T. C. Banwell, A. Jayakumar,
    // Electronics Letters 36(4), 2000, from memory), W evaluated in logs by Newton's method.
    const vs = 5;
    const r = 1000;
    const lnZ = Math.log((IS * r) / VT) + (vs + IS * r) / VT;
    let w = lnZ - Math.log(lnZ);
    for (let k = 0; k < 50; k++) w -= (w + Math.log(w) - lnZ) / (1 + 1 / w);
    const iExact = (VT / r) * w - IS;
    const vExact = vs - r * iExact;
    for (const v0 of [vs, -10, 0, 3, 0.9]) {
      const d = makeLoad(diodeLoad, { saturationCurrent: IS });
      const sol = newtonSolve(d, vs, r, v0);
      expect(sol.iterations, `start ${v0} V`).toBeLessThan(50);
      expect(sol.residualA).toBeLessThan(1e-12);
      // The solution agrees with the closed form to 1e-9 V (the residual 1e-12 A times R = 1e-9 V).
      expect(Math.abs(sol.v - vExact)).toBeLessThan(1e-9);
    }
    // The limiting is what makes the upward starts converge: without it a start at 0 V overshoots
    // to 5 V and more iterations are needed.
    const plain = newtonSolve(makeLoad(diodeLoad, { saturationCurrent: IS }), vs, r, -10, false);
    const limited = newtonSolve(makeLoad(diodeLoad, { saturationCurrent: IS }), vs, r, -10, true);
    expect(limited.iterations).toBeLessThan(plain.iterations);
  });
});

describe('limitExponentialStep', () => {
  it('shortens a step up beyond the critical voltage to the logarithmic limit and leaves other steps alone', () => {
    const vcrit = VT * Math.log(VT / (Math.SQRT2 * IS));
    expect(limitExponentialStep(5, 0.6, VT, vcrit, 0)).toBeCloseTo(0.6 + VT * Math.log(1 + 4.4 / VT), 12);
    expect(limitExponentialStep(0.3, 0.6, VT, vcrit, 0)).toBe(0.3); // step down
    expect(limitExponentialStep(0.5, 0.2, VT, vcrit, 0)).toBe(0.5); // below vcrit
  });
});

describe('tvsClampLoad', () => {
  const p = { breakdownVoltage: 33, testCurrent: 1e-3, clampVoltage: 53, peakPulseCurrent: 28, slopeVoltage: 0.66 };

  /** Voltage at which the clamp carries current i, by bisection. */
  function voltageAt(d: NonlinearLoadInstance, i: number): number {
    let lo = 0;
    let hi = 1000;
    for (let k = 0; k < 200; k++) {
      const m = 0.5 * (lo + hi);
      if (current(d, m) < i) lo = m;
      else hi = m;
    }
    return 0.5 * (lo + hi);
  }

  it('clamps at the clamp voltage at the peak pulse current and breaks down at Vbr at the test current', () => {
    // By construction of Rd from the datasheet points (module doc): v(Ipp) = Vc, v(It) = Vbr + It Rd.
    // The zero-offset term It exp(-Vbr/Vs) = 2e-25 A changes nothing at 1e-9.
    const d = makeLoad(tvsClampLoad, p);
    const rd = (53 - 33 - 0.66 * Math.log(28 / 1e-3)) / 28;
    expectClose('v(Ipp)', voltageAt(d, 28), 53, 1e-9);
    expectClose('v(It)', voltageAt(d, 1e-3), 33 + 1e-3 * rd, 1e-9);
    expect(Math.abs(current(d, 20))).toBeLessThan(1e-11); // standoff: leakage only
  });

  it('is odd when bidirectional and conducts forward below 0 V when unidirectional', () => {
    const b = makeLoad(tvsClampLoad, p);
    expectClose('odd', current(b, -40), -current(b, 40), 1e-12);
    const u = makeLoad(tvsClampLoad, { ...p, polarity: 'unidirectional' });
    expect(current(u, -2)).toBeLessThan(-1); // forward diode (and Rd), amperes at 2 V
    expectClose('reverse side unchanged', current(u, 40), current(b, 40), 1e-9);
  });

  it('converges by Newton from a bad start against a 1 kV source behind 2 ohm', () => {
    const d = makeLoad(tvsClampLoad, p);
    for (const v0 of [0, 1000, -50]) {
      // Tolerance 1e-9 A, 2.6e-12 of the 388 A solution: (1000 - v)/2 and i(v) round at ~1e-13 A
      // each, and the inner junction solve leaves ~1e-15 V times the conductance.
      const sol = newtonSolve(d, 1000, 2, v0, true, 1e-9);
      expect(sol.iterations, `start ${v0} V`).toBeLessThan(50);
      expect(sol.residualA).toBeLessThan(1e-9);
    }
  });

  it('rejects a clamp voltage that leaves no dynamic resistance, naming the parameter', () => {
    expect(() => makeLoad(tvsClampLoad, { ...p, clampVoltage: 35 })).toThrow(/clampVoltage/);
  });
});

describe('DiodeDevice', () => {
  it('gives the small-signal admittance 1/(Rs + 1/(Is/Vt + j omega C)) around 0 V', () => {
    // Closed form of the linearised junction (g0 = Is/(n Vt)) with C in parallel and Rs in series.
    const d = makeLoad(diodeLoad, { saturationCurrent: 1e-6, seriesResistance: 10, junctionCapacitance: 1e-9 });
    const out = new Float64Array(2);
    const w = 2 * Math.PI * 1e6;
    d.admittance?.(w, out);
    const g0 = 1e-6 / VT;
    const zr = 10 + g0 / (g0 * g0 + (w * 1e-9) ** 2);
    const zi = -(w * 1e-9) / (g0 * g0 + (w * 1e-9) ** 2);
    expectClose('Re Y', out[0], zr / (zr * zr + zi * zi), 1e-9);
    expectClose('Im Y', out[1], -zi / (zr * zr + zi * zi), 1e-9);
  });

  it('continues the small-signal admittance to s = sigma + j omega as 1/(Rs + 1/(g0 + s C))', () => {
    // The same closed form with j omega C replaced by s C (Laplace domain, common practice).
    const d = makeLoad(diodeLoad, { saturationCurrent: 1e-6, seriesResistance: 10, junctionCapacitance: 1e-9 });
    const out = new Float64Array(2);
    const sr = 4e5, w = 2 * Math.PI * 1e6;
    d.admittanceAt?.(sr, w, out);
    const gr = 1e-6 / VT + sr * 1e-9, gi = w * 1e-9;
    const zr = 10 + gr / (gr * gr + gi * gi);
    const zi = -gi / (gr * gr + gi * gi);
    expectClose('Re Y', out[0], zr / (zr * zr + zi * zi), 1e-12);
    expectClose('Im Y', out[1], -zi / (zr * zr + zi * zi), 1e-12);
  });
});

describe('JunctionDevice', () => {
  it('returns NaN, not a hang, for a non-finite branch voltage', () => {
    const d = makeLoad(diodeLoad, { seriesResistance: 1 });
    expect(current(d, Number.NaN)).toBeNaN();
    expect(current(d, Number.POSITIVE_INFINITY)).toBeNaN();
    // and recovers on the next finite voltage (the warm start was not overwritten)
    expectClose('after NaN', current(d, 0.5), IS * Math.expm1((0.5 - current(d, 0.5)) / VT), 1e-9);
  });
});
