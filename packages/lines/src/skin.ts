/**
 * Conductor internal impedance with skin effect.
 *
 * Round wire: the exact Bessel-function form (Schelkunoff, "The electromagnetic theory of coaxial
 * transmission lines and cylindrical shields", Bell Syst. Tech. J. 13, 1934, from memory)
 *   Z = k / (2 pi a sigma) * J0(k a) / J1(k a),  k = (1 - j) / delta,  delta = 1/sqrt(pi f mu sigma),
 * with the e^{+j omega t} time convention used throughout skein.
 * Tubes and flat conductors: the planar-slab form (a thin tube of thickness t << radius):
 *   surface impedance of a slab carrying current on one face  Zs = (k'/sigma) coth(k' t),
 *   transfer impedance  Zt = (k'/sigma) / sinh(k' t),  k' = (1 + j)/delta,
 * which reaches the DC resistance 1/(sigma t) at f -> 0 and the surface resistance 1/(sigma delta)
 * at high frequency.
 */
import type { Complex } from './complex.ts';
import { cdiv, cmul, cscale, csqrt, ctanh, cexp } from './complex.ts';
import { besselJ0OverJ1 } from './bessel.ts';
import { MU0 } from './constants.ts';

/**
 * Skin depth delta = 1/sqrt(pi f mu0 mur sigma).
 *
 * @param fHz frequency [Hz], > 0 (returns Infinity at 0)
 * @param conductivity conductivity [S/m]
 * @param relPermeability relative permeability [-], default 1
 * @returns skin depth [m]
 * @example skinDepth(1e6, 5.8e7) // 6.6085e-5 m (copper at 1 MHz)
 */
export function skinDepth(fHz: number, conductivity: number, relPermeability = 1): number {
  if (fHz === 0) return Infinity;
  return 1 / Math.sqrt(Math.PI * fHz * MU0 * relPermeability * conductivity);
}

/**
 * Internal impedance per unit length of a solid round wire, exact Bessel form.
 *
 * @param radiusM wire radius a [m]
 * @param fHz frequency [Hz]; 0 gives the DC resistance 1/(pi a^2 sigma) (imaginary part 0)
 * @param conductivity sigma [S/m]
 * @param relPermeability mur [-], default 1
 * @returns Z [ohm/m]; Im Z / (2 pi f) is the internal inductance, mu/(8 pi) at low frequency
 * @example roundWireInternalImpedance(1e-3, 1e6, 5.8e7) // {re: 4.292866e-2, im: 4.148639e-2}
 */
export function roundWireInternalImpedance(radiusM: number, fHz: number, conductivity: number, relPermeability = 1): Complex {
  const rdc = 1 / (Math.PI * radiusM * radiusM * conductivity);
  if (fHz === 0) return { re: rdc, im: 0 };
  const delta = skinDepth(fHz, conductivity, relPermeability);
  const x = radiusM / delta;
  if (x < 1e-4) {
    // J0/J1 series: Z = Rdc (1 + (ka)^2 ... ) ; to first order Z = Rdc + j omega mu/(8 pi)
    const omega = 2 * Math.PI * fHz;
    return { re: rdc, im: (omega * MU0 * relPermeability) / (8 * Math.PI) };
  }
  const k = { re: 1 / delta, im: -1 / delta };
  const ratio = besselJ0OverJ1({ re: x, im: -x });
  return cscale(cmul(k, ratio), 1 / (2 * Math.PI * radiusM * conductivity));
}

/**
 * Internal inductance of a round wire at DC, mu0 mur / (8 pi).
 *
 * @param relPermeability mur [-], default 1
 * @returns [H/m]
 * @example roundWireDcInternalInductance() // 5.0e-8 H/m
 */
export function roundWireDcInternalInductance(relPermeability = 1): number {
  return (MU0 * relPermeability) / (8 * Math.PI);
}

/** Surface and transfer impedances of a planar slab (thin tube), per unit width. */
export interface SlabImpedance {
  /** Impedance seen by current on one face, return on the same side [ohm] (per unit length, per unit width). */
  surface: Complex;
  /** Transfer impedance between the two faces [ohm] (per unit length, per unit width). */
  transfer: Complex;
}

/**
 * Surface and transfer impedance of a conducting slab of thickness t (planar approximation of a
 * thin tube, Schelkunoff 1934, from memory). Divide by the width (2 pi r for a tube) to get ohm/m.
 *
 * @param thicknessM slab thickness t [m], > 0
 * @param fHz frequency [Hz]; 0 gives 1/(sigma t) for both
 * @param conductivity sigma [S/m]
 * @param relPermeability mur [-], default 1
 * @returns surface = (k/sigma) coth(k t), transfer = (k/sigma)/sinh(k t), k = (1+j)/delta
 * @example slabImpedance(1e-3, 0, 5.8e7).surface.re // 1/(5.8e7*1e-3) = 1.724e-5 ohm
 */
export function slabImpedance(thicknessM: number, fHz: number, conductivity: number, relPermeability = 1): SlabImpedance {
  const rdc = 1 / (conductivity * thicknessM);
  if (fHz === 0) return { surface: { re: rdc, im: 0 }, transfer: { re: rdc, im: 0 } };
  const delta = skinDepth(fHz, conductivity, relPermeability);
  const kt = { re: thicknessM / delta, im: thicknessM / delta };
  if (kt.re < 1e-6) {
    const omega = 2 * Math.PI * fHz;
    // coth(x) ~ 1/x + x/3 -> Zs ~ 1/(sigma t) + j omega mu t / 3
    return {
      surface: { re: rdc, im: (omega * MU0 * relPermeability * thicknessM) / 3 },
      transfer: { re: rdc, im: (-omega * MU0 * relPermeability * thicknessM) / 6 },
    };
  }
  const k = { re: 1 / delta, im: 1 / delta };
  const th = ctanh(kt);
  const surface = cscale(cdiv(k, th), 1 / conductivity);
  // 1/sinh(x) = 2 e^{-x} / (1 - e^{-2x})
  const e1 = cexp({ re: -kt.re, im: -kt.im });
  const e2 = cexp({ re: -2 * kt.re, im: -2 * kt.im });
  const csch = cdiv(cscale(e1, 2), { re: 1 - e2.re, im: -e2.im });
  const transfer = cscale(cmul(k, csch), 1 / conductivity);
  return { surface, transfer };
}

/**
 * Internal impedance of a solid round wire at complex frequency s = sigma + j omega, the analytic
 * continuation of {@link roundWireInternalImpedance}: Z(s) = k / (2 pi a sigma_c) J0(k a) / J1(k a),
 * k^2 = -s mu sigma_c (at s = j omega, k = (1 - j) / delta). Z is even in k, so the branch of the
 * root does not matter; for a real s > 0, k a is imaginary and the ratio is the modified-Bessel
 * form -j I0(q a) / I1(q a), q = sqrt(s mu sigma_c).
 *
 * @param radiusM wire radius a [m]
 * @param s complex frequency [1/s]; 0 gives the DC resistance
 * @param conductivity sigma_c [S/m]
 * @param relPermeability mur [-], default 1
 * @returns Z(s) [ohm/m]
 * @example roundWireInternalImpedanceS(1e-3, { re: 0, im: 2 * Math.PI * 1e6 }, 5.8e7) // {re: 4.292866e-2, im: 4.148639e-2}
 */
export function roundWireInternalImpedanceS(radiusM: number, s: Complex, conductivity: number, relPermeability = 1): Complex {
  const rdc = 1 / (Math.PI * radiusM * radiusM * conductivity);
  const mu = MU0 * relPermeability;
  const k2a2 = { re: -s.re * mu * conductivity * radiusM * radiusM, im: -s.im * mu * conductivity * radiusM * radiusM };
  if (Math.hypot(k2a2.re, k2a2.im) < 2e-8) {
    // J0/J1 series to first order: Z = Rdc + s mu / (8 pi) (as the j omega form below x = 1e-4).
    return { re: rdc + (s.re * mu) / (8 * Math.PI), im: (s.im * mu) / (8 * Math.PI) };
  }
  const ka = csqrt(k2a2);
  const ratio = besselJ0OverJ1(ka);
  return cscale(cmul(ka, ratio), 1 / (2 * Math.PI * radiusM * radiusM * conductivity));
}

/**
 * Surface and transfer impedance of a conducting slab at complex frequency s = sigma + j omega,
 * the analytic continuation of {@link slabImpedance}: (k/sigma_c) coth(k t) and
 * (k/sigma_c) / sinh(k t), k^2 = s mu sigma_c (both even in k; the root with Re k >= 0 is taken).
 *
 * @param thicknessM slab thickness t [m], > 0
 * @param s complex frequency [1/s]; 0 gives 1/(sigma_c t) for both
 * @param conductivity sigma_c [S/m]
 * @param relPermeability mur [-], default 1
 * @returns surface and transfer impedance [ohm] per unit length and width
 * @example slabImpedanceS(1e-3, { re: 0, im: 0 }, 5.8e7).surface.re // 1.724e-5 ohm
 */
export function slabImpedanceS(thicknessM: number, s: Complex, conductivity: number, relPermeability = 1): SlabImpedance {
  const rdc = 1 / (conductivity * thicknessM);
  const mu = MU0 * relPermeability;
  const k2t2 = { re: s.re * mu * conductivity * thicknessM * thicknessM, im: s.im * mu * conductivity * thicknessM * thicknessM };
  if (Math.hypot(k2t2.re, k2t2.im) < 2e-12) {
    // coth(x) ~ 1/x + x/3, csch(x) ~ 1/x - x/6 -> Zs ~ 1/(sigma t) + s mu t / 3, Zt ~ 1/(sigma t) - s mu t / 6
    return {
      surface: { re: rdc + (s.re * mu * thicknessM) / 3, im: (s.im * mu * thicknessM) / 3 },
      transfer: { re: rdc - (s.re * mu * thicknessM) / 6, im: (-s.im * mu * thicknessM) / 6 },
    };
  }
  const kt = csqrt(k2t2);
  const k = cscale(kt, 1 / thicknessM);
  const surface = cscale(cdiv(k, ctanh(kt)), 1 / conductivity);
  const e1 = cexp({ re: -kt.re, im: -kt.im });
  const e2 = cexp({ re: -2 * kt.re, im: -2 * kt.im });
  const csch = cdiv(cscale(e1, 2), { re: 1 - e2.re, im: -e2.im });
  const transfer = cscale(cmul(k, csch), 1 / conductivity);
  return { surface, transfer };
}
