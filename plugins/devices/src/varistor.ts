/**
 * `varistor`: a metal-oxide varistor or surge arrester, symmetric, i = sign(v) I(|v|), with I(u)
 *  - a power law I = Iref (u / Vref)^alpha (the usual varistor law, alpha the nonlinearity
 *    exponent; e.g. L. M. Levinson, H. R. Philipp, "Zinc oxide varistors - a review", Am. Ceram.
 *    Soc. Bull. 65, 1986, from memory), or
 *  - a table of [current, voltage] points interpolated in log-log: ln I as a function of ln V by
 *    monotone piecewise-cubic Hermite interpolation (F. N. Fritsch, R. E. Carlson, SIAM J. Numer.
 *    Anal. 17, 238-246, 1980), so that di/dv is continuous and I(V) stays increasing; between points
 *    of a table that follows a power law it is that power law exactly. Outside the table the end
 *    segments' exponents continue it (a power law through the end point).
 * Beyond 1e12 A the law continues linearly (C1), so i(v) stays finite. With a rated energy, the
 * absorbed energy above it gives a "rating exceeded" warning.
 *
 * Newton limiting: the power-law analogue of logarithmic junction limiting. A step up from u_old
 * (at least the knee voltage) to u_new is shortened to the voltage at which the device current
 * equals the linearised prediction, u = u_b (1 + a (u_new - u_b)/u_b)^(1/a), a = d ln I / d ln u
 * at u_b = max(u_old, knee). Steps down pass unchanged.
 */
import { badInput, defineLoad, type SetupContext, type StructuredOutput } from '@skein/core';
import { DeviceMeter, finishDevice, RATING_PARAMS, type Ratings } from './meter.ts';

/** Current beyond which the law continues linearly [A]. */
const I_LINEAR_A = 1e12;

/**
 * Fritsch-Carlson slopes of a monotone cubic Hermite interpolant through (x_k, y_k), y increasing.
 * @param x knots, increasing; y values, strictly increasing.
 * @returns the slope at each knot.
 * @example monotoneSlopes([0, 1, 2], [0, 1, 2]) // [1, 1, 1]
 */
export function monotoneSlopes(x: ArrayLike<number>, y: ArrayLike<number>): Float64Array {
  const n = x.length;
  const d = new Float64Array(n - 1);
  for (let k = 0; k < n - 1; k++) d[k] = (y[k + 1] - y[k]) / (x[k + 1] - x[k]);
  const m = new Float64Array(n);
  m[0] = d[0];
  m[n - 1] = d[n - 2];
  for (let k = 1; k < n - 1; k++) m[k] = 0.5 * (d[k - 1] + d[k]);
  for (let k = 0; k < n - 1; k++) {
    const a = m[k] / d[k];
    const b = m[k + 1] / d[k];
    const r = a * a + b * b;
    if (r > 9) {
      const t = 3 / Math.sqrt(r);
      m[k] = t * a * d[k];
      m[k + 1] = t * b * d[k];
    }
  }
  return m;
}

/**
 * Per-run object of the varistor.
 * @example (varistorLoad.create({ referenceVoltage: 470, referenceCurrent: 1e-3, exponent: 30 }, ctx) as VaristorDevice).evaluate(-470, 0, out) // out[0] = -1e-3 A
 */
export class VaristorDevice {
  readonly kind = 'nonlinear' as const;
  readonly #xs: Float64Array; // ln V knots (length 1 for a power law)
  readonly #ys: Float64Array; // ln I
  readonly #ms: Float64Array; // d lnI / d lnV
  // [uLin, ILin, dILin, knee, scratch I, scratch dI/du, scratch u]
  readonly #q = new Float64Array(7);
  readonly #meter: DeviceMeter;
  readonly #ratings: Ratings;
  readonly #ctx: SetupContext;

  /**
   * @param lnV knots ln V (one knot: a power law through it with exponent slopes[0]);
   * @param lnI ln I at the knots; slopes d ln I / d ln V at the knots.
   */
  constructor(lnV: Float64Array, lnI: Float64Array, slopes: Float64Array, ratings: Ratings, ctx: SetupContext) {
    this.#xs = lnV;
    this.#ys = lnI;
    this.#ms = slopes;
    this.#meter = new DeviceMeter(ratings.currentThreshold);
    this.#ratings = ratings;
    this.#ctx = ctx;
    const n = lnV.length;
    // Where the upper power law reaches I_LINEAR_A.
    const uLin = Math.exp(lnV[n - 1] + (Math.log(I_LINEAR_A) - lnI[n - 1]) / slopes[n - 1]);
    const q = this.#q;
    q[3] = Math.exp(lnV[0]);
    if (uLin > Math.exp(lnV[n - 1])) {
      q[0] = uLin;
      q[1] = I_LINEAR_A;
      q[2] = (slopes[n - 1] * I_LINEAR_A) / uLin;
    } else {
      q[0] = Infinity;
    }
  }

  /** I(u) and dI/du at u = q[6] >= 0 into the scratch slots q[4], q[5] (array in and out: no boxed doubles). */
  #law(): void {
    const q = this.#q;
    const u = q[6];
    if (u >= q[0]) {
      q[4] = q[1] + q[2] * (u - q[0]);
      q[5] = q[2];
      return;
    }
    if (u <= 0) {
      q[4] = 0;
      q[5] = this.#ms[0] === 1 ? Math.exp(this.#ys[0] - this.#xs[0]) : 0;
      return;
    }
    const xs = this.#xs;
    const ys = this.#ys;
    const ms = this.#ms;
    const n = xs.length;
    const x = Math.log(u);
    let y: number;
    let dy: number;
    if (x <= xs[0]) {
      y = ys[0] + ms[0] * (x - xs[0]);
      dy = ms[0];
    } else if (x >= xs[n - 1]) {
      y = ys[n - 1] + ms[n - 1] * (x - xs[n - 1]);
      dy = ms[n - 1];
    } else {
      let lo = 0;
      let hi = n - 1;
      while (hi - lo > 1) {
        const mid = (lo + hi) >> 1;
        if (xs[mid] <= x) lo = mid;
        else hi = mid;
      }
      const h = xs[hi] - xs[lo];
      const t = (x - xs[lo]) / h;
      const t2 = t * t;
      const t3 = t2 * t;
      y = (2 * t3 - 3 * t2 + 1) * ys[lo] + (t3 - 2 * t2 + t) * h * ms[lo] + (-2 * t3 + 3 * t2) * ys[hi] + (t3 - t2) * h * ms[hi];
      dy = ((6 * t2 - 6 * t) * ys[lo] + (3 * t2 - 4 * t + 1) * h * ms[lo] + (-6 * t2 + 6 * t) * ys[hi] + (3 * t2 - 2 * t) * h * ms[hi]) / h;
    }
    const i = Math.exp(y);
    q[4] = i;
    q[5] = (dy * i) / u;
  }

  /** Step hook: i [A] into out[0], di/dv [S] into out[1]. */
  evaluate(vV: number, _tS: number, out: Float64Array): void {
    const q = this.#q;
    q[6] = Math.abs(vV);
    this.#law();
    out[0] = vV < 0 ? -q[4] : q[4];
    out[1] = q[5];
  }

  /** Step hook: power-law limiting of a Newton step up (see the module doc). */
  limit(vNew: number, vOld: number): number {
    const uN = Math.abs(vNew);
    const sameSide = (vNew >= 0) === (vOld >= 0);
    const uO = sameSide ? Math.abs(vOld) : 0;
    const q = this.#q;
    const ub = uO > q[3] ? uO : q[3];
    if (!(uN > ub)) return vNew;
    q[6] = ub;
    this.#law();
    const a = (ub * q[5]) / q[4];
    if (!(a > 1)) return vNew;
    const uL = ub * Math.pow(1 + (a * (uN - ub)) / ub, 1 / a);
    return vNew < 0 ? -uL : uL;
  }

  /** Frequency-domain hook: small-signal admittance around 0 V, di/dv(0) (0 for an exponent above 1) [S]. */
  admittance(_omegaRadS: number, out: Float64Array): void {
    const q = this.#q;
    q[6] = 0;
    this.#law();
    out[0] = q[5];
    out[1] = 0;
  }

  /** Frequency-domain hook at s = sigma + j omega: the same real constant (analytic in s) [S]. */
  admittanceAt(_sigma: number, omegaRadS: number, out: Float64Array): void {
    this.admittance(omegaRadS, out);
  }

  /** Step hook after convergence: energy and peaks. */
  accept(vV: number, iA: number, tS: number): void {
    const m = this.#meter;
    m.io[0] = vV;
    m.io[1] = iA;
    m.io[2] = tS;
    m.record();
  }

  /** Finish: energy absorbed, peak current, i^2 t, time above threshold; warns when a rating is exceeded. */
  finish(error?: unknown): StructuredOutput {
    return finishDevice(this.#meter, this.#ratings, this.#ctx, 'varistor', {}, error);
  }
}

/**
 * The varistor load plugin. Params: either `points` (table of [current A, voltage V], currents and
 * voltages increasing, at least two rows) or the power law `referenceVoltage` [V, default 470],
 * `referenceCurrent` [A, default 1 mA], `exponent` [1, default 30]; plus the ratings
 * (ratedEnergy J, ratedCurrent A, ratedI2t A2s, currentThreshold A).
 * @throws InputError (E_PARAM) naming the table row whose voltage does not rise, or an exponent below 1.
 * @example create({ referenceVoltage: 470, referenceCurrent: 1e-3, exponent: 30 }).evaluate(470, 0, out) // out[0] = 1e-3
 */
export const varistorLoad = defineLoad({
  type: 'varistor',
  summary: 'A metal-oxide varistor or surge arrester: power law or log-log V-I table, with energy rating',
  params: {
    points: { kind: 'table', columns: ['A', 'V'], optional: true, summary: 'V-I characteristic as [current, voltage] rows (log-log interpolation); replaces the power law' },
    referenceVoltage: { unit: 'V', default: 470, min: 0, exclusiveMin: true, summary: 'power law: voltage at the reference current (the "varistor voltage")' },
    referenceCurrent: { unit: 'A', default: 1e-3, min: 0, exclusiveMin: true, summary: 'power law: reference current (usually 1 mA)' },
    exponent: { unit: '1', default: 30, min: 1, summary: 'power law: nonlinearity exponent alpha, I = Iref (V/Vref)^alpha' },
    ...RATING_PARAMS,
  },
  create(p, ctx) {
    if (p.points) {
      const rows = p.points;
      const n = rows.length;
      const lnV = new Float64Array(n);
      const lnI = new Float64Array(n);
      for (let k = 0; k < n; k++) {
        const [i, v] = rows[k];
        if (!(i > 0)) throw badInput(['points', k, 0], 'must be a positive current (log-log interpolation)', i, 'E_PARAM');
        if (!(v > 0)) throw badInput(['points', k, 1], 'must be a positive voltage (log-log interpolation)', v, 'E_PARAM');
        if (k > 0 && !(v > rows[k - 1][1])) throw badInput(['points', k, 1], `must be greater than the previous row's voltage ${rows[k - 1][1]} V (a varistor's voltage rises with its current)`, v, 'E_PARAM');
        lnV[k] = Math.log(v);
        lnI[k] = Math.log(i);
      }
      const m = monotoneSlopes(lnV, lnI);
      if (!(m[0] >= 1)) {
        throw badInput(['points', 1], `the first two rows give a log-log slope of ${m[0].toPrecision(3)}; it must be at least 1 so that di/dv stays finite at 0 V`, rows[1], 'E_PARAM');
      }
      return new VaristorDevice(lnV, lnI, m, p, ctx);
    }
    return new VaristorDevice(
      new Float64Array([Math.log(p.referenceVoltage)]), new Float64Array([Math.log(p.referenceCurrent)]), new Float64Array([p.exponent]), p, ctx,
    );
  },
});
