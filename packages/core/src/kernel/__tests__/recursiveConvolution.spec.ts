// Recursive convolution against closed forms and against direct numerical convolution. The
// closed form: for h(t) = r e^{p t} and a ramp u = t, y(t) = r ((e^{p t} - 1)/p^2 - t/p)
// (elementary integral; any table of Laplace transforms, e.g. Abramowitz and Stegun 29.3,
// from memory). The recursion is exact for piecewise-linear input (Semlyen and Dabuleanu 1975),
// so only rounding separates it from the closed form.
import { describe, expect, it } from 'vitest';
import {
  createRecursiveConvolution, recursiveConvolutionAddInput, recursiveConvolutionCoefficients,
  recursiveConvolutionDirect, recursiveConvolutionHistory, recursiveConvolutionStep, recursiveConvolve,
} from '../recursiveConvolution.ts';

type Fn = Parameters<typeof createRecursiveConvolution>[0];

const FN: Fn = {
  polesRe: Float64Array.of(-3e6, -2e5, -2e5),
  polesIm: Float64Array.of(0, 4e6, -4e6),
  residuesRe: Float64Array.of(2e6, 1e5, 1e5),
  residuesIm: Float64Array.of(0, -7e5, 7e5),
  d: 0.25,
  e: 0,
};

/** Closed-form response of r/(s - p) to u = t (complex p, r), returned as [re, im]. */
function rampResponse(pr: number, pi: number, rr: number, ri: number, t: number): [number, number] {
  const m = Math.exp(pr * t);
  const er = m * Math.cos(pi * t) - 1, ei = m * Math.sin(pi * t);
  const p2r = pr * pr - pi * pi, p2i = 2 * pr * pi;
  const d2 = p2r * p2r + p2i * p2i;
  const ar = (er * p2r + ei * p2i) / d2, ai = (ei * p2r - er * p2i) / d2; // (e^{pt} - 1)/p^2
  const d1 = pr * pr + pi * pi;
  const br = (t * pr) / d1, bi = (-t * pi) / d1; // t/p
  const xr = ar - br, xi = ai - bi;
  return [rr * xr - ri * xi, rr * xi + ri * xr];
}

function impulse(fn: Fn, t: number): number {
  let h = 0;
  for (let k = 0; k < fn.polesRe.length; k++) {
    const m = Math.exp(fn.polesRe[k] * t);
    h += m * (fn.residuesRe[k] * Math.cos(fn.polesIm[k] * t) - fn.residuesIm[k] * Math.sin(fn.polesIm[k] * t));
  }
  return h;
}

describe('recursiveConvolve', () => {
  it('matches the closed-form ramp response of real and complex terms', () => {
    const dt = 2e-8;
    const n = 400;
    const u = Float64Array.from({ length: n }, (_, i) => i * dt);
    const y = recursiveConvolve(createRecursiveConvolution(FN, dt), u, new Float64Array(n));
    let worst = 0, peak = 0;
    for (let i = 0; i < n; i++) {
      const t = i * dt;
      let ref = FN.d * t + rampResponse(FN.polesRe[0], 0, FN.residuesRe[0], 0, t)[0];
      ref += 2 * rampResponse(FN.polesRe[1], FN.polesIm[1], FN.residuesRe[1], FN.residuesIm[1], t)[0];
      worst = Math.max(worst, Math.abs(y[i] - ref));
      peak = Math.max(peak, Math.abs(ref));
    }
    expect(peak).toBeGreaterThan(1e-7);
    // Exact for a ramp: rounding only (measured 1e-15 of the peak); 1e-12 leaves room.
    expect(worst / peak).toBeLessThan(1e-12);
  });

  it('matches direct numerical convolution of the impulse response for piecewise-linear input', () => {
    const dt = 5e-8;
    const n = 60;
    // Invented piecewise-linear input (deterministic pseudo-random samples, u_0 = 0).
    const u = Float64Array.from({ length: n }, (_, i) => (i === 0 ? 0 : Math.sin(1.7 * i) + 0.3 * Math.cos(5.1 * i)));
    const y = recursiveConvolve(createRecursiveConvolution(FN, dt), u, new Float64Array(n));
    // Direct: y(t_n) = d u_n + int_0^{t_n} h(t_n - tau) u(tau) dtau, composite Simpson with 400
    // panels per sample interval on the piecewise-linear u (error ~ (dt/400)^4 h'''' ~ 1e-11).
    const M = 400;
    let worst = 0, peak = 0;
    for (let k = 1; k < n; k++) {
      const tn = k * dt;
      let s = 0;
      for (let j = 0; j < k; j++) {
        const hstep = dt / M;
        for (let m = 0; m <= M; m++) {
          const tau = j * dt + m * hstep;
          const uu = u[j] + ((u[j + 1] - u[j]) * m) / M;
          const wgt = m === 0 || m === M ? 1 : m % 2 === 1 ? 4 : 2;
          s += (wgt * hstep * impulse(FN, tn - tau) * uu) / 3;
        }
      }
      const ref = FN.d * u[k] + s;
      worst = Math.max(worst, Math.abs(y[k] - ref));
      peak = Math.max(peak, Math.abs(ref));
    }
    expect(peak).toBeGreaterThan(0.1);
    expect(worst / peak).toBeLessThan(1e-9);
  });

  it('returns the output untouched for an empty input', () => {
    const y = Float64Array.of(NaN);
    expect(recursiveConvolve(createRecursiveConvolution(FN, 1e-9), new Float64Array(0), y)[0]).toBeNaN();
  });
});

describe('recursiveConvolutionCoefficients', () => {
  it('joins the small-q series to the closed form without a jump', () => {
    // |q| just below and above the 1e-3 switch: the two forms agree to the series' truncation
    // error (q^4 / 720 ~ 1e-15) plus the cancellation of the closed form (~1e-16 / q^2 = 1e-10).
    const dt = 1e-9;
    const a = recursiveConvolutionCoefficients(-0.99999e6, 0, 1, 0, dt);
    const b = recursiveConvolutionCoefficients(-1.00001e6, 0, 1, 0, dt);
    expect(Math.abs(a[2] - b[2]) / a[2]).toBeLessThan(1e-7);
    expect(Math.abs(a[4] - b[4]) / a[4]).toBeLessThan(1e-7);
    // Trapezoidal limit r dt / 2 (q -> 0): alpha = r dt/2 (1 + q/3), beta = r dt/2 (1 + 2q/3)
    // to first order, q = -1e-9 here.
    const c = recursiveConvolutionCoefficients(-1, 0, 1, 0, dt);
    expect(Math.abs(c[2] / (dt / 2) - (1 - 1e-9 / 3))).toBeLessThan(1e-15);
    expect(Math.abs(c[4] / (dt / 2) - (1 - 2e-9 / 3))).toBeLessThan(1e-15);
  });
});

describe('recursiveConvolutionStep', () => {
  it('honours the coefficient and state offsets and leaves other slots alone', () => {
    const rc = createRecursiveConvolution(FN, 1e-8);
    const coef = new Float64Array(rc.coef.length + 5).fill(NaN);
    coef.set(rc.coef, 5);
    const state = new Float64Array(rc.state.length + 6).fill(NaN);
    state.fill(0, 3, 3 + rc.state.length);
    const ref = createRecursiveConvolution(FN, 1e-8);
    let up = 0;
    for (let n = 1; n < 20; n++) {
      const un = Math.cos(n);
      const a = recursiveConvolutionStep(rc.nReal, rc.nComplex, up, un, coef, 5, state, 3);
      const b = recursiveConvolutionStep(ref.nReal, ref.nComplex, up, un, ref.coef, 0, ref.state, 0);
      expect(a).toBe(b);
      up = un;
    }
    expect(state[0]).toBeNaN();
    expect(state[3 + rc.state.length]).toBeNaN();
    expect(recursiveConvolutionStep(0, 0, 1, 1, coef, 0, state, 0)).toBe(0);
  });
});

describe('recursiveConvolutionHistory', () => {
  it('with recursiveConvolutionAddInput and the direct weight equals one full step', () => {
    const a = createRecursiveConvolution(FN, 1e-8);
    const b = createRecursiveConvolution(FN, 1e-8);
    const g = recursiveConvolutionDirect(a.nReal, a.nComplex, a.coef, 0);
    let up = 0;
    for (let n = 1; n < 30; n++) {
      const un = Math.sin(0.3 * n) + 1;
      const full = recursiveConvolutionStep(a.nReal, a.nComplex, up, un, a.coef, 0, a.state, 0);
      const hist = recursiveConvolutionHistory(b.nReal, b.nComplex, up, b.coef, 0, b.state, 0);
      expect(recursiveConvolutionAddInput(b.nReal, b.nComplex, un, b.coef, 0, b.state, 0)).toBe(2);
      // Same sums in a different order: rounding only.
      expect(Math.abs(hist + g * un - full)).toBeLessThan(1e-14 * (Math.abs(full) + 1));
      for (let k = 0; k < a.state.length; k++) expect(Math.abs(a.state[k] - b.state[k])).toBeLessThan(1e-14 * (Math.abs(a.state[k]) + 1));
      up = un;
    }
  });
});

describe('createRecursiveConvolution', () => {
  it('rejects unstable poles, a term s e, unpaired complex poles and a bad step', () => {
    expect(() => createRecursiveConvolution({ ...FN, polesRe: Float64Array.of(1, -2e5, -2e5) }, 1e-9)).toThrow(/poles\[0\].*stable/);
    expect(() => createRecursiveConvolution({ ...FN, e: 1 }, 1e-9)).toThrow(/\.e:/);
    expect(() => createRecursiveConvolution({ ...FN, polesIm: Float64Array.of(0, 4e6, 0) }, 1e-9)).toThrow(/conjugate/);
    expect(() => createRecursiveConvolution(FN, 0)).toThrow(/dtS/);
  });
});
