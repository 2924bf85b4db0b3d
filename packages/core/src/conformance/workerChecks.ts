/**
 * The checks of the plugin conformance suite, run inside the worker after the bootstrap
 * (conformanceWorker.mjs) has imported the plugin module by its specifier.
 *
 * Allocation is measured as the sum of the positive increments of `heapUsed` over chunks of 1000
 * hook calls (a chunk in which a scavenge ran shows a decrease and adds nothing), the least of
 * three passes, after warming the hooks up so that the optimising compiler has run, minus the
 * same figure for a trivial
 * instance of the same shape stepped by an identical loop (the harness's own cost). Every loop is
 * compiled afresh (new Function) so that each instance gets its own monomorphic call sites.
 */
import v8 from 'node:v8';
import vm from 'node:vm';
import type { AnyPlugin, LoadInstance, ParamSpec, ProbeInstance, WaveformInstance } from '../plugins/api.ts';
import { isPlugin } from '../plugins/registry.ts';
import { quantityName } from '../units.ts';
import type { UnitSymbol } from '../units.ts';
import { createFakeProbeRig, createFakeSetupContext, FAKE_TRACE_CAPACITY, type FakeProbeRig } from './fakes.ts';
import type { ConformanceCheck, ConformanceReport } from './report.ts';

/** What the main thread sends the worker. */
export interface WorkerInput {
  specifier: string;
  parentUrl: string;
  /** Parameters by plugin type (SI values, as a factory receives them), merged over synthesised ones. */
  params: Record<string, Record<string, unknown>>;
  /** Step-hook calls measured by the allocation check. */
  steps: number;
  /** Largest heap growth over `steps` calls, after subtracting the harness's own [bytes]. */
  allocationBoundBytes: number;
  dtS: number;
  endS: number;
}

/** What the bootstrap found when it imported the module. */
export interface LoadOutcome {
  url?: string;
  mod?: { default?: unknown };
  loadError?: string;
}

const TYPE_NAME = /^[a-z][a-z0-9]*(-[a-z0-9]+)*$/;
const INSTANCE_KEYS: Record<AnyPlugin['kind'], readonly string[]> = {
  source: ['value', 'laplace', 'shortestFeatureS', 'settledAfterS', 'finish'],
  load: ['kind', 'conductanceS', 'history', 'accept', 'conductanceAt', 'evaluate', 'limit', 'storedEnergyJ', 'admittance', 'admittanceAt', 'finish'],
  probe: ['sample', 'finish'],
};
/** Steps of the shared-state and value checks (within the fake trace ring). */
const STATE_STEPS = 2000;
const CHUNK = 1000;
const WARMUP_CHUNKS = 50;
const PASSES = 3;

type Instance = WaveformInstance | LoadInstance | ProbeInstance;

function getGc(): () => void {
  const existing = (globalThis as { gc?: () => void }).gc;
  if (existing) return existing;
  // Worker threads refuse V8 flags in execArgv (ERR_WORKER_INVALID_EXEC_ARGV), so the flag is set
  // at run time and gc is taken from a fresh context, where V8 installs it once the flag is on.
  v8.setFlagsFromString('--expose-gc');
  return vm.runInNewContext('gc') as () => void;
}

const describeError = (e: unknown): string => (e instanceof Error ? `${e.name}: ${e.message}` : String(e));

/** Runs every check over the module's plugins and returns the report. */
export async function runWorkerChecks(input: WorkerInput, loaded: LoadOutcome): Promise<ConformanceReport> {
  const checks: ConformanceCheck[] = [];
  const report: ConformanceReport = { specifier: input.specifier, url: loaded.url, plugins: [], checks, ok: false };
  if (loaded.loadError !== undefined || !loaded.mod) {
    checks.push({ name: 'loads-in-worker', ok: false, message: `import by specifier failed in a worker thread: ${loaded.loadError}` });
    return report;
  }
  const exported = loaded.mod.default;
  const list = Array.isArray(exported) ? exported : exported === undefined ? [] : [exported];
  if (list.length === 0) {
    checks.push({ name: 'loads-in-worker', ok: false, message: 'the module has no default export (a plugin or an array of plugins)' });
    return report;
  }
  checks.push({ name: 'loads-in-worker', ok: true, message: `imported ${loaded.url} in a worker thread; default export holds ${list.length} plugin(s)` });
  const seen = new Set<string>();
  for (let k = 0; k < list.length; k++) {
    const p = list[k] as AnyPlugin;
    const label = isPlugin(p) ? `${p.kind}:${p.type}` : `default export [${k}]`;
    const shape = checkShape(p, seen);
    checks.push({ name: 'plugin-shape', plugin: label, ...shape });
    if (!shape.ok) continue;
    report.plugins.push(label);
    checks.push({ name: 'param-schema', plugin: label, ...checkSchema(p) });
    await checkBehaviour(p, label, input, checks);
  }
  report.ok = checks.every((c) => c.ok);
  return report;
}

function checkShape(p: AnyPlugin, seen: Set<string>): { ok: boolean; message: string } {
  if (!isPlugin(p)) return { ok: false, message: 'is not a plugin made by defineSource, defineLoad or defineProbe (needs kind, type, params, create)' };
  if (!TYPE_NAME.test(p.type)) return { ok: false, message: `type name "${p.type}" must be kebab-case (lower-case words joined by "-")` };
  const key = `${p.kind}:${p.type}`;
  if (seen.has(key)) return { ok: false, message: `type name "${p.type}" appears twice in the module` };
  seen.add(key);
  if (typeof p.summary !== 'string' || p.summary.trim() === '') return { ok: false, message: 'needs a one-line summary' };
  return { ok: true, message: `${p.kind} plugin "${p.type}"` };
}

function checkSchema(p: AnyPlugin): { ok: boolean; message: string } {
  const problems: string[] = [];
  const known = (u: unknown): boolean => typeof u === 'string' && quantityName(u as UnitSymbol) !== undefined;
  for (const [name, spec] of Object.entries(p.params as Record<string, ParamSpec>)) {
    if (typeof spec.summary !== 'string' || spec.summary.trim() === '') problems.push(`${name}: needs a summary`);
    switch (spec.kind) {
      case undefined:
      case 'quantity': {
        if (!known(spec.unit)) problems.push(`${name}: needs a unit, one of the UnitSymbol values, got ${JSON.stringify(spec.unit)}`);
        const d = spec.default;
        if (d !== undefined) {
          if (typeof d !== 'number' || !Number.isFinite(d)) problems.push(`${name}: default must be a finite SI number, got ${JSON.stringify(d)}`);
          else {
            if (spec.min !== undefined && (spec.exclusiveMin ? !(d > spec.min) : !(d >= spec.min))) problems.push(`${name}: default ${d} is below min ${spec.min}`);
            if (spec.max !== undefined && d > spec.max) problems.push(`${name}: default ${d} is above max ${spec.max}`);
          }
        }
        break;
      }
      case 'integer':
        if (spec.default !== undefined && !Number.isInteger(spec.default)) problems.push(`${name}: default must be an integer`);
        break;
      case 'enum':
        if (!Array.isArray(spec.values) || spec.values.length === 0) problems.push(`${name}: enum needs values`);
        else if (spec.default !== undefined && !spec.values.includes(spec.default)) problems.push(`${name}: default "${spec.default}" is not one of ${spec.values.join(', ')}`);
        break;
      case 'table':
        if (!Array.isArray(spec.columns) || spec.columns.length !== 2 || !spec.columns.every(known)) problems.push(`${name}: table needs two column units`);
        break;
      case 'boolean':
      case 'string':
        break;
      default:
        problems.push(`${name}: unknown kind ${JSON.stringify((spec as { kind: unknown }).kind)}`);
    }
  }
  const n = Object.keys(p.params).length;
  return problems.length ? { ok: false, message: problems.join('; ') } : { ok: true, message: `${n} parameter(s), each with a summary, every quantity with a unit` };
}

/** Parameters for create: the given ones over synthesised ones (defaults, else a typical value within the bounds). */
export function synthesiseParams(p: AnyPlugin, given: Record<string, unknown> | undefined, dtS: number): Record<string, unknown> {
  const out: Record<string, unknown> = {};
  for (const [name, spec] of Object.entries(p.params as Record<string, ParamSpec>)) {
    if (spec.kind !== 'table' && spec.default !== undefined) {
      out[name] = spec.default;
      continue;
    }
    if (spec.optional) continue;
    switch (spec.kind) {
      case 'enum': out[name] = spec.values[0]; break;
      case 'boolean': out[name] = false; break;
      case 'string': out[name] = 'a'; break;
      case 'integer': out[name] = Math.max(spec.min ?? 1, Math.min(spec.max ?? 1, 1)); break;
      case 'table': out[name] = [[0, 0], [20 * dtS, 1], [40 * dtS, 0.5]]; break;
      default: {
        const typical: Partial<Record<UnitSymbol, number>> = { s: 20 * dtS, Hz: 1 / (200 * dtS), ohm: 50, S: 0.02, F: 1e-9, H: 1e-6, m: 1 };
        let x = typical[spec.unit] ?? 1;
        if (spec.min !== undefined && (spec.exclusiveMin ? !(x > spec.min) : !(x >= spec.min))) x = spec.min > 0 ? 2 * spec.min : spec.min + 1;
        if (spec.max !== undefined && x > spec.max) x = spec.max;
        out[name] = x;
      }
    }
  }
  return { ...out, ...given };
}

/** A per-instance driver of the step hooks, with its own inputs (variant 0 or 1). */
interface Stepper {
  inst: Instance;
  rig?: FakeProbeRig;
  step(k: number): number;
  finish(error?: unknown): unknown;
}

async function makeStepper(p: AnyPlugin, params: Record<string, unknown>, input: WorkerInput, variant: number): Promise<Stepper> {
  const id = `conformance-${variant}`;
  const dt = input.dtS;
  if (p.kind === 'probe') {
    const rig = createFakeProbeRig(dt, input.endS, id, variant);
    const inst = await p.create(params as never, rig.ctx);
    return {
      inst,
      rig,
      step(k) {
        rig.setStep(k);
        inst.sample(rig.state);
        let s = 0;
        for (const t of rig.traces) s += t[k % FAKE_TRACE_CAPACITY];
        return s;
      },
      finish: (e) => inst.finish?.(e),
    };
  }
  const ctx = createFakeSetupContext(dt, input.endS, id);
  if (p.kind === 'source') {
    const inst = await p.create(params as never, ctx);
    return {
      inst,
      step: (k) => inst.value((variant === 0 ? k : STATE_STEPS - 1 - k) * (input.endS / STATE_STEPS)),
      finish: (e) => inst.finish?.(e),
    };
  }
  const inst = await p.create(params as never, ctx);
  const out = new Float64Array(2);
  return {
    inst,
    step(k) {
      const t = k * dt;
      const v = variant === 0 ? Math.sin(0.01 * k) : 2 * Math.cos(0.013 * k);
      if (inst.kind === 'short') return 0;
      if (inst.kind === 'nonlinear') {
        inst.evaluate(v, t, out);
        inst.accept?.(v, out[0], t);
        return out[0] + out[1] + (inst.storedEnergyJ?.() ?? 0);
      }
      const g = inst.conductanceAt ? inst.conductanceAt(t) : inst.conductanceS;
      const i = g * v + (inst.history ? inst.history() : 0);
      inst.accept?.(v, i, t);
      return i + g + (inst.storedEnergyJ?.() ?? 0);
    },
    finish: (e) => inst.finish?.(e),
  };
}

async function checkBehaviour(p: AnyPlugin, label: string, input: WorkerInput, checks: ConformanceCheck[]): Promise<void> {
  const params = synthesiseParams(p, input.params[p.type], input.dtS);
  let first: Stepper;
  try {
    first = await makeStepper(p, params, input, 0);
  } catch (e) {
    checks.push({ name: 'create', plugin: label, ok: false, message: `create(${JSON.stringify(params)}) threw ${describeError(e)}; pass valid parameters in options.params["${p.type}"]` });
    return;
  }
  checks.push({ name: 'create', plugin: label, ...checkInstance(p, first.inst) });

  // Values: every step hook result is finite.
  try {
    let bad = -1;
    for (let k = 0; k < STATE_STEPS && bad < 0; k++) if (!Number.isFinite(first.step(k))) bad = k;
    checks.push({ name: 'step-values', plugin: label, ok: bad < 0, message: bad < 0 ? `${STATE_STEPS} steps, every result finite` : `a step hook gave a non-finite result at step ${bad}` });
  } catch (e) {
    checks.push({ name: 'step-values', plugin: label, ok: false, message: `a step hook threw ${describeError(e)}` });
  }

  // Shared state: two instances stepped in turn give exactly what each gives alone.
  try {
    const alone = async (variant: number): Promise<{ seq: Float64Array; out: string }> => {
      const s = await makeStepper(p, params, input, variant);
      const seq = new Float64Array(STATE_STEPS);
      for (let k = 0; k < STATE_STEPS; k++) seq[k] = s.step(k);
      return { seq, out: JSON.stringify(s.finish()) ?? '' };
    };
    const a = await alone(0);
    const b = await alone(1);
    const sa = await makeStepper(p, params, input, 0);
    const sb = await makeStepper(p, params, input, 1);
    const ia = new Float64Array(STATE_STEPS);
    const ib = new Float64Array(STATE_STEPS);
    for (let k = 0; k < STATE_STEPS; k++) {
      ia[k] = sa.step(k);
      ib[k] = sb.step(k);
    }
    const outA = JSON.stringify(sa.finish()) ?? '';
    const outB = JSON.stringify(sb.finish()) ?? '';
    const diff = (x: Float64Array, y: Float64Array): number => { for (let k = 0; k < x.length; k++) if (!Object.is(x[k], y[k])) return k; return -1; };
    const da = diff(a.seq, ia);
    const db = diff(b.seq, ib);
    const ok = da < 0 && db < 0 && outA === a.out && outB === b.out;
    checks.push({
      name: 'no-shared-state', plugin: label, ok,
      message: ok ? `two instances stepped in turn over ${STATE_STEPS} steps match separate runs bit for bit`
        : da >= 0 || db >= 0 ? `interleaved instances differ from separate runs first at step ${da >= 0 ? da : db} (state shared between instances?)`
          : 'finish outputs of interleaved instances differ from separate runs',
    });
  } catch (e) {
    checks.push({ name: 'no-shared-state', plugin: label, ok: false, message: `threw ${describeError(e)}` });
  }

  // Finish after a failure, before the first step and after some steps.
  try {
    const failure = new Error('conformance: simulated failure of the run');
    const s0 = await makeStepper(p, params, input, 0);
    const out0 = s0.finish(failure);
    const s1 = await makeStepper(p, params, input, 0);
    for (let k = 0; k < 10; k++) s1.step(k);
    const out1 = s1.finish(failure);
    let plain = true;
    for (const o of [out0, out1]) if (o !== undefined && !isPlainData(o)) plain = false;
    checks.push({
      name: 'finish-after-failure', plugin: label, ok: plain,
      message: plain ? 'finish(error) runs before the first step and after 10 steps without throwing' : 'finish returned something that is not plain data (numbers, strings, booleans, null, arrays, plain objects, bytes)',
    });
  } catch (e) {
    checks.push({ name: 'finish-after-failure', plugin: label, ok: false, message: `finish(error) threw ${describeError(e)}` });
  }

  // Allocation in the step hooks.
  try {
    checks.push({ name: 'no-step-allocation', plugin: label, ...(await checkAllocation(p, params, input)) });
  } catch (e) {
    checks.push({ name: 'no-step-allocation', plugin: label, ok: false, message: `threw ${describeError(e)}` });
  }
}

function checkInstance(p: AnyPlugin, inst: Instance): { ok: boolean; message: string } {
  if (inst === null || typeof inst !== 'object') return { ok: false, message: 'create must return an object' };
  const allowed = INSTANCE_KEYS[p.kind];
  const extra = Object.keys(inst).filter((k) => !allowed.includes(k));
  if (extra.length) return { ok: false, message: `instance has keys the engine does not know: ${extra.join(', ')} (allowed: ${allowed.join(', ')})` };
  const r = inst as unknown as Record<string, unknown>;
  if (p.kind === 'source' && typeof r.value !== 'function') return { ok: false, message: 'a waveform instance needs value(tS)' };
  if (p.kind === 'probe' && typeof r.sample !== 'function') return { ok: false, message: 'a probe instance needs sample(state)' };
  if (p.kind === 'load') {
    if (r.kind === 'linear' && !(typeof r.conductanceS === 'number' && r.conductanceS >= 0 && Number.isFinite(r.conductanceS))) {
      return { ok: false, message: `conductanceS must be finite and non-negative, got ${String(r.conductanceS)}` };
    }
    if (r.kind === 'nonlinear' && typeof r.evaluate !== 'function') return { ok: false, message: 'a nonlinear load needs evaluate(vV, tS, out)' };
    if (r.kind !== 'linear' && r.kind !== 'nonlinear' && r.kind !== 'short') return { ok: false, message: `load kind must be linear, nonlinear or short, got ${String(r.kind)}` };
  }
  return { ok: true, message: `instance with ${Object.keys(inst).join(', ') || 'no hooks'}` };
}

function isPlainData(x: unknown, depth = 0): boolean {
  if (depth > 32) return false;
  if (x === null || typeof x === 'number' || typeof x === 'string' || typeof x === 'boolean') return true;
  if (Array.isArray(x)) return x.every((y) => isPlainData(y, depth + 1));
  // Bytes are MessagePack's plain "bin" type (float64 samples travel that way).
  if (x instanceof Uint8Array) return true;
  if (typeof x === 'object') {
    const proto = Object.getPrototypeOf(x);
    if (proto !== Object.prototype && proto !== null) return false;
    return Object.values(x as object).every((y) => isPlainData(y, depth + 1));
  }
  return false;
}

/** Source text of the loop that drives an instance's step hooks, by the hooks it has. */
function loopBody(kind: AnyPlugin['kind'], inst: Instance): string | undefined {
  const has = (k: string): boolean => typeof (inst as unknown as Record<string, unknown>)[k] === 'function';
  if (kind === 'source') return 'let acc = 0; for (let k = k0; k < k0 + n; k++) acc += inst.value(k * aux.dt); return acc;';
  if (kind === 'probe') return 'const s = aux.state; for (let k = k0; k < k0 + n; k++) { s.step = k; s.tS = k * aux.dt; inst.sample(s); } return 0;';
  const l = inst as LoadInstance;
  if (l.kind === 'short') return undefined;
  if (l.kind === 'nonlinear') {
    return `let acc = 0; const out = aux.buf; for (let k = k0; k < k0 + n; k++) { const t = k * aux.dt; const v = Math.sin(0.01 * k);
      inst.evaluate(v, t, out); ${has('accept') ? 'inst.accept(v, out[0], t);' : ''} acc += out[0]; } return acc;`;
  }
  if (!has('history') && !has('accept') && !has('conductanceAt')) return undefined;
  return `let acc = 0; let g = inst.conductanceS; for (let k = k0; k < k0 + n; k++) { const t = k * aux.dt;
    ${has('conductanceAt') ? 'g = inst.conductanceAt(t);' : ''} const h = ${has('history') ? 'inst.history()' : '0'};
    const v = Math.sin(0.01 * k); const i = g * v + h; ${has('accept') ? 'inst.accept(v, i, t);' : ''} acc += i; } return acc;`;
}

/** A trivial instance with the same hooks as `inst`, that allocates nothing: the harness baseline. */
function baselineOf(kind: AnyPlugin['kind'], inst: Instance): Instance {
  if (kind === 'source') return { value: (t: number) => t * 1.5 + 0.25 };
  if (kind === 'probe') return { sample: (s) => { if (s.step < 0) throw new Error('unreachable'); } };
  const l = inst as LoadInstance;
  if (l.kind === 'nonlinear') return { kind: 'nonlinear', evaluate: (v: number, _t: number, out: Float64Array) => { out[0] = 0.5 * v; out[1] = 0.5; }, accept: l.accept ? () => {} : undefined } as LoadInstance;
  const b: Record<string, unknown> = { kind: 'linear', conductanceS: 0.02 };
  if (l.kind === 'linear' && l.history) b.history = () => 0.125;
  if (l.kind === 'linear' && l.accept) b.accept = (_v: number, _i: number, _t: number) => {};
  if (l.kind === 'linear' && l.conductanceAt) b.conductanceAt = (t: number) => (t > 0 ? 0.02 : 0.01);
  return b as unknown as LoadInstance;
}

type Loop = (inst: Instance, aux: unknown, n: number, k0: number) => number;

function measureGrowth(body: string, inst: Instance, aux: unknown, steps: number, gc: () => void): number {
  const loop = new Function('inst', 'aux', 'n', 'k0', body) as Loop;
  let k = 0;
  for (let c = 0; c < WARMUP_CHUNKS; c++, k += CHUNK) loop(inst, aux, CHUNK, k);
  // The least of a few passes: a hook that allocates does so in every pass, while a background
  // compilation or other one-off in the worker lands in one pass only.
  let least = Infinity;
  for (let pass = 0; pass < PASSES; pass++) {
    gc();
    let grown = 0;
    let last = process.memoryUsage().heapUsed;
    for (let done = 0; done < steps; done += CHUNK, k += CHUNK) {
      loop(inst, aux, Math.min(CHUNK, steps - done), k);
      const now = process.memoryUsage().heapUsed;
      if (now > last) grown += now - last;
      last = now;
    }
    least = Math.min(least, grown);
  }
  return least;
}

async function checkAllocation(p: AnyPlugin, params: Record<string, unknown>, input: WorkerInput): Promise<{ ok: boolean; message: string }> {
  const gc = getGc();
  const s = await makeStepper(p, params, input, 0);
  const body = loopBody(p.kind, s.inst);
  if (body === undefined) return { ok: true, message: 'no step hooks to measure (the engine solves this load without calling it)' };
  const aux = (rig?: FakeProbeRig) => ({ dt: input.dtS, buf: new Float64Array(2), state: rig?.state });
  const baseRig = p.kind === 'probe' ? createFakeProbeRig(input.dtS, input.endS, 'baseline') : undefined;
  const base = measureGrowth(body, baselineOf(p.kind, s.inst), aux(baseRig), input.steps, gc);
  const grown = measureGrowth(body, s.inst, aux(s.rig), input.steps, gc);
  const net = grown - base;
  const perCall = net / input.steps;
  const ok = net <= input.allocationBoundBytes;
  return {
    ok,
    message: `${input.steps} step-hook calls grew the heap by ${net} bytes beyond the harness's ${base} (${perCall.toFixed(2)} B per call; bound ${input.allocationBoundBytes} bytes)${ok ? '' : ': the step hooks allocate'}`,
  };
}
