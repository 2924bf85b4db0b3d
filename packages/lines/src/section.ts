/**
 * computeSection: from a validated cross-section to per-unit-length matrices over frequency.
 */
import type { Complex } from './complex.ts';
import { cadd, cdiv, cmul, cscale, csub } from './complex.ts';
import { sectionError } from './errors.ts';
import { resolveSection } from './validate.ts';
import type { ResolvedCoax, ResolvedMicrostrip, ResolvedStripline, ResolvedWires, ResolvedMaterial } from './validate.ts';
import type { EarthInput } from './input.ts';
import { dielectricModel } from './dielectric.ts';
import type { DielectricModel } from './dielectric.ts';
import { roundWireDcInternalInductance, roundWireInternalImpedance, roundWireInternalImpedanceS, slabImpedance, slabImpedanceS } from './skin.ts';
import { carsonEarthImpedance, carsonEarthImpedanceS, complexDepthEarthImpedance, complexDepthEarthImpedanceS } from './earth.ts';
import { imageMethodWires } from './closedForms.ts';
import { solveInsulatedBundle } from './bundleSolver.ts';
import type { BundleWire } from './bundleSolver.ts';
import { coupledStripline, microstrip, stripline } from './printed.ts';
import { EPS0, MU0 } from './constants.ts';

/** Per-unit-length R, L, G, C at one frequency, n x n row-major. */
export interface Rlgc {
  /** Resistance [ohm/m] (internal impedance and earth return included). */
  R: Float64Array;
  /** Inductance [H/m] (external + internal + earth return). */
  L: Float64Array;
  /** Conductance [S/m]. */
  G: Float64Array;
  /** Capacitance [F/m]. */
  C: Float64Array;
}

/** Series impedance Z = R + j omega L and shunt admittance Y = G + j omega C, n x n row-major. */
export interface ZY {
  /** Re Z [ohm/m]. */
  Zre: Float64Array;
  /** Im Z [ohm/m]. */
  Zim: Float64Array;
  /** Re Y [S/m]. */
  Yre: Float64Array;
  /** Im Y [S/m]. */
  Yim: Float64Array;
}

/** The per-unit-length description of a line cross-section. */
export interface LineSection {
  /** Conductor names, in matrix order (the reference is not listed). */
  conductors: string[];
  /** Number of conductors. */
  n: number;
  /** High-frequency (lossless) inductance, n x n row-major [H/m]. */
  L: Float64Array;
  /** High-frequency (lossless) capacitance, n x n row-major [F/m]. */
  C: Float64Array;
  /** R, L, G, C at fHz >= 0 [Hz]; at 0 the DC values. Fresh arrays on every call. */
  rlgcAt(fHz: number): Rlgc;
  /** Z and Y at fHz >= 0 [Hz]. Fresh arrays on every call. */
  zyAt(fHz: number): ZY;
  /**
   * Z(s) and Y(s) at complex frequency s = sigma + j omega (sigma [1/s] >= 0, omega [rad/s] >= 0),
   * the analytic continuation of zyAt (Z = R + j omega L becomes Z(s); at sigma = 0 the two agree).
   * Fresh arrays on every call. Throws SectionError SECTION_NOT_CONTINUABLE for a model that has no
   * continuation (a constant loss tangent), naming it.
   */
  zyAtLaplace?(sigma: number, omegaRadS: number): ZY;
  /** One-line human description. */
  describe: string;
}

/**
 * Frequency at which the earth-return inductance is reported for fHz = 0: Carson's inductance grows
 * like ln(1/f) without bound as f -> 0, while omega L = 0 at DC anyway [Hz].
 */
export const DC_EARTH_INDUCTANCE_HZ = 1;

interface Model {
  conductors: string[];
  n: number;
  Lhf: Float64Array;
  Chf: Float64Array;
  /** R and total L at f >= 0. */
  rl(fHz: number): { R: Float64Array; L: Float64Array };
  /** G and C at f >= 0. */
  gc(fHz: number): { G: Float64Array; C: Float64Array };
  /** Z(s) and Y(s) at complex s (the analytic continuation); throws SECTION_NOT_CONTINUABLE. */
  zyS(s: Complex): ZY;
  describe: string;
}

/** The error of a section model that has no continuation to complex frequency. */
function notContinuable(path: (string | number)[], what: string, value: unknown): never {
  throw sectionError('SECTION_NOT_CONTINUABLE', path, `has no continuation to complex frequency s = sigma + j omega (${what})`, value);
}

/** eps_r(s) of a dielectric, or the error naming it. */
function epsAtS(d: DielectricModel, s: Complex, path: (string | number)[], input: unknown): Complex {
  if (!d.atS) notContinuable(path, "a constant loss tangent is not causal; give the dielectric model 'djordjevic-sarkar'", input);
  return d.atS(s);
}

/** Fills Z = s L + z into a ZY, n x n. */
function zyFrom(n: number, s: Complex, L: Float64Array, zAdd: (idx: number) => Complex, C: Float64Array, cAdd: (idx: number) => Complex): ZY {
  const Zre = new Float64Array(n * n);
  const Zim = new Float64Array(n * n);
  const Yre = new Float64Array(n * n);
  const Yim = new Float64Array(n * n);
  for (let k = 0; k < n * n; k++) {
    const z = zAdd(k);
    Zre[k] = s.re * L[k] + z.re;
    Zim[k] = s.im * L[k] + z.im;
    // Y = s (C + dC), dC complex
    const c = cAdd(k);
    const cr = C[k] + c.re;
    const ci = c.im;
    Yre[k] = s.re * cr - s.im * ci;
    Yim[k] = s.re * ci + s.im * cr;
  }
  return { Zre, Zim, Yre, Yim };
}

/** Adds a complex impedance z [ohm/m] at frequency f into R and L at (i, j). */
function addZ(R: Float64Array, L: Float64Array, idx: number, z: Complex, fHz: number): void {
  R[idx] += z.re;
  L[idx] += z.im / (2 * Math.PI * fHz);
}

function isPerfect(m: ResolvedMaterial): boolean {
  return !Number.isFinite(m.conductivity);
}

function earthCorrection(earth: EarthInput, hi: number, hj: number, x: number, fHz: number): Complex {
  const e = { resistivityOhmM: earth.resistivityOhmM, relPermittivity: earth.relPermittivity };
  return earth.model === 'complex-depth' ? complexDepthEarthImpedance(hi, hj, x, fHz, e) : carsonEarthImpedance(hi, hj, x, fHz, e);
}

/** earthCorrection at complex s (Carson or Deri continued). */
function earthCorrectionS(earth: EarthInput, hi: number, hj: number, x: number, s: Complex): Complex {
  const e = { resistivityOhmM: earth.resistivityOhmM, relPermittivity: earth.relPermittivity };
  return earth.model === 'complex-depth' ? complexDepthEarthImpedanceS(hi, hj, x, s, e) : carsonEarthImpedanceS(hi, hj, x, s, e);
}

function earthLabel(g: EarthInput): string {
  return `lossy earth (${g.resistivityOhmM} ohm*m${g.relPermittivity ? `, er ${g.relPermittivity}` : ''}, ${g.model === 'complex-depth' ? 'complex depth' : 'Carson integral'})`;
}

/** Internal impedance of a (possibly bundled) wire; at f = 0 im holds the DC internal inductance times 1 rad/s. */
function wireInternal(w: ResolvedWires['wires'][number], fHz: number): { z: Complex; lDc: number } {
  const m = w.resolvedMaterial;
  const count = w.bundle?.count ?? 1;
  if (isPerfect(m)) return { z: { re: 0, im: 0 }, lDc: 0 };
  const z = roundWireInternalImpedance(w.radius, fHz, m.conductivity, m.relPermeability);
  return { z: cscale(z, 1 / count), lDc: roundWireDcInternalInductance(m.relPermeability) / count };
}

function wiresModel(s: ResolvedWires): Model {
  const ref = s.referenceIndex;
  const signal = s.wires.map((_, i) => i).filter((i) => i !== ref);
  const n = signal.length;
  const conductors = signal.map((i) => s.wires[i].name);
  const ground = s.ground === 'none' ? 'none' : 'perfect';
  let Lhf: Float64Array;
  let Chf: Float64Array;
  const sens: Float64Array[] = [];
  const dielectrics: DielectricModel[] = [];
  /** A wire of each dielectric group (for the error that names a model without continuation). */
  const dielectricWire: number[] = [];
  let numericHarmonics = 0;
  let numericChange = NaN;
  if (s.solverUsed === 'thin-wire') {
    const r = imageMethodWires(s.wires.map((w) => ({ x: w.x, y: w.y, radius: w.fieldRadius })), ground, ref);
    Lhf = r.L;
    Chf = r.C;
  } else {
    const models = s.wires.map((w) => (w.insulation && w.insulation.thickness > 0 ? dielectricModel(w.insulation) : undefined));
    const bundle = (eps: (number | undefined)[]): BundleWire[] =>
      s.wires.map((w, i) => {
        const e = eps[i];
        return e === undefined ? { x: w.x, y: w.y, radius: w.fieldRadius } : { x: w.x, y: w.y, radius: w.fieldRadius, insulation: { thickness: (w.insulation as { thickness: number }).thickness, relPermittivity: e } };
      });
    const epsHf = models.map((d) => d?.highFrequency);
    const solve = (eps: (number | undefined)[], N: number): { C: Float64Array; L: Float64Array } =>
      solveInsulatedBundle({ wires: bundle(eps), ground, referenceIndex: ref, harmonics: N });
    let N = s.harmonics ?? 6;
    let r = solve(epsHf, N);
    if (s.harmonics === undefined) {
      // Automatic refinement: double N until C and L change by less than 1e-7 (relative to the
      // largest diagonal term) or the system would pass 800 unknowns (about a second of LU in ml-matrix).
      const circles = s.wires.length + models.filter((d) => d !== undefined).length;
      for (const next of [12, 24, 48]) {
        if (circles * (2 * next + 1) > 800) break;
        const q = solve(epsHf, next);
        const ch = Math.max(relChange(q.C, r.C, n), relChange(q.L, r.L, n));
        N = next;
        r = q;
        numericChange = ch;
        if (ch < 1e-7) break;
      }
    }
    numericHarmonics = N;
    Lhf = r.L;
    Chf = r.C;
    // Wires whose insulation is described identically share one sensitivity dC/d eps (one group).
    const groups = new Map<string, number[]>();
    s.wires.forEach((w, i) => {
      const d = models[i];
      if (d === undefined || !(d.lossy || d.dispersive)) return;
      const { thickness: _t, ...rest } = w.insulation as NonNullable<typeof w.insulation>;
      const key = JSON.stringify(rest);
      const g = groups.get(key);
      if (g) g.push(i);
      else groups.set(key, [i]);
    });
    // dC/d eps by central differences (step 1e-4 relative: truncation ~1e-8, round-off ~1e-12).
    for (const members of groups.values()) {
      const d = models[members[0]] as DielectricModel;
      const h = 1e-4 * d.highFrequency;
      const up = epsHf.slice();
      const dn = epsHf.slice();
      for (const i of members) {
        up[i] = d.highFrequency + h;
        dn[i] = Math.max(1, d.highFrequency - h);
      }
      const cu = solve(up, N).C;
      const cd = solve(dn, N).C;
      const step = (up[members[0]] as number) - (dn[members[0]] as number);
      sens.push(cu.map((v, k) => (v - cd[k]) / step));
      dielectrics.push(d);
      dielectricWire.push(members[0]);
    }
  }
  const earth = typeof s.ground === 'object' ? s.ground : undefined;
  const rl = (fHz: number): { R: Float64Array; L: Float64Array } => {
    const R = new Float64Array(n * n);
    const L = Lhf.slice();
    const zRef = ref >= 0 ? wireInternal(s.wires[ref], fHz) : { z: { re: 0, im: 0 }, lDc: 0 };
    for (let a = 0; a < n; a++) {
      const wi = wireInternal(s.wires[signal[a]], fHz);
      for (let b = 0; b < n; b++) {
        const idx = a * n + b;
        if (fHz === 0) {
          R[idx] += zRef.z.re + (a === b ? wi.z.re : 0);
          L[idx] += zRef.lDc + (a === b ? wi.lDc : 0);
        } else {
          addZ(R, L, idx, a === b ? cadd(wi.z, zRef.z) : zRef.z, fHz);
        }
      }
    }
    if (earth) {
      const fe = fHz === 0 ? DC_EARTH_INDUCTANCE_HZ : fHz;
      for (let a = 0; a < n; a++) {
        for (let b = a; b < n; b++) {
          const wa = s.wires[signal[a]];
          const wb = s.wires[signal[b]];
          const dz = earthCorrection(earth, wa.y, wb.y, wa.x - wb.x, fe);
          const idxs = a === b ? [a * n + a] : [a * n + b, b * n + a];
          for (const idx of idxs) {
            if (fHz !== 0) R[idx] += dz.re;
            L[idx] += dz.im / (2 * Math.PI * fe);
          }
        }
      }
    }
    return { R, L };
  };
  const gc = (fHz: number): { G: Float64Array; C: Float64Array } => {
    const G = new Float64Array(n * n);
    const C = Chf.slice();
    const omega = 2 * Math.PI * fHz;
    dielectrics.forEach((d, w) => {
      const e = d.at(fHz);
      const S = sens[w];
      for (let k = 0; k < n * n; k++) {
        C[k] += (e.re - d.highFrequency) * S[k];
        G[k] += omega * e.im * S[k];
      }
    });
    return { G, C };
  };
  const gLabel = s.ground === 'none' ? `free space, reference '${s.wires[ref].name}'` : s.ground === 'perfect' ? 'perfect ground' : earthLabel(s.ground);
  const describe = `${n} wire conductor(s) [${conductors.join(', ')}] over ${gLabel}; ${s.solverUsed === 'thin-wire' ? 'thin-wire image method' : `multipole solver (${numericHarmonics} harmonics${Number.isNaN(numericChange) ? '' : `, last refinement changed C, L by ${numericChange.toExponential(1)}`})`}`;
  const internalS = (w: ResolvedWires['wires'][number], sc: Complex): Complex => {
    const m = w.resolvedMaterial;
    if (isPerfect(m)) return { re: 0, im: 0 };
    return cscale(roundWireInternalImpedanceS(w.radius, sc, m.conductivity, m.relPermeability), 1 / (w.bundle?.count ?? 1));
  };
  const zyS = (sc: Complex): ZY => {
    const zRef = ref >= 0 ? internalS(s.wires[ref], sc) : { re: 0, im: 0 };
    const zi = signal.map((i) => internalS(s.wires[i], sc));
    const dz = new Array<Complex>(n * n).fill({ re: 0, im: 0 });
    if (earth) {
      for (let a = 0; a < n; a++) {
        for (let b = a; b < n; b++) {
          const wa = s.wires[signal[a]];
          const wb = s.wires[signal[b]];
          const z = earthCorrectionS(earth, wa.y, wb.y, wa.x - wb.x, sc);
          dz[a * n + b] = z;
          dz[b * n + a] = z;
        }
      }
    }
    const eps = dielectrics.map((d, w) => {
      const i = dielectricWire[w];
      return cadd(epsAtS(d, sc, ['wires', i, 'insulation'], s.wires[i].insulation), { re: -d.highFrequency, im: 0 });
    });
    return zyFrom(n, sc, Lhf, (k) => {
      const a = Math.floor(k / n);
      const b = k % n;
      return cadd(cadd(zRef, a === b ? zi[a] : { re: 0, im: 0 }), dz[k]);
    }, Chf, (k) => {
      let re = 0;
      let im = 0;
      eps.forEach((e, w) => { re += e.re * sens[w][k]; im += e.im * sens[w][k]; });
      return { re, im };
    });
  };
  return { conductors, n, Lhf, Chf, rl, gc, zyS, describe };
}

function coaxModel(s: ResolvedCoax): Model {
  const a = s.innerRadius;
  const b = s.shieldInnerRadius;
  const lg = Math.log(b / a);
  const diel = dielectricModel(s.dielectric);
  const Lc = (MU0 / (2 * Math.PI)) * lg;
  const cUnit = (2 * Math.PI * EPS0) / lg; // capacitance per unit relative permittivity
  const t = s.shieldThickness;
  const shieldPerfect = t === 0 || isPerfect(s.shieldMaterial);
  const rm = b + t / 2;
  const innerZ = (fHz: number): { z: Complex; lDc: number } =>
    isPerfect(s.inner) ? { z: { re: 0, im: 0 }, lDc: 0 } : { z: roundWireInternalImpedance(a, fHz, s.inner.conductivity, s.inner.relPermeability), lDc: roundWireDcInternalInductance(s.inner.relPermeability) };
  // Shield: thin-tube (planar) surface and transfer impedances per unit length; DC inductance term omega*mu*t/3 / (2 pi rm).
  const shieldZ = (fHz: number): { surf: Complex; transfer: Complex; lSurfDc: number; lTransDc: number } => {
    if (shieldPerfect) return { surf: { re: 0, im: 0 }, transfer: { re: 0, im: 0 }, lSurfDc: 0, lTransDc: 0 };
    const m = s.shieldMaterial;
    const z = slabImpedance(t, fHz, m.conductivity, m.relPermeability);
    const w = 2 * Math.PI * rm;
    return { surf: cscale(z.surface, 1 / w), transfer: cscale(z.transfer, 1 / w), lSurfDc: (MU0 * m.relPermeability * t) / 3 / w, lTransDc: (-MU0 * m.relPermeability * t) / 6 / w };
  };
  // Continuations to complex s: the same loop impedances with Z(s) of the conductors.
  const innerZS = (sc: Complex): Complex => (isPerfect(s.inner) ? { re: 0, im: 0 } : roundWireInternalImpedanceS(a, sc, s.inner.conductivity, s.inner.relPermeability));
  const shieldZS = (sc: Complex): { surf: Complex; transfer: Complex } => {
    if (shieldPerfect) return { surf: { re: 0, im: 0 }, transfer: { re: 0, im: 0 } };
    const z = slabImpedanceS(t, sc, s.shieldMaterial.conductivity, s.shieldMaterial.relPermeability);
    const w = 2 * Math.PI * rm;
    return { surf: cscale(z.surface, 1 / w), transfer: cscale(z.transfer, 1 / w) };
  };
  if (!s.overGround) {
    const zyS = (sc: Complex): ZY => {
      const e = epsAtS(diel, sc, ['dielectric'], s.dielectric);
      const z = cadd(innerZS(sc), shieldZS(sc).surf);
      return zyFrom(1, sc, new Float64Array([Lc]), () => z, new Float64Array([0]), () => cscale(e, cUnit));
    };
    const rl = (fHz: number): { R: Float64Array; L: Float64Array } => {
      const zi = innerZ(fHz);
      const zs = shieldZ(fHz);
      if (fHz === 0) return { R: new Float64Array([zi.z.re + zs.surf.re]), L: new Float64Array([Lc + zi.lDc + zs.lSurfDc]) };
      const R = new Float64Array(1);
      const L = new Float64Array([Lc]);
      addZ(R, L, 0, cadd(zi.z, zs.surf), fHz);
      return { R, L };
    };
    const gc = (fHz: number): { G: Float64Array; C: Float64Array } => {
      const e = diel.at(fHz);
      return { G: new Float64Array([2 * Math.PI * fHz * cUnit * e.im + 0]), C: new Float64Array([cUnit * e.re]) };
    };
    return { conductors: ['inner'], n: 1, Lhf: new Float64Array([Lc]), Chf: new Float64Array([cUnit * diel.highFrequency]), rl, gc, zyS, describe: `coax a=${a} m, b=${b} m, er=${s.dielectric.relPermittivity}; conductor 'inner', reference the shield` };
  }
  // Second level: the shield is a conductor over ground.
  const og = s.overGround;
  const h = og.height;
  const Rs = b + t;
  const Ls = (MU0 / (2 * Math.PI)) * Math.acosh(h / Rs);
  const jacket = og.jacket && og.jacket.thickness > 0 ? og.jacket : undefined;
  const jd = jacket ? dielectricModel(jacket) : undefined;
  const Rj = Rs + (jacket?.thickness ?? 0);
  // Coated wire over ground: layers in series (exact for the concentric layer, image interaction neglected: error O((Rj/2h)^2)).
  const psAt = (eps: Complex | undefined): Complex => {
    const air = { re: Math.acosh(h / Rj) / (2 * Math.PI * EPS0), im: 0 };
    if (!eps) return air;
    // 1/(eps' - j eps'') = (eps' + j eps'')/|eps|^2 ; P = ln(Rj/Rs)/(2 pi eps0 eps)
    const m2 = eps.re * eps.re + eps.im * eps.im;
    const k = Math.log(Rj / Rs) / (2 * Math.PI * EPS0);
    return cadd(air, { re: (k * eps.re) / m2, im: (k * eps.im) / m2 });
  };
  const earth = typeof og.ground === 'object' ? og.ground : undefined;
  const ymat = (fHz: number, hf: boolean): { G: Float64Array; C: Float64Array } => {
    const e = hf ? { re: diel.highFrequency, im: 0 } : diel.at(fHz);
    const ej = jd ? (hf ? { re: jd.highFrequency, im: 0 } : jd.at(fHz)) : undefined;
    // complex capacitances C* = C - jG/omega: inner loop cUnit*(eps' - j eps''), shield loop 1/Ps
    const cc = { re: cUnit * e.re, im: -cUnit * e.im };
    const ps = psAt(ej);
    // 1/ps
    const pm = ps.re * ps.re + ps.im * ps.im;
    const cs = { re: ps.re / pm, im: -ps.im / pm };
    const tot = cadd(cc, cs);
    const omega = 2 * Math.PI * fHz;
    const C = new Float64Array([cc.re, -cc.re, -cc.re, tot.re]);
    const G = new Float64Array([-omega * cc.im + 0, omega * cc.im + 0, omega * cc.im + 0, -omega * tot.im + 0]);
    return { G, C };
  };
  const rl = (fHz: number): { R: Float64Array; L: Float64Array } => {
    const zi = innerZ(fHz);
    const zs = shieldZ(fHz);
    if (fHz === 0) {
      const zc = zi.z.re + zs.surf.re;
      const zsh = zs.surf.re;
      const zt = zs.transfer.re;
      const lc = Lc + zi.lDc + zs.lSurfDc;
      let lsh = Ls + zs.lSurfDc;
      const lt = zs.lTransDc;
      if (earth) lsh += earthCorrection(earth, h, h, 0, DC_EARTH_INDUCTANCE_HZ).im / (2 * Math.PI * DC_EARTH_INDUCTANCE_HZ);
      return {
        R: new Float64Array([zc + zsh - 2 * zt, zsh - zt, zsh - zt, zsh]),
        L: new Float64Array([lc + lsh - 2 * lt, lsh - lt, lsh - lt, lsh]),
      };
    }
    const omega = 2 * Math.PI * fHz;
    const zc = cadd(cadd(zi.z, zs.surf), { re: 0, im: omega * Lc });
    let zsh = cadd(zs.surf, { re: 0, im: omega * Ls });
    if (earth) zsh = cadd(zsh, earthCorrection(earth, h, h, 0, fHz));
    const zt = zs.transfer;
    const z11 = csub(cadd(zc, zsh), cscale(zt, 2));
    const z12 = csub(zsh, zt);
    const R = new Float64Array([z11.re, z12.re, z12.re, zsh.re]);
    const L = new Float64Array([z11.im / omega, z12.im / omega, z12.im / omega, zsh.im / omega]);
    return { R, L };
  };
  const zyS = (sc: Complex): ZY => {
    // Z: zc = zi + zs + s Lc, zsh = zs + s Ls + earth, zt; Z = [[zc + zsh - 2 zt, zsh - zt], [zsh - zt, zsh]].
    const zs = shieldZS(sc);
    const zc = cadd(innerZS(sc), zs.surf);
    let zsh = zs.surf;
    if (earth) zsh = cadd(zsh, earthCorrectionS(earth, h, h, 0, sc));
    const zt = zs.transfer;
    const zList = [csub(cadd(zc, zsh), cscale(zt, 2)), csub(zsh, zt), csub(zsh, zt), zsh];
    // Y = s [[cc, -cc], [-cc, cc + cs]], cc = cUnit eps(s), cs = 1 / (air + k / eps_jacket(s)).
    const cc = cscale(epsAtS(diel, sc, ['dielectric'], s.dielectric), cUnit);
    let ps: Complex = { re: Math.acosh(h / Rj) / (2 * Math.PI * EPS0), im: 0 };
    if (jd) ps = cadd(ps, cdiv({ re: Math.log(Rj / Rs) / (2 * Math.PI * EPS0), im: 0 }, epsAtS(jd, sc, ['overGround', 'jacket'], og.jacket)));
    const cs = cdiv({ re: 1, im: 0 }, ps);
    const tot = cadd(cc, cs);
    const neg = cscale(cc, -1);
    const cList = [cc, neg, neg, tot];
    return zyFrom(2, sc, new Float64Array([Lc + Ls, Ls, Ls, Ls]), (k) => zList[k], new Float64Array(4), (k) => cList[k]);
  };
  const Lhf = new Float64Array([Lc + Ls, Ls, Ls, Ls]);
  const Chf = ymat(0, true).C;
  const gLabel = og.ground === 'perfect' ? 'perfect ground' : earthLabel(og.ground);
  return { conductors: ['inner', 'shield'], n: 2, Lhf, Chf, rl, gc: (f) => ymat(f, false), zyS, describe: `coax a=${a} m, b=${b} m with its shield over ${gLabel} at ${h} m; conductors 'inner', 'shield'` };
}

function printedModel(s: ResolvedMicrostrip | ResolvedStripline): Model {
  const m = s.resolvedMaterial;
  const t = s.thickness ?? 0;
  const perfect = isPerfect(m);
  const W = s.width;
  const diel = dielectricModel(s.kind === 'microstrip' ? s.substrate : s.dielectric);
  // Conductor impedance per unit length, wide-strip approximation (current under the strip only).
  const condZ = (fHz: number): { z: Complex; lDc: number } => {
    if (perfect) return { z: { re: 0, im: 0 }, lDc: 0 };
    if (s.kind === 'microstrip') {
      // strip: current on the face toward the ground; ground plane: a slab of the same thickness.
      const zs = slabImpedance(t, fHz, m.conductivity, m.relPermeability).surface;
      return { z: cscale(zs, 2 / W), lDc: (2 * MU0 * m.relPermeability * t) / 3 / W };
    }
    // strip: both faces (symmetric slab, half thickness each); two planes in parallel.
    const zStrip = cscale(slabImpedance(t / 2, fHz, m.conductivity, m.relPermeability).surface, 1 / (2 * W));
    const zPlanes = cscale(slabImpedance(t, fHz, m.conductivity, m.relPermeability).surface, 1 / (2 * W));
    return { z: cadd(zStrip, zPlanes), lDc: (MU0 * m.relPermeability * (t / 2 / 3 + t / 3)) / (2 * W) };
  };
  let base: (eps: number) => { L: Float64Array; C: Float64Array; q: number };
  let conductors: string[];
  let describe: string;
  if (s.kind === 'microstrip') {
    base = (eps) => {
      const r = microstrip(W, s.substrateHeight, eps, t);
      return { L: new Float64Array([r.L]), C: new Float64Array([r.C]), q: r.fillingFactor };
    };
    conductors = ['strip'];
    describe = `microstrip W=${W} m, h=${s.substrateHeight} m, er=${s.substrate.relPermittivity} (Hammerstad-Jensen)`;
  } else if (s.kind === 'stripline') {
    base = (eps) => {
      const r = stripline(W, s.plateSpacing, eps);
      return { L: new Float64Array([r.L]), C: new Float64Array([r.C]), q: 1 };
    };
    conductors = ['strip'];
    describe = `stripline W=${W} m, b=${s.plateSpacing} m, er=${s.dielectric.relPermittivity} (Cohn)`;
  } else {
    base = (eps) => {
      const r = coupledStripline(W, s.gap as number, s.plateSpacing, eps);
      return { L: r.L, C: r.C, q: 1 };
    };
    conductors = ['strip1', 'strip2'];
    describe = `edge-coupled stripline W=${W} m, S=${s.gap} m, b=${s.plateSpacing} m, er=${s.dielectric.relPermittivity} (Cohn)`;
  }
  const hf = base(diel.highFrequency);
  const n = conductors.length;
  const rl = (fHz: number): { R: Float64Array; L: Float64Array } => {
    const R = new Float64Array(n * n);
    const L = hf.L.slice();
    const c = condZ(fHz);
    for (let i = 0; i < n; i++) {
      if (fHz === 0) {
        R[i * n + i] += c.z.re;
        L[i * n + i] += c.lDc;
      } else addZ(R, L, i * n + i, c.z, fHz);
    }
    return { R, L };
  };
  const gc = (fHz: number): { G: Float64Array; C: Float64Array } => {
    const e = diel.at(fHz);
    const r = diel.dispersive ? base(e.re) : hf;
    const omega = 2 * Math.PI * fHz;
    const G = r.C.map((v) => (omega * v * r.q * e.im) / e.re + 0);
    return { G, C: r.C.slice() };
  };
  const condZS = (sc: Complex): Complex => {
    if (perfect) return { re: 0, im: 0 };
    if (s.kind === 'microstrip') return cscale(slabImpedanceS(t, sc, m.conductivity, m.relPermeability).surface, 2 / W);
    const zStrip = cscale(slabImpedanceS(t / 2, sc, m.conductivity, m.relPermeability).surface, 1 / (2 * W));
    const zPlanes = cscale(slabImpedanceS(t, sc, m.conductivity, m.relPermeability).surface, 1 / (2 * W));
    return cadd(zStrip, zPlanes);
  };
  const zyS = (sc: Complex): ZY => {
    // The closed forms take a real permittivity; only a lossless, non-dispersive dielectric continues (Y = s C).
    if (diel.lossy || diel.dispersive) {
      notContinuable([s.kind === 'microstrip' ? 'substrate' : 'dielectric'], 'the quasi-static closed forms of printed lines take a real permittivity; a lossy or dispersive dielectric has no continuation here', s.kind === 'microstrip' ? s.substrate : s.dielectric);
    }
    const z = condZS(sc);
    return zyFrom(n, sc, hf.L, (k) => (Math.floor(k / n) === k % n ? z : { re: 0, im: 0 }), hf.C, () => ({ re: 0, im: 0 }));
  };
  return { conductors, n, Lhf: hf.L, Chf: hf.C, rl, gc, zyS, describe };
}

/** max |a - b| over the matrix, relative to the largest diagonal entry of b. */
function relChange(a: Float64Array, b: Float64Array, n: number): number {
  let d = 0;
  let m = 0;
  for (let i = 0; i < n * n; i++) d = Math.max(d, Math.abs(a[i] - b[i]));
  for (let i = 0; i < n; i++) m = Math.max(m, Math.abs(b[i * n + i]));
  return d / m;
}

const CACHE_LIMIT = 8192;

/**
 * Validates a cross-section and computes its per-unit-length matrices.
 *
 * @param input the section object: a discriminated union on `kind` ('wires', 'coax',
 *   'microstrip', 'stripline', 'coupled-stripline'), numbers in SI units; see README.md / sectionSchema
 * @returns the LineSection: conductor names, high-frequency L and C, rlgcAt(f), zyAt(f), describe
 * @throws SectionError for bad input, with code, path inside the section, rule and value
 * @example
 * const s = computeSection({ kind: 'coax', innerRadius: 0.405e-3, shieldInnerRadius: 1.475e-3, dielectric: { relPermittivity: 2.25 } });
 * s.L[0]; // 2.58505e-7 H/m
 * s.rlgcAt(1e6).R[0]; // 0.0542 ohm/m (copper inner conductor, ideal shield)
 */
export function computeSection(input: unknown): LineSection {
  const s = resolveSection(input);
  const model = s.kind === 'wires' ? wiresModel(s) : s.kind === 'coax' ? coaxModel(s) : printedModel(s);
  const cache = new Map<number, Rlgc>();
  const at = (fHz: number): Rlgc => {
    if (typeof fHz !== 'number' || !Number.isFinite(fHz) || fHz < 0) throw sectionError('SECTION_FREQUENCY', [], 'frequency must be a finite number >= 0 Hz', fHz, 'Hz');
    let r = cache.get(fHz);
    if (r === undefined) {
      const a = model.rl(fHz);
      const b = model.gc(fHz);
      r = { R: a.R, L: a.L, G: b.G, C: b.C };
      if (cache.size >= CACHE_LIMIT) cache.clear();
      cache.set(fHz, r);
    }
    return r;
  };
  return {
    conductors: [...model.conductors],
    n: model.n,
    L: model.Lhf.slice(),
    C: model.Chf.slice(),
    rlgcAt(fHz: number): Rlgc {
      const r = at(fHz);
      return { R: r.R.slice(), L: r.L.slice(), G: r.G.slice(), C: r.C.slice() };
    },
    zyAt(fHz: number): ZY {
      const r = at(fHz);
      const omega = 2 * Math.PI * fHz;
      return { Zre: r.R.slice(), Zim: r.L.map((v) => omega * v), Yre: r.G.slice(), Yim: r.C.map((v) => omega * v) };
    },
    zyAtLaplace(sigma: number, omegaRadS: number): ZY {
      if (!(Number.isFinite(sigma) && sigma >= 0) || !(Number.isFinite(omegaRadS) && omegaRadS >= 0)) {
        throw sectionError('SECTION_FREQUENCY', [], 'complex frequency needs finite sigma >= 0 and omega >= 0', { sigma, omegaRadS }, '1/s');
      }
      return model.zyS({ re: sigma, im: omegaRadS });
    },
    describe: model.describe,
  };
}

