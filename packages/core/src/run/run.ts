/**
 * Runs a compiled plan: sets up probes, steps to the end, records traces, calls every finish
 * hook (also after a failure) and returns the results.
 */
import ndarray, { type NdArray } from 'ndarray';
import ops from 'ndarray-ops';
import { compileScenario, type DelayInfo, type Plan } from '../compile/compile.ts';
import { badInput, nonFinite, PluginError, SkeinError } from '../errors.ts';
import type { ResolvedScenario } from '../model.ts';
import type {
  LedgerView, NodeHandle, PartHandle, PointHandle, PortHandle, ProbeInstance, ProbeSetupContext, ProbeState, StructuredOutput, TraceHandle,
} from '../plugins/api.ts';
import type { PluginRegistry } from '../plugins/registry.ts';
import { accumulateLedger, createLedger, refreshLedgerView, type Ledger } from './ledger.ts';
import { acceptNonlinear, phaseNonlinear } from './newton.ts';
import { phaseFdtdAfter, phaseFdtdBefore } from './fdtdPhase.ts';
import { phaseFdAfter, phaseFdBefore } from './fdPhase.ts';
import { acceptParts, computeParts, kernelRuns, phaseJunctions, phaseSources, phaseSwitches } from './step.ts';

/**
 * What advances the solver. The default steps everything on this thread; a partitioned run steps
 * on workers and replays each step here. `observe(step, partsReady)` runs the parts (unless the
 * driver already filled them), ledger and probe phases of one step.
 */
export interface StepDriver {
  run(plan: Plan, io: DriverIo): Promise<void>;
  /** Finish results of loads that were stepped elsewhere (they replace this thread's loads' results). */
  loadResults?(): { outputs: Record<string, StructuredOutput>; warnings: string[] };
}

/** What a driver gets from the run. */
export interface DriverIo {
  observe(step: number, partsReady: boolean): void;
  timing: Record<string, number>;
  partV: Float64Array;
  partI: Float64Array;
  partU: Float64Array;
}

/** Options of a run. */
export interface RunOptions {
  registry: PluginRegistry;
  /** Steps the solver (default: this thread). */
  driver?: StepDriver;
  /** Called about every 1 % of the steps with the fraction done. */
  onProgress?: (fraction: number, step: number, nSteps: number) => void;
  onWarning?: (message: string) => void;
}

/** Per-line derived data for summaries and reports. */
export interface LineDerived {
  id: string;
  conductors: string[];
  lengthM: number;
  velocitiesMps: number[];
  delaysS: number[];
  modalImpedancesOhm: number[];
  /** Characteristic impedance matrix, n x n row-major [ohm]. */
  zcOhm: number[];
  origin: string;
}

/** Peak of one trace. */
export interface TracePeak {
  trace: string;
  unit: string;
  max: number;
  min: number;
  /** Time of the largest magnitude [s]. */
  atS: number;
}

/** What a run returns. Traces share one time axis: t_i = i * dt * recordEvery. */
export interface RunResult {
  title: string;
  digest: string;
  dtS: number;
  nSteps: number;
  recordEvery: number;
  nSamples: number;
  traceNames: string[];
  traceUnits: string[];
  traceProbes: string[];
  /** Trace samples, [trace, sample] over one Float64Array. */
  traces: NdArray<Float64Array>;
  outputs: Record<string, StructuredOutput>;
  peaks: TracePeak[];
  ledger: { deliveredJ: number; absorbedJ: number; storedJ: number; lostJ: number; residualJ: number } | undefined;
  warnings: string[];
  lines: LineDerived[];
  delays: DelayInfo[];
  /** Wall time per phase [s]. */
  timing: Record<string, number>;
  network: NetworkSummary;
}

/** A plain description of the network, kept in results for reports. */
export interface NetworkSummary {
  lines: Array<{ id: string; from: string; to: string; lengthM: number; conductors: string[] }>;
  junctions: Array<{ id: string; nodes: string[]; parts: Array<{ id: string; role: string; type: string; between: [string, string] }> }>;
  probes: Array<{ id: string; type: string }>;
}

/** A point on a line; zNode: on an FDTD segment, the position in node units (node k at k, linear between nodes). */
interface PointRec { line: number; positionM: number; kf: Int32Array; ff: Float64Array; kb: Int32Array; fb: Float64Array; zNode?: number }
interface PortRec { line: number; end: number; conductor: number }

const CHECK_EVERY = 1024;

/** Position z [m] on an FDTD segment in node units: k + t between nodes k and k + 1 (uniform cells of dz, or the node positions of a varying line). */
function fdtdNodeCoordinate(zNodeM: Float64Array | undefined, dzM: number, cells: number, z: number): number {
  if (!zNodeM) return z / dzM;
  let k = 0;
  while (k < cells - 1 && zNodeM[k + 1] <= z) k++;
  return k + Math.min(1, (z - zNodeM[k]) / (zNodeM[k + 1] - zNodeM[k]));
}

/**
 * Validated scenario in, results out.
 * @throws InputError, NumericalError, PluginError (see errors.ts).
 */
export async function runScenario(scenario: ResolvedScenario, options: RunOptions): Promise<RunResult> {
  const t0 = performance.now();
  const plan = await compileScenario(scenario, { registry: options.registry, onWarning: options.onWarning });
  const compileS = (performance.now() - t0) / 1000;
  return runPlan(plan, options, compileS);
}

/** Steps a compiled plan to its end. */
export async function runPlan(plan: Plan, options: RunOptions, compileS = 0): Promise<RunResult> {
  const sc = plan.scenario;
  const warnings = plan.warnings;
  const traceNames: string[] = [];
  const traceUnits: string[] = [];
  const traceProbes: string[] = [];
  const points: PointRec[] = [];
  const ports: PortRec[] = [];
  let ledgerWanted = false;
  let partsWanted = false;
  const lineIndex = new Map(sc.lines.map((l) => [l.id, l.index]));
  const partIndex = new Map(plan.parts.map((p) => [p.part.id, p.index]));
  const probes: Array<{ id: string; type: string; inst: ProbeInstance }> = [];
  let failure: unknown;
  let finished = false;
  const finishAll = (): Record<string, StructuredOutput> => {
    const outputs: Record<string, StructuredOutput> = {};
    if (finished) return outputs;
    finished = true;
    for (const w of plan.waveforms) safeFinish(() => w.instance.finish?.(failure), w.type, warnings);
    if (options.driver?.loadResults) {
      const lr = options.driver.loadResults();
      Object.assign(outputs, lr.outputs);
      warnings.push(...lr.warnings);
    } else {
      for (const p of plan.parts) {
        if (!p.load) continue;
        safeFinish(() => {
          const out = p.load!.finish?.(failure);
          if (out) outputs[`part:${p.part.id}`] = out;
        }, p.part.type, warnings);
      }
    }
    for (const p of probes) {
      safeFinish(() => {
        const out = p.inst.finish?.(failure);
        if (out) outputs[p.id] = out;
      }, p.type, warnings);
    }
    return outputs;
  };

  try {
    for (const pr of sc.probes) {
      const plugin = options.registry.probes.get(pr.type)!.plugin;
      const fail = (param: string | undefined, rule: string, value: unknown): SkeinError =>
        badInput(param ? [...pr.path, param] : pr.path, rule, value, 'E_PROBE_PLACE', sc.locate(param ? [...pr.path, param] : pr.path));
      const ctx: ProbeSetupContext = {
        dtS: plan.dtS,
        endS: sc.time.endS,
        id: pr.id,
        warn: (m) => warnings.push(`${pr.id}: ${m}`),
        partIds: plan.parts.map((p) => p.part.id),
        node(ref, param) {
          const [jid, node] = ref.split('.');
          const j = sc.junctions.find((x) => x.id === jid);
          if (!j) throw fail(param, `must name a node as "junction.node"; junctions: ${sc.junctions.map((x) => x.id).join(', ')}`, ref);
          const k = j.nodes.indexOf(node);
          if (k < 0) throw fail(param, `must name a node of junction ${jid}: ${j.nodes.join(', ')}`, ref);
          return (plan.jX[j.index] + k) as NodeHandle;
        },
        lineEnd(line, end, conductor, param) {
          const l = lineIndex.get(line);
          if (l === undefined) throw fail(param, `must name a line: ${[...lineIndex.keys()].join(', ')}`, line);
          const k = sc.lines[l].conductors.indexOf(conductor);
          if (k < 0) throw fail(param, `must name a conductor of line ${line}: ${sc.lines[l].conductors.join(', ')}`, conductor);
          ports.push({ line: l, end: end === 'from' ? 0 : 1, conductor: k });
          return (ports.length - 1) as PortHandle;
        },
        linePoint(line, positionM, param) {
          const l = lineIndex.get(line);
          if (l === undefined) throw fail(param, `must name a line: ${[...lineIndex.keys()].join(', ')}`, line);
          const len = sc.lines[l].lengthM;
          if (!(positionM >= 0 && positionM <= len)) throw fail(param, `must lie on line ${line}, between 0 m and ${len} m`, positionM);
          if (sc.lines[l].frequencyDependent) throw fail(param, `must name a line with travelling-wave or FDTD model: line ${line} is frequency-dependent, whose inside is not computed (probe its ends)`, line);
          const ml = plan.modal[l];
          const rec: PointRec = { line: l, positionM, kf: new Int32Array(ml.n), ff: new Float64Array(ml.n), kb: new Int32Array(ml.n), fb: new Float64Array(ml.n) };
          for (let m = 0; m < ml.n; m++) {
            const d = plan.delays[plan.lineModeOff[l] + m];
            const total = d.k + d.f;
            const sf = (positionM / len) * total;
            const sb = total - sf;
            rec.kf[m] = Math.floor(sf + 1e-9);
            rec.ff[m] = Math.max(0, sf - rec.kf[m]);
            rec.kb[m] = Math.floor(sb + 1e-9);
            rec.fb[m] = Math.max(0, sb - rec.kb[m]);
          }
          const seg = plan.fdtd.find((f) => f.line === l);
          if (seg) rec.zNode = fdtdNodeCoordinate(seg.zNodeM, seg.dzM, seg.cells, positionM);
          points.push(rec);
          return (points.length - 1) as PointHandle;
        },
        conductorsOf(line, param) {
          const l = lineIndex.get(line);
          if (l === undefined) throw fail(param, `must name a line: ${[...lineIndex.keys()].join(', ')}`, line);
          return sc.lines[l].conductors;
        },
        lineLength(line, param) {
          const l = lineIndex.get(line);
          if (l === undefined) throw fail(param, `must name a line: ${[...lineIndex.keys()].join(', ')}`, line);
          return sc.lines[l].lengthM;
        },
        part(id, param) {
          const k = partIndex.get(id);
          if (k === undefined) throw fail(param, `must name a part: ${[...partIndex.keys()].join(', ') || '(none)'}`, id);
          partsWanted = true;
          return k as PartHandle;
        },
        trace(name, unit) {
          traceNames.push(`${pr.id}.${name}`);
          traceUnits.push(unit);
          traceProbes.push(pr.id);
          return (traceNames.length - 1) as TraceHandle;
        },
        useLedger() {
          ledgerWanted = true;
        },
      };
      let inst: ProbeInstance;
      try {
        inst = await plugin.create(pr.params as never, ctx);
      } catch (e) {
        if (e instanceof SkeinError) throw e;
        throw new PluginError(pr.type, 'create', e, { part: pr.id });
      }
      probes.push({ id: pr.id, type: pr.type, inst });
    }
  } catch (e) {
    failure = e;
    finishAll();
    throw e;
  }

  const nT = traceNames.length;
  const traceData = new Float64Array(Math.max(1, nT * plan.nSamples));
  const traces = ndarray(traceData, [nT, plan.nSamples]);
  const partV = new Float64Array(plan.parts.length);
  const partI = new Float64Array(plan.parts.length);
  const partU = new Float64Array(plan.parts.length);
  const ledger: Ledger | undefined = ledgerWanted ? createLedger(plan) : undefined;
  const runs = kernelRuns(plan);
  let step = 0;
  let tS = 0;
  let sample = 0;
  const outVal = (p: number): number => plan.wave[plan.pOut[p] + (step & plan.pOutMask[p])];
  const interp = (off: number, mask: number, k: number, f: number): number => {
    const i1 = step - k;
    return (1 - f) * plan.wave[off + (i1 & mask)] + (f > 0 ? f * plan.wave[off + ((i1 - 1) & mask)] : 0);
  };
  const fdtdByLine = new Map(plan.fdtd.map((f) => [f.line, f]));
  const fdByLine = new Map(plan.fdLines.map((f) => [f.line, f]));
  const pointWave = (h: PointHandle, k: number, current: boolean): number => {
    const rec = points[h];
    const fd = fdtdByLine.get(rec.line);
    if (fd) {
      // FDTD segment: voltages on nodes, currents at cell centres (half a step older), linear in z.
      const z = rec.zNode!;
      if (!current) {
        const c = Math.min(fd.cells - 1, Math.floor(z));
        const t = z - c;
        return (1 - t) * fd.V[c * fd.n + k] + t * fd.V[(c + 1) * fd.n + k];
      }
      const zc = Math.min(fd.cells - 1, Math.max(0, z - 0.5));
      const c = Math.min(fd.cells - 2, Math.floor(zc));
      if (fd.cells === 1 || c < 0) return fd.I[k];
      const t = zc - c;
      return (1 - t) * fd.I[c * fd.n + k] + t * fd.I[(c + 1) * fd.n + k];
    }
    const ml = plan.modal[rec.line];
    const n = ml.n;
    let acc = 0;
    for (let m = 0; m < n; m++) {
      const q = plan.lineModeOff[rec.line] + m;
      const a = interp(plan.fwdOff[q], plan.ringMask[q], rec.kf[m], rec.ff[m]);
      const b = interp(plan.bwdOff[q], plan.ringMask[q], rec.kb[m], rec.fb[m]);
      acc += current ? (ml.Ti[k * n + m] * (a - b)) / ml.Zm[m] : ml.Tv[k * n + m] * (a + b);
    }
    return acc;
  };
  const emptyLedger: LedgerView = {
    delivered: new Map(), absorbed: new Map(), stored: new Map(), lost: new Map(), deliveredTotalJ: 0, absorbedTotalJ: 0, storedTotalJ: 0, lostTotalJ: 0, residualJ: 0,
  };
  const state: ProbeState = Object.freeze({
    get step() { return step; },
    get tS() { return tS; },
    nodeVoltage: (h: NodeHandle) => plan.x[h],
    portVoltage: (h: PortHandle) => {
      const r = ports[h];
      const n = plan.modal[r.line].n;
      return plan.x[plan.conductorX[plan.lineCondOff[r.line] * 2 + r.end * n + r.conductor]];
    },
    portCurrent: (h: PortHandle) => {
      const r = ports[h];
      const fd = fdtdByLine.get(r.line);
      if (fd) return fd.iEnd[r.end * fd.n + r.conductor];
      const fl = fdByLine.get(r.line);
      if (fl) return fl.iEnd[r.end * fl.n + r.conductor];
      const ml = plan.modal[r.line];
      const n = ml.n;
      const p0 = plan.lineEndPort[2 * r.line + r.end];
      let acc = 0;
      // The incident wave is read back from its ring (not from plan.inc) so that a replay of an
      // earlier step, as in partitioned runs, sees the same value.
      for (let m = 0; m < n; m++) {
        const q = p0 + m;
        const w = interp(plan.pIn[q], plan.pInMask[q], plan.pK[q], plan.pF[q]);
        acc += (ml.Ti[r.conductor * n + m] * (outVal(q) - w)) / ml.Zm[m];
      }
      return acc;
    },
    pointVoltage: (h: PointHandle, k: number) => pointWave(h, k, false),
    pointCurrent: (h: PointHandle, k: number) => pointWave(h, k, true),
    partVoltage: (h: PartHandle) => partV[h],
    partCurrent: (h: PartHandle) => partI[h],
    ledger: () => (ledger ? refreshLedgerView(plan, ledger, step) : emptyLedger),
    record: (trace: TraceHandle, value: number) => { traceData[trace * plan.nSamples + sample] = value; },
  });

  const timing: Record<string, number> = { compile: compileS, sources: 0, switches: 0, fdtd: 0, junctions: 0, newton: 0, parts: 0, probes: 0 };
  const progressEvery = Math.max(1, Math.floor(plan.nSteps / 100));
  const tStart = performance.now();
  const observe = (n: number, partsReady: boolean): void => {
    step = n;
    tS = n * plan.dtS;
    const t1 = performance.now();
    if (!partsReady && needParts) computeParts(plan, partV, partI, partU);
    if (ledger) accumulateLedger(plan, ledger, partV, partI, partU);
    const t2 = performance.now();
    timing.parts += t2 - t1;
    if (n % plan.recordEvery === 0) {
      for (let k = 0; k < probes.length; k++) probes[k].inst.sample(state);
      sample++;
      timing.probes += performance.now() - t2;
    }
    if (n % CHECK_EVERY === 0 || n === plan.nSteps) checkFinite(plan, n, tS);
    if (options.onProgress && n % progressEvery === 0) options.onProgress(n / plan.nSteps, n, plan.nSteps);
  };
  const needParts = ledgerWanted || partsWanted;
  const driver = options.driver ?? serialDriver(runs, needParts);
  try {
    await driver.run(plan, { observe, timing, partV, partI, partU });
  } catch (e) {
    failure = e instanceof SkeinError ? e : new PluginError('(step)', 'step', e, { step, timeS: tS });
    finishAll();
    throw failure;
  }
  const loopS = (performance.now() - tStart) / 1000;
  for (const k of Object.keys(timing)) if (k !== 'compile' && k !== 'workerSetup' && !k.startsWith('worker')) timing[k] /= 1000;
  timing.loop = loopS - (timing.workerSetup ?? 0);
  const outputs = finishAll();

  const dtRec = plan.dtS * plan.recordEvery;
  const peaks: TracePeak[] = traceNames.map((name, i) => {
    const row = traces.pick(i, null);
    const max = ops.sup(row);
    const min = ops.inf(row);
    const at = Math.abs(max) >= Math.abs(min) ? ops.argmax(row)[0] : ops.argmin(row)[0];
    return { trace: name, unit: traceUnits[i], max, min, atS: at * dtRec };
  });
  let ledgerTotals: RunResult['ledger'];
  if (ledger) {
    const v = refreshLedgerView(plan, ledger, plan.nSteps);
    ledgerTotals = { deliveredJ: v.deliveredTotalJ, absorbedJ: v.absorbedTotalJ, storedJ: v.storedTotalJ, lostJ: v.lostTotalJ, residualJ: v.residualJ };
  }
  return {
    title: sc.title,
    digest: sc.digest,
    dtS: plan.dtS,
    nSteps: plan.nSteps,
    recordEvery: plan.recordEvery,
    nSamples: plan.nSamples,
    traceNames, traceUnits, traceProbes, traces, outputs, peaks,
    ledger: ledgerTotals,
    warnings,
    lines: deriveLines(plan),
    delays: plan.delays,
    timing,
    network: summariseNetwork(sc),
  };
}

/** The default driver: every phase on this thread, one step at a time. */
function serialDriver(runs: Int32Array, needParts: boolean): StepDriver {
  return {
    async run(plan, io) {
      const { timing, partV, partI, partU } = io;
      for (let n = 0; n <= plan.nSteps; n++) {
        const tS = n * plan.dtS;
        let t1 = performance.now();
        phaseSources(plan, tS);
        let t2 = performance.now();
        timing.sources += t2 - t1;
        if (plan.varying.length > 0) {
          phaseSwitches(plan, tS);
          t1 = performance.now();
          timing.switches += t1 - t2;
          t2 = t1;
        }
        if (plan.fdLines.length > 0) phaseFdBefore(plan, n);
        if (plan.fdtd.length > 0) {
          phaseFdtdBefore(plan);
          t1 = performance.now();
          timing.fdtd += t1 - t2;
          t2 = t1;
        }
        phaseJunctions(plan, runs, n);
        t1 = performance.now();
        timing.junctions += t1 - t2;
        if (plan.nonlinear.length > 0) {
          phaseNonlinear(plan, n, tS);
          t2 = performance.now();
          timing.newton += t2 - t1;
        }
        if (plan.fdtd.length > 0) phaseFdtdAfter(plan);
        if (plan.fdLines.length > 0) phaseFdAfter(plan, n);
        // Branch values are needed by accept hooks, the ledger and part probes only.
        if (needParts || plan.acceptLoads.length > 0) computeParts(plan, partV, partI, partU);
        acceptParts(plan, tS, partV, partI);
        if (plan.nonlinear.length > 0) acceptNonlinear(plan, tS);
        io.observe(n, true);
      }
    },
  };
}

function safeFinish(f: () => void, plugin: string, warnings: string[]): void {
  try {
    f();
  } catch (e) {
    warnings.push(`plugin ${plugin}, hook finish: ${(e as Error).message}`);
  }
}

function checkFinite(plan: Plan, step: number, tS: number): void {
  let s = 0;
  const x = plan.x;
  for (let i = 0; i < x.length; i++) s += x[i];
  if (Number.isFinite(s)) return;
  for (let j = 0; j < plan.nJunctions; j++) {
    for (let i = plan.jX[j]; i < plan.jX[j + 1]; i++) {
      if (!Number.isFinite(x[i])) {
        const jn = plan.scenario.junctions[j];
        const local = i - plan.jX[j];
        throw nonFinite(step, tS, `junction ${jn.id}, ${local < jn.nodes.length ? `node ${jn.nodes[local]}` : 'a constraint current'}`);
      }
    }
  }
}

/** Derived per-line data (velocities, delays, Zc). */
export function deriveLines(plan: Plan): LineDerived[] {
  return plan.scenario.lines.map((l, i) => ({
    id: l.id,
    conductors: l.conductors,
    lengthM: l.lengthM,
    velocitiesMps: Array.from(plan.modal[i].velocities),
    delaysS: Array.from(plan.modal[i].velocities, (v) => l.lengthM / v),
    modalImpedancesOhm: Array.from(plan.modal[i].Zm),
    zcOhm: Array.from(plan.modal[i].Zc),
    origin: l.origin,
  }));
}

/** Plain summary of the network (names only). */
export function summariseNetwork(sc: ResolvedScenario): NetworkSummary {
  const nodeName = (j: number, k: number): string => (k < 0 ? 'ref' : sc.junctions[j].nodes[k]);
  return {
    lines: sc.lines.map((l) => ({ id: l.id, from: sc.junctions[l.from].id, to: sc.junctions[l.to].id, lengthM: l.lengthM, conductors: l.conductors })),
    junctions: sc.junctions.map((j) => ({
      id: j.id,
      nodes: j.nodes,
      parts: j.parts.map((p) => ({ id: p.id, role: p.role, type: p.type, between: [nodeName(j.index, p.plus), nodeName(j.index, p.minus)] as [string, string] })),
    })),
    probes: sc.probes.map((p) => ({ id: p.id, type: p.type })),
  };
}
