// A matched source (Rs = Z0 = 50 ohm, 1 V step) drives a line ending in C = 100 pF. The load
// charges as vL = 1 - exp(-(t - T) / (Z0 C)) (classic analytic solution; REFERENCES.md gives
// 0.181269 at t - T = 1 ns and 0.632121 at 5 ns).
// The trapezoidal companion sees the incident step as a ramp over one step, so its discrete
// solution is exactly vL_n = 1 - ((1 + r) / 2) r^(n - n0) with r = (1 - h/2tau) / (1 + h/2tau)
// (the trapezoidal rule's amplification factor, e.g. Hairer & Wanner, Solving ODEs II, IV.3,
// from memory). We check the run against that to 1e-12, and against the analytic curve within the
// rule's known error: half a step of smearing at the edge, |err| <= h / (2 tau), plus the global
// O(h^2) term (t/tau)(h/tau)^2/12.
import { describe, it } from 'vitest';
import { expectClose } from '../support/compare.ts';
import { runText } from '../support/run.ts';

const H = 0.01e-9;
const T = 5e-9;
const TAU = 50 * 100e-12;

const SCENARIO = `
skein: 1
time: { end: 40ns, step: ${H} }
lines:
  tl: { from: S, to: L, length: 1m, impedance: 50ohm, velocity: 2e8m/s }
junctions:
  S:
    nodes: { s: [tl] }
    parts:
      gen: { source: step, between: [s, ref], amplitude: 1, resistance: 50ohm }
  L:
    nodes: { l: [tl] }
    parts:
      C1: { load: capacitor, between: [l, ref], capacitance: 100pF }
probes:
  vl: { probe: node-voltage, node: L.l }
  led: { probe: energy-ledger }
`;

describe('capacitive termination', () => {
  it('charges the capacitor exponentially within the trapezoidal rule error', async () => {
    const r = await runText(SCENARIO, 'capacitive.yaml');
    const v = r.series('vl.v');
    const n0 = Math.round(T / H);
    const q = H / (2 * TAU);
    const rr = (1 - q) / (1 + q);
    for (let n = n0; n < v.length; n += 37) {
      expectClose(`vl at step ${n} (discrete closed form)`, v[n], 1 - ((1 + rr) / 2) * rr ** (n - n0), { rel: 1e-12, abs: 1e-12 });
    }
    for (const [dtAfter, ref] of [[1e-9, 0.181269], [5e-9, 0.632121]] as const) {
      const got = r.at('vl.v', T + dtAfter);
      const bound = H / (2 * TAU) + (dtAfter / TAU) * (H / TAU) ** 2 / 12 + 1e-6; // 1e-6: the reference's 6 digits
      expectClose(`vl at T + ${dtAfter * 1e9} ns (analytic)`, got, ref, { rel: 0, abs: bound });
    }
    expectClose('vl just before arrival', v[n0 - 1], 0, { rel: 0, abs: 1e-15 });
  });
});
