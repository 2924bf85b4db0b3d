// Tapered lines (characteristic impedance varying smoothly along the line), stepped by one FDTD
// segment (packages/core/src/compile/fdtdProfile.ts): the input reflection of an exponential
// taper against the theory of small reflections, and a strong taper against the frequency-domain
// solution of the same taper written as a cascade of uniform sections, with the cascade's
// convergence shown.
import { describe, expect, it } from 'vitest';
import { resolveScenarioText } from '@skein/core';
import { timeResponse } from '@skein/spectral';
import { expectClose } from '../support/compare.ts';
import { runText, standardRegistry } from '../support/run.ts';

const V = 2e8;

/** Source 1 V behind Z1 with a smooth edge, load Z2: both ends matched to the taper's ends. */
function ends(line: string, z1: number, z2: number, rise: string, ledger = true): string {
  return `
junctions:
  A:
    nodes: { a: [${line}] }
    parts: { gen: { source: step, between: [a, ref], amplitude: 1, rise: ${rise}, edge: smooth, resistance: ${z1}ohm } }
  B:
    nodes: { b: [${line}] }
    parts: { R: { load: resistor, between: [b, ref], resistance: ${z2}ohm } }
probes:
  near: { probe: node-voltage, node: A.a }
  far: { probe: node-voltage, node: B.b }
${ledger ? '  ledger: { probe: energy-ledger }' : ''}
`;
}

/** The energy ledger of a lossless run closes: delivered = absorbed + stored. */
function expectLedgerClosed(r: { ledger?: { deliveredJ: number; residualJ: number; lostJ: number } }): void {
  const l = r.ledger!;
  expect(l.deliveredJ).toBeGreaterThan(0);
  expect(l.lostJ).toBe(0);
  expect(Math.abs(l.residualJ) / l.deliveredJ).toBeLessThan(1e-6);
}

describe('an exponential taper', () => {
  it('reflects a step as the theory of small reflections says: a ramp to ln(Z2 / Z1) / 2 over the round trip', async () => {
    // Theory of small reflections, exponential taper (D. M. Pozar, Microwave Engineering, 4th ed.,
    // sec. 5.8, from memory): Gamma(theta) = ln(Z2 / Z1) / 2 e^{-j theta} sin(theta) / theta,
    // theta = beta l. In time this is a rectangle of length 2 l / v, so an incident step V+
    // reflects as V+ ln(Z2 / Z1) / 2 min(1, t / (2 l / v)) (t from the edge's arrival). 50 to 60
    // ohm over 1 m at 2e8 m/s: ramp over 10 ns to 0.5 x 0.0911608 = 0.0455804 V. The source is
    // matched to Z1 and the load to Z2, so the reflected wave is v(near) - 0.5 (the incident
    // half of the 1 V step). The edge (0.2 ns, smooth, symmetric about 0.1 ns) delays the ramp by
    // 0.1 ns. Tolerance 1 % of the plateau: the theory drops terms of third order in
    // ln(Z2/Z1)/2 (the exact DC value is tanh of it, (Z2 - Z1)/(Z2 + Z1) / 2 = 0.0454545, 0.28 %
    // below), and 400 cells resolve the taper to (dz/l)^2 ~ 1e-5. Measured: -2e-5 of the plateau
    // early on the ramp, growing to -0.28 % on the plateau, the third-order term.
    const r = await runText(`
skein: 1
time: { end: 20ns, step: 12.5ps, record: 4 }
lines:
  horn:
    from: A
    to: B
    length: 1m
    taper: { impedance: [50ohm, 60ohm], velocity: 2e8m/s, shape: exponential }
    fdtd: { cells: 400 }
${ends('horn', 50, 60, '0.2ns')}`, 'taper.yaml');
    const x = Math.log(60 / 50) / 2;
    expectClose('ln(1.2) / 2', x, 0.0911608, { rel: 1e-6 });
    const round = (2 * 1) / V;
    const plateau = 0.5 * x;
    for (const ts of [2.6e-9, 5.1e-9, 7.6e-9, 12e-9, 15e-9, 19.5e-9]) {
      const expected = plateau * Math.min(1, (ts - 0.1e-9) / round);
      expectClose(`reflected wave at ${ts * 1e9} ns`, r.at('near.v', ts) - 0.5, expected, { rel: 0, abs: 0.01 * plateau });
    }
    // The far end: the transmitted step settles to the DC divider 60 / 110 (common practice).
    expectClose('far end at 19.5 ns', r.at('far.v', 19.5e-9), 60 / 110, { rel: 2e-3 });
    expectLedgerClosed(r);
  });

  it('reflects, with a linear taper, as ln(Z(v t / 2) / Z1) / 2 of the small-reflection theory', async () => {
    // The same theory (Pozar, sec. 5.8, from memory) in the time domain for any smooth taper: the
    // reflection of a step V+ after time t (from the edge) gathers d(ln Z)/dz / 2 over the first
    // v t / 2 of the line, V+ ln(Z(v t / 2) / Z1) / 2 until the round trip. Linear, 50 to 60 ohm
    // over 1 m: Z(z) = 50 + 10 z / 1 m, so a concave rise (unlike the exponential taper's
    // straight ramp) to the same plateau. Tolerance 1 % of the plateau, as above (third-order
    // terms of the theory).
    const r = await runText(`
skein: 1
time: { end: 20ns, step: 12.5ps, record: 4 }
lines:
  horn:
    from: A
    to: B
    length: 1m
    taper: { impedance: [50ohm, 60ohm], velocity: 2e8m/s, shape: linear }
    fdtd: { cells: 400 }
${ends('horn', 50, 60, '0.2ns')}`, 'linearTaper.yaml');
    const plateau = 0.5 * (Math.log(60 / 50) / 2);
    const samples: number[] = [];
    for (const ts of [2.6e-9, 5.1e-9, 7.6e-9, 12e-9, 19.5e-9]) {
      const z = Math.min(1, ((ts - 0.1e-9) * V) / 2);
      const expected = 0.5 * (Math.log((50 + 10 * z) / 50) / 2);
      samples.push(r.at('near.v', ts) - 0.5);
      expectClose(`reflected wave at ${ts * 1e9} ns`, samples[samples.length - 1], expected, { rel: 0, abs: 0.01 * plateau });
    }
    // Concave, unlike a ramp: the first quarter of the round trip gathers more than a quarter.
    expect(samples[0] / plateau).toBeGreaterThan(0.26);
    expectLedgerClosed(r);
  });

  it('gives the frequency-domain solution of its cascade of uniform sections within 1 % of the reflected wave, as the cascade converges', async () => {
    // A strong taper, 50 to 100 ohm over 1 m. The reference is the frequency-domain solution
    // (exact line solutions at each frequency, packages/spectral, transformed to time) of the same
    // taper as M uniform sections, each with the taper's impedance at its centre; the staircase
    // converges to the taper as M^-2 (its impedance error is second order in the section length
    // for a smooth taper, common practice), shown by the differences between M = 8, 16, 32, 64
    // falling by about 4 each time (measured 2.5e-2, 5.4e-3, 1.1e-3 of the scale below: factors 4.6
    // and 4.9, so between 3.5 and 6 is asked). The FDTD segment (400 cells) must agree with M = 64 within
    // 1 % of the reflected wave's final value (Z2 - Z1) / (Z2 + Z1) / 2 = 1/6 V at every sample,
    // for the near end (where the reflection is seen) and the far end (measured 0.07 % and 0.09 %;
    // M = 64 is itself about 4e-4 from the limit the differences point to).
    const rise = '1ns';
    const r = await runText(`
skein: 1
time: { end: 24ns, step: 12.5ps, record: 8 }
lines:
  horn:
    from: A
    to: B
    length: 1m
    taper: { impedance: [50ohm, 100ohm], velocity: 2e8m/s }
    fdtd: { cells: 400 }
${ends('horn', 50, 100, rise)}`, 'strongTaper.yaml');
    const registry = await standardRegistry();
    const times = Array.from(r.times());
    const cascade = async (m: number): Promise<Float64Array[]> => {
      const lines: string[] = [];
      const joints: string[] = [];
      for (let k = 0; k < m; k++) {
        const z = 50 * Math.pow(2, (k + 0.5) / m);
        lines.push(`  s${k}: { from: ${k === 0 ? 'A' : `J${k}`}, to: ${k === m - 1 ? 'B' : `J${k + 1}`}, length: ${1 / m}m, impedance: ${z}ohm, velocity: 2e8m/s }`);
        if (k > 0) joints.push(`  J${k}: { nodes: { j: [s${k - 1}, s${k}] } }`);
      }
      const text = `
skein: 1
time: { end: 24ns, step: 12.5ps }
lines:
${lines.join('\n')}
${ends('X', 50, 100, rise).replace('[X]', '[s0]').replace('[X]', `[s${m - 1}]`).replace('junctions:\n', `junctions:\n${joints.join('\n')}\n`)}`;
      const ref = await timeResponse(resolveScenarioText(text, { registry, file: `cascade${m}.yaml` }), registry, {
        outputs: [{ kind: 'voltage', node: 'A.a' }, { kind: 'voltage', node: 'B.b' }], timesS: times, maxFrequencyHz: 8e9,
      });
      return ref.series.map((s) => s.values);
    };
    const scale = (100 - 50) / (100 + 50) / 2;
    const worst = (a: ArrayLike<number>, b: ArrayLike<number>): number => {
      let w = 0;
      for (let i = 0; i < b.length; i++) w = Math.max(w, Math.abs(a[i] - b[i]));
      return w / scale;
    };
    const refs: Float64Array[][] = [];
    for (const m of [8, 16, 32, 64]) refs.push(await cascade(m));
    const steps = [0, 1, 2].map((k) => Math.max(worst(refs[k][0], refs[k + 1][0]), worst(refs[k][1], refs[k + 1][1])));
    for (let k = 1; k < steps.length; k++) {
      const factor = steps[k - 1] / steps[k];
      expect(factor, `cascade differences ${steps.map((s) => s.toExponential(2)).join(', ')}`).toBeGreaterThan(3.5);
      expect(factor).toBeLessThan(6);
    }
    const fine = refs[3];
    const errNear = worst(r.series('near.v'), fine[0]);
    const errFar = worst(r.series('far.v'), fine[1]);
    // The reflection is there to be seen: the near end rises from 0.5 towards 2/3.
    expect(r.at('near.v', 23e-9)).toBeGreaterThan(0.5 + 0.9 * scale);
    expectLedgerClosed(r);
    expect(Math.max(errNear, errFar), `FDTD vs cascade of 64: near ${errNear.toExponential(2)}, far ${errFar.toExponential(2)}; cascade differences ${steps.map((s) => s.toExponential(2)).join(', ')}`).toBeLessThan(0.01);
  }, 300_000);
});
