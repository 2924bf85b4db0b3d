import { describe, expect, it } from 'vitest';
import { resolveScenarioText, runScenario } from '../index.ts';
import { testRegistry } from './fixtures.ts';

const bewley = `
skein: 1
title: Bewley lattice check
time: { end: 8us, step: 0.1us }
lines:
  tl: { from: S, to: L, length: 200m, impedance: 50ohm, velocity: 2e8m/s }
junctions:
  S:
    nodes: { s: [tl] }
    parts:
      gen: { source: test-step, between: [s, ref], amplitude: 1, resistance: 25ohm }
  L:
    nodes: { l: [tl] }
    parts:
      RL: { load: test-resistor, between: [l, ref], resistance: 100ohm }
probes:
  vs: { probe: test-node, node: S.s }
  vl: { probe: test-node, node: L.l }
  led: { probe: test-ledger }
`;

describe('runScenario', () => {
  it('reproduces the Bewley lattice of a step into a mismatched line', async () => {
    // Bewley, Trans. AIEE 50, 1931 (from memory); values from ../shared/REFERENCES.md:
    // Rs = 25, Z0 = 50, RL = 100 ohm, one-way delay 1 us (200 m at 2e8 m/s).
    const registry = testRegistry();
    const sc = resolveScenarioText(bewley, { registry, file: 'bewley.yaml' });
    const r = await runScenario(sc, { registry });
    const dtRec = r.dtS * r.recordEvery;
    const at = (name: string, t: number): number => {
      const i = r.traceNames.indexOf(name);
      return r.traces.get(i, Math.round(t / dtRec));
    };
    // Exact arithmetic of the lattice; 1e-9 allows for rounding in the modal and junction algebra.
    expect(at('vl.v', 2e-6)).toBeCloseTo(0.88888889, 8);
    expect(at('vl.v', 4e-6)).toBeCloseTo(0.79012346, 8);
    expect(at('vl.v', 6e-6)).toBeCloseTo(0.80109739, 8);
    expect(at('vs.v', 1e-6)).toBeCloseTo(0.66666667, 8);
    expect(at('vs.v', 3e-6)).toBeCloseTo(0.81481481, 8);
    expect(at('vl.v', 0.5e-6)).toBe(0);
  });

  it('closes the energy ledger to rounding in a lossless resistive network', async () => {
    const registry = testRegistry();
    const sc = resolveScenarioText(bewley, { registry, file: 'bewley.yaml' });
    const r = await runScenario(sc, { registry });
    const d = r.traces.pick(r.traceNames.indexOf('led.delivered'), null);
    const a = r.traces.pick(r.traceNames.indexOf('led.absorbed'), null);
    const s = r.traces.pick(r.traceNames.indexOf('led.stored'), null);
    const final = d.get(r.nSamples - 1);
    expect(final).toBeGreaterThan(0);
    for (let i = 0; i < r.nSamples; i++) {
      expect(Math.abs(d.get(i) - a.get(i) - s.get(i))).toBeLessThanOrEqual(1e-9 * final);
    }
  });
});
