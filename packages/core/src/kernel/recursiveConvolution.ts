/**
 * Recursive convolution of a sampled input u with a sum of first-order terms r/(s - p).
 *
 * Each term's impulse response is r e^{p t}; its state x(t) = int_0^t r e^{p (t - tau)} u(tau) dtau
 * obeys, exactly for an input that is linear between samples (u_{n-1} at t_{n-1}, u_n at t_n),
 *
 *   x_n = E x_{n-1} + alpha u_n + beta u_{n-1},   E = e^{p dt},  q = p dt,
 *   alpha = (r / p) ((E - 1)/q - 1),   beta = (r / p) (E - (E - 1)/q),
 *
 * (A. Semlyen and A. Dabuleanu, "Fast and accurate switching transient calculations on
 * transmission lines with ground return using recursive convolutions", IEEE Trans. PAS-94(2),
 * 1975; the piecewise-linear coefficients as in B. Gustavsen and A. Semlyen, "Simulation of
 * transmission line transients using vector fitting and modal decomposition", IEEE Trans. Power
 * Delivery 13(2), 1998; from memory, rederived here). For |q| small the series
 * alpha = r dt (1/2 + q/6 + q^2/24), beta = r dt (1/2 + q/3 + q^2/8) avoids cancellation; both tend
 * to the trapezoidal rule r dt / 2 as q -> 0.
 *
 * Layout (flat, prepared by `createRecursiveConvolution` before the first step):
 * - real terms first, nReal of them: coef[c + 3k .. +2] = (E, alpha, beta), state[s + k] = x.
 * - complex pairs after, nComplex of them, one state per pair (the term with Im p > 0; the
 *   conjugate term's state is its conjugate, so the pair contributes 2 Re x):
 *   coef[c + 3 nReal + 6k .. +5] = (Er, Ei, alphar, alphai, betar, betai), state[s + nReal + 2k .. +1] = (xr, xi).
 * Time levels: state holds x_{n-1} on entry and x_n on return; uPrev = u_{n-1}, uNow = u_n.
 */

/**
 * Advances all terms by one step with u linear from uPrev to uNow.
 * @param nReal number of real terms
 * @param nComplex number of complex pairs
 * @param uPrev input at t_{n-1}
 * @param uNow input at t_n
 * @param coef coefficients (layout above), read from offset cOff
 * @param cOff offset into coef
 * @param state states x_{n-1} -> x_n, from offset sOff
 * @param sOff offset into state
 * @returns sum of the terms' outputs at t_n (real terms x, pairs 2 Re x); add d u_n for the direct part
 * @example recursiveConvolutionStep(1, 0, 0, 1, coef, 0, state, 0) // x_1 of a unit ramp
 */
export function recursiveConvolutionStep(
  nReal: number, nComplex: number, uPrev: number, uNow: number,
  coef: Float64Array, cOff: number, state: Float64Array, sOff: number,
): number {
  let y = 0;
  let c = cOff;
  let s = sOff;
  for (let k = 0; k < nReal; k++) {
    const x = coef[c] * state[s] + coef[c + 1] * uNow + coef[c + 2] * uPrev;
    state[s] = x;
    y += x;
    c += 3;
    s += 1;
  }
  for (let k = 0; k < nComplex; k++) {
    const xr = state[s];
    const xi = state[s + 1];
    const nr = coef[c] * xr - coef[c + 1] * xi + coef[c + 2] * uNow + coef[c + 4] * uPrev;
    const ni = coef[c] * xi + coef[c + 1] * xr + coef[c + 3] * uNow + coef[c + 5] * uPrev;
    state[s] = nr;
    state[s + 1] = ni;
    y += 2 * nr;
    c += 6;
    s += 2;
  }
  return y;
}

/**
 * First half of a step whose input u_n is not known yet (it depends on the output, as at a line
 * end): x <- E x_{n-1} + beta u_{n-1}. The output at t_n is then this return value plus
 * gAlpha u_n, where gAlpha = sum alpha (pairs 2 Re alpha), see `recursiveConvolutionDirect`; finish
 * with `recursiveConvolutionAddInput` once u_n is known.
 * @param nReal number of real terms
 * @param nComplex number of complex pairs
 * @param uPrev input at t_{n-1}
 * @param coef coefficients, from offset cOff
 * @param cOff offset into coef
 * @param state states (x_{n-1} on entry, the partial update on return), from offset sOff
 * @param sOff offset into state
 * @returns the history part of the output at t_n
 * @example recursiveConvolutionHistory(1, 0, 1, coef, 0, state, 0)
 */
export function recursiveConvolutionHistory(
  nReal: number, nComplex: number, uPrev: number,
  coef: Float64Array, cOff: number, state: Float64Array, sOff: number,
): number {
  let y = 0;
  let c = cOff;
  let s = sOff;
  for (let k = 0; k < nReal; k++) {
    const x = coef[c] * state[s] + coef[c + 2] * uPrev;
    state[s] = x;
    y += x;
    c += 3;
    s += 1;
  }
  for (let k = 0; k < nComplex; k++) {
    const xr = state[s];
    const xi = state[s + 1];
    const nr = coef[c] * xr - coef[c + 1] * xi + coef[c + 4] * uPrev;
    const ni = coef[c] * xi + coef[c + 1] * xr + coef[c + 5] * uPrev;
    state[s] = nr;
    state[s + 1] = ni;
    y += 2 * nr;
    c += 6;
    s += 2;
  }
  return y;
}

/**
 * Second half of a step: x_n = (partial state) + alpha u_n.
 * @param nReal number of real terms
 * @param nComplex number of complex pairs
 * @param uNow input at t_n
 * @param coef coefficients, from offset cOff
 * @param cOff offset into coef
 * @param state states, from offset sOff
 * @param sOff offset into state
 * @returns the number of terms updated
 * @example recursiveConvolutionAddInput(1, 0, 1, coef, 0, state, 0) // 1
 */
export function recursiveConvolutionAddInput(
  nReal: number, nComplex: number, uNow: number,
  coef: Float64Array, cOff: number, state: Float64Array, sOff: number,
): number {
  let c = cOff;
  let s = sOff;
  for (let k = 0; k < nReal; k++) {
    state[s] += coef[c + 1] * uNow;
    c += 3;
    s += 1;
  }
  for (let k = 0; k < nComplex; k++) {
    state[s] += coef[c + 2] * uNow;
    state[s + 1] += coef[c + 3] * uNow;
    c += 6;
    s += 2;
  }
  return nReal + nComplex;
}

/**
 * The weight of u_n in the output at t_n: sum alpha (pairs 2 Re alpha); add d for the total.
 * @param nReal number of real terms
 * @param nComplex number of complex pairs
 * @param coef coefficients, from offset cOff
 * @param cOff offset into coef
 * @returns sum of alpha
 * @example recursiveConvolutionDirect(1, 0, coef, 0) // r dt / 2 for small p dt
 */
export function recursiveConvolutionDirect(nReal: number, nComplex: number, coef: Float64Array, cOff: number): number {
  let g = 0;
  let c = cOff;
  for (let k = 0; k < nReal; k++) {
    g += coef[c + 1];
    c += 3;
  }
  for (let k = 0; k < nComplex; k++) {
    g += 2 * coef[c + 2];
    c += 6;
  }
  return g;
}

/** Complex (a + jb)(c + jd). */
function cmul(a: number, b: number, c: number, d: number): [number, number] {
  return [a * c - b * d, a * d + b * c];
}

/** Complex (a + jb)/(c + jd). */
function cdiv(a: number, b: number, c: number, d: number): [number, number] {
  const den = c * c + d * d;
  return [(a * c + b * d) / den, (b * c - a * d) / den];
}

/**
 * The coefficients (E, alpha, beta) of one term r/(s - p) for step dt (complex arithmetic).
 * @param pr Re p [1/s]
 * @param pi Im p [rad/s]
 * @param rr Re r
 * @param ri Im r
 * @param dtS time step [s]
 * @returns [Er, Ei, alphar, alphai, betar, betai]
 * @example recursiveConvolutionCoefficients(-1, 0, 1, 0, 1e-9) // [~1, 0, ~5e-10, 0, ~5e-10, 0]
 */
export function recursiveConvolutionCoefficients(pr: number, pi: number, rr: number, ri: number, dtS: number): [number, number, number, number, number, number] {
  const qr = pr * dtS;
  const qi = pi * dtS;
  const m = Math.exp(qr);
  const Er = m * Math.cos(qi);
  const Ei = m * Math.sin(qi);
  let ar: number, ai: number, br: number, bi: number;
  if (Math.hypot(qr, qi) < 1e-3) {
    // Series in q: alpha/(r dt) = 1/2 + q/6 + q^2/24 + q^3/120, beta/(r dt) = 1/2 + q/3 + q^2/8 + q^3/30.
    const [q2r, q2i] = cmul(qr, qi, qr, qi);
    const [q3r, q3i] = cmul(q2r, q2i, qr, qi);
    const sar = 0.5 + qr / 6 + q2r / 24 + q3r / 120;
    const sai = qi / 6 + q2i / 24 + q3i / 120;
    const sbr = 0.5 + qr / 3 + q2r / 8 + q3r / 30;
    const sbi = qi / 3 + q2i / 8 + q3i / 30;
    [ar, ai] = cmul(rr * dtS, ri * dtS, sar, sai);
    [br, bi] = cmul(rr * dtS, ri * dtS, sbr, sbi);
  } else {
    const [gr, gi] = cdiv(Er - 1, Ei, qr, qi); // (E - 1)/q
    const [rpr, rpi] = cdiv(rr, ri, pr, pi); // r/p
    [ar, ai] = cmul(rpr, rpi, gr - 1, gi);
    [br, bi] = cmul(rpr, rpi, Er - gr, Ei - gi);
  }
  return [Er, Ei, ar, ai, br, bi];
}

/** A prepared recursive convolution: flat coefficients, a state buffer and the direct term. */
export interface RecursiveConvolution {
  /** Number of real terms. */
  nReal: number;
  /** Number of complex pairs. */
  nComplex: number;
  /** Coefficients, layout in the file header. */
  coef: Float64Array;
  /** States (zero: at rest). */
  state: Float64Array;
  /** Direct term d (output d u_n). */
  d: number;
  /** Time step [s]. */
  dtS: number;
}

/**
 * Prepares the recursive convolution of sum r_k/(s - p_k) + d for step dt. Poles with Im p != 0
 * must come in conjugate pairs with the Im p > 0 member first (as `vectorFit` returns them); only
 * that member is kept.
 * @param fn poles and residues (Float64Array each), d; e (a term s e) is not supported
 * @param dtS time step [s], > 0
 * @returns coefficients and a zero state
 * @throws Error if dt is not positive, a pole is unstable, e != 0, or a complex pole has no conjugate after it
 * @example createRecursiveConvolution({ polesRe: Float64Array.of(-1e6), polesIm: Float64Array.of(0), residuesRe: Float64Array.of(1e6), residuesIm: Float64Array.of(0), d: 0, e: 0 }, 1e-9).nReal // 1
 */
export function createRecursiveConvolution(
  fn: { polesRe: Float64Array; polesIm: Float64Array; residuesRe: Float64Array; residuesIm: Float64Array; d: number; e: number },
  dtS: number,
): RecursiveConvolution {
  if (!(dtS > 0) || !Number.isFinite(dtS)) throw new Error(`recursiveConvolution.dtS: must be a positive time step, got ${dtS} s`);
  if (fn.e !== 0) throw new Error(`recursiveConvolution.e: a term s e cannot be convolved recursively, got e = ${fn.e}`);
  const real: number[] = [];
  const pairs: number[] = [];
  for (let k = 0; k < fn.polesRe.length; k++) {
    if (!(fn.polesRe[k] < 0)) throw new Error(`recursiveConvolution.poles[${k}]: must be stable (Re p < 0), got ${fn.polesRe[k]} + j${fn.polesIm[k]}`);
    if (fn.polesIm[k] === 0) real.push(k);
    else if (fn.polesIm[k] > 0) {
      if (fn.polesIm[k + 1] !== -fn.polesIm[k] || fn.polesRe[k + 1] !== fn.polesRe[k]) throw new Error(`recursiveConvolution.poles[${k}]: a complex pole must be followed by its conjugate`);
      pairs.push(k);
      k += 1;
    } else throw new Error(`recursiveConvolution.poles[${k}]: a complex pole must be preceded by its conjugate with Im p > 0`);
  }
  const coef = new Float64Array(3 * real.length + 6 * pairs.length);
  let c = 0;
  for (const k of real) {
    const q = recursiveConvolutionCoefficients(fn.polesRe[k], 0, fn.residuesRe[k], 0, dtS);
    coef[c] = q[0];
    coef[c + 1] = q[2];
    coef[c + 2] = q[4];
    c += 3;
  }
  for (const k of pairs) {
    coef.set(recursiveConvolutionCoefficients(fn.polesRe[k], fn.polesIm[k], fn.residuesRe[k], fn.residuesIm[k], dtS), c);
    c += 6;
  }
  return { nReal: real.length, nComplex: pairs.length, coef, state: new Float64Array(real.length + 2 * pairs.length), d: fn.d, dtS };
}

/**
 * Convolves a whole sampled input (u_0 at t = 0, at rest before; linear between samples) with the
 * prepared terms: y_n = d u_n + sum_k x_k,n. Resets the state first.
 * @param rc prepared convolution (its state is overwritten)
 * @param u input samples
 * @param y output samples (same length), returned
 * @returns y
 * @example recursiveConvolve(rc, u, new Float64Array(u.length))
 */
export function recursiveConvolve(rc: RecursiveConvolution, u: Float64Array, y: Float64Array): Float64Array {
  rc.state.fill(0);
  if (u.length === 0) return y;
  y[0] = rc.d * u[0];
  for (let n = 1; n < u.length; n++) {
    y[n] = rc.d * u[n] + recursiveConvolutionStep(rc.nReal, rc.nComplex, u[n - 1], u[n], rc.coef, 0, rc.state, 0);
  }
  return y;
}
