import { describe, expect, it } from 'vitest';
import { monotoneSlopes, varistorLoad } from '../index.ts';
import { current, expectClose, makeLoad, newtonSolve, slope, testContext } from './helpers.ts';

const VREF = 470;
const IREF = 1e-3;
const ALPHA = 30;
const powerLaw = (v: number): number => Math.sign(v) * IREF * Math.pow(Math.abs(v) / VREF, ALPHA);

/** Wallis integral int_0^pi sin^n x dx (n >= 0): pi (n-1)!!/n!! for even n, 2 (n-1)!!/n!! for odd n. */
function wallis(n: number): number {
  let r = n % 2 === 0 ? Math.PI : 2;
  for (let k = n; k >= 2; k -= 2) r *= (k - 1) / k;
  return r;
}

describe('varistorLoad', () => {
  it('follows the power law I = Iref (V/Vref)^alpha, odd in v, with its derivative', () => {
    const d = makeLoad(varistorLoad, { referenceVoltage: VREF, referenceCurrent: IREF, exponent: ALPHA });
    for (const v of [100, 400, 470, 520, 600, 800, -600]) {
      // Same formula through exp/log in the plugin: 1e-12 relative (alpha ln(v/Vref) rounds at 1e-15, times 30).
      expectClose(`i(${v} V)`, current(d, v), powerLaw(v), 1e-12, 1e-300);
      expectClose(`di/dv(${v} V)`, slope(d, v), (ALPHA * Math.abs(powerLaw(v))) / Math.abs(v), 1e-12, 1e-300);
    }
    expect(current(d, 0)).toBe(0);
    expect(slope(d, 0)).toBe(0);
  });

  it('interpolates a table in log-log: a table taken from a power law gives that law between its points', () => {
    // Log-log interpolation of points on I = k V^alpha is exactly that power law (a straight line
    // in ln I vs ln V; the monotone cubic reproduces straight lines). Tolerance 1e-12 relative.
    const rows: Array<[number, number]> = [1e-6, 1e-3, 1, 100, 5000].map((i) => [i, VREF * Math.pow(i / IREF, 1 / ALPHA)]);
    const d = makeLoad(varistorLoad, { points: rows });
    for (const v of [300, 420, 470, 505, 590, 650, 700]) expectClose(`i(${v} V)`, current(d, v), powerLaw(v), 1e-11);
  });

  it('passes through every table point of a kinked characteristic, stays monotone and keeps di/dv continuous', () => {
    // A characteristic with three regions (leakage, clamp, upturn), exponents 8, 40, 10 between points.
    const rows: Array<[number, number]> = [[1e-6, 300], [1e-3, 470], [10, 591], [1000, 750], [1e4, 940]];
    const d = makeLoad(varistorLoad, { points: rows });
    for (const [i, v] of rows) expectClose(`i at the point ${v} V`, current(d, v), i, 1e-12);
    let prev = 0;
    for (let v = 1; v < 1200; v += 0.5) {
      const i = current(d, v);
      expect(i, `monotone at ${v} V`).toBeGreaterThanOrEqual(prev);
      prev = i;
    }
    // Across each interior point, di/dv from just left and just right agree (C1): within the
    // change of a smooth slope over 2e-7 V of a ~100 V scale, 1e-5 relative.
    for (const [, v] of rows.slice(1, -1)) expectClose(`di/dv continuous at ${v} V`, slope(d, v - 1e-7), slope(d, v + 1e-7), 1e-5);
    // And di/dv matches a central difference of i(v) between points (error h^2 i'''/6, 1e-6).
    for (const v of [400, 520, 700, 900]) {
      const h = 1e-4;
      expectClose(`di/dv(${v} V)`, slope(d, v), (current(d, v + h) - current(d, v - h)) / (2 * h), 1e-6);
    }
  });

  it('absorbs the integral of v i over the run to 1e-6, stepped through its own hooks under a prescribed v(t)', () => {
    // v(t) = Vp sin(pi t / T) on [0, T]: int v i dt = Iref Vp (Vp/Vref)^alpha (T/pi) W(alpha + 1),
    // int i^2 dt = Iref^2 (Vp/Vref)^(2 alpha) (T/pi) W(2 alpha), W the Wallis integral (closed
    // form). The device sums dt v_mean i_mean (the ledger's step-centred product), which differs
    // from the exact integral by about (dt^2/4) int v' i' dt: 2.4e-6 relative for i^2 t at 4000
    // steps, so 20000 steps (1e-7) hold 1e-6 with margin.
    const vp = 600;
    const T = 20e-6;
    const n = 20000;
    const dt = T / n;
    const warnings: string[] = [];
    const d = makeLoad(varistorLoad, { referenceVoltage: VREF, referenceCurrent: IREF, exponent: ALPHA, ratedEnergy: 1e-3, currentThreshold: 1 }, testContext(dt, warnings));
    const out = new Float64Array(2);
    for (let k = 0; k <= n; k++) {
      const t = k * dt;
      const v = vp * Math.sin((Math.PI * t) / T);
      d.evaluate(v, t, out);
      d.accept?.(v, out[0], t);
    }
    const r = d.finish?.() as Record<string, number | string[]>;
    const ipk = IREF * Math.pow(vp / VREF, ALPHA);
    const energy = IREF * vp * Math.pow(vp / VREF, ALPHA) * (T / Math.PI) * wallis(ALPHA + 1);
    expectClose('energy [J]', r.energyJ as number, energy, 1e-6);
    expectClose('i2t [A2s]', r.i2tA2s as number, ipk * ipk * (T / Math.PI) * wallis(2 * ALPHA), 1e-6);
    // The peak falls on the step at T/2.
    expectClose('peak current [A]', r.peakCurrentA as number, ipk, 1e-12);
    // |i| > 1 A while sin > (1/ipk)^(1/alpha): T (1 - 2 asin(r)/pi); linear interpolation between steps, 1e-4.
    expectClose('time above 1 A [s]', r.timeAboveThresholdS as number, T * (1 - (2 * Math.asin(Math.pow(1 / ipk, 1 / ALPHA))) / Math.PI), 1e-4);
    // Rated 1 mJ, absorbed 2.59 mJ: one warning in the run summary's format.
    expect(energy).toBeGreaterThan(1e-3);
    expect(warnings).toHaveLength(1);
    expect(warnings[0]).toMatch(/^rating exceeded: D1 \(varistor\) energy/);
    expect(r.ratingsExceeded).toEqual(['energy']);
  });

  it('gives no warning within its rating', () => {
    const warnings: string[] = [];
    const d = makeLoad(varistorLoad, { ratedEnergy: 100, ratedCurrent: 1e3 }, testContext(1e-6, warnings));
    d.accept?.(500, current(d, 500), 1e-6);
    d.finish?.();
    expect(warnings).toEqual([]);
  });

  it('converges by Newton against a 10 kV source behind 10 ohm from bad starts in under 50 iterations to 1e-12 relative', () => {
    const d = makeLoad(varistorLoad, { referenceVoltage: VREF, referenceCurrent: IREF, exponent: ALPHA });
    for (const v0 of [0, 10e3, -5e3, 600]) {
      // Tolerance 1e-9 A on a ~940 A solution (1e-12 relative): the node equation's own rounding is ~1e-13 A.
      const sol = newtonSolve(d, 10e3, 10, v0, true, 1e-9);
      expect(sol.iterations, `start ${v0} V`).toBeLessThan(50);
      expect(sol.residualA).toBeLessThan(1e-9);
    }
  });

  it('rejects a table whose voltage does not rise, naming the row', () => {
    expect(() => makeLoad(varistorLoad, { points: [[1e-3, 470], [1, 460]] })).toThrow(/points\.1\.1|points\[1\]\[1\]|points/);
    try {
      makeLoad(varistorLoad, { points: [[1e-3, 470], [1, 460]] });
    } catch (e) {
      expect((e as { code?: string }).code).toBe('E_PARAM');
      expect(String((e as Error).message)).toMatch(/greater than the previous row's voltage/);
    }
  });
});

describe('monotoneSlopes', () => {
  it('gives the secant slope on straight data and limits overshoot (Fritsch-Carlson condition a^2 + b^2 <= 9)', () => {
    expect(Array.from(monotoneSlopes([0, 1, 2, 3], [0, 2, 4, 6]))).toEqual([2, 2, 2, 2]);
    const m = monotoneSlopes([0, 1, 2], [0, 0.01, 10]);
    const d0 = 0.01;
    expect((m[0] / d0) ** 2 + (m[1] / d0) ** 2).toBeLessThanOrEqual(9 + 1e-9);
  });
});
