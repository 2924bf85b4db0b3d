/**
 * `ramp`: linear from 0 to `amplitude` over `rise` starting at `delay`, then holds.
 */
import { defineSource } from '@skein/core';
import { AMPLITUDE, DELAY, linearEdge } from './edge.ts';

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
    };
  },
});
