/**
 * Earth-return impedance of wires above a homogeneous lossy earth.
 *
 * Carson (J. R. Carson, "Wave propagation in overhead wires with ground return", Bell Syst. Tech.
 * J. 5, 539-554, 1926): the correction to the perfect-ground impedance between wires i and j,
 *   dZ_ij = (j omega mu0 / pi) * int_0^inf e^{-(h_i + h_j) l} cos(x_ij l) / (l + sqrt(l^2 + gamma^2)) dl,
 *   gamma^2 = j omega mu0 (sigma_e + j omega eps_e),
 * evaluated here by adaptive Gauss-Kronrod quadrature. Carson neglects the earth's displacement
 * current; with relPermittivity given, sigma_e is replaced by sigma_e + j omega eps_e (the usual
 * extension; the air-side propagation constant is still neglected, quasi-TEM).
 *
 * Complex depth (A. Deri, G. Tevan, A. Semlyen, A. Castanheira, "The complex ground return plane:
 * a simplified model for homogeneous and multi-layer earth return", IEEE Trans. PAS-100(8), 1981,
 * from memory): the earth is replaced by a perfect plane at the complex depth p = 1/gamma,
 *   dZ_ij = (j omega mu0 / (4 pi)) ln( ((h_i + h_j + 2p)^2 + x_ij^2) / ((h_i + h_j)^2 + x_ij^2) ).
 */
import type { Complex } from './complex.ts';
import { cadd, cdiv, clog, cmul, csqrt } from './complex.ts';
import { integrateComplex } from './quadrature.ts';
import { EPS0, MU0 } from './constants.ts';

/** Earth parameters. */
export interface EarthParams {
  /** Earth resistivity [ohm*m], > 0. */
  resistivityOhmM: number;
  /** Earth relative permittivity [-]; omitted or 0 means Carson's original (no displacement current). */
  relPermittivity?: number;
}

/**
 * Carson's earth-return correction dZ_ij by numerical integration of Carson's integral.
 *
 * @param hiM height of wire i above earth [m], > 0
 * @param hjM height of wire j [m], > 0 (equal to hiM with xM = 0 for the self term)
 * @param xM horizontal distance between the wires [m]
 * @param fHz frequency [Hz]; 0 returns 0
 * @param earth resistivity [ohm*m] and optional relative permittivity
 * @returns dZ_ij [ohm/m], to add to j omega (mu0/2 pi) ln(D'_ij/d_ij)
 * @example carsonEarthImpedance(10, 10, 0, 50, { resistivityOhmM: 100 }).re // ≈ 4.8e-5 ohm/m (close to omega mu0/8 = 4.93e-5)
 */
export function carsonEarthImpedance(hiM: number, hjM: number, xM: number, fHz: number, earth: EarthParams): Complex {
  return carsonEarthImpedanceS(hiM, hjM, xM, { re: 0, im: 2 * Math.PI * fHz }, earth);
}

/**
 * Deri's complex-depth approximation of the earth-return correction dZ_ij.
 *
 * @param hiM height of wire i [m]
 * @param hjM height of wire j [m]
 * @param xM horizontal distance [m]
 * @param fHz frequency [Hz]; 0 returns 0
 * @param earth resistivity [ohm*m] and optional relative permittivity
 * @returns dZ_ij [ohm/m]
 * @example complexDepthEarthImpedance(10, 10, 0, 50, { resistivityOhmM: 100 }).re // ≈ 4.8e-5 ohm/m
 */
export function complexDepthEarthImpedance(hiM: number, hjM: number, xM: number, fHz: number, earth: EarthParams): Complex {
  return complexDepthEarthImpedanceS(hiM, hjM, xM, { re: 0, im: 2 * Math.PI * fHz }, earth);
}

/** gamma^2 = s mu0 (sigma_e + s eps_e) at complex s (at s = j omega: j omega mu0 (sigma_e + j omega eps_e)). */
function gammaSquaredS(s: Complex, earth: EarthParams): Complex {
  const sigma = 1 / earth.resistivityOhmM;
  const eps = (earth.relPermittivity ?? 0) * EPS0;
  // sigma_e + s eps_e, times s mu0
  return cmul({ re: s.re * MU0, im: s.im * MU0 }, { re: sigma + s.re * eps, im: s.im * eps });
}

/**
 * Carson's earth-return correction at complex frequency s = sigma + j omega, the analytic
 * continuation of {@link carsonEarthImpedance}: j omega becomes s in the prefactor and in
 * gamma^2 = s mu0 (sigma_e + s eps_e); the integral keeps its form (the root with Re >= 0, which is
 * the continuation for Re s >= 0, Im s >= 0).
 *
 * @param hiM height of wire i [m]; @param hjM height of wire j [m]; @param xM horizontal distance [m]
 * @param s complex frequency [1/s], Re s >= 0, Im s >= 0; 0 returns 0
 * @param earth resistivity [ohm*m] and optional relative permittivity
 * @returns dZ_ij(s) [ohm/m]
 * @example carsonEarthImpedanceS(10, 10, 0, { re: 0, im: 2 * Math.PI * 50 }, { resistivityOhmM: 100 }) // = carsonEarthImpedance(10, 10, 0, 50, ...)
 */
export function carsonEarthImpedanceS(hiM: number, hjM: number, xM: number, s: Complex, earth: EarthParams): Complex {
  if (s.re === 0 && s.im === 0) return { re: 0, im: 0 };
  const g2 = gammaSquaredS(s, earth);
  const H = hiM + hjM;
  const x = Math.abs(xM);
  // Substitute l = u / H: integral = int_0^inf e^{-u} cos(x u/H) / (u + sqrt(u^2 + gamma^2 H^2)) du
  const g2h = { re: g2.re * H * H, im: g2.im * H * H };
  const xr = x / H;
  const f = (u: number, out: Float64Array): void => {
    const r = csqrt({ re: u * u + g2h.re, im: g2h.im });
    const dr = u + r.re;
    const di = r.im;
    const w = (Math.exp(-u) * Math.cos(xr * u)) / (dr * dr + di * di);
    out[0] = w * dr;
    out[1] = -w * di;
  };
  // Split where the integrand changes character: near u = |gamma| H and at the decay scale.
  const gh = Math.sqrt(Math.hypot(g2h.re, g2h.im));
  const breaks = [0, ...[gh / 4, gh, 4 * gh].filter((b) => b > 0 && b < 45), 45].sort((a, b) => a - b);
  let jr = 0;
  let ji = 0;
  for (let i = 0; i + 1 < breaks.length; i++) {
    const [r, im] = integrateComplex(f, breaks[i], breaks[i + 1], 1e-11, 1e-16);
    jr += r;
    ji += im;
  }
  // dZ = s mu0 / pi * J
  return cmul({ re: (s.re * MU0) / Math.PI, im: (s.im * MU0) / Math.PI }, { re: jr, im: ji });
}

/**
 * Deri's complex-depth correction at complex frequency s = sigma + j omega (continuation of
 * {@link complexDepthEarthImpedance}: p = 1 / sqrt(gamma^2(s)), prefactor s mu0 / (4 pi)).
 *
 * @param hiM height of wire i [m]; @param hjM height of wire j [m]; @param xM horizontal distance [m]
 * @param s complex frequency [1/s]; 0 returns 0
 * @param earth resistivity [ohm*m] and optional relative permittivity
 * @returns dZ_ij(s) [ohm/m]
 * @example complexDepthEarthImpedanceS(10, 10, 0, { re: 0, im: 2 * Math.PI * 50 }, { resistivityOhmM: 100 }) // = complexDepthEarthImpedance(10, 10, 0, 50, ...)
 */
export function complexDepthEarthImpedanceS(hiM: number, hjM: number, xM: number, s: Complex, earth: EarthParams): Complex {
  if (s.re === 0 && s.im === 0) return { re: 0, im: 0 };
  const p = cdiv({ re: 1, im: 0 }, csqrt(gammaSquaredS(s, earth)));
  const H = hiM + hjM;
  const a = cadd({ re: H, im: 0 }, { re: 2 * p.re, im: 2 * p.im });
  const num = cadd(cmul(a, a), { re: xM * xM, im: 0 });
  const lg = clog(cdiv(num, { re: H * H + xM * xM, im: 0 }));
  return cmul({ re: (s.re * MU0) / (4 * Math.PI), im: (s.im * MU0) / (4 * Math.PI) }, lg);
}
