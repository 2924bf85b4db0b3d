import { describe, expect, it } from 'vitest';
import { compileScenario, resolveScenarioText, runPlan, widenRings } from '../../index.ts';
import { testRegistry } from '../../__tests__/fixtures.ts';

// Three lines of different delays (two whole, one fractional) between a source, a junction and
// two loads, with a two-conductor pair: enough reflections that a port pointing at a wrong ring
// offset or a ring too short for its delay changes the traces.
const text = `
skein: 1
time: { end: 200ns, step: 0.5ns }
lines:
  a: { from: S, to: M, length: 3m, impedance: 50ohm, velocity: 2e8m/s }
  b: { from: M, to: L1, length: 2.15m, impedance: 90ohm, velocity: 2e8m/s }
  p: { from: M, to: L2, length: 1.7m, conductors: [x, y], inductance: [[0.9uH/m, 0.2uH/m], [0.2uH/m, 0.9uH/m]], capacitance: [[12pF/m, -2pF/m], [-2pF/m, 12pF/m]] }
junctions:
  S:
    nodes: { s: [a] }
    parts: { gen: { source: test-step, between: [s, ref], amplitude: 1, resistance: 10ohm } }
  M:
    nodes: { m: [a, b, p.x], n: [p.y] }
    parts: { rn: { load: test-resistor, between: [n, ref], resistance: 300ohm } }
  L1:
    nodes: { l: [b] }
    parts: { r1: { load: test-resistor, between: [l, ref], resistance: 1kohm } }
  L2:
    nodes: { x: [p.x], y: [p.y] }
    parts: { rx: { load: test-capacitor, between: [x, ref], capacitance: 10pF }, ry: { load: test-resistor, between: [y, ref], resistance: 20ohm } }
probes:
  vm: { probe: test-node, node: M.m }
  vl: { probe: test-node, node: L1.l }
  vx: { probe: test-node, node: L2.x }
  led: { probe: test-ledger }
`;

describe('widenRings', () => {
  it('lengthens each line\'s rings by its extra history and leaves every result bit for bit unchanged', async () => {
    const registry = testRegistry();
    const plain = await compileScenario(resolveScenarioText(text, { registry, file: 'rings.yaml' }), { registry });
    const wide = await compileScenario(resolveScenarioText(text, { registry, file: 'rings.yaml' }), { registry });
    const extra = Int32Array.of(0, 13, 40);
    widenRings(wide, extra);
    // Ring length: next power of two of k + 2 + extra (rings.ts).
    const pow2 = (x: number) => 2 ** Math.ceil(Math.log2(x));
    for (let i = 0; i < 3; i++) {
      for (let q = wide.lineModeOff[i]; q < wide.lineModeOff[i + 1]; q++) {
        expect(wide.ringMask[q] + 1).toBe(pow2(wide.delays[q].k + 2 + extra[i]));
        expect(plain.ringMask[q] + 1).toBe(pow2(plain.delays[q].k + 2));
      }
    }
    expect(wide.wave.length).toBeGreaterThan(plain.wave.length);
    const r0 = await runPlan(plain, { registry });
    const r1 = await runPlan(wide, { registry });
    let peak = 0;
    for (let i = 0; i < r0.traces.data.length; i++) peak = Math.max(peak, Math.abs(r0.traces.data[i]));
    expect(peak).toBeGreaterThan(0.1);
    expect(Array.from(r1.traces.data)).toEqual(Array.from(r0.traces.data));
  });
});
