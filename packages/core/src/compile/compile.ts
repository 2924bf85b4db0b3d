/**
 * The compile step: from a resolved scenario to a Plan of flat typed arrays. Every check, lookup,
 * plugin setup and allocation happens here, before the first step; the stepping kernel then reads
 * the arrays through precomputed offsets only.
 */
import { LuDecomposition, Matrix, inverse } from 'ml-matrix';
import { badInput, bug, PluginError, singularJunction } from '../errors.ts';
import { decomposeLine, type ModalLine } from '../line/modal.ts';
import { layRings } from './rings.ts';
import { couplingOverBand, type ModalCoupling } from '../line/fdModal.ts';
import { createFdtdLine, type FdtdLine } from './fdtd.ts';
import { createFdtdProfileLine, profileCells, type CellProfile } from './fdtdProfile.ts';
import { createFdRuntime, fitLine, shortestFdDelay, type FdRuntime } from './fdRuntime.ts';
import type { ResolvedJunction, ResolvedPart, ResolvedScenario } from '../model.ts';
import type { LinearLoadInstance, LoadInstance, NonlinearLoadInstance, SetupContext, WaveformInstance } from '../plugins/api.ts';
import type { PluginRegistry } from '../plugins/registry.ts';
import { formatQuantity } from '../units.ts';

/** Delay of one mode of one line, as the run quantises it. */
export interface DelayInfo {
  line: string;
  mode: number;
  velocityMps: number;
  delayS: number;
  /** Whole steps k and fraction f: delay = (k + f) dt (f = 0 when rounded). */
  k: number;
  f: number;
  /** True when the line is stepped by an FDTD segment (k and f then only describe its delay). */
  fdtd: boolean;
  /** |delay used - true delay| [s] (nonzero only with time.delays: round). */
  timingErrorS: number;
  /**
   * Amplitude error of the linear delay interpolation at the sources' bandwidth (0.35 / shortest
   * feature): 1 - |1 - f + f exp(-j w dt)|.
   */
  interpolationLoss: number;
}

/** How each lumped part takes part in a step. */
export interface CompiledPart {
  index: number;
  part: ResolvedPart;
  /** 'norton': voltage drive with series R; 'vsource': ideal voltage drive; 'isource': current drive. */
  mode: 'norton' | 'vsource' | 'isource' | 'linear' | 'short' | 'nonlinear';
  /** Global x index of the plus and minus nodes (-1: reference). */
  xPlus: number;
  xMinus: number;
  /** Global x index of the constraint current (vsource, short), else -1. */
  xConstraint: number;
  /** Conductance used for the branch current [S]. */
  g: number;
  /** Slot holding the waveform value (sources) or history current (linear loads with history), else -1. */
  slot: number;
  load: LoadInstance | undefined;
  waveform: number;
}

/** A waveform evaluated once per step into a slot. */
export interface CompiledWaveform {
  type: string;
  instance: WaveformInstance;
  slot: number;
  parts: string[];
}

/** A device of a nonlinear junction, solved by Newton's method each step. */
export interface NonlinearDevice {
  part: CompiledPart;
  instance: NonlinearLoadInstance;
  /** Junction-local rows of the plus and minus node (-1: reference). */
  rowPlus: number;
  rowMinus: number;
  /** Branch voltage [V] and current [A] of the last converged step. */
  v: number;
  i: number;
}

/** A junction holding nonlinear devices: its linear part and the devices. */
export interface NonlinearJunction {
  junction: number;
  R: number;
  /** Linear part of the junction matrix (R x R), without devices and time-varying loads. */
  base: Float64Array;
  devices: NonlinearDevice[];
  /** Time-varying linear loads at this junction (stamped each iteration, never inverted). */
  varying: VaryingJunction['loads'];
  a: Float64Array;
  b: Float64Array;
  rhs0: Float64Array;
  out: Float64Array;
}

/** A junction whose matrix changes with time (a switch). */
export interface VaryingJunction {
  junction: number;
  /** Base matrix without the varying loads, (R x R) row-major. */
  base: Float64Array;
  /** Scratch for base + stamps, inverted in place. */
  assembled: Float64Array;
  R: number;
  loads: Array<{ part: CompiledPart; instance: LinearLoadInstance; rowPlus: number; rowMinus: number; g: number }>;
}

/** Everything a run needs, as flat arrays plus the per-run plugin objects. */
export interface Plan {
  scenario: ResolvedScenario;
  dtS: number;
  nSteps: number;
  recordEvery: number;
  nSamples: number;
  modal: ModalLine[];
  delays: DelayInfo[];
  warnings: string[];
  nJunctions: number;
  /** Junction j owns modal ports [jPort[j], jPort[j+1]) and x entries [jX[j], jX[j+1]). */
  jPort: Int32Array;
  jX: Int32Array;
  jN: Int32Array;
  jB: Int32Array;
  jK: Int32Array;
  jA: Int32Array;
  jEx: Int32Array;
  /** 1 where every line end at the junction has one conductor (fast path). */
  jScalar: Uint8Array;
  nPorts: number;
  pIn: Int32Array;
  pInMask: Int32Array;
  pK: Int32Array;
  pF: Float64Array;
  pOut: Int32Array;
  pOutMask: Int32Array;
  /** Scalar path: local node of the port and 2 / Z. */
  pNode: Int32Array;
  pY2: Float64Array;
  pLine: Int32Array;
  pEnd: Uint8Array;
  pMode: Int32Array;
  /** First modal port of line l at end e: lineEndPort[2 l + e]. */
  lineEndPort: Int32Array;
  /** Global x index of the node that conductor k of line l at end e sits on: conductorX[lineCondOff[l] * 2 + e * n + k]. */
  conductorX: Int32Array;
  lineCondOff: Int32Array;
  /** Forward (written at the from end) and backward ring buffer of each line mode: offsets and masks. */
  fwdOff: Int32Array;
  bwdOff: Int32Array;
  ringMask: Int32Array;
  /** First mode of line l in the per-mode arrays. */
  lineModeOff: Int32Array;
  exRow: Int32Array;
  exSlot: Int32Array;
  exCoef: Float64Array;
  slot: Float64Array;
  mat: Float64Array;
  wave: Float64Array;
  rhs: Float64Array;
  inc: Float64Array;
  x: Float64Array;
  parts: CompiledPart[];
  waveforms: CompiledWaveform[];
  /** Loads whose history or accept hook runs each step. */
  historyLoads: CompiledPart[];
  acceptLoads: CompiledPart[];
  varying: VaryingJunction[];
  nonlinear: NonlinearJunction[];
  /** FDTD segments (lossy lines). */
  fdtd: FdtdLine[];
  /** Frequency-dependent lines. */
  fdLines: FdRuntime[];
  /** Branch current of each nonlinear part at the last converged step [A], by part index. */
  nlCurrent: Float64Array;
  /** 1 where the junction is solved by Newton's method (outside the kernels). */
  jNonlinear: Uint8Array;
  /** Scratch for re-factoring a varying junction. */
  work: Float64Array;
}

/** Options of the compile step. */
export interface CompileOptions {
  registry: PluginRegistry;
  /** Collects warnings; default: into plan.warnings only. */
  onWarning?: (message: string) => void;
}

const MIN_DELAY_STEPS = 1;
/** Neglected modal coupling of a constant transformation above which compile warns (line/fdModal.ts). */
export const FD_COUPLING_WARN = 0.01;

/**
 * Compiles a resolved scenario: modal decomposition, time step, delays, junction matrices, plugin
 * instances and all flat arrays.
 * @throws InputError for a time step longer than a line delay; NumericalError for a singular junction;
 *   PluginError when a plugin's setup fails.
 */
export async function compileScenario(scenario: ResolvedScenario, options: CompileOptions): Promise<Plan> {
  const warnings: string[] = [];
  const warn = (m: string): void => {
    warnings.push(m);
    options.onWarning?.(m);
  };
  const { registry } = options;
  // Frequency-dependent lines are fitted first: their fitted delay bounds the time step.
  const fdModels = new Map<number, ReturnType<typeof fitLine>>();
  for (const l of scenario.lines) {
    if (l.frequencyDependent && l.section) fdModels.set(l.index, fitLine(l.section, l.lengthM, { modalFrequencyHz: l.fdModalFrequencyHz }));
  }
  for (const l of scenario.lines) {
    if (l.section && !l.frequencyDependent) warn(`line ${l.id}: the time-domain solver uses the section's high-frequency L and C; its conductor, dielectric and earth losses are left out`);
  }
  // Lines of one cable type share one decomposition (a harness has thousands of branches of a
  // few types); the modal data is read-only after this point.
  const modalByMatrices = new Map<string, ModalLine>();
  const modal = scenario.lines.map((l) => {
    const key = `${l.L.join(',')}|${l.C.join(',')}`;
    let m = modalByMatrices.get(key);
    if (!m) {
      m = decomposeLine(l.L, l.C);
      modalByMatrices.set(key, m);
    }
    return m;
  });
  // Lines whose parameters vary along them: their cells, whose fastest bounds the time step.
  const profiles = new Map<number, CellProfile>();
  for (const l of scenario.lines) if (l.profile && l.fdtdCells !== undefined) profiles.set(l.index, profileCells(l, l.fdtdCells));

  // Shortest delay per line mode.
  let minDelay = Infinity;
  let minWhere = '';
  scenario.lines.forEach((l, i) => {
    const prof = profiles.get(l.index);
    if (prof) {
      if (prof.minDelayS < minDelay) {
        minDelay = prof.minDelayS;
        minWhere = `FDTD cell ${prof.minCell + 1} of line ${l.id} at its fastest mode's speed`;
      }
      return;
    }
    modal[i].velocities.forEach((v, m) => {
      // An FDTD segment's limit is one cell at the fastest mode (the Courant condition); a
      // frequency-dependent line's is its fitted delay.
      const fm = fdModels.get(l.index);
      const d = fm ? shortestFdDelay(fm) : l.fdtdCells !== undefined ? l.lengthM / l.fdtdCells / v : l.lengthM / v;
      if (d < minDelay) {
        minDelay = d;
        minWhere = l.fdtdCells !== undefined ? `one FDTD cell of line ${l.id} at its mode ${m + 1} speed` : `line ${l.id}, mode ${m + 1}`;
      }
    });
  });

  // Sources first (their shortest feature sets the automatic step), all in scenario order.
  const provisionalDt = scenario.time.stepS ?? minDelay;
  const ctxFor = (id: string, dtS: number): SetupContext => ({ dtS, endS: scenario.time.endS, id, warn: (m) => warn(`${id}: ${m}`) });
  const waveformKeys = new Map<string, number>();
  const waveformDefs: Array<{ type: string; params: Record<string, unknown>; parts: string[] }> = [];
  const partWaveform = new Map<string, number>();
  for (const j of scenario.junctions) {
    for (const p of j.parts) {
      if (p.role !== 'source') continue;
      const key = `${p.type}:${JSON.stringify(p.params)}`;
      let w = waveformKeys.get(key);
      if (w === undefined) {
        w = waveformDefs.length;
        waveformKeys.set(key, w);
        waveformDefs.push({ type: p.type, params: p.params, parts: [] });
      }
      waveformDefs[w].parts.push(p.id);
      partWaveform.set(p.id, w);
    }
  }
  const waveformInstances: WaveformInstance[] = [];
  for (const def of waveformDefs) {
    const plugin = registry.sources.get(def.type)?.plugin;
    if (!plugin) throw bug(`source type ${def.type} passed resolution but is not registered`);
    try {
      waveformInstances.push(await plugin.create(def.params as never, ctxFor(def.parts.join(','), provisionalDt)));
    } catch (e) {
      throw new PluginError(def.type, 'create', e, { part: def.parts.join(', ') });
    }
  }

  // Time step.
  let dtS: number;
  if (scenario.time.stepS !== undefined) {
    dtS = scenario.time.stepS;
    if (dtS > minDelay * (1 + 1e-12)) {
      throw badInput(['time', 'step'], `must be at most the shortest line delay, ${formatQuantity(minDelay, 's')} (${minWhere})`, formatQuantity(dtS, 's'), 'E_STEP_TOO_LONG', scenario.locate(['time', 'step']));
    }
  } else {
    let feature = Infinity;
    for (const w of waveformInstances) if (w.shortestFeatureS !== undefined && w.shortestFeatureS > 0) feature = Math.min(feature, w.shortestFeatureS);
    let target = Math.min(minDelay / MIN_DELAY_STEPS, feature / scenario.time.stepsPerFeature, scenario.time.endS / 100);
    target = Math.max(target, scenario.time.endS / 5e7);
    const stepsInMin = Math.max(1, Math.ceil(minDelay / target - 1e-9));
    dtS = minDelay / stepsInMin;
  }
  const nSteps = Math.max(1, Math.round(scenario.time.endS / dtS));
  const recordEvery = scenario.time.recordEvery;
  const nSamples = Math.floor(nSteps / recordEvery) + 1;
  let bandwidth = Infinity;
  for (const w of waveformInstances) if (w.shortestFeatureS) bandwidth = Math.min(bandwidth, w.shortestFeatureS);
  const fBw = Number.isFinite(bandwidth) ? 0.35 / bandwidth : 0.1 / dtS;
  // The constant transformation of a multiconductor frequency-dependent line neglects its modes'
  // coupling (line/fdModal.ts), measured over the band the run resolves: from 1 / (end time) to
  // the Nyquist frequency 1 / (2 dt). A coupling c perturbs a mode's gamma^2 by the fraction c to
  // first order; on a 3 km unsymmetric overhead line the transient's error was about three times c
  // (test/transient-vs-spectral/multiconductorFd.spec.ts), so 1 % is worth a warning.
  const fdCoupling = new Map<number, ModalCoupling>();
  for (const [index, fm] of fdModels) {
    const l = scenario.lines[index];
    if (fm.n < 2 || !l.section) continue;
    const c = couplingOverBand(l.section, fm.transform, Math.min(1 / scenario.time.endS, 0.5 / dtS), 0.5 / dtS);
    fdCoupling.set(index, c);
    if (c.max > FD_COUPLING_WARN) {
      warn(`line ${l.id}: the constant modal transformation (at ${formatQuantity(fm.transform.fHz, 'Hz')}) leaves modes ${c.modes[0]} and ${c.modes[1]} coupled by ${(c.max * 100).toFixed(1)} % at ${formatQuantity(c.atHz, 'Hz')}, within the band the run resolves (${formatQuantity(c.bandHz[0], 'Hz')} to ${formatQuantity(c.bandHz[1], 'Hz')}): the line's modes turn with frequency and the transient drifts from the exact solution; set the line's modalFrequency to the transient's dominant frequency`);
    }
  }

  // Delays and ring buffers.
  const delays: DelayInfo[] = [];
  const lineModeOff = new Int32Array(scenario.lines.length + 1);
  scenario.lines.forEach((l, i) => { lineModeOff[i + 1] = lineModeOff[i] + modal[i].n; });
  const nModes = lineModeOff[scenario.lines.length];
  const fwdOff = new Int32Array(nModes);
  const bwdOff = new Int32Array(nModes);
  const ringMask = new Int32Array(nModes);
  const modeK = new Int32Array(nModes);
  const modeF = new Float64Array(nModes);
  scenario.lines.forEach((l, i) => {
    modal[i].velocities.forEach((v, m) => {
      const d = l.lengthM / v;
      const steps = d / dtS;
      let k: number;
      let f: number;
      if (scenario.time.delays === 'round') {
        k = Math.max(MIN_DELAY_STEPS, Math.round(steps));
        f = 0;
      } else {
        k = Math.floor(steps + 1e-9);
        f = steps - k;
        if (f < 1e-9) f = 0;
        if (k < MIN_DELAY_STEPS && l.fdtdCells === undefined && !l.frequencyDependent) {
          throw bug(`delay of ${l.id} mode ${m + 1} is ${steps} steps although the step was checked against the shortest delay`);
        }
      }
      const q = lineModeOff[i] + m;
      modeK[q] = k;
      modeF[q] = f;
      const wdt = 2 * Math.PI * fBw * dtS;
      const re = 1 - f + f * Math.cos(wdt);
      const im = -f * Math.sin(wdt);
      delays.push({
        line: l.id, mode: m + 1, velocityMps: v, delayS: d, k, f, fdtd: l.fdtdCells !== undefined || l.frequencyDependent === true,
        timingErrorS: Math.abs((k + f) * dtS - d),
        interpolationLoss: 1 - Math.hypot(re, im),
      });
    });
  });
  // Ring buffers of every mode (rings.ts; partitioned runs widen them per line after compile).
  const waveLen = layRings(lineModeOff, modeK, undefined, fwdOff, bwdOff, ringMask);
  // A loop, not a spread: a large network has more delays than the argument limit.
  let worstLoss = 0;
  for (const d of delays) if (!d.fdtd && d.interpolationLoss > worstLoss) worstLoss = d.interpolationLoss;
  if (worstLoss > 0.01) {
    warn(`delay interpolation attenuates the sources' bandwidth (${formatQuantity(fBw, 'Hz')}) by up to ${(worstLoss * 100).toFixed(2)} %; a shorter time.step or lengths that are whole multiples of it reduce this`);
  }
  if (scenario.time.delays === 'round') {
    const worst = delays.filter((d) => !d.fdtd).concat(delays.slice(0, 1)).reduce((a, d) => (d.timingErrorS / d.delayS > a.timingErrorS / a.delayS ? d : a), delays[0]);
    if (worst.timingErrorS / worst.delayS > 0.01) warn(`rounding delays to whole steps changes ${worst.line} mode ${worst.mode} by ${((worst.timingErrorS / worst.delayS) * 100).toFixed(2)} %`);
  }

  // Ports, in junction order; each junction's line ends in the order they were wired.
  const nJ = scenario.junctions.length;
  const jPort = new Int32Array(nJ + 1);
  const jX = new Int32Array(nJ + 1);
  const jN = new Int32Array(nJ);
  const jB = new Int32Array(nJ);
  const jK = new Int32Array(nJ);
  const jA = new Int32Array(nJ);
  const jEx = new Int32Array(nJ + 1);
  const jScalar = new Uint8Array(nJ);
  const jNonlinear = new Uint8Array(nJ);
  const nonlinear: NonlinearJunction[] = [];
  const lineEndPort = new Int32Array(scenario.lines.length * 2).fill(-1);
  const lineCondOff = new Int32Array(scenario.lines.length + 1);
  scenario.lines.forEach((l, i) => { lineCondOff[i + 1] = lineCondOff[i] + l.conductors.length; });
  const conductorX = new Int32Array(lineCondOff[scenario.lines.length] * 2).fill(-1);

  interface EndRef { line: number; end: 0 | 1; nodes: Int32Array }
  const fdtdEnds: EndRef[][] = scenario.junctions.map(() => []);
  const junctionEnds: EndRef[][] = scenario.junctions.map((j, ji) => {
    const ends: EndRef[] = [];
    for (const p of j.ports) {
      if (scenario.lines[p.line].fdtdCells !== undefined || scenario.lines[p.line].frequencyDependent) {
        let e = fdtdEnds[ji].find((x) => x.line === p.line && x.end === p.end);
        if (!e) {
          e = { line: p.line, end: p.end, nodes: new Int32Array(scenario.lines[p.line].conductors.length).fill(-1) };
          fdtdEnds[ji].push(e);
        }
        e.nodes[p.conductor] = p.node;
        continue;
      }
      let e = ends.find((x) => x.line === p.line && x.end === p.end);
      if (!e) {
        e = { line: p.line, end: p.end, nodes: new Int32Array(scenario.lines[p.line].conductors.length).fill(-1) };
        ends.push(e);
      }
      e.nodes[p.conductor] = p.node;
    }
    return ends;
  });

  // Constraint rows (ideal voltage drives, shorts) per junction.
  const loadInstances = new Map<string, LoadInstance>();
  for (const j of scenario.junctions) {
    for (const p of j.parts) {
      if (p.role !== 'load') continue;
      const plugin = registry.loads.get(p.type)?.plugin;
      if (!plugin) throw bug(`load type ${p.type} passed resolution but is not registered`);
      let inst: LoadInstance;
      try {
        inst = await plugin.create(p.params as never, ctxFor(p.id, dtS));
      } catch (e) {
        throw new PluginError(p.type, 'create', e, { part: p.id });
      }
      if (inst.kind === 'linear' && !(inst.conductanceS >= 0 && Number.isFinite(inst.conductanceS))) {
        throw new PluginError(p.type, 'create', new Error(`companion conductance must be finite and non-negative, got ${inst.conductanceS}`), { part: p.id });
      }
      loadInstances.set(p.id, inst);
    }
  }

  let nPorts = 0;
  let nX = 0;
  let nEx = 0;
  let matLen = 0;
  let maxR = 0;
  const jRows: number[] = [];
  scenario.junctions.forEach((j, ji) => {
    let M = 0;
    for (const e of junctionEnds[ji]) M += modal[e.line].n;
    const Q = j.parts.filter((p) => (p.role === 'source' && p.drive === 'voltage' && p.resistanceOhm === 0) || loadInstances.get(p.id)?.kind === 'short').length;
    const N = j.nodes.length;
    const R = N + Q;
    jRows.push(R);
    maxR = Math.max(maxR, R);
    jPort[ji] = nPorts;
    nPorts += M;
    jX[ji] = nX;
    nX += R;
    jN[ji] = N;
    jB[ji] = matLen;
    matLen += R * M;
    jK[ji] = matLen;
    matLen += R * R;
    jA[ji] = matLen;
    matLen += M * N;
    jScalar[ji] = junctionEnds[ji].every((e) => modal[e.line].n === 1) ? 1 : 0;
  });
  jPort[nJ] = nPorts;
  jX[nJ] = nX;

  const pIn = new Int32Array(nPorts);
  const pInMask = new Int32Array(nPorts);
  const pK = new Int32Array(nPorts);
  const pF = new Float64Array(nPorts);
  const pOut = new Int32Array(nPorts);
  const pOutMask = new Int32Array(nPorts);
  const pNode = new Int32Array(nPorts);
  const pY2 = new Float64Array(nPorts);
  const pLine = new Int32Array(nPorts);
  const pEnd = new Uint8Array(nPorts);
  const pMode = new Int32Array(nPorts);
  const mat = new Float64Array(matLen);

  // Parts: slots and excitation entries.
  const parts: CompiledPart[] = [];
  const exRowL: number[] = [];
  const exSlotL: number[] = [];
  const exCoefL: number[] = [];
  let nSlots = waveformDefs.length;
  const varying: VaryingJunction[] = [];
  const fdtd: FdtdLine[] = [];
  const fdtdOf = new Map<number, FdtdLine>();
  const fdLines: FdRuntime[] = [];
  const fdOf = new Map<number, FdRuntime>();
  for (const [line, model] of fdModels) {
    const f = createFdRuntime(line, model, dtS, nSlots, fdCoupling.get(line));
    nSlots += 2 * f.n;
    fdLines.push(f);
    fdOf.set(line, f);
  }
  for (const l of scenario.lines) {
    if (l.fdtdCells === undefined) continue;
    const prof = profiles.get(l.index);
    if (prof) {
      if (dtS > prof.minDelayS * (1 + 1e-12)) {
        const dz = prof.dzM[prof.minCell];
        const v = prof.vMaxMps[prof.minCell];
        const at = prof.minWhere.slice(l.path.length).map((x) => (typeof x === 'number' ? `[${x}]` : `.${x}`)).join('').slice(1);
        throw badInput([...l.path, 'fdtd', 'cells'], `gives its fastest cell (cell ${prof.minCell + 1}, in ${at}: ${formatQuantity(dz, 'm')} at ${formatQuantity(v, 'm/s')}) a delay of ${formatQuantity(prof.minDelayS, 's')}, shorter than the time step ${formatQuantity(dtS, 's')} (the Courant condition needs dt <= dz / v in every cell); use fewer cells or a shorter step`, l.fdtdCells, 'E_FDTD_COURANT', scenario.locate([...l.path, 'fdtd', 'cells']));
      }
      const f = createFdtdProfileLine(l, prof, dtS, nSlots);
      nSlots += 2 * f.n;
      fdtd.push(f);
      fdtdOf.set(l.index, f);
      continue;
    }
    const vmax = Math.max(...modal[l.index].velocities);
    const dz = l.lengthM / l.fdtdCells;
    if (dtS > (dz / vmax) * (1 + 1e-12)) {
      throw badInput([...l.path, 'fdtd', 'cells'], `gives cells of ${formatQuantity(dz, 'm')}, too short for the time step ${formatQuantity(dtS, 's')} (the Courant condition needs dt <= dz / v = ${formatQuantity(dz / vmax, 's')}); use fewer cells or a shorter step`, l.fdtdCells, 'E_FDTD_COURANT', scenario.locate([...l.path, 'fdtd', 'cells']));
    }
    const f = createFdtdLine(l, l.fdtdCells, dtS, nSlots);
    nSlots += 2 * f.n;
    fdtd.push(f);
    fdtdOf.set(l.index, f);
  }

  for (let ji = 0; ji < nJ; ji++) {
    const j = scenario.junctions[ji];
    const R = jRows[ji];
    const N = j.nodes.length;
    const A = new Float64Array(R * R);
    const exStart = exRowL.length;
    const stamp = (a: number, b: number, g: number): void => {
      if (a >= 0) A[a * R + a] += g;
      if (b >= 0) A[b * R + b] += g;
      if (a >= 0 && b >= 0) {
        A[a * R + b] -= g;
        A[b * R + a] -= g;
      }
    };
    // Line ends.
    let q = jPort[ji];
    for (const e of junctionEnds[ji]) {
      const ml = modal[e.line];
      const n = ml.n;
      lineEndPort[2 * e.line + e.end] = q;
      for (let k = 0; k < n; k++) conductorX[lineCondOff[e.line] * 2 + e.end * n + k] = jX[ji] + e.nodes[k];
      for (let a = 0; a < n; a++) for (let b = 0; b < n; b++) A[e.nodes[a] * R + e.nodes[b]] += ml.Yc[a * n + b];
      for (let m = 0; m < n; m++) {
        const mode = lineModeOff[e.line] + m;
        const p = q + m;
        pLine[p] = e.line;
        pEnd[p] = e.end;
        pMode[p] = m;
        pK[p] = modeK[mode];
        pF[p] = modeF[mode];
        pIn[p] = e.end === 0 ? bwdOff[mode] : fwdOff[mode];
        pOut[p] = e.end === 0 ? fwdOff[mode] : bwdOff[mode];
        pInMask[p] = ringMask[mode];
        pOutMask[p] = ringMask[mode];
        pNode[p] = n === 1 ? e.nodes[0] : -1;
        pY2[p] = n === 1 ? 2 / ml.Zm[0] : 0;
      }
      q += n;
    }
    // FDTD segment ends: Norton branches g to the reference, history currents through slots.
    for (const e of fdtdEnds[ji]) {
      const fd = fdOf.get(e.line);
      if (fd) {
        // Frequency-dependent line end: Norton branch G (Yc's instantaneous part, in phase
        // quantities) among the end's conductors, history currents through slots.
        const n = fd.n;
        for (let k = 0; k < n; k++) {
          const x = jX[ji] + e.nodes[k];
          fd.xEnd[e.end * n + k] = x;
          conductorX[lineCondOff[e.line] * 2 + e.end * n + k] = x;
          for (let b = 0; b < n; b++) A[e.nodes[k] * R + e.nodes[b]] += fd.G[k * n + b];
          exRowL.push(e.nodes[k]);
          exSlotL.push(fd.slotBase + e.end * n + k);
          exCoefL.push(-1);
        }
        continue;
      }
      const f = fdtdOf.get(e.line)!;
      const n = f.n;
      for (let k = 0; k < n; k++) {
        const x = jX[ji] + e.nodes[k];
        f.xEnd[e.end * n + k] = x;
        conductorX[lineCondOff[e.line] * 2 + e.end * n + k] = x;
        for (let b = 0; b < n; b++) A[e.nodes[k] * R + e.nodes[b]] += f.g[e.end * n * n + k * n + b];
        exRowL.push(e.nodes[k]);
        exSlotL.push(f.slotBase + e.end * n + k);
        exCoefL.push(-1);
      }
    }
    // B (line-end Norton sources) and A (emitted waves), see junctionStep.ts.
    const M = jPort[ji + 1] - jPort[ji];
    q = 0;
    for (const e of junctionEnds[ji]) {
      const ml = modal[e.line];
      const n = ml.n;
      for (let k = 0; k < n; k++) {
        for (let m = 0; m < n; m++) {
          mat[jB[ji] + e.nodes[k] * M + (q + m)] += (2 * ml.Ti[k * n + m]) / ml.Zm[m];
          mat[jA[ji] + (q + m) * N + e.nodes[k]] += ml.TvInv[m * n + k];
        }
      }
      q += n;
    }
    // Lumped parts.
    let nextConstraint = N;
    const varyingLoads: VaryingJunction['loads'] = [];
    const devices: NonlinearDevice[] = [];
    for (const p of j.parts) {
      const xPlus = p.plus >= 0 ? jX[ji] + p.plus : -1;
      const xMinus = p.minus >= 0 ? jX[ji] + p.minus : -1;
      const cp: CompiledPart = { index: parts.length, part: p, mode: 'linear', xPlus, xMinus, xConstraint: -1, g: 0, slot: -1, load: undefined, waveform: -1 };
      const addEx = (row: number, slot: number, coef: number): void => {
        if (row < 0) return;
        exRowL.push(row);
        exSlotL.push(slot);
        exCoefL.push(coef);
      };
      const constraintRow = (): number => {
        const r = nextConstraint++;
        if (p.plus >= 0) { A[p.plus * R + r] += 1; A[r * R + p.plus] += 1; }
        if (p.minus >= 0) { A[p.minus * R + r] -= 1; A[r * R + p.minus] -= 1; }
        return r;
      };
      if (p.role === 'source') {
        const w = partWaveform.get(p.id)!;
        cp.waveform = w;
        cp.slot = w;
        if (p.drive === 'voltage' && p.resistanceOhm === 0) {
          cp.mode = 'vsource';
          const r = constraintRow();
          cp.xConstraint = jX[ji] + r;
          addEx(r, w, 1);
        } else if (p.drive === 'voltage') {
          cp.mode = 'norton';
          cp.g = 1 / p.resistanceOhm;
          stamp(p.plus, p.minus, cp.g);
          addEx(p.plus, w, cp.g);
          addEx(p.minus, w, -cp.g);
        } else {
          cp.mode = 'isource';
          cp.g = Number.isFinite(p.resistanceOhm) ? 1 / p.resistanceOhm : 0;
          if (cp.g > 0) stamp(p.plus, p.minus, cp.g);
          addEx(p.plus, w, 1);
          addEx(p.minus, w, -1);
        }
      } else {
        const inst = loadInstances.get(p.id)!;
        cp.load = inst;
        if (inst.kind === 'nonlinear') {
          cp.mode = 'nonlinear';
          devices.push({ part: cp, instance: inst, rowPlus: p.plus, rowMinus: p.minus, v: 0, i: 0 });
        } else if (inst.kind === 'short') {
          cp.mode = 'short';
          const r = constraintRow();
          cp.xConstraint = jX[ji] + r;
        } else if (inst.kind === 'linear') {
          cp.mode = 'linear';
          cp.g = inst.conductanceS;
          if (inst.conductanceAt) {
            varyingLoads.push({ part: cp, instance: inst, rowPlus: p.plus, rowMinus: p.minus, g: inst.conductanceS });
          } else {
            stamp(p.plus, p.minus, cp.g);
          }
          if (inst.history) {
            cp.slot = nSlots++;
            addEx(p.plus, cp.slot, -1);
            addEx(p.minus, cp.slot, 1);
          }
        }
      }
      parts.push(cp);
    }
    jEx[ji] = exStart;
    jEx[ji + 1] = exRowL.length;
    if (devices.length > 0) {
      jNonlinear[ji] = 1;
      nonlinear.push({
        junction: ji, R, base: A.slice(), devices, varying: varyingLoads,
        a: new Float64Array(R * R), b: new Float64Array(R), rhs0: new Float64Array(R), out: new Float64Array(2),
      });
      continue;
    }
    if (varyingLoads.length > 0) {
      varying.push({ junction: ji, base: A.slice(), assembled: new Float64Array(R * R), R, loads: varyingLoads });
      for (const v of varyingLoads) stamp(v.rowPlus, v.rowMinus, v.g);
    }
    invertJunction(j, A, R, mat, jK[ji]);
  }

  const historyLoads = parts.filter((p) => p.load?.kind === 'linear' && p.load.history !== undefined);
  // Nonlinear devices are accepted by the Newton phase with their converged values.
  const acceptLoads = parts.filter((p) => p.load !== undefined && p.load.kind !== 'nonlinear' && 'accept' in p.load && p.load.accept !== undefined);

  const sharedMat = shareJunctionMatrices(nJ, jPort, jX, jN, jB, jK, jA, mat, varying);
  return {
    scenario, dtS, nSteps, recordEvery, nSamples, modal, delays, warnings,
    nJunctions: nJ, jPort, jX, jN, jB, jK, jA, jEx, jScalar,
    nPorts, pIn, pInMask, pK, pF, pOut, pOutMask, pNode, pY2, pLine, pEnd, pMode,
    lineEndPort, conductorX, lineCondOff, fwdOff, bwdOff, ringMask, lineModeOff,
    exRow: Int32Array.from(exRowL), exSlot: Int32Array.from(exSlotL), exCoef: Float64Array.from(exCoefL),
    slot: new Float64Array(nSlots),
    mat: sharedMat, wave: new Float64Array(waveLen), rhs: new Float64Array(Math.max(1, maxR)), inc: new Float64Array(nPorts), x: new Float64Array(nX),
    parts,
    waveforms: waveformDefs.map((d, i) => ({ type: d.type, instance: waveformInstances[i], slot: i, parts: d.parts })),
    historyLoads, acceptLoads, varying, nonlinear, jNonlinear, fdtd, fdLines, nlCurrent: new Float64Array(parts.length),
    work: new Float64Array(Math.max(1, 2 * maxR * maxR)),
  };
}

/**
 * Junctions with the same matrices (same line types, same parts: most junctions of a harness or
 * a generated grid) share one copy of B, K and A, so the stepping reads a few blocks that stay in
 * cache instead of one block per junction. A junction whose K is re-factored while stepping
 * (time-varying parts) keeps its own. Rewrites jB, jK and jA in place.
 * @returns the compacted matrix store.
 */
function shareJunctionMatrices(
  nJ: number, jPort: Int32Array, jX: Int32Array, jN: Int32Array, jB: Int32Array, jK: Int32Array, jA: Int32Array,
  mat: Float64Array, varying: VaryingJunction[],
): Float64Array {
  const own = new Uint8Array(nJ);
  for (const v of varying) own[v.junction] = 1;
  const byContent = new Map<string, number>();
  const out = new Float64Array(mat.length);
  let len = 0;
  for (let j = 0; j < nJ; j++) {
    const M = jPort[j + 1] - jPort[j];
    const R = jX[j + 1] - jX[j];
    const size = R * M + R * R + M * jN[j];
    const from = jB[j];
    // B, K and A are consecutive (see the layout above).
    const block = mat.subarray(from, from + size);
    const key = own[j] ? '' : `${M},${R},${jN[j]}:${block.join(',')}`;
    let at = own[j] ? -1 : byContent.get(key) ?? -1;
    if (at < 0) {
      at = len;
      out.set(block, at);
      len += size;
      if (!own[j]) byContent.set(key, at);
    }
    jB[j] = at;
    jK[j] = at + R * M;
    jA[j] = at + R * M + R * R;
  }
  return out.slice(0, Math.max(1, len));
}

function invertJunction(j: ResolvedJunction, A: Float64Array, R: number, mat: Float64Array, off: number): void {
  const m = new Matrix(R, R);
  let scale = 0;
  for (let a = 0; a < R; a++) for (let b = 0; b < R; b++) {
    m.set(a, b, A[a * R + b]);
    scale = Math.max(scale, Math.abs(A[a * R + b]));
  }
  const lu = new LuDecomposition(m);
  let minPivot = Infinity;
  const U = lu.upperTriangularMatrix;
  for (let a = 0; a < R; a++) minPivot = Math.min(minPivot, Math.abs(U.get(a, a)));
  if (lu.isSingular() || !(minPivot > 1e-13 * scale)) {
    // Name the node that has no conductance to anything.
    const lonely = j.nodes.filter((_, k) => A[k * R + k] === 0);
    throw singularJunction(j.id, lonely.length > 0 ? `node ${lonely.join(', ')} has no conductance to anything` : 'a loop of ideal sources or shorts, or a node group with no path to the reference');
  }
  const K = inverse(m);
  for (let a = 0; a < R; a++) for (let b = 0; b < R; b++) mat[off + a * R + b] = K.get(a, b);
}
