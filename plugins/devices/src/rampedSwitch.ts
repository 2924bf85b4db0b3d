/**
 * `ramped-switch`: the timed switch with resistance ramps, e.g. a breaker closing on a line
 * (optionally through a pre-insertion resistor). A linear load whose conductance follows a
 * schedule in time (the engine re-factors the junction at each step where it changes):
 *   t < closeAt: offResistance;
 *   closeAt .. closeAt + rampTime: geometric (log-linear) ramp to the insertion resistance
 *     (preInsertionResistance if given, else onResistance);
 *   with pre-insertion: held until closeAt + insertionTime, then a second ramp to onResistance;
 *   openAt (optional) .. openAt + rampTime: geometric ramp back to offResistance.
 * A geometric ramp spreads the change over decades of resistance evenly (a contact gap's
 * resistance falls by orders of magnitude as it closes: common practice, a modelling choice).
 * Its accept records energy, peak current and i^2 t (e.g. the duty of the pre-insertion resistor).
 */
import { badInput, defineLoad, type SetupContext, type StructuredOutput } from '@skein/core';
import { DeviceMeter, finishDevice, RATING_PARAMS, type Ratings } from './meter.ts';

const T_CLOSE = 0;
const RAMP = 1;
const T_INS = 2; // end of insertion (closeAt + insertionTime), Infinity without pre-insertion
const T_OPEN = 3;
const LN_OFF = 4;
const LN_INS = 5;
const LN_ON = 6;

/**
 * Per-run object of the ramped switch (schedule in a typed array: doubles in closures box).
 * @example sw.conductanceAt(closeAt + rampTime / 2) // 1 / sqrt(offResistance * onResistance) without pre-insertion
 */
export class RampedSwitchDevice {
  readonly kind = 'linear' as const;
  readonly conductanceS: number;
  readonly #s = new Float64Array(7);
  readonly #meter: DeviceMeter;
  readonly #ratings: Ratings;
  readonly #ctx: SetupContext;

  constructor(o: { closeAt: number; rampS: number; insertionEnd: number; openAt: number; offOhm: number; insOhm: number; onOhm: number }, ratings: Ratings, ctx: SetupContext) {
    const s = this.#s;
    s[T_CLOSE] = o.closeAt;
    s[RAMP] = o.rampS;
    s[T_INS] = o.insertionEnd;
    s[T_OPEN] = o.openAt;
    s[LN_OFF] = Math.log(o.offOhm);
    s[LN_INS] = Math.log(o.insOhm);
    s[LN_ON] = Math.log(o.onOhm);
    this.#meter = new DeviceMeter(ratings.currentThreshold);
    this.#ratings = ratings;
    this.#ctx = ctx;
    this.conductanceS = this.conductanceAt(0);
  }

  /** Step hook: conductance at t [S] by the schedule. */
  conductanceAt(tS: number): number {
    const s = this.#s;
    const ramp = s[RAMP];
    // ln R while closing.
    let lnR: number;
    if (tS < s[T_CLOSE]) lnR = s[LN_OFF];
    else {
      const x1 = ramp > 0 ? (tS - s[T_CLOSE]) / ramp : 1;
      lnR = x1 >= 1 ? s[LN_INS] : s[LN_OFF] + x1 * (s[LN_INS] - s[LN_OFF]);
      if (tS >= s[T_INS]) {
        const x2 = ramp > 0 ? (tS - s[T_INS]) / ramp : 1;
        lnR = x2 >= 1 ? s[LN_ON] : s[LN_INS] + x2 * (s[LN_ON] - s[LN_INS]);
      }
    }
    if (tS >= s[T_OPEN]) {
      const x3 = ramp > 0 ? (tS - s[T_OPEN]) / ramp : 1;
      lnR = x3 >= 1 ? s[LN_OFF] : lnR + x3 * (s[LN_OFF] - lnR);
    }
    return Math.exp(-lnR);
  }

  /** Frequency-domain hook: admittance at t = 0 (the schedule acts in time only) [S]. */
  admittance(_omegaRadS: number, out: Float64Array): void {
    out[0] = this.conductanceS;
    out[1] = 0;
  }

  /** Frequency-domain hook at s = sigma + j omega: the same real constant (analytic in s) [S]. */
  admittanceAt(_sigma: number, omegaRadS: number, out: Float64Array): void {
    this.admittance(omegaRadS, out);
  }

  /** Step hook after the solve: the meter. */
  accept(vV: number, iA: number, tS: number): void {
    const m = this.#meter;
    m.io[0] = vV;
    m.io[1] = iA;
    m.io[2] = tS;
    m.record();
  }

  /** Finish: energy, peak current, i^2 t; warns when a rating is exceeded. */
  finish(error?: unknown): StructuredOutput {
    return finishDevice(this.#meter, this.#ratings, this.#ctx, 'ramped-switch', {}, error);
  }
}

/**
 * The ramped-switch load plugin. Params: closeAt [s, 0], rampTime [s, 0], onResistance [ohm, 1 mohm],
 * offResistance [ohm, 1 Gohm], preInsertionResistance [ohm, optional], insertionTime [s, optional,
 * needed with pre-insertion, >= rampTime], openAt [s, optional, after the closing], ratings.
 * @throws InputError (E_PARAM) for an openAt before the closing ends, an insertion time without a
 *   pre-insertion resistance (or the reverse), or offResistance not above onResistance.
 * @example create({ closeAt: 1e-3, rampTime: 1e-6, onResistance: 1e-3, offResistance: 1e9 }).conductanceAt(1e-3 + 0.5e-6) // 1/sqrt(1e6) = 1e-3 S
 */
export const rampedSwitchLoad = defineLoad({
  type: 'ramped-switch',
  summary: 'A timed switch whose resistance ramps (breaker closing on a line, optional pre-insertion resistor)',
  params: {
    closeAt: { unit: 's', default: 0, min: 0, summary: 'time the contacts start to close' },
    rampTime: { unit: 's', default: 0, min: 0, summary: 'duration of each geometric resistance ramp' },
    onResistance: { unit: 'ohm', default: 1e-3, min: 0, exclusiveMin: true, summary: 'resistance when fully closed' },
    offResistance: { unit: 'ohm', default: 1e9, min: 0, exclusiveMin: true, summary: 'resistance when open' },
    preInsertionResistance: { unit: 'ohm', optional: true, min: 0, exclusiveMin: true, summary: 'closing resistor inserted first, bypassed after insertionTime' },
    insertionTime: { unit: 's', optional: true, min: 0, summary: 'time from closeAt to the start of the bypass ramp (with preInsertionResistance)' },
    openAt: { unit: 's', optional: true, min: 0, summary: 'time the contacts start to open again; leave out to stay closed' },
    ...RATING_PARAMS,
  },
  create(p, ctx) {
    if (!(p.offResistance > p.onResistance)) throw badInput(['offResistance'], `must be greater than onResistance (${p.onResistance} ohm)`, p.offResistance, 'E_PARAM');
    const pre = p.preInsertionResistance;
    if ((pre === undefined) !== (p.insertionTime === undefined)) {
      throw badInput([pre === undefined ? 'insertionTime' : 'preInsertionResistance'], 'preInsertionResistance and insertionTime go together: give both or neither', pre ?? p.insertionTime, 'E_PARAM');
    }
    if (p.insertionTime !== undefined && !(p.insertionTime >= p.rampTime)) {
      throw badInput(['insertionTime'], `must be at least rampTime (${p.rampTime} s): the bypass starts after the first ramp`, p.insertionTime, 'E_PARAM');
    }
    const closedAt = p.closeAt + (p.insertionTime ?? 0) + p.rampTime;
    if (p.openAt !== undefined && !(p.openAt >= closedAt)) {
      throw badInput(['openAt'], `must be at or after the end of the closing (${closedAt} s)`, p.openAt, 'E_PARAM');
    }
    return new RampedSwitchDevice({
      closeAt: p.closeAt, rampS: p.rampTime, insertionEnd: pre === undefined ? Infinity : p.closeAt + (p.insertionTime as number),
      openAt: p.openAt ?? Infinity, offOhm: p.offResistance, insOhm: pre ?? p.onResistance, onOhm: p.onResistance,
    }, p, ctx);
  },
});
