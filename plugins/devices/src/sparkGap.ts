/**
 * `spark-gap`: a spark gap or gas discharge tube, a two-state device whose state changes only in
 * accept, after a step converged (never inside evaluate):
 *  - insulating: i = v / Roff;
 *  - arc: a smooth dead zone of half-width Va (the arc voltage) with slope 1/Rarc outside,
 *    i = (sp(v - Va) - sp(-v - Va)) / Rarc + v / Roff, sp(x) = w ln(1 + e^{x/w}) (softplus of
 *    corner width w): monotone, C-infinity, |v| -> Va + Rarc |i| for |i| well above w / Rarc.
 * Breakdown: |v| at or above the static (DC) sparkover voltage for at least `timeLag`: the
 * constant time-lag (volt-time) model, under which the impulse sparkover voltage of a ramp rises
 * with its steepness, V_bd = Vdc + S timeLag for dv/dt = S (common practice; e.g. Kuffel,
 * Zaengl, Kuffel, High Voltage Engineering Fundamentals, 2nd ed., ch. on breakdown time lags, from memory).
 * Extinction: in the arc state, |i| below the holding current at an accepted step.
 * The glow stage of a gas tube is not modelled (it goes straight from insulating to arc).
 */
import { defineLoad, type SetupContext, type StructuredOutput } from '@skein/core';
import { DeviceMeter, finishDevice, RATING_PARAMS, type Ratings } from './meter.ts';

/** Events kept for the results (breakdowns and extinctions). */
const MAX_EVENTS = 64;

// Parameter and state slots.
const VDC = 0;
const LAG = 1;
const VARC = 2;
const GARC = 3;
const GOFF = 4;
const W = 5;
const IHOLD = 6;
const STATE = 7; // 0 insulating, 1 arc
const T_CROSS = 8; // time |v| first reached Vdc in the current excursion (NaN when below)
const N_BREAK = 9;
const N_EVENTS = 10;
const T_ON = 11; // time of the last breakdown
const CONDUCTING_S = 12;
const T_LAST = 13;

/**
 * Per-run object of the spark gap.
 * @example g.accept(100, 1e-7, t) // with sparkoverVoltage 90 V and no time lag: g.conducting becomes true
 */
export class SparkGapDevice {
  readonly kind = 'nonlinear' as const;
  readonly #s = new Float64Array(14);
  /** Events: [kind (1 breakdown, 0 extinction), t, v] per event. */
  readonly #ev = new Float64Array(3 * MAX_EVENTS);
  readonly #meter: DeviceMeter;
  readonly #ratings: Ratings;
  readonly #ctx: SetupContext;

  constructor(vdc: number, lagS: number, arcV: number, arcOhm: number, offOhm: number, cornerV: number, holdA: number, ratings: Ratings, ctx: SetupContext) {
    const s = this.#s;
    s[VDC] = vdc;
    s[LAG] = lagS;
    s[VARC] = arcV;
    s[GARC] = 1 / arcOhm;
    s[GOFF] = 1 / offOhm;
    s[W] = cornerV;
    s[IHOLD] = holdA;
    s[T_CROSS] = NaN;
    this.#meter = new DeviceMeter(ratings.currentThreshold);
    this.#ratings = ratings;
    this.#ctx = ctx;
  }

  /** True while the arc burns (read-only view of the state, for tests and probes). */
  get conducting(): boolean {
    return this.#s[STATE] === 1;
  }

  /** Step hook: i [A] and di/dv [S] in the present state. */
  evaluate(vV: number, _tS: number, out: Float64Array): void {
    const s = this.#s;
    const goff = s[GOFF];
    if (s[STATE] === 0) {
      out[0] = goff * vV;
      out[1] = goff;
      return;
    }
    const w = s[W];
    const za = (vV - s[VARC]) / w;
    const zb = (-vV - s[VARC]) / w;
    // Stable softplus (w (max(z, 0) + ln(1 + e^-|z|))) and logistic of both corners.
    const ea = Math.exp(-Math.abs(za));
    const eb = Math.exp(-Math.abs(zb));
    const spa = w * ((za > 0 ? za : 0) + Math.log1p(ea));
    const spb = w * ((zb > 0 ? zb : 0) + Math.log1p(eb));
    const sa = za >= 0 ? 1 / (1 + ea) : ea / (1 + ea);
    const sb = zb >= 0 ? 1 / (1 + eb) : eb / (1 + eb);
    out[0] = (spa - spb) * s[GARC] + goff * vV;
    out[1] = (sa + sb) * s[GARC] + goff;
  }

  /** Frequency-domain hook: small-signal admittance of the insulating gap, 1/Roff [S]. */
  admittance(_omegaRadS: number, out: Float64Array): void {
    out[0] = this.#s[GOFF];
    out[1] = 0;
  }

  /** Frequency-domain hook at s = sigma + j omega: the same real constant (analytic in s) [S]. */
  admittanceAt(_sigma: number, omegaRadS: number, out: Float64Array): void {
    this.admittance(omegaRadS, out);
  }

  #event(kind: number, t: number, v: number): void {
    const s = this.#s;
    const k = s[N_EVENTS];
    if (k < MAX_EVENTS) {
      this.#ev[3 * k] = kind;
      this.#ev[3 * k + 1] = t;
      this.#ev[3 * k + 2] = v;
      s[N_EVENTS] = k + 1;
    }
  }

  /** Step hook after convergence: the state machine (breakdown, extinction) and the meter. */
  accept(vV: number, iA: number, tS: number): void {
    const s = this.#s;
    const m = this.#meter;
    m.io[0] = vV;
    m.io[1] = iA;
    m.io[2] = tS;
    m.record();
    if (s[STATE] === 1) s[CONDUCTING_S] += tS - s[T_LAST];
    s[T_LAST] = tS;
    if (s[STATE] === 0) {
      if (Math.abs(vV) >= s[VDC]) {
        if (s[T_CROSS] !== s[T_CROSS]) s[T_CROSS] = tS;
        // A relative slack of 1e-9 of the lag absorbs rounding of t = n dt.
        if (tS - s[T_CROSS] >= s[LAG] * (1 - 1e-9)) {
          s[STATE] = 1;
          s[N_BREAK] += 1;
          s[T_ON] = tS;
          this.#event(1, tS, vV);
        }
      } else {
        s[T_CROSS] = NaN;
      }
    } else if (Math.abs(iA) < s[IHOLD]) {
      s[STATE] = 0;
      s[T_CROSS] = NaN;
      this.#event(0, tS, vV);
    }
  }

  /** Finish: events, conduction time, energy; warns when a rating is exceeded. */
  finish(error?: unknown): StructuredOutput {
    const s = this.#s;
    const events: Array<{ kind: string; timeS: number; voltageV: number }> = [];
    for (let k = 0; k < s[N_EVENTS]; k++) {
      events.push({ kind: this.#ev[3 * k] === 1 ? 'breakdown' : 'extinction', timeS: this.#ev[3 * k + 1], voltageV: this.#ev[3 * k + 2] });
    }
    const first = events.find((e) => e.kind === 'breakdown');
    return finishDevice(this.#meter, this.#ratings, this.#ctx, 'spark-gap', {
      breakdowns: s[N_BREAK],
      firstBreakdownTimeS: first ? first.timeS : null,
      firstBreakdownVoltageV: first ? first.voltageV : null,
      conductingTimeS: s[CONDUCTING_S],
      conductingAtEnd: s[STATE] === 1,
      events,
      eventsTruncated: s[N_BREAK] * 2 > MAX_EVENTS,
    }, error);
  }
}

/**
 * The spark-gap load plugin. Params: sparkoverVoltage [V, default 90] (static, DC), timeLag [s,
 * default 0], arcVoltage [V, default 15], arcResistance [ohm, default 0.1], holdingCurrent [A,
 * default 0.1], offResistance [ohm, default 1 Gohm], arcCorner [V, default 0.5], ratings.
 * @example a 90 V tube under 1 kV/us with timeLag 100 ns breaks down near 190 V.
 */
export const sparkGapLoad = defineLoad({
  type: 'spark-gap',
  summary: 'A spark gap or gas discharge tube: sparkover (with time lag), arc voltage, extinction below the holding current',
  params: {
    sparkoverVoltage: { unit: 'V', default: 90, min: 0, exclusiveMin: true, summary: 'static (DC) sparkover voltage' },
    timeLag: { unit: 's', default: 0, min: 0, summary: 'time |v| must stay at or above the sparkover voltage before breakdown (makes the impulse sparkover rise with dv/dt)' },
    arcVoltage: { unit: 'V', default: 15, min: 0, exclusiveMin: true, summary: 'arc (burning) voltage while conducting' },
    arcResistance: { unit: 'ohm', default: 0.1, min: 0, exclusiveMin: true, summary: 'resistance of the arc above the arc voltage' },
    holdingCurrent: { unit: 'A', default: 0.1, min: 0, exclusiveMin: true, summary: 'the arc goes out when |i| falls below this' },
    offResistance: { unit: 'ohm', default: 1e9, min: 0, exclusiveMin: true, summary: 'insulation resistance when not conducting' },
    arcCorner: { unit: 'V', default: 0.5, min: 0, exclusiveMin: true, summary: 'width of the smooth corner at the arc voltage (keeps di/dv continuous)' },
    ...RATING_PARAMS,
  },
  create(p, ctx) {
    return new SparkGapDevice(p.sparkoverVoltage, p.timeLag, p.arcVoltage, p.arcResistance, p.offResistance, p.arcCorner, p.holdingCurrent, p, ctx);
  },
});
