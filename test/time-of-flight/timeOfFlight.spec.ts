// A signal crosses 1 m of air-insulated line in about 3.34 ns (common practice; 1 m / c =
// 3.3356 ns). The scenario gives the line as a wire over ground in air (velocity = c); the test
// finds the first sample where the far end leaves zero. With a 0.01 ns step the arrival is
// located to one step.
import { describe, expect, it } from 'vitest';
import { expectClose } from '../support/compare.ts';
import { runText } from '../support/run.ts';

describe('time of flight', () => {
  it('takes 3.34 ns over 1 m of air-insulated line', async () => {
    const r = await runText(`
skein: 1
time: { end: 6ns, step: 0.01ns, delays: interpolate }
lines:
  air: { from: A, to: B, length: 1m, impedance: 300ohm, velocity: 1c }
junctions:
  A:
    nodes: { a: [air] }
    parts: { gen: { source: step, between: [a, ref], amplitude: 1, resistance: 300ohm } }
  B:
    nodes: { b: [air] }
    parts: { R: { load: resistor, between: [b, ref], resistance: 300ohm } }
probes:
  far: { probe: node-voltage, node: B.b }
`, 'tof.yaml');
    const v = r.series('far.v');
    const first = v.findIndex((x) => Math.abs(x) > 1e-6);
    expect(first).toBeGreaterThan(0);
    const t = first * r.dtS;
    expectClose('arrival time', t, 3.34e-9, { rel: 0, abs: 0.011e-9 });
    expectClose('far-end plateau', r.at('far.v', 5e-9), 0.5, { rel: 1e-12 });
  });
});
