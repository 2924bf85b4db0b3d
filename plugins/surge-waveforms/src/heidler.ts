/**
 * The Heidler function, the usual analytic form of lightning and ESD currents:
 * h(t) = (t/tau1)^n / (1 + (t/tau1)^n) exp(-t/tau2). Unlike a double exponential its front has
 * zero slope at t = 0 and its front and tail can be set almost independently.
 * Source: F. Heidler, J. M. Cvetic, B. V. Stanic, "Calculation of lightning current parameters",
 * IEEE Trans. Power Delivery 14(2), 1999 (from memory); IEC 62305-1 Annex B uses this form.
 */

/**
 * The unscaled Heidler function at t [s] (0 for t <= 0).
 * @param tS time [s]; tau1S front time constant [s]; tau2S decay time constant [s]; n steepness exponent.
 * @example heidler(19e-6, 19e-6, 485e-6, 10) // 0.5 exp(-19/485) = 0.48079
 */
export function heidler(tS: number, tau1S: number, tau2S: number, n: number): number {
  if (tS <= 0) return 0;
  const x = Math.pow(tS / tau1S, n);
  return (x / (1 + x)) * Math.exp(-tS / tau2S);
}

/**
 * The correction factor of a Heidler function that makes I/k its approximate peak scale:
 * k = exp(-(tau1/tau2) (n tau2/tau1)^(1/n)) (the closed form quoted with IEC 61000-4-2 Annex B, from memory).
 * @example heidlerPeakFactor(1.1e-9, 2e-9, 1.8) // 0.3455
 */
export function heidlerPeakFactor(tau1S: number, tau2S: number, n: number): number {
  return Math.exp(-(tau1S / tau2S) * Math.pow((n * tau2S) / tau1S, 1 / n));
}
