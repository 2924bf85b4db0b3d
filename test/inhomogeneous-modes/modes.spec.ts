// An inhomogeneous two-conductor line whose modes travel at different speeds. The matrices are
// built from chosen even and odd modes (Ze = 100 ohm at 2.0e8 m/s, Zo = 60 ohm at 1.6e8 m/s):
// l11 = (Le + Lo)/2, l12 = (Le - Lo)/2, c11 = (Ce + Co)/2, c12 = (Ce - Co)/2 with L = Z/v,
// C = 1/(Z v) per mode (even/odd decomposition of a symmetric pair: C. R. Paul, Analysis of
// Multiconductor Transmission Lines, 2nd ed., 2008, from memory). Over 2 m the modes arrive at
// the far end at 10 ns and 12.5 ns; a 0.5 ns step makes both whole steps, so the arrivals are
// exact to the sample.
import { describe, expect, it } from 'vitest';
import { decomposeLine } from '@skein/core';
import { expectClose } from '../support/compare.ts';
import { runText } from '../support/run.ts';

const Le = 100 / 2e8, Ce = 1 / (100 * 2e8), Lo = 60 / 1.6e8, Co = 1 / (60 * 1.6e8);
const l11 = (Le + Lo) / 2, l12 = (Le - Lo) / 2, c11 = (Ce + Co) / 2, c12 = (Ce - Co) / 2;

describe('inhomogeneous line', () => {
  it('has modes at the even and odd velocities and impedances', () => {
    const m = decomposeLine(Float64Array.of(l11, l12, l12, l11), Float64Array.of(c11, c12, c12, c11));
    expectClose('fast mode velocity', m.velocities[0], 2e8, { rel: 1e-12 });
    expectClose('slow mode velocity', m.velocities[1], 1.6e8, { rel: 1e-12 });
  });

  it('delivers the two modal arrivals at length / v_mode', async () => {
    const r = await runText(`
skein: 1
time: { end: 20ns, step: 0.5ns }
lines:
  pair:
    from: N
    to: F
    length: 2m
    conductors: [c1, c2]
    inductance: [[${l11}, ${l12}], [${l12}, ${l11}]]
    capacitance: [[${c11}, ${c12}], [${c12}, ${c11}]]
junctions:
  N:
    nodes: { a: [pair.c1], b: [pair.c2] }
    parts:
      gen: { source: step, between: [a, ref], amplitude: 1, resistance: 50ohm }
      Rb: { load: resistor, between: [b, ref], resistance: 50ohm }
  F:
    nodes: { a: [pair.c1], b: [pair.c2] }
    parts:
      Ra: { load: resistor, between: [a, ref], resistance: 80ohm }
      Rb2: { load: resistor, between: [b, ref], resistance: 80ohm }
probes:
  fa: { probe: node-voltage, node: F.a }
  fb: { probe: node-voltage, node: F.b }
`, 'modes.yaml');
    const fa = r.series('fa.v');
    const fb = r.series('fb.v');
    const step = (t: number): number => Math.round(t / r.dtS);
    // Nothing before the fast mode, a first plateau between the arrivals, a change at the slow one.
    expect(fa[step(10e-9) - 1]).toBe(0);
    expect(Math.abs(fa[step(10e-9)])).toBeGreaterThan(0.05);
    expectClose('plateau between arrivals', fa[step(12e-9)], fa[step(10.5e-9)], { rel: 1e-12 });
    expect(Math.abs(fa[step(12.5e-9)] - fa[step(12e-9)])).toBeGreaterThan(0.05);
    // The victim conductor sees the two modes with opposite sign: the even-mode step arrives first
    // and the odd mode, when it arrives, cancels part of it.
    expect(Math.sign(fb[step(11e-9)])).toBe(1);
    expect(fb[step(13e-9)]).toBeLessThan(fb[step(11e-9)]);
  });
});
