/**
 * The plugin API: the contracts that sources (waveforms), loads and probes implement.
 *
 * A plugin is a plain object made by `defineSource`, `defineLoad` or `defineProbe` (they only type
 * it): a kebab-case type name, a parameter schema with units, and a `create` factory that returns
 * the per-run object. Hook kinds:
 *  - setup: `create` itself; may be async, may allocate, resolves indices through the context.
 *  - step: sync, allocates nothing (`value`, `history`, `accept`, `evaluate`, `sample`).
 *  - finish: once per run, also after a failure, given the error.
 * State lives in the per-run object returned by `create`, never in module globals.
 */
import type { UnitSymbol } from '../units.ts';

/** One parameter of a plugin's schema. Quantities are converted to SI before `create` sees them. */
interface ParamBase {
  /** One line saying what the parameter is. */
  summary: string;
  /** True when the parameter may be left out and has no default (the factory sees undefined). */
  optional?: boolean;
}

export type ParamSpec =
  | (ParamBase & { kind?: 'quantity'; unit: UnitSymbol; default?: number; min?: number; exclusiveMin?: boolean; max?: number })
  | (ParamBase & { kind: 'integer'; default?: number; min?: number; max?: number })
  | (ParamBase & { kind: 'enum'; values: readonly string[]; default?: string })
  | (ParamBase & { kind: 'boolean'; default?: boolean })
  | (ParamBase & { kind: 'string'; default?: string })
  | (ParamBase & { kind: 'table'; columns: readonly [UnitSymbol, UnitSymbol]; increasingFirst?: boolean });

/** A plugin's parameter schema: name to spec. */
export type ParamSchema = Readonly<Record<string, ParamSpec>>;

type ValueOf<S extends ParamSpec> = S extends { kind: 'table' }
  ? Array<[number, number]>
  : S extends { kind: 'enum' | 'string' }
    ? string
    : S extends { kind: 'boolean' }
      ? boolean
      : number;

type IsOptional<S> = S extends { optional: true } ? true : false;

/** The resolved parameter values a factory receives, in SI units. Optional where there is no default. */
export type ParamValues<P extends ParamSchema> = {
  [K in keyof P as IsOptional<P[K]> extends true ? never : K]: ValueOf<P[K]>;
} & {
  [K in keyof P as IsOptional<P[K]> extends true ? K : never]?: ValueOf<P[K]>;
};

/** What every factory can use. */
export interface SetupContext {
  /** Time step of the run [s]. */
  readonly dtS: number;
  /** End time of the run [s]. */
  readonly endS: number;
  /** Id of the scenario element this instance serves (part or probe id). */
  readonly id: string;
  /** Adds a warning to the run summary. */
  warn(message: string): void;
}

/** Per-run object of a source (waveform). */
export interface WaveformInstance {
  /** Step hook: the waveform's value at time t [s], in the source's unit (V or A). */
  value(tS: number): number;
  /**
   * Frequency-domain hook (optional): the Laplace transform W(s) at s = sigma + j omega into
   * out[0] (real) and out[1] (imaginary). Without it a spectral solver transforms samples of value(t).
   */
  laplace?(sigma: number, omega: number, out: Float64Array): void;
  /** Shortest feature of the waveform [s] (a rise time); the automatic time step resolves it. */
  readonly shortestFeatureS?: number;
  /** Time after which the value no longer changes [s], if any. */
  readonly settledAfterS?: number;
  /** Finish hook. */
  finish?(error?: unknown): void;
}

/** A source (waveform) plugin. */
export interface SourcePlugin<P extends ParamSchema = ParamSchema> {
  readonly kind: 'source';
  readonly type: string;
  readonly summary: string;
  readonly params: P;
  create(params: ParamValues<P>, ctx: SetupContext): WaveformInstance | Promise<WaveformInstance>;
}

/**
 * A linear two-terminal load by its companion model at the run's step: the current from its `plus`
 * to its `minus` terminal is i = g v + h, with g fixed (or changing only at known times) and h the
 * history current.
 */
export interface LinearLoadInstance {
  readonly kind: 'linear';
  /** Companion conductance g [S] for the run's time step (at t = 0 when it varies). */
  readonly conductanceS: number;
  /** Step hook (before the junction solve at t_n): history current h [A]. Omit when h is always 0. */
  history?(): number;
  /** Step hook (after the solve at t_n): the branch voltage [V] and current [A] the solver found. */
  accept?(vV: number, iA: number, tS: number): void;
  /** Step hook: the conductance at t [S] for loads whose g changes (switches). The engine re-factors when it changes. */
  conductanceAt?(tS: number): number;
  /** Energy held inside the load now [J] (capacitor, inductor), for the ledger. */
  storedEnergyJ?(): number;
  /**
   * Frequency-domain hook: the load's admittance at angular frequency omega [rad/s] into
   * out[0] (real, S) and out[1] (imaginary, S). Required for spectral runs.
   */
  admittance?(omegaRadS: number, out: Float64Array): void;
  /**
   * Frequency-domain hook at complex frequency: the admittance Y(s) at s = sigma + j omega
   * (sigma [1/s], omega [rad/s]) into out[0] (real, S) and out[1] (imaginary, S), the analytic
   * continuation of `admittance` (at sigma = 0 the two agree). Needed by the numerical Laplace
   * transform of a time response (damping shift sigma > 0); when present a spectral solver uses it
   * on the j omega axis too.
   */
  admittanceAt?(sigma: number, omegaRadS: number, out: Float64Array): void;
  /** Finish hook; may return structured results for the results file (under the part's id). */
  finish?(error?: unknown): StructuredOutput | void;
}

/** An ideal zero-volt branch (a short circuit), solved exactly as a constraint. */
export interface ShortLoadInstance {
  readonly kind: 'short';
  finish?(error?: unknown): StructuredOutput | void;
}

/**
 * A nonlinear two-terminal load: the engine solves its junction by Newton's method each step.
 */
export interface NonlinearLoadInstance {
  readonly kind: 'nonlinear';
  /** Step hook: current [A] at branch voltage v [V] and time t into out[0], di/dv [S] into out[1]. */
  evaluate(vV: number, tS: number, out: Float64Array): void;
  /** Step hook, after the step converged. */
  accept?(vV: number, iA: number, tS: number): void;
  /**
   * Step hook (optional): limits a Newton update from vOld to vNew [V] and returns the voltage to
   * use (for exponential devices, e.g. a logarithmic limit above a critical voltage).
   */
  limit?(vNew: number, vOld: number): number;
  storedEnergyJ?(): number;
  /** Frequency-domain hook: small-signal admittance at omega around 0 V, as for linear loads. */
  admittance?(omegaRadS: number, out: Float64Array): void;
  /** Frequency-domain hook: small-signal admittance at s = sigma + j omega, as for linear loads. */
  admittanceAt?(sigma: number, omegaRadS: number, out: Float64Array): void;
  finish?(error?: unknown): StructuredOutput | void;
}

export type LoadInstance = LinearLoadInstance | ShortLoadInstance | NonlinearLoadInstance;

/** A load plugin. */
export interface LoadPlugin<P extends ParamSchema = ParamSchema> {
  readonly kind: 'load';
  readonly type: string;
  readonly summary: string;
  readonly params: P;
  create(params: ParamValues<P>, ctx: SetupContext): LoadInstance | Promise<LoadInstance>;
}

/** Handles a probe resolves at setup and reads at each sample. */
export type NodeHandle = number & { readonly __node: unique symbol };
export type PortHandle = number & { readonly __port: unique symbol };
export type PointHandle = number & { readonly __point: unique symbol };
export type PartHandle = number & { readonly __part: unique symbol };
export type TraceHandle = number & { readonly __trace: unique symbol };

/** Totals of the energy ledger at the current time [J]. */
export interface LedgerView {
  /** Energy delivered by each source's EMF (source id -> J). */
  readonly delivered: ReadonlyMap<string, number>;
  /** Energy taken by each part: dissipated plus stored inside it (part id -> J). Includes sources' internal resistance. */
  readonly absorbed: ReadonlyMap<string, number>;
  /** Energy stored in each line now (line id -> J). */
  readonly stored: ReadonlyMap<string, number>;
  /** Energy lost so far in each lossy line's R and G (line id -> J; lossless lines: 0). */
  readonly lost: ReadonlyMap<string, number>;
  readonly deliveredTotalJ: number;
  readonly absorbedTotalJ: number;
  readonly storedTotalJ: number;
  readonly lostTotalJ: number;
  /** delivered - absorbed - stored - lost [J]; zero up to rounding for lossless lines with whole-step delays. */
  readonly residualJ: number;
}

/** What a probe's factory uses to resolve places and declare traces. */
export interface ProbeSetupContext extends SetupContext {
  /** A node by "junction.node" ("J2.load"). Throws a located error when it does not exist. */
  node(ref: string, paramName?: string): NodeHandle;
  /** A conductor at a line end. */
  lineEnd(line: string, end: 'from' | 'to', conductor: string, paramName?: string): PortHandle;
  /** A cross-section along a line at `positionM` from its `from` end. */
  linePoint(line: string, positionM: number, paramName?: string): PointHandle;
  /** Conductor names of a line. */
  conductorsOf(line: string, paramName?: string): readonly string[];
  /** Length of a line [m]. */
  lineLength(line: string, paramName?: string): number;
  /** A lumped part (load or source) by id. */
  part(id: string, paramName?: string): PartHandle;
  /** Ids of all parts, sources first, in the engine's fixed order. */
  readonly partIds: readonly string[];
  /** Declares a trace to record; all traces share the run's time axis. */
  trace(name: string, unit: string): TraceHandle;
  /** Asks the engine to keep the energy ledger during this run. */
  useLedger(): void;
}

/** The solver state a probe sees at a recorded step. Read-only: it offers no way to write. */
export interface ProbeState {
  readonly step: number;
  readonly tS: number;
  nodeVoltage(h: NodeHandle): number;
  /** Voltage of a line-end conductor to the reference [V]. */
  portVoltage(h: PortHandle): number;
  /** Current into the line at that end, flowing along the conductor away from the junction [A]. */
  portCurrent(h: PortHandle): number;
  /** Voltage of conductor k at a line point [V]. */
  pointVoltage(h: PointHandle, k: number): number;
  /** Current of conductor k at a line point, positive towards the line's `to` end [A]. */
  pointCurrent(h: PointHandle, k: number): number;
  /** Voltage from plus to minus terminal of a part [V]. */
  partVoltage(h: PartHandle): number;
  /** Current through a part from plus to minus [A] (for a source: delivered out of its plus terminal). */
  partCurrent(h: PartHandle): number;
  ledger(): LedgerView;
  /** Stores one sample of a declared trace for this step. */
  record(trace: TraceHandle, value: number): void;
}

/** Plain data a probe returns at finish: numbers, strings, arrays and objects of them. */
export type StructuredOutput = { [key: string]: unknown };

/** Per-run object of a probe. */
export interface ProbeInstance {
  /** Step hook, called at every recorded step after all junctions are solved. */
  sample(state: ProbeState): void;
  /** Finish hook: returns structured results for the results file. */
  finish?(error?: unknown): StructuredOutput | void;
}

/** A probe plugin. */
export interface ProbePlugin<P extends ParamSchema = ParamSchema> {
  readonly kind: 'probe';
  readonly type: string;
  readonly summary: string;
  readonly params: P;
  create(params: ParamValues<P>, ctx: ProbeSetupContext): ProbeInstance | Promise<ProbeInstance>;
}

export type AnyPlugin = SourcePlugin<any> | LoadPlugin<any> | ProbePlugin<any>;

type Def<T> = Omit<T, 'kind'>;

/** Types a source plugin. @example export default defineSource({ type: 'step', summary: '...', params: {...}, create: (p) => ({ value: (t) => ... }) }) */
export function defineSource<P extends ParamSchema>(def: Def<SourcePlugin<P>>): SourcePlugin<P> {
  return { kind: 'source', ...def };
}

/** Types a load plugin. */
export function defineLoad<P extends ParamSchema>(def: Def<LoadPlugin<P>>): LoadPlugin<P> {
  return { kind: 'load', ...def };
}

/** Types a probe plugin. */
export function defineProbe<P extends ParamSchema>(def: Def<ProbePlugin<P>>): ProbePlugin<P> {
  return { kind: 'probe', ...def };
}

/** The hook names, by plugin kind (guarded by a type test). */
export const HOOK_NAMES = {
  source: ['create', 'value', 'laplace', 'finish'],
  load: ['create', 'history', 'accept', 'conductanceAt', 'evaluate', 'limit', 'storedEnergyJ', 'admittance', 'admittanceAt', 'finish'],
  probe: ['create', 'sample', 'finish'],
} as const;
