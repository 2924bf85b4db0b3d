/**
 * `parallel-rlc`: any subset of R, L, C in parallel between the same two nodes, trapezoidal rule.
 * The branch current is i = v/R + i_L + i_C with the inductor and capacitor companions
 *   i_L,n = g_L v_n + i_L,{n-1} + g_L v_{n-1},  g_L = dt/(2L)
 *   i_C,n = g_C v_n - (g_C v_{n-1} + i_C,{n-1}),  g_C = 2C/dt
 * so g = 1/R + g_L + g_C and h_n = i_L,{n-1} + (g_L - g_C) v_{n-1} - i_C,{n-1}.
 * The state before the first step (v = initialVoltage, i_L = initialCurrent, i_C = 0) is taken to
 * hold one step before t = 0.
 */
import { badInput, defineLoad } from '@skein/core';

/**
 * The parallel RLC load plugin. Params: resistance [ohm, optional], inductance [H, optional],
 * capacitance [F, optional] (at least one), initialVoltage [V, default 0], initialCurrent [A, default 0, in L].
 * storedEnergyJ() = L i_L^2 / 2 + C v^2 / 2.
 * @throws InputError (E_PARAM) when none of R, L, C is given.
 * @example create({ resistance: 100, capacitance: 1e-9, initialVoltage: 0, initialCurrent: 0 }, { dtS: 1e-9 }).conductanceS // 2.01
 */
export const parallelRlcLoad = defineLoad({
  type: 'parallel-rlc',
  summary: 'Resistance, inductance and capacitance in parallel (any subset, at least one)',
  params: {
    resistance: { unit: 'ohm', optional: true, min: 0, exclusiveMin: true, summary: 'parallel resistance; leave out for none' },
    inductance: { unit: 'H', optional: true, min: 0, exclusiveMin: true, summary: 'parallel inductance; leave out for none' },
    capacitance: { unit: 'F', optional: true, min: 0, exclusiveMin: true, summary: 'parallel capacitance; leave out for none' },
    initialVoltage: { unit: 'V', default: 0, summary: 'voltage from plus to minus before the run starts (on C)' },
    initialCurrent: { unit: 'A', default: 0, summary: 'inductor current from plus to minus before the run starts' },
  },
  create(p, ctx) {
    if (p.resistance === undefined && p.inductance === undefined && p.capacitance === undefined) {
      throw badInput(['resistance'], 'needs at least one of resistance, inductance, capacitance', undefined, 'E_PARAM');
    }
    const dt = ctx.dtS;
    const l = p.inductance;
    const c = p.capacitance ?? 0;
    const gr = p.resistance === undefined ? 0 : 1 / p.resistance;
    const gl = l === undefined ? 0 : dt / (2 * l);
    const gc = (2 * c) / dt;
    const g = gr + gl + gc;
    // State in a typed array: a double kept in a closure variable is boxed anew on every write (V8).
    const s = new Float64Array([p.initialVoltage, l === undefined ? 0 : p.initialCurrent, 0]); // [v, i_L, i_C] at n-1
    const ll = l ?? 0;
    return {
      kind: 'linear',
      conductanceS: g,
      // Frequency domain: Y = 1/R + j omega C + 1 / (j omega L).
      admittance(w: number, out: Float64Array): void {
        out[0] = gr;
        out[1] = w * c - (l === undefined ? 0 : 1 / (w * l));
      },
      // At s = sigma + j omega: Y = 1/R + s C + 1 / (s L).
      admittanceAt(sigma: number, w: number, out: Float64Array): void {
        out[0] = gr + sigma * c;
        out[1] = w * c;
        if (l !== undefined) {
          const m = (sigma * sigma + w * w) * l;
          out[0] += sigma / m;
          out[1] -= w / m;
        }
      },
      history: (): number => s[1] + (gl - gc) * s[0] - s[2],
      accept(vV: number): void {
        s[1] = s[1] + gl * (s[0] + vV);
        s[2] = gc * (vV - s[0]) - s[2];
        s[0] = vV;
      },
      storedEnergyJ: (): number => 0.5 * ll * s[1] * s[1] + 0.5 * c * s[0] * s[0],
    };
  },
});
