/**
 * `step`: 0 before `delay`, then `amplitude`; with `rise` > 0 the edge takes `rise` seconds, linear or smooth.
 */
import { defineSource } from '@skein/core';
import { AMPLITUDE, DELAY, linearEdge, smoothEdge } from './edge.ts';
import { addEdge } from './laplace.ts';

/**
 * The step waveform plugin.
 * Params: amplitude [V or A, default 1], delay [s, default 0], rise [s, default 0 = ideal step],
 * edge (linear | smooth, default linear).
 * @example create({ amplitude: 2, delay: 1e-9, rise: 0, edge: 'linear' }).value(1e-9) // 2
 */
export const stepSource = defineSource({
  type: 'step',
  summary: 'A step to `amplitude` at `delay`, ideal or with a finite rise',
  params: {
    amplitude: AMPLITUDE,
    delay: DELAY,
    rise: { unit: 's', default: 0, min: 0, summary: 'duration of the edge (10 % to 90 % is 0.8 rise for linear); 0 gives an ideal step' },
    edge: { kind: 'enum', values: ['linear', 'smooth'], default: 'linear', summary: 'shape of a finite edge: linear ramp or raised cosine' },
  },
  create(p) {
    const a = p.amplitude;
    const t0 = p.delay;
    const rise = p.rise;
    const smooth = p.edge === 'smooth';
    const value = (tS: number): number => {
      const tau = tS - t0;
      if (rise <= 0) return tau >= 0 ? a : 0;
      return a * (smooth ? smoothEdge(tau, rise) : linearEdge(tau, rise));
    };
    const base = { shortestFeatureS: rise > 0 ? rise : undefined, settledAfterS: t0 + rise, value };
    // Ideal and linear edges: W(s) = A e^{-s t0} / s and A e^{-s t0} (1 - e^{-s rise}) / (rise s^2).
    // The raised cosine has a removable 0/0 at omega = pi / rise on the axis; it keeps the engine's
    // sampled transform (no hook).
    if (smooth && rise > 0) return base;
    return {
      ...base,
      laplace(sigma: number, omega: number, out: Float64Array): void {
        out[0] = 0;
        out[1] = 0;
        addEdge(sigma, omega, t0, rise, a, out);
      },
    };
  },
});
