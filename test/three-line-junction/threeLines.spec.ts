// Junction of lines: a wave arriving on one line at a junction of lines with parallel impedance
// Zp is transmitted with 2 Zp / (Z1 + Zp) and reflected with (Zp - Z1) / (Zp + Z1) (classic
// junction scattering; REFERENCES.md: three equal lines 2/3 and -1/3; 400 ohm into 50 || 400 ohm
// gives 0.2). Lines are matched at their far ends, so the plateaus are exact; 1e-12 covers rounding.
import { describe, it } from 'vitest';
import { expectClose } from '../support/compare.ts';
import { runText } from '../support/run.ts';

function scenario(z1: number, z2: number, z3: number): string {
  return `
skein: 1
time: { end: 60ns, step: 0.5ns }
lines:
  a: { from: S, to: J, length: 2m, impedance: ${z1}ohm, velocity: 2e8m/s }
  b: { from: J, to: B, length: 2m, impedance: ${z2}ohm, velocity: 2e8m/s }
  c: { from: J, to: C, length: 2m, impedance: ${z3}ohm, velocity: 2e8m/s }
junctions:
  S:
    nodes: { s: [a] }
    parts:
      gen: { source: step, between: [s, ref], amplitude: 2, resistance: ${z1}ohm }
  J:
    nodes: { j: [a, b, c] }
  B:
    nodes: { e: [b] }
    parts: { Rb: { load: resistor, between: [e, ref], resistance: ${z2}ohm } }
  C:
    nodes: { e: [c] }
    parts: { Rc: { load: resistor, between: [e, ref], resistance: ${z3}ohm } }
probes:
  vs: { probe: node-voltage, node: S.s }
  vj: { probe: node-voltage, node: J.j }
  vb: { probe: node-voltage, node: B.e }
`;
}

describe('junction of three lines', () => {
  it('transmits 2/3 and reflects -1/3 when the three lines are equal', async () => {
    // Source amplitude 2 behind a matched resistance launches a 1 V incident wave.
    const r = await runText(scenario(50, 50, 50), 'three-equal.yaml');
    expectClose('junction voltage', r.at('vj.v', 15e-9), 2 / 3, { rel: 1e-12 });
    expectClose('far end of b', r.at('vb.v', 25e-9), 2 / 3, { rel: 1e-12 });
    // The source end sees incident 1 V plus the reflection -1/3 V once it returns after 20 ns.
    expectClose('source end before the reflection', r.at('vs.v', 15e-9), 1, { rel: 1e-12 });
    expectClose('source end after the reflection', r.at('vs.v', 25e-9), 1 - 1 / 3, { rel: 1e-12 });
  });

  it('transmits 0.2 from a 400 ohm line into 50 ohm in parallel with 400 ohm', async () => {
    const r = await runText(scenario(400, 50, 400), 'mismatch.yaml');
    expectClose('junction voltage', r.at('vj.v', 15e-9), 0.2, { rel: 1e-12 });
  });
});
