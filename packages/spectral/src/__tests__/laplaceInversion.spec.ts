// The numerical Laplace transform (timeResponse method 'laplace') against closed-form inverse
// Laplace transforms, and against the plain periodic Fourier series (method 'fourier' with one
// pass, tolerance 0) on the same grid: same period Tp, same frequencies k / Tp, same window.
import { describe, expect, it } from 'vitest';
import erfc from '@stdlib/math-base-special-erfc';
import { resolveScenarioText } from '@skein/core';
import { timeResponse } from '../index.ts';
import { CAPACITIVE_TERMINATION, spectralRegistry } from './fixtures.ts';

const reg = spectralRegistry();

/** Worst |got - want| over all samples, and where. */
function worst(got: ArrayLike<number>, want: readonly number[], times: readonly number[]): { err: number; atS: number } {
  let err = 0;
  let atS = NaN;
  for (let i = 0; i < want.length; i++) {
    const e = Math.abs(got[i] - want[i]);
    if (e > err || Number.isNaN(e)) { err = e; atS = times[i]; }
  }
  return { err, atS };
}

/**
 * Kelvin's RC cable (W. Thomson, Proc. Roy. Soc. 7, 1855; Carslaw & Jaeger, Conduction of Heat in
 * Solids, ch. II; REFERENCES.md): R = 10 ohm/km, C = 50 nF/km, observed at x = 10 km; the
 * semi-infinite cable is 100 km long (its far end adds about erfc(19) by 200 us). The format needs
 * L > 0: L = 1e-16 H/m changes v by about L / (R t) = 5e-9 of the value at t = 2 us (measured: the
 * floor of 1.7e-9 of the peak below scales with L).
 */
function kelvin(source: string): ReturnType<typeof resolveScenarioText> {
  return resolveScenarioText(`
skein: 1
time: { end: 200us }
lines:
  a: { from: S, to: X, length: 10km, inductance: 1e-16H/m, capacitance: 50nF/km, resistance: 10ohm/km }
  b: { from: X, to: E, length: 90km, inductance: 1e-16H/m, capacitance: 50nF/km, resistance: 10ohm/km }
junctions:
  S:
    nodes: { s: [a] }
    parts:
      gen: { ${source}, between: [s, ref], amplitude: 1 }
  X: { nodes: { x: [a, b] } }
  E: { nodes: { e: [b] } }
`, { registry: reg, file: 'kelvin.yaml' });
}

/** x sqrt(RC / 4) [s^1/2] of Kelvin's cable at 10 km. */
const A = 1e4 * Math.sqrt((10e-3 * 50e-12) / 4);

describe('timeResponse (numerical Laplace transform)', () => {
  it("keeps the slow tail of Kelvin's cable from wrapping around, where the plain periodic series errs by 5e-3 of the peak", async () => {
    // A 10 us rectangular pulse (W(s) = (1 - e^{-s w}) / s, exact at complex s) into Kelvin's
    // cable: v = erfc(A / sqrt t) - erfc(A / sqrt(t - w)) for t > w (superposition of two steps,
    // Carslaw & Jaeger ch. II). Its tail decays like t^-3/2, so over a period of 8 windows the
    // plain series adds the tails of earlier periods.
    const w = 10e-6;
    const s = kelvin(`source: rect, width: ${w}s`);
    const times = Array.from({ length: 101 }, (_, i) => i * 2e-6);
    const want = times.map((t) => (t > 0 ? erfc(A / Math.sqrt(t)) : 0) - (t > w ? erfc(A / Math.sqrt(t - w)) : 0));
    // The closed form itself against the published value erfc(1) = 0.15729921 (REFERENCES.md).
    expect(Math.abs(erfc(A / Math.sqrt(12.5e-6)) - 0.15729921)).toBeLessThan(5e-9);
    const peak = Math.max(...want);
    const outputs = [{ kind: 'voltage' as const, node: 'X.x' }];
    // fmax = 4 MHz: the cable's transfer e^{-x sqrt(s R C)} is e^-25 there, so truncation is negligible.
    const grid = { outputs, timesS: times, maxFrequencyHz: 4e6 };
    const nlt = await timeResponse(s, reg, { ...grid, method: 'laplace' });
    const plain = await timeResponse(s, reg, { ...grid, method: 'fourier', tolerance: 0 });
    // Same grid: one pass each over the same period and frequencies.
    expect(nlt.method.periodS).toBe(plain.method.periodS);
    expect(nlt.method.points).toBe(plain.method.points);
    expect(nlt.method.kind).toBe('laplace');
    // sigma = ln(1 / aliasing) / Tp with the default aliasing 1e-10.
    expect(Math.abs(nlt.method.sigmaPerS * nlt.method.periodS - Math.log(1e10))).toBeLessThan(1e-12);
    const eN = worst(nlt.series[0].values, want, times);
    const eP = worst(plain.series[0].values, want, times);
    // Measured: plain 4.86e-3 of the peak (the "about 1e-3"), the wrap-around of the tail,
    // largest at t = 0 where the true value is 0; asserted between 1e-3 and 1e-2.
    expect(eP.err / peak, `plain series at ${eP.atS} s`).toBeGreaterThan(1e-3);
    expect(eP.err / peak).toBeLessThan(1e-2);
    // Measured: NLT 1.69e-9 of the peak, at 4 us, where the L term above is 2.5e-9 of the value;
    // 1e-8 covers it with the aliasing bound (1e-10) and rounding over 6400 solves.
    expect(eN.err / peak, `NLT at ${eN.atS} s`).toBeLessThan(1e-8);
  });

  it("gives Kelvin's step response with the aliasing error the damping rule sets", async () => {
    // Step into Kelvin's cable: v = erfc(A / sqrt t). Its final value is 1, so the aliasing of the
    // damped series, sum_m v(t + m Tp) e^{-sigma m Tp}, is close to e^{-sigma Tp} = aliasing:
    // asked for 1e-6 the error must lie between 0.5e-6 and 1.1e-6 (v(t + Tp) is 0.91 to 0.98 here;
    // measured 9.10e-7, 9.12e-7, 9.18e-7).
    const s = kelvin('source: step');
    const times = [12.5e-6, 50e-6, 200e-6];
    const published = [0.15729921, 0.47950012, 0.72367361]; // REFERENCES.md, 8 digits
    const want = times.map((t) => erfc(A / Math.sqrt(t)));
    const outputs = [{ kind: 'voltage' as const, node: 'X.x' }];
    const coarse = await timeResponse(s, reg, { outputs, timesS: times, maxFrequencyHz: 4e6, method: 'laplace', aliasing: 1e-6 });
    coarse.series[0].values.forEach((v, i) => {
      const e = want[i] - v;
      // The aliased copies add to v (all positive), so the computed value lies above the true one.
      expect(-e, `at ${times[i]} s`).toBeGreaterThan(0.5e-6);
      expect(-e, `at ${times[i]} s`).toBeLessThan(1.1e-6);
    });
    const fine = await timeResponse(s, reg, { outputs, timesS: times, maxFrequencyHz: 4e6, method: 'laplace' });
    // Default aliasing 1e-10: measured 1.1e-10 against erfc (at 200 us, the aliasing itself); 1e-9.
    // Against the published 8 digits (measured 2.9e-9): their rounding, 5e-9.
    expect(worst(fine.series[0].values, want, times).err).toBeLessThan(1e-9);
    expect(worst(fine.series[0].values, published, times).err).toBeLessThan(5e-9);
    expect(Math.abs(fine.method.aliasingBound / 1e-10 - 1)).toBeLessThan(1e-9);
  });

  it('gives the charging of a capacitive load after a matched source at every sample away from the kink', async () => {
    // REFERENCES.md: Rs = Z0 = 50 ohm, C = 100 pF, vL = 1 - exp(-(t - T)/(Z0 C)) for t > T = 10 ns,
    // 0 before (classic RC charge; the matched source absorbs the reflection). Every 0.5 ns to 40 ns.
    const s = resolveScenarioText(CAPACITIVE_TERMINATION, { registry: reg, file: 'cap.yaml' });
    const T = 10e-9;
    const times = Array.from({ length: 81 }, (_, i) => i * 0.5e-9).filter((t) => Math.abs(t - T) >= 1e-9);
    const exact = times.map((t) => (t > T ? 1 - Math.exp(-(t - T) / 5e-9) : 0));
    const r = await timeResponse(s, reg, { outputs: [{ kind: 'voltage', node: 'L.l' }], timesS: times, maxFrequencyHz: 20e9, method: 'laplace' });
    // Measured 2.1e-9 (the plain single pass: 2.6e-9): what is left is the window's smoothing of the
    // kink at t = T over about 1 / fmax = 0.05 ns, amplified by at most e^{sigma t} <= 17.8 at the
    // end; the samples within 1 ns of the kink are left out (there the window errs by 7e-4 in both
    // methods). 1e-7 as for the Fourier method's test of the same case.
    expect(worst(r.series[0].values, exact, times).err).toBeLessThan(1e-7);
  });

  it('transforms a sampled source (no laplace hook) at complex s: the Bewley plateaus', async () => {
    // The raised-cosine edge has no laplace hook: its transform at s = sigma + j omega is the
    // trapezoid rule on (w - w_inf) e^{-sigma t} with Gregory's end correction plus w_inf / s.
    // Bewley lattice (L. V. Bewley, Trans. AIEE 50, 1931, from memory; REFERENCES.md): 25 ohm
    // source, 50 ohm line of 1 us, 100 ohm load; plateaus 0.88888889 (1-3 us), 0.79012346
    // (3-5 us), 0.80109739 (5-7 us) after the 100 ns edge has settled.
    const s = resolveScenarioText(`
skein: 1
time: { end: 8us, step: 5ns }
lines:
  tl: { from: S, to: L, length: 200m, impedance: 50ohm, velocity: 2e8m/s }
junctions:
  S:
    nodes: { s: [tl] }
    parts:
      gen: { source: edge, between: [s, ref], amplitude: 1, rise: 100ns, resistance: 25ohm }
  L:
    nodes: { l: [tl] }
    parts:
      RL: { load: resistor, between: [l, ref], resistance: 100ohm }
`, { registry: reg, file: 'bewley.yaml' });
    const times = [2e-6, 4e-6, 6e-6, 8e-6];
    const r = await timeResponse(s, reg, { outputs: [{ kind: 'voltage', node: 'L.l' }], timesS: times, method: 'laplace' });
    const want = [0.88888889, 0.79012346, 0.80109739];
    // Measured 1.1e-9, 3.1e-9, 3.8e-9 (the Fourier method: 3.6e-9): the published 8 digits; 1e-8 as there.
    for (let i = 0; i < 3; i++) expect(Math.abs(r.series[0].values[i] - want[i]), `at ${times[i]} s`).toBeLessThan(1e-8);
  });

  it('refuses a load without admittanceAt, naming plugin and hook', async () => {
    const s = resolveScenarioText(`
skein: 1
time: { end: 40ns }
lines:
  tl: { from: S, to: L, length: 2m, impedance: 50ohm, velocity: 2e8m/s }
junctions:
  S:
    nodes: { s: [tl] }
    parts:
      gen: { source: step, between: [s, ref], amplitude: 1, resistance: 50ohm }
  L:
    nodes: { l: [tl] }
    parts:
      RL: { load: axis-resistor, between: [l, ref], resistance: 50ohm }
`, { registry: reg, file: 'axis.yaml' });
    const opts = { outputs: [{ kind: 'voltage' as const, node: 'L.l' }], timesS: [20e-9], maxFrequencyHz: 1e9 };
    // The j omega axis method still works with the plain hook: the matched divider gives 0.5 (the
    // ideal step's jump, windowed at 1 GHz, rings 4e-5 there: 1e-3).
    const f = await timeResponse(s, reg, opts);
    expect(Math.abs(f.series[0].values[0] - 0.5)).toBeLessThan(1e-3);
    const e = await timeResponse(s, reg, { ...opts, method: 'laplace' }).catch((x: unknown) => x);
    expect(e).toMatchObject({ code: 'E_SPECTRAL_HOOK_MISSING', details: { plugin: 'axis-resistor', hook: 'admittanceAt', part: 'RL' } });
  });

  it('rejects a bad aliasing, method or window, naming the option', async () => {
    const s = kelvin('source: step');
    const base = { outputs: [{ kind: 'voltage' as const, node: 'X.x' }], timesS: [1e-5], maxFrequencyHz: 1e5 };
    for (const [opt, path] of [[{ method: 'laplace', aliasing: 0 }, 'aliasing'], [{ method: 'laplace', aliasing: 0.5 }, 'aliasing'], [{ method: 'z' }, 'method'], [{ window: 'box' }, 'window']] as const) {
      const e = await timeResponse(s, reg, { ...base, ...(opt as object) }).catch((x: unknown) => x);
      expect(e).toMatchObject({ code: 'E_SPECTRAL_TIME', path: [path] });
    }
  });
});

describe('timeResponse (numerical Laplace transform) with cross-sections', () => {
  it('refuses a section whose dielectric has no continuation, naming line and model', async () => {
    // A constant loss tangent is not causal (its eps'' is not the boundary value of a function
    // analytic in Re s > 0), so @skein/lines gives no Y(s); the Fourier method still runs.
    const s = resolveScenarioText(`
skein: 1
time: { end: 200ns }
lines:
  c1: { from: S, to: L, length: 10m, section: { kind: coax, innerRadius: 0.405mm, shieldInnerRadius: 1.475mm, dielectric: { relPermittivity: 2.25, lossTangent: 0.002 } } }
junctions:
  S:
    nodes: { s: [c1] }
    parts:
      gen: { source: edge, between: [s, ref], amplitude: 1, rise: 5ns, resistance: 50ohm }
  L:
    nodes: { l: [c1] }
    parts:
      RL: { load: resistor, between: [l, ref], resistance: 50ohm }
`, { registry: reg, file: 'coax.yaml' });
    const opts = { outputs: [{ kind: 'voltage' as const, node: 'L.l' }], timesS: [100e-9] };
    const e = await timeResponse(s, reg, { ...opts, method: 'laplace' }).catch((x: unknown) => x);
    expect(e).toMatchObject({ code: 'E_SPECTRAL_COMPLEX_FREQUENCY', details: { element: 'line c1' } });
    expect(String((e as Error).message)).toMatch(/dielectric.*djordjevic-sarkar/);
    // Matched 50 ohm coax of 51.7 ohm (REFERENCES.md, Z0 = 51.665 ohm): about half the EMF after the
    // edge has passed, within the mismatch and the losses of 10 m (5 %); one pass is enough here.
    const f = await timeResponse(s, reg, { ...opts, tolerance: 0 });
    expect(Math.abs(f.series[0].values[0] - 0.5)).toBeLessThan(0.05);
  });
});
