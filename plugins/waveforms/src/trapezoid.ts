/**
 * `trapezoid`: a single pulse, linear rise, flat top of `width`, linear fall, then 0.
 */
import { defineSource } from '@skein/core';
import { AMPLITUDE, DELAY } from './edge.ts';
import { addEdge } from './laplace.ts';

/**
 * The trapezoid waveform plugin. Params: amplitude [V or A, default 1], delay [s, default 0],
 * rise [s, > 0], width [s, >= 0, flat top], fall [s, > 0].
 * @example create({ amplitude: 1, delay: 0, rise: 1e-9, width: 10e-9, fall: 1e-9 }).value(11.5e-9) // 0.5
 */
export const trapezoidSource = defineSource({
  type: 'trapezoid',
  summary: 'A trapezoidal pulse: linear rise, flat top of `width`, linear fall',
  params: {
    amplitude: AMPLITUDE,
    delay: DELAY,
    rise: { unit: 's', min: 0, exclusiveMin: true, summary: 'duration of the rising edge, 0 to amplitude' },
    width: { unit: 's', min: 0, summary: 'duration of the flat top at amplitude' },
    fall: { unit: 's', min: 0, exclusiveMin: true, summary: 'duration of the falling edge, amplitude to 0' },
  },
  create(p) {
    const a = p.amplitude;
    const t0 = p.delay;
    const t1 = t0 + p.rise;
    const t2 = t1 + p.width;
    const t3 = t2 + p.fall;
    const rise = p.rise;
    const fall = p.fall;
    return {
      shortestFeatureS: p.width > 0 ? Math.min(rise, fall, p.width) : Math.min(rise, fall),
      settledAfterS: t3,
      value(tS: number): number {
        if (tS <= t0 || tS >= t3) return 0;
        if (tS < t1) return (a * (tS - t0)) / rise;
        if (tS <= t2) return a;
        return (a * (t3 - tS)) / fall;
      },
      // A rising edge at t0 minus a rising edge of duration fall at t2 (superposition):
      // W(s) = A [e^{-s t0} (1 - e^{-s rise}) / (rise s^2) - e^{-s t2} (1 - e^{-s fall}) / (fall s^2)].
      laplace(sigma: number, omega: number, out: Float64Array): void {
        out[0] = 0;
        out[1] = 0;
        if (sigma === 0 && omega === 0) {
          out[0] = a * (rise / 2 + p.width + fall / 2); // the area, W(0)
          return;
        }
        addEdge(sigma, omega, t0, rise, a, out);
        addEdge(sigma, omega, t2, fall, -a, out);
      },
    };
  },
});
