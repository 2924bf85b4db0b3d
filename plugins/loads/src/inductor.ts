/**
 * `inductor`: trapezoidal companion model. From v = L di/dt integrated by the trapezoidal rule,
 *   i_n = i_{n-1} + (dt/2L) (v_n + v_{n-1}),
 * so g = dt/(2L) and h_n = i_{n-1} + g v_{n-1}. The state before the first step,
 * (v, i) = (0, initialCurrent), is taken to hold one step before t = 0.
 */
import { defineLoad } from '@skein/core';

/**
 * The inductor load plugin. Params: inductance [H, > 0], initialCurrent [A, default 0, plus to minus].
 * storedEnergyJ() = L i^2 / 2 at the last accepted current.
 * @example create({ inductance: 1e-6, initialCurrent: 0 }, { dtS: 1e-9 }).conductanceS // 5e-4 (S)
 */
export const inductorLoad = defineLoad({
  type: 'inductor',
  summary: 'A linear inductor (trapezoidal companion model)',
  params: {
    inductance: { unit: 'H', min: 0, exclusiveMin: true, summary: 'inductance' },
    initialCurrent: { unit: 'A', default: 0, summary: 'current from plus to minus before the run starts' },
  },
  create(p, ctx) {
    const l = p.inductance;
    const g = ctx.dtS / (2 * l);
    // State in a typed array: a double kept in a closure variable is boxed anew on every write (V8).
    const s = new Float64Array([0, p.initialCurrent]); // [v_{n-1}, i_{n-1}]
    return {
      kind: 'linear',
      conductanceS: g,
      // Frequency domain: Y = 1 / (j omega L) (infinite at DC: a spectral run starts above 0 Hz).
      admittance(w: number, out: Float64Array): void { out[0] = 0; out[1] = -1 / (w * p.inductance); },
      // At s = sigma + j omega: Y = 1 / (s L) = (sigma - j omega) / ((sigma^2 + omega^2) L).
      admittanceAt(sigma: number, w: number, out: Float64Array): void {
        const d = (sigma * sigma + w * w) * p.inductance;
        out[0] = sigma / d;
        out[1] = -w / d;
      },
      history: (): number => s[1] + g * s[0],
      accept(vV: number): void {
        s[1] = s[1] + g * (s[0] + vV);
        s[0] = vV;
      },
      storedEnergyJ: (): number => 0.5 * l * s[1] * s[1],
    };
  },
});
