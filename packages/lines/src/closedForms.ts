/**
 * Closed-form per-unit-length parameters of round-wire lines in a homogeneous medium.
 * Sources: Pozar, Microwave Engineering, 4th ed., ch. 2 (coax, two-wire; from memory);
 * C. R. Paul, Analysis of Multiconductor Transmission Lines, 2nd ed., Wiley 2008,
 * per-unit-length parameters chapter (wire over ground, image method; from memory).
 */
import { Matrix, inverse } from 'ml-matrix';
import { EPS0, MU0 } from './constants.ts';

/** Per-unit-length parameters of a two-conductor line. */
export interface TwoConductorLine {
  /** External inductance [H/m]. */
  L: number;
  /** Capacitance [F/m]. */
  C: number;
  /** Characteristic impedance sqrt(L/C) [ohm]. */
  z0: number;
  /** Phase velocity 1/sqrt(LC) [m/s]. */
  velocity: number;
}

function line(L: number, C: number): TwoConductorLine {
  return { L, C, z0: Math.sqrt(L / C), velocity: 1 / Math.sqrt(L * C) };
}

/**
 * Coaxial line: L = mu0 mur/(2 pi) ln(b/a), C = 2 pi eps0 er / ln(b/a).
 *
 * @param innerRadiusM a [m]
 * @param shieldInnerRadiusM b [m], > a
 * @param relPermittivity er of the dielectric [-], default 1
 * @param relPermeability mur of the dielectric [-], default 1
 * @returns L, C, z0, velocity
 * @example coax(0.405e-3, 1.475e-3, 2.25).z0 // 51.665 ohm
 */
export function coax(innerRadiusM: number, shieldInnerRadiusM: number, relPermittivity = 1, relPermeability = 1): TwoConductorLine {
  const lg = Math.log(shieldInnerRadiusM / innerRadiusM);
  return line(((MU0 * relPermeability) / (2 * Math.PI)) * lg, (2 * Math.PI * EPS0 * relPermittivity) / lg);
}

/**
 * Two-wire line, exact for round wires: L = (mu0/pi) acosh(D/d), C = pi eps0 er / acosh(D/d).
 *
 * @param separationM centre-to-centre distance D [m]
 * @param radiusM wire radius d/2 [m]
 * @param relPermittivity er of the surrounding medium [-], default 1
 * @returns L, C, z0, velocity
 * @example twoWire(10e-3, 1e-3).z0 // 274.90 ohm
 */
export function twoWire(separationM: number, radiusM: number, relPermittivity = 1): TwoConductorLine {
  const a = Math.acosh(separationM / (2 * radiusM));
  return line((MU0 / Math.PI) * a, (Math.PI * EPS0 * relPermittivity) / a);
}

/**
 * Round wire over a perfect ground plane, exact: L = (mu0/2 pi) acosh(h/r), C = 2 pi eps0 / acosh(h/r).
 *
 * @param heightM height of the wire axis above the plane h [m]
 * @param radiusM wire radius r [m]
 * @returns L, C, z0, velocity
 * @example wireOverGround(10, 5e-3).z0 // 497.30 ohm
 */
export function wireOverGround(heightM: number, radiusM: number): TwoConductorLine {
  const a = Math.acosh(heightM / radiusM);
  return line((MU0 / (2 * Math.PI)) * a, (2 * Math.PI * EPS0) / a);
}

/** A round wire for the image method. */
export interface ImageWire {
  /** Horizontal position [m]. */
  x: number;
  /** Height of the axis above ground, or vertical position in free space [m]. */
  y: number;
  /** Radius [m] (equivalent radius for bundles). */
  radius: number;
}

/** Result of the image method: n x n row-major matrices. */
export interface ImageMethodResult {
  /** Number of signal conductors. */
  n: number;
  /** External inductance [H/m]. */
  L: Float64Array;
  /** Capacitance [F/m], C = mu0 eps0 L^-1. */
  C: Float64Array;
  /** Potential coefficients P = L / (mu0 eps0) [m/F]. */
  P: Float64Array;
}

/**
 * Thin-wire (wide-separation) per-unit-length matrices of round wires in air, Paul MTL ch. 4-5
 * (from memory). Over a perfect ground plane at y = 0:
 *   l_ii = mu0/(2 pi) ln(2 h_i / r_i),  l_ij = mu0/(4 pi) ln(1 + 4 h_i h_j / d_ij^2).
 * In free space with wire `referenceIndex` as the return (n + 1 wires):
 *   l_ii = mu0/(2 pi) ln(d_i0^2/(r_i r_0)),  l_ij = mu0/(2 pi) ln(d_i0 d_j0/(d_ij r_0)).
 * Accurate while separations and heights are large compared with radii (proximity effect
 * neglected; the error is of order (r/d)^2).
 *
 * @param wires wire positions and radii [m]
 * @param ground 'perfect' (plane y = 0) or 'none'
 * @param referenceIndex for ground 'none': index of the reference wire in `wires`
 * @returns L, C, P (the reference wire, if any, is removed: n = wires.length - 1)
 * @example imageMethodWires([{x: 0, y: 0.02, radius: 0.4064e-3}, {x: 0.02, y: 0.02, radius: 0.4064e-3}], 'perfect').L[0] // 0.917859e-6
 */
export function imageMethodWires(wires: ImageWire[], ground: 'perfect' | 'none', referenceIndex = -1): ImageMethodResult {
  const k = MU0 / (2 * Math.PI);
  let idx: number[];
  const L = (i: number, j: number): number => {
    const a = wires[i];
    const b = wires[j];
    if (ground === 'perfect') {
      if (i === j) return k * Math.log((2 * a.y) / a.radius);
      const d2 = (a.x - b.x) ** 2 + (a.y - b.y) ** 2;
      return (k / 2) * Math.log(1 + (4 * a.y * b.y) / d2);
    }
    const r = wires[referenceIndex];
    const di0 = Math.hypot(a.x - r.x, a.y - r.y);
    if (i === j) return k * Math.log((di0 * di0) / (a.radius * r.radius));
    const dj0 = Math.hypot(b.x - r.x, b.y - r.y);
    const dij = Math.hypot(a.x - b.x, a.y - b.y);
    return k * Math.log((di0 * dj0) / (dij * r.radius));
  };
  if (ground === 'perfect') idx = wires.map((_, i) => i);
  else idx = wires.map((_, i) => i).filter((i) => i !== referenceIndex);
  const n = idx.length;
  const Lm = new Float64Array(n * n);
  for (let i = 0; i < n; i++) for (let j = 0; j < n; j++) Lm[i * n + j] = L(idx[i], idx[j]);
  const P = Lm.map((v) => v / (MU0 * EPS0));
  const C = invertSymmetric(Lm, n).map((v) => v * MU0 * EPS0);
  return { n, L: Lm, C, P };
}

/**
 * Inverse of a small dense real matrix (row-major), via ml-matrix LU.
 *
 * @param a n*n row-major
 * @param n order
 * @returns a^-1 row-major
 * @example invertSymmetric(new Float64Array([2, 0, 0, 4]), 2) // [0.5, 0, 0, 0.25]
 */
export function invertSymmetric(a: Float64Array, n: number): Float64Array {
  if (n === 0) return new Float64Array(0);
  const m = new Matrix(n, n);
  for (let i = 0; i < n; i++) for (let j = 0; j < n; j++) m.set(i, j, a[i * n + j]);
  const inv = inverse(m);
  const out = new Float64Array(n * n);
  for (let i = 0; i < n; i++) for (let j = 0; j < n; j++) out[i * n + j] = inv.get(i, j);
  return out;
}
