/**
 * `filament`: an incandescent filament. Resistance rises with temperature,
 *   R(T) = Rcold (T / Tamb)^beta, beta = ln(Rhot/Rcold) / ln(Thot/Tamb)
 * (tungsten follows R ~ T^1.2 roughly: common practice), and the temperature follows the heat balance
 *   Cth dT/dt = v i - k (T^4 - Tamb^4)
 * (radiation, Stefan-Boltzmann law, emissivity and area lumped into k). k is set so that the steady
 * state at `ratedVoltage` is exactly Thot, where R = Rhot:
 *   k = ratedVoltage^2 / (Rhot (Thot^4 - Tamb^4)).
 * Within a step the filament is a resistor R(T_{n-1}) (evaluate is linear in v); accept advances T
 * by the trapezoidal rule, solved by Newton's method (A-stable, second order).
 * A cold filament switched on at constant voltage draws Rhot/Rcold times its hot current at first.
 */
import { badInput, defineLoad, type SetupContext, type StructuredOutput } from '@skein/core';
import { DeviceMeter, finishDevice, RATING_PARAMS, type Ratings } from './meter.ts';

const T = 0;
const T_PREV = 1; // time of the last accept
const P_PREV = 2;
const R0 = 3;
const T_AMB = 4;
const BETA = 5;
const K = 6;
const C_TH = 7;
const T_PEAK = 8;

/**
 * Per-run object of the filament.
 * @example f.evaluate(120, 0, out) // cold: out[0] = 120 / coldResistance
 */
export class FilamentDevice {
  readonly kind = 'nonlinear' as const;
  readonly #s = new Float64Array(9);
  readonly #meter: DeviceMeter;
  readonly #ratings: Ratings;
  readonly #ctx: SetupContext;

  constructor(o: { coldOhm: number; hotOhm: number; ratedV: number; heatCapacityJK: number; ambientK: number; hotK: number }, ratings: Ratings, ctx: SetupContext) {
    const s = this.#s;
    s[T] = o.ambientK;
    s[T_PEAK] = o.ambientK;
    s[R0] = o.coldOhm;
    s[T_AMB] = o.ambientK;
    s[BETA] = Math.log(o.hotOhm / o.coldOhm) / Math.log(o.hotK / o.ambientK);
    s[K] = (o.ratedV * o.ratedV) / (o.hotOhm * (o.hotK ** 4 - o.ambientK ** 4));
    s[C_TH] = o.heatCapacityJK;
    this.#meter = new DeviceMeter(ratings.currentThreshold);
    this.#ratings = ratings;
    this.#ctx = ctx;
  }

  /** Filament temperature now [K]. */
  get temperatureK(): number {
    return this.#s[T];
  }

  /** Resistance now [ohm]. */
  get resistanceOhm(): number {
    const s = this.#s;
    return s[R0] * Math.pow(s[T] / s[T_AMB], s[BETA]);
  }

  /** Step hook: i = v / R(T) with T from the last accepted step. */
  evaluate(vV: number, _tS: number, out: Float64Array): void {
    const s = this.#s;
    const g = 1 / (s[R0] * Math.pow(s[T] / s[T_AMB], s[BETA]));
    out[0] = g * vV;
    out[1] = g;
  }

  /** Frequency-domain hook: admittance of the cold filament, 1/Rcold [S]. */
  admittance(_omegaRadS: number, out: Float64Array): void {
    out[0] = 1 / this.#s[R0];
    out[1] = 0;
  }

  /** Frequency-domain hook at s = sigma + j omega: the same real constant (analytic in s) [S]. */
  admittanceAt(_sigma: number, omegaRadS: number, out: Float64Array): void {
    this.admittance(omegaRadS, out);
  }

  /** Step hook after convergence: advances the temperature by the heat balance, and the meter. */
  accept(vV: number, iA: number, tS: number): void {
    const s = this.#s;
    const m = this.#meter;
    m.io[0] = vV;
    m.io[1] = iA;
    m.io[2] = tS;
    m.record();
    const p = vV * iA;
    const dt = tS - s[T_PREV];
    if (dt > 0) {
      const tp = s[T];
      const k = s[K];
      const ta4 = s[T_AMB] ** 4;
      const c = s[C_TH] / dt;
      const pm = 0.5 * (p + s[P_PREV]);
      const tp4 = tp * tp * tp * tp;
      // G(T) = c (T - Tp) - pm + k ((T^4 + Tp^4)/2 - Ta^4) = 0, increasing in T > 0.
      let x = tp;
      for (let it = 0; it < 50; it++) {
        const x3 = x * x * x;
        const gx = c * (x - tp) - pm + k * (0.5 * (x3 * x + tp4) - ta4);
        const dx = gx / (c + 2 * k * x3);
        x -= dx;
        if (x < 1) x = 1;
        if (Math.abs(dx) <= 1e-13 * x) break;
      }
      s[T] = x;
      if (x > s[T_PEAK]) s[T_PEAK] = x;
    }
    s[T_PREV] = tS;
    s[P_PREV] = p;
  }

  /** Finish: peak (inrush) current, final and peak temperature, final resistance, energy; warns when a rating is exceeded. */
  finish(error?: unknown): StructuredOutput {
    const s = this.#s;
    return finishDevice(this.#meter, this.#ratings, this.#ctx, 'filament', {
      temperatureK: s[T],
      peakTemperatureK: s[T_PEAK],
      resistanceOhm: this.resistanceOhm,
    }, error);
  }
}

/**
 * The filament load plugin. Params: coldResistance [ohm, at ambient], hotResistance [ohm, at
 * ratedVoltage, > cold], ratedVoltage [V], heatCapacity [J/K], ambientTemperature [K, 300],
 * hotTemperature [K, 2700], ratings.
 * @throws InputError (E_PARAM) when hotResistance is not above coldResistance or hotTemperature not above ambient.
 * @example at constant ratedVoltage the current falls from V/Rcold to V/Rhot.
 */
export const filamentLoad = defineLoad({
  type: 'filament',
  summary: 'An incandescent filament: resistance rising with temperature, heat balance with T^4 radiation (inrush current)',
  params: {
    coldResistance: { unit: 'ohm', default: 20, min: 0, exclusiveMin: true, summary: 'resistance at the ambient temperature' },
    hotResistance: { unit: 'ohm', default: 240, min: 0, exclusiveMin: true, summary: 'resistance in steady state at the rated voltage' },
    ratedVoltage: { unit: 'V', default: 120, min: 0, exclusiveMin: true, summary: 'voltage (DC or RMS) at which the filament runs at hotTemperature' },
    heatCapacity: { unit: 'J/K', default: 3e-3, min: 0, exclusiveMin: true, summary: 'heat capacity of the filament' },
    ambientTemperature: { unit: 'K', default: 300, min: 0, exclusiveMin: true, summary: 'ambient (and initial) temperature' },
    hotTemperature: { unit: 'K', default: 2700, min: 0, exclusiveMin: true, summary: 'operating temperature at the rated voltage' },
    ...RATING_PARAMS,
  },
  create(p, ctx) {
    if (!(p.hotResistance > p.coldResistance)) throw badInput(['hotResistance'], `must be greater than coldResistance (${p.coldResistance} ohm)`, p.hotResistance, 'E_PARAM');
    if (!(p.hotTemperature > p.ambientTemperature)) throw badInput(['hotTemperature'], `must be above ambientTemperature (${p.ambientTemperature} K)`, p.hotTemperature, 'E_PARAM');
    return new FilamentDevice({
      coldOhm: p.coldResistance, hotOhm: p.hotResistance, ratedV: p.ratedVoltage, heatCapacityJK: p.heatCapacity,
      ambientK: p.ambientTemperature, hotK: p.hotTemperature,
    }, p, ctx);
  },
});
