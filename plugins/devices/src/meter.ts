/**
 * What every device accounts for over a run, from the (v, i, t) the engine accepts at each step:
 * energy absorbed int v i dt and i^2 t = int i^2 dt, by the engine ledger's step-centred product
 * dt ((v_n + v_{n-1})/2) ((i_n + i_{n-1})/2) (second order; the device's energy then equals its
 * entry in the ledger, and a trapezoidal capacitor's energy is exactly C v^2/2), the device being
 * at rest (v = i = 0) at t = 0; peak current and voltage; the time the current magnitude spent
 * above a threshold (linear interpolation between steps). State in a typed array: recording
 * allocates nothing.
 */
import type { SetupContext, StructuredOutput } from '@skein/core';

/** The rating and threshold parameters every device takes (all optional). @example params: { myParam: {...}, ...RATING_PARAMS } */
export const RATING_PARAMS = {
  ratedEnergy: { unit: 'J', optional: true, min: 0, exclusiveMin: true, summary: 'energy rating; absorbing more gives a "rating exceeded" warning' },
  ratedCurrent: { unit: 'A', optional: true, min: 0, exclusiveMin: true, summary: 'peak current rating; a larger peak gives a "rating exceeded" warning' },
  ratedI2t: { unit: 'A2s', optional: true, min: 0, exclusiveMin: true, summary: 'i^2 t rating; a larger action integral gives a "rating exceeded" warning' },
  currentThreshold: { unit: 'A', optional: true, min: 0, exclusiveMin: true, summary: 'current magnitude whose time-above is reported' },
} as const;

/** The rating values as a factory receives them (J, A, A2s, A). @example { ratedEnergy: 20, currentThreshold: 100 } */
export interface Ratings {
  ratedEnergy?: number;
  ratedCurrent?: number;
  ratedI2t?: number;
  currentThreshold?: number;
}

const T_PREV = 0;
const V_PREV = 1;
const I_PREV = 2;
const ENERGY = 3;
const I2T = 4;
const PEAK_I = 5;
const PEAK_V = 6;
const ABOVE = 7;
const THRESHOLD = 8;
const PEAK_I_T = 9;

/**
 * Accumulates a device's energy, i^2 t, peaks and time above threshold.
 * The step's values are passed through `io` ([v V, i A, t s]), not as arguments: a double passed
 * to or returned from a call that is not inlined is boxed (a heap allocation per step).
 * @example const m = new DeviceMeter(); m.io[0] = 1; m.io[1] = 2; m.io[2] = 1; m.record(); m.energyJ() // 0.5 (1 s of mean v 0.5 V times mean i 1 A, from rest at t = 0)
 */
export class DeviceMeter {
  readonly #s = new Float64Array(10);
  /** Inputs of record: [v V, i A, t s]. */
  readonly io = new Float64Array(3);

  /** @param thresholdA current magnitude for timeAboveThreshold [A]; Infinity when not asked for. */
  constructor(thresholdA = Infinity) {
    this.#s[THRESHOLD] = thresholdA;
  }

  /** Step hook: one accepted step at t = io[2] [s] with branch voltage v = io[0] [V] and current i = io[1] [A]. */
  record(): void {
    const s = this.#s;
    const v = this.io[0];
    const i = this.io[1];
    const t = this.io[2];
    const dt = t - s[T_PREV];
    if (dt > 0) {
      const vp = s[V_PREV];
      const ip = s[I_PREV];
      const vm = 0.5 * (vp + v);
      const im = 0.5 * (ip + i);
      s[ENERGY] += vm * im * dt;
      s[I2T] += im * im * dt;
      const th = s[THRESHOLD];
      const a = Math.abs(ip);
      const b = Math.abs(i);
      if (a > th && b > th) s[ABOVE] += dt;
      else if (a > th) s[ABOVE] += (dt * (a - th)) / (a - b);
      else if (b > th) s[ABOVE] += (dt * (b - th)) / (b - a);
    }
    if (Math.abs(i) > s[PEAK_I]) {
      s[PEAK_I] = Math.abs(i);
      s[PEAK_I_T] = t;
    }
    if (Math.abs(v) > s[PEAK_V]) s[PEAK_V] = Math.abs(v);
    s[T_PREV] = t;
    s[V_PREV] = v;
    s[I_PREV] = i;
  }

  /** Energy absorbed so far [J]. */
  energyJ(): number {
    return this.#s[ENERGY];
  }

  /** The accumulated figures as plain data (units in the key names). */
  results(): StructuredOutput {
    const s = this.#s;
    return {
      energyJ: s[ENERGY],
      peakCurrentA: s[PEAK_I],
      peakCurrentTimeS: s[PEAK_I_T],
      peakVoltageV: s[PEAK_V],
      i2tA2s: s[I2T],
      currentThresholdA: Number.isFinite(s[THRESHOLD]) ? s[THRESHOLD] : null,
      timeAboveThresholdS: Number.isFinite(s[THRESHOLD]) ? s[ABOVE] : null,
    };
  }

  /**
   * Finish: warns through ctx for each rating exceeded (text starts "rating exceeded:") and returns
   * the list of exceeded rating names.
   */
  checkRatings(r: Ratings, ctx: SetupContext, device: string): string[] {
    const s = this.#s;
    const out: string[] = [];
    const check = (name: string, got: number, rating: number | undefined, unit: string): void => {
      if (rating !== undefined && got > rating) {
        out.push(name);
        ctx.warn(`rating exceeded: ${ctx.id} (${device}) ${name} ${got.toPrecision(4)} ${unit} > rating ${rating.toPrecision(4)} ${unit}`);
      }
    };
    check('energy', s[ENERGY], r.ratedEnergy, 'J');
    check('peak current', s[PEAK_I], r.ratedCurrent, 'A');
    check('i2t', s[I2T], r.ratedI2t, 'A2s');
    return out;
  }
}

/**
 * The finish hook's results of a device: the meter's figures, the ratings, the exceeded ones and
 * device-specific extras; warns for each exceeded rating. Called once per run, also after a failure.
 */
export function finishDevice(meter: DeviceMeter, ratings: Ratings, ctx: SetupContext, device: string, extra: StructuredOutput, error?: unknown): StructuredOutput {
  const exceeded = meter.checkRatings(ratings, ctx, device);
  return {
    device,
    ...meter.results(),
    ratedEnergyJ: ratings.ratedEnergy ?? null,
    ratedCurrentA: ratings.ratedCurrent ?? null,
    ratedI2tA2s: ratings.ratedI2t ?? null,
    ratingsExceeded: exceeded,
    ...extra,
    completed: error === undefined,
  };
}
