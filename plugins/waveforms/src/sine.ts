/**
 * `sine`: A sin(2 pi f (t - delay) + phase) from `delay` on, optionally with a soft start.
 */
import { defineSource } from '@skein/core';
import { AMPLITUDE, DELAY, smoothEdge } from './edge.ts';

/** Steps per period the automatic time step aims for: the feature is 1 / (20 f). */
const FEATURES_PER_PERIOD = 20;

/**
 * The sine waveform plugin. Params: amplitude [V or A, default 1], frequency [Hz, > 0],
 * phase [degrees, default 0], delay [s, default 0], rise [s, default 0: no soft start; else a
 * raised-cosine envelope from 0 to 1 over `rise`].
 * @example create({ amplitude: 1, frequency: 1e6, phase: 90, delay: 0, rise: 0 }).value(0) // 1
 */
export const sineSource = defineSource({
  type: 'sine',
  summary: 'A sine wave starting at `delay`, with an optional soft start',
  params: {
    amplitude: AMPLITUDE,
    frequency: { unit: 'Hz', min: 0, exclusiveMin: true, summary: 'frequency of the sine' },
    phase: { unit: '1', default: 0, summary: 'phase at the start, in degrees (90 starts at the crest)' },
    delay: DELAY,
    rise: { unit: 's', default: 0, min: 0, summary: 'soft start: raised-cosine envelope from 0 to 1 over this time; 0 starts at full amplitude' },
  },
  create(p) {
    const a = p.amplitude;
    const w = 2 * Math.PI * p.frequency;
    const phi = (p.phase * Math.PI) / 180;
    const t0 = p.delay;
    const rise = p.rise;
    const period = 1 / (FEATURES_PER_PERIOD * p.frequency);
    return {
      shortestFeatureS: rise > 0 ? Math.min(rise, period) : period,
      value(tS: number): number {
        const tau = tS - t0;
        if (tau < 0) return 0;
        const s = a * Math.sin(w * tau + phi);
        return rise > 0 && tau < rise ? s * smoothEdge(tau, rise) : s;
      },
    };
  },
});
