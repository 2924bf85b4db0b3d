// Bewley lattice: a 1 V step behind 25 ohm into a 50 ohm line of 1 us one-way delay, loaded by
// 100 ohm. Reference: L. V. Bewley, "Traveling waves on transmission systems", Trans. AIEE 50,
// 1931 (from memory); values in ../shared/REFERENCES.md. Tolerance 1e-9: the lattice is exact
// at whole-step delays, so only rounding in the junction algebra remains (about 1e-15).
import { describe, it } from 'vitest';
import { expectClose } from '../support/compare.ts';
import { runText } from '../support/run.ts';

export const BEWLEY = `
skein: 1
title: Bewley lattice
time: { end: 8us, step: 0.05us }
lines:
  tl: { from: S, to: L, length: 200m, impedance: 50ohm, velocity: 2e8m/s }
junctions:
  S:
    nodes: { s: [tl] }
    parts:
      gen: { source: step, between: [s, ref], amplitude: 1, resistance: 25ohm }
  L:
    nodes: { l: [tl] }
    parts:
      RL: { load: resistor, between: [l, ref], resistance: 100ohm }
probes:
  vs: { probe: node-voltage, node: S.s }
  vl: { probe: node-voltage, node: L.l }
  led: { probe: energy-ledger }
`;

describe('Bewley lattice', () => {
  it('gives the load and source voltages of every interval', async () => {
    const r = await runText(BEWLEY, 'bewley.yaml');
    const tol = { rel: 1e-9, abs: 1e-12 };
    const load: Array<[number, number, number]> = [[1, 3, 0.88888889], [3, 5, 0.79012346], [5, 7, 0.80109739]];
    for (const [a, b, v] of load) {
      for (const t of [a + 0.05, (a + b) / 2, b - 0.05]) expectClose(`vl.v at ${t} us`, r.at('vl.v', t * 1e-6), v, { rel: 1e-8 });
    }
    const src: Array<[number, number, number]> = [[0, 2, 0.66666667], [2, 4, 0.81481481]];
    for (const [a, b, v] of src) {
      for (const t of [a + 0.05, (a + b) / 2, b - 0.05]) expectClose(`vs.v at ${t} us`, r.at('vs.v', t * 1e-6), v, { rel: 1e-8 });
    }
    expectClose('vl.v before arrival', r.at('vl.v', 0.95e-6), 0, tol);
    // Final value: 100 / (25 + 100) = 0.8, approached geometrically (ratio -1/9 per round trip).
    expectClose('vl.v at 7.9 us', r.at('vl.v', 7.9e-6), 0.8, { rel: 2e-4 });
  });
});
