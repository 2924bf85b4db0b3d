/**
 * `timed-switch`: a resistor that steps between offResistance and onResistance at given times:
 * closed for closeAt <= t < openAt, open otherwise. The engine re-factors the junction at the step
 * where conductanceAt(t) changes; the switching instant is thus rounded up to the next step.
 */
import { badInput, defineLoad } from '@skein/core';

/**
 * The timed switch load plugin. Params: closeAt [s, default 0], openAt [s, optional, > closeAt],
 * onResistance [ohm, default 1 mohm], offResistance [ohm, default 1 Gohm].
 * @throws InputError (E_PARAM) when openAt is not after closeAt, or offResistance is not above onResistance.
 * @example create({ closeAt: 1e-6, onResistance: 1e-3, offResistance: 1e9 }).conductanceAt(2e-6) // 1000
 */
export const timedSwitchLoad = defineLoad({
  type: 'timed-switch',
  summary: 'A switch that closes at `closeAt` and opens again at `openAt` (optional)',
  params: {
    closeAt: { unit: 's', default: 0, min: 0, summary: 'time the switch closes (0: closed from the start)' },
    openAt: { unit: 's', optional: true, min: 0, summary: 'time the switch opens again; leave out to stay closed' },
    onResistance: { unit: 'ohm', default: 1e-3, min: 0, exclusiveMin: true, summary: 'resistance when closed' },
    offResistance: { unit: 'ohm', default: 1e9, min: 0, exclusiveMin: true, summary: 'resistance when open' },
  },
  create(p) {
    const tc = p.closeAt;
    const to = p.openAt ?? Infinity;
    if (!(to > tc)) throw badInput(['openAt'], `must be after closeAt (${tc} s)`, p.openAt, 'E_PARAM');
    if (!(p.offResistance > p.onResistance)) {
      throw badInput(['offResistance'], `must be greater than onResistance (${p.onResistance} ohm)`, p.offResistance, 'E_PARAM');
    }
    // [closeAt, openAt, g_on, g_off] in a typed array: doubles read from closure variables were
    // boxed on return in the conformance suite's measurement (39 B per call).
    const s = new Float64Array([tc, to, 1 / p.onResistance, 1 / p.offResistance]);
    const conductanceAt = (tS: number): number => (tS >= s[0] && tS < s[1] ? s[2] : s[3]);
    return {
      kind: 'linear',
      conductanceS: conductanceAt(0),
      conductanceAt,
      // Frequency domain: the state at t = 0 (a spectral run is a small-signal, fixed-state view).
      admittance(_w: number, out: Float64Array): void { out[0] = conductanceAt(0); out[1] = 0; },
      admittanceAt(_sigma: number, _w: number, out: Float64Array): void { out[0] = conductanceAt(0); out[1] = 0; },
    };
  },
});
