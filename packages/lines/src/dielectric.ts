/**
 * Dielectric models: complex relative permittivity eps_r(f) = eps' - j eps''.
 *
 * - constant: eps' and loss tangent fixed at every frequency (simple, not causal over a wide band).
 * - Djordjevic-Sarkar wideband model (A. R. Djordjevic, R. M. Biljic, V. D. Likar-Smiljanic,
 *   T. K. Sarkar, "Wideband frequency-domain characterization of FR-4 and time-domain causality",
 *   IEEE Trans. EMC 43(4), 662-667, 2001):
 *     eps_r(w) = eps_inf + (d_eps / ln(w2/w1)) ln((w2 + j w)/(w1 + j w)),
 *   causal (Kramers-Kronig consistent), fitted so that eps_r(f_spec) = eps'(1 - j tan delta).
 */
import type { Complex } from './complex.ts';
import { cdiv, clog } from './complex.ts';

/** Dielectric material as the section input describes it. */
export interface DielectricInput {
  /** Relative permittivity eps' [-] (at specAtHz for the wideband model), >= 1. */
  relPermittivity: number;
  /** Loss tangent eps''/eps' [-] (at specAtHz for the wideband model), default 0. */
  lossTangent?: number;
  /** 'constant' (default) or 'djordjevic-sarkar'. */
  model?: 'constant' | 'djordjevic-sarkar';
  /** Frequency at which relPermittivity and lossTangent are specified [Hz], default 1e9 (wideband model only). */
  specAtHz?: number;
  /** Lower corner f1 of the wideband model [Hz], default 1e3. */
  lowHz?: number;
  /** Upper corner f2 of the wideband model [Hz], default 1e12. */
  highHz?: number;
}

/** A dielectric model ready to evaluate. */
export interface DielectricModel {
  /** eps_r at f [Hz] as {re: eps', im: eps''} with eps_r = eps' - j eps''. */
  at(fHz: number): Complex;
  /**
   * eps_r(s) at complex frequency s = sigma + j omega [1/s] as the complex value itself (at
   * s = j omega: {re: eps', im: -eps''}); absent where the model has no analytic continuation
   * (a constant nonzero loss tangent is not the boundary value of a function analytic in Re s > 0).
   */
  atS?(s: Complex): Complex;
  /** eps' at very high frequency (used for the lossless, high-frequency matrices) [-]. */
  highFrequency: number;
  /** True when eps' depends on frequency. */
  dispersive: boolean;
  /** True when eps'' is not identically zero. */
  lossy: boolean;
}

/**
 * Constant-permittivity, constant-loss-tangent dielectric.
 *
 * @param relPermittivity eps' [-]
 * @param lossTangent tan delta [-], default 0
 * @returns the model; at(f) = {re: eps', im: eps' tan delta} for f > 0, im = 0 at f = 0
 * @example constantDielectric(4.4, 0.02).at(1e9) // {re: 4.4, im: 0.088}
 */
export function constantDielectric(relPermittivity: number, lossTangent = 0): DielectricModel {
  return {
    at: (fHz) => ({ re: relPermittivity, im: fHz === 0 ? 0 : relPermittivity * lossTangent }),
    ...(lossTangent > 0 ? {} : { atS: () => ({ re: relPermittivity, im: 0 }) }),
    highFrequency: relPermittivity,
    dispersive: false,
    lossy: lossTangent > 0,
  };
}

/**
 * Djordjevic-Sarkar wideband dielectric, fitted to eps' and tan delta at one frequency.
 *
 * @param relPermittivity eps' at specAtHz [-]
 * @param lossTangent tan delta at specAtHz [-]
 * @param specAtHz frequency of the specification [Hz], default 1e9
 * @param lowHz lower corner [Hz], default 1e3
 * @param highHz upper corner [Hz], default 1e12
 * @returns the model; highFrequency is eps_inf
 * @example djordjevicSarkarDielectric(4.4, 0.02).at(1e9) // {re: 4.4, im: 0.088}
 */
export function djordjevicSarkarDielectric(relPermittivity: number, lossTangent: number, specAtHz = 1e9, lowHz = 1e3, highHz = 1e12): DielectricModel {
  const w1 = 2 * Math.PI * lowHz;
  const w2 = 2 * Math.PI * highHz;
  const lnr = Math.log(w2 / w1);
  const shape = (w: number): Complex => {
    const l = clog(cdiv({ re: w2, im: w }, { re: w1, im: w }));
    return { re: l.re / lnr, im: l.im / lnr };
  };
  const ws = 2 * Math.PI * specAtHz;
  const fs = shape(ws);
  // eps = eps_inf + d shape ; Im eps = d Im shape = -eps' tan delta
  const d = lossTangent === 0 ? 0 : (-relPermittivity * lossTangent) / fs.im;
  const epsInf = relPermittivity - d * fs.re;
  return {
    at: (fHz) => {
      const s = shape(2 * Math.PI * fHz);
      return { re: epsInf + d * s.re, im: -d * s.im + 0 };
    },
    // eps_inf + d ln((w2 + s) / (w1 + s)) / ln(w2 / w1): analytic for Re s > -w1.
    atS: (s) => {
      const l = clog(cdiv({ re: w2 + s.re, im: s.im }, { re: w1 + s.re, im: s.im }));
      return { re: epsInf + (d * l.re) / lnr, im: (d * l.im) / lnr };
    },
    highFrequency: epsInf,
    dispersive: d !== 0,
    lossy: d !== 0,
  };
}

/**
 * Builds the model the input asks for.
 *
 * @param input dielectric description (already validated)
 * @returns the model
 * @example dielectricModel({ relPermittivity: 2.25 }).at(1e6).re // 2.25
 */
export function dielectricModel(input: DielectricInput): DielectricModel {
  if (input.model === 'djordjevic-sarkar') {
    return djordjevicSarkarDielectric(input.relPermittivity, input.lossTangent ?? 0, input.specAtHz ?? 1e9, input.lowHz ?? 1e3, input.highHz ?? 1e12);
  }
  return constantDielectric(input.relPermittivity, input.lossTangent ?? 0);
}
