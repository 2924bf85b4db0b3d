import { describe, expect, it } from 'vitest';
import { filamentLoad, type FilamentDevice } from '../index.ts';
import { expectClose, makeLoad, testContext } from './helpers.ts';

describe('filamentLoad', () => {
  const p = { coldResistance: 20, hotResistance: 240, ratedVoltage: 120, heatCapacity: 3e-3, ambientTemperature: 300, hotTemperature: 2700 };

  it('draws Rhot/Rcold times its hot current when switched on cold at constant voltage (inrush)', () => {
    // At constant V, i = V/R: i_cold / i_hot = R_hot / R_cold = 12. The heat balance settles at
    // T_hot by construction of k (module doc); the thermal time constant is ~ C T/(4 P) = 34 ms,
    // so 1 s is ~30 time constants: the remaining approach e^-30 = 1e-13. Tolerance 1e-6.
    const dt = 10e-6;
    const d = makeLoad<FilamentDevice>(filamentLoad, p, testContext(dt));
    const out = new Float64Array(2);
    let first = NaN;
    let last = NaN;
    for (let k = 0; k <= 100_000; k++) {
      const t = k * dt;
      d.evaluate(120, t, out);
      if (k === 0) first = out[0];
      last = out[0];
      d.accept(120, out[0], t);
    }
    expectClose('cold/hot current ratio', first / last, 240 / 20, 1e-6);
    expectClose('hot temperature [K]', d.temperatureK, 2700, 1e-6);
    const r = d.finish() as { peakCurrentA: number; temperatureK: number };
    expectClose('inrush peak = V/Rcold', r.peakCurrentA, 6, 1e-12);
  });

  it('heats at first as an adiabatic mass: dT/dt = V^2/(Rcold C)', () => {
    // Energy conservation over the first 10 us (radiation at 300 K is negligible, ~3e-5 W vs 720 W):
    // dT = P t / C = 2.4 K. R rises by beta dT/T = 0.9 % meanwhile, so P falls by up to 0.9 %: 1 %.
    const dt = 0.1e-6;
    const d = makeLoad<FilamentDevice>(filamentLoad, p, testContext(dt));
    const out = new Float64Array(2);
    for (let k = 0; k <= 100; k++) {
      d.evaluate(120, k * dt, out);
      d.accept(120, out[0], k * dt);
    }
    expectClose('temperature rise [K]', d.temperatureK - 300, (120 * 120 / 20) * 10e-6 / 3e-3, 0.01);
    expect(d.temperatureK - 300).toBeLessThan(2.4); // and less than with constant R (R rises)
  });

  it('rejects a hot resistance below the cold one, naming the parameter', () => {
    expect(() => makeLoad(filamentLoad, { ...p, hotResistance: 10 })).toThrow(/hotResistance/);
  });
});
