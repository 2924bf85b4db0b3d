// Invariance: a run partitioned over worker threads equals the single-thread run bit for bit
// (DESIGN.md, "Parallelism and scale"): every junction does the same arithmetic in the same order,
// only on another thread. The network mixes one- and two-conductor lines, reactive loads, a timed
// switch and a nonlinear diode, with fractional delays, a lossy line (FDTD segment) and a
// frequency-dependent coax.
import { describe, expect, it } from 'vitest';
import { compileScenario, junctionCost, partitionNetwork, resolveScenarioText, runPartitioned, runScenario, type Partition } from '@skein/core';
import { standardRegistry } from '../support/run.ts';

function chain(n: number): string {
  const lines: string[] = [];
  const junctions: string[] = [];
  for (let i = 0; i < n; i++) {
    lines.push(`  l${i}: { from: J${i}, to: J${i + 1}, length: ${(1 + (i % 5) * 0.37).toFixed(2)}m, impedance: ${50 + (i % 7) * 10}ohm, velocity: 2e8m/s }`);
  }
  lines.push(`  pair: { from: J${Math.floor(n / 2)}, to: K, length: 1.3m, conductors: [a, b], inductance: [[0.9uH/m, 0.2uH/m], [0.2uH/m, 0.9uH/m]], capacitance: [[12pF/m, -2pF/m], [-2pF/m, 12pF/m]] }`);
  // Long chains also carry a lossy branch (an FDTD segment) and a frequency-dependent coax, each
  // stepped whole by the thread of its z = 0 end.
  const lossy = n >= 35;
  if (lossy) {
    lines.push('  lossy: { from: J5, to: F, length: 1.5m, impedance: 70ohm, velocity: 2e8m/s, resistance: 2ohm/m, conductance: 1mS/m }');
    lines.push('  coax: { from: J3, to: Q, length: 3m, model: frequency-dependent, section: { kind: coax, innerRadius: 0.405mm, shieldInnerRadius: 1.475mm, dielectric: { relPermittivity: 2.25, lossTangent: 2e-4 } } }');
  }
  for (let i = 0; i <= n; i++) {
    const on = [i > 0 ? `l${i - 1}` : undefined, i < n ? `l${i}` : undefined].filter(Boolean) as string[];
    if (i === Math.floor(n / 2)) on.push('pair.a');
    if (lossy && i === 5) on.push('lossy');
    if (lossy && i === 3) on.push('coax');
    const parts: string[] = [];
    if (i === 0) parts.push('gen: { source: trapezoid, between: [m, ref], amplitude: 5, rise: 1ns, width: 10ns, fall: 2ns, resistance: 25ohm }');
    if (i % 6 === 3) parts.push(`R${i}: { load: resistor, between: [m, ref], resistance: ${200 + i}ohm }`);
    if (i % 9 === 4) parts.push(`C${i}: { load: capacitor, between: [m, ref], capacitance: 20pF }`);
    if (i === 9) parts.push(`D${i}: { load: diode, between: [m, ref] }`);
    if (i === 7) parts.push(`S${i}: { load: timed-switch, between: [m, ref], closeAt: 80ns, onResistance: 5ohm, offResistance: 1Mohm }`);
    if (i === n) parts.push(`Rend: { load: resistor, between: [m, ref], resistance: 75ohm }`);
    const extra = i === Math.floor(n / 2) ? ', mb: [pair.b]' : '';
    if (i === Math.floor(n / 2)) parts.push('Rmb: { load: resistor, between: [mb, ref], resistance: 100ohm }');
    junctions.push(`  J${i}:\n    nodes: { m: [${on.join(', ')}]${extra} }\n    parts: { ${parts.join(', ')} }`);
  }
  if (lossy) {
    junctions.push('  F:\n    nodes: { f: [lossy] }\n    parts: { Rf: { load: resistor, between: [f, ref], resistance: 30ohm } }');
    junctions.push('  Q:\n    nodes: { q: [coax] }\n    parts: { Rq: { load: resistor, between: [q, ref], resistance: 500ohm } }');
  }
  junctions.push('  K:\n    nodes: { a: [pair.a], b: [pair.b] }\n    parts: { Ka: { load: resistor, between: [a, ref], resistance: 150ohm }, Kb: { load: capacitor, between: [b, ref], capacitance: 5pF } }');
  return `skein: 1
title: partition check
time: { end: 120ns, step: 0.1ns }
lines:
${lines.join('\n')}
junctions:
${junctions.join('\n')}
probes:
  v0: { probe: node-voltage, node: J0.m }
  vmid: { probe: node-voltage, node: J${Math.floor(n / 2)}.m }
  vd: { probe: node-voltage, node: J9.m }
  vend: { probe: node-voltage, node: J${n}.m }
  ik: { probe: line-end-current, line: pair, end: to }
  pt: { probe: line-point, line: l3, position: 0.4m }
  diode: { probe: part, part: D9 }
  ledger: { probe: energy-ledger }
${n >= 35 ? `  ploss: { probe: line-point, line: lossy, position: 0.7m }
  icoax: { probe: line-end-current, line: coax, end: to }
  vq: { probe: node-voltage, node: Q.q }
` : ''}`;
}

/** A tree of four-conductor lines with node-voltage probes only (no probe reads waves). */
function tree4(n: number): string {
  const L = '[[0.9uH/m, 0.15uH/m, 0.08uH/m, 0.05uH/m], [0.15uH/m, 0.9uH/m, 0.15uH/m, 0.08uH/m], [0.08uH/m, 0.15uH/m, 0.9uH/m, 0.15uH/m], [0.05uH/m, 0.08uH/m, 0.15uH/m, 0.9uH/m]]';
  const C = '[[13pF/m, -2pF/m, -1pF/m, -0.5pF/m], [-2pF/m, 14pF/m, -2pF/m, -1pF/m], [-1pF/m, -2pF/m, 14pF/m, -2pF/m], [-0.5pF/m, -1pF/m, -2pF/m, 13pF/m]]';
  const cs = ['a', 'b', 'c', 'd'];
  const parent = (j: number) => Math.max(0, j - 1 - ((j * 7) % 3));
  const on: string[][][] = Array.from({ length: n }, () => cs.map(() => []));
  const lines: string[] = [];
  for (let j = 1; j < n; j++) {
    lines.push(`  t${j}: { from: N${parent(j)}, to: N${j}, length: ${(1.1 + (j % 4) * 0.3).toFixed(1)}m, conductors: [${cs.join(', ')}], inductance: ${L}, capacitance: ${C} }`);
    cs.forEach((c, k) => { on[parent(j)][k].push(`t${j}.${c}`); on[j][k].push(`t${j}.${c}`); });
  }
  const junctions = on.map((nodes, j) => {
    const parts: string[] = [];
    if (j === 0) parts.push('src: { source: trapezoid, between: [a, ref], amplitude: 2, rise: 1ns, width: 6ns, fall: 1ns, resistance: 40ohm }');
    if (j % 5 === 4) cs.forEach((c) => parts.push(`R${j}${c}: { load: resistor, between: [${c}, ref], resistance: ${120 + j}ohm }`));
    if (j % 11 === 7) parts.push(`C${j}: { load: capacitor, between: [b, c], capacitance: 15pF }`);
    const nodeText = cs.map((c, k) => `${c}: [${nodes[k].join(', ')}]`).join(', ');
    return `  N${j}:\n    nodes: { ${nodeText} }${parts.length ? `\n    parts: { ${parts.join(', ')} }` : ''}`;
  });
  return `skein: 1
title: four-conductor tree
time: { end: 60ns, step: 0.05ns }
lines:
${lines.join('\n')}
junctions:
${junctions.join('\n')}
probes:
  v0: { probe: node-voltage, node: N0.a }
  v1: { probe: node-voltage, node: N${n - 1}.b }
  v2: { probe: node-voltage, node: N${Math.floor(n / 2)}.d }
`;
}

/** Counts the samples of two trace buffers that are not the same float64 (0: bit for bit equal). */
function differingSamples(a: Float64Array, b: Float64Array): number {
  expect(b.length).toBe(a.length);
  let differing = 0;
  for (let i = 0; i < a.length; i++) if (!Object.is(a[i], b[i])) differing++;
  return differing;
}

describe('partitionNetwork', () => {
  it('balances the stepping cost to within one junction when meetings cost nothing, and trades balance for longer crossings when they do', async () => {
    const registry = await standardRegistry();
    const plan = await compileScenario(resolveScenarioText(tree4(60), { registry, file: 'tree4.yaml' }), { registry });
    const cost = (p: Partition) => {
      const c = [0, 0];
      for (let j = 0; j < plan.nJunctions; j++) c[p.owner[j]] += junctionCost(plan, j);
      return c;
    };
    let maxJ = 0;
    for (let j = 0; j < plan.nJunctions; j++) maxJ = Math.max(maxJ, junctionCost(plan, j));
    const even = partitionNetwork(plan, 2, { barrierS: 0 });
    const [c0, c1] = cost(even);
    expect(Math.abs(c0 - c1)).toBeLessThanOrEqual(maxJ);
    // With expensive meetings the cut moves (within the 15 % slack) to a longer crossing delay.
    const costly = partitionNetwork(plan, 2, { barrierS: 1 });
    expect(costly.K).toBeGreaterThanOrEqual(even.K);
    const [d0, d1] = cost(costly);
    // The cut stays within the slack: each side within 0.15 of a share of its own, so the
    // difference within 0.15 of the total.
    expect(Math.abs(d0 - d1)).toBeLessThanOrEqual(0.15 * (d0 + d1) + maxJ);
  });
});

describe('runPartitioned', () => {
  it('equals the single-thread run bit for bit on four-conductor lines, with probes that read no waves', async () => {
    const registry = await standardRegistry();
    const text = tree4(60);
    const serial = await runScenario(resolveScenarioText(text, { registry, file: 'tree4.yaml' }), { registry });
    const parallel = await runPartitioned({ text, file: 'tree4.yaml' }, { registry, threads: 2, minBlockWorkS: 0 });
    expect(parallel.partition.used).toBe(2);
    expect(parallel.partition.crossing).toBeGreaterThan(0);
    const a = serial.traces.data;
    let peak = 0;
    for (let i = 0; i < a.length; i++) peak = Math.max(peak, Math.abs(a[i]));
    expect(peak).toBeGreaterThan(0.1);
    expect(differingSamples(a, parallel.traces.data)).toBe(0);
  });

  it('equals the single-thread run bit for bit, with lossless, lossy (FDTD), frequency-dependent and nonlinear parts', async () => {
    const registry = await standardRegistry();
    const text = chain(40);
    const serial = await runScenario(resolveScenarioText(text, { registry, file: 'chain.yaml' }), { registry });
    const parallel = await runPartitioned({ text, file: 'chain.yaml' }, { registry, threads: 2, minBlockWorkS: 0 });
    // The set-ups differ: two threads, lines crossing between them, meetings every K >= 1 steps.
    expect(parallel.partition.used).toBe(2);
    expect(parallel.partition.crossing).toBeGreaterThan(0);
    expect(parallel.partition.K).toBeGreaterThanOrEqual(1);
    expect(parallel.traceNames).toEqual(serial.traceNames);
    expect(serial.traceNames.length).toBeGreaterThan(10);
    expect(differingSamples(serial.traces.data, parallel.traces.data)).toBe(0);
    // The diode conducted (so the nonlinear path was exercised) and its results came back.
    const di = serial.traces.pick(serial.traceNames.indexOf('diode.i'), null);
    let peak = 0;
    for (let i = 0; i < di.shape[0]; i++) peak = Math.max(peak, Math.abs(di.get(i)));
    expect(peak).toBeGreaterThan(1e-3);
    expect(serial.outputs["part:D9"]).toBeDefined();
    expect(JSON.stringify(parallel.outputs["part:D9"])).toBe(JSON.stringify(serial.outputs["part:D9"]));
    expect(parallel.ledger).toEqual(serial.ledger);
    // The lossy and frequency-dependent lines carried the pulse and lost energy.
    expect(serial.ledger!.lostJ).toBeGreaterThan(0);
    for (const name of ['ploss.v.w', 'icoax.i.inner', 'vq.v']) {
      expect(serial.traceNames, serial.traceNames.join(' ')).toContain(name);
      const tr = serial.traces.pick(serial.traceNames.indexOf(name), null);
      let m = 0;
      for (let i = 0; i < tr.shape[0]; i++) m = Math.max(m, Math.abs(tr.get(i)));
      expect(m, name).toBeGreaterThan(name.includes('.i.') ? 1e-4 : 0.01);
    }
  });

  it('gives the same result when the workers start before the main thread compiles', async () => {
    const registry = await standardRegistry();
    const text = tree4(60);
    const late = await runPartitioned({ text, file: 'tree4.yaml' }, { registry, threads: 2, minBlockWorkS: 0, earlyStart: false });
    const early = await runPartitioned({ text, file: 'tree4.yaml' }, { registry, threads: 2, minBlockWorkS: 0, earlyStart: true });
    expect(early.partition.used).toBe(2);
    expect(differingSamples(late.traces.data, early.traces.data)).toBe(0);
    // Workers started early that the decision does not use: the run falls back to one thread
    // and completes.
    const small = await runPartitioned({ text: chain(10), file: 'small.yaml' }, { registry, threads: 2, earlyStart: true });
    expect(small.partition.used).toBe(1);
  });

  it('uses fewer threads than asked when a block of work is too small, and says why', async () => {
    const registry = await standardRegistry();
    const r = await runPartitioned({ text: chain(10), file: 'small.yaml' }, { registry, threads: 2 });
    expect(r.partition.used).toBe(1);
    expect(r.warnings.some((w) => w.startsWith('ran on 1 thread of 2 asked'))).toBe(true);
  });
});
