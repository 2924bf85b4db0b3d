/**
 * `combination-wave`: the IEC 61000-4-5 combination wave (1.2/50 us open-circuit voltage,
 * 8/20 us short-circuit current, effective output impedance 2 ohm = peak Voc / peak Isc).
 *
 * Forms (IEC 61000-4-5:2014 Annex A gives these analytic forms; constants from memory):
 *  - open-circuit voltage: V(t) = A (1 - exp(-t/tau1)) exp(-t/tau2), tau1 = 0.4074 us, tau2 = 68.22 us;
 *  - short-circuit current: I(t) = A t^3 exp(-t/tau), tau = 3.911 us.
 * A normalises the peak to `peak` exactly (computed in closed form here, not taken from the table).
 * A double exponential cannot make 8/20: its half-value time is always too long for its front, so
 * the current uses the t^3 form, which can.
 *
 * One source gives one of the two shapes. A generator whose open-circuit and short-circuit shapes
 * differ has a frequency-dependent internal impedance; the voltage behind a plain 2 ohm resistor
 * gives a 1.2/50 short-circuit current (Voc/2), not 8/20. See the README.
 */
import { defineSource } from '@skein/core';

/** Open-circuit voltage time constants [s] (IEC 61000-4-5 Annex A, from memory). */
export const COMBINATION_VOLTAGE_TAU1_S = 0.4074e-6;
export const COMBINATION_VOLTAGE_TAU2_S = 68.22e-6;
/** Short-circuit current time constant of t^3 exp(-t/tau) [s] (IEC 61000-4-5 Annex A, from memory). */
export const COMBINATION_CURRENT_TAU_S = 3.911e-6;

/**
 * Source resistances of the usual set-ups [ohm]: the generator's effective output impedance of
 * 2 ohm, plus the coupling network's series resistance (10 ohm for line-to-earth on power ports,
 * 40 ohm for interconnection lines; IEC 61000-4-5, coupling clauses, from memory).
 */
export const COMBINATION_WAVE_SOURCE_RESISTANCE_OHM = {
  generator: 2,
  'power-line-to-earth': 12,
  'interconnection-line': 42,
} as const;

/** Multiples of the tail constant after which the wave is taken as settled (exp(-40) = 4e-18). */
const SETTLE = 40;

/**
 * The combination-wave source plugin. Params: `waveform` ('open-circuit-voltage' (default) or
 * 'short-circuit-current'), `peak` (drive unit, default 1: the open-circuit peak voltage in V, or
 * the short-circuit peak current in A), `delay` [s, default 0].
 * Use the voltage with `drive: voltage, resistance: 2ohm` (or 12 / 42 ohm with a coupling network),
 * the current with `drive: current`.
 * @example create({ waveform: 'short-circuit-current', peak: 500, delay: 0 }).value(3 * 3.911e-6) // 500
 */
export const combinationWaveSource = defineSource({
  type: 'combination-wave',
  summary: 'IEC 61000-4-5 combination wave: 1.2/50 us open-circuit voltage or 8/20 us short-circuit current',
  params: {
    waveform: { kind: 'enum', values: ['open-circuit-voltage', 'short-circuit-current'], default: 'open-circuit-voltage', summary: 'which of the two defined shapes this source gives' },
    peak: { unit: '1', default: 1, summary: 'peak in the drive unit: open-circuit peak voltage [V] or short-circuit peak current [A] (a plain number)' },
    delay: { unit: 's', default: 0, min: 0, summary: 'time before the wave starts; the value is 0 before it' },
  },
  create(p) {
    // [delay, scale, 1/tau1, 1/tau2] in a typed array (doubles in closures box when returned).
    const s = new Float64Array(4);
    s[0] = p.delay;
    if (p.waveform === 'short-circuit-current') {
      const tau = COMBINATION_CURRENT_TAU_S;
      // t^3 exp(-t/tau) peaks at 3 tau with 27 tau^3 e^-3.
      s[1] = p.peak / (27 * tau * tau * tau * Math.exp(-3));
      s[2] = 1 / tau;
      return {
        // W(s) = A 6 / (s + 1/tau)^4 e^{-s delay}.
        laplace(sigma: number, omega: number, out: Float64Array): void {
          const re = sigma + s[2];
          // (re + j omega)^-4 by squaring twice, then the delay factor.
          const r2 = re * re - omega * omega;
          const i2 = 2 * re * omega;
          const r4 = r2 * r2 - i2 * i2;
          const i4 = 2 * r2 * i2;
          const m = r4 * r4 + i4 * i4;
          const k = 6 * s[1];
          const dr = Math.exp(-sigma * s[0]);
          const c = dr * Math.cos(omega * s[0]);
          const d = -dr * Math.sin(omega * s[0]);
          const wr = (k * r4) / m;
          const wi = (-k * i4) / m;
          out[0] = wr * c - wi * d;
          out[1] = wr * d + wi * c;
        },
        shortestFeatureS: 8e-6,
        settledAfterS: p.delay + SETTLE * 4 * tau,
        value(tS: number): number {
          const t = tS - s[0];
          if (t <= 0) return 0;
          return s[1] * t * t * t * Math.exp(-t * s[2]);
        },
      };
    }
    const a = COMBINATION_VOLTAGE_TAU1_S;
    const b = COMBINATION_VOLTAGE_TAU2_S;
    // (1 - e^{-t/a}) e^{-t/b} peaks where e^{-t/a} = a/(a+b).
    const tp = a * Math.log((a + b) / a);
    s[1] = p.peak / ((1 - a / (a + b)) * Math.exp(-tp / b));
    s[2] = 1 / a;
    s[3] = 1 / b;
    return {
      // (1 - e^{-t/a}) e^{-t/b} = e^{-t/b} - e^{-t(1/a + 1/b)}: W(s) = A (1/(s + 1/b) - 1/(s + 1/a + 1/b)) e^{-s delay}.
      laplace(sigma: number, omega: number, out: Float64Array): void {
        const p = sigma + s[3];
        const q = sigma + s[2] + s[3];
        const mp = p * p + omega * omega;
        const mq = q * q + omega * omega;
        const wr = s[1] * (p / mp - q / mq);
        const wi = s[1] * (-omega / mp + omega / mq);
        const dr = Math.exp(-sigma * s[0]);
        const c = dr * Math.cos(omega * s[0]);
        const d = -dr * Math.sin(omega * s[0]);
        out[0] = wr * c - wi * d;
        out[1] = wr * d + wi * c;
      },
      shortestFeatureS: 1.2e-6,
      settledAfterS: p.delay + SETTLE * b,
      value(tS: number): number {
        const t = tS - s[0];
        if (t <= 0) return 0;
        return s[1] * (1 - Math.exp(-t * s[2])) * Math.exp(-t * s[3]);
      },
    };
  },
});
