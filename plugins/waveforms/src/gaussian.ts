/**
 * `gaussian`: A exp(-(t - centre)^2 / (2 sigma^2)).
 */
import { badInput, defineSource } from '@skein/core';
import { AMPLITUDE } from './edge.ts';

/** Multiples of sigma after the centre at which the pulse is taken as settled: exp(-8^2/2) = 1.3e-14. */
const SETTLE_SIGMAS = 8;
/** Default centre in multiples of sigma: the value at t = 0 is then exp(-12.5) = 3.7e-6 of the peak. */
const DEFAULT_CENTRE_SIGMAS = 5;

/**
 * The Gaussian pulse plugin. Params: amplitude [V or A, default 1], centre [s, default 5 width],
 * width [s, > 0, the standard deviation sigma].
 * @throws InputError (E_PARAM) when the centre is negative.
 * @example create({ amplitude: 1, centre: 5e-9, width: 1e-9 }).value(6e-9) // exp(-0.5) = 0.60653
 */
export const gaussianSource = defineSource({
  type: 'gaussian',
  summary: 'A Gaussian pulse of standard deviation `width` centred at `centre`',
  params: {
    amplitude: AMPLITUDE,
    centre: { unit: 's', optional: true, min: 0, summary: 'time of the peak; when left out, 5 width (the value at t = 0 is 3.7e-6 of the peak)' },
    width: { unit: 's', min: 0, exclusiveMin: true, summary: 'standard deviation sigma of the pulse (FWHM = 2.3548 sigma)' },
  },
  create(p) {
    const a = p.amplitude;
    const sigma = p.width;
    const tc = p.centre ?? DEFAULT_CENTRE_SIGMAS * sigma;
    if (tc < 0) throw badInput(['centre'], 'must be at least 0 s', tc, 'E_PARAM');
    const k = 1 / (2 * sigma * sigma);
    return {
      shortestFeatureS: sigma,
      settledAfterS: tc + SETTLE_SIGMAS * sigma,
      value(tS: number): number {
        const d = tS - tc;
        return a * Math.exp(-d * d * k);
      },
    };
  },
});
