import { describe, expect, it } from 'vitest';
import type { SetupContext, SourcePlugin, WaveformInstance } from '@skein/core';
import waveforms, {
  doubleExponentialPeakTime, doubleExponentialSource, gaussianSource, rampSource, sineSource, stepSource, tableSource, trapezoidSource,
} from '../index.ts';

const ctx: SetupContext = { dtS: 1e-12, endS: 1e-6, id: 'test', warn: () => {} };
// Factories are synchronous here; the cast only narrows the declared union with a Promise.
const make = (plugin: SourcePlugin<any>, params: Record<string, unknown>): WaveformInstance => plugin.create(params as never, ctx) as WaveformInstance;

/** Relative tolerance with an absolute floor (the one compare rule of STYLE.md). */
function close(got: number, expected: number, rel: number, abs = 0): void {
  const err = Math.abs(got - expected);
  expect(err, `got ${got}, expected ${expected}, relative error ${err / Math.abs(expected || 1)}`).toBeLessThanOrEqual(Math.max(rel * Math.abs(expected), abs));
}

// Tolerances of 1e-12 relative below: each value is a closed form evaluated in float64, a few roundings away.
describe('waveforms', () => {
  it('lists the seven standard waveforms in a fixed order with kebab-case types', () => {
    expect(waveforms.map((w) => w.type)).toEqual(['step', 'ramp', 'trapezoid', 'gaussian', 'sine', 'double-exponential', 'table']);
    for (const w of waveforms) expect(w.kind).toBe('source');
  });
});

describe('stepSource', () => {
  it('is 0 before the delay and the amplitude from the delay on when ideal', () => {
    const w = make(stepSource, { amplitude: 2, delay: 1e-9, rise: 0, edge: 'linear' });
    expect(w.value(0.999e-9)).toBe(0);
    expect(w.value(1e-9)).toBe(2);
    expect(w.value(5e-9)).toBe(2);
    expect(w.shortestFeatureS).toBeUndefined();
    expect(w.settledAfterS).toBe(1e-9);
  });
  it('rises linearly or as a raised cosine over the rise time', () => {
    const lin = make(stepSource, { amplitude: 4, delay: 0, rise: 2e-9, edge: 'linear' });
    close(lin.value(0.5e-9), 1, 1e-12);
    close(lin.value(1e-9), 2, 1e-12);
    const sm = make(stepSource, { amplitude: 4, delay: 0, rise: 2e-9, edge: 'smooth' });
    // 4 * 0.5 (1 - cos(pi/4)) = 0.585786 (closed form of the raised cosine).
    close(sm.value(0.5e-9), 2 * (1 - Math.SQRT1_2), 1e-12);
    close(sm.value(1e-9), 2, 1e-12);
    expect(sm.value(3e-9)).toBe(4);
    expect(sm.shortestFeatureS).toBe(2e-9);
  });
});

describe('rampSource', () => {
  it('goes linearly from 0 to the amplitude over the rise and then holds', () => {
    const w = make(rampSource, { amplitude: 3, delay: 1e-9, rise: 4e-9 });
    expect(w.value(0.5e-9)).toBe(0);
    close(w.value(2e-9), 0.75, 1e-12);
    close(w.value(4e-9), 2.25, 1e-12);
    expect(w.value(10e-9)).toBe(3);
    expect(w.settledAfterS).toBe(5e-9);
  });
});

describe('trapezoidSource', () => {
  it('rises, holds the flat top for the width, falls and returns to 0', () => {
    const w = make(trapezoidSource, { amplitude: 1, delay: 1e-9, rise: 1e-9, width: 10e-9, fall: 2e-9 });
    expect(w.value(0.5e-9)).toBe(0);
    close(w.value(1.5e-9), 0.5, 1e-12);
    expect(w.value(6e-9)).toBe(1);
    close(w.value(13e-9), 0.5, 1e-12);
    expect(w.value(15e-9)).toBe(0);
    expect(w.shortestFeatureS).toBe(1e-9);
    close(w.settledAfterS!, 14e-9, 1e-12);
  });
});

describe('gaussianSource', () => {
  it('has the value A exp(-(t - tc)^2 / (2 sigma^2)) at one and two sigma', () => {
    const w = make(gaussianSource, { amplitude: 2, centre: 10e-9, width: 1e-9 });
    expect(w.value(10e-9)).toBe(2);
    close(w.value(11e-9), 2 * Math.exp(-0.5), 1e-12);
    close(w.value(8e-9), 2 * Math.exp(-2), 1e-12);
  });
  it('centres at 5 sigma when no centre is given', () => {
    const w = make(gaussianSource, { amplitude: 1, width: 2e-9 });
    expect(w.value(10e-9)).toBe(1);
  });
  it('integrates to sqrt(2 pi) sigma A', () => {
    // Gaussian integral, classic result: int exp(-x^2 / (2 s^2)) dx = sqrt(2 pi) s.
    const sigma = 1e-9;
    const A = 3;
    const w = make(gaussianSource, { amplitude: A, centre: 10 * sigma, width: sigma });
    // Trapezoidal sum over +-10 sigma with h = sigma/50: for a Gaussian the trapezoidal rule is
    // spectrally accurate (error ~ exp(-2 pi^2 sigma^2 / h^2)), and the tails beyond 10 sigma are
    // below 1e-22 of the peak, so the sum is exact to rounding: 1e-12 relative.
    const h = sigma / 50;
    let s = 0;
    for (let k = 0; k <= 1000; k++) s += (k === 0 || k === 1000 ? 0.5 : 1) * w.value(k * h);
    close(s * h, Math.sqrt(2 * Math.PI) * sigma * A, 1e-12);
  });
  it('rejects a negative centre naming the parameter', () => {
    expect(() => make(gaussianSource, { amplitude: 1, centre: -1e-9, width: 1e-9 })).toThrow(/centre/);
  });
});

describe('sineSource', () => {
  it('follows A sin(2 pi f (t - delay) + phase in degrees) after the delay', () => {
    const w = make(sineSource, { amplitude: 2, frequency: 1e6, phase: 30, delay: 1e-6, rise: 0 });
    expect(w.value(0.5e-6)).toBe(0);
    close(w.value(1e-6), 1, 1e-12); // 2 sin(30 deg) = 1
    close(w.value(1.25e-6), 2 * Math.sin(Math.PI / 2 + Math.PI / 6), 1e-12);
    close(w.shortestFeatureS!, 1 / (20 * 1e6), 1e-15);
    expect(w.settledAfterS).toBeUndefined();
  });
  it('starts softly with a raised-cosine envelope over the rise', () => {
    const w = make(sineSource, { amplitude: 1, frequency: 1e6, phase: 90, delay: 0, rise: 2e-6 });
    // cos(2 pi * 0.5) = -1 at t = 0.5 us, envelope 0.5 (1 - cos(pi/4)).
    close(w.value(1e-6), Math.cos(2 * Math.PI) * 0.5, 1e-12);
    close(w.value(0.25e-6), Math.cos(Math.PI / 2) * 0.5 * (1 - Math.cos(Math.PI / 8)), 0, 1e-15);
    close(w.value(3.1e-6), Math.cos(2 * Math.PI * 3.1), 1e-12);
  });
});

describe('doubleExponentialSource', () => {
  it('peaks at exactly the amplitude at t_p = ln(tau2/tau1) tau1 tau2 / (tau2 - tau1)', () => {
    const tau1 = 0.4e-6;
    const tau2 = 68e-6;
    const w = make(doubleExponentialSource, { amplitude: 5e3, delay: 0, tau1, tau2 });
    const tp = doubleExponentialPeakTime(tau1, tau2);
    close(w.value(tp), 5e3, 1e-12);
    // Brute-force maximum on a fine grid (classic calculus: the analytic t_p is the maximum).
    let best = 0;
    for (let k = 1; k < 200000; k++) best = Math.max(best, w.value(k * 5e-11)); // 0..10 us covers t_p = 2.066 us
    expect(best).toBeLessThanOrEqual(5e3 * (1 + 1e-12));
    close(best, 5e3, 1e-9);
  });
  it('has the closed-form normalisation k = 4 for tau1 = 1 s and tau2 = 2 s', () => {
    // tau1 = 1 s, tau2 = 2 s: t_p = 2 ln 2, peak of e^{-t/2} - e^{-t} is 1/4, so k = 4.
    const w = make(doubleExponentialSource, { amplitude: 1, delay: 0, tau1: 1, tau2: 2 });
    close(doubleExponentialPeakTime(1, 2), 2 * Math.LN2, 1e-15);
    close(w.value(1), 4 * (Math.exp(-0.5) - Math.exp(-1)), 1e-12);
    expect(w.value(0)).toBe(0);
  });
  it('rejects tau2 not longer than tau1', () => {
    expect(() => make(doubleExponentialSource, { amplitude: 1, delay: 0, tau1: 2e-6, tau2: 1e-6 })).toThrow(/tau2.*longer than tau1/);
  });
});

describe('tableSource', () => {
  it('interpolates linearly between points and holds the end values', () => {
    const w = make(tableSource, { points: [[1e-9, 0], [2e-9, 1], [4e-9, -1], [4.5e-9, 0]] });
    expect(w.value(0)).toBe(0);
    close(w.value(1.25e-9), 0.25, 1e-12);
    close(w.value(3e-9), 0, 0, 1e-15);
    close(w.value(3.5e-9), -0.5, 1e-12);
    expect(w.value(2e-9)).toBe(1);
    expect(w.value(9e-9)).toBe(0);
    close(w.shortestFeatureS!, 0.5e-9, 1e-12);
    expect(w.settledAfterS).toBe(4.5e-9);
  });
  it('gives the same values whatever order it is called in', () => {
    const w = make(tableSource, { points: [[0, 0], [1, 10], [2, 0], [3, 5]] });
    const fwd = [0.5, 1.5, 2.5].map((t) => w.value(t));
    const rev = [2.5, 1.5, 0.5].map((t) => w.value(t)).reverse();
    expect(rev).toEqual(fwd);
    expect(fwd).toEqual([5, 5, 2.5]);
  });
});

describe('laplace hooks', () => {
  /**
   * W(s) = int_0^inf w(t) e^{-s t} dt by composite Simpson's rule between the waveform's corners
   * (Abramowitz & Stegun 25.4.6, from memory), plus the exact tail w_inf e^{-s T} / s beyond the last corner T
   * (w constant there): an independent check that each hook is the transform of its value(t).
   */
  function numeric(w: WaveformInstance, corners: number[], endS: number, sr: number, si: number): [number, number] {
    let re = 0, im = 0;
    const pts = [...corners, endS];
    for (let p = 0; p + 1 < pts.length; p++) {
      const a = pts[p], b = pts[p + 1], n = 50000, h = (b - a) / n;
      for (let i = 0; i <= n; i++) {
        const t = a + i * h;
        // Just inside the piece at its ends: the value on this piece (w is continuous or jumps at a corner).
        const tv = i === 0 ? t + 1e-9 * h : i === n ? t - 1e-9 * h : t;
        const c = (i === 0 || i === n ? 1 : i % 2 ? 4 : 2) * h / 3;
        const e = Math.exp(-sr * t), v = w.value(tv);
        re += c * v * e * Math.cos(si * t);
        im -= c * v * e * Math.sin(si * t);
      }
    }
    const wInf = w.value(endS + 1);
    if (wInf !== 0) {
      const e = Math.exp(-sr * endS), cr = e * Math.cos(si * endS), ci = -e * Math.sin(si * endS), d = sr * sr + si * si;
      re += wInf * (cr * sr + ci * si) / d;
      im += wInf * (ci * sr - cr * si) / d;
    }
    return [re, im];
  }
  const cases: Array<[string, WaveformInstance, number[], number]> = [
    ['ideal step', make(stepSource, { amplitude: 2, delay: 1e-7, rise: 0, edge: 'linear' }), [0, 1e-7], 1e-7],
    ['linear step', make(stepSource, { amplitude: 2, delay: 1e-7, rise: 5e-8, edge: 'linear' }), [0, 1e-7], 1.5e-7],
    ['ramp', make(rampSource, { amplitude: 3, delay: 0, rise: 2e-7 }), [0], 2e-7],
    ['trapezoid', make(trapezoidSource, { amplitude: 1.5, delay: 5e-8, rise: 2e-8, width: 1e-7, fall: 3e-8 }), [0, 5e-8, 7e-8, 1.7e-7], 2e-7],
    ['double exponential', make(doubleExponentialSource, { amplitude: 1, delay: 1e-8, tau1: 1e-8, tau2: 5e-8 }), [0, 1e-8], 1e-8 + 40 * 5e-8],
  ];
  for (const [name, w, corners, endS] of cases) {
    it(`gives the transform of the ${name} at complex s, as the integral of value(t) e^{-st}`, () => {
      const out = new Float64Array(2);
      for (const [sr, si] of [[2e6, 2 * Math.PI * 3e6], [0, 2 * Math.PI * 1e5], [5e7, 0], [1e3, 2 * Math.PI * 37.3e6]]) {
        w.laplace!(sr, si, out);
        const [nr, ni] = numeric(w, corners, endS, sr, si);
        const scale = Math.hypot(nr, ni);
        // Simpson's error with 50 000 panels per piece, (omega h)^4 / 180 < 1e-12 at 37.3 MHz, and its
        // rounding stay below 1e-9 (measured at most 1.5e-10 over all cases); 1e-9.
        expect(Math.hypot(out[0] - nr, out[1] - ni) / scale, `${name} at s = ${sr} + j${si}`).toBeLessThan(1e-9);
      }
    });
  }
  it('gives the trapezoid its area at s = 0 and keeps no hook for the raised-cosine edge', () => {
    const out = new Float64Array(2);
    make(trapezoidSource, { amplitude: 2, delay: 0, rise: 1, width: 3, fall: 2 }).laplace!(0, 0, out);
    expect(out[0]).toBe(2 * (0.5 + 3 + 1)); // area of the trapezoid (geometry)
    expect(make(stepSource, { amplitude: 1, delay: 0, rise: 1e-9, edge: 'smooth' }).laplace).toBeUndefined();
  });
});
