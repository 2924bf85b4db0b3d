/**
 * `capacitor`: trapezoidal companion model. From i = C dv/dt integrated by the trapezoidal rule,
 *   i_n = (2C/dt) v_n - ((2C/dt) v_{n-1} + i_{n-1}),
 * so g = 2C/dt and h_n = -(g v_{n-1} + i_{n-1}). (Trapezoidal companion: H. W. Dommel, "Digital
 * computer solution of electromagnetic transients in single- and multiphase networks", IEEE Trans.
 * PAS-88, 1969, from memory.) The state before the first step, (v, i) = (initialVoltage, 0), is
 * taken to hold one step before t = 0.
 */
import { defineLoad } from '@skein/core';

/**
 * The capacitor load plugin. Params: capacitance [F, > 0], initialVoltage [V, default 0].
 * storedEnergyJ() = C v^2 / 2 at the last accepted voltage.
 * @example create({ capacitance: 1e-9, initialVoltage: 0 }, { dtS: 1e-9 }).conductanceS // 2 (S)
 */
export const capacitorLoad = defineLoad({
  type: 'capacitor',
  summary: 'A linear capacitor (trapezoidal companion model)',
  params: {
    capacitance: { unit: 'F', min: 0, exclusiveMin: true, summary: 'capacitance' },
    initialVoltage: { unit: 'V', default: 0, summary: 'voltage from plus to minus before the run starts' },
  },
  create(p, ctx) {
    const c = p.capacitance;
    const g = (2 * c) / ctx.dtS;
    // State in a typed array: a double kept in a closure variable is boxed anew on every write (V8).
    const s = new Float64Array([p.initialVoltage, 0]); // [v_{n-1}, i_{n-1}]
    return {
      kind: 'linear',
      conductanceS: g,
      // Frequency domain: Y = j omega C.
      admittance(w: number, out: Float64Array): void { out[0] = 0; out[1] = w * p.capacitance; },
      // At s = sigma + j omega: Y = s C.
      admittanceAt(sigma: number, w: number, out: Float64Array): void { out[0] = sigma * p.capacitance; out[1] = w * p.capacitance; },
      history: (): number => -(g * s[0] + s[1]),
      accept(vV: number): void {
        // Own model rather than the solver's current: the two agree, and this keeps the state exact.
        s[1] = g * (vV - s[0]) - s[1];
        s[0] = vV;
      },
      storedEnergyJ: (): number => 0.5 * c * s[0] * s[0],
    };
  },
});
