import { describe, expect, it } from 'vitest';
import {
  combinationWaveSource, esdContactSource, heidler, integrateCurrent, lightningCurrentSource, measureImpulse,
} from '../index.ts';
import { makeSource, within } from './helpers.ts';

describe('measureImpulse', () => {
  it('finds the front and half-value times of a linear-front exponential-tail pulse in closed form', () => {
    // f = t on [0, 1], exp(-(t-1)/T) after: t10 = 0.1, t90 = 0.9 => T1 = 1.25 * 0.8 = 1, O1 = 0;
    // t50 = 1 + T ln 2 (closed form). Sampling error below endS/n = 1e-4.
    const T = 3;
    const m = measureImpulse((t) => (t < 1 ? t : Math.exp(-(t - 1) / T)), 20, 'current');
    expect(m.frontTimeS).toBeCloseTo(1, 4);
    expect(m.virtualOriginS).toBeCloseTo(0, 4);
    expect(m.timeToHalfS).toBeCloseTo(1 + T * Math.LN2, 4);
    // Voltage definition: t30 = 0.3, t90 = 0.9 => T1 = 1.67 * 0.6 = 1.002, O1 = 0.3 - 0.3 = 0.
    const v = measureImpulse((t) => (t < 1 ? t : Math.exp(-(t - 1) / T)), 20, 'voltage');
    expect(v.frontTimeS).toBeCloseTo(1.002, 4);
    expect(v.virtualOriginS).toBeCloseTo(0, 4);
  });
});

describe('combinationWaveSource', () => {
  // IEC 61000-4-5:2014, clause 6.2 (generator characteristics), tables of waveform parameters
  // (from memory): open-circuit voltage front 1.2 us +-30 %, half value 50 us +-20 %;
  // short-circuit current front 8 us +-20 %, half value 20 us +-20 %. Definitions of T1 from the
  // standard's clause 3: 1.67 (t90 - t30) for the voltage, 1.25 (t90 - t10) for the current.
  it('gives a 1.2/50 us open-circuit voltage within the IEC 61000-4-5 tolerances and the exact peak', () => {
    const w = makeSource(combinationWaveSource, { waveform: 'open-circuit-voltage', peak: 4000 });
    const m = measureImpulse((t) => w.value(t), 400e-6, 'voltage', 400_000);
    within('peak [V]', m.peak, 4000, 1e-6); // normalised in closed form; sampling near the flat peak costs < 1e-6
    within('T1 (IEC 61000-4-5 clause 6.2, +-30 %)', m.frontTimeS, 1.2e-6, 0.3);
    within('T2 (IEC 61000-4-5 clause 6.2, +-20 %)', m.timeToHalfS, 50e-6, 0.2);
    // Measured: T1 = 1.202 us, T2 = 50.00 us (0.2 % and 0.004 % off nominal): far inside; a wrong
    // time constant by 10 % would still pass the standard's band, so also hold the nominal to 1 %.
    within('T1 vs nominal', m.frontTimeS, 1.2e-6, 0.01);
    within('T2 vs nominal', m.timeToHalfS, 50e-6, 0.01);
  });

  it('gives an 8/20 us short-circuit current within the IEC 61000-4-5 tolerances, which no double exponential can', () => {
    const w = makeSource(combinationWaveSource, { waveform: 'short-circuit-current', peak: 2000 });
    const m = measureImpulse((t) => w.value(t), 100e-6, 'current', 400_000);
    within('peak [A]', m.peak, 2000, 1e-6);
    within('T1 (IEC 61000-4-5 clause 6.2, +-20 %)', m.frontTimeS, 8e-6, 0.2);
    within('T2 (IEC 61000-4-5 clause 6.2, +-20 %)', m.timeToHalfS, 20e-6, 0.2);
    within('T1 vs nominal', m.frontTimeS, 8e-6, 0.01); // measured 8.023 us
    within('T2 vs nominal', m.timeToHalfS, 20e-6, 0.01); // measured 19.94 us
    expect(w.value(0)).toBe(0);
  });

  it('normalises its peaks with the constants IEC 61000-4-5 Annex A quotes (A = 1.037 and 0.01243 per us^3)', () => {
    // IEC 61000-4-5:2014 Annex A (from memory): V = 1.037 Vp (1 - e^{-t/tau1}) e^{-t/tau2},
    // I = 0.01243 Ip t^3 e^{-t/tau} (t in us). The plugin computes its factors in closed form;
    // they must agree with the quoted ones to the quoted digits (half a unit in the last: 0.05 %).
    const v = makeSource(combinationWaveSource, { waveform: 'open-circuit-voltage', peak: 1 });
    const t = 10e-6;
    within('voltage factor', v.value(t) / ((1 - Math.exp(-t / 0.4074e-6)) * Math.exp(-t / 68.22e-6)), 1.037, 5e-4);
    const i = makeSource(combinationWaveSource, { waveform: 'short-circuit-current', peak: 1 });
    const tu = 10; // us
    within('current factor [1/us^3]', i.value(tu * 1e-6) / (tu ** 3 * Math.exp(-tu / 3.911)), 0.01243, 5e-4);
  });

  it('gives its Laplace transform in closed form, equal to a numerical integral of w(t) e^{-st}', () => {
    // Definition W(s) = int_0^inf w(t) e^{-st} dt, by the trapezoidal rule over 2 ms with 2e6
    // steps (h = 1 ns; the integrand's scale is >= 0.4 us, so the O(h^2) error is below 1e-6).
    for (const waveform of ['open-circuit-voltage', 'short-circuit-current']) {
      const w = makeSource(combinationWaveSource, { waveform, peak: 1, delay: 2e-6 });
      for (const [sigma, omega] of [[1e4, 0], [2e4, 2 * Math.PI * 50e3], [0, 2 * Math.PI * 200e3]]) {
        const n = 2_000_000;
        const h = 2e-3 / n;
        let re = 0;
        let im = 0;
        for (let k = 0; k <= n; k++) {
          const t = k * h;
          const c = k === 0 || k === n ? 0.5 : 1;
          const f = c * w.value(t) * Math.exp(-sigma * t);
          re += f * Math.cos(omega * t);
          im -= f * Math.sin(omega * t);
        }
        const out = new Float64Array(2);
        w.laplace?.(sigma, omega, out);
        const scale = Math.hypot(re * h, im * h);
        expect(Math.hypot(out[0] - re * h, out[1] - im * h) / scale, `${waveform} at s = ${sigma} + j${omega}`).toBeLessThan(1e-5);
      }
    }
  });

  it('is zero before its delay and shifted by it', () => {
    const w = makeSource(combinationWaveSource, { peak: 1, delay: 5e-6 });
    const w0 = makeSource(combinationWaveSource, { peak: 1 });
    expect(w.value(4.9e-6)).toBe(0);
    expect(w.value(5e-6 + 3e-6)).toBeCloseTo(w0.value(3e-6), 14);
  });
});

describe('lightningCurrentSource', () => {
  // IEC 62305-1:2010 Table 3 (lightning current parameters) and Annex B (Heidler parameters),
  // from memory except the first positive stroke (vetted in REFERENCES.md). Tolerances for test
  // currents, IEC 62305-1 Annex C (from memory): peak +-10 %, charge +-20 %, specific energy +-35 %.
  // The times T1, T2 get our own +-10 % (the standard's Heidler parameters are meant to give them).
  const cases = [
    { stroke: 'first-positive', peak: 200e3, t1: 10e-6, t2: 350e-6, end: 10e-3, q: 100, w: 10e6 },
    { stroke: 'first-negative', peak: 100e3, t1: 1e-6, t2: 200e-6, end: 6e-3 },
    { stroke: 'subsequent', peak: 50e3, t1: 0.25e-6, t2: 100e-6, end: 3e-3 },
  ] as const;
  for (const c of cases) {
    it(`gives the ${c.stroke} stroke of level I with peak, front and half-value times within tolerance`, () => {
      const w = makeSource(lightningCurrentSource, { stroke: c.stroke, level: 'I' });
      const m = measureImpulse((t) => w.value(t), 3 * c.t2, 'current', 600_000);
      within('peak (IEC 62305-1 Annex C, +-10 %)', m.peak, c.peak, 0.1);
      within('peak vs nominal (the table k gives it to 0.2 %)', m.peak, c.peak, 0.002);
      within('T1 (+-10 %, ours)', m.frontTimeS, c.t1, 0.1);
      within('T2 (+-10 %, ours)', m.timeToHalfS, c.t2, 0.1);
    });
  }

  it('carries about 100 C and 10 MJ/ohm in the first positive stroke of level I, by numerical integration', () => {
    // REFERENCES.md: charge about 100 C, specific energy about 10 MJ/ohm (IEC 62305-1 Table 3).
    // Trapezoid over 20 ms (41 tau2: the tail left out is below 1e-17 of the total) with 1e6 steps.
    const w = makeSource(lightningCurrentSource, { stroke: 'first-positive', level: 'I' });
    const r = integrateCurrent((t) => w.value(t), 20e-3, 1_000_000);
    within('Q (IEC 62305-1 Annex C, +-20 %)', r.chargeC, 100, 0.2);
    within('W/R (IEC 62305-1 Annex C, +-35 %)', r.specificEnergyJPerOhm, 10e6, 0.35);
    // Measured 100.23 C and 10.28 MJ/ohm; hold the charge to 1 % and W/R to 5 % of nominal too.
    within('Q vs nominal', r.chargeC, 100, 0.01);
    within('W/R vs nominal', r.specificEnergyJPerOhm, 10e6, 0.05);
  });

  it('scales the peak to 75 % at level II and 50 % at levels III and IV, with the sign of the polarity', () => {
    const i1 = makeSource(lightningCurrentSource, { level: 'I' }).value(30e-6);
    expect(makeSource(lightningCurrentSource, { level: 'II' }).value(30e-6) / i1).toBeCloseTo(0.75, 12);
    expect(makeSource(lightningCurrentSource, { level: 'IV' }).value(30e-6) / i1).toBeCloseTo(0.5, 12);
    expect(makeSource(lightningCurrentSource, { level: 'I', polarity: 'negative' }).value(30e-6)).toBe(-i1);
  });
});

describe('heidler', () => {
  it('is half the decay factor at t = tau1 and zero before t = 0', () => {
    // (t/tau1)^n/(1+(t/tau1)^n) = 1/2 at t = tau1, for every n (closed form).
    expect(heidler(19e-6, 19e-6, 485e-6, 10)).toBeCloseTo(0.5 * Math.exp(-19 / 485), 14);
    expect(heidler(-1e-6, 19e-6, 485e-6, 10)).toBe(0);
  });
});

describe('esdContactSource', () => {
  // IEC 61000-4-2:2008 Table 2 (contact discharge current waveform parameters, from memory;
  // 4 kV values vetted in REFERENCES.md): first peak 3.75 A/kV +-15 %, rise time (10-90 %)
  // 0.8 ns +-25 %, current at 30 ns 2 A/kV +-30 %, at 60 ns 1 A/kV +-30 %.
  for (const [level, kv] of [['1', 2], ['2', 4], ['3', 6], ['4', 8]] as const) {
    it(`meets the IEC 61000-4-2 current parameters at level ${level} (${kv} kV)`, () => {
      const w = makeSource(esdContactSource, { level });
      // The first peak: largest value in the first 5 ns (the second hump at ~25 ns is lower).
      const m = measureImpulse((t) => (t <= 5e-9 ? w.value(t) : 0), 10e-9, 'current', 200_000);
      within('first peak (+-15 %)', m.peak, 3.75 * kv, 0.15);
      within('rise 10-90 % (+-25 %)', m.rise10to90S, 0.8e-9, 0.25);
      within('i(30 ns) (+-30 %)', w.value(30e-9), 2 * kv, 0.3);
      within('i(60 ns) (+-30 %)', w.value(60e-9), 1 * kv, 0.3);
    });
  }

  it('takes a charge voltage instead of a level, with its sign', () => {
    const a = makeSource(esdContactSource, { voltage: -4000 });
    const b = makeSource(esdContactSource, { level: '2' });
    expect(a.value(30e-9)).toBeCloseTo(-b.value(30e-9), 12);
    expect(() => makeSource(esdContactSource, { voltage: 0 })).toThrow(/voltage/);
  });
});
