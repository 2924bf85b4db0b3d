/**
 * Worker side of a partitioned run: compiles the same scenario (deterministically, so the plan's
 * layout matches the main thread's) and says so; then takes its assignment (which junctions are
 * its own, the meeting interval, the shared ring buffers) and steps only the junctions it owns,
 * block by block (see shared.ts). The main thread may start the workers before it has compiled
 * the scenario itself, so that their compiling overlaps its own; it ends a worker it does not
 * need before the assignment.
 */
import { parentPort, workerData } from 'node:worker_threads';
import { compileScenario } from '../compile/compile.ts';
import { widenRings } from '../compile/rings.ts';
import { SkeinError } from '../errors.ts';
import { PluginRegistry, loadPluginModules } from '../plugins/registry.ts';
import type { StructuredOutput } from '../plugins/api.ts';
import { resolveScenarioData, resolveScenarioText } from '../scenario/resolve.ts';
import type { ResolvedScenario } from '../model.ts';
import { acceptNonlinear, phaseNonlinear } from '../run/newton.ts';
import { acceptParts, computeParts, kernelRuns, phaseJunctions, phaseSources, phaseSwitches } from '../run/step.ts';
import { phaseFdtdAfter, phaseFdtdBefore } from '../run/fdtdPhase.ts';
import { phaseFdAfter, phaseFdBefore } from '../run/fdPhase.ts';
import { unpackScenario } from './transfer.ts';
import { CONTROL_WORDS, DONE, ERROR, GO, REPLAYED, historyRow, type SharedBuffers } from './shared.ts';

/** What the main thread sends at the start. */
export interface WorkerInit {
  entry: string;
  modules: string[];
  source: { text?: string; data?: unknown; file?: string };
  /** The main thread's resolved scenario packed by transfer.ts, or undefined (resolve `source`). */
  packed?: SharedArrayBuffer;
  /** Control words (shared.ts), shared from the start so that either side can stop the run. */
  control: SharedArrayBuffer;
  /** How long a worker spins before it sleeps at a meeting [s]. */
  spinWaitS: number;
}

/** What the main thread sends once the worker has compiled and the partition is decided. */
export interface WorkerAssignment {
  type: 'assignment';
  self: number;
  threads: number;
  K: number;
  /** Extra ring history per line (rings.ts), the same as the main thread's. */
  ringExtra: Int32Array;
  owner: Int32Array;
  shared: SharedBuffers;
}

/**
 * Waits until every worker has finished the blocks before this one (DONE >= done) and the main
 * thread has replayed the block whose history rows the next block overwrites (REPLAYED >=
 * replayed). It spins first: a thread that sleeps is woken only when the scheduler next gets to
 * it, which on a busy machine is a whole time slice, while the wait at a meeting is usually the
 * other worker's last fraction of a millisecond.
 * @returns false when a worker failed or the run was stopped.
 */
function awaitBlock(control: Int32Array, done: number, replayed: number, spinMs: number): boolean {
  const ready = (): boolean => Atomics.load(control, DONE) >= done && Atomics.load(control, REPLAYED) >= replayed;
  if (ready()) return true;
  const until = performance.now() + spinMs;
  let spins = 0;
  while (!ready()) {
    if (Atomics.load(control, ERROR) !== 0) return false;
    if ((++spins & 255) === 0 && performance.now() > until) {
      const d = Atomics.load(control, DONE);
      if (d < done) Atomics.wait(control, DONE, d, 100);
      else {
        const r = Atomics.load(control, REPLAYED);
        if (r < replayed) Atomics.wait(control, REPLAYED, r, 100);
      }
    }
  }
  return true;
}

async function main(init: WorkerInit): Promise<void> {
  const control = new Int32Array(init.control, 0, CONTROL_WORDS);
  let blocksDone = 0;
  try {
    const registry = await loadPluginModules(new PluginRegistry(), init.modules);
    const file = init.source.file;
    const scenario: ResolvedScenario = init.packed
      ? unpackScenario(init.packed, file)
      : init.source.text !== undefined
      ? resolveScenarioText(init.source.text, { registry, file: init.source.file })
      : resolveScenarioData(init.source.data, { registry, file: init.source.file });
    const plan = await compileScenario(scenario, { registry });
    const assigned = new Promise<WorkerAssignment>((res) => parentPort!.once('message', res));
    parentPort!.postMessage({ type: 'compiled' });
    const job = await assigned;
    widenRings(plan, job.ringExtra);
    const warnStart = plan.warnings.length;
    const wave = new Float64Array(job.shared.wave);
    if (wave.length !== plan.wave.length) throw new SkeinError('E_BUG', `bug: worker plan has ${plan.wave.length} wave slots, main ${wave.length}`);
    plan.wave = wave;
    const own = new Uint8Array(plan.nJunctions);
    for (let j = 0; j < plan.nJunctions; j++) own[j] = job.owner[j] === job.self ? 1 : 0;
    // Only what this worker owns runs here.
    const allRuns = kernelRuns(plan);
    const runs: number[] = [];
    for (let r = 0; r < allRuns.length; r += 3) {
      let start = -1;
      for (let j = allRuns[r]; j <= allRuns[r + 1]; j++) {
        const mine = j < allRuns[r + 1] && own[j] === 1;
        if (mine && start < 0) start = j;
        if (!mine && start >= 0) { runs.push(start, j, allRuns[r + 2]); start = -1; }
      }
    }
    const ownedRuns = Int32Array.from(runs);
    plan.historyLoads = plan.historyLoads.filter((p) => own[p.part.junction] === 1);
    plan.acceptLoads = plan.acceptLoads.filter((p) => own[p.part.junction] === 1);
    plan.varying = plan.varying.filter((v) => own[v.junction] === 1);
    plan.nonlinear = plan.nonlinear.filter((v) => own[v.junction] === 1);
    // FDTD segments and frequency-dependent lines never cross threads (partition.ts): the thread
    // of a line's z = 0 end steps the whole line.
    const lines = plan.scenario.lines;
    plan.fdtd = plan.fdtd.filter((f) => own[lines[f.line].from] === 1);
    plan.fdLines = plan.fdLines.filter((f) => own[lines[f.line].from] === 1);
    // Parts of other workers are neither stepped nor needed here (computeParts writes by part index).
    const allParts = plan.parts;
    plan.parts = plan.parts.filter((p) => own[p.part.junction] === 1);
    const xRanges: number[] = [];
    for (let j = 0; j < plan.nJunctions; j++) if (own[j]) xRanges.push(plan.jX[j], plan.jX[j + 1]);
    const mySlots: number[] = [];
    if (job.self === 0) for (const w of plan.waveforms) mySlots.push(w.slot);
    for (const p of plan.historyLoads) mySlots.push(p.slot);
    const myParts = plan.parts.filter((p) => p.mode === 'nonlinear').map((p) => p.index);
    const nX = plan.x.length;
    const nSlots = plan.slot.length;
    const nParts = allParts.length;
    const xHist = new Float64Array(job.shared.xHist);
    const slotHist = new Float64Array(job.shared.slotHist);
    const nlHist = new Float64Array(job.shared.nlHist);
    const partV = new Float64Array(nParts);
    const partI = new Float64Array(nParts);
    const partU = new Float64Array(nParts);
    const K = job.K;
    const spinMs = init.spinWaitS * 1000;
    const nBlocks = Math.floor(plan.nSteps / K) + 1;
    parentPort!.postMessage({ type: 'ready' });
    let computeMs = 0;
    let waitMs = 0;
    let startMs = 0;
    for (let b = 0; b < nBlocks; b++) {
      const tw = performance.now();
      if (b === 0) {
        while (Atomics.load(control, GO) === 0) {
          if (Atomics.load(control, ERROR) !== 0) return;
          Atomics.wait(control, GO, 0, 1000);
        }
      } else if (!awaitBlock(control, job.threads * b, b - 1, spinMs)) return;
      const tc = performance.now();
      // The wait before the first block is the other workers' start-up, not a meeting.
      if (b === 0) startMs = tc - tw;
      else waitMs += tc - tw;
      const end = Math.min((b + 1) * K, plan.nSteps + 1);
      for (let n = b * K; n < end; n++) {
        const tS = n * plan.dtS;
        phaseSources(plan, tS);
        if (plan.varying.length > 0) phaseSwitches(plan, tS);
        if (plan.fdLines.length > 0) phaseFdBefore(plan, n);
        if (plan.fdtd.length > 0) phaseFdtdBefore(plan);
        phaseJunctions(plan, ownedRuns, n);
        if (plan.nonlinear.length > 0) phaseNonlinear(plan, n, tS);
        if (plan.fdtd.length > 0) phaseFdtdAfter(plan);
        if (plan.fdLines.length > 0) phaseFdAfter(plan, n);
        // Branch values are needed here by accept hooks only (the main thread's replay computes its own).
        if (plan.acceptLoads.length > 0) computeParts(plan, partV, partI, partU);
        acceptParts(plan, tS, partV, partI);
        if (plan.nonlinear.length > 0) acceptNonlinear(plan, tS);
        const h = historyRow(n, K);
        const xo = h * nX;
        for (let r = 0; r < xRanges.length; r += 2) for (let i = xRanges[r]; i < xRanges[r + 1]; i++) xHist[xo + i] = plan.x[i];
        const so = h * nSlots;
        for (let k = 0; k < mySlots.length; k++) slotHist[so + mySlots[k]] = plan.slot[mySlots[k]];
        const po = h * nParts;
        for (let k = 0; k < myParts.length; k++) nlHist[po + myParts[k]] = plan.nlCurrent[myParts[k]];
      }
      computeMs += performance.now() - tc;
      blocksDone++;
      Atomics.add(control, DONE, 1);
      Atomics.notify(control, DONE);
    }
    const outputs: Record<string, StructuredOutput> = {};
    const warnings: string[] = plan.warnings.slice(warnStart);
    for (const w of plan.waveforms) if (job.self === 0) w.instance.finish?.();
    for (const p of plan.parts) {
      if (!p.load) continue;
      try {
        const out = p.load.finish?.();
        if (out) outputs[`part:${p.part.id}`] = out;
      } catch (e) {
        warnings.push(`plugin ${p.part.type}, hook finish: ${(e as Error).message}`);
      }
    }
    parentPort!.postMessage({ type: 'finished', outputs, warnings, computeS: computeMs / 1000, waitS: waitMs / 1000, startS: startMs / 1000 });
  } catch (e) {
    const err = e as SkeinError;
    parentPort!.postMessage({ type: 'error', message: err.message, code: err.code, details: err.details, blocksDone });
    Atomics.store(control, ERROR, 1);
    Atomics.notify(control, DONE);
    Atomics.notify(control, REPLAYED);
  }
}

await main(workerData as WorkerInit);
