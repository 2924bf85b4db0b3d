/**
 * Impulse parameters by the definitions of the surge standards (IEC 60060-1 for impulse shapes,
 * used by IEC 61000-4-5 and IEC 62305-1):
 *  - voltage: front time T1 = 1.67 (t90 - t30), virtual origin O1 = t30 - 0.5 (t90 - t30);
 *  - current: front time T1 = 1.25 (t90 - t10), virtual origin O1 = t10 - 0.125 (t90 - t10);
 *  - time to half value T2 = t50 (on the tail) - O1.
 * t30, t90, t10 are the first times the rising front reaches that fraction of the peak, t50 the
 * first time after the peak the value falls to half of it (linear interpolation between samples).
 */

/** What measureImpulse finds. Times in s, from t = 0 of the sampled function. */
export interface ImpulseParameters {
  /** Largest value. */
  peak: number;
  /** Time of the peak [s]. */
  peakTimeS: number;
  /** Front time T1 by the standard's definition for the kind [s]. */
  frontTimeS: number;
  /** Virtual origin O1 [s]. */
  virtualOriginS: number;
  /** Time to half value T2 = t50 - O1 [s]. */
  timeToHalfS: number;
  /** t10 - t90 rise (10 % to 90 %) [s], used by IEC 61000-4-2 for ESD. */
  rise10to90S: number;
}

/**
 * Samples f on [0, endS] with n intervals and measures its impulse parameters.
 * @param f the waveform (any unit); endS [s] must reach past the tail's half value.
 * @param kind 'voltage' (front from 30 % and 90 %) or 'current' (from 10 % and 90 %).
 * @param n number of sampling intervals (default 200000); the error of each time is below endS/n.
 * @throws Error when the waveform has no positive peak or does not fall to half within endS.
 * @example measureImpulse((t) => t < 1 ? t : Math.exp(1 - t), 20, 'current').frontTimeS // 1.0
 */
export function measureImpulse(f: (tS: number) => number, endS: number, kind: 'voltage' | 'current', n = 200_000): ImpulseParameters {
  const y = new Float64Array(n + 1);
  const dt = endS / n;
  let ip = 0;
  for (let k = 0; k <= n; k++) {
    y[k] = f(k * dt);
    if (y[k] > y[ip]) ip = k;
  }
  const peak = y[ip];
  if (!(peak > 0)) throw new Error(`measureImpulse: the waveform has no positive peak on [0, ${endS}] s`);
  const rising = (frac: number): number => {
    const lv = frac * peak;
    for (let k = 1; k <= ip; k++) if (y[k] >= lv) return (k - 1 + (lv - y[k - 1]) / (y[k] - y[k - 1])) * dt;
    return ip * dt;
  };
  const falling = (frac: number): number => {
    const lv = frac * peak;
    for (let k = ip + 1; k <= n; k++) if (y[k] <= lv) return (k - 1 + (y[k - 1] - lv) / (y[k - 1] - y[k])) * dt;
    throw new Error(`measureImpulse: the waveform does not fall to ${frac} of its peak within ${endS} s; sample longer`);
  };
  const t10 = rising(0.1);
  const t30 = rising(0.3);
  const t90 = rising(0.9);
  const t50 = falling(0.5);
  const frontTimeS = kind === 'voltage' ? 1.67 * (t90 - t30) : 1.25 * (t90 - t10);
  const virtualOriginS = kind === 'voltage' ? t30 - 0.5 * (t90 - t30) : t10 - 0.125 * (t90 - t10);
  return { peak, peakTimeS: ip * dt, frontTimeS, virtualOriginS, timeToHalfS: t50 - virtualOriginS, rise10to90S: t90 - t10 };
}

/**
 * Charge and specific energy of a current by the trapezoidal rule: Q = int i dt [C], W/R = int i^2 dt [J/ohm].
 * @param f current [A] at t [s]; endS [s]; n intervals (default 400000).
 * @example integrateCurrent(() => 2, 1).chargeC // 2
 */
export function integrateCurrent(f: (tS: number) => number, endS: number, n = 400_000): { chargeC: number; specificEnergyJPerOhm: number } {
  const dt = endS / n;
  let q = 0;
  let w = 0;
  for (let k = 0; k <= n; k++) {
    const i = f(k * dt);
    const c = k === 0 || k === n ? 0.5 : 1;
    q += c * i;
    w += c * i * i;
  }
  return { chargeC: q * dt, specificEnergyJPerOhm: w * dt };
}
