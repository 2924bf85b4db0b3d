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
    return { kind: 'linear', conductanceS: 1 / p.resistance };
  },
});
