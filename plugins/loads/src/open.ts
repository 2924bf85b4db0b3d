/**
 * `open`: no current at any voltage (g = 0, no history). Useful to mark an open line end explicitly.
 */
import { defineLoad } from '@skein/core';

/**
 * The open-circuit load plugin. No parameters.
 * @example create({}).conductanceS // 0
 */
export const openLoad = defineLoad({
  type: 'open',
  summary: 'An open circuit (no current)',
  params: {},
  create() {
    return {
      kind: 'linear',
      conductanceS: 0,
      admittance(_w: number, out: Float64Array): void { out[0] = 0; out[1] = 0; },
      admittanceAt(_sigma: number, _w: number, out: Float64Array): void { out[0] = 0; out[1] = 0; },
    };
  },
});
