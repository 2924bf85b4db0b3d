/**
 * Throughput of the case pool: the same small cases (the cable run of the examples, load
 * resistance swept) on 1 and on 2 worker threads, in the same run. The pools are started and
 * warmed (tsx loader and plugins loaded in every worker) before the timer, and no cache is used,
 * so the timer covers exactly what a sweep does per case: resolve and key it, run it on a worker,
 * collect its outputs. Prints cases per second for each pool and their ratio.
 *
 *   npx tsx packages/sweep/bench/sweepBench.ts [--cases 200] [--steps 4000] [--rounds 3] [--json]
 */
import { existsSync, readdirSync, readFileSync } from 'node:fs';
import { availableParallelism, loadavg } from 'node:os';
import { Worker } from 'node:worker_threads';
import { fileURLToPath } from 'node:url';
import { loadPluginModules, parseLocatedDocument, PluginRegistry, resolveScenarioData } from '@skein/core';
import { STANDARD_PLUGINS } from '@skein/cli';
import { createCasePool, expandCases, runSweep, sweepFromData, type CaseExecutor, type CaseTask } from '../src/index.ts';

const argv = process.argv.slice(2);
const at = argv.indexOf('--cases');
const nCases = at >= 0 ? Number(argv[at + 1]) : 200;
const json = argv.includes('--json');
const st = argv.indexOf('--steps');
const steps = st >= 0 ? Number(argv[st + 1]) : 4000;

const base = parseLocatedDocument(readFileSync(fileURLToPath(new URL('../examples/cableRun.yaml', import.meta.url)), 'utf8')).data as Record<string, unknown>;
// A small case: one line, two junctions, 4000 steps (8 us at 2 ns), about 10 ms of work.
base.time = { end: '8us', step: 8e-6 / steps };
const spec = sweepFromData({
  sweep: 1,
  title: 'pool throughput',
  scenario: base,
  parameters: { load: { path: 'junctions.L.parts.load.resistance', range: { from: 10, to: 1000, count: nCases, scale: 'log', unit: 'ohm' } } },
  outputs: { peak: { peak: 'vLoad.v' }, energy: { energy: 'ledger', part: 'load' } },
});

const registry = await loadPluginModules(new PluginRegistry(), STANDARD_PLUGINS, import.meta.resolve('@skein/cli'));
const sampleCase = expandCases(spec)[0];
const sample: CaseTask = {
  key: 'warm-up', digest: resolveScenarioData(sampleCase.scenario, { registry }).digest, scenario: sampleCase.scenario, outputs: spec.outputs, keepResults: false,
};

/**
 * CPU seconds per thread of this process (Linux /proc; empty elsewhere), to show where the time
 * goes: the main thread (keys, table) against the worker threads (the cases).
 */
function threadCpuS(): Map<string, number> {
  const out = new Map<string, number>();
  if (!existsSync('/proc/self/task')) return out;
  const tick = 100; // USER_HZ, 100 on Linux
  for (const t of readdirSync('/proc/self/task')) {
    try {
      const f = readFileSync(`/proc/self/task/${t}/stat`, 'utf8');
      const p = f.slice(f.lastIndexOf(')') + 2).split(' ');
      out.set(t, (Number(p[11]) + Number(p[12])) / tick);
    } catch {
      // The thread ended between listing and reading.
    }
  }
  return out;
}

/** CPU seconds used between two readings: by the main thread, by the workers, by the rest (GC, JIT helpers). */
function cpuSplit(before: Map<string, number>, after: Map<string, number>, workerIds: Set<number>): { mainS: number; workersS: number; otherS: number } {
  let mainS = 0;
  let workersS = 0;
  let otherS = 0;
  for (const [t, v] of after) {
    const d = v - (before.get(t) ?? 0);
    if (Number(t) === process.pid) mainS += d;
    else if (workerIds.has(Number(t))) workersS += d;
    else otherS += d;
  }
  return { mainS, workersS, otherS };
}

/**
 * Control measured in the same run: the same fixed CPU work (an integer loop, no skein code) on
 * 1 thread and split over 2 plain worker threads. Its ratio is what the machine offers right now;
 * on an idle 2-core machine it is close to 2, on a loaded one it drops with the load.
 */
async function controlRatio(): Promise<number> {
  const code = "let x = 0; for (let i = 0; i < 1e8; i++) x += i % 7; require('node:worker_threads').parentPort.postMessage(x);";
  const run = async (threads: number): Promise<number> => {
    const t0 = performance.now();
    const units = 4;
    let next = 0;
    await Promise.all(Array.from({ length: threads }, async () => {
      while (next++ < units) {
        await new Promise<void>((resolve, reject) => {
          const w = new Worker(code, { eval: true });
          w.once('message', () => void w.terminate().then(() => resolve()));
          w.once('error', reject);
        });
      }
    }));
    return (performance.now() - t0) / 1000;
  };
  const one = await run(1);
  const two = await run(2);
  return one / two;
}

interface Round { workers: number; seconds: number; casesPerS: number; sum: number; cpu: { mainS: number; workersS: number; otherS: number } }

async function throughput(workers: number): Promise<Round> {
  const pool = createCasePool({ modules: registry.modules, workers });
  // Start-up (tsx loader, plugins) and JIT warm-up of every worker stay outside the timer: they
  // are paid once per worker, not per case.
  await pool.warm(sample, 30);
  const executor: CaseExecutor = { capacity: workers * 2, run: (t) => pool.run(t), close: async () => {} };
  const cpu0 = threadCpuS();
  const t0 = performance.now();
  const out = await runSweep(spec, { registry, executor });
  const seconds = (performance.now() - t0) / 1000;
  const cpu1 = threadCpuS();
  // Threads that appeared with this pool and did most of the work are its workers.
  const fresh = [...cpu1.keys()].filter((t) => !cpu0.has(t) || (cpu1.get(t)! - cpu0.get(t)! > 0.2 * seconds && Number(t) !== process.pid));
  const ranked = fresh.sort((x, y) => (cpu1.get(y)! - (cpu0.get(y) ?? 0)) - (cpu1.get(x)! - (cpu0.get(x) ?? 0)));
  const cpu = cpuSplit(cpu0, cpu1, new Set(ranked.slice(0, workers).map(Number)));
  await pool.close();
  if (out.counts.computed !== nCases || out.counts.failed !== 0) throw new Error(`bench: expected ${nCases} computed cases, got ${JSON.stringify(out.counts)}`);
  // Use the results, so that nothing can be skipped.
  const sum = out.table.rows.reduce((s, r) => s + r.outputs[0], 0);
  return { workers, seconds, casesPerS: nCases / seconds, sum, cpu };
}

// Rounds alternate 1 and 2 workers; the best round of each counts, so that a burst of other load
// on the machine during one round does not decide the figure.
const roundsAt = argv.indexOf('--rounds');
const rounds = roundsAt >= 0 ? Number(argv[roundsAt + 1]) : 3;
let one: Round | undefined;
let two: Round | undefined;
let bestControl = 0;
const relative: number[] = [];
for (let r = 0; r < rounds; r++) {
  const control = await controlRatio();
  bestControl = Math.max(bestControl, control);
  const a = await throughput(1);
  const b = await throughput(2);
  if (a.sum !== b.sum) throw new Error(`bench: 1 and 2 workers disagree (${a.sum} vs ${b.sum})`);
  relative.push(b.casesPerS / a.casesPerS / control);
  if (!json) {
    console.log(`  round ${r + 1}: 1 worker ${a.casesPerS.toFixed(1)} cases/s, 2 workers ${b.casesPerS.toFixed(1)} cases/s, ratio ${(b.casesPerS / a.casesPerS).toFixed(2)}; control (plain CPU loop, 2 threads vs 1) ${control.toFixed(2)}`);
  }
  if (!one || a.casesPerS > one.casesPerS) one = a;
  if (!two || b.casesPerS > two.casesPerS) two = b;
}
if (!one || !two) throw new Error('bench: --rounds must be at least 1');
const ratio = two.casesPerS / one.casesPerS;
// Median over rounds of (pool ratio / control ratio of the same round): how close the pool comes
// to what the machine offered while it ran.
const sortedRel = [...relative].sort((x, y) => x - y);
const relMedian = sortedRel[Math.floor(sortedRel.length / 2)];
const load = loadavg()[0];
if (json) {
  console.log(JSON.stringify({ cases: nCases, steps, one, two, ratio, controlRatio: bestControl, poolOverControlMedian: relMedian, loadAverage1m: load }));
} else {
  console.log(`sweep pool throughput, ${nCases} cases of ${steps} steps`);
  console.log(`  best 1 worker : ${one.casesPerS.toFixed(1)} cases/s (${one.seconds.toFixed(2)} s)`);
  console.log(`  best 2 workers: ${two.casesPerS.toFixed(1)} cases/s (${two.seconds.toFixed(2)} s)`);
  console.log(`  ratio 2/1: ${ratio.toFixed(2)} (target >= 1.8)`);
  console.log(`  control ratio (what the machine offered, best round): ${bestControl.toFixed(2)}`);
  console.log(`  pool ratio / control ratio of the same round, median over rounds: ${relMedian.toFixed(2)}`);
  const c = (x: Round) => `main ${x.cpu.mainS.toFixed(2)} s, workers ${x.cpu.workersS.toFixed(2)} s, other threads ${x.cpu.otherS.toFixed(2)} s`;
  console.log(`  CPU time, 1 worker : ${c(one)}`);
  console.log(`  CPU time, 2 workers: ${c(two)}`);
  console.log(`  load average ${load.toFixed(1)} on ${availableParallelism()} cores (a loaded machine cannot show the pool's scaling)`);
}
