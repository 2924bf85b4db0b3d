/**
 * `esd-contact`: the IEC 61000-4-2 contact-discharge current into the standard's current target,
 * as the sum of two Heidler functions (the form and constants in IEC 61000-4-2:2008 Annex B, from
 * memory): for 4 kV,
 *   i(t) = I1/k1 h(t; 1.1 ns, 2 ns, 1.8) + I2/k2 h(t; 12 ns, 37 ns, 1.8), I1 = 16.6 A, I2 = 9.3 A,
 *   k = exp(-(tau1/tau2) (n tau2/tau1)^(1/n)).
 * Other charge voltages scale the current linearly (the standard's table is linear in the level).
 * The value is in amperes (use `drive: current`).
 */
import { badInput, defineSource } from '@skein/core';
import { heidler, heidlerPeakFactor } from './heidler.ts';

/** Contact-discharge test levels 1..4: charge voltage [V] (IEC 61000-4-2 Table 1, from memory). */
export const ESD_CONTACT_LEVEL_V: Readonly<Record<'1' | '2' | '3' | '4', number>> = { 1: 2000, 2: 4000, 3: 6000, 4: 8000 };

/** Constants of the 4 kV current: [I1 A, tau1 s, tau2 s, I2 A, tau3 s, tau4 s, n]. */
export const ESD_4KV_HEIDLER = { i1A: 16.6, tau1S: 1.1e-9, tau2S: 2e-9, i2A: 9.3, tau3S: 12e-9, tau4S: 37e-9, n: 1.8 } as const;

/**
 * The ESD contact-discharge source plugin. Params: `level` ('1' to '4': 2, 4 (default), 6, 8 kV) or
 * `voltage` [V, optional, overrides level; positive or negative charge voltage], `delay` [s, 0].
 * @throws InputError (E_PARAM) when voltage is 0.
 * @example create({ level: '2', delay: 0 }).value(30e-9) // 8.03 A
 */
export const esdContactSource = defineSource({
  type: 'esd-contact',
  summary: 'IEC 61000-4-2 contact-discharge current (two Heidler terms) per test level, in amperes',
  params: {
    level: { kind: 'enum', values: ['1', '2', '3', '4'], default: '2', summary: 'test level: 1 = 2 kV, 2 = 4 kV, 3 = 6 kV, 4 = 8 kV contact discharge' },
    voltage: { unit: 'V', optional: true, summary: 'charge voltage instead of a level (the current scales linearly; the sign sets the polarity)' },
    delay: { unit: 's', default: 0, min: 0, summary: 'time before the discharge starts; the value is 0 before it' },
  },
  create(p) {
    const v = p.voltage ?? ESD_CONTACT_LEVEL_V[p.level as keyof typeof ESD_CONTACT_LEVEL_V];
    if (v === 0) throw badInput(['voltage'], 'must not be 0 (give the charge voltage, e.g. 4kV)', v, 'E_PARAM');
    const h = ESD_4KV_HEIDLER;
    const r = v / 4000;
    const s = new Float64Array([
      p.delay,
      (r * h.i1A) / heidlerPeakFactor(h.tau1S, h.tau2S, h.n), h.tau1S, h.tau2S,
      (r * h.i2A) / heidlerPeakFactor(h.tau3S, h.tau4S, h.n), h.tau3S, h.tau4S, h.n,
    ]);
    return {
      shortestFeatureS: 0.8e-9,
      settledAfterS: p.delay + 40 * h.tau4S,
      value(tS: number): number {
        const t = tS - s[0];
        return s[1] * heidler(t, s[2], s[3], s[7]) + s[4] * heidler(t, s[5], s[6], s[7]);
      },
    };
  },
});
