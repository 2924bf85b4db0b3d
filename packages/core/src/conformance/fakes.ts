/**
 * Fake setup contexts and a fake solver state for checking plugins without a network. The fake
 * probe state gives deterministic, phase-shifted signals for every handle and records traces into
 * preallocated rings; nothing in a sample call allocates.
 */
import type {
  LedgerView, NodeHandle, PartHandle, PointHandle, PortHandle, ProbeSetupContext, ProbeState, SetupContext, TraceHandle,
} from '../plugins/api.ts';

/** Conductor names every fake line has. */
export const FAKE_CONDUCTORS: readonly string[] = ['a', 'b'];
/** Samples kept per trace by the fake state (a ring). */
export const FAKE_TRACE_CAPACITY = 4096;

/**
 * A setup context for sources and loads.
 * @param dtS time step [s]; endS end time [s]; warnings collects ctx.warn messages.
 */
export function createFakeSetupContext(dtS: number, endS: number, id: string, warnings: string[] = []): SetupContext {
  return { dtS, endS, id, warn: (m) => { warnings.push(m); } };
}

/** A fake probe context together with the state its probe samples. */
export interface FakeProbeRig {
  ctx: ProbeSetupContext;
  state: ProbeState & { step: number; tS: number };
  /** Advances the fake state to step n (t = n dt). */
  setStep(n: number): void;
  /** Recorded samples, one ring of FAKE_TRACE_CAPACITY per declared trace. */
  traces: Float64Array[];
  traceNames: string[];
  ledgerUsed: () => boolean;
}

/**
 * A probe setup context over an imaginary network: every node, line and part name resolves;
 * lines have the conductors FAKE_CONDUCTORS and a length of 100 m. `phase` shifts every signal,
 * so two rigs with different phases feed two probes different data.
 * @throws Error for a conductor not in FAKE_CONDUCTORS or a position outside 0..100 m, as the engine would.
 */
export function createFakeProbeRig(dtS: number, endS: number, id: string, phase = 0, warnings: string[] = []): FakeProbeRig {
  let nHandles = 0;
  let ledgerWanted = false;
  const traces: Float64Array[] = [];
  const traceNames: string[] = [];
  const ledgerView = {
    delivered: new Map<string, number>([['gen', 1 + phase]]),
    absorbed: new Map<string, number>([['gen', 0.1 + phase], ['load', 0.5 + phase]]),
    stored: new Map<string, number>([['line', 0.4 + phase]]),
    lost: new Map<string, number>([['line', 0]]),
    lostTotalJ: 0,
    deliveredTotalJ: 0,
    absorbedTotalJ: 0,
    storedTotalJ: 0,
    residualJ: 0,
  };
  const signal = (h: number, k: number, step: number): number => Math.sin(1e-3 * step * (1 + 0.1 * h) + phase + 0.7 * k);
  const state = {
    step: 0,
    tS: 0,
    nodeVoltage: (h: NodeHandle): number => signal(h, 0, state.step),
    portVoltage: (h: PortHandle): number => signal(h, 1, state.step),
    portCurrent: (h: PortHandle): number => 0.02 * signal(h, 2, state.step),
    pointVoltage: (h: PointHandle, k: number): number => signal(h, 3 + k, state.step),
    pointCurrent: (h: PointHandle, k: number): number => 0.02 * signal(h, 5 + k, state.step),
    partVoltage: (h: PartHandle): number => signal(h, 7, state.step),
    partCurrent: (h: PartHandle): number => 0.01 * signal(h, 8, state.step),
    ledger(): LedgerView {
      const e = 1e-9 * state.step * (1.5 + Math.sin(phase));
      ledgerView.deliveredTotalJ = e;
      ledgerView.absorbedTotalJ = 0.6 * e;
      ledgerView.storedTotalJ = 0.4 * e;
      ledgerView.residualJ = 0;
      // The maps keep their values: Map.set with a double allocates, and this fake must not.
      return ledgerView;
    },
    record(trace: TraceHandle, value: number): void {
      traces[trace][state.step % FAKE_TRACE_CAPACITY] = value;
    },
  };
  const ctx: ProbeSetupContext = {
    dtS,
    endS,
    id,
    warn: (m) => { warnings.push(m); },
    partIds: ['gen', 'load'],
    node: () => nHandles++ as NodeHandle,
    lineEnd(_line, _end, conductor, param) {
      if (!FAKE_CONDUCTORS.includes(conductor)) throw new Error(`${param ?? 'conductor'}: must name a conductor: ${FAKE_CONDUCTORS.join(', ')}`);
      return nHandles++ as PortHandle;
    },
    linePoint(_line, positionM, param) {
      if (!(positionM >= 0 && positionM <= 100)) throw new Error(`${param ?? 'position'}: must lie between 0 m and 100 m`);
      return nHandles++ as PointHandle;
    },
    conductorsOf: () => FAKE_CONDUCTORS,
    lineLength: () => 10,
    part: () => nHandles++ as PartHandle,
    trace(name) {
      traceNames.push(name);
      traces.push(new Float64Array(FAKE_TRACE_CAPACITY));
      return (traces.length - 1) as TraceHandle;
    },
    useLedger() { ledgerWanted = true; },
  };
  return {
    ctx,
    state,
    setStep(n) { state.step = n; state.tS = n * dtS; },
    traces,
    traceNames,
    ledgerUsed: () => ledgerWanted,
  };
}
