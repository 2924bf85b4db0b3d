/**
 * The 2n-port admittance block of a uniform multiconductor line at one frequency.
 *
 * With the current modes of Y Z (Y Z = T gamma^2 T^-1, Re gamma >= 0) the line's currents into
 * both ends are (C. R. Paul, Analysis of Multiconductor Transmission Lines, 2nd ed., Wiley 2008,
 * frequency-domain chapter, modal solution, from memory; re-derived here):
 *   [I(0); -I(l)] = [[Y11, Y12], [Y12, Y11]] [V(0); V(l)],
 *   Y11 = T diag(coth(gamma l) / gamma) T^-1 Y,   Y12 = -T diag(csch(gamma l) / gamma) T^-1 Y.
 * coth and csch are formed from E = exp(-gamma l) and 1 - E^2 = -expm1(-2 gamma l), so a long lossy
 * line (E -> 0) and a short line at low frequency (gamma l -> 0) both stay accurate.
 * Nothing here assumes s = j omega: Z and Y may be taken at complex s = sigma + j omega (Z(s), Y(s)
 * for the numerical Laplace transform); gamma = sqrt(eig(Y Z)) with Re gamma >= 0 is then the
 * continuation from the axis for sigma >= 0, where the line's damping only grows.
 */
import { cEigen, cInverse, cMul, cZeros, csqrt, type CMatrix } from './complex.ts';

/** The admittance block: Y11 (= Y22) and Y12 (= Y21), n x n each, and the modal constants. */
export interface LineBlock {
  n: number;
  y11: CMatrix;
  y12: CMatrix;
  /** Propagation constants gamma_m = alpha_m + j beta_m [1/m], one per mode. */
  gammaRe: Float64Array;
  gammaIm: Float64Array;
}

/** The modal solution of a line at one frequency (current modes of Y Z). */
export interface LineModes {
  n: number;
  /** Current-mode matrix T (columns: modes), I(z) = T (e^{-gamma z} a - e^{-gamma (l - z)} b). */
  t: CMatrix;
  /** Voltage map M = Y^-1 T gamma (= Zc T): V(z) = M (e^{-gamma z} a + e^{-gamma (l - z)} b). */
  m: CMatrix;
  gammaRe: Float64Array;
  gammaIm: Float64Array;
  /** E = exp(-gamma l) per mode. */
  eRe: Float64Array;
  eIm: Float64Array;
}

/**
 * Modal solution: Y Z = T gamma^2 T^-1 with Re gamma >= 0, M = Y^-1 T gamma, E = exp(-gamma l).
 * Wave amplitudes a (forward, referenced at z = 0) and b (backward, referenced at z = l) keep every
 * coefficient bounded (|E| <= 1), so the network solver stays regular at a lossless line's
 * half-wave resonances, where the admittance block of lineBlock is infinite.
 * @throws SkeinError E_SINGULAR when Y or T is singular (Y = 0 at DC without G).
 */
export function lineModes(z: CMatrix, y: CMatrix, lengthM: number): LineModes {
  const n = z.rows;
  const eig = cEigen(cMul(y, z));
  const t = eig.vectors;
  const gammaRe = new Float64Array(n);
  const gammaIm = new Float64Array(n);
  const eRe = new Float64Array(n);
  const eIm = new Float64Array(n);
  const tg = cZeros(n);
  for (let m = 0; m < n; m++) {
    const [gr, gi] = csqrt(eig.valuesRe[m], eig.valuesIm[m]);
    gammaRe[m] = gr;
    gammaIm[m] = gi;
    eRe[m] = Math.exp(-gr * lengthM) * Math.cos(gi * lengthM);
    eIm[m] = -Math.exp(-gr * lengthM) * Math.sin(gi * lengthM);
    for (let i = 0; i < n; i++) {
      const vr = t.re[i * n + m], vi = t.im[i * n + m];
      tg.re[i * n + m] = vr * gr - vi * gi;
      tg.im[i * n + m] = vr * gi + vi * gr;
    }
  }
  return { n, t, m: cMul(cInverse(y), tg), gammaRe, gammaIm, eRe, eIm };
}

/** expm1 of a complex argument, accurate near 0: [re, im]. */
function cexpm1(x: number, y: number): [number, number] {
  const ex = Math.exp(x);
  const s = Math.sin(y / 2);
  return [Math.expm1(x) * Math.cos(y) - 2 * s * s, ex * Math.sin(y)];
}

/**
 * Builds the line block from the per-unit-length series impedance Z and shunt admittance Y.
 * @param z Z = R + j omega L [ohm/m], n x n; @param y Y = G + j omega C [S/m], n x n.
 * @param lengthM line length [m], > 0.
 * @throws SkeinError E_SINGULAR when the modal matrix is singular (a defective Y Z, not physical).
 * @example lineBlock(cFrom(1,1,[0],[omega*L]), cFrom(1,1,[0],[omega*C]), 1).y11 // -j cot(beta l) / Z0
 */
export function lineBlock(z: CMatrix, y: CMatrix, lengthM: number): LineBlock {
  const n = z.rows;
  const yz = cMul(y, z);
  const eig = cEigen(yz);
  const t = eig.vectors;
  const tinvY = cMul(cInverse(t), y);
  const gammaRe = new Float64Array(n);
  const gammaIm = new Float64Array(n);
  const a = cZeros(n);
  const b = cZeros(n);
  for (let m = 0; m < n; m++) {
    const [gr, gi] = csqrt(eig.valuesRe[m], eig.valuesIm[m]);
    gammaRe[m] = gr;
    gammaIm[m] = gi;
    const xr = gr * lengthM, xi = gi * lengthM;
    // E = exp(-gamma l); D = (1 - E^2) gamma = -expm1(-2 gamma l) gamma
    const er = Math.exp(-xr) * Math.cos(-xi), ei = Math.exp(-xr) * Math.sin(-xi);
    const [mr, mi] = cexpm1(-2 * xr, -2 * xi);
    const dr = -(mr * gr - mi * gi), di = -(mr * gi + mi * gr);
    const dd = dr * dr + di * di;
    // coth/gamma = (1 + E^2) / D; csch/gamma = 2E / D
    const e2r = er * er - ei * ei, e2i = 2 * er * ei;
    const nr = 1 + e2r, ni = e2i;
    for (let j = 0; j < n; j++) {
      const pr = tinvY.re[m * n + j], pi = tinvY.im[m * n + j];
      // a = diag(coth/gamma) T^-1 Y, b = diag(csch/gamma) T^-1 Y (row m scaled)
      const cr = (nr * dr + ni * di) / dd, ci = (ni * dr - nr * di) / dd;
      const sr = (2 * er * dr + 2 * ei * di) / dd, si = (2 * ei * dr - 2 * er * di) / dd;
      a.re[m * n + j] = cr * pr - ci * pi;
      a.im[m * n + j] = cr * pi + ci * pr;
      b.re[m * n + j] = -(sr * pr - si * pi);
      b.im[m * n + j] = -(sr * pi + si * pr);
    }
  }
  return { n, y11: cMul(t, a), y12: cMul(t, b), gammaRe, gammaIm };
}
