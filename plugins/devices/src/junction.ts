/**
 * A two-terminal device made of a nonlinear junction j(x) (x the junction voltage), a constant
 * junction capacitance C across it, and a series resistance Rs:
 *   i = j(x) + C dx/dt = (v - x) / Rs.
 * The capacitance uses the trapezoidal companion i_C = g_C x + h_C, g_C = 2C/dt, with
 * h_C = -(g_C x_{n-1} + i_C,{n-1}) updated in accept. For each branch voltage v the junction
 * voltage x is found by a safeguarded Newton iteration (Newton steps kept inside a bracket, with
 * bisection when a step leaves it; Numerical Recipes' "rtsafe" scheme), so i(v) is smooth and
 * monotone and di/dv = j'_tot / (1 + Rs j'_tot) with j'_tot = j'(x) + g_C.
 *
 * Newton limiting of the branch voltage (limit): the branch step is mapped to a junction step by
 * the linearisation at the old point, the junction step is limited by the device's rule
 * (logarithmic junction-voltage limiting for exponentials), and mapped back.
 */
import type { SetupContext, StructuredOutput } from '@skein/core';
import { DeviceMeter, finishDevice, type Ratings } from './meter.ts';

/** Largest exponent argument before exponentials continue linearly (e^80 = 5.5e34; keeps i(v) finite and C1). @example Math.exp(EXP_ARG_MAX) // 5.54e34 */
export const EXP_ARG_MAX = 80;

/**
 * Junction current beyond which a device's exponential continues linearly [A]: 1 MA, far above
 * any device rating, low enough that Newton iterations from far above the solution (where an
 * exponential converges by one slope voltage per iteration) start close to it.
 */
export const EXP_LINEAR_CURRENT_A = 1e6;

/**
 * The exponent argument at which an exponential I0 e^z reaches EXP_LINEAR_CURRENT_A (at most EXP_ARG_MAX).
 * @example expArgMax(1e-14) // ln(1e20) = 46.05
 */
export function expArgMax(i0A: number): number {
  return Math.min(EXP_ARG_MAX, Math.log(EXP_LINEAR_CURRENT_A / i0A));
}

/**
 * exp(z) continued linearly beyond zMax, C1 at the joint: reads z from buf[at] and zMax from
 * buf[at + 1], writes the value to buf[at] and its derivative to buf[at + 1] (array in and out:
 * no boxed doubles).
 * @example const o = new Float64Array([1, 80]); expLinear(o, 0); o[0] // e
 */
export function expLinear(buf: Float64Array, at: number): void {
  const z = buf[at];
  const zm = buf[at + 1];
  if (z <= zm) {
    const e = Math.exp(z);
    buf[at] = e;
    buf[at + 1] = e;
  } else {
    const e = Math.exp(zm);
    buf[at] = e * (1 + z - zm);
    buf[at + 1] = e;
  }
}

/**
 * Logarithmic junction-voltage limiting of one Newton step of an exponential e^{(x - x0)/vt}:
 * above the critical voltage a step up is shortened so that the current grows as the
 * linearisation predicts, x = base + vt ln(1 + (xNew - base)/vt) with base = max(xOld, x0).
 * Steps down and steps below vcrit pass unchanged. (Classic circuit-simulation practice for
 * exponential junctions, common practice.)
 * @example limitExponentialStep(5, 0.6, 0.025, 0.6, 0) // 0.6 + 0.025 ln(1 + 4.4/0.025) = 0.7294
 */
export function limitExponentialStep(xNew: number, xOld: number, vt: number, vcrit: number, x0: number): number {
  if (xNew > vcrit && Math.abs(xNew - xOld) > 2 * vt && xNew > xOld) {
    const base = xOld > x0 ? xOld : x0;
    if (xNew <= base) return xNew;
    return base + vt * Math.log(1 + (xNew - base) / vt);
  }
  return xNew;
}

// State slots.
const X = 0; // last solved junction voltage (warm start)
const HC = 1; // capacitor history current
const JX = 2; // junction law scratch: x in, then j, j' out
const J = 3;
const DJ = 4;
const XACC = 5; // junction voltage at the last accepted step
const VIN = 6; // branch voltage to solve for
const FV = 7; // F at s[JX]
const N = 8;

/**
 * Base class of junction devices. Subclasses give the junction law and its Newton limiting.
 * @example class MyJunction extends JunctionDevice { protected junction(b, at) { ... } protected limitJunction(xn) { return xn; } }
 */
export abstract class JunctionDevice {
  readonly kind = 'nonlinear' as const;
  readonly #s = new Float64Array(N);
  readonly #p: Float64Array; // [Rs, gC, C]
  readonly #meter: DeviceMeter;
  readonly #ratings: Ratings;
  readonly #ctx: SetupContext;
  readonly #name: string;

  constructor(name: string, seriesResistanceOhm: number, capacitanceF: number, ratings: Ratings, ctx: SetupContext) {
    this.#name = name;
    this.#p = new Float64Array([seriesResistanceOhm, capacitanceF > 0 ? (2 * capacitanceF) / ctx.dtS : 0, capacitanceF]);
    this.#meter = new DeviceMeter(ratings.currentThreshold);
    this.#ratings = ratings;
    this.#ctx = ctx;
  }

  /**
   * The junction law: reads x [V] from buf[at], writes j(x) [A] to buf[at + 1] and dj/dx [S] to
   * buf[at + 2]. Smooth and increasing. (Array in and out: no boxed doubles per call.)
   */
  protected abstract junction(buf: Float64Array, at: number): void;

  /** Limits a junction-voltage Newton step (device rule; called from limit only). */
  protected abstract limitJunction(xNew: number, xOld: number): number;

  /** Device-specific results for finish. */
  protected extraResults(): StructuredOutput {
    return {};
  }

  /** F(x) = j(x) + gc x + hc - (v - x)/rs at x = s[JX] into s[FV], with j' in s[DJ]. */
  #f(): void {
    const s = this.#s;
    const x = s[JX];
    this.junction(s, JX);
    s[FV] = s[J] + this.#p[1] * x + s[HC] - (s[VIN] - x) / this.#p[0];
  }

  /**
   * Solves for the junction voltage at the branch voltage s[VIN] into s[X]; leaves j_tot and
   * j'_tot in s[J], s[DJ].
   */
  #solve(): void {
    const s = this.#s;
    const rs = this.#p[0];
    const gc = this.#p[1];
    const v = s[VIN];
    if (rs === 0) {
      s[JX] = v;
      this.junction(s, JX);
      s[J] += gc * v + s[HC];
      s[DJ] += gc;
      s[X] = v;
      return;
    }
    if (!(v - v === 0)) {
      // NaN or infinite voltage: no root to bracket; NaN lets the engine's finiteness check name the place.
      s[J] = NaN;
      s[DJ] = NaN;
      return;
    }
    const g = 1 / rs;
    // F increasing with F' >= 1/rs: bracket the root from the warm start, then safeguarded Newton.
    let x = s[X];
    let lo = x;
    let hi = x;
    let d = 0.1;
    s[JX] = x;
    this.#f();
    // F' >= 1/rs bounds the root within |F(x)| rs of x: doubling from 0.1 V reaches any finite
    // bracket in well under 1100 steps (2^1100 overflows).
    if (s[FV] > 0) {
      for (let e = 0; e < 1100; e++) {
        lo = x - d;
        s[JX] = lo;
        this.#f();
        if (s[FV] <= 0) break;
        hi = lo;
        d *= 2;
      }
    } else {
      for (let e = 0; e < 1100; e++) {
        hi = x + d;
        s[JX] = hi;
        this.#f();
        if (s[FV] >= 0) break;
        lo = hi;
        d *= 2;
      }
    }
    for (let it = 0; it < 200; it++) {
      s[JX] = x;
      this.#f();
      const f = s[FV];
      const df = s[DJ] + gc + g;
      if (f > 0) hi = x;
      else lo = x;
      let xn = x - f / df;
      if (!(xn > lo && xn < hi)) xn = 0.5 * (lo + hi);
      const step = Math.abs(xn - x);
      x = xn;
      if (step <= 1e-15 * (Math.abs(x) + 1) || hi - lo <= 1e-15 * (Math.abs(x) + 1)) break;
    }
    s[JX] = x;
    this.junction(s, JX);
    s[J] += gc * x + s[HC];
    s[DJ] += gc;
    s[X] = x;
  }

  /** Step hook: branch current (plus to minus) [A] into out[0], di/dv [S] into out[1]. */
  evaluate(vV: number, _tS: number, out: Float64Array): void {
    const s = this.#s;
    s[VIN] = vV;
    this.#solve();
    const dj = s[DJ];
    out[0] = s[J];
    out[1] = dj / (1 + this.#p[0] * dj);
  }

  /** Step hook: limits a Newton update of the branch voltage from vOld to vNew [V]. */
  limit(vNew: number, vOld: number): number {
    const s = this.#s;
    s[VIN] = vOld;
    this.#solve();
    const xOld = s[X];
    const r = 1 + this.#p[0] * s[DJ];
    const xPred = xOld + (vNew - vOld) / r;
    const xLim = this.limitJunction(xPred, xOld);
    return xLim === xPred ? vNew : vOld + (xLim - xOld) * r;
  }

  /** Step hook after convergence: updates the capacitor history and the meter. */
  accept(vV: number, iA: number, tS: number): void {
    const s = this.#s;
    s[VIN] = vV;
    this.#solve();
    const x = s[X];
    const gc = this.#p[1];
    if (gc > 0) {
      const ic = gc * x + s[HC];
      s[HC] = -(gc * x + ic);
    }
    s[XACC] = x;
    const m = this.#meter;
    m.io[0] = vV;
    m.io[1] = iA;
    m.io[2] = tS;
    m.record();
  }

  /**
   * Frequency-domain hook: small-signal admittance around 0 V at omega [rad/s],
   * Y = 1 / (Rs + 1 / (j'(0) + j omega C)), real part into out[0], imaginary into out[1] [S].
   */
  admittance(omegaRadS: number, out: Float64Array): void {
    this.admittanceAt(0, omegaRadS, out);
  }

  /**
   * Frequency-domain hook at s = sigma + j omega: Y(s) = 1 / (Rs + 1 / (j'(0) + s C)), the analytic
   * continuation of `admittance` [S].
   */
  admittanceAt(sigma: number, omegaRadS: number, out: Float64Array): void {
    const s = this.#s;
    s[JX] = 0;
    this.junction(s, JX);
    const g = s[DJ] + sigma * this.#p[2];
    const b = omegaRadS * this.#p[2];
    const den = g * g + b * b;
    if (den === 0) {
      out[0] = 0;
      out[1] = 0;
      return;
    }
    // Z = Rs + (g - j b)/den; Y = conj(Z)/|Z|^2.
    const zr = this.#p[0] + g / den;
    const zi = -b / den;
    const m = zr * zr + zi * zi;
    out[0] = zr / m;
    out[1] = -zi / m;
  }

  /** Energy in the junction capacitance now [J]: C x^2 / 2. */
  storedEnergyJ(): number {
    const x = this.#s[XACC];
    return 0.5 * this.#p[2] * x * x;
  }

  /** Finish: the meter's figures and ratings (warns for each exceeded rating). */
  finish(error?: unknown): StructuredOutput {
    return finishDevice(this.#meter, this.#ratings, this.#ctx, this.#name, this.extraResults(), error);
  }
}
