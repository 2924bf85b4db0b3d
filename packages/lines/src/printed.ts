/**
 * Printed traces: closed forms.
 *
 * Microstrip: E. Hammerstad, O. Jensen, "Accurate models for microstrip computer-aided design",
 * IEEE MTT-S Int. Microwave Symp. Digest 1980, pp. 407-409: Z01(u), eps_eff(u, er), and the strip
 * thickness correction (u -> u1, ur). Quasi-static (no dispersion of eps_eff).
 * Stripline, centred zero-thickness strip between plates a distance b apart:
 * S. B. Cohn, "Characteristic impedance of the shielded-strip transmission line", IRE Trans. MTT-2,
 * 1954 (from memory): Z0 = eta0/(4 sqrt(er)) K(k)/K(k'), k = sech(pi W / 2b).
 * Edge-coupled stripline: S. B. Cohn, "Shielded coupled-strip transmission line", IRE Trans. MTT-3,
 * 1955 (from memory): k_e = tanh(pi W/2b) tanh(pi (W+S)/2b), k_o = tanh(pi W/2b) coth(pi (W+S)/2b),
 * Z0e,o = eta0/(4 sqrt(er)) K(k'_e,o)/K(k_e,o).
 */
import { C0, ETA0 } from './constants.ts';

/**
 * Complete elliptic integral of the first kind K(k) (modulus k), by the arithmetic-geometric mean:
 * K(k) = pi / (2 AGM(1, sqrt(1 - k^2))) (A&S 17.6).
 *
 * @param k modulus, 0 <= k < 1
 * @returns K(k)
 * @example ellipticK(0) // pi/2
 */
export function ellipticK(k: number): number {
  return ellipticKFromComplement(Math.sqrt((1 - k) * (1 + k)));
}

/** K(k) given k' = sqrt(1 - k^2) directly (accurate when k is close to 1). */
function ellipticKFromComplement(kp: number): number {
  let a = 1;
  let g = kp;
  for (let i = 0; i < 60 && Math.abs(a - g) > 1e-16 * a; i++) {
    const an = (a + g) / 2;
    g = Math.sqrt(a * g);
    a = an;
  }
  return Math.PI / (2 * a);
}

/** Ratio K(k)/K(k') evaluated from k and k' to keep accuracy at both ends. */
function kRatio(k: number, kp: number): number {
  return ellipticKFromComplement(kp) / ellipticKFromComplement(k);
}

/** Quasi-TEM single line summary. */
export interface PrintedLine {
  /** Characteristic impedance [ohm]. */
  z0: number;
  /** Effective relative permittivity [-]. */
  epsEff: number;
  /** Inductance [H/m] = z0 sqrt(epsEff)/c. */
  L: number;
  /** Capacitance [F/m] = sqrt(epsEff)/(z0 c). */
  C: number;
  /** Dielectric filling factor q = er (epsEff - 1)/(epsEff (er - 1)): G = omega C q tan delta. */
  fillingFactor: number;
}

function z01(u: number): number {
  const f = 6 + (2 * Math.PI - 6) * Math.exp(-Math.pow(30.666 / u, 0.7528));
  return (ETA0 / (2 * Math.PI)) * Math.log(f / u + Math.sqrt(1 + 4 / (u * u)));
}

function epsEffHJ(u: number, er: number): number {
  const a = 1 + (1 / 49) * Math.log((u ** 4 + (u / 52) ** 2) / (u ** 4 + 0.432)) + (1 / 18.7) * Math.log(1 + (u / 18.1) ** 3);
  const b = 0.564 * Math.pow((er - 0.9) / (er + 3), 0.053);
  return (er + 1) / 2 + ((er - 1) / 2) * Math.pow(1 + 10 / u, -a * b);
}

/**
 * Microstrip, Hammerstad-Jensen (1980), with their finite-thickness correction.
 *
 * @param widthM strip width W [m]
 * @param heightM substrate height h [m]
 * @param relPermittivity substrate er [-]
 * @param thicknessM strip thickness t [m], default 0
 * @returns z0, epsEff, L, C, fillingFactor
 * @example microstrip(1e-3, 1e-3, 9.8).z0 // 49.289 ohm (epsEff 6.5790)
 */
export function microstrip(widthM: number, heightM: number, relPermittivity: number, thicknessM = 0): PrintedLine {
  const u = widthM / heightM;
  const er = relPermittivity;
  let z0: number;
  let ee: number;
  if (thicknessM > 0) {
    const t = thicknessM / heightM;
    const coth2 = 1 / Math.tanh(Math.sqrt(6.517 * u)) ** 2;
    const du1 = (t / Math.PI) * Math.log(1 + (4 * Math.E) / (t * coth2));
    const dur = 0.5 * (1 + 1 / Math.cosh(Math.sqrt(er - 1))) * du1;
    const u1 = u + du1;
    const ur = u + dur;
    const eer = epsEffHJ(ur, er);
    z0 = z01(ur) / Math.sqrt(eer);
    ee = eer * (z01(u1) / z01(ur)) ** 2;
  } else {
    ee = epsEffHJ(u, er);
    z0 = z01(u) / Math.sqrt(ee);
  }
  const s = Math.sqrt(ee);
  const q = er === 1 ? 1 : (er * (ee - 1)) / (ee * (er - 1));
  return { z0, epsEff: ee, L: (z0 * s) / C0, C: s / (z0 * C0), fillingFactor: q };
}

/**
 * Stripline (centred, zero-thickness strip), Cohn's exact conformal-mapping result.
 *
 * @param widthM strip width W [m]
 * @param plateSpacingM ground-plane spacing b [m]
 * @param relPermittivity er [-], default 1
 * @returns z0, epsEff (= er), L, C, fillingFactor (= 1)
 * @example stripline(1e-3, 1e-3, 1).z0 // 65.354 ohm
 */
export function stripline(widthM: number, plateSpacingM: number, relPermittivity = 1): PrintedLine {
  const x = (Math.PI * widthM) / (2 * plateSpacingM);
  const k = 1 / Math.cosh(x);
  const kp = Math.tanh(x);
  const z0 = (ETA0 / (4 * Math.sqrt(relPermittivity))) * kRatio(k, kp);
  const s = Math.sqrt(relPermittivity);
  return { z0, epsEff: relPermittivity, L: (z0 * s) / C0, C: s / (z0 * C0), fillingFactor: 1 };
}

/** Even/odd-mode result of a symmetric coupled pair, with its 2x2 matrices. */
export interface CoupledPair {
  /** Even-mode impedance [ohm]. */
  z0Even: number;
  /** Odd-mode impedance [ohm]. */
  z0Odd: number;
  /** 2x2 row-major inductance [H/m]. */
  L: Float64Array;
  /** 2x2 row-major capacitance [F/m]. */
  C: Float64Array;
}

/**
 * Edge-coupled stripline (two centred zero-thickness strips side by side), Cohn 1955.
 * Homogeneous medium, so both modes travel at c/sqrt(er) and
 * L = [[Ze+Zo, Ze-Zo],[Ze-Zo, Ze+Zo]]/(2v), C = [[1/Ze+1/Zo, 1/Ze-1/Zo], ...]/(2v).
 *
 * @param widthM width of each strip W [m]
 * @param gapM edge-to-edge gap S [m]
 * @param plateSpacingM ground-plane spacing b [m]
 * @param relPermittivity er [-], default 1
 * @returns z0Even, z0Odd, L, C
 * @example coupledStripline(1e-3, 1e3, 1e-3).z0Even // -> 65.354 ohm (uncoupled limit)
 */
export function coupledStripline(widthM: number, gapM: number, plateSpacingM: number, relPermittivity = 1): CoupledPair {
  const a = (Math.PI * widthM) / (2 * plateSpacingM);
  const c = (Math.PI * (widthM + gapM)) / (2 * plateSpacingM);
  const ta = Math.tanh(a);
  const tc = Math.tanh(c);
  const ke = ta * tc;
  const ko = ta / tc;
  const comp = (k: number): number => Math.sqrt((1 - k) * (1 + k));
  const pre = ETA0 / (4 * Math.sqrt(relPermittivity));
  const ze = pre * kRatio(comp(ke), ke);
  const zo = pre * kRatio(comp(ko), ko);
  const v = C0 / Math.sqrt(relPermittivity);
  const L = new Float64Array([(ze + zo) / (2 * v), (ze - zo) / (2 * v), (ze - zo) / (2 * v), (ze + zo) / (2 * v)]);
  const cs = (1 / ze + 1 / zo) / (2 * v);
  const cm = (1 / ze - 1 / zo) / (2 * v);
  const C = new Float64Array([cs, cm, cm, cs]);
  return { z0Even: ze, z0Odd: zo, L, C };
}
