/**
 * Lines whose per-unit-length parameters vary along their length, in two forms of the scenario:
 *
 * - `stretches`: a list of consecutive uniform stretches from the `from` end, each with its
 *   `length` and its parameters as a uniform line gives them (`inductance` and `capacitance`
 *   matrices, or `impedance` and `velocity` for one conductor; `resistance` and `conductance`
 *   optional), all with the line's conductors;
 * - `taper`: a one-conductor line whose characteristic impedance goes smoothly from
 *   `impedance: [Z_from, Z_to]` at constant `velocity`, `shape: exponential` (default) or `linear`,
 *   with the line's `length` and optional constant `resistance` and `conductance`.
 *
 * Both are stepped by an FDTD segment (`fdtd: { cells }`, cells over the whole line; the compile
 * step shares them out, compile/fdtdProfile.ts).
 */
import type { DocPath } from '../errors.ts';
import type { ResolvedLine, ResolvedStretch, ResolvedTaper } from '../model.ts';
import type { LocatedDocument } from './document.ts';
import { DEFAULT_FDTD_CELLS, checkKeys, expectObj, matrix, quantity, velocity } from './resolve.ts';

type Obj = Record<string, unknown>;

/** What resolveLine has read before it hands a varying line over. */
export interface VaryingLineHead {
  id: string;
  index: number;
  from: number;
  to: number;
  conductors: string[] | undefined;
}

const UNIFORM_KEYS = ['inductance', 'capacitance', 'impedance', 'velocity', 'section', 'model', 'modalFrequency'] as const;

/**
 * Resolves a line given by `stretches` or a `taper` (see the module comment).
 * @throws InputError with the path of the offending value: E_LINE_FORM (both forms, or a uniform
 *   line's parameters beside them), E_MISSING, E_MATRIX (conductor counts that differ),
 *   E_LENGTH_MISMATCH (a `length` that is not the stretches' sum), E_TAPER_MULTICONDUCTOR,
 *   E_ENUM, E_RANGE, and the quantity and matrix errors of a uniform line.
 */
export function resolveVaryingLine(doc: LocatedDocument, path: DocPath, l: Obj, head: VaryingLineHead): ResolvedLine {
  if (l.stretches !== undefined && l.taper !== undefined) {
    throw doc.fail(path, 'must give one of stretches or taper, not both', Object.keys(l), 'E_LINE_FORM');
  }
  const form = l.stretches !== undefined ? 'stretches' : 'taper';
  for (const k of UNIFORM_KEYS) {
    if (l[k] !== undefined) {
      const what = form === 'stretches' ? 'each stretch gives its own parameters' : 'the taper gives the line\'s impedance and velocity';
      throw doc.fail([...path, k], `must not be given with ${form} (${what})`, l[k], 'E_LINE_FORM');
    }
  }
  return form === 'stretches' ? resolveStretches(doc, path, l, head) : resolveTaper(doc, path, l, head);
}

function resolveStretches(doc: LocatedDocument, path: DocPath, l: Obj, head: VaryingLineHead): ResolvedLine {
  for (const k of ['resistance', 'conductance'] as const) {
    if (l[k] !== undefined) throw doc.fail([...path, k], `must be given per stretch (stretches[i].${k}), not for the whole line`, l[k], 'E_LINE_FORM');
  }
  const sp = [...path, 'stretches'];
  if (!Array.isArray(l.stretches) || l.stretches.length === 0) {
    throw doc.fail(sp, 'must be a non-empty list of stretches such as [{ length: 2m, impedance: 50ohm, velocity: 0.66c }, ...]', l.stretches, 'E_TYPE');
  }
  let n = head.conductors?.length;
  const stretches: ResolvedStretch[] = l.stretches.map((v, i) => {
    const p = [...sp, i];
    const s = stretchParams(doc, p, v, n);
    n ??= Math.round(Math.sqrt(s.L.length));
    return s;
  });
  const nn = n!;
  const conductors = head.conductors ?? (nn === 1 ? ['w'] : Array.from({ length: nn }, (_, i) => `c${i + 1}`));
  let lengthM = 0;
  for (const s of stretches) lengthM += s.lengthM;
  if (l.length !== undefined) {
    const given = quantity(doc, [...path, 'length'], l.length, 'm', 'positive');
    if (Math.abs(given - lengthM) > 1e-9 * lengthM) {
      throw doc.fail([...path, 'length'], `must equal the sum of the stretches' lengths, ${lengthM} m (or be left out)`, l.length, 'E_LENGTH_MISMATCH');
    }
  }
  const fdtdCells = cells(doc, path, l, stretches.length);
  const first = stretches[0];
  return {
    id: head.id, index: head.index, from: head.from, to: head.to, lengthM, conductors,
    L: first.L, C: first.C, R: first.R, G: first.G, fdtdCells,
    profile: { kind: 'stretches', stretches }, path, origin: `${stretches.length} stretches`,
  };
}

/** One stretch: length and uniform parameters, n conductors when known. */
function stretchParams(doc: LocatedDocument, path: DocPath, v: unknown, n: number | undefined): ResolvedStretch {
  const s = expectObj(doc, path, v, 'a mapping such as { length: 2m, impedance: 50ohm, velocity: 0.66c }');
  checkKeys(doc, path, s, ['length', 'inductance', 'capacitance', 'resistance', 'conductance', 'impedance', 'velocity']);
  if (s.length === undefined) throw doc.fail([...path, 'length'], 'is required, e.g. 2m', undefined, 'E_MISSING');
  const lengthM = quantity(doc, [...path, 'length'], s.length, 'm', 'positive');
  const hasMatrices = s.inductance !== undefined || s.capacitance !== undefined;
  const hasZv = s.impedance !== undefined || s.velocity !== undefined;
  if (hasMatrices === hasZv) {
    throw doc.fail(path, 'must give exactly one of: inductance and capacitance matrices; impedance and velocity (one conductor)', Object.keys(s), 'E_LINE_FORM');
  }
  let L: Float64Array;
  let C: Float64Array;
  if (hasMatrices) {
    if (s.inductance === undefined) throw doc.fail([...path, 'inductance'], 'is required with capacitance (per metre, e.g. 0.25uH/m)', undefined, 'E_MISSING');
    if (s.capacitance === undefined) throw doc.fail([...path, 'capacitance'], 'is required with inductance (per metre, e.g. 100pF/m)', undefined, 'E_MISSING');
    L = matrix(doc, [...path, 'inductance'], s.inductance, n, 'H/m', false);
    n ??= Math.round(Math.sqrt(L.length));
    C = matrix(doc, [...path, 'capacitance'], s.capacitance, n, 'F/m', false);
  } else {
    if (s.impedance === undefined || s.velocity === undefined) throw doc.fail(path, 'must give both impedance and velocity', Object.keys(s), 'E_MISSING');
    if (n !== undefined && n !== 1) {
      throw doc.fail([...path, 'impedance'], `describes one conductor, but the line has ${n} (give inductance and capacitance matrices)`, s.impedance, 'E_MATRIX');
    }
    n = 1;
    const z = quantity(doc, [...path, 'impedance'], s.impedance, 'ohm', 'positive');
    const vel = velocity(doc, [...path, 'velocity'], s.velocity);
    L = Float64Array.of(z / vel);
    C = Float64Array.of(1 / (z * vel));
  }
  const R = s.resistance !== undefined ? matrix(doc, [...path, 'resistance'], s.resistance, n, 'ohm/m', true) : new Float64Array(n * n);
  const G = s.conductance !== undefined ? matrix(doc, [...path, 'conductance'], s.conductance, n, 'S/m', true) : new Float64Array(n * n);
  return { lengthM, L, C, R, G, path };
}

function resolveTaper(doc: LocatedDocument, path: DocPath, l: Obj, head: VaryingLineHead): ResolvedLine {
  const tp = [...path, 'taper'];
  if (head.conductors !== undefined && head.conductors.length !== 1) {
    throw doc.fail([...path, 'conductors'], 'must name one conductor: a taper is available for one-conductor lines (give stretches for more)', l.conductors, 'E_TAPER_MULTICONDUCTOR');
  }
  if (l.length === undefined) throw doc.fail([...path, 'length'], 'is required, e.g. 1.5m', undefined, 'E_MISSING');
  const lengthM = quantity(doc, [...path, 'length'], l.length, 'm', 'positive');
  const t = expectObj(doc, tp, l.taper, 'a mapping such as { impedance: [50ohm, 100ohm], velocity: 0.66c, shape: exponential }');
  checkKeys(doc, tp, t, ['impedance', 'velocity', 'shape']);
  if (!Array.isArray(t.impedance) || t.impedance.length !== 2) {
    throw doc.fail([...tp, 'impedance'], 'must list two impedances, at the from end and at the to end, e.g. [50ohm, 100ohm]', t.impedance, 'E_TYPE');
  }
  const fromOhm = quantity(doc, [...tp, 'impedance', 0], t.impedance[0], 'ohm', 'positive');
  const toOhm = quantity(doc, [...tp, 'impedance', 1], t.impedance[1], 'ohm', 'positive');
  if (t.velocity === undefined) throw doc.fail([...tp, 'velocity'], 'is required, e.g. 0.66c or 2e8m/s', undefined, 'E_MISSING');
  const velocityMps = velocity(doc, [...tp, 'velocity'], t.velocity);
  const shape = t.shape ?? 'exponential';
  if (shape !== 'exponential' && shape !== 'linear') throw doc.fail([...tp, 'shape'], 'must be one of exponential, linear', shape, 'E_ENUM');
  const R = l.resistance !== undefined ? matrix(doc, [...path, 'resistance'], l.resistance, 1, 'ohm/m', true) : new Float64Array(1);
  const G = l.conductance !== undefined ? matrix(doc, [...path, 'conductance'], l.conductance, 1, 'S/m', true) : new Float64Array(1);
  const taper: ResolvedTaper = { fromOhm, toOhm, velocityMps, shape };
  return {
    id: head.id, index: head.index, from: head.from, to: head.to, lengthM, conductors: head.conductors ?? ['w'],
    L: Float64Array.of(fromOhm / velocityMps), C: Float64Array.of(1 / (fromOhm * velocityMps)), R, G,
    fdtdCells: cells(doc, path, l, 1), profile: { kind: 'taper', taper }, path, origin: `${shape} taper`,
  };
}

/** The line's FDTD cells: `fdtd: { cells }` or the default, at least one per stretch. */
function cells(doc: LocatedDocument, path: DocPath, l: Obj, stretches: number): number {
  if (l.fdtd === undefined) return Math.max(DEFAULT_FDTD_CELLS, stretches);
  const f = expectObj(doc, [...path, 'fdtd'], l.fdtd, 'a mapping such as { cells: 200 }');
  checkKeys(doc, [...path, 'fdtd'], f, ['cells']);
  const c = f.cells ?? Math.max(DEFAULT_FDTD_CELLS, stretches);
  const min = Math.max(2, stretches);
  if (typeof c !== 'number' || !Number.isInteger(c) || c < min || c > 1e6) {
    const why = stretches > 1 ? ` (at least one per stretch: ${stretches} stretches)` : '';
    throw doc.fail([...path, 'fdtd', 'cells'], `must be a whole number of cells from ${min} to 1e6${why}`, c, 'E_RANGE');
  }
  return c;
}
