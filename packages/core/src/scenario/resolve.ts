/**
 * Scenario validation: from a parsed document to a ResolvedScenario. Every rule that a scenario
 * can break is checked here, with the path, line and column of the offending value, before any
 * array is allocated for the run.
 */
import { createHash } from 'node:crypto';
import { endianness } from 'node:os';
import type { DocPath } from '../errors.ts';
import type { ResolvedJunction, ResolvedLine, ResolvedPart, ResolvedPort, ResolvedProbe, ResolvedScenario, ResolvedTime } from '../model.ts';
import type { PluginRegistry } from '../plugins/registry.ts';
import { resolveParams } from '../plugins/params.ts';
import { parseQuantity, quantityName, unitExample, type UnitSymbol } from '../units.ts';
import type { LineSection } from '@skein/lines';
import { parseLocatedDocument, plainDocument, type LocatedDocument } from './document.ts';
import { resolveSection } from './section.ts';
import { resolveVaryingLine } from './resolveVarying.ts';

/** The format version this engine reads. */
export const SCENARIO_FORMAT_VERSION = 1;

/** Cells of an FDTD segment when the scenario does not say (a lossy line). */
export const DEFAULT_FDTD_CELLS = 40;

/** Name of the reference node in every junction. */
export const REFERENCE_NODE = 'ref';

const SPEED_OF_LIGHT = 299_792_458;
const ID = /^[A-Za-z_][A-Za-z0-9_-]*$/;

/** Options of scenario resolution. */
export interface ResolveOptions {
  /** Plugins the scenario may name. */
  registry: PluginRegistry;
  /** File name for messages. */
  file?: string;
  /** Turns a line's `section` into matrices; default: the line-geometry package (@skein/lines). */
  sectionResolver?: SectionResolver;
}

/** Matrices of a cross-section: high-frequency L and C (n x n row-major) and the full model. */
export interface SectionMatrices {
  conductors: string[];
  L: Float64Array;
  C: Float64Array;
  origin: string;
  /** The frequency-dependent model, kept for the frequency-domain and lossy solvers. */
  model?: LineSection;
}

/** Resolves a `section` object at `path` (throws located errors through `doc.fail`). */
export type SectionResolver = (section: unknown, path: DocPath, doc: LocatedDocument) => SectionMatrices;

/**
 * Reads scenario text (YAML or JSON) into a resolved, validated network.
 * @throws InputError naming file, line, column, path, rule and value.
 * @example resolveScenarioText(fs.readFileSync('harness.yaml', 'utf8'), { registry, file: 'harness.yaml' })
 */
export function resolveScenarioText(text: string, options: ResolveOptions): ResolvedScenario {
  return resolveScenarioDocument(parseLocatedDocument(text, options.file), options);
}

/** Resolves scenario data built in code (same rules, no line numbers). */
export function resolveScenarioData(data: unknown, options: ResolveOptions): ResolvedScenario {
  return resolveScenarioDocument(plainDocument(data, options.file), options);
}

type Obj = Record<string, unknown>;

function isObj(v: unknown): v is Obj {
  return v !== null && typeof v === 'object' && !Array.isArray(v);
}

export function expectObj(doc: LocatedDocument, path: DocPath, v: unknown, what: string): Obj {
  if (!isObj(v)) throw doc.fail(path, `must be ${what}`, v, 'E_TYPE');
  return v;
}

export function checkKeys(doc: LocatedDocument, path: DocPath, v: Obj, allowed: readonly string[]): void {
  for (const k of Object.keys(v)) {
    if (!allowed.includes(k)) throw doc.fail([...path, k], `is not a known key here; accepted: ${allowed.join(', ')}`, v[k], 'E_UNKNOWN_KEY');
  }
}

export function quantity(doc: LocatedDocument, path: DocPath, v: unknown, unit: UnitSymbol, rule: 'positive' | 'nonnegative' | 'any' = 'any'): number {
  const x = parseQuantity(v, unit);
  if (x === undefined) throw doc.fail(path, `must be a ${quantityName(unit)} such as ${unitExample(unit)}`, v, 'E_QUANTITY');
  if (rule === 'positive' && !(x > 0)) throw doc.fail(path, `must be a positive ${quantityName(unit)}`, v, 'E_RANGE');
  if (rule === 'nonnegative' && !(x >= 0)) throw doc.fail(path, `must be a non-negative ${quantityName(unit)}`, v, 'E_RANGE');
  return x;
}

function identifier(doc: LocatedDocument, path: DocPath, v: unknown, what: string): string {
  if (typeof v !== 'string' || !ID.test(v)) throw doc.fail(path, `must be ${what} (letters, digits, "_" and "-", starting with a letter)`, v, 'E_ID');
  return v;
}

/**
 * Reads an n x n matrix per metre. A single conductor may give a scalar. Checks symmetry and
 * (unless `allowZero`) positive definiteness.
 */
export function matrix(doc: LocatedDocument, path: DocPath, v: unknown, n: number | undefined, unit: UnitSymbol, semidefinite: boolean): Float64Array {
  let rows: unknown[][];
  if (!Array.isArray(v)) rows = [[v]];
  else if (v.length > 0 && v.every((r) => Array.isArray(r))) rows = v as unknown[][];
  else if (v.length === 1) rows = [v];
  else throw doc.fail(path, 'must be a square matrix given as a list of rows (or one number for one conductor)', v, 'E_MATRIX');
  const m = n ?? rows.length;
  if (rows.length !== m) throw doc.fail(path, `must have ${m} rows, one per conductor`, v, 'E_MATRIX');
  const out = new Float64Array(m * m);
  const nested = Array.isArray(v) && Array.isArray(v[0]);
  for (let i = 0; i < m; i++) {
    const row = rows[i];
    if (!Array.isArray(row) || row.length !== m) throw doc.fail([...path, i], `must be a row of ${m} values`, row, 'E_MATRIX');
    for (let j = 0; j < m; j++) {
      const x = row[j];
      // Plain numbers need no unit parsing (and no path unless they fail).
      out[i * m + j] = typeof x === 'number' && Number.isFinite(x) ? x : quantity(doc, nested ? [...path, i, j] : path, x, unit);
    }
  }
  for (let i = 0; i < m; i++) {
    for (let j = 0; j < i; j++) {
      const a = out[i * m + j];
      const b = out[j * m + i];
      if (Math.abs(a - b) > 1e-12 * Math.max(Math.abs(a), Math.abs(b))) {
        throw doc.fail([...path, i, j], `must equal the element at row ${j + 1}, column ${i + 1} (the matrix must be symmetric)`, v instanceof Array ? (v[i] as unknown[])[j] : v, 'E_NOT_SYMMETRIC');
      }
    }
  }
  if (semidefinite) {
    for (let i = 0; i < m; i++) if (out[i * m + i] < 0) throw doc.fail(path, 'must have non-negative diagonal entries', v, 'E_NOT_POSITIVE');
  } else if (!isPositiveDefinite(out, m)) {
    throw doc.fail(path, 'must be positive definite (a physical line has positive self terms larger than its mutual terms)', v, 'E_NOT_POSITIVE_DEFINITE');
  }
  return out;
}

/**
 * True when the symmetric m x m row-major matrix is positive definite: its Cholesky factorisation
 * A = L L^T exists with a positive diagonal (Golub and Van Loan, Matrix Computations, 4th ed.,
 * sec. 4.2). Written out rather than taken from ml-matrix because a network of 10^5
 * four-conductor lines checks 2 * 10^5 matrices, and building the library's matrix objects cost
 * more than the factorisations (1.4 s of a 9 s resolve); tested against ml-matrix's
 * CholeskyDecomposition.
 */
export function isPositiveDefinite(a: Float64Array, m: number): boolean {
  const l = new Float64Array(m * m);
  for (let j = 0; j < m; j++) {
    let d = a[j * m + j];
    for (let k = 0; k < j; k++) d -= l[j * m + k] * l[j * m + k];
    if (!(d > 0)) return false;
    const ljj = Math.sqrt(d);
    l[j * m + j] = ljj;
    for (let i = j + 1; i < m; i++) {
      // Symmetrised: the caller checked symmetry to rounding; the factorisation wants it exact.
      let s = 0.5 * (a[i * m + j] + a[j * m + i]);
      for (let k = 0; k < j; k++) s -= l[i * m + k] * l[j * m + k];
      l[i * m + j] = s / ljj;
    }
  }
  return true;
}

function resolveTime(doc: LocatedDocument, v: unknown): ResolvedTime {
  const path = ['time'];
  const t = expectObj(doc, path, v, 'a mapping with at least "end", e.g. { end: 2us }');
  checkKeys(doc, path, t, ['end', 'step', 'stepsPerFeature', 'record', 'delays']);
  if (t.end === undefined) throw doc.fail([...path, 'end'], 'is required: the end of the simulated interval, e.g. 2us', undefined, 'E_MISSING');
  const endS = quantity(doc, [...path, 'end'], t.end, 's', 'positive');
  let stepS: number | undefined;
  if (t.step !== undefined && t.step !== 'auto') {
    stepS = quantity(doc, [...path, 'step'], t.step, 's', 'positive');
    if (stepS >= endS) throw doc.fail([...path, 'step'], 'must be shorter than time.end', t.step, 'E_RANGE');
  }
  const int = (key: string, def: number, min: number): number => {
    const x = t[key];
    if (x === undefined) return def;
    if (typeof x !== 'number' || !Number.isInteger(x) || x < min) throw doc.fail([...path, key], `must be an integer of at least ${min}`, x, 'E_RANGE');
    return x;
  };
  const delays = t.delays ?? 'interpolate';
  if (delays !== 'interpolate' && delays !== 'round') throw doc.fail([...path, 'delays'], 'must be one of interpolate, round', delays, 'E_ENUM');
  const stepsPerFeature = int('stepsPerFeature', 10, 2);
  const recordEvery = int('record', 1, 1);
  if (stepS !== undefined && endS / stepS > 5e8) throw doc.fail([...path, 'step'], 'gives more than 5e8 steps; choose a longer step or a shorter end', t.step, 'E_RANGE');
  return { endS, stepS, stepsPerFeature, recordEvery, delays };
}

function resolveLine(doc: LocatedDocument, id: string, v: unknown, index: number, junctionIndex: Map<string, number>, opts: ResolveOptions): ResolvedLine {
  const path = ['lines', id];
  const l = expectObj(doc, path, v, 'a mapping describing the line (from, to, length, and its matrices or section)');
  checkKeys(doc, path, l, ['from', 'to', 'length', 'conductors', 'inductance', 'capacitance', 'resistance', 'conductance', 'impedance', 'velocity', 'section', 'fdtd', 'model', 'modalFrequency', 'stretches', 'taper']);
  const end = (key: 'from' | 'to'): number => {
    if (l[key] === undefined) throw doc.fail([...path, key], `is required: the junction at the line's ${key} end`, undefined, 'E_MISSING');
    const j = junctionIndex.get(String(l[key]));
    if (typeof l[key] !== 'string' || j === undefined) {
      throw doc.fail([...path, key], `must name a junction; known: ${[...junctionIndex.keys()].join(', ') || '(none)'}`, l[key], 'E_UNKNOWN_JUNCTION');
    }
    return j;
  };
  const from = end('from');
  const to = end('to');

  let conductors: string[] | undefined;
  if (l.conductors !== undefined) {
    if (!Array.isArray(l.conductors) || l.conductors.length === 0) throw doc.fail([...path, 'conductors'], 'must be a non-empty list of conductor names', l.conductors, 'E_TYPE');
    conductors = l.conductors.map((c, i) => identifier(doc, [...path, 'conductors', i], c, 'a conductor name'));
    const seen = new Set<string>();
    conductors.forEach((c, i) => {
      if (seen.has(c)) throw doc.fail([...path, 'conductors', i], 'must be unique within the line', c, 'E_DUPLICATE');
      seen.add(c);
    });
  }
  // A line whose parameters vary along it (stretches or a taper): scenario/resolveVarying.ts.
  if (l.stretches !== undefined || l.taper !== undefined) return resolveVaryingLine(doc, path, l, { id, index, from, to, conductors });
  if (l.length === undefined) throw doc.fail([...path, 'length'], 'is required, e.g. 12m', undefined, 'E_MISSING');
  const lengthM = quantity(doc, [...path, 'length'], l.length, 'm', 'positive');
  let L: Float64Array;
  let C: Float64Array;
  let R: Float64Array | undefined;
  let G: Float64Array | undefined;
  let origin: string;
  let section: ResolvedLine['section'];
  const hasMatrices = l.inductance !== undefined || l.capacitance !== undefined;
  const hasZv = l.impedance !== undefined || l.velocity !== undefined;
  const forms = [hasMatrices, hasZv, l.section !== undefined].filter(Boolean).length;
  if (forms !== 1) {
    throw doc.fail(path, 'must give exactly one of: inductance and capacitance matrices; impedance and velocity (one conductor); a section', Object.keys(l), 'E_LINE_FORM');
  }
  if (hasMatrices) {
    if (l.inductance === undefined) throw doc.fail([...path, 'inductance'], 'is required with capacitance (per metre, e.g. 0.25uH/m)', undefined, 'E_MISSING');
    if (l.capacitance === undefined) throw doc.fail([...path, 'capacitance'], 'is required with inductance (per metre, e.g. 100pF/m)', undefined, 'E_MISSING');
    L = matrix(doc, [...path, 'inductance'], l.inductance, conductors?.length, 'H/m', false);
    const n = Math.round(Math.sqrt(L.length));
    C = matrix(doc, [...path, 'capacitance'], l.capacitance, n, 'F/m', false);
    if (l.resistance !== undefined) R = matrix(doc, [...path, 'resistance'], l.resistance, n, 'ohm/m', true);
    if (l.conductance !== undefined) G = matrix(doc, [...path, 'conductance'], l.conductance, n, 'S/m', true);
    origin = 'matrices';
  } else if (hasZv) {
    if (l.impedance === undefined || l.velocity === undefined) throw doc.fail(path, 'must give both impedance and velocity', Object.keys(l), 'E_MISSING');
    if (conductors !== undefined && conductors.length !== 1) throw doc.fail([...path, 'conductors'], 'must name exactly one conductor when impedance and velocity are given', l.conductors, 'E_MATRIX');
    const z = quantity(doc, [...path, 'impedance'], l.impedance, 'ohm', 'positive');
    const vel = velocity(doc, [...path, 'velocity'], l.velocity);
    L = Float64Array.of(z / vel);
    C = Float64Array.of(1 / (z * vel));
    if (l.resistance !== undefined) R = matrix(doc, [...path, 'resistance'], l.resistance, 1, 'ohm/m', true);
    if (l.conductance !== undefined) G = matrix(doc, [...path, 'conductance'], l.conductance, 1, 'S/m', true);
    origin = 'impedance and velocity';
  } else {
    if (l.resistance !== undefined || l.conductance !== undefined) {
      throw doc.fail(path, 'must not give resistance or conductance together with a section (the section computes them)', Object.keys(l), 'E_LINE_FORM');
    }
    const s = (opts.sectionResolver ?? resolveSection)(l.section, [...path, 'section'], doc);
    section = s.model;
    if (conductors !== undefined && conductors.length !== s.conductors.length) {
      throw doc.fail([...path, 'conductors'], `must name ${s.conductors.length} conductors, as the section has`, l.conductors, 'E_MATRIX');
    }
    conductors ??= s.conductors;
    L = s.L;
    C = s.C;
    origin = s.origin;
  }
  const n = Math.round(Math.sqrt(L.length));
  if (conductors === undefined) conductors = n === 1 ? ['w'] : Array.from({ length: n }, (_, i) => `c${i + 1}`);
  if (conductors.length !== n) throw doc.fail([...path, 'conductors'], `must name ${n} conductors, one per matrix row`, l.conductors, 'E_MATRIX');
  R ??= new Float64Array(n * n);
  G ??= new Float64Array(n * n);
  let fdtdCells: number | undefined;
  if (l.fdtd !== undefined) {
    const f = expectObj(doc, [...path, 'fdtd'], l.fdtd, 'a mapping such as { cells: 200 }');
    checkKeys(doc, [...path, 'fdtd'], f, ['cells']);
    const c = f.cells ?? DEFAULT_FDTD_CELLS;
    if (typeof c !== 'number' || !Number.isInteger(c) || c < 2 || c > 1e6) throw doc.fail([...path, 'fdtd', 'cells'], 'must be a whole number of cells from 2 to 1e6', c, 'E_RANGE');
    fdtdCells = c;
  } else if (R.some((x) => x !== 0) || G.some((x) => x !== 0)) {
    fdtdCells = DEFAULT_FDTD_CELLS;
  }
  let frequencyDependent: boolean | undefined;
  if (l.model !== undefined) {
    if (l.model !== 'frequency-dependent' && l.model !== 'high-frequency') {
      throw doc.fail([...path, 'model'], 'must be one of frequency-dependent, high-frequency', l.model, 'E_ENUM');
    }
    if (l.model === 'frequency-dependent') {
      if (!section) throw doc.fail([...path, 'model'], 'needs a line given by a section (its parameters over frequency)', l.model, 'E_FD_NEEDS_SECTION');
      frequencyDependent = true;
    }
  }
  let fdModalFrequencyHz: number | undefined;
  if (l.modalFrequency !== undefined) {
    if (!frequencyDependent || n < 2) throw doc.fail([...path, 'modalFrequency'], 'applies only to a multiconductor line with model: frequency-dependent (it sets the frequency of the constant modal transformation)', l.modalFrequency, 'E_FD_MODAL_FREQUENCY');
    fdModalFrequencyHz = quantity(doc, [...path, 'modalFrequency'], l.modalFrequency, 'Hz', 'positive');
  }
  if (fdtdCells !== undefined && section) {
    throw doc.fail([...path, 'fdtd'], 'is not available for a line given by a section in this version (the section\'s losses depend on frequency); give R, L, G, C matrices', l.fdtd ?? 'lossy section', 'E_FDTD_SECTION');
  }
  return {
    fdtdCells, frequencyDependent, fdModalFrequencyHz, id, index, from, to, lengthM, conductors, L, C, R, G, path, origin, section, sectionInput: section ? l.section : undefined };
}

export function velocity(doc: LocatedDocument, path: DocPath, v: unknown): number {
  let x: number | undefined;
  if (typeof v === 'string' && /^\s*[0-9.eE+-]+\s*c\s*$/.test(v)) x = Number(v.trim().slice(0, -1)) * SPEED_OF_LIGHT;
  else x = parseQuantity(v, 'm/s');
  if (x === undefined || !Number.isFinite(x)) throw doc.fail(path, 'must be a speed such as 2e8m/s or a fraction of light speed such as 0.66c', v, 'E_QUANTITY');
  if (!(x > 0) || x > SPEED_OF_LIGHT * (1 + 1e-12)) throw doc.fail(path, 'must be positive and at most the speed of light (1c)', v, 'E_RANGE');
  return x;
}

interface PortRefTarget {
  line: ResolvedLine;
  end: 0 | 1;
  conductor: number;
}

function resolvePortRef(doc: LocatedDocument, path: DocPath, ref: unknown, junction: number, lines: Map<string, ResolvedLine>): PortRefTarget {
  if (typeof ref !== 'string') throw doc.fail(path, 'must be a line-end conductor written "line.conductor" or "line.from.conductor"', ref, 'E_TYPE');
  const parts = ref.split('.');
  const line = lines.get(parts[0]);
  if (!line) throw doc.fail(path, `must start with a line id; known: ${[...lines.keys()].join(', ') || '(none)'}`, ref, 'E_UNKNOWN_LINE');
  let endName: string | undefined;
  let cond: string | undefined;
  if (parts.length === 1) cond = line.conductors.length === 1 ? line.conductors[0] : undefined;
  else if (parts.length === 2) cond = parts[1];
  else if (parts.length === 3) [endName, cond] = [parts[1], parts[2]];
  if (cond === undefined || parts.length > 3) {
    throw doc.fail(path, `must name a conductor of line ${line.id} (${line.conductors.join(', ')}), as "${line.id}.${line.conductors[0]}"`, ref, 'E_UNKNOWN_CONDUCTOR');
  }
  const k = line.conductors.indexOf(cond);
  if (k < 0) throw doc.fail(path, `must name a conductor of line ${line.id}; it has ${line.conductors.join(', ')}`, ref, 'E_UNKNOWN_CONDUCTOR');
  let end: 0 | 1;
  if (endName !== undefined) {
    if (endName !== 'from' && endName !== 'to') throw doc.fail(path, 'must use "from" or "to" as the end in "line.end.conductor"', ref, 'E_PORT_REF');
    end = endName === 'from' ? 0 : 1;
    if ((end === 0 ? line.from : line.to) !== junction) throw doc.fail(path, `names the ${endName} end of line ${line.id}, which is not at this junction`, ref, 'E_PORT_ELSEWHERE');
  } else {
    const atFrom = line.from === junction;
    const atTo = line.to === junction;
    if (!atFrom && !atTo) throw doc.fail(path, `names line ${line.id}, which has no end at this junction`, ref, 'E_PORT_ELSEWHERE');
    if (atFrom && atTo) throw doc.fail(path, `is ambiguous: both ends of line ${line.id} are at this junction; write "${line.id}.from.${cond}" or "${line.id}.to.${cond}"`, ref, 'E_PORT_REF');
    end = atFrom ? 0 : 1;
  }
  return { line, end, conductor: k };
}

/** Which line-end conductors are on a node: one flag per conductor per line end, lines in order. */
interface WiredPorts {
  /** First flag of each line (its from end, then its to end). */
  base: Int32Array;
  seen: Uint8Array;
}

function wiredPorts(lines: readonly ResolvedLine[]): WiredPorts {
  const base = new Int32Array(lines.length + 1);
  for (let i = 0; i < lines.length; i++) base[i + 1] = base[i] + 2 * lines[i].conductors.length;
  return { base, seen: new Uint8Array(base[lines.length]) };
}

function resolveJunction(
  doc: LocatedDocument, id: string, v: unknown, index: number, lines: Map<string, ResolvedLine>, partIds: Set<string>,
  wired: WiredPorts, registry: PluginRegistry,
): ResolvedJunction {
  const path = ['junctions', id];
  const j = expectObj(doc, path, v, 'a mapping with nodes (and optional parts)');
  checkKeys(doc, path, j, ['nodes', 'parts']);
  const nodesObj = expectObj(doc, [...path, 'nodes'], j.nodes, 'a mapping from node name to the list of line-end conductors on that node');
  const nodes: string[] = [];
  const ports: ResolvedPort[] = [];
  for (const [name, list] of Object.entries(nodesObj)) {
    const np = [...path, 'nodes', name];
    identifier(doc, np, name, 'a node name');
    if (name === REFERENCE_NODE) throw doc.fail(np, `must not be "${REFERENCE_NODE}", the reserved name of the reference`, name, 'E_RESERVED');
    const node = nodes.length;
    nodes.push(name);
    const refs = list === null ? [] : Array.isArray(list) ? list : [list];
    refs.forEach((ref, i) => {
      const pp = Array.isArray(list) ? [...np, i] : np;
      const t = resolvePortRef(doc, pp, ref, index, lines);
      const key = wired.base[t.line.index] + t.end * t.line.conductors.length + t.conductor;
      if (wired.seen[key] !== 0) throw doc.fail(pp, 'is wired twice; each line-end conductor sits on exactly one node', ref, 'E_PORT_TWICE');
      wired.seen[key] = 1;
      ports.push({ line: t.line.index, end: t.end, conductor: t.conductor, node });
    });
  }
  if (nodes.length === 0) throw doc.fail([...path, 'nodes'], 'must hold at least one node', j.nodes, 'E_EMPTY');
  const parts: ResolvedPart[] = [];
  if (j.parts !== undefined) {
    const partsObj = expectObj(doc, [...path, 'parts'], j.parts, 'a mapping from part id to its description');
    for (const [pid, pv] of Object.entries(partsObj)) {
      const pp = [...path, 'parts', pid];
      identifier(doc, pp, pid, 'a part id');
      if (partIds.has(pid)) throw doc.fail(pp, 'is a part id used twice; part ids are unique in the scenario', pid, 'E_DUPLICATE');
      partIds.add(pid);
      parts.push(resolvePart(doc, pp, pid, pv, index, nodes, registry));
    }
  }
  // A node with nothing on it is wired to nothing.
  nodes.forEach((name, k) => {
    const used = ports.some((p) => p.node === k) || parts.some((p) => p.plus === k || p.minus === k);
    if (!used) throw doc.fail([...path, 'nodes', name], 'is wired to nothing: give it a line-end conductor or a part', nodesObj[name], 'E_WIRED_TO_NOTHING');
  });
  return { id, index, nodes, ports, parts, path };
}

function resolvePart(doc: LocatedDocument, path: DocPath, id: string, v: unknown, junction: number, nodes: string[], registry: PluginRegistry): ResolvedPart {
  const p = expectObj(doc, path, v, 'a mapping with "load: TYPE" or "source: TYPE" and "between: [plus, minus]"');
  const role = p.source !== undefined ? 'source' : p.load !== undefined ? 'load' : undefined;
  if (role === undefined || (p.source !== undefined && p.load !== undefined)) {
    throw doc.fail(path, 'must have exactly one of "load: TYPE" or "source: TYPE"', Object.keys(p), 'E_PART_KIND');
  }
  const type = p[role];
  const map = role === 'source' ? registry.sources : registry.loads;
  if (typeof type !== 'string' || !map.has(type)) {
    throw doc.fail([...path, role], `must be a registered ${role} type: ${[...map.keys()].sort().join(', ') || '(none registered)'}`, type, 'E_UNKNOWN_TYPE');
  }
  const between = p.between;
  if (!Array.isArray(between) || between.length !== 2) {
    throw doc.fail([...path, 'between'], `must be [plus, minus]: two nodes of this junction or "${REFERENCE_NODE}"`, between, 'E_BETWEEN');
  }
  const term = (i: number): number => {
    const name = between[i];
    if (name === REFERENCE_NODE) return -1;
    const k = typeof name === 'string' ? nodes.indexOf(name) : -1;
    if (k < 0) throw doc.fail([...path, 'between', i], `must be a node of this junction (${nodes.join(', ')}) or "${REFERENCE_NODE}"`, name, 'E_UNKNOWN_NODE');
    return k;
  };
  const plus = term(0);
  const minus = term(1);
  if (plus === minus) throw doc.fail([...path, 'between'], 'must join two different nodes', between, 'E_BETWEEN');
  const plugin = map.get(type)!.plugin;
  let drive: 'voltage' | 'current' = 'voltage';
  let resistanceOhm = 0;
  const reserved = role === 'source' ? ['source', 'between', 'drive', 'resistance'] : ['load', 'between'];
  if (role === 'source') {
    if (p.drive !== undefined && p.drive !== 'voltage' && p.drive !== 'current') throw doc.fail([...path, 'drive'], 'must be one of voltage, current', p.drive, 'E_ENUM');
    drive = (p.drive as 'voltage' | 'current' | undefined) ?? 'voltage';
    if (p.resistance !== undefined) resistanceOhm = quantity(doc, [...path, 'resistance'], p.resistance, 'ohm', drive === 'voltage' ? 'nonnegative' : 'positive');
    else resistanceOhm = drive === 'voltage' ? 0 : Infinity;
  }
  const params = resolveParams(plugin.params, p, path, doc, reserved, `${role} ${type}`);
  return { id, junction, role, type, plus, minus, params, drive, resistanceOhm, path };
}

function resolveProbe(doc: LocatedDocument, id: string, v: unknown, registry: PluginRegistry): ResolvedProbe {
  const path = ['probes', id];
  const p = expectObj(doc, path, v, 'a mapping with "probe: TYPE" and its parameters');
  const type = p.probe;
  if (typeof type !== 'string' || !registry.probes.has(type)) {
    throw doc.fail([...path, 'probe'], `must be a registered probe type: ${registry.typesOf('probe').join(', ') || '(none registered)'}`, type, 'E_UNKNOWN_TYPE');
  }
  const params = resolveParams(registry.probes.get(type)!.plugin.params, p, path, doc, ['probe'], `probe ${type}`);
  return { id, type, params, path };
}

/** Resolves an already parsed document. */
export function resolveScenarioDocument(doc: LocatedDocument, options: ResolveOptions): ResolvedScenario {
  const root = expectObj(doc, [], doc.data, 'a mapping with skein, time, lines and junctions');
  checkKeys(doc, [], root, ['skein', 'title', 'time', 'lines', 'junctions', 'probes']);
  if (root.skein !== SCENARIO_FORMAT_VERSION) {
    throw doc.fail(['skein'], `must be ${SCENARIO_FORMAT_VERSION}, the scenario format version this engine reads`, root.skein, 'E_FORMAT_VERSION');
  }
  if (root.title !== undefined && typeof root.title !== 'string') throw doc.fail(['title'], 'must be a string', root.title, 'E_TYPE');
  if (root.time === undefined) throw doc.fail(['time'], 'is required, e.g. time: { end: 2us }', undefined, 'E_MISSING');
  const time = resolveTime(doc, root.time);
  const junctionsObj = expectObj(doc, ['junctions'], root.junctions, 'a mapping from junction id to its nodes and parts');
  const linesObj = expectObj(doc, ['lines'], root.lines, 'a mapping from line id to its description');
  const junctionIndex = new Map<string, number>();
  for (const id of Object.keys(junctionsObj)) {
    identifier(doc, ['junctions', id], id, 'a junction id');
    junctionIndex.set(id, junctionIndex.size);
  }
  if (junctionIndex.size === 0) throw doc.fail(['junctions'], 'must hold at least one junction', root.junctions, 'E_EMPTY');
  const lineMap = new Map<string, ResolvedLine>();
  for (const [id, lv] of Object.entries(linesObj)) {
    identifier(doc, ['lines', id], id, 'a line id');
    lineMap.set(id, resolveLine(doc, id, lv, lineMap.size, junctionIndex, options));
  }
  if (lineMap.size === 0) throw doc.fail(['lines'], 'must hold at least one line', root.lines, 'E_EMPTY');
  const partIds = new Set<string>();
  const lines = [...lineMap.values()];
  const wired = wiredPorts(lines);
  const junctions = Object.entries(junctionsObj).map(([id, jv], k) =>
    resolveJunction(doc, id, jv, k, lineMap, partIds, wired, options.registry),
  );
  for (const line of lines) {
    for (const end of [0, 1] as const) {
      line.conductors.forEach((c, k) => {
        if (wired.seen[wired.base[line.index] + end * line.conductors.length + k] === 0) {
          const jid = junctions[end === 0 ? line.from : line.to].id;
          throw doc.fail(['junctions', jid, 'nodes'], `must wire conductor ${c} of line ${line.id} (its ${end === 0 ? 'from' : 'to'} end); to leave it open give it a node of its own`, Object.keys((junctionsObj[jid] as Obj)?.nodes ?? {}), 'E_PORT_UNWIRED');
        }
      });
    }
  }
  const probes: ResolvedProbe[] = [];
  if (root.probes !== undefined) {
    const probesObj = expectObj(doc, ['probes'], root.probes, 'a mapping from probe id to its description');
    for (const [id, pv] of Object.entries(probesObj)) {
      identifier(doc, ['probes', id], id, 'a probe id');
      probes.push(resolveProbe(doc, id, pv, options.registry));
    }
  }
  const title = (root.title as string | undefined) ?? (options.file ?? 'untitled scenario');
  const resolved: Omit<ResolvedScenario, 'digest' | 'locate'> = { title, file: options.file, time, lines, junctions, probes };
  return { ...resolved, digest: digestOf(resolved), locate: (path) => doc.locate(path) };
}

/** Keys that do not change the computation: where a value came from, and closures. */
const DIGEST_SKIP = new Set(['path', 'file', 'section', 'locate']);

/** Bytes of typed arrays are hashed as they are stored; on a big-endian host they are hashed as text instead. */
const LITTLE_ENDIAN = endianness() === 'LE';

/**
 * SHA-256 (hex) of a canonical form of `value`: objects in key order, keys `path`, `file`,
 * `section` and `locate` left out (where a value came from does not change the result), numbers as
 * their shortest text, typed arrays by type, length and little-endian bytes. Two streams are
 * hashed, the text of the structure and the bytes of the typed arrays in the order met, and the
 * digest is the hash of both hashes: a resolved network of 10^5 four-conductor lines (3 * 10^6
 * matrix entries) is hashed without turning its matrices into text.
 */
export function digestOf(value: unknown): string {
  const textHash = createHash('sha256');
  const bytesHash = createHash('sha256');
  let text = '';
  const stage = new Uint8Array(1 << 20);
  let at = 0;
  const quoted = new Map<string, string>();
  const walk = (x: unknown): void => {
    if (x === null || x === undefined) {
      text += 'n';
    } else if (typeof x === 'number') {
      text += `${x};`;
    } else if (typeof x === 'string') {
      text += JSON.stringify(x);
    } else if (typeof x === 'boolean') {
      text += x ? 't' : 'f';
    } else if (typeof x === 'bigint') {
      text += `${x}b;`;
    } else if (ArrayBuffer.isView(x)) {
      const tag = (x as { constructor: { name: string } }).constructor.name;
      const len = (x as unknown as { length?: number }).length ?? x.byteLength;
      if (LITTLE_ENDIAN) {
        text += `<${tag}:${len}>`;
        if (at + x.byteLength > stage.length) {
          bytesHash.update(stage.subarray(0, at));
          at = 0;
        }
        const b = new Uint8Array(x.buffer, x.byteOffset, x.byteLength);
        if (b.length > stage.length) bytesHash.update(b);
        else {
          stage.set(b, at);
          at += b.length;
        }
      } else {
        text += `<${tag}:${len}:`;
        const a = x as unknown as ArrayLike<number>;
        for (let i = 0; i < a.length; i++) text += `${a[i]};`;
        text += '>';
      }
    } else if (Array.isArray(x)) {
      text += '[';
      for (let i = 0; i < x.length; i++) walk(x[i]);
      text += ']';
    } else if (typeof x === 'object') {
      const o = x as Record<string, unknown> & { toJSON?: () => unknown };
      if (typeof o.toJSON === 'function') {
        walk(o.toJSON());
        return;
      }
      text += '{';
      for (const k in o) {
        if (!Object.prototype.hasOwnProperty.call(o, k)) continue;
        const v = o[k];
        if (v === undefined || typeof v === 'function' || DIGEST_SKIP.has(k)) continue;
        let q = quoted.get(k);
        if (q === undefined) {
          q = `${JSON.stringify(k)}:`;
          if (quoted.size < 4096) quoted.set(k, q);
        }
        text += q;
        walk(v);
      }
      text += '}';
    }
    // Functions and symbols contribute nothing (as in JSON).
    if (text.length > 1 << 16) {
      textHash.update(text);
      text = '';
    }
  };
  walk(value);
  textHash.update(text);
  bytesHash.update(stage.subarray(0, at));
  return createHash('sha256').update(textHash.digest()).update(bytesHash.digest()).digest('hex');
}
