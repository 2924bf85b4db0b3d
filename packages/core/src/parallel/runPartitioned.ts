/**
 * Partitioned runs of one network on several threads (`skein run --threads N`). The network is
 * split at lines (partition.ts); each worker steps its own junctions, waves cross between threads
 * through shared ring buffers, and the threads meet only every K steps, K the shortest whole-step
 * delay of a crossing line. This thread replays each finished block from the workers' history
 * (parts, ledger, probes), so the results equal the single-thread run bit for bit: every
 * junction does the same arithmetic in the same order on the same inputs.
 */
import { availableParallelism } from 'node:os';
import { Worker } from 'node:worker_threads';
import { compileScenario, type Plan } from '../compile/compile.ts';
import { widenRings } from '../compile/rings.ts';
import { phaseFdtdAfter, phaseFdtdBefore } from '../run/fdtdPhase.ts';
import { phaseFdAfter, phaseFdBefore } from '../run/fdPhase.ts';
import { SkeinError } from '../errors.ts';
import type { NodeHandle, PartHandle, PointHandle, PortHandle, ProbeSetupContext, StructuredOutput, TraceHandle } from '../plugins/api.ts';
import type { PluginRegistry } from '../plugins/registry.ts';
import { resolveScenarioData, resolveScenarioText } from '../scenario/resolve.ts';
import type { ResolvedScenario } from '../model.ts';
import { runPlan, type RunOptions, type RunResult, type StepDriver } from '../run/run.ts';
import { partitionNetwork, type Partition } from './partition.ts';
import { allocateControl, allocateShared, CONTROL_WORDS, DONE, ERROR, GO, REPLAYED, historyRow } from './shared.ts';
import { isPortable, packScenario } from './transfer.ts';
import type { WorkerAssignment, WorkerInit } from './worker.ts';

/** Where the workers get the scenario from (they resolve and compile it themselves). */
export interface ScenarioSource {
  text?: string;
  data?: unknown;
  file?: string;
  /** The scenario already resolved from `text` or `data` (saves resolving it again). */
  scenario?: ResolvedScenario;
}

/** Options of a partitioned run. */
export interface PartitionedOptions extends Omit<RunOptions, 'driver'> {
  /** Threads asked for. */
  threads: number;
  /** Smallest useful work per thread between two meetings [s] (default 1 ms): below it fewer threads are used. */
  minBlockWorkS?: number;
  /** Estimated cost of one line-end port update [s] (default 10 ns), for that decision. */
  portCostS?: number;
  /** How long a worker spins at a meeting before it sleeps [s] (default 2 ms). */
  spinWaitS?: number;
  /**
   * Start the workers before this thread compiles the scenario, so that their set-up overlaps its
   * own. Default: when the machine has a core for every worker besides this thread's and the
   * network has at least 2 * 10^4 line-end ports per thread. With fewer cores the main thread's
   * compile competes with the workers' and the set-up took longer (benchmarks/README.md).
   */
  earlyStart?: boolean;
  /** History memory cap [bytes] (default 256 MiB): K is lowered to fit. */
  maxHistoryBytes?: number;
}

/** How a partitioned run was set up, reported in the run's warnings and returned for tests. */
export interface PartitionDecision {
  asked: number;
  used: number;
  K: number;
  crossing: number;
  work: number[];
  reason: string;
}

const WORKER_ENTRY = new URL('./worker.ts', import.meta.url).href;
const BOOTSTRAP = new URL('./bootstrap.mjs', import.meta.url);

/** Decides how many threads pay and the meeting interval. */
export function decidePartition(plan: Plan, opts: PartitionedOptions): { partition: Partition | undefined; decision: PartitionDecision } {
  const asked = Math.max(1, Math.floor(opts.threads));
  const cores = availableParallelism();
  const portCost = opts.portCostS ?? 10e-9;
  const minWork = opts.minBlockWorkS ?? 1e-3;
  const maxHist = opts.maxHistoryBytes ?? 256 * 1024 * 1024;
  if (asked === 1) return { partition: undefined, decision: { asked, used: 1, K: 0, crossing: 0, work: [plan.nPorts], reason: 'one thread asked' } };
  let best: Partition | undefined;
  let reason = '';
  for (let t = Math.min(asked, cores, plan.nJunctions); t >= 2; t--) {
    const p = partitionNetwork(plan, t, { portCostS: portCost });
    if (p.K < 1) {
      reason = `every cut for ${t} threads near the balance goes through an FDTD segment or a frequency-dependent line, which one thread steps whole`;
      continue;
    }
    const perRow = 8 * 2 * (plan.x.length + plan.slot.length + plan.parts.length);
    const K = Math.max(1, Math.min(p.K, Math.floor(maxHist / Math.max(1, perRow)), plan.nSteps + 1));
    const blockWork = (K * portCost * Math.max(...p.work)) ;
    if (blockWork >= minWork) {
      best = { ...p, K };
      break;
    }
    reason = `one block of ${K} steps is about ${(blockWork * 1e3).toFixed(3)} ms of work per thread with ${t} threads, below the ${(minWork * 1e3).toFixed(1)} ms a meeting of threads costs on a shared machine`;
  }
  if (!best) {
    return { partition: undefined, decision: { asked, used: 1, K: 0, crossing: 0, work: [plan.nPorts], reason: reason || `only ${cores} core(s) or ${plan.nJunctions} junction(s)` } };
  }
  const used = best.threads;
  const why = used < asked ? (used >= cores ? `this machine has ${cores} cores` : reason) : 'as asked';
  return { partition: best, decision: { asked, used, K: best.K, crossing: best.crossing, work: best.work, reason: why } };
}

/**
 * Runs a scenario partitioned over worker threads.
 * @returns the run result (identical to the single-thread run) and the partition decision.
 */
export async function runPartitioned(source: ScenarioSource, opts: PartitionedOptions): Promise<RunResult & { partition: PartitionDecision }> {
  const registry = opts.registry;
  const resolve = () => source.text !== undefined
    ? resolveScenarioText(source.text, { registry, file: source.file })
    : resolveScenarioData(source.data, { registry, file: source.file });
  const t0 = performance.now();
  const scenario = source.scenario ?? resolve();
  // A network large enough that its blocks will surely be worth a meeting, on a machine with a
  // core to spare for this thread: start the workers now, so that they unpack and compile the
  // scenario while this thread compiles it (a worker the decision below does not use is ended
  // before it does anything else).
  const cores = availableParallelism();
  const want = Math.min(Math.max(1, Math.floor(opts.threads)), cores);
  const ports = scenario.lines.reduce((n, l) => n + 2 * l.conductors.length, 0);
  const control = allocateControl();
  const spinWaitS = opts.spinWaitS ?? 2e-3;
  const earlyStart = opts.earlyStart ?? (want + 1 <= cores && ports >= EARLY_START_PORTS_PER_THREAD * want);
  // What any worker reports going wrong, read by this thread while it waits (one list, so that
  // checking it allocates nothing).
  const errors: WorkerError[] = [];
  const early = want > 1 && earlyStart ? startWorkers(want, source, scenario, registry, control, spinWaitS, errors) : undefined;
  const started: WorkerHandle[] = [...(early ?? [])];
  try {
    const plan = await compileScenario(scenario, { registry, onWarning: opts.onWarning });
    const { partition, decision } = decidePartition(plan, opts);
    if (early) for (const h of early.slice(partition?.threads ?? 0)) void h.worker.terminate();
    if (!partition) {
      const r = await runPlan(plan, opts, (performance.now() - t0) / 1000);
      if (decision.asked > 1) r.warnings.push(`ran on 1 thread of ${decision.asked} asked: ${decision.reason}`);
      return Object.assign(r, { partition: decision });
    }
    const K = partition.K;
    // Ring history (rings.ts): a line crossing threads needs K more steps (its writer may be up to
    // K - 1 steps ahead of its reader); the replay one block behind the workers reads waves from
    // the rings only for probes that ask for line ends, line points or the ledger, and only then
    // do all rings need two blocks more (which costs memory and, beyond the cache, time).
    const readsWaves = await probesReadWaves(plan, registry);
    const ringExtra = new Int32Array(scenario.lines.length);
    const owner = partition.owner;
    scenario.lines.forEach((l, i) => {
      ringExtra[i] = readsWaves ? 2 * K : owner[l.from] !== owner[l.to] ? K : 0;
    });
    widenRings(plan, ringExtra);
    const handles = early?.slice(0, partition.threads) ?? startWorkers(partition.threads, source, scenario, registry, control, spinWaitS, errors);
    if (!early) started.push(...handles);
    // Set-up on this thread: resolve, compile, partition and packing the scenario for the workers.
    const compileS = (performance.now() - t0) / 1000;
    const driver = partitionedDriver(plan, partition, handles, errors, control, ringExtra, readsWaves);
    const r = await runPlan(plan, { ...opts, driver }, compileS);
    r.warnings.push(`ran on ${decision.used} threads (${decision.reason}); threads meet every ${K} steps; ${decision.crossing} lines cross between threads; ports per thread ${decision.work.join(', ')}`);
    return Object.assign(r, { partition: decision });
  } catch (e) {
    // No worker outlives a run that failed on this thread (a worker waiting for its assignment
    // would keep the process alive).
    await Promise.all(started.map((h) => h.worker.terminate()));
    throw e;
  }
}

/**
 * Line-end ports per thread from which the workers are started before this thread compiles (when
 * a core is free for it): at the default 10 ns a port and 1 ms of useful work per meeting,
 * 2 * 10^4 ports per thread hold a block's worth of work from a meeting interval of 5 steps.
 */
const EARLY_START_PORTS_PER_THREAD = 20_000;

/** What a worker posts when it has stepped its last block. */
interface FinishedMessage {
  type: 'finished';
  outputs?: Record<string, StructuredOutput>;
  warnings?: string[];
  computeS?: number;
  waitS?: number;
  startS?: number;
}

/** What a worker reported going wrong. */
interface WorkerError {
  message: string;
  code?: string;
  details?: Record<string, unknown>;
}

/** A started worker and the promises of its stages. */
interface WorkerHandle {
  worker: Worker;
  /** Settles when the worker has compiled the scenario, failed or ended. */
  compiled: Promise<void>;
  /** Settles when the worker has taken its assignment (or failed or ended). */
  ready: Promise<void>;
  /** Settles when the worker has finished, failed or ended. */
  finished: Promise<void>;
  result?: FinishedMessage;
}

/**
 * Starts `count` workers on the scenario: the resolved scenario packed once in shared memory
 * (transfer.ts; unpacking costs a fraction of resolving it again) unless it holds closures (lines
 * given by a section), which each worker resolves again from its source. Their errors go to `errors`.
 */
function startWorkers(count: number, source: ScenarioSource, scenario: ResolvedScenario, registry: PluginRegistry, control: SharedArrayBuffer, spinWaitS: number, errors: WorkerError[]): WorkerHandle[] {
  const packed = isPortable(scenario) ? packScenario(scenario) : undefined;
  const init: WorkerInit = {
    entry: WORKER_ENTRY, modules: [...registry.modules], control, spinWaitS,
    source: packed ? { file: source.file } : { text: source.text, data: source.data, file: source.file },
    packed,
  };
  const words = new Int32Array(control, 0, CONTROL_WORDS);
  return Array.from({ length: count }, () => {
    const worker = new Worker(BOOTSTRAP, { workerData: init });
    let onCompiled: () => void = () => {};
    let onReady: () => void = () => {};
    let onFinished: () => void = () => {};
    const h: WorkerHandle = {
      worker,
      compiled: new Promise<void>((res) => { onCompiled = res; }),
      ready: new Promise<void>((res) => { onReady = res; }),
      finished: new Promise<void>((res) => { onFinished = res; }),
    };
    const end = (): void => { onCompiled(); onReady(); onFinished(); };
    worker.on('message', (m: { type: string; message?: string; code?: string; details?: Record<string, unknown> }) => {
      if (m.type === 'compiled') onCompiled();
      else if (m.type === 'ready') onReady();
      else if (m.type === 'finished') {
        h.result = m as FinishedMessage;
        onFinished();
      } else if (m.type === 'error') {
        errors.push({ message: m.message ?? 'worker failed', code: m.code, details: m.details });
        end();
      }
    });
    worker.on('error', (e) => {
      errors.push({ message: e.message });
      Atomics.store(words, ERROR, 1);
      end();
    });
    worker.on('exit', end);
    return h;
  });
}

/**
 * Whether any probe reads waves (line ends, line points) or the ledger: each probe is set up once
 * against a recording context and finished at once (plugins share no state between runs).
 */
async function probesReadWaves(plan: Plan, registry: PluginRegistry): Promise<boolean> {
  let reads = false;
  const sc = plan.scenario;
  const line = (id: string) => sc.lines.find((l) => l.id === id);
  for (const pr of sc.probes) {
    const plugin = registry.probes.get(pr.type)!.plugin;
    const ctx: ProbeSetupContext = {
      dtS: plan.dtS, endS: sc.time.endS, id: pr.id, warn: () => {}, partIds: plan.parts.map((p) => p.part.id),
      node: () => 0 as NodeHandle,
      lineEnd: () => { reads = true; return 0 as PortHandle; },
      linePoint: () => { reads = true; return 0 as PointHandle; },
      conductorsOf: (id) => line(id)?.conductors ?? ['w'],
      lineLength: (id) => line(id)?.lengthM ?? 1,
      part: () => 0 as PartHandle,
      trace: () => 0 as TraceHandle,
      useLedger: () => { reads = true; },
    };
    try {
      const inst = await plugin.create(pr.params as never, ctx);
      inst.finish?.();
    } catch {
      reads = true;
    }
  }
  return reads;
}

function partitionedDriver(plan: Plan, partition: Partition, handles: WorkerHandle[], errors: readonly WorkerError[], controlBuffer: SharedArrayBuffer, ringExtra: Int32Array, replayLines: boolean): StepDriver {
  const K = partition.K;
  const T = partition.threads;
  const layout = { K, nX: plan.x.length, nSlots: plan.slot.length, nParts: plan.parts.length, waveLength: plan.wave.length };
  const shared = allocateShared(layout, controlBuffer);
  const loadOutputs: Record<string, StructuredOutput> = {};
  const loadWarnings: string[] = [];
  return {
    loadResults: () => ({ outputs: loadOutputs, warnings: loadWarnings }),
    async run(p, io) {
      // This thread's plan reads the shared waves and, step by step, the workers' history.
      const wave = new Float64Array(shared.wave);
      p.wave = wave;
      const xHist = new Float64Array(shared.xHist);
      const slotHist = new Float64Array(shared.slotHist);
      const nlHist = new Float64Array(shared.nlHist);
      const control = new Int32Array(shared.control, 0, CONTROL_WORDS);
      const workers = handles.map((h) => h.worker);
      const finished = handles.map((h) => h.finished);
      const fail = (): never => {
        const e = errors[0] ?? { message: 'a worker stopped' };
        throw new SkeinError(e.code ?? 'E_WORKER', `partitioned run: ${e.message}`, e.details ?? {});
      };
      // Worker start-up (loading, unpacking, compiling) is reported apart from stepping: what
      // is left of it after this thread's own compile.
      const tSetup = performance.now();
      try {
        await Promise.all(handles.map((h) => h.compiled));
        if (errors.length > 0) fail();
        handles.forEach((h, t) => {
          const job: WorkerAssignment = { type: 'assignment', self: t, threads: T, K, ringExtra, owner: partition.owner, shared };
          h.worker.postMessage(job);
        });
        await Promise.all(handles.map((h) => h.ready));
        if (errors.length > 0) fail();
        io.timing.workerSetup = (performance.now() - tSetup) / 1000;
        const nBlocks = Math.floor(p.nSteps / K) + 1;
        const varyingLoads = [...p.varying.flatMap((v) => v.loads), ...p.nonlinear.flatMap((v) => v.varying)];
        // Views of every history row, made once (the replay loop allocates nothing).
        const rows = 2 * K;
        const xRows = Array.from({ length: rows }, (_, h) => xHist.subarray(h * layout.nX, (h + 1) * layout.nX));
        const slotRows = Array.from({ length: rows }, (_, h) => slotHist.subarray(h * layout.nSlots, (h + 1) * layout.nSlots));
        const nlRows = Array.from({ length: rows }, (_, h) => nlHist.subarray(h * layout.nParts, (h + 1) * layout.nParts));
        const replay = (b: number): void => {
          const end = Math.min((b + 1) * K, p.nSteps + 1);
          for (let n = b * K; n < end; n++) {
            const h = historyRow(n, K);
            p.x = xRows[h];
            p.slot = slotRows[h];
            p.nlCurrent = nlRows[h];
            const tS = n * p.dtS;
            for (let k = 0; k < varyingLoads.length; k++) {
              const l = varyingLoads[k];
              l.part.g = l.instance.conductanceAt!(tS);
            }
            if (replayLines) {
              // The same updates as the owning worker's, on this thread's copy of the lines'
              // state, for the probes and the ledger (FDTD/FD slots are this thread's own: the
              // workers write only their waveform, load and device values to the history).
              if (p.fdLines.length > 0) phaseFdBefore(p, n);
              if (p.fdtd.length > 0) {
                phaseFdtdBefore(p);
                phaseFdtdAfter(p);
              }
              if (p.fdLines.length > 0) phaseFdAfter(p, n);
            }
            io.observe(n, false);
          }
        };
        Atomics.store(control, GO, 1);
        Atomics.notify(control, GO);
        for (let b = 0; b < nBlocks; b++) {
          const target = T * (b + 1);
          const t1 = performance.now();
          // This thread sleeps (it is not on the workers' path: they release each other).
          while (Atomics.load(control, DONE) < target) {
            if (Atomics.load(control, ERROR) !== 0 || errors.length > 0) {
              await Promise.all(finished);
              fail();
            }
            Atomics.wait(control, DONE, Atomics.load(control, DONE), 50);
          }
          io.timing.junctions += performance.now() - t1;
          replay(b);
          Atomics.store(control, REPLAYED, b + 1);
          Atomics.notify(control, REPLAYED);
        }
        await Promise.all(finished);
        if (errors.length > 0) fail();
        handles.forEach((h, t) => {
          // Per-worker stepping and waiting time, for the efficiency figures.
          const m = h.result;
          io.timing[`worker${t}Compute`] = m?.computeS ?? 0;
          io.timing[`worker${t}Wait`] = m?.waitS ?? 0;
          io.timing[`worker${t}Start`] = m?.startS ?? 0;
          Object.assign(loadOutputs, m?.outputs);
          loadWarnings.push(...(m?.warnings ?? []));
        });
        // The workers have posted their results and end by themselves; their teardown (freeing
        // their plans) overlaps with this thread's finish.
        for (const w of workers) void w.terminate();
      } catch (e) {
        Atomics.store(control, ERROR, Atomics.load(control, ERROR) || 2);
        for (const word of [GO, DONE, REPLAYED]) Atomics.notify(control, word);
        await Promise.all(workers.map((w) => w.terminate()));
        throw e;
      }
    },
  };
}
