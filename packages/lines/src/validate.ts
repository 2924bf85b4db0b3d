/**
 * Validation of the section input: every check names the path, the rule and the value found.
 */
import { sectionError } from './errors.ts';
import type { SectionPath } from './errors.ts';
import type { DielectricInput } from './dielectric.ts';
import type {
  BundleSpec,
  CoaxSectionInput,
  EarthInput,
  GroundInput,
  InsulationInput,
  MaterialInput,
  MicrostripSectionInput,
  SectionInput,
  StriplineSectionInput,
  WireInput,
  WiresSectionInput,
} from './input.ts';
import { ALUMINIUM_CONDUCTIVITY, COPPER_CONDUCTIVITY } from './constants.ts';

/** Material with numbers: conductivity Infinity means a perfect conductor. */
export interface ResolvedMaterial {
  conductivity: number;
  relPermeability: number;
}

type Obj = Record<string, unknown>;

/** The accepted section kinds. */
export const SECTION_KINDS = ['wires', 'coax', 'microstrip', 'stripline', 'coupled-stripline'] as const;

function isObj(v: unknown): v is Obj {
  return typeof v === 'object' && v !== null && !Array.isArray(v);
}

function asObj(v: unknown, path: SectionPath): Obj {
  if (!isObj(v)) throw sectionError('SECTION_TYPE', path, 'must be an object', v);
  return v;
}

function allowKeys(o: Obj, path: SectionPath, allowed: readonly string[]): void {
  for (const k of Object.keys(o)) {
    if (!allowed.includes(k)) throw sectionError('SECTION_UNKNOWN_KEY', [...path, k], `is not a known field (accepted: ${allowed.join(', ')})`, o[k]);
  }
}

interface NumOpts {
  required?: boolean;
  positive?: boolean;
  nonNegative?: boolean;
  min?: number;
  max?: number;
  integer?: boolean;
  unit?: string;
  what?: string;
}

function num(o: Obj, key: string, path: SectionPath, opts: NumOpts): number | undefined {
  const p = [...path, key];
  const v = o[key];
  const what = opts.what ?? 'number';
  if (v === undefined) {
    if (opts.required) throw sectionError('SECTION_REQUIRED', p, `is required (${what})`, undefined);
    return undefined;
  }
  if (typeof v !== 'number') throw sectionError('SECTION_TYPE', p, `must be a ${what}`, v);
  if (!Number.isFinite(v)) throw sectionError('SECTION_NOT_FINITE', p, `must be a finite ${what}`, v, opts.unit);
  if (opts.positive && !(v > 0)) throw sectionError('SECTION_NOT_POSITIVE', p, `must be a positive ${what}`, v, opts.unit);
  if (opts.nonNegative && v < 0) throw sectionError('SECTION_NEGATIVE', p, `must be a non-negative ${what}`, v, opts.unit);
  if (opts.integer && !Number.isInteger(v)) throw sectionError('SECTION_TYPE', p, `must be an integer`, v);
  if (opts.min !== undefined && v < opts.min) throw sectionError('SECTION_RANGE', p, `must be at least ${opts.min}`, v, opts.unit);
  if (opts.max !== undefined && v > opts.max) throw sectionError('SECTION_RANGE', p, `must be at most ${opts.max}`, v, opts.unit);
  return v;
}

function reqNum(o: Obj, key: string, path: SectionPath, opts: NumOpts): number {
  return num(o, key, path, { ...opts, required: true }) as number;
}

function enumStr<T extends string>(o: Obj, key: string, path: SectionPath, accepted: readonly T[], def?: T): T {
  const v = o[key];
  if (v === undefined && def !== undefined) return def;
  if (typeof v !== 'string' || !accepted.includes(v as T)) {
    throw sectionError(v === undefined ? 'SECTION_REQUIRED' : 'SECTION_ENUM', [...path, key], `must be one of ${accepted.map((a) => `'${a}'`).join(', ')}`, v);
  }
  return v as T;
}

const LENGTH = { unit: 'm', what: 'length' };

/**
 * Validates a material (default copper).
 *
 * @param v the material input
 * @param path its path in the section
 * @returns conductivity [S/m] (Infinity for 'perfect') and relative permeability
 * @throws SectionError for an unknown name or bad numbers
 * @example resolveMaterial('aluminium', []).conductivity // 3.77e7
 */
export function resolveMaterial(v: unknown, path: SectionPath): ResolvedMaterial {
  if (v === undefined || v === 'copper') return { conductivity: COPPER_CONDUCTIVITY, relPermeability: 1 };
  if (v === 'aluminium') return { conductivity: ALUMINIUM_CONDUCTIVITY, relPermeability: 1 };
  if (v === 'perfect') return { conductivity: Infinity, relPermeability: 1 };
  if (typeof v === 'string') throw sectionError('SECTION_ENUM', path, "must be 'copper', 'aluminium', 'perfect' or { conductivity, relPermeability? }", v);
  const o = asObj(v, path);
  allowKeys(o, path, ['conductivity', 'relPermeability']);
  const conductivity = reqNum(o, 'conductivity', path, { positive: true, unit: 'S/m', what: 'conductivity' });
  const relPermeability = num(o, 'relPermeability', path, { min: 1, what: 'relative permeability' }) ?? 1;
  return { conductivity, relPermeability };
}

const DIELECTRIC_KEYS = ['relPermittivity', 'lossTangent', 'model', 'specAtHz', 'lowHz', 'highHz'] as const;

/**
 * Validates a dielectric description and fills its defaults.
 *
 * @param v the dielectric input
 * @param path its path in the section
 * @param extraKeys further keys allowed in the same object (e.g. 'thickness')
 * @returns the dielectric with defaults
 * @throws SectionError for bad or out-of-range values
 * @example resolveDielectric({ relPermittivity: 2.25 }, []).lossTangent // 0
 */
export function resolveDielectric(v: unknown, path: SectionPath, extraKeys: readonly string[] = []): DielectricInput {
  const o = asObj(v, path);
  allowKeys(o, path, [...DIELECTRIC_KEYS, ...extraKeys]);
  const relPermittivity = reqNum(o, 'relPermittivity', path, { min: 1, what: 'relative permittivity' });
  const lossTangent = num(o, 'lossTangent', path, { nonNegative: true, max: 1, what: 'loss tangent' }) ?? 0;
  const model = enumStr(o, 'model', path, ['constant', 'djordjevic-sarkar'] as const, 'constant');
  const specAtHz = num(o, 'specAtHz', path, { positive: true, unit: 'Hz', what: 'frequency' }) ?? 1e9;
  const lowHz = num(o, 'lowHz', path, { positive: true, unit: 'Hz', what: 'frequency' }) ?? 1e3;
  const highHz = num(o, 'highHz', path, { positive: true, unit: 'Hz', what: 'frequency' }) ?? 1e12;
  if (model === 'djordjevic-sarkar') {
    if (!(highHz > lowHz)) throw sectionError('SECTION_ORDER', [...path, 'highHz'], `must be above lowHz (${lowHz} Hz)`, highHz, 'Hz');
    if (lossTangent === 0) throw sectionError('SECTION_RANGE', [...path, 'lossTangent'], "must be positive for model 'djordjevic-sarkar'", lossTangent);
  }
  const out: DielectricInput = { relPermittivity, lossTangent, model, specAtHz, lowHz, highHz };
  if (model === 'djordjevic-sarkar') {
    // eps_inf must stay >= 1 for a physical material.
    const w1 = 2 * Math.PI * lowHz;
    const w2 = 2 * Math.PI * highHz;
    const ws = 2 * Math.PI * specAtHz;
    const lnr = Math.log(w2 / w1);
    const im = (Math.atan2(ws, w2) - Math.atan2(ws, w1)) / lnr; // Im ln((w2 + jw)/(w1 + jw)) / ln(w2/w1)
    const re = (0.5 * Math.log((w2 * w2 + ws * ws) / (w1 * w1 + ws * ws))) / lnr;
    const d = (-relPermittivity * lossTangent) / im;
    if (relPermittivity - d * re < 1) throw sectionError('SECTION_RANGE', [...path, 'lossTangent'], 'is too large for this relative permittivity: the wideband model would need eps_inf < 1', lossTangent);
  }
  return out;
}

function resolveInsulation(v: unknown, path: SectionPath): InsulationInput {
  const o = asObj(v, path);
  const thickness = reqNum(o, 'thickness', path, { nonNegative: true, ...LENGTH });
  return { ...resolveDielectric(o, path, ['thickness']), thickness };
}

function resolveEarth(o: Obj, path: SectionPath): EarthInput {
  allowKeys(o, path, ['resistivityOhmM', 'relPermittivity', 'model']);
  const resistivityOhmM = reqNum(o, 'resistivityOhmM', path, { positive: true, unit: 'ohm*m', what: 'resistivity' });
  const relPermittivity = num(o, 'relPermittivity', path, { min: 1, what: 'relative permittivity' });
  const model = enumStr(o, 'model', path, ['carson', 'complex-depth'] as const, 'carson');
  return relPermittivity === undefined ? { resistivityOhmM, model } : { resistivityOhmM, relPermittivity, model };
}

function resolveGround(v: unknown, path: SectionPath, allowNone: boolean): GroundInput {
  if (v === 'perfect' || (allowNone && v === 'none')) return v;
  if (isObj(v)) return resolveEarth(v, path);
  throw sectionError(v === undefined ? 'SECTION_REQUIRED' : 'SECTION_ENUM', path, `must be ${allowNone ? "'none', " : ''}'perfect' or { resistivityOhmM, relPermittivity?, model? }`, v);
}

/** Validated wire with its resolved material and its outer radius. */
export interface ResolvedWire extends WireInput {
  resolvedMaterial: ResolvedMaterial;
  /** Radius of the circle used for fields: equivalent radius for bundles [m]. */
  fieldRadius: number;
  /** Outermost radius (insulation or bundle envelope) for geometry checks [m]. */
  outerRadius: number;
  /** Radius of the metal for contact checks [m]. */
  metalRadius: number;
}

/** Validated 'wires' section. */
export interface ResolvedWires extends WiresSectionInput {
  wires: ResolvedWire[];
  referenceIndex: number;
  solverUsed: 'thin-wire' | 'numeric';
}

function resolveWires(o: Obj): ResolvedWires {
  allowKeys(o, [], ['kind', 'ground', 'reference', 'wires', 'solver', 'harmonics']);
  const ground = resolveGround(o.ground, ['ground'], true);
  const solver = enumStr(o, 'solver', [], ['auto', 'thin-wire', 'numeric'] as const, 'auto');
  const harmonics = num(o, 'harmonics', [], { integer: true, min: 1, max: 64, what: 'integer' });
  if (!Array.isArray(o.wires)) throw sectionError(o.wires === undefined ? 'SECTION_REQUIRED' : 'SECTION_TYPE', ['wires'], 'must be a list of wires', o.wires);
  if (o.wires.length === 0) throw sectionError('SECTION_RANGE', ['wires'], 'must hold at least one wire', o.wires);
  const names = new Map<string, number>();
  const wires: ResolvedWire[] = o.wires.map((wv: unknown, i: number) => {
    const p: SectionPath = ['wires', i];
    const w = asObj(wv, p);
    allowKeys(w, p, ['name', 'x', 'y', 'radius', 'material', 'insulation', 'bundle']);
    const name = w.name;
    if (typeof name !== 'string' || name === '') throw sectionError(name === undefined ? 'SECTION_REQUIRED' : 'SECTION_TYPE', [...p, 'name'], 'must be a non-empty string', name);
    if (names.has(name)) throw sectionError('SECTION_DUPLICATE_NAME', [...p, 'name'], `must be unique (also used by wires[${names.get(name)}])`, name);
    names.set(name, i);
    const x = reqNum(w, 'x', p, LENGTH);
    const y = reqNum(w, 'y', p, LENGTH);
    const radius = reqNum(w, 'radius', p, { positive: true, ...LENGTH });
    const resolvedMaterial = resolveMaterial(w.material, [...p, 'material']);
    const insulation = w.insulation === undefined ? undefined : resolveInsulation(w.insulation, [...p, 'insulation']);
    let bundle: BundleSpec | undefined;
    let fieldRadius = radius;
    let metalRadius = radius;
    if (w.bundle !== undefined) {
      const bp: SectionPath = [...p, 'bundle'];
      const b = asObj(w.bundle, bp);
      allowKeys(b, bp, ['count', 'spacing']);
      const count = reqNum(b, 'count', bp, { integer: true, min: 2, max: 16, what: 'integer' });
      const spacing = reqNum(b, 'spacing', bp, { positive: true, ...LENGTH });
      if (!(spacing > 2 * radius)) throw sectionError('SECTION_OVERLAP', [...bp, 'spacing'], `must exceed the sub-conductor diameter ${2 * radius} m so sub-conductors do not touch`, spacing, 'm');
      if (insulation !== undefined) throw sectionError('SECTION_UNSUPPORTED', [...p, 'insulation'], 'cannot be combined with bundle (bundled sub-conductors are bare)', w.insulation);
      bundle = { count, spacing };
      const rb = spacing / (2 * Math.sin(Math.PI / count));
      // Geometric mean radius of a regular bundle (equivalent radius), common practice.
      fieldRadius = Math.pow(count * radius * Math.pow(rb, count - 1), 1 / count);
      metalRadius = rb + radius;
    }
    const outerRadius = metalRadius + (insulation?.thickness ?? 0);
    return { name, x, y, radius, insulation, bundle, resolvedMaterial, fieldRadius, outerRadius, metalRadius };
  });
  let referenceIndex = -1;
  if (ground === 'none') {
    if (wires.length < 2) throw sectionError('SECTION_RANGE', ['wires'], "must hold at least two wires when ground is 'none' (one is the reference)", o.wires);
    const r = o.reference;
    if (typeof r !== 'string' || !names.has(r)) throw sectionError('SECTION_REFERENCE', ['reference'], `must name one of the wires (${[...names.keys()].join(', ')}) when ground is 'none'`, r);
    referenceIndex = names.get(r) as number;
  } else if (o.reference !== undefined) {
    throw sectionError('SECTION_REFERENCE', ['reference'], "is only used with ground 'none' (the ground is the reference)", o.reference);
  }
  // Geometry.
  if (ground !== 'none') {
    wires.forEach((w, i) => {
      if (!(w.y - w.metalRadius > 0)) throw sectionError('SECTION_BELOW_GROUND', ['wires', i, 'y'], `must put the conductor above ground: height must exceed ${w.metalRadius} m`, w.y, 'm');
      if (w.y - w.outerRadius < -1e-12 * w.outerRadius) throw sectionError('SECTION_BELOW_GROUND', ['wires', i, 'y'], `must keep the insulation above ground: height must be at least ${w.outerRadius} m`, w.y, 'm');
    });
  }
  for (let i = 0; i < wires.length; i++) {
    for (let j = 0; j < i; j++) {
      const a = wires[i];
      const b = wires[j];
      const d = Math.hypot(a.x - b.x, a.y - b.y);
      if (d < (a.outerRadius + b.outerRadius) * (1 - 1e-12) || d <= a.metalRadius + b.metalRadius) {
        throw sectionError('SECTION_OVERLAP', ['wires', i], `must not overlap wires[${j}] ('${b.name}'): centre distance must be at least ${a.outerRadius + b.outerRadius} m`, d, 'm');
      }
    }
  }
  const anyInsulated = wires.some((w) => w.insulation !== undefined && w.insulation.thickness > 0);
  if (solver === 'thin-wire' && anyInsulated) {
    const i = wires.findIndex((w) => w.insulation !== undefined && w.insulation.thickness > 0);
    throw sectionError('SECTION_UNSUPPORTED', ['solver'], `must be 'numeric' or 'auto' when a wire is insulated (wires[${i}] is): the thin-wire formulas have no insulation`, solver);
  }
  const solverUsed = solver === 'auto' ? (anyInsulated || thinWireProximity(wires, ground !== 'none') > AUTO_PROXIMITY ? 'numeric' : 'thin-wire') : solver;
  return { kind: 'wires', ground, wires, solver, ...(harmonics === undefined ? {} : { harmonics }), referenceIndex, solverUsed };
}

/**
 * With solver 'auto', bare wires closer than this ratio of radius to distance (to another wire or
 * to its image) use the numerical solver: the thin-wire formulas are off by about (r/d)^2, so
 * 0.03 keeps their error below 1e-3.
 */
export const AUTO_PROXIMITY = 0.03;

/** Largest radius / distance ratio over wire pairs and wire-image pairs. */
export function thinWireProximity(wires: ResolvedWire[], withGround: boolean): number {
  let p = 0;
  for (let i = 0; i < wires.length; i++) {
    const a = wires[i];
    if (withGround) p = Math.max(p, a.fieldRadius / (2 * a.y));
    for (let j = 0; j < wires.length; j++) {
      if (i === j) continue;
      const b = wires[j];
      p = Math.max(p, a.fieldRadius / Math.hypot(a.x - b.x, a.y - b.y));
    }
  }
  return p;
}

/** Validated coax. */
export interface ResolvedCoax extends CoaxSectionInput {
  inner: ResolvedMaterial;
  shieldMaterial: ResolvedMaterial;
  shieldThickness: number;
}

function resolveCoax(o: Obj): ResolvedCoax {
  allowKeys(o, [], ['kind', 'innerRadius', 'shieldInnerRadius', 'dielectric', 'innerMaterial', 'shield', 'overGround']);
  const innerRadius = reqNum(o, 'innerRadius', [], { positive: true, ...LENGTH });
  const shieldInnerRadius = reqNum(o, 'shieldInnerRadius', [], { positive: true, ...LENGTH });
  if (!(shieldInnerRadius > innerRadius)) throw sectionError('SECTION_ORDER', ['shieldInnerRadius'], `must exceed innerRadius (${innerRadius} m)`, shieldInnerRadius, 'm');
  if (o.dielectric === undefined) throw sectionError('SECTION_REQUIRED', ['dielectric'], 'is required ({ relPermittivity, lossTangent? })', undefined);
  const dielectric = resolveDielectric(o.dielectric, ['dielectric']);
  const inner = resolveMaterial(o.innerMaterial, ['innerMaterial']);
  let shieldMaterial: ResolvedMaterial = { conductivity: Infinity, relPermeability: 1 };
  let shieldThickness = 0;
  if (o.shield !== undefined) {
    const s = asObj(o.shield, ['shield']);
    allowKeys(s, ['shield'], ['thickness', 'material']);
    const t = num(s, 'thickness', ['shield'], { positive: true, ...LENGTH });
    shieldMaterial = resolveMaterial(s.material, ['shield', 'material']);
    if (t === undefined) shieldMaterial = { conductivity: Infinity, relPermeability: 1 };
    else shieldThickness = t;
  }
  let overGround: ResolvedCoax['overGround'];
  if (o.overGround !== undefined) {
    const gp: SectionPath = ['overGround'];
    const g = asObj(o.overGround, gp);
    allowKeys(g, gp, ['height', 'ground', 'jacket']);
    const height = reqNum(g, 'height', gp, { positive: true, ...LENGTH });
    const ground = resolveGround(g.ground, [...gp, 'ground'], false) as 'perfect' | EarthInput;
    const jacket = g.jacket === undefined ? undefined : resolveInsulation(g.jacket, [...gp, 'jacket']);
    const outer = shieldInnerRadius + shieldThickness + (jacket?.thickness ?? 0);
    if (!(height > shieldInnerRadius + shieldThickness)) throw sectionError('SECTION_BELOW_GROUND', [...gp, 'height'], `must put the shield above ground: height must exceed ${shieldInnerRadius + shieldThickness} m`, height, 'm');
    if (height < outer) throw sectionError('SECTION_BELOW_GROUND', [...gp, 'height'], `must keep the jacket above ground: height must be at least ${outer} m`, height, 'm');
    overGround = { height, ground, jacket };
  }
  return { kind: 'coax', innerRadius, shieldInnerRadius, dielectric, inner, shieldMaterial, shieldThickness, overGround };
}

/** Validated microstrip. */
export interface ResolvedMicrostrip extends MicrostripSectionInput {
  resolvedMaterial: ResolvedMaterial;
}

function thicknessForLoss(o: Obj, m: ResolvedMaterial): number {
  const t = num(o, 'thickness', [], { positive: true, ...LENGTH });
  if (t === undefined && Number.isFinite(m.conductivity)) {
    throw sectionError('SECTION_REQUIRED', ['thickness'], "is required to compute conductor loss (or set material: 'perfect')", undefined);
  }
  return t ?? 0;
}

function resolveMicrostrip(o: Obj): ResolvedMicrostrip {
  allowKeys(o, [], ['kind', 'width', 'substrateHeight', 'thickness', 'substrate', 'material']);
  const width = reqNum(o, 'width', [], { positive: true, ...LENGTH });
  const substrateHeight = reqNum(o, 'substrateHeight', [], { positive: true, ...LENGTH });
  const resolvedMaterial = resolveMaterial(o.material, ['material']);
  const thickness = thicknessForLoss(o, resolvedMaterial);
  if (o.substrate === undefined) throw sectionError('SECTION_REQUIRED', ['substrate'], 'is required ({ relPermittivity, lossTangent? })', undefined);
  const substrate = resolveDielectric(o.substrate, ['substrate']);
  // Hammerstad-Jensen's stated accuracy range: 0.01 <= W/h <= 100, er <= 128.
  const u = width / substrateHeight;
  if (u < 0.01 || u > 100) throw sectionError('SECTION_RANGE', ['width'], `must give width/substrateHeight within 0.01..100 (Hammerstad-Jensen range), ratio is ${u}`, width, 'm');
  if (substrate.relPermittivity > 128) throw sectionError('SECTION_RANGE', ['substrate', 'relPermittivity'], 'must be at most 128 (Hammerstad-Jensen range)', substrate.relPermittivity);
  return { kind: 'microstrip', width, substrateHeight, thickness, substrate, resolvedMaterial };
}

/** Validated stripline or coupled stripline. */
export interface ResolvedStripline extends StriplineSectionInput {
  resolvedMaterial: ResolvedMaterial;
}

function resolveStripline(o: Obj, kind: 'stripline' | 'coupled-stripline'): ResolvedStripline {
  const keys = ['kind', 'width', 'plateSpacing', 'thickness', 'dielectric', 'material'];
  if (kind === 'coupled-stripline') keys.push('gap');
  allowKeys(o, [], keys);
  const width = reqNum(o, 'width', [], { positive: true, ...LENGTH });
  const plateSpacing = reqNum(o, 'plateSpacing', [], { positive: true, ...LENGTH });
  const gap = kind === 'coupled-stripline' ? reqNum(o, 'gap', [], { positive: true, ...LENGTH }) : undefined;
  const resolvedMaterial = resolveMaterial(o.material, ['material']);
  const thickness = thicknessForLoss(o, resolvedMaterial);
  if (thickness >= plateSpacing / 2) throw sectionError('SECTION_RANGE', ['thickness'], `must be well below half the plate spacing (${plateSpacing / 2} m)`, thickness, 'm');
  if (o.dielectric === undefined) throw sectionError('SECTION_REQUIRED', ['dielectric'], 'is required ({ relPermittivity, lossTangent? })', undefined);
  const dielectric = resolveDielectric(o.dielectric, ['dielectric']);
  return { kind, width, gap, plateSpacing, thickness, dielectric, resolvedMaterial };
}

/** A validated section of any kind. */
export type ResolvedSection = ResolvedWires | ResolvedCoax | ResolvedMicrostrip | ResolvedStripline;

/**
 * Validates a section input and resolves defaults.
 *
 * @param input the section object (numbers in SI)
 * @returns the validated section
 * @throws SectionError naming the path, the rule and the value
 * @example resolveSection({ kind: 'coax', innerRadius: 1e-3, shieldInnerRadius: 3e-3, dielectric: { relPermittivity: 2.25 } }).kind // 'coax'
 */
export function resolveSection(input: unknown): ResolvedSection {
  const o = asObj(input, []);
  const kind = enumStr(o, 'kind', [], SECTION_KINDS);
  switch (kind) {
    case 'wires':
      return resolveWires(o);
    case 'coax':
      return resolveCoax(o);
    case 'microstrip':
      return resolveMicrostrip(o);
    case 'stripline':
    case 'coupled-stripline':
      return resolveStripline(o, kind);
  }
}

export type { SectionInput };
