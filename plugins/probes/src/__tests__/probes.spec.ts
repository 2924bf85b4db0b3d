import { describe, expect, it } from 'vitest';
import { PluginRegistry, resolveScenarioText, runScenario, type RunResult } from '@skein/core';
import loads from '@skein/plugin-loads';
import waveforms from '@skein/plugin-waveforms';
import probes, {
  energyLedgerProbe, lineEndCurrentProbe, linePointProbe, nodeVoltageProbe, partProbe, voltageBetweenProbe,
} from '../index.ts';

function registry(): PluginRegistry {
  const r = new PluginRegistry();
  for (const p of waveforms) r.register(p, '@skein/plugin-waveforms');
  for (const p of loads) r.register(p, '@skein/plugin-loads');
  for (const p of probes) r.register(p, '@skein/plugin-probes');
  return r;
}

async function run(text: string): Promise<RunResult & { at: (trace: string, tS: number) => number }> {
  const reg = registry();
  const r = await runScenario(resolveScenarioText(text, { registry: reg, file: 'test.yaml' }), { registry: reg });
  const dtRec = r.dtS * r.recordEvery;
  const at = (trace: string, tS: number): number => {
    const i = r.traceNames.indexOf(trace);
    if (i < 0) throw new Error(`no trace ${trace}; have ${r.traceNames.join(', ')}`);
    return r.traces.get(i, Math.round(tS / dtRec));
  };
  return Object.assign(r, { at });
}

// Bewley lattice, values from /work/shared/REFERENCES.md (Bewley, Trans. AIEE 50, 1931, from memory):
// 1 V step, Rs = 25 ohm, Z0 = 50 ohm, RL = 100 ohm, one-way delay 1 us (200 m at 2e8 m/s).
const bewley = `
skein: 1
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
  vsl: { probe: voltage-between, plus: S.s, minus: L.l }
  is: { probe: line-end-current, line: tl, end: from }
  il: { probe: line-end-current, line: tl, end: to }
  midv: { probe: line-point, line: tl, position: 100m }
  midi: { probe: line-point, line: tl, position: 100m, quantity: current }
  midp: { probe: line-point, line: tl, position: 100m, quantity: power }
  rl: { probe: part, part: RL }
  energy: { probe: energy-ledger }
`;

// Lattice arithmetic is exact; 1e-9 allows for rounding in the modal and junction algebra.
const TOL = 1e-9;

describe('probes', () => {
  it('lists the seven standard probes in a fixed order', () => {
    expect(probes.map((p) => p.type)).toEqual(['node-voltage', 'voltage-between', 'line-end-current', 'line-point', 'part', 'energy-ledger', 'space-time']);
  });
});

describe('nodeVoltageProbe', () => {
  it('records the Bewley lattice voltages at both ends and reports the peak', async () => {
    expect(nodeVoltageProbe.type).toBe('node-voltage');
    const r = await run(bewley);
    expect(r.at('vl.v', 2e-6)).toBeCloseTo(0.88888889, 8);
    expect(r.at('vl.v', 4e-6)).toBeCloseTo(0.79012346, 8);
    expect(r.at('vs.v', 1e-6)).toBeCloseTo(0.66666667, 8);
    expect(r.at('vs.v', 3e-6)).toBeCloseTo(0.81481481, 8);
    const peaks = (r.outputs.vl as { peaks: Record<string, { peak: number; peakAtS: number; min: number }> }).peaks;
    // The load's largest value is the first plateau 8/9 V, reached at t = 1 us.
    expect(Math.abs(peaks.v.peak - 8 / 9)).toBeLessThan(TOL);
    expect(peaks.v.peakAtS).toBeCloseTo(1e-6, 12);
    expect(peaks.v.min).toBe(0);
  });
});

describe('voltageBetweenProbe', () => {
  it('gives the difference of two nodes in different junctions', async () => {
    expect(voltageBetweenProbe.type).toBe('voltage-between');
    const r = await run(bewley);
    for (const t of [0.5e-6, 2e-6, 3.5e-6]) expect(Math.abs(r.at('vsl.v', t) - (r.at('vs.v', t) - r.at('vl.v', t)))).toBeLessThan(1e-15);
    expect(r.at('vsl.v', 0.5e-6)).toBeCloseTo(0.66666667, 8);
  });
});

describe('lineEndCurrentProbe', () => {
  it('gives one trace per conductor, the current into the line at each end', async () => {
    expect(lineEndCurrentProbe.type).toBe('line-end-current');
    const r = await run(bewley);
    const names = r.traceNames.filter((n) => n.startsWith('is.'));
    expect(names).toHaveLength(1);
    // Source end, 0-2 us: (1 - 2/3) V / 25 ohm = 13.333 mA into the line.
    expect(Math.abs(r.at(names[0], 0.5e-6) - 1 / 75)).toBeLessThan(TOL);
    // Load end, 1-3 us: the load draws 8/9 V / 100 ohm out of the line: -8.889 mA into the line.
    const il = r.traceNames.find((n) => n.startsWith('il.'))!;
    expect(Math.abs(r.at(il, 2e-6) + 8 / 900)).toBeLessThan(TOL);
  });
});

describe('linePointProbe', () => {
  it('gives voltage, current and power of the travelling and reflected waves at mid-line', async () => {
    expect(linePointProbe.type).toBe('line-point');
    const r = await run(bewley);
    const v = r.traceNames.find((n) => n.startsWith('midv.v.'))!;
    const i = r.traceNames.find((n) => n.startsWith('midi.i.'))!;
    // 0.5-1.5 us: only the forward wave 2/3 V, current 2/3 / 50 A. 1.5-2.5 us: plus the reflection
    // (load reflection coefficient 1/3): 8/9 V and (2/3 - 2/9)/50 A.
    expect(Math.abs(r.at(v, 1e-6) - 2 / 3)).toBeLessThan(TOL);
    expect(Math.abs(r.at(i, 1e-6) - 2 / 150)).toBeLessThan(TOL);
    expect(Math.abs(r.at(v, 2e-6) - 8 / 9)).toBeLessThan(TOL);
    expect(Math.abs(r.at(i, 2e-6) - 4 / 450)).toBeLessThan(TOL);
    expect(Math.abs(r.at('midp.p', 2e-6) - (8 / 9) * (4 / 450))).toBeLessThan(TOL);
    expect(r.at(v, 0.25e-6)).toBe(0);
  });
  it('rejects a conductor the line does not have, naming the parameter', async () => {
    const bad = bewley.replace('quantity: power }', 'quantity: power, conductor: nope }');
    await expect(run(bad)).rejects.toThrow(/conductor/);
  });
});

describe('partProbe', () => {
  it('gives v, i and p = v^2 / R of a resistor, and its energy', async () => {
    expect(partProbe.type).toBe('part');
    const r = await run(bewley);
    expect(Math.abs(r.at('rl.v', 2e-6) - 8 / 9)).toBeLessThan(TOL);
    expect(Math.abs(r.at('rl.i', 2e-6) - 8 / 900)).toBeLessThan(TOL);
    expect(Math.abs(r.at('rl.p', 2e-6) - (8 / 9) ** 2 / 100)).toBeLessThan(TOL);
    // Exact energy of the lattice: the load voltage is piecewise constant, 0 on 0-1 us, then
    // v_k = v_{k-1} + (2/3)(1 + GL)(GL GS)^k on [1 + 2k, 3 + 2k] us, GL = 1/3, GS = -1/3
    // (Bewley lattice, as above). The trapezoidal sum over samples counts each jump, which falls
    // between two samples, as dt/2 times the jump in power; the jumps telescope to dt/2 p(8 us).
    const GL = 1 / 3;
    const GS = -1 / 3;
    let v = 0;
    let exact = 0;
    for (let k = 0; k < 4; k++) {
      v += (2 / 3) * (1 + GL) * (GL * GS) ** k;
      const t1 = Math.min(8e-6, (3 + 2 * k) * 1e-6);
      exact += ((v * v) / 100) * (t1 - (1 + 2 * k) * 1e-6);
    }
    const out = r.outputs.rl as { energyJ: number };
    const expected = exact + (r.dtS / 2) * r.at('rl.p', 8e-6);
    expect(Math.abs(out.energyJ - expected)).toBeLessThanOrEqual(1e-9 * expected);
  });
});

describe('energyLedgerProbe', () => {
  it('closes the ledger and reports per-part, per-line and total energies', async () => {
    expect(energyLedgerProbe.type).toBe('energy-ledger');
    const r = await run(bewley);
    const out = r.outputs.energy as {
      delivered: Record<string, number>; absorbed: Record<string, number>; stored: Record<string, number>;
      totals: { deliveredJ: number; absorbedJ: number; storedJ: number; residualJ: number };
    };
    expect(Object.keys(out.delivered)).toEqual(['gen']);
    expect(Object.keys(out.absorbed).sort()).toEqual(['RL', 'gen']);
    expect(Object.keys(out.stored)).toEqual(['tl']);
    // Lossless resistive network with integer delays: the ledger closes to rounding (core ledger.ts).
    expect(Math.abs(out.totals.residualJ)).toBeLessThanOrEqual(1e-9 * out.totals.deliveredJ);
    expect(out.totals.deliveredJ).toBeGreaterThan(0);
    // By t = 8 us the load voltage is within 0.2 % of 0.8 V; the line holds the rest.
    const d = r.at('energy.delivered', 8e-6);
    expect(Math.abs(d - out.totals.deliveredJ)).toBeLessThanOrEqual(1e-15 * d);
  });
});

describe('capacitive load after a matched source', () => {
  it('charges as 1 - exp(-(t - T)/(Z0 C)) through the standard capacitor load', async () => {
    // REFERENCES.md: Rs = Z0 = 50 ohm, C = 100 pF: 0.181269 at t - T = 1 ns, 0.632121 at 5 ns
    // (classic analytic solution). The ideal step reaches the capacitor between two steps of the
    // trapezoidal rule, which shifts the response by dt/2 at most: |dv| <= (dt/2)/(Z0 C) = 1e-3 at dt = 10 ps.
    const r = await run(`
skein: 1
time: { end: 12ns, step: 10ps }
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
  c1: { probe: part, part: C1 }
  energy: { probe: energy-ledger }
`);
    const T = 5e-9;
    expect(Math.abs(r.at('vl.v', T + 1e-9) - 0.181269)).toBeLessThan(1e-3);
    expect(Math.abs(r.at('vl.v', T + 5e-9) - 0.632121)).toBeLessThan(1e-3);
    const out = r.outputs.energy as { absorbed: Record<string, number> };
    const vEnd = r.at('vl.v', 12e-9);
    // The capacitor's absorbed energy is C v^2 / 2 exactly for the trapezoidal companion (ledger.ts).
    expect(Math.abs(out.absorbed.C1 - 0.5 * 100e-12 * vEnd * vEnd)).toBeLessThanOrEqual(1e-9 * out.absorbed.C1);
  });
});

describe('spaceTimeProbe', () => {
  it('maps a travelling step as f(t - x / v) along a matched line', async () => {
    // A matched line carries the incident wave unchanged: v(x, t) = 0.5 for t >= x / v, else 0
    // (d'Alembert's travelling-wave solution, classic). Step 0.5 ns, 2e8 m/s: 0.1 m per step, and
    // points every 0.2 m, so every sample is a whole-step delay and exact.
    const { loadPluginModules, PluginRegistry, resolveScenarioText, runScenario, bytesToFloat64 } = await import('@skein/core');
    const registry = await loadPluginModules(new PluginRegistry(), ['@skein/plugin-waveforms', '@skein/plugin-loads', '@skein/plugin-probes'], import.meta.url);
    const r = await runScenario(resolveScenarioText(`
skein: 1
time: { end: 20ns, step: 0.5ns }
lines:
  a: { from: S, to: M, length: 1m, impedance: 50ohm, velocity: 2e8m/s }
  b: { from: M, to: L, length: 1m, impedance: 50ohm, velocity: 2e8m/s }
junctions:
  S:
    nodes: { s: [a] }
    parts: { g: { source: step, between: [s, ref], amplitude: 1, resistance: 50ohm } }
  M:
    nodes: { m: [a, b] }
  L:
    nodes: { l: [b] }
    parts: { R: { load: resistor, between: [l, ref], resistance: 50ohm } }
probes:
  map: { probe: space-time, path: "a,b", points: 11 }
`, { registry }), { registry });
    const out = r.outputs.map as { positionsM: number[]; timesS: number[]; values: Uint8Array; boundaries: Array<{ positionM: number }> };
    expect(out.positionsM.length).toBe(11);
    expect(out.boundaries[0].positionM).toBe(1);
    const v = bytesToFloat64(out.values);
    const n = 11;
    for (let ti = 0; ti < out.timesS.length; ti++) {
      for (let i = 0; i < n; i++) {
        const t = out.timesS[ti];
        const x = out.positionsM[i];
        const expected = t + 1e-15 >= x / 2e8 ? 0.5 : 0;
        expect(Math.abs(v[ti * n + i] - expected)).toBeLessThan(1e-12);
      }
    }
  });
});
