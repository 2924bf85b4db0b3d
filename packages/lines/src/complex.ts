/**
 * A complex number as a plain pair. Used for the handful of scalar complex operations the
 * per-unit-length formulas need (Bessel functions, earth-return integrals, surface impedances).
 * Kept tiny on purpose; complex matrices are not needed in this package.
 */
export interface Complex {
  /** Real part. */
  re: number;
  /** Imaginary part. */
  im: number;
}

/** Makes a complex number re + j im. @example cx(1, 2) // {re: 1, im: 2} */
export function cx(re: number, im = 0): Complex {
  return { re, im };
}

/** a + b. */
export function cadd(a: Complex, b: Complex): Complex {
  return { re: a.re + b.re, im: a.im + b.im };
}

/** a - b. */
export function csub(a: Complex, b: Complex): Complex {
  return { re: a.re - b.re, im: a.im - b.im };
}

/** a * b. */
export function cmul(a: Complex, b: Complex): Complex {
  return { re: a.re * b.re - a.im * b.im, im: a.re * b.im + a.im * b.re };
}

/** a * s for real s. */
export function cscale(a: Complex, s: number): Complex {
  return { re: a.re * s, im: a.im * s };
}

/** a / b (Smith's algorithm, avoids overflow for large |b|). */
export function cdiv(a: Complex, b: Complex): Complex {
  if (Math.abs(b.re) >= Math.abs(b.im)) {
    const r = b.im / b.re;
    const d = b.re + b.im * r;
    return { re: (a.re + a.im * r) / d, im: (a.im - a.re * r) / d };
  }
  const r = b.re / b.im;
  const d = b.re * r + b.im;
  return { re: (a.re * r + a.im) / d, im: (a.im * r - a.re) / d };
}

/** |a|. */
export function cabs(a: Complex): number {
  return Math.hypot(a.re, a.im);
}

/** Principal square root (branch cut on the negative real axis, Re >= 0). */
export function csqrt(a: Complex): Complex {
  const m = cabs(a);
  if (m === 0) return { re: 0, im: 0 };
  const re = Math.sqrt((m + Math.abs(a.re)) / 2);
  if (a.re >= 0) return { re, im: a.im / (2 * re) };
  return { re: Math.abs(a.im) / (2 * re), im: a.im >= 0 ? re : -re };
}

/** e^a. */
export function cexp(a: Complex): Complex {
  const e = Math.exp(a.re);
  return { re: e * Math.cos(a.im), im: e * Math.sin(a.im) };
}

/** Principal natural logarithm. */
export function clog(a: Complex): Complex {
  return { re: Math.log(cabs(a)), im: Math.atan2(a.im, a.re) };
}

/** tanh(a), computed without overflow for large |Re a|. */
export function ctanh(a: Complex): Complex {
  // tanh z = (1 - e^{-2z}) / (1 + e^{-2z}) for Re z >= 0, odd symmetry otherwise.
  if (a.re < 0) {
    const t = ctanh({ re: -a.re, im: -a.im });
    return { re: -t.re, im: -t.im };
  }
  const e = cexp({ re: -2 * a.re, im: -2 * a.im });
  return cdiv({ re: 1 - e.re, im: -e.im }, { re: 1 + e.re, im: e.im });
}
