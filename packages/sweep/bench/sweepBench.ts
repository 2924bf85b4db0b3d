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
 * CPU seconds per thread of this process (Linux /proc; empty elsewhere). On a machine shared with
 * other work the wall-clock ratio measures the machine's load as much as the pool; the CPU time
 * each thread used gives what an idle machine with `cores` cores would take: the larger of the
 * busiest thread's time and the total divided by the cores.
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

function idleSeconds(before: Map<string, number>, after: Map<string, number>, cores: number): number {
  let total = 0;
  let busiest = 0;
  for (const [t, v] of after) {
    const d = v - (before.get(t) ?? 0);
    total += d;
    busiest = Math.max(busiest, d);
  }
  return Math.max(busiest, total / cores);
}

async function throughput(workers: number): Promise<{ workers: number; seconds: number; casesPerS: number; sum: number; idleProjectedS: number }> {
  const pool = createCasePool({ modules: registry.modules, workers });
  // Start-up (tsx loader, plugins) and JIT warm-up of every worker stay outside the timer: they
  // are paid once per worker, not per case.
  await pool.warm(sample, 30);
  const executor: CaseExecutor = { capacity: workers * 2, run: (t) => pool.run(t), close: async () => {} };
  const cpu0 = threadCpuS();
  const t0 = performance.now();
  const out = await runSweep(spec, { registry, executor });
  const seconds = (performance.now() - t0) / 1000;
  const idleProjectedS = idleSeconds(cpu0, threadCpuS(), 2);
  await pool.close();
  if (out.counts.computed !== nCases || out.counts.failed !== 0) throw new Error(`bench: expected ${nCases} computed cases, got ${JSON.stringify(out.counts)}`);
  // Use the results, so that nothing can be skipped.
  const sum = out.table.rows.reduce((s, r) => s + r.outputs[0], 0);
  return { workers, seconds, casesPerS: nCases / seconds, sum, idleProjectedS };
}

// Rounds alternate 1 and 2 workers; the best round of each counts, so that a burst of other load
// on the machine during one round does not decide the figure.
const roundsAt = argv.indexOf('--rounds');
const rounds = roundsAt >= 0 ? Number(argv[roundsAt + 1]) : 3;
let one: Awaited<ReturnType<typeof throughput>> | undefined;
let two: Awaited<ReturnType<typeof throughput>> | undefined;
for (let r = 0; r < rounds; r++) {
  const a = await throughput(1);
  const b = await throughput(2);
  if (a.sum !== b.sum) throw new Error(`bench: 1 and 2 workers disagree (${a.sum} vs ${b.sum})`);
  if (!json) {
    console.log(`  round ${r + 1}: 1 worker ${a.casesPerS.toFixed(1)} cases/s, 2 workers ${b.casesPerS.toFixed(1)} cases/s, ratio ${(b.casesPerS / a.casesPerS).toFixed(2)}` +
      (a.idleProjectedS > 0 ? ` (per-thread CPU: an idle 2-core machine would give ${(a.idleProjectedS / b.idleProjectedS).toFixed(2)})` : ''));
  }
  if (!one || a.casesPerS > one.casesPerS) one = a;
  if (!two || b.casesPerS > two.casesPerS) two = b;
}
if (!one || !two) throw new Error('bench: --rounds must be at least 1');
const ratio = two.casesPerS / one.casesPerS;
const idleRatio = one.idleProjectedS > 0 ? one.idleProjectedS / two.idleProjectedS : NaN;
const load = loadavg()[0];
if (json) {
  console.log(JSON.stringify({ cases: nCases, steps, one, two, ratio, idleRatio, loadAverage1m: load }));
} else {
  console.log(`sweep pool throughput, ${nCases} cases of ${steps} steps`);
  console.log(`  best 1 worker : ${one.casesPerS.toFixed(1)} cases/s (${one.seconds.toFixed(2)} s)`);
  console.log(`  best 2 workers: ${two.casesPerS.toFixed(1)} cases/s (${two.seconds.toFixed(2)} s)`);
  console.log(`  ratio 2/1: ${ratio.toFixed(2)} (target >= 1.8)`);
  console.log(`  from per-thread CPU time, on an idle 2-core machine: ${idleRatio.toFixed(2)} (load average now ${load.toFixed(1)} on ${availableParallelism()} cores)`);
}
