/**
 * The sweep file: a base scenario, the parameters to vary (addressed by their path in the
 * scenario), how their values combine, and the named outputs to collect per case. Every rule is
 * checked here, and a broken rule is a located error (file, line, column, path) like the engine's.
 */
import { readFileSync } from 'node:fs';
import { dirname, resolve } from 'node:path';
import { InputError, parseLocatedDocument, parseQuantity, plainDocument, type DocPath, type LocatedDocument, type SourceLocation, type UnitSymbol } from '@skein/core';
import { checkSettable, parseValuePath } from './paths.ts';

/** The sweep file format version this package reads. */
export const SWEEP_FORMAT_VERSION = 1;

/** Units a range or a draw may be written in (the value is written into the scenario in SI). */
export const SWEEP_UNITS: readonly UnitSymbol[] = ['1', 's', 'Hz', 'm', 'V', 'A', 'ohm', 'S', 'F', 'H', 'W', 'J', 'K', 'C', 'H/m', 'F/m', 'ohm/m', 'S/m', 'm/s'];

/** Values given as a list, written into the scenario as they are (quantities with units allowed). */
export interface ListValues { kind: 'list'; values: unknown[] }
/** `count` values from `from` to `to` inclusive, evenly spaced (linear) or evenly in ratio (log). */
export interface RangeValues { kind: 'range'; from: number; to: number; count: number; scale: 'linear' | 'log'; unit: UnitSymbol }
/** `count` random draws. Uniform on [min, max); normal (mean, std); log-normal (median, sigma of ln x). */
export interface DrawValues {
  kind: 'draw';
  dist: 'uniform' | 'normal' | 'log-normal';
  /** uniform: min, max; normal: mean, std; log-normal: median, sigma (SI, sigma dimensionless). */
  a: number;
  b: number;
  count: number;
  unit: UnitSymbol;
}

/** One swept parameter. */
export interface ParameterSpec {
  /** Column name in the table. */
  name: string;
  /** Where it goes in the scenario. */
  path: Array<string | number>;
  values: ListValues | RangeValues | DrawValues;
}

/** One named output collected per case. */
export type OutputSpec =
  | { name: string; kind: 'peak'; trace: string }
  | { name: string; kind: 'value-at'; trace: string; timeS: number }
  | { name: string; kind: 'arrival'; trace: string; threshold: number }
  | { name: string; kind: 'energy'; probe: string; part: string; of: 'absorbed' | 'delivered' | 'stored' }
  | { name: string; kind: 'output'; probe: string; path: Array<string | number> };

/** The output kinds, in the order error messages list them. */
export const OUTPUT_KINDS = ['peak', 'value-at', 'arrival', 'energy', 'output'] as const;

/** A validated sweep. */
export interface SweepSpec {
  title: string;
  /** The sweep file (for messages), if read from one. */
  file: string | undefined;
  /** The base scenario as plain data. */
  scenario: unknown;
  /** The base scenario's own text and file, when it came from a file (for located errors). */
  scenarioText: string | undefined;
  scenarioFile: string | undefined;
  combine: 'grid' | 'zip';
  seed: number;
  parameters: ParameterSpec[];
  outputs: OutputSpec[];
  /** For an inline scenario: where a path inside it sits in the sweep file. */
  locateScenario?: (path: DocPath) => SourceLocation;
}

/** Options of loadSweep. */
export interface LoadSweepOptions {
  /** The sweep file name, for messages and to resolve a relative `scenario:` path. */
  file?: string;
  /** Reads a scenario file named by the sweep (default: fs.readFileSync as UTF-8). */
  readText?: (path: string) => string;
}

type Obj = Record<string, unknown>;
const isObj = (v: unknown): v is Obj => v !== null && typeof v === 'object' && !Array.isArray(v);
const NAME = /^[A-Za-z_][A-Za-z0-9_-]*$/;

/**
 * Reads sweep text (YAML or JSON).
 * @param text the sweep document.
 * @param options file name and a reader for the scenario it names.
 * @returns the validated SweepSpec.
 * @throws InputError (located: file, line, column, path) for every broken rule, E_SYNTAX for bad YAML.
 * @example loadSweep('sweep: 1\nscenario: base.yaml\nparameters: ...', { file: 'scan.yaml' })
 */
export function loadSweep(text: string, options: LoadSweepOptions = {}): SweepSpec {
  return validateSweep(parseLocatedDocument(text, options.file), options);
}

/**
 * Validates sweep data built in code (same rules as loadSweep, no line numbers).
 * @throws InputError naming the path, the rule and the value.
 */
export function sweepFromData(data: unknown, options: LoadSweepOptions = {}): SweepSpec {
  return validateSweep(plainDocument(data, options.file), options);
}

/**
 * Reads a sweep file from disk.
 * @throws InputError E_FILE when unreadable, and every located error of loadSweep.
 */
export function loadSweepFile(path: string): SweepSpec {
  let text: string;
  try {
    text = readFileSync(path, 'utf8');
  } catch (e) {
    throw new InputError('E_FILE', [], `must be a readable sweep file (${(e as NodeJS.ErrnoException).code ?? 'error'})`, path, { file: path });
  }
  return loadSweep(text, { file: path });
}

function checkKeys(doc: LocatedDocument, path: DocPath, v: Obj, allowed: readonly string[]): void {
  for (const k of Object.keys(v)) {
    if (!allowed.includes(k)) throw doc.fail([...path, k], `is not a known key here; accepted: ${allowed.join(', ')}`, v[k], 'E_UNKNOWN_KEY');
  }
}

function validateSweep(doc: LocatedDocument, options: LoadSweepOptions): SweepSpec {
  const root = doc.data;
  if (!isObj(root)) throw doc.fail([], 'must be a mapping with sweep, scenario, parameters and outputs', root, 'E_TYPE');
  checkKeys(doc, [], root, ['sweep', 'title', 'scenario', 'seed', 'combine', 'count', 'parameters', 'outputs']);
  if (root.sweep !== SWEEP_FORMAT_VERSION) {
    throw doc.fail(['sweep'], `must be ${SWEEP_FORMAT_VERSION}, the sweep format version this package reads`, root.sweep, 'E_FORMAT_VERSION');
  }
  if (root.title !== undefined && typeof root.title !== 'string') throw doc.fail(['title'], 'must be a string', root.title, 'E_TYPE');
  const { scenario, scenarioText, scenarioFile } = readBase(doc, root.scenario, options);
  let seed = 1;
  if (root.seed !== undefined) {
    if (typeof root.seed !== 'number' || !Number.isSafeInteger(root.seed) || root.seed < 0) {
      throw doc.fail(['seed'], 'must be a non-negative whole number', root.seed, 'E_RANGE');
    }
    seed = root.seed;
  }
  const combine = root.combine ?? 'grid';
  if (combine !== 'grid' && combine !== 'zip') throw doc.fail(['combine'], 'must be one of: grid, zip', combine, 'E_ENUM');
  let defaultCount: number | undefined;
  if (root.count !== undefined) defaultCount = count(doc, ['count'], root.count, 1);
  if (!isObj(root.parameters) || Object.keys(root.parameters).length === 0) {
    throw doc.fail(['parameters'], 'must be a mapping from parameter name to { path, values | range | draw }', root.parameters, 'E_MISSING');
  }
  const parameters: ParameterSpec[] = [];
  for (const [name, pv] of Object.entries(root.parameters)) {
    parameters.push(parameter(doc, name, pv, scenario, defaultCount));
  }
  if (combine === 'zip') {
    const n0 = lengthOf(parameters[0]);
    for (const p of parameters) {
      if (lengthOf(p) !== n0) {
        throw doc.fail(['parameters', p.name], `must give ${n0} values like parameter ${parameters[0].name} (combine: zip pairs the i-th values of every parameter)`, lengthOf(p), 'E_ZIP_LENGTH');
      }
    }
  }
  if (!isObj(root.outputs) || Object.keys(root.outputs).length === 0) {
    throw doc.fail(['outputs'], `must be a mapping from output name to one of: ${OUTPUT_KINDS.join(', ')}`, root.outputs, 'E_MISSING');
  }
  const probeIds = isObj(scenario) && isObj(scenario.probes) ? new Set(Object.keys(scenario.probes)) : new Set<string>();
  const outputs = Object.entries(root.outputs).map(([name, ov]) => output(doc, name, ov, probeIds, parameters));
  const title = typeof root.title === 'string' ? root.title : (options.file ?? 'sweep');
  const locateScenario = scenarioText === undefined ? (path: DocPath) => doc.locate(['scenario', ...path]) : undefined;
  return { title, file: options.file, scenario, scenarioText, scenarioFile, combine, seed, parameters, outputs, locateScenario };
}

function readBase(doc: LocatedDocument, v: unknown, options: LoadSweepOptions): { scenario: unknown; scenarioText?: string; scenarioFile?: string } {
  if (v === undefined) throw doc.fail(['scenario'], 'is required: the base scenario file (a path relative to the sweep file) or the scenario inline', undefined, 'E_MISSING');
  if (isObj(v)) return { scenario: v };
  if (typeof v !== 'string' || v === '') throw doc.fail(['scenario'], 'must be a scenario file path or an inline scenario mapping', v, 'E_TYPE');
  const file = resolve(options.file ? dirname(options.file) : '.', v);
  let text: string;
  try {
    text = (options.readText ?? ((p: string) => readFileSync(p, 'utf8')))(file);
  } catch (e) {
    throw doc.fail(['scenario'], `must name a readable scenario file (${(e as NodeJS.ErrnoException).code ?? (e as Error).message}: ${file})`, v, 'E_FILE');
  }
  const located = parseLocatedDocument(text, file);
  return { scenario: located.data, scenarioText: text, scenarioFile: file };
}

function count(doc: LocatedDocument, path: DocPath, v: unknown, min: number): number {
  if (typeof v !== 'number' || !Number.isSafeInteger(v) || v < min) throw doc.fail(path, `must be a whole number of at least ${min}`, v, 'E_RANGE');
  return v;
}

function unitOf(doc: LocatedDocument, path: DocPath, v: unknown): UnitSymbol {
  if (v === undefined) return '1';
  if (typeof v !== 'string' || !(SWEEP_UNITS as readonly string[]).includes(v)) {
    throw doc.fail(path, `must be one of: ${SWEEP_UNITS.join(', ')}`, v, 'E_ENUM');
  }
  return v as UnitSymbol;
}

function number(doc: LocatedDocument, path: DocPath, v: unknown, unit: UnitSymbol): number {
  const x = parseQuantity(v, unit);
  if (x === undefined) {
    const hint = unit === '1' ? ' (to write a quantity such as "100ohm", give the unit, e.g. unit: ohm)' : ` in ${unit}`;
    throw doc.fail(path, `must be a number${hint}`, v, 'E_QUANTITY');
  }
  return x;
}

function lengthOf(p: ParameterSpec): number {
  return p.values.kind === 'list' ? p.values.values.length : p.values.count;
}

function parameter(doc: LocatedDocument, name: string, v: unknown, scenario: unknown, defaultCount: number | undefined): ParameterSpec {
  const at: DocPath = ['parameters', name];
  if (!NAME.test(name)) throw doc.fail(at, 'must be a parameter name (letters, digits, "_" and "-", starting with a letter)', name, 'E_ID');
  if (!isObj(v)) throw doc.fail(at, 'must be a mapping { path, and one of values, range, draw }', v, 'E_TYPE');
  checkKeys(doc, at, v, ['path', 'values', 'range', 'draw']);
  const path = parseValuePath(v.path as string);
  if (!path) throw doc.fail([...at, 'path'], 'must be a dotted path into the scenario, e.g. lines.feeder.length or junctions.B.parts.R1.resistance', v.path, 'E_PATH');
  const why = checkSettable(scenario, path);
  if (why) throw doc.fail([...at, 'path'], `must address a value in the base scenario (${why})`, v.path, 'E_PATH');
  const kinds = ['values', 'range', 'draw'].filter((k) => v[k] !== undefined);
  if (kinds.length !== 1) throw doc.fail(at, 'must give exactly one of: values, range, draw', kinds, 'E_VALUES');
  if (v.values !== undefined) {
    if (!Array.isArray(v.values) || v.values.length === 0) throw doc.fail([...at, 'values'], 'must be a non-empty list of values', v.values, 'E_TYPE');
    return { name, path, values: { kind: 'list', values: v.values } };
  }
  if (v.range !== undefined) {
    const rp: DocPath = [...at, 'range'];
    const r = v.range;
    if (!isObj(r)) throw doc.fail(rp, 'must be a mapping { from, to, count, scale: linear | log, unit }', r, 'E_TYPE');
    checkKeys(doc, rp, r, ['from', 'to', 'count', 'scale', 'unit']);
    const unit = unitOf(doc, [...rp, 'unit'], r.unit);
    const from = number(doc, [...rp, 'from'], r.from, unit);
    const to = number(doc, [...rp, 'to'], r.to, unit);
    const n = count(doc, [...rp, 'count'], r.count, 1);
    const scale = r.scale ?? 'linear';
    if (scale !== 'linear' && scale !== 'log') throw doc.fail([...rp, 'scale'], 'must be one of: linear, log', scale, 'E_ENUM');
    if (scale === 'log' && !(from > 0 && to > 0)) throw doc.fail([...rp, from > 0 ? 'to' : 'from'], 'must be positive for a logarithmic range', from > 0 ? r.to : r.from, 'E_RANGE');
    if (n === 1 && from !== to) throw doc.fail([...rp, 'count'], 'must be at least 2 when from and to differ', n, 'E_RANGE');
    return { name, path, values: { kind: 'range', from, to, count: n, scale, unit } };
  }
  const dp: DocPath = [...at, 'draw'];
  const d = v.draw;
  if (!isObj(d)) throw doc.fail(dp, 'must be a mapping { dist: uniform | normal | log-normal, its parameters, count, unit }', d, 'E_TYPE');
  const dist = d.dist;
  const keysOf: Record<string, [string, string]> = { uniform: ['min', 'max'], normal: ['mean', 'std'], 'log-normal': ['median', 'sigma'] };
  if (typeof dist !== 'string' || !(dist in keysOf)) throw doc.fail([...dp, 'dist'], 'must be one of: uniform, normal, log-normal', dist, 'E_ENUM');
  const [ka, kb] = keysOf[dist];
  checkKeys(doc, dp, d, ['dist', ka, kb, 'count', 'unit']);
  const unit = unitOf(doc, [...dp, 'unit'], d.unit);
  for (const k of [ka, kb]) if (d[k] === undefined) throw doc.fail([...dp, k], `is required for dist: ${dist}`, undefined, 'E_MISSING');
  const a = number(doc, [...dp, ka], d[ka], unit);
  const b = number(doc, [...dp, kb], d[kb], dist === 'log-normal' ? '1' : unit);
  if (dist === 'uniform' && !(b > a)) throw doc.fail([...dp, 'max'], 'must be larger than min', d.max, 'E_RANGE');
  if (dist === 'normal' && !(b >= 0)) throw doc.fail([...dp, 'std'], 'must be a non-negative standard deviation', d.std, 'E_RANGE');
  if (dist === 'log-normal' && !(a > 0)) throw doc.fail([...dp, 'median'], 'must be positive', d.median, 'E_RANGE');
  if (dist === 'log-normal' && !(b >= 0)) throw doc.fail([...dp, 'sigma'], 'must be a non-negative standard deviation of ln x', d.sigma, 'E_RANGE');
  if (d.count === undefined && defaultCount === undefined) throw doc.fail([...dp, 'count'], 'is required (or give count at the top level of the sweep)', undefined, 'E_MISSING');
  const n = d.count === undefined ? defaultCount! : count(doc, [...dp, 'count'], d.count, 1);
  return { name, path, values: { kind: 'draw', dist: dist as DrawValues['dist'], a, b, count: n, unit } };
}

function traceName(doc: LocatedDocument, path: DocPath, v: unknown, probeIds: Set<string>): string {
  if (typeof v !== 'string' || !/^[A-Za-z_][A-Za-z0-9_-]*\.[A-Za-z0-9_.-]+$/.test(v)) {
    throw doc.fail(path, 'must name a trace as probe.trace, e.g. vLoad.v', v, 'E_TRACE');
  }
  const probe = v.slice(0, v.indexOf('.'));
  if (!probeIds.has(probe)) throw doc.fail(path, `must name a probe of the base scenario; probes: ${[...probeIds].join(', ') || '(none)'}`, v, 'E_TRACE');
  return v;
}

function probeId(doc: LocatedDocument, path: DocPath, v: unknown, probeIds: Set<string>): string {
  if (typeof v !== 'string' || !probeIds.has(v)) {
    throw doc.fail(path, `must name a probe of the base scenario; probes: ${[...probeIds].join(', ') || '(none)'}`, v, 'E_PROBE');
  }
  return v;
}

function output(doc: LocatedDocument, name: string, v: unknown, probeIds: Set<string>, params: ParameterSpec[]): OutputSpec {
  const at: DocPath = ['outputs', name];
  if (!NAME.test(name)) throw doc.fail(at, 'must be an output name (letters, digits, "_" and "-", starting with a letter)', name, 'E_ID');
  if (params.some((p) => p.name === name)) throw doc.fail(at, 'must not reuse a parameter name (both are table columns)', name, 'E_ID');
  if (!isObj(v)) throw doc.fail(at, `must be a mapping with one of: ${OUTPUT_KINDS.join(', ')}`, v, 'E_TYPE');
  const kinds = OUTPUT_KINDS.filter((k) => v[k] !== undefined);
  if (kinds.length !== 1) throw doc.fail(at, `must give exactly one of: ${OUTPUT_KINDS.join(', ')}`, Object.keys(v), 'E_OUTPUT_KIND');
  const kind = kinds[0];
  switch (kind) {
    case 'peak':
      checkKeys(doc, at, v, ['peak']);
      return { name, kind, trace: traceName(doc, [...at, 'peak'], v.peak, probeIds) };
    case 'value-at': {
      checkKeys(doc, at, v, ['value-at', 'time']);
      const trace = traceName(doc, [...at, 'value-at'], v['value-at'], probeIds);
      const timeS = parseQuantity(v.time, 's');
      if (timeS === undefined || timeS < 0) throw doc.fail([...at, 'time'], 'must be a non-negative time such as 1.5us', v.time, 'E_QUANTITY');
      return { name, kind, trace, timeS };
    }
    case 'arrival': {
      checkKeys(doc, at, v, ['arrival', 'threshold']);
      const trace = traceName(doc, [...at, 'arrival'], v.arrival, probeIds);
      const threshold = (['1', 'V', 'A', 'W', 'J'] as UnitSymbol[]).map((u) => parseQuantity(v.threshold, u)).find((x) => x !== undefined);
      if (threshold === undefined || !(threshold > 0)) throw doc.fail([...at, 'threshold'], 'must be a positive level in the trace unit, such as 0.1 or 100mV', v.threshold, 'E_QUANTITY');
      return { name, kind, trace, threshold };
    }
    case 'energy': {
      checkKeys(doc, at, v, ['energy', 'part', 'of']);
      const probe = probeId(doc, [...at, 'energy'], v.energy, probeIds);
      if (typeof v.part !== 'string' || v.part === '') throw doc.fail([...at, 'part'], 'must name a part (or, with of: stored, a line)', v.part, 'E_MISSING');
      const of = v.of ?? 'absorbed';
      if (of !== 'absorbed' && of !== 'delivered' && of !== 'stored') throw doc.fail([...at, 'of'], 'must be one of: absorbed, delivered, stored', of, 'E_ENUM');
      return { name, kind, probe, part: v.part, of };
    }
    case 'output': {
      checkKeys(doc, at, v, ['output', 'path']);
      const probe = probeId(doc, [...at, 'output'], v.output, probeIds);
      const path = parseValuePath(v.path as string);
      if (!path) throw doc.fail([...at, 'path'], 'must be a dotted path into the probe\'s structured output, e.g. totals.relativeResidual', v.path, 'E_PATH');
      return { name, kind, probe, path };
    }
  }
}
