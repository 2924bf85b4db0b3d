/**
 * Adaptive Gauss-Kronrod (7-15) quadrature of a complex-valued function on a finite interval.
 * Nodes and weights: Kronrod extension of the 7-point Gauss rule (Piessens et al., QUADPACK,
 * Springer 1983, table of QK15).
 */

const XGK = [
  0.991455371120812639206854697526329, 0.949107912342758524526189684047851, 0.864864423359769072789712788640926,
  0.741531185599394439863864773280788, 0.58608723546769113029414483825873, 0.405845151377397166906606412076961,
  0.207784955007898467600689403773245, 0,
];
const WGK = [
  0.02293532201052922496373200805897, 0.063092092629978553290700663189204, 0.104790010322250183839876322541518,
  0.140653259715525918745189590510238, 0.16900472663926790282658342659855, 0.190350578064785409913256402421014,
  0.204432940075298892414161999234649, 0.209482141084727828012999174891714,
];
const WG = [0.129484966168869693270611432679082, 0.27970539148927666790146777142378, 0.381830050505118944950369775488975, 0.417959183673469387755102040816327];

/** A complex integrand: writes f(x) into out[0] (re) and out[1] (im). */
export type ComplexIntegrand = (x: number, out: Float64Array) => void;

/**
 * Integrates a complex function over [a, b] adaptively to |error| <= max(absTol, relTol |I|).
 *
 * @param f integrand writing re, im into its out argument
 * @param a lower limit
 * @param b upper limit
 * @param relTol relative tolerance, default 1e-10
 * @param absTol absolute tolerance, default 0
 * @returns [re, im] of the integral
 * @example integrateComplex((x, o) => { o[0] = x; o[1] = 0; }, 0, 1) // [0.5, 0]
 */
export function integrateComplex(f: ComplexIntegrand, a: number, b: number, relTol = 1e-10, absTol = 0): [number, number] {
  const out = new Float64Array(2);
  const stack: [number, number, number][] = [[a, b, 0]];
  let sr = 0;
  let si = 0;
  // First pass to estimate the magnitude for the relative tolerance.
  const whole = rule(f, a, b, out);
  const scale = Math.max(Math.hypot(whole[0], whole[1]), 1e-300);
  stack.pop();
  stack.push([a, b, 0]);
  while (stack.length > 0) {
    const [x0, x1, depth] = stack.pop() as [number, number, number];
    const r = rule(f, x0, x1, out);
    const tol = Math.max(absTol, relTol * scale) * ((x1 - x0) / (b - a));
    if (r[2] <= tol || depth >= 40) {
      sr += r[0];
      si += r[1];
    } else {
      const m = 0.5 * (x0 + x1);
      stack.push([x0, m, depth + 1], [m, x1, depth + 1]);
    }
  }
  return [sr, si];
}

function rule(f: ComplexIntegrand, a: number, b: number, out: Float64Array): [number, number, number] {
  const c = 0.5 * (a + b);
  const h = 0.5 * (b - a);
  f(c, out);
  let kr = out[0] * WGK[7];
  let ki = out[1] * WGK[7];
  let gr = out[0] * WG[3];
  let gi = out[1] * WG[3];
  for (let j = 0; j < 7; j++) {
    const dx = h * XGK[j];
    f(c - dx, out);
    const r1 = out[0];
    const i1 = out[1];
    f(c + dx, out);
    const r2 = out[0];
    const i2 = out[1];
    kr += WGK[j] * (r1 + r2);
    ki += WGK[j] * (i1 + i2);
    if (j % 2 === 1) {
      const w = WG[(j - 1) / 2];
      gr += w * (r1 + r2);
      gi += w * (i1 + i2);
    }
  }
  const err = h * Math.hypot(kr - gr, ki - gi);
  return [kr * h, ki * h, err];
}
