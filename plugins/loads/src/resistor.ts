/**
 * `resistor`: i = v / R, no history.
 */
import { defineLoad } from '@skein/core';

/**
 * The resistor load plugin. Params: resistance [ohm, > 0].
 * @example create({ resistance: 50 }).conductanceS // 0.02
 */
export const resistorLoad = defineLoad({
  type: 'resistor',
  summary: 'A linear resistor between two nodes',
  params: {
    resistance: { unit: 'ohm', min: 0, exclusiveMin: true, summary: 'resistance' },
  },
  create(p) {
    const g = 1 / p.resistance;
    return {
      kind: 'linear',
      conductanceS: g,
      // Frequency domain: Y = 1 / R.
      admittance(_w: number, out: Float64Array): void { out[0] = g; out[1] = 0; },
      admittanceAt(_sigma: number, _w: number, out: Float64Array): void { out[0] = g; out[1] = 0; },
    };
  },
});
