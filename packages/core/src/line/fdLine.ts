/**
 * Frequency-dependent travelling-wave line model, single-mode form (one conductor over its
 * reference, e.g. a coax inner conductor against its shield).
 *
 * In the frequency domain a uniform line of length l obeys, at each end k with the other end m,
 * currents I into the line (J. R. Marti, "Accurate modelling of frequency-dependent transmission
 * lines in electromagnetic transient simulations", IEEE Trans. PAS-101(1), 1982; in the notation
 * of the universal line model, A. Morched, B. Gustavsen and M. Tartibi, IEEE Trans. Power
 * Delivery 14(3), 1999; from memory):
 *
 *   I_k = Yc V_k - H (I_m + Yc V_m),   Yc = sqrt(Y/Z),  H = exp(-gamma l),  gamma = sqrt(Z Y).
 *
 * H is written H(s) = H'(s) e^{-s tau}: the delay tau is taken out and the smooth, minimum-phase
 * rest H' and Yc are fitted by rational functions (vector fitting, ./vectorFitting.ts). tau starts
 * at the lossless delay l sqrt(L_inf C_inf) of the section's high-frequency L and C and is then
 * adjusted (golden-section search) to the value that minimises the rms error of the H' fit, the
 * published practice for the delay of the propagation function (Morched, Gustavsen and Tartibi
 * 1999; Gustavsen and Semlyen 1998, from memory). H' is fitted strictly proper over the band where
 * |H| >= hFloor (above it the wave is gone; common practice), Yc with a constant term (its
 * high-frequency limit 1/Z0) over the whole band, with relative weighting.
 *
 * In the time domain (convolutions *, recursive for rational kernels, ../kernel/recursiveConvolution.ts):
 *
 *   i_k(t) = (yc * v_k)(t) - b_k(t),   b_k = h' * f_m(. - tau),   f_m = i_m + yc * v_m,
 *
 * so each end is a Norton equivalent i_k = G v_k + J_k - b_k with G = d + sum alpha of Yc's terms,
 * J_k the Yc history, and b_k from the far end's wave f_m delayed by tau (a ring buffer, linear
 * interpolation between samples) and filtered by H'. The cost per step is that of the two fits'
 * poles plus one ring-buffer read and write per end: it does not grow with the line's length
 * (only the ring buffer's memory does). tau >= dt is required so that an end's update needs only
 * the other end's past.
 *
 * Multiconductor lines. With n conductors H and Yc become matrices; their modal decomposition
 * T(omega) varies with frequency when the line is not homogeneous (earth return, cables with
 * sheaths). This file fits single-mode lines only; ./fdModal.ts implements route (a) below with a
 * constant real T0 (at a scenario's `modalFrequency`, default the quarter-wave frequency), each
 * mode fitted here, the ends coupled through T0, and the neglected coupling measured and reported
 * (the residual coupling is neglected, not fitted). For n > 1 the two published routes are (a) a
 * constant real transformation T0 (at a chosen frequency, e.g. the dominant frequency of the
 * transient), the modes fitted as here one by one and the residual modal coupling T0^-1 T(omega)
 * neglected or fitted as a small correction (J. R. Marti's constant-T model; L. Marti, IEEE Trans.
 * PWRD 3(3), 1988 for cables with a fitted T(omega); from memory), or (b) the phase-domain universal
 * line model: H in phase coordinates fitted with the poles of each modal group and the modal delays
 * (one delay per group), Yc fitted directly as a matrix with common poles (Morched, Gustavsen and
 * Tartibi 1999), which needs no transformation at all. Route (b) is the one this file's pieces
 * (vector fitting with common poles, recursive convolution per pole) extend to.
 */
import type { LineSection } from '@skein/lines';
import { badInput } from '../errors.ts';
import {
  createRecursiveConvolution, recursiveConvolutionAddInput, recursiveConvolutionDirect,
  recursiveConvolutionHistory, recursiveConvolutionStep,
} from '../kernel/recursiveConvolution.ts';
import {
  enforceAdmittancePassivity, enforceBoundedMagnitude, fitErrors, vectorFit,
  type PassivityResult, type RationalFunction,
} from './vectorFitting.ts';

/** Yc(j omega) and H'(j omega) = exp(-gamma l) exp(j omega tau) of a single-conductor line on a grid. */
export interface LineFunctions {
  /** Angular frequencies [rad/s]. */
  omegas: Float64Array;
  /** Characteristic admittance Yc [S], real and imaginary parts. */
  ycRe: Float64Array;
  ycIm: Float64Array;
  /** Propagation function with the delay taken out, real and imaginary parts. */
  hRe: Float64Array;
  hIm: Float64Array;
  /** The delay taken out [s]. */
  tauS: number;
  /** Lossless delay l sqrt(L_inf C_inf) of the section's high-frequency L and C [s]. */
  losslessDelayS: number;
}

function checkSingle(section: LineSection, lengthM: number): void {
  if (section.n !== 1) throw badInput(['fdLine', 'section', 'conductors'], 'must be one conductor (this model is single-mode; fitFdMultiLine in fdModal.ts fits multiconductor lines mode by mode)', `${section.n} conductors (${section.conductors.join(', ')})`);
  if (!(lengthM > 0) || !Number.isFinite(lengthM)) throw badInput(['fdLine', 'lengthM'], 'must be a positive length', `${lengthM} m`);
}

/**
 * Samples Yc and the propagation function with a delay taken out, H' = exp(-gamma l + j omega tau).
 * @param section a one-conductor section from @skein/lines
 * @param lengthM line length [m]
 * @param omegas angular frequencies [rad/s], > 0
 * @param tauS delay to take out [s]; default the lossless delay
 * @returns the samples
 * @throws InputError (E_INPUT) for a section with more than one conductor or a non-positive length
 * @example lineFunctions(coax, 10, Float64Array.of(2 * Math.PI * 1e6)).ycRe[0] // about 1/51.7 S
 */
export function lineFunctions(section: LineSection, lengthM: number, omegas: Float64Array, tauS?: number): LineFunctions {
  checkSingle(section, lengthM);
  const tau0 = lengthM * Math.sqrt(section.L[0] * section.C[0]);
  const tau = tauS ?? tau0;
  const n = omegas.length;
  const out: LineFunctions = {
    omegas, ycRe: new Float64Array(n), ycIm: new Float64Array(n), hRe: new Float64Array(n), hIm: new Float64Array(n),
    tauS: tau, losslessDelayS: tau0,
  };
  for (let i = 0; i < n; i++) {
    const w = omegas[i];
    const zy = section.zyAt(w / (2 * Math.PI));
    const zr = zy.Zre[0], zi = zy.Zim[0], yr = zy.Yre[0], yi = zy.Yim[0];
    // gamma = sqrt(Z Y), principal root (Re >= 0); Yc = Y / gamma.
    const pr = zr * yr - zi * yi;
    const pi = zr * yi + zi * yr;
    const m = Math.hypot(pr, pi);
    let gr = Math.sqrt((m + pr) / 2);
    let gi = Math.sqrt(Math.max(0, (m - pr) / 2)) * (pi < 0 ? -1 : 1);
    if (gr < 0) { gr = -gr; gi = -gi; }
    const gd = gr * gr + gi * gi;
    out.ycRe[i] = (yr * gr + yi * gi) / gd;
    out.ycIm[i] = (yi * gr - yr * gi) / gd;
    const mag = Math.exp(-gr * lengthM);
    const ph = -gi * lengthM + w * tau;
    out.hRe[i] = mag * Math.cos(ph);
    out.hIm[i] = mag * Math.sin(ph);
  }
  return out;
}

/** Options of fitFdLine. */
export interface FdLineFitOptions {
  /** Lowest fitted frequency [Hz]; default 1. */
  fMinHz?: number;
  /** Highest fitted frequency [Hz]; default 1e9. */
  fMaxHz?: number;
  /** Logarithmic samples per decade; default 20. */
  pointsPerDecade?: number;
  /** Poles of the Yc fit; default 14 (rms 3.5e-4 over the default 9 decades on a skin-effect coax; 12 give 9e-4). */
  ycPoles?: number;
  /** Poles of the H' fit; default 10. */
  hPoles?: number;
  /** H' is fitted where |H| >= hFloor; default 1e-5. */
  hFloor?: number;
  /** A fixed delay [s] instead of the search. */
  tauS?: number;
  /** Vector-fitting iterations of the final fits; default 10. */
  iterations?: number;
  /** Form of the H' fit: 'none' (strictly proper, default: H -> 0 as losses grow with frequency) or 'constant' (for lines whose H' stays finite, e.g. lossless or distortionless). */
  hAsymptote?: 'none' | 'constant';
}

/** A fitted frequency-dependent line. */
export interface FdLineModel {
  lengthM: number;
  /** The delay taken out of H [s]. */
  tauS: number;
  /** Lossless delay l sqrt(L_inf C_inf) [s]. */
  losslessDelayS: number;
  /** Rational Yc [S] (passive: Re Yc >= 0). */
  yc: RationalFunction;
  /** Rational H' (strictly proper unless hAsymptote = 'constant'; |H'| <= 1). */
  h: RationalFunction;
  /** Fitting errors on the samples: Yc relative, H' relative and absolute (after passivity enforcement). */
  errors: { ycRmsRelative: number; ycMaxRelative: number; hRmsRelative: number; hRmsAbsolute: number; hMaxRelative: number };
  /** Passivity checks (min Re Yc, max |H'|, before and after). */
  passivity: { yc: Omit<PassivityResult, 'fit'>; h: Omit<PassivityResult, 'fit'> };
  /** Fitted bands [Hz]. */
  bands: { yc: [number, number]; h: [number, number] };
}

function logGrid(f0: number, f1: number, perDecade: number): Float64Array {
  const n = Math.max(8, Math.ceil(Math.log10(f1 / f0) * perDecade) + 1);
  return Float64Array.from({ length: n }, (_, i) => 2 * Math.PI * 10 ** (Math.log10(f0) + ((Math.log10(f1) - Math.log10(f0)) * i) / (n - 1)));
}

/**
 * Fits a single-conductor line: the delay tau, Yc and H' by vector fitting, passivity enforced.
 * @param section a one-conductor section from @skein/lines
 * @param lengthM line length [m]
 * @param options band (1 Hz..1 GHz), poles (14 for Yc, 10 for H'), hFloor (1e-5), tau (searched)
 * @returns the model with its fitting errors
 * @throws InputError (E_INPUT) for a multiconductor section, a bad length or band, or a line so
 *   lossy that |H| < hFloor over the whole band
 * @example fitFdLine(coax, 100).errors.ycRmsRelative // about 1e-4
 */
export function fitFdLine(section: LineSection, lengthM: number, options: FdLineFitOptions = {}): FdLineModel {
  checkSingle(section, lengthM);
  const fMin = options.fMinHz ?? 1;
  const fMax = options.fMaxHz ?? 1e9;
  if (!(fMin > 0) || !(fMax > fMin)) throw badInput(['fdLine', 'fit', 'fMinHz'], 'must satisfy 0 < fMinHz < fMaxHz', `${fMin} Hz .. ${fMax} Hz`);
  const nYc = options.ycPoles ?? 14;
  const nH = options.hPoles ?? 10;
  const hFloor = options.hFloor ?? 1e-5;
  const iters = options.iterations ?? 10;
  const w = logGrid(fMin, fMax, options.pointsPerDecade ?? 20);
  const lf = lineFunctions(section, lengthM, w);

  // Yc: relative weighting, constant term.
  const ycW = Float64Array.from(w, (_, i) => 1 / Math.hypot(lf.ycRe[i], lf.ycIm[i]));
  const ycFit = vectorFit(w, lf.ycRe, lf.ycIm, { nPoles: nYc, startPoles: 'real', weights: ycW, iterations: iters });
  const ycP = enforceAdmittancePassivity(ycFit, w[0], w[w.length - 1]);

  // H': band where |H| >= hFloor.
  let nBand = 0;
  while (nBand < w.length && Math.hypot(lf.hRe[nBand], lf.hIm[nBand]) >= hFloor) nBand++;
  if (nBand < nH + 2) throw badInput(['fdLine', 'fit', 'hFloor'], `must leave at least ${nH + 2} samples with |H| >= hFloor (the line is too lossy for the band; lower fMinHz or hFloor)`, `${nBand} samples`);
  const wb = w.subarray(0, nBand);
  const errAt = (tau: number, it: number): { err: number; fit: ReturnType<typeof vectorFit>; re: Float64Array; im: Float64Array } => {
    const h = lineFunctions(section, lengthM, wb, tau);
    const fit = vectorFit(wb, h.hRe, h.hIm, { nPoles: nH, startPoles: 'real', asymptote: options.hAsymptote ?? 'none', iterations: it });
    return { err: fit.rmsError, fit, re: h.hRe, im: h.hIm };
  };
  let tau: number;
  const tau0 = lf.losslessDelayS;
  if (options.tauS !== undefined) {
    if (!(options.tauS > 0)) throw badInput(['fdLine', 'fit', 'tauS'], 'must be a positive delay', `${options.tauS} s`);
    tau = options.tauS;
  } else {
    // Phase delay at the lowest frequency of the band bounds the search from above (internal
    // inductance only adds delay at lower frequencies); the lossless delay from below.
    const phaseLow = lineFunctions(section, lengthM, wb.subarray(0, 1), 0);
    let hi = -Math.atan2(phaseLow.hIm[0], phaseLow.hRe[0]) / wb[0];
    if (!(hi > tau0 * 1.001) || hi > tau0 * 1.2) hi = tau0 * 1.05;
    let lo = tau0 * 0.999;
    // Coarse scan, then golden-section refinement around the best point.
    const nScan = 9;
    let best = lo, bestErr = Infinity;
    for (let k = 0; k < nScan; k++) {
      const t = lo + ((hi - lo) * k) / (nScan - 1);
      const e = errAt(t, 5).err;
      if (e < bestErr) { bestErr = e; best = t; }
    }
    const step = (hi - lo) / (nScan - 1);
    lo = Math.max(tau0 * 0.999, best - step);
    hi = best + step;
    const g = (Math.sqrt(5) - 1) / 2;
    let a = hi - g * (hi - lo), b = lo + g * (hi - lo);
    let ea = errAt(a, 5).err, eb = errAt(b, 5).err;
    for (let k = 0; k < 14; k++) {
      if (ea < eb) { hi = b; b = a; eb = ea; a = hi - g * (hi - lo); ea = errAt(a, 5).err; }
      else { lo = a; a = b; ea = eb; b = lo + g * (hi - lo); eb = errAt(b, 5).err; }
    }
    tau = ea < eb ? a : b;
  }
  const hRes = errAt(tau, iters);
  const hP = enforceBoundedMagnitude(hRes.fit, wb[0], wb[wb.length - 1]);
  const ycErr = fitErrors(ycP.fit, w, lf.ycRe, lf.ycIm);
  const hErr = fitErrors(hP.fit, wb, hRes.re, hRes.im);
  const strip = (p: PassivityResult): Omit<PassivityResult, 'fit'> => ({ worstBefore: p.worstBefore, worstAfter: p.worstAfter, changed: p.changed });
  return {
    lengthM, tauS: tau, losslessDelayS: tau0, yc: ycP.fit, h: hP.fit,
    errors: {
      ycRmsRelative: ycErr.rmsRelativeError, ycMaxRelative: ycErr.maxRelativeError,
      hRmsRelative: hErr.rmsRelativeError, hRmsAbsolute: hErr.rmsError, hMaxRelative: hErr.maxRelativeError,
    },
    passivity: { yc: strip(ycP), h: strip(hP) },
    bands: { yc: [fMin, fMax], h: [fMin, wb[wb.length - 1] / (2 * Math.PI)] },
  };
}

/** Input of simulateFdLine. */
export interface FdLineSimulation {
  /** One-conductor section from @skein/lines (ignored when `model` is given). */
  section?: LineSection;
  /** A model from fitFdLine (skips the fit). */
  model?: FdLineModel;
  /** Line length [m]. */
  lengthM: number;
  /** Time step [s]; must not exceed the delay tau. */
  dtS: number;
  /** Number of time samples (t = 0 .. (steps - 1) dt). */
  steps: number;
  /** Thevenin source at the near end: EMF v(t) [V] at t [s] and resistance [ohm] (0: ideal). */
  source: { v: (tS: number) => number; resistanceOhm: number };
  /** Load resistance at the far end [ohm]; Infinity for an open end. */
  loadR: number;
  /** Fit options when `model` is not given. */
  fit?: FdLineFitOptions;
}

/** Output of simulateFdLine. */
export interface FdLineResult {
  /** Near-end (source side) voltage [V] per sample. */
  vNear: Float64Array;
  /** Far-end (load) voltage [V] per sample. */
  vFar: Float64Array;
  /** Current into the line at the near end [A]. */
  iNear: Float64Array;
  /** Current into the line at the far end [A]. */
  iFar: Float64Array;
  /** The model used. */
  model: FdLineModel;
  /** Wall time of the stepping loop alone [ms]. */
  stepMs: number;
}

/** The per-run arrays of a prepared line, all allocated before the first step. */
/** A fitted model prepared for one time step (recursive-convolution coefficients, delay in steps). */
export interface Prepared {
  ycC: Float64Array; ycN: number; ycNc: number; ycD: number;
  hC: Float64Array; hN: number; hNc: number; hD: number;
  g: number; k: number; frac: number; mask: number;
}

/** Prepares a fitted model for time step dt [s]. */
export function prepareFdLine(model: FdLineModel, dtS: number): Prepared {
  const yc = createRecursiveConvolution(model.yc, dtS);
  const h = createRecursiveConvolution(model.h, dtS);
  const r = model.tauS / dtS;
  const k = Math.floor(r);
  let size = 1;
  while (size < k + 2) size *= 2;
  return {
    ycC: yc.coef, ycN: yc.nReal, ycNc: yc.nComplex, ycD: yc.d,
    hC: h.coef, hN: h.nReal, hNc: h.nComplex, hD: h.d,
    g: yc.d + recursiveConvolutionDirect(yc.nReal, yc.nComplex, yc.coef, 0),
    k, frac: r - k, mask: size - 1,
  };
}

/**
 * Simulates one frequency-dependent line between a Thevenin source and a resistive load, by the
 * line-end update in this file's header, from rest at t = 0.
 * @param sim section (or a fitted model), length [m], dt [s], steps, source, load [ohm], fit options
 * @returns near- and far-end voltages and currents per sample, the model, the stepping time [ms]
 * @throws InputError (E_INPUT) for dt <= 0, dt > tau, steps < 1, negative resistances, or a bad section
 * @example simulateFdLine({ section: coax, lengthM: 100, dtS: 1e-10, steps: 20000, source: { v: (t) => (t > 0 ? 1 : 0), resistanceOhm: 50 }, loadR: 50 }).vFar
 */
export function simulateFdLine(sim: FdLineSimulation): FdLineResult {
  const { lengthM, dtS, steps, source, loadR } = sim;
  if (!(dtS > 0) || !Number.isFinite(dtS)) throw badInput(['simulateFdLine', 'dtS'], 'must be a positive time step', `${dtS} s`);
  if (!Number.isInteger(steps) || steps < 1) throw badInput(['simulateFdLine', 'steps'], 'must be a positive integer', steps);
  if (!(source.resistanceOhm >= 0)) throw badInput(['simulateFdLine', 'source', 'resistanceOhm'], 'must be a resistance >= 0 ohm', source.resistanceOhm);
  if (!(loadR > 0)) throw badInput(['simulateFdLine', 'loadR'], 'must be a resistance > 0 ohm (Infinity: open)', loadR);
  let model = sim.model;
  if (!model) {
    if (!sim.section) throw badInput(['simulateFdLine', 'section'], 'must be given when no model is', 'undefined');
    model = fitFdLine(sim.section, lengthM, sim.fit);
  }
  if (dtS > model.tauS) throw badInput(['simulateFdLine', 'dtS'], `must not exceed the line's delay ${model.tauS} s (an end must see only the other end's past)`, `${dtS} s`);
  const p = prepareFdLine(model, dtS);
  const vNear = new Float64Array(steps);
  const vFar = new Float64Array(steps);
  const iNear = new Float64Array(steps);
  const iFar = new Float64Array(steps);
  const nYcS = p.ycN + 2 * p.ycNc;
  const nHS = p.hN + 2 * p.hNc;
  const ycState = new Float64Array(2 * nYcS); // near end at 0, far end at nYcS
  const hState = new Float64Array(2 * nHS);
  const ring = new Float64Array(2 * (p.mask + 1)); // f of the near end at 0, of the far end at mask + 1
  const rOff = p.mask + 1;
  const gs = source.resistanceOhm > 0 ? 1 / source.resistanceOhm : Infinity;
  const gl = Number.isFinite(loadR) ? 1 / loadR : 0;
  const t0 = performance.now();
  stepLoop(steps, dtS, p, source.v, gs, gl, ycState, nYcS, hState, nHS, ring, rOff, vNear, vFar, iNear, iFar);
  const stepMs = performance.now() - t0;
  return { vNear, vFar, iNear, iFar, model, stepMs };
}

/**
 * The stepping loop: per step, each end's incident wave (delayed, filtered by H'), its Yc history,
 * the terminal solve, then the end's outgoing wave f into its ring buffer. Allocates nothing.
 * Time levels: every quantity at t_n; the ring buffers hold f at t_0 .. t_n.
 */
function stepLoop(
  steps: number, dtS: number, p: Prepared, vs: (tS: number) => number, gs: number, gl: number,
  ycState: Float64Array, nYcS: number, hState: Float64Array, nHS: number, ring: Float64Array, rOff: number,
  vNear: Float64Array, vFar: Float64Array, iNear: Float64Array, iFar: Float64Array,
): void {
  const { ycC, ycN, ycNc, ycD, hC, hN, hNc, hD, g, k, frac, mask } = p;
  let u1Prev = 0, u2Prev = 0, v1Prev = 0, v2Prev = 0;
  for (let n = 0; n < steps; n++) {
    // Incident waves at t_n - tau: (1 - frac) f[n - k] + frac f[n - k - 1]; zero before t = 0.
    const ia = n - k, ib = n - k - 1;
    const f2a = ia >= 0 ? ring[rOff + (ia & mask)] : 0;
    const f2b = ib >= 0 ? ring[rOff + (ib & mask)] : 0;
    const f1a = ia >= 0 ? ring[ia & mask] : 0;
    const f1b = ib >= 0 ? ring[ib & mask] : 0;
    const u1 = (1 - frac) * f2a + frac * f2b; // arrives at the near end
    const u2 = (1 - frac) * f1a + frac * f1b;
    let b1: number, b2: number, j1: number, j2: number;
    if (n === 0) {
      b1 = hD * u1; b2 = hD * u2; j1 = 0; j2 = 0;
    } else {
      b1 = hD * u1 + recursiveConvolutionStep(hN, hNc, u1Prev, u1, hC, 0, hState, 0);
      b2 = hD * u2 + recursiveConvolutionStep(hN, hNc, u2Prev, u2, hC, 0, hState, nHS);
      j1 = recursiveConvolutionHistory(ycN, ycNc, v1Prev, ycC, 0, ycState, 0);
      j2 = recursiveConvolutionHistory(ycN, ycNc, v2Prev, ycC, 0, ycState, nYcS);
    }
    // Near end: (vs - v1) gs = g v1 + j1 - b1; an ideal source (gs = Infinity) sets v1 = vs.
    // At t = 0 from rest the Yc convolution is d v_0 alone (no interval behind it yet).
    const gn = n === 0 ? ycD : g;
    const e = vs(n * dtS);
    const v1 = gs === Infinity ? e : (e * gs - j1 + b1) / (gs + gn);
    // Far end: -v2 gl = g v2 + j2 - b2.
    const v2 = (b2 - j2) / (gl + gn);
    if (n > 0) {
      recursiveConvolutionAddInput(ycN, ycNc, v1, ycC, 0, ycState, 0);
      recursiveConvolutionAddInput(ycN, ycNc, v2, ycC, 0, ycState, nYcS);
    }
    const y1 = gn * v1 + j1; // (yc * v1)(t_n)
    const y2 = gn * v2 + j2;
    const i1 = y1 - b1;
    const i2 = y2 - b2;
    ring[n & mask] = i1 + y1;
    ring[rOff + (n & mask)] = i2 + y2;
    vNear[n] = v1; vFar[n] = v2; iNear[n] = i1; iFar[n] = i2;
    u1Prev = u1; u2Prev = u2; v1Prev = v1; v2Prev = v2;
  }
}
