// Diode clamp at the end of a line: the arriving wave meets the diode where the line's Thevenin
// equivalent (twice the incident wave behind Z0) crosses the diode's curve: 2 V_inc - v = Z0 i(v).
// This is the method of characteristics' graphical (Bergeron) construction (L. Bergeron, Water
// Hammer in Hydraulics and Wave Surges in Electricity, 1961, from memory), solved here by
// bisection on the Shockley equation i = Is (exp(v / (n Vt)) - 1), Vt = kT/q (W. Shockley, Bell
// Syst. Tech. J. 28, 1949). The reflected wave v - V_inc returns to the matched source after the
// round trip. Tolerance 1e-8 V: Newton stops at 1e-9 (1 + |v|) V.
import { describe, it } from 'vitest';
import { expectClose } from '../support/compare.ts';
import { runText } from '../support/run.ts';

const K_B = 1.380649e-23;
const Q = 1.602176634e-19;

describe('diode clamp', () => {
  it('clamps at the Bergeron construction and reflects the difference', async () => {
    const r = await runText(`
skein: 1
time: { end: 60ns, step: 0.25ns }
lines:
  tl: { from: S, to: L, length: 3m, impedance: 50ohm, velocity: 2e8m/s }
junctions:
  S:
    nodes: { s: [tl] }
    parts: { gen: { source: step, between: [s, ref], amplitude: 10, resistance: 50ohm } }
  L:
    nodes: { l: [tl] }
    parts: { D: { load: diode, between: [l, ref], saturationCurrent: 1e-14, emissionCoefficient: 1, temperature: 300K } }
probes:
  vl: { probe: node-voltage, node: L.l }
  vs: { probe: node-voltage, node: S.s }
  ledger: { probe: energy-ledger }
`, 'clamp.yaml');
    const vt = (K_B * 300) / Q;
    const vinc = 5;
    let lo = 0;
    let hi = 2 * vinc;
    for (let k = 0; k < 200; k++) {
      const m = 0.5 * (lo + hi);
      if (2 * vinc - m - 50 * 1e-14 * (Math.exp(m / vt) - 1) > 0) lo = m;
      else hi = m;
    }
    const vd = 0.5 * (lo + hi);
    expectClose('clamp voltage', r.at('vl.v', 25e-9), vd, { rel: 0, abs: 1e-8 });
    // Source end: incident 5 V, then 5 V + (vd - 5 V) once the reflection is back (after 30 ns).
    expectClose('source end before the reflection', r.at('vs.v', 25e-9), vinc, { rel: 1e-12 });
    expectClose('source end after the reflection', r.at('vs.v', 45e-9), vd, { rel: 0, abs: 1e-8 });
    expectClose('ledger closes', r.ledger!.residualJ / r.ledger!.deliveredJ, 0, { rel: 0, abs: 1e-7 });
  });
});
