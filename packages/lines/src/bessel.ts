/**
 * Bessel functions of the first kind, orders 0 and 1, of complex argument.
 *
 * Method (Abramowitz & Stegun, Handbook of Mathematical Functions, 1964):
 * - |z| < 17: the ascending power series 9.1.10,
 *   J_n(z) = (z/2)^n sum_k (-z^2/4)^k / (k! (n+k)!).
 * - |z| >= 17: Hankel's asymptotic expansion 9.2.5 with P, Q of 9.2.9-9.2.10, summed until the
 *   terms stop decreasing (smallest term about e^{-2|z|} < 2e-15 at the switch point).
 * Re z < 0 is mapped by J_n(-z) = (-1)^n J_n(z) (9.1.35) so the expansion is used for
 * |arg z| <= pi/2 only. The scaled forms return J_n(z) e^{-|Im z|}, which stays finite for
 * the large arguments (1 - j) a / delta of skin-effect problems at high frequency.
 */
import type { Complex } from './complex.ts';
import { cdiv, cexp, cmul, csqrt } from './complex.ts';

const SERIES_LIMIT = 17;

function series(n: 0 | 1, z: Complex): Complex {
  // w = -z^2/4
  const wr = -(z.re * z.re - z.im * z.im) / 4;
  const wi = -(2 * z.re * z.im) / 4;
  let tr = 1;
  let ti = 0;
  if (n === 1) {
    tr = z.re / 2;
    ti = z.im / 2;
  }
  let sr = tr;
  let si = ti;
  for (let k = 1; k < 300; k++) {
    const d = k * (k + n);
    const nr = (tr * wr - ti * wi) / d;
    const ni = (tr * wi + ti * wr) / d;
    tr = nr;
    ti = ni;
    sr += tr;
    si += ti;
    if (Math.abs(tr) + Math.abs(ti) <= 1e-17 * (Math.abs(sr) + Math.abs(si)) && k > 2) break;
  }
  return { re: sr, im: si };
}

/** Hankel expansion of J_n(z) e^{-|Im z|} for Re z >= 0, |z| large. */
function asymptoticScaled(n: 0 | 1, z: Complex): Complex {
  const mu = 4 * n * n;
  // P = sum (-1)^k a_{2k} / z^{2k}, Q = sum (-1)^k a_{2k+1} / z^{2k+1}; a_m = prod_{i=1..m} (mu - (2i-1)^2) / (m! 8^m)
  const iz = cdiv({ re: 1, im: 0 }, z);
  let pr = 1;
  let pi = 0;
  let qr = 0;
  let qi = 0;
  let termR = 1; // a_m / z^m with sign handled below
  let termI = 0;
  let prevMag = Infinity;
  for (let m = 1; m < 200; m++) {
    const f = (mu - (2 * m - 1) * (2 * m - 1)) / (m * 8);
    const nr = (termR * iz.re - termI * iz.im) * f;
    const ni = (termR * iz.im + termI * iz.re) * f;
    const mag = Math.abs(nr) + Math.abs(ni);
    if (mag > prevMag) break; // asymptotic series: stop at the smallest term
    termR = nr;
    termI = ni;
    prevMag = mag;
    // sign (-1)^k where m = 2k or 2k+1
    const k = Math.floor(m / 2);
    const s = k % 2 === 0 ? 1 : -1;
    if (m % 2 === 0) {
      pr += s * termR;
      pi += s * termI;
    } else {
      qr += s * termR;
      qi += s * termI;
    }
    if (mag < 1e-17) break;
  }
  // chi = z - (n/2 + 1/4) pi ; cos chi = (e^{i chi} + e^{-i chi})/2, sin chi = (e^{i chi} - e^{-i chi})/(2i)
  const chiR = z.re - (n / 2 + 0.25) * Math.PI;
  const chiI = z.im;
  const s = Math.abs(z.im);
  const ep = cexp({ re: -chiI - s, im: chiR }); // e^{i chi} e^{-|Im z|}
  const em = cexp({ re: chiI - s, im: -chiR }); // e^{-i chi} e^{-|Im z|}
  const cosR = (ep.re + em.re) / 2;
  const cosI = (ep.im + em.im) / 2;
  // sin = (ep - em)/(2i) = -i (ep - em)/2
  const sinR = (ep.im - em.im) / 2;
  const sinI = -(ep.re - em.re) / 2;
  const a = cmul({ re: pr, im: pi }, { re: cosR, im: cosI });
  const b = cmul({ re: qr, im: qi }, { re: sinR, im: sinI });
  const bracket = { re: a.re - b.re, im: a.im - b.im };
  const pref = csqrt(cdiv({ re: 2 / Math.PI, im: 0 }, z));
  return cmul(pref, bracket);
}

function scaled(n: 0 | 1, z: Complex): Complex {
  if (!Number.isFinite(z.re) || !Number.isFinite(z.im)) return { re: NaN, im: NaN };
  let w = z;
  let sign = 1;
  if (z.re < 0) {
    w = { re: -z.re, im: -z.im };
    sign = n === 1 ? -1 : 1;
  }
  let r: Complex;
  if (Math.hypot(w.re, w.im) < SERIES_LIMIT) {
    const j = series(n, w);
    const e = Math.exp(-Math.abs(w.im));
    r = { re: j.re * e, im: j.im * e };
  } else {
    r = asymptoticScaled(n, w);
  }
  return { re: sign * r.re, im: sign * r.im };
}

/**
 * J0(z) for complex z.
 *
 * @param z complex argument
 * @returns J0(z); overflows to Infinity only when |Im z| > ~709 (use {@link besselJ0Scaled} there)
 * @example besselJ0({ re: 1, im: 0 }) // {re: 0.7651976866, im: 0} (A&S table 9.1)
 */
export function besselJ0(z: Complex): Complex {
  const r = scaled(0, z);
  const e = Math.exp(Math.abs(z.im));
  return { re: r.re * e, im: r.im * e };
}

/**
 * J1(z) for complex z.
 *
 * @param z complex argument
 * @returns J1(z)
 * @example besselJ1({ re: 1, im: 0 }) // {re: 0.4400505857, im: 0} (A&S table 9.1)
 */
export function besselJ1(z: Complex): Complex {
  const r = scaled(1, z);
  const e = Math.exp(Math.abs(z.im));
  return { re: r.re * e, im: r.im * e };
}

/**
 * Exponentially scaled J0: J0(z) e^{-|Im z|}, finite for every finite z.
 *
 * @param z complex argument
 * @example besselJ0Scaled({ re: 0, im: 0 }) // {re: 1, im: 0}
 */
export function besselJ0Scaled(z: Complex): Complex {
  return scaled(0, z);
}

/**
 * Exponentially scaled J1: J1(z) e^{-|Im z|}, finite for every finite z.
 *
 * @param z complex argument
 * @example besselJ1Scaled({ re: 0, im: 0 }) // {re: 0, im: 0}
 */
export function besselJ1Scaled(z: Complex): Complex {
  return scaled(1, z);
}

/**
 * The ratio J0(z)/J1(z) without overflow (both scaled by the same factor).
 *
 * @param z complex argument, z != 0
 * @example besselJ0OverJ1({ re: 1, im: 0 }).re // 1.7388 (= 0.76520/0.44005)
 */
export function besselJ0OverJ1(z: Complex): Complex {
  return cdiv(scaled(0, z), scaled(1, z));
}
