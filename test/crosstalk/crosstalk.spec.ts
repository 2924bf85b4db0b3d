// Near-end crosstalk on a symmetric two-conductor line over ground in a homogeneous medium.
// L and C are the image-method matrices of REFERENCES.md (two wires r = 0.4064 mm, h = 2 cm,
// 2 cm apart; C. R. Paul, Analysis of Multiconductor Transmission Lines, 2nd ed., Wiley 2008,
// per-unit-length parameters chapter, from memory). Every end is terminated in R = 50 ohm and
// conductor 1 is driven by a 1 V step behind R.
// Closed form by even/odd-mode decomposition (Paul, same book, crosstalk chapter, from memory):
// with Ze = sqrt((l11 + l12) / (c11 + c12)) and Zo = sqrt((l11 - l12) / (c11 - c12)), before the
// far-end reflections return (t < 2T) the near ends see
//   V1 = (Vs / 2) (Ze / (Ze + R) + Zo / (Zo + R)),   V2 = (Vs / 2) (Ze / (Ze + R) - Zo / (Zo + R)).
// The engine uses a general modal decomposition, not even/odd modes, so this is an independent
// check; 1e-9 covers rounding in the eigen-decomposition.
import { describe, it } from 'vitest';
import { decomposeLine } from '@skein/core';
import { expectClose } from '../support/compare.ts';
import { runText } from '../support/run.ts';

const l11 = 0.917859e-6, l12 = 0.160944e-6, c11 = 12.506768e-12, c12 = -2.193023e-12;
const R = 50;

describe('near-end crosstalk', () => {
  it('matches the even/odd-mode closed form on the plateau', async () => {
    const r = await runText(`
skein: 1
time: { end: 12ns, step: 0.05ns, delays: interpolate }
lines:
  pair:
    from: N
    to: F
    length: 1m
    conductors: [c1, c2]
    inductance: [[${l11}, ${l12}], [${l12}, ${l11}]]
    capacitance: [[${c11}, ${c12}], [${c12}, ${c11}]]
junctions:
  N:
    nodes: { a: [pair.c1], b: [pair.c2] }
    parts:
      gen: { source: step, between: [a, ref], amplitude: 1, resistance: ${R}ohm }
      Rb: { load: resistor, between: [b, ref], resistance: ${R}ohm }
  F:
    nodes: { a: [pair.c1], b: [pair.c2] }
    parts:
      Ra: { load: resistor, between: [a, ref], resistance: ${R}ohm }
      Rb2: { load: resistor, between: [b, ref], resistance: ${R}ohm }
probes:
  v1: { probe: node-voltage, node: N.a }
  v2: { probe: node-voltage, node: N.b }
  f2: { probe: node-voltage, node: F.b }
`, 'crosstalk.yaml');
    const Ze = Math.sqrt((l11 + l12) / (c11 + c12));
    const Zo = Math.sqrt((l11 - l12) / (c11 - c12));
    const v1 = 0.5 * (Ze / (Ze + R) + Zo / (Zo + R));
    const v2 = 0.5 * (Ze / (Ze + R) - Zo / (Zo + R));
    const T = 1 / 299792458;
    for (const t of [0.2 * T, T, 1.8 * T]) {
      expectClose(`near-end victim at ${(t * 1e9).toFixed(2)} ns`, r.at('v2.v', t), v2, { rel: 1e-9 });
      expectClose(`near-end driven at ${(t * 1e9).toFixed(2)} ns`, r.at('v1.v', t), v1, { rel: 1e-9 });
    }
    // Far end, T < t < 3T: each mode arrives once and meets R; with equal terminations the even
    // and odd modes stay uncoupled, so V2 = Ve (1 + Ge) - Vo (1 + Go), G = (R - Z) / (R + Z),
    // Ve and Vo the launched modal amplitudes (same even/odd method).
    const ve = 0.5 * (Ze / (Ze + R));
    const vo = 0.5 * (Zo / (Zo + R));
    const far2 = ve * (1 + (R - Ze) / (R + Ze)) - vo * (1 + (R - Zo) / (R + Zo));
    for (const t of [1.2 * T, 2 * T, 2.8 * T]) {
      expectClose(`far-end victim at ${(t * 1e9).toFixed(2)} ns`, r.at('f2.v', t), far2, { rel: 1e-9 });
    }
  });

  it('finds both modes at the speed of light for the image-method matrices', () => {
    // Homogeneous medium: L C = mu0 eps0 I, so every mode travels at c (Paul, same chapter).
    const m = decomposeLine(Float64Array.of(l11, l12, l12, l11), Float64Array.of(c11, c12, c12, c11));
    for (const v of m.velocities) expectClose('modal velocity', v, 299792458, { rel: 2e-6 });
  });
});
