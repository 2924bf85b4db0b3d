// Invariance: transient vs spectral. A branched network of lossy lines (constant R and G, stepped
// in the time domain by FDTD segments) and a capacitive load, driven by a smooth trapezoid: the
// transient run and the frequency-domain solution transformed to time (packages/spectral, Fourier
// series with the wrap-around controlled) agree within 1 % of the peak at every sample. The two
// are independent methods (leapfrog in time vs exact line solutions per frequency), so they agree
// only as far as the FDTD segments resolve the pulse; 1 % is what the issue asks; 30 cells per
// metre give 0.3 % (measured), with margin.
import { describe, expect, it } from 'vitest';
import { resolveScenarioText } from '@skein/core';
import { timeResponse } from '@skein/spectral';
import { worstRelativeToPeak } from '../support/compare.ts';
import { runText, standardRegistry } from '../support/run.ts';

const NET = `
skein: 1
time: { end: 400ns }
lines:
  trunk: { from: src, to: tee, length: 12m, inductance: 300nH/m, capacitance: 80pF/m, resistance: 0.4ohm/m, conductance: 5uS/m, fdtd: { cells: 360 } }
  armA: { from: tee, to: endA, length: 7m, inductance: 250nH/m, capacitance: 100pF/m, resistance: 0.8ohm/m, fdtd: { cells: 210 } }
  armB: { from: tee, to: endB, length: 9m, inductance: 350nH/m, capacitance: 70pF/m, resistance: 0.2ohm/m, conductance: 20uS/m, fdtd: { cells: 270 } }
junctions:
  src:
    nodes: { s: [trunk] }
    parts: { gen: { source: trapezoid, between: [s, ref], amplitude: 10, delay: 5ns, rise: 8ns, width: 30ns, fall: 8ns, resistance: 30ohm } }
  tee:
    nodes: { t: [trunk, armA, armB] }
  endA:
    nodes: { a: [armA] }
    parts: { RA: { load: resistor, between: [a, ref], resistance: 150ohm } }
  endB:
    nodes: { b: [armB] }
    parts: { CB: { load: capacitor, between: [b, ref], capacitance: 50pF }, RB: { load: resistor, between: [b, ref], resistance: 1kohm } }
probes:
  vt: { probe: node-voltage, node: tee.t }
  va: { probe: node-voltage, node: endA.a }
  vb: { probe: node-voltage, node: endB.b }
  ledger: { probe: energy-ledger }
`;

describe('transient vs spectral', () => {
  it('agree within 1 % of the peak at every sample on a branched lossy network', async () => {
    const r = await runText(NET, 'branched.yaml');
    const registry = await standardRegistry();
    const sc = resolveScenarioText(NET, { registry, file: 'branched.yaml' });
    const times = Array.from(r.times());
    const ref = await timeResponse(sc, registry, {
      outputs: [{ kind: 'voltage', node: 'tee.t' }, { kind: 'voltage', node: 'endA.a' }, { kind: 'voltage', node: 'endB.b' }],
      timesS: times,
    });
    const pairs: Array<[string, number]> = [['vt.v', 0], ['va.v', 1], ['vb.v', 2]];
    for (const [trace, k] of pairs) {
      const { worst, peak } = worstRelativeToPeak(r.series(trace), ref.series[k].values);
      expect(peak).toBeGreaterThan(1);
      expect(worst, `${trace}: worst difference ${worst} of the peak ${peak} V`).toBeLessThan(0.01);
    }
    // The ledger closes with the lines' losses (FDTD scheme order).
    expect(Math.abs(r.ledger!.residualJ) / r.ledger!.deliveredJ).toBeLessThan(2e-3);
    expect(r.ledger!.lostJ).toBeGreaterThan(0);
  }, 120_000);
});
