/**
 * Time response of the network from its spectrum: a reference for the transient solver.
 *
 * Method (a Fourier series on the j omega axis with the slow parts taken out analytically):
 *  1. Every source's spectrum W(j omega): its waveform's `laplace` hook at sigma = 0 when present,
 *     else w_inf / (j omega) for its final value w_inf plus the transform of value(t) - w_inf by the
 *     trapezoid rule on 32 K samples over the period (one FFT) with Gregory's end correction at
 *     t = 0 to fifth differences.
 *  2. The output's spectrum Y(j omega) = sum over sources of H(j omega) W(j omega), solved at
 *     omega_k = 2 pi k / Tp, k = 1..K, K = ceil(fmax Tp).
 *  3. The final value y_inf = lim s Y(s) (at omega -> 0) and a smooth step r(t) = 1 - e^-x (1 + x
 *     + x^2/2 + x^3/6), x = t / tau, tau = Tp / 40, R(s) = 1 / (s (1 + s tau)^4), are taken out:
 *     Y_rem = Y - y_inf R. The remainder decays in time, so its periodic continuation (period Tp)
 *     differs from it only by the network's tail beyond Tp; R's spectrum beyond fmax is below
 *     (tau omega_max)^-4 and r(t) is added back exactly.
 *  4. y(t) = y_inf r(t) + (1/Tp) [Y_rem(0) + 2 Re sum_k w_k Y_rem(j omega_k) e^{j omega_k t}], with a
 *     Tukey window w_k (flat to fmax / 2, cosine taper to fmax) against Gibbs ringing.
 *  5. Period doubling: Tp starts at 8 times the last sample time and is doubled until two passes
 *     agree to `tolerance` (default 1e-6 of the largest sample); the last change is reported as
 *     the wrap-around estimate.
 * This is the Fourier-series route (method 'fourier', the default). Method 'laplace' is the numerical
 * Laplace transform (D. J. Wilcox, "Numerical Laplace transformation and inversion", Int. J. Elect.
 * Enging Educ. 15, 1978; L. M. Wedepohl, from memory): one pass at s = sigma + j omega_k with
 * sigma = ln(1 / aliasing) / Tp, which damps the tail instead of doubling the period (every load
 * needs `admittanceAt`, every section `zyAtLaplace`); see responseLaplace. The README lists the
 * errors measured.
 */
import { badInput, type PluginRegistry, type ResolvedScenario } from '@skein/core';
import { assemble, compileNetwork, lineIndex, nodeIndex, solveAssembled, sourceRhs, type SpectralNetwork } from './network.ts';
import { outputName, type SpectralOutput } from './spectrum.ts';

/** Options of timeResponse. */
export interface TimeResponseOptions {
  /** What to sample: voltage, current or part-current outputs. */
  outputs: readonly SpectralOutput[];
  /** Sample times [s], >= 0. */
  timesS: readonly number[];
  /**
   * Highest frequency of the series [Hz]. Default: 16 / (shortest feature of the sources), else
   * 0.5 / time.step of the scenario.
   */
  maxFrequencyHz?: number;
  /** Period Tp of the first pass as a multiple of the last sample time (default 8, at least 2). */
  periodFactor?: number;
  /** Spectral window (default 'tukey': flat to fmax / 2; 'lanczos': Lanczos' sigma factors). */
  window?: TimeWindow;
  /**
   * How the spectrum becomes a time response (default 'fourier'): 'fourier' is the Fourier series on
   * the j omega axis with period doubling; 'laplace' the numerical Laplace transform (one pass at
   * s = sigma + j omega, sigma = ln(1 / aliasing) / Tp, the shift undone by e^{sigma t}).
   */
  method?: 'fourier' | 'laplace';
  /**
   * Method 'laplace': the wanted aliasing error, relative to the largest |response| (default 1e-10,
   * between 0 and 0.1). It sets sigma; the truncation and window errors are amplified by at most
   * e^{sigma t_max} = aliasing^(-1 / periodFactor) (17.8 at the defaults).
   */
  aliasing?: number;
  /**
   * Wrap-around tolerance, relative to the largest sample (default 1e-6): the period is doubled
   * until two successive periods agree to it (or maxPoints is reached); 0 makes one pass.
   */
  tolerance?: number;
  /** Most frequency points in one pass (default 400 000); the first pass must fit. */
  maxPoints?: number;
}

/** Spectral windows of timeResponse. */
export type TimeWindow = 'tukey' | 'hann' | 'lanczos' | 'none';

/** The samples of timeResponse and the parameters the method chose. */
export interface TimeResponse {
  timesS: number[];
  series: Array<{ name: string; unit: string; values: Float64Array }>;
  method: {
    /** 'fourier' (j omega axis, period doubling) or 'laplace' (numerical Laplace transform). */
    kind: 'fourier' | 'laplace';
    /** Damping shift sigma [1/s] (0 for 'fourier'). */
    sigmaPerS: number;
    /** 'laplace': the aliasing bound e^{-sigma Tp} / (1 - e^{-sigma Tp}) relative to the largest |response| (NaN for 'fourier'). */
    aliasingBound: number;
    /** Period of the last pass [s]. */
    periodS: number;
    maxFrequencyHz: number;
    /** Frequency points of the last pass. */
    points: number;
    window: string;
    tauS: number;
    /** Number of passes (periods tried). */
    passes: number;
    /** Largest change between the last two passes relative to the largest sample (NaN after one pass and for 'laplace'). */
    wrapEstimate: number;
    /** True when wrapEstimate <= tolerance (or one pass was asked for). */
    converged: boolean;
  };
}

/** In-place iterative radix-2 FFT (forward, e^{-j 2 pi k n / N}); N a power of two. */
export function fft(re: Float64Array, im: Float64Array): void {
  const n = re.length;
  for (let i = 1, j = 0; i < n; i++) {
    let bit = n >> 1;
    for (; j & bit; bit >>= 1) j ^= bit;
    j ^= bit;
    if (i < j) {
      let t = re[i]; re[i] = re[j]; re[j] = t;
      t = im[i]; im[i] = im[j]; im[j] = t;
    }
  }
  for (let len = 2; len <= n; len <<= 1) {
    const ang = (-2 * Math.PI) / len;
    for (let i = 0; i < n; i += len) {
      for (let k = 0; k < len / 2; k++) {
        const wr = Math.cos(ang * k), wi = Math.sin(ang * k);
        const a = i + k, b = i + k + len / 2;
        const xr = re[b] * wr - im[b] * wi;
        const xi = re[b] * wi + im[b] * wr;
        re[b] = re[a] - xr; im[b] = im[a] - xi;
        re[a] += xr; im[a] += xi;
      }
    }
  }
}

/** Gregory's end-correction coefficients (forward differences; Hildebrand, Introduction to Numerical Analysis, 2nd ed., sec. 5.9, from memory). */
const GREGORY = [1 / 12, -1 / 24, 19 / 720, -3 / 160, 863 / 60480];

/** Spectrum of one waveform on the grid omega_k = k dw (k = 1..K) and at omegaEps. */
interface WaveSpectrum {
  re: Float64Array; // index k = 1..K (0 unused)
  im: Float64Array;
  epsRe: number;
  epsIm: number;
}

/**
 * Spectrum of waveform w on omega_k = k 2 pi / Tp (k = 1..K) and at omegaEps (see step 1 above).
 * Exported for the tests; not part of the public API.
 */
export function waveSpectrum(net: SpectralNetwork, w: number, K: number, periodS: number, omegaEps: number, sigma = 0): WaveSpectrum {
  const inst = net.waveforms[w];
  const dw = (2 * Math.PI) / periodS;
  const re = new Float64Array(K + 1);
  const im = new Float64Array(K + 1);
  const out = new Float64Array(2);
  if (typeof inst.laplace === 'function') {
    for (let k = sigma > 0 ? 0 : 1; k <= K; k++) {
      inst.laplace(sigma, k * dw, out);
      re[k] = out[0];
      im[k] = out[1];
    }
    inst.laplace(0, omegaEps, out);
    return { re, im, epsRe: out[0], epsIm: out[1] };
  }
  let M = 4096;
  while (M < 32 * K) M *= 2;
  const dt = periodS / M;
  const wInf = inst.value(inst.settledAfterS !== undefined && inst.settledAfterS < periodS ? inst.settledAfterS * 1.5 + dt : periodS);
  const dr = new Float64Array(M);
  const di = new Float64Array(M);
  // With a damping shift the integrand is (w - w_inf) e^{-sigma t}; the step w_inf / s is exact.
  for (let n = 0; n < M; n++) dr[n] = (inst.value(n * dt) - wInf) * (sigma > 0 ? Math.exp(-sigma * n * dt) : 1);
  const d = dr.slice(0, GREGORY.length + 1);
  // Gregory's end correction at t = 0 (the far end is settled, d = 0 there):
  // h sum_j c_j Delta^j g_0 with g_n = d_n e^{-j omega n h}.
  const correction = (om: number): [number, number] => {
    const gr = new Float64Array(d.length);
    const gi = new Float64Array(d.length);
    for (let n = 0; n < d.length; n++) { gr[n] = d[n] * Math.cos(om * n * dt); gi[n] = -d[n] * Math.sin(om * n * dt); }
    let cr = 0, ci = 0;
    for (let j = 0; j < GREGORY.length; j++) {
      for (let n = 0; n < d.length - 1 - j; n++) { gr[n] = gr[n + 1] - gr[n]; gi[n] = gi[n + 1] - gi[n]; }
      cr += GREGORY[j] * gr[0];
      ci += GREGORY[j] * gi[0];
    }
    return [dt * cr, dt * ci];
  };
  // W = w_inf / (j omega) + integral of (w - w_inf) by the trapezoid rule with Gregory's correction.
  let sr = 0, si = 0;
  for (let n = 1; n < M; n++) { sr += dr[n] * Math.cos(omegaEps * n * dt); si -= dr[n] * Math.sin(omegaEps * n * dt); }
  const [c0r, c0i] = correction(omegaEps);
  const er = dt * (d[0] / 2 + sr) + c0r;
  const ei = dt * si + c0i - wInf / omegaEps;
  fft(dr, di);
  for (let k = sigma > 0 ? 0 : 1; k <= K; k++) {
    const om = k * dw;
    const [cr, ci] = correction(om);
    // w_inf / s at s = sigma + j omega: w_inf (sigma - j omega) / (sigma^2 + omega^2)
    const m = sigma * sigma + om * om;
    re[k] = dt * (dr[k] - d[0] / 2) + cr + (sigma > 0 ? (wInf * sigma) / m : 0);
    im[k] = dt * di[k] + ci - (sigma > 0 ? (wInf * om) / m : wInf / om);
  }
  return { re, im, epsRe: er, epsIm: ei };
}

/**
 * Samples the network's response to its own sources at the given times, computed from the spectrum.
 * @param scenario resolved scenario; @param registry plugins (loads need `admittance`).
 * @param options outputs, times [s], maxFrequencyHz, periodFactor, window.
 * @returns samples per output and the method's parameters.
 * @throws InputError E_SPECTRAL_TIME for bad times or settings, E_SPECTRAL_OUTPUT for an output kind
 *   without a time response; SkeinError E_SPECTRAL_HOOK_MISSING, E_SPECTRAL_SINGULAR.
 * @example await timeResponse(s, reg, { outputs: [{ kind: 'voltage', node: 'L.l' }], timesS: [1.5e-6] })
 */
export async function timeResponse(scenario: ResolvedScenario, registry: PluginRegistry, options: TimeResponseOptions): Promise<TimeResponse> {
  const net = await compileNetwork(scenario, registry);
  const times = [...options.timesS];
  if (times.length === 0) throw badInput(['timesS'], 'must list at least one time', times, 'E_SPECTRAL_TIME');
  times.forEach((t, i) => { if (!(t >= 0 && Number.isFinite(t))) throw badInput(['timesS', i], 'must be a time of at least 0 s', t, 'E_SPECTRAL_TIME'); });
  const tMax = Math.max(...times, 0) || scenario.time.endS;
  const factor = options.periodFactor ?? 8;
  if (!(factor >= 2)) throw badInput(['periodFactor'], 'must be at least 2', factor, 'E_SPECTRAL_TIME');
  const periodS = factor * tMax;
  let fmax = options.maxFrequencyHz;
  if (fmax === undefined) {
    let feature = Infinity;
    for (const w of net.waveforms) if (w.shortestFeatureS !== undefined && w.shortestFeatureS > 0) feature = Math.min(feature, w.shortestFeatureS);
    if (Number.isFinite(feature)) fmax = 16 / feature;
    else if (scenario.time.stepS !== undefined) fmax = 0.5 / scenario.time.stepS;
    else throw badInput(['maxFrequencyHz'], 'must be given: the sources declare no shortest feature and the scenario sets no time.step', undefined, 'E_SPECTRAL_TIME');
  }
  if (!(fmax > 0 && Number.isFinite(fmax))) throw badInput(['maxFrequencyHz'], 'must be a frequency above 0 Hz', fmax, 'E_SPECTRAL_TIME');
  const maxPoints = options.maxPoints ?? 400_000;
  const windowKind = options.window ?? 'tukey';
  if (!WINDOWS.includes(windowKind)) throw badInput(['window'], `must be one of ${WINDOWS.join(', ')}`, windowKind, 'E_SPECTRAL_TIME');
  const kind = options.method ?? 'fourier';
  if (kind !== 'fourier' && kind !== 'laplace') throw badInput(['method'], 'must be fourier or laplace', kind, 'E_SPECTRAL_TIME');
  const tolerance = options.tolerance ?? 1e-6;
  if (!(tolerance >= 0)) throw badInput(['tolerance'], 'must be 0 (one pass) or a positive fraction', tolerance, 'E_SPECTRAL_TIME');
  const outs = options.outputs.map((o, oi) => planTimeOutput(net, o, oi));
  const first = Math.ceil(fmax * periodS);
  if (first > maxPoints) throw badInput(['maxFrequencyHz'], `gives ${first} frequency points over the period ${periodS} s, more than ${maxPoints}; lower it or the last sample time`, fmax, 'E_SPECTRAL_TIME');
  if (kind === 'laplace') {
    const aliasing = options.aliasing ?? 1e-10;
    if (!(aliasing > 0 && aliasing <= 0.1)) throw badInput(['aliasing'], 'must be a fraction above 0 and at most 0.1', aliasing, 'E_SPECTRAL_TIME');
    const sigma = Math.log(1 / aliasing) / periodS;
    const pass = responseLaplace(net, outs, times, periodS, fmax, windowKind, sigma);
    const series = options.outputs.map((o, i) => ({ name: outputName(o), unit: o.kind === 'voltage' ? 'V' : 'A', values: pass.values[i] }));
    return {
      timesS: times, series,
      method: {
        kind, sigmaPerS: sigma, aliasingBound: aliasing / (1 - aliasing), periodS, maxFrequencyHz: fmax, points: pass.points,
        window: windowKind, tauS: NaN, passes: 1, wrapEstimate: NaN, converged: true,
      },
    };
  }
  // Period doubling: the change between periods Tp and 2 Tp estimates the wrap-around of the tail.
  let tp = periodS;
  let prev = responseForPeriod(net, outs, times, tp, fmax, windowKind);
  let points = prev.points;
  let estimate = NaN;
  let converged = tolerance === 0;
  let passes = 1;
  while (!converged && Math.ceil(fmax * 2 * tp) <= maxPoints) {
    tp *= 2;
    const next = responseForPeriod(net, outs, times, tp, fmax, windowKind);
    passes++;
    points = next.points;
    let peak = 0;
    let change = 0;
    next.values.forEach((v, i) => v.forEach((x, q) => {
      peak = Math.max(peak, Math.abs(x));
      change = Math.max(change, Math.abs(x - prev.values[i][q]));
    }));
    estimate = change / (peak || 1);
    prev = next;
    converged = estimate <= tolerance;
  }
  const series = options.outputs.map((o, i) => ({ name: outputName(o), unit: o.kind === 'voltage' ? 'V' : 'A', values: prev.values[i] }));
  return {
    timesS: times, series,
    method: { kind, sigmaPerS: 0, aliasingBound: NaN, periodS: tp, maxFrequencyHz: fmax, points, window: windowKind, tauS: tp / 40, passes, wrapEstimate: estimate, converged },
  };
}

/** One pass of the method over period Tp: the samples of every output at the given times. */
function responseForPeriod(net: SpectralNetwork, outs: Reader[], times: number[], periodS: number, fmax: number, windowKind: TimeWindow): { values: Float64Array[]; points: number } {
  const K = Math.ceil(fmax * periodS);
  const dw = (2 * Math.PI) / periodS;
  const omegaEps = dw * 1e-4;
  const tau = periodS / 40;
  const nOut = outs.length;
  const spectra = net.waveforms.map((_, w) => waveSpectrum(net, w, K, periodS, omegaEps));
  const noRemoved = new Array<boolean>(net.parts.length).fill(false);
  const solveAt = (omega: number, k: number): { re: number[]; im: number[] } => {
    const phasors = net.parts.map((np) => {
      if (np.waveform === undefined) return null;
      const s = spectra[np.waveform];
      return k < 0 ? { re: s.epsRe, im: s.epsIm } : { re: s.re[k], im: s.im[k] };
    });
    const asm = assemble(net, omega, noRemoved);
    const x = solveAssembled(asm, sourceRhs(net, [phasors]));
    const re: number[] = [];
    const im: number[] = [];
    for (const r of outs) {
      const [a, b] = r(asm, x, phasors);
      re.push(a);
      im.push(b);
    }
    return { re, im };
  };
  // R(j omega) = 1 / (j omega (1 + j omega tau)^4)
  const rOf = (om: number): [number, number] => {
    let pr = 1, pi = 0;
    for (let i = 0; i < 4; i++) { const nr = pr - pi * om * tau; pi = pi + pr * om * tau; pr = nr; }
    // j om (pr + j pi) = -om pi + j om pr
    const dr = -om * pi, di = om * pr;
    const d = dr * dr + di * di;
    return [dr / d, -di / d];
  };
  const eps = solveAt(omegaEps, -1);
  const yInf = eps.im.map((im) => -omegaEps * im); // Re(j w Y) = -w Im Y
  const [r0r] = rOf(omegaEps);
  const yRem0 = eps.re.map((re, i) => re - yInf[i] * r0r);
  const cRe = new Float64Array(nOut * (K + 1));
  const cIm = new Float64Array(nOut * (K + 1));
  for (let k = 1; k <= K; k++) {
    const om = k * dw;
    const y = solveAt(om, k);
    const [rr, ri] = rOf(om);
    const win = windowWeight(windowKind, k / K);
    for (let i = 0; i < nOut; i++) {
      cRe[i * (K + 1) + k] = win * (y.re[i] - yInf[i] * rr);
      cIm[i * (K + 1) + k] = win * (y.im[i] - yInf[i] * ri);
    }
  }
  const values = outs.map((_, i) => {
    const v = new Float64Array(times.length);
    times.forEach((t, q) => {
      const s = seriesSum(cRe, cIm, i * (K + 1), K, dw, t);
      const x = t / tau;
      const r = -Math.expm1(-x) - Math.exp(-x) * (x + (x * x) / 2 + (x * x * x) / 6);
      v[q] = yInf[i] * r + (yRem0[i] + 2 * s) / periodS;
    });
    return v;
  });
  return { values, points: K + 1 };
}

/**
 * Re sum_{k=1..K} c_k e^{j k dw t} over the coefficients at base + k, by a rotation recurrence
 * re-anchored every 64 terms (both methods share it).
 */
function seriesSum(cRe: Float64Array, cIm: Float64Array, base: number, K: number, dw: number, t: number): number {
  let s = 0;
  const cr = Math.cos(dw * t), ci = Math.sin(dw * t);
  let er = 1, ei = 0;
  for (let k = 1; k <= K; k++) {
    if ((k & 63) === 0) { er = Math.cos(k * dw * t); ei = Math.sin(k * dw * t); } else {
      const nr = er * cr - ei * ci; ei = er * ci + ei * cr; er = nr;
    }
    s += cRe[base + k] * er - cIm[base + k] * ei;
  }
  return s;
}

const WINDOWS: readonly TimeWindow[] = ['tukey', 'hann', 'lanczos', 'none'];

/**
 * Weight of the term at u = omega / omega_max in [0, 1]: 'tukey' flat to 1/2 then a cosine taper
 * (Bingham, Godfrey & Tukey, IEEE Trans. Audio Electroacoust. 15(2), 1967, from memory), 'hann'
 * (1 + cos pi u) / 2, 'lanczos' the sigma factors sin(pi u) / (pi u) (C. Lanczos, Applied Analysis,
 * 1956, ch. IV, from memory), 'none' 1.
 */
function windowWeight(kind: TimeWindow, u: number): number {
  if (kind === 'none') return 1;
  if (kind === 'hann') return 0.5 * (1 + Math.cos(Math.PI * u));
  if (kind === 'lanczos') return u === 0 ? 1 : Math.sin(Math.PI * u) / (Math.PI * u);
  return u <= 0.5 ? 1 : 0.5 * (1 + Math.cos(Math.PI * (2 * u - 1)));
}

/**
 * One pass of the numerical Laplace transform over period Tp (Wilcox 1978; Wedepohl): the output's
 * transform Y(s) at s_k = sigma + j k dw, k = 0..K, dw = 2 pi / Tp, K = ceil(fmax Tp), gives the
 * Fourier coefficients of the damped response g(t) = y(t) e^{-sigma t}; its windowed series is
 * summed and the shift undone:
 *   y(t) = e^{sigma t} / Tp [Y(sigma) + 2 Re sum_{k=1..K} w_k Y(s_k) e^{j k dw t}].
 * The periodic continuation adds sum_{m>=1} y(t + m Tp) e^{-sigma m Tp}, at most
 * max|y| e^{-sigma Tp} / (1 - e^{-sigma Tp}) (the discretisation bound of the Fourier-series
 * inversion: Dubner & Abate, J. ACM 15(1), 1968; Crump, J. ACM 23(1), 1976, from memory), so
 * sigma = ln(1 / aliasing) / Tp. No final value is taken out: Y(s) is regular at s = sigma.
 */
function responseLaplace(net: SpectralNetwork, outs: Reader[], times: number[], periodS: number, fmax: number, windowKind: TimeWindow, sigma: number): { values: Float64Array[]; points: number } {
  const K = Math.ceil(fmax * periodS);
  const dw = (2 * Math.PI) / periodS;
  const nOut = outs.length;
  const spectra = net.waveforms.map((_, w) => waveSpectrum(net, w, K, periodS, dw * 1e-4, sigma));
  const noRemoved = new Array<boolean>(net.parts.length).fill(false);
  const cRe = new Float64Array(nOut * (K + 1));
  const cIm = new Float64Array(nOut * (K + 1));
  for (let k = 0; k <= K; k++) {
    const phasors = net.parts.map((np) => (np.waveform === undefined ? null : { re: spectra[np.waveform].re[k], im: spectra[np.waveform].im[k] }));
    const asm = assemble(net, k * dw, noRemoved, [], sigma);
    const x = solveAssembled(asm, sourceRhs(net, [phasors]));
    const win = k === 0 ? 1 : windowWeight(windowKind, k / K);
    outs.forEach((r, i) => {
      const [a, b] = r(asm, x, phasors);
      cRe[i * (K + 1) + k] = win * a;
      cIm[i * (K + 1) + k] = win * b;
    });
  }
  const values = outs.map((_, i) => {
    const v = new Float64Array(times.length);
    times.forEach((t, q) => {
      const s = seriesSum(cRe, cIm, i * (K + 1), K, dw, t);
      v[q] = (Math.exp(sigma * t) * (cRe[i * (K + 1)] + 2 * s)) / periodS;
    });
    return v;
  });
  return { values, points: K + 1 };
}

type Reader = (asm: ReturnType<typeof assemble>, x: { re: Float64Array; im: Float64Array }, phasors: Array<{ re: number; im: number } | null>) => [number, number];

function planTimeOutput(net: SpectralNetwork, o: SpectralOutput, oi: number): Reader {
  const path = ['outputs', oi];
  if (o.kind === 'voltage') {
    const n = nodeIndex(net, o.node, [...path, 'node']);
    return (_a, x) => [x.re[n], x.im[n]];
  }
  if (o.kind === 'current') {
    const li = lineIndex(net, o.line, [...path, 'line']);
    const l = net.lines[li];
    const c = o.conductor === undefined ? 0 : l.line.conductors.indexOf(o.conductor);
    if (c < 0 || (o.conductor === undefined && l.n !== 1)) throw badInput([...path, 'conductor'], `must name a conductor of line ${l.line.id} (${l.line.conductors.join(', ')})`, o.conductor, 'E_SPECTRAL_OUTPUT');
    const here0 = o.end === 'from';
    return (a, x) => {
          const md = a.modes[li];
          let re = 0, im = 0;
          // Into the line: T (a - E b) at z = 0, T (b - E a) at z = l.
          const oh = here0 ? l.offset : l.offset + l.n, ot = here0 ? l.offset + l.n : l.offset;
          for (let j = 0; j < l.n; j++) {
            const tr = md.t.re[c * l.n + j], ti = md.t.im[c * l.n + j];
            const ur = x.re[oh + j] - (md.eRe[j] * x.re[ot + j] - md.eIm[j] * x.im[ot + j]);
            const ui = x.im[oh + j] - (md.eRe[j] * x.im[ot + j] + md.eIm[j] * x.re[ot + j]);
            re += tr * ur - ti * ui;
            im += tr * ui + ti * ur;
          }
          return [re, im];
    };
  }
  throw badInput([...path, 'kind'], 'must be voltage or current for a time response', o.kind, 'E_SPECTRAL_OUTPUT');
}
