/**
 * `double-exponential`: A k (exp(-t/tau2) - exp(-t/tau1)) after `delay`, k normalising the peak to A.
 */
import { badInput, defineSource } from '@skein/core';
import { AMPLITUDE, DELAY } from './edge.ts';
import { addDoubleExponential } from './laplace.ts';

/** Multiples of tau2 after which the tail is taken as settled: exp(-40) = 4.2e-18. */
const SETTLE_TAUS = 40;

/**
 * Time of the peak of exp(-t/tau2) - exp(-t/tau1) [s]: where the derivative vanishes,
 * t_p = ln(tau2/tau1) tau1 tau2 / (tau2 - tau1) (classic result, set d/dt = 0).
 * @param tau1S front time constant [s]; tau2S tail time constant [s], tau2 > tau1 > 0.
 * @example doubleExponentialPeakTime(1, 2) // 2 ln 2 = 1.386294
 */
export function doubleExponentialPeakTime(tau1S: number, tau2S: number): number {
  return (Math.log(tau2S / tau1S) * tau1S * tau2S) / (tau2S - tau1S);
}

/**
 * The double-exponential surge plugin. Params: amplitude [V or A, default 1, the peak], delay [s, default 0],
 * tau1 [s, > 0, front time constant], tau2 [s, > tau1, tail time constant].
 * @throws InputError (E_PARAM) when tau2 is not longer than tau1.
 * @example create({ amplitude: 1, delay: 0, tau1: 1, tau2: 2 }).value(2 * Math.LN2) // 1 (the peak)
 */
export const doubleExponentialSource = defineSource({
  type: 'double-exponential',
  summary: 'A double-exponential surge, A k (exp(-t/tau2) - exp(-t/tau1)), peak normalised to A',
  params: {
    amplitude: AMPLITUDE,
    delay: DELAY,
    tau1: { unit: 's', min: 0, exclusiveMin: true, summary: 'front time constant (the shorter one)' },
    tau2: { unit: 's', min: 0, exclusiveMin: true, summary: 'tail time constant (the longer one)' },
  },
  create(p) {
    const tau1 = p.tau1;
    const tau2 = p.tau2;
    if (!(tau2 > tau1)) throw badInput(['tau2'], `must be longer than tau1 (${tau1} s): tau1 shapes the front, tau2 the tail`, tau2, 'E_PARAM');
    const tp = doubleExponentialPeakTime(tau1, tau2);
    const k = 1 / (Math.exp(-tp / tau2) - Math.exp(-tp / tau1));
    const ak = p.amplitude * k;
    const t0 = p.delay;
    const r1 = 1 / tau1;
    const r2 = 1 / tau2;
    return {
      shortestFeatureS: tau1,
      settledAfterS: t0 + SETTLE_TAUS * tau2,
      value(tS: number): number {
        const t = tS - t0;
        if (t <= 0) return 0;
        return ak * (Math.exp(-t * r2) - Math.exp(-t * r1));
      },
      // W(s) = A k e^{-s t0} (1/tau1 - 1/tau2) / ((s + 1/tau1)(s + 1/tau2))
      laplace(sigma: number, omega: number, out: Float64Array): void {
        out[0] = 0;
        out[1] = 0;
        addDoubleExponential(sigma, omega, t0, r1, r2, ak, out);
      },
    };
  },
});
