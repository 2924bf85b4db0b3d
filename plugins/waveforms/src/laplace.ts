/**
 * Laplace transforms W(s) at s = sigma + j omega of the piecewise-linear and exponential shapes,
 * for the waveforms' `laplace(sigma, omega, out)` hooks (closed forms from the table of transforms:
 * L{u(t - t0)} = e^{-s t0} / s, L{ramp} = 1 / s^2, shift theorem; common practice). Scalar math
 * into out[0] (real) and out[1] (imaginary); nothing is allocated.
 */

/**
 * Unit linear edge starting at t0 and reaching 1 at t0 + d, then held:
 * W(s) = e^{-s t0} (1 - e^{-s d}) / (d s^2), with 1 - e^{-s d} formed by expm1 so that small |s d|
 * keeps its digits. d = 0 is the ideal step e^{-s t0} / s. Adds scale * W into out.
 * @param sigma damping [1/s]; @param omega angular frequency [rad/s]; s != 0.
 */
export function addEdge(sigma: number, omega: number, t0: number, d: number, scale: number, out: Float64Array): void {
  // e^{-s t0}
  const m0 = Math.exp(-sigma * t0);
  const er = m0 * Math.cos(omega * t0), ei = -m0 * Math.sin(omega * t0);
  const ss = sigma * sigma + omega * omega;
  if (d === 0) {
    // e^{-s t0} / s = e^{-s t0} conj(s) / |s|^2
    out[0] += (scale * (er * sigma + ei * omega)) / ss;
    out[1] += (scale * (ei * sigma - er * omega)) / ss;
    return;
  }
  // q = 1 - e^{-s d} = -expm1(-s d); expm1(x + j y) = expm1(x) cos y - 2 sin^2(y/2) + j e^x sin y
  const x = -sigma * d, y = -omega * d;
  const h = Math.sin(y / 2);
  const qr = -(Math.expm1(x) * Math.cos(y) - 2 * h * h);
  const qi = -(Math.exp(x) * Math.sin(y));
  // 1 / (d s^2): s^2 = (sigma^2 - omega^2) + j 2 sigma omega
  const s2r = sigma * sigma - omega * omega, s2i = 2 * sigma * omega;
  const den = d * (s2r * s2r + s2i * s2i);
  // (q / s^2) = q conj(s^2) / |s^2|^2
  const ar = (qr * s2r + qi * s2i) / den, ai = (qi * s2r - qr * s2i) / den;
  out[0] += scale * (er * ar - ei * ai);
  out[1] += scale * (er * ai + ei * ar);
}

/**
 * Delayed double exponential A k (e^{-(t - t0) r2} - e^{-(t - t0) r1}):
 * W(s) = A k e^{-s t0} (r1 - r2) / ((s + r1)(s + r2)). Adds it into out.
 */
export function addDoubleExponential(sigma: number, omega: number, t0: number, r1: number, r2: number, ak: number, out: Float64Array): void {
  const m0 = Math.exp(-sigma * t0);
  const er = m0 * Math.cos(omega * t0), ei = -m0 * Math.sin(omega * t0);
  // (s + r1)(s + r2)
  const pr = (sigma + r1) * (sigma + r2) - omega * omega;
  const pi = omega * (sigma + r1 + sigma + r2);
  const pp = pr * pr + pi * pi;
  const c = ak * (r1 - r2);
  const ar = (c * pr) / pp, ai = (-c * pi) / pp;
  out[0] += er * ar - ei * ai;
  out[1] += er * ai + ei * ar;
}
