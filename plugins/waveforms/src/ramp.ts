/**
 * `ramp`: linear from 0 to `amplitude` over `rise` starting at `delay`, then holds.
 */
import { defineSource } from '@skein/core';
import { AMPLITUDE, DELAY, linearEdge } from './edge.ts';
import { addEdge } from './laplace.ts';

/**
 * The ramp waveform plugin. Params: amplitude [V or A, default 1], delay [s, default 0], rise [s, > 0, required].
 * @example create({ amplitude: 1, delay: 0, rise: 2e-9 }).value(1e-9) // 0.5
 */
export const rampSource = defineSource({
  type: 'ramp',
  summary: 'A linear ramp from 0 to `amplitude` over `rise`, starting at `delay`, then held',
  params: {
    amplitude: AMPLITUDE,
    delay: DELAY,
    rise: { unit: 's', min: 0, exclusiveMin: true, summary: 'duration of the ramp from 0 to amplitude' },
  },
  create(p) {
    const a = p.amplitude;
    const t0 = p.delay;
    const rise = p.rise;
    return {
      shortestFeatureS: rise,
      settledAfterS: t0 + rise,
      value: (tS: number): number => a * linearEdge(tS - t0, rise),
      // W(s) = A e^{-s t0} (1 - e^{-s rise}) / (rise s^2)
      laplace(sigma: number, omega: number, out: Float64Array): void {
        out[0] = 0;
        out[1] = 0;
        addEdge(sigma, omega, t0, rise, a, out);
      },
    };
  },
});
