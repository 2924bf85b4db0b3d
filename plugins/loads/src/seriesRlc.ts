/**
 * `series-rlc`: R, L and C in series as one branch with internal state, trapezoidal rule.
 * With the branch current i (the same in R, L, C):
 *   v_L,n = (2L/dt)(i_n - i_{n-1}) - v_L,{n-1}
 *   v_C,n = v_C,{n-1} + (dt/2C)(i_n + i_{n-1})
 *   v_n = R i_n + v_L,n + v_C,n = Z i_n + e_n,  Z = R + 2L/dt + dt/(2C),
 *   e_n = -(2L/dt) i_{n-1} - v_L,{n-1} + v_C,{n-1} + (dt/2C) i_{n-1},
 * so the companion is g = 1/Z, h_n = -e_n / Z. A missing L or C drops its terms (series RC, RL,
 * LC, or R alone). The state before the first step (i = initialCurrent, v_C = initialVoltage,
 * v_L = 0) is taken to hold one step before t = 0.
 */
import { badInput, defineLoad } from '@skein/core';

/**
 * The series RLC load plugin. Params: resistance [ohm, default 0], inductance [H, optional],
 * capacitance [F, optional], initialCurrent [A, default 0], initialVoltage [V, default 0, on the capacitor].
 * storedEnergyJ() = L i^2 / 2 + C v_C^2 / 2.
 * @throws InputError (E_PARAM) when R is 0 and neither L nor C is given (use a short).
 * @example create({ resistance: 10, inductance: 1e-6, initialCurrent: 0, initialVoltage: 0 }, { dtS: 1e-9 }).conductanceS // 1/2010
 */
export const seriesRlcLoad = defineLoad({
  type: 'series-rlc',
  summary: 'Resistance, inductance and capacitance in series (any of L, C may be left out)',
  params: {
    resistance: { unit: 'ohm', default: 0, min: 0, summary: 'series resistance' },
    inductance: { unit: 'H', optional: true, min: 0, exclusiveMin: true, summary: 'series inductance; leave out for none' },
    capacitance: { unit: 'F', optional: true, min: 0, exclusiveMin: true, summary: 'series capacitance; leave out for none (a DC path)' },
    initialCurrent: { unit: 'A', default: 0, summary: 'branch current from plus to minus before the run starts' },
    initialVoltage: { unit: 'V', default: 0, summary: 'capacitor voltage (plus side to minus side) before the run starts' },
  },
  create(p, ctx) {
    const dt = ctx.dtS;
    const r = p.resistance;
    const l = p.inductance ?? 0;
    const c = p.capacitance;
    if (r === 0 && l === 0 && c === undefined) {
      throw badInput(['resistance'], 'must be greater than 0 ohm when neither inductance nor capacitance is given (for an ideal short use load: short)', r, 'E_PARAM');
    }
    const zl = (2 * l) / dt;
    const zc = c === undefined ? 0 : dt / (2 * c);
    const z = r + zl + zc;
    const g = 1 / z;
    // State in a typed array: a double kept in a closure variable is boxed anew on every write (V8).
    const s = new Float64Array([p.initialCurrent, 0, c === undefined ? 0 : p.initialVoltage]); // [i, v_L, v_C] at n-1
    const e = (): number => -zl * s[0] - s[1] + s[2] + zc * s[0];
    const cc = c ?? 0;
    return {
      kind: 'linear',
      conductanceS: g,
      // Frequency domain: Y = 1 / (R + j omega L + 1 / (j omega C)).
      admittance(w: number, out: Float64Array): void {
        const x = w * l - (c === undefined ? 0 : 1 / (w * c));
        const d = r * r + x * x;
        out[0] = r / d;
        out[1] = -x / d;
      },
      // At s = sigma + j omega: Y = 1 / (R + s L + 1 / (s C)).
      admittanceAt(sigma: number, w: number, out: Float64Array): void {
        let zr = r + sigma * l;
        let zi = w * l;
        if (c !== undefined) {
          const m = (sigma * sigma + w * w) * c;
          zr += sigma / m;
          zi -= w / m;
        }
        const d = zr * zr + zi * zi;
        out[0] = zr / d;
        out[1] = -zi / d;
      },
      history: (): number => -e() * g,
      accept(vV: number): void {
        const iNew = g * (vV - e());
        s[1] = zl * (iNew - s[0]) - s[1];
        s[2] = s[2] + zc * (iNew + s[0]);
        s[0] = iNew;
      },
      storedEnergyJ: (): number => 0.5 * l * s[0] * s[0] + 0.5 * cc * s[2] * s[2],
    };
  },
});
