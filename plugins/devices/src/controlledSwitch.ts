/**
 * `controlled-switch`: a switch controlled by its own branch voltage or current (a two-terminal
 * load sees only its own v and i). The state changes only in accept, after a step converged:
 *  - action 'close': closes when the control magnitude rises above `threshold`, opens again when it
 *    falls below threshold - hysteresis;
 *  - action 'open': opens above threshold (an overcurrent trip), closes again below threshold - hysteresis.
 * With `latch` the first change is final. After a change, the resistance moves from its value then
 * to the new end value geometrically (log-linear) over `transitionTime`, as a function of t, so
 * that evaluate stays smooth in v: i = g(t) v.
 */
import { badInput, defineLoad, type SetupContext, type StructuredOutput } from '@skein/core';
import { DeviceMeter, finishDevice, RATING_PARAMS, type Ratings } from './meter.ts';

const G_ON = 0;
const G_OFF = 1;
const THR = 2;
const HYST = 3;
const BY_CURRENT = 4; // 1: control is |i|, 0: |v|
const ACTION_CLOSE = 5; // 1: closes above threshold, 0: opens above threshold
const LATCH = 6;
const T_TRANS = 7;
const CLOSED = 8;
const T_SWITCH = 9; // time of the last change (-Infinity before any)
const G_FROM = 10; // conductance when the last change began
const SWITCHES = 11;
const FIRST_T = 12;
const T_IN = 13; // time for #g
const G_OUT = 14; // conductance from #g

/**
 * Per-run object of the controlled switch.
 * @example s.accept(120, 0, t) // control voltage, threshold 100 V, action close: s.closed becomes true
 */
export class ControlledSwitchDevice {
  readonly kind = 'nonlinear' as const;
  readonly #s = new Float64Array(15);
  readonly #meter: DeviceMeter;
  readonly #ratings: Ratings;
  readonly #ctx: SetupContext;

  constructor(o: { onOhm: number; offOhm: number; threshold: number; hysteresis: number; byCurrent: boolean; actionClose: boolean; latch: boolean; transitionS: number; initiallyClosed: boolean }, ratings: Ratings, ctx: SetupContext) {
    const s = this.#s;
    s[G_ON] = 1 / o.onOhm;
    s[G_OFF] = 1 / o.offOhm;
    s[THR] = o.threshold;
    s[HYST] = o.hysteresis;
    s[BY_CURRENT] = o.byCurrent ? 1 : 0;
    s[ACTION_CLOSE] = o.actionClose ? 1 : 0;
    s[LATCH] = o.latch ? 1 : 0;
    s[T_TRANS] = o.transitionS;
    s[CLOSED] = o.initiallyClosed ? 1 : 0;
    s[T_SWITCH] = -Infinity;
    s[G_FROM] = o.initiallyClosed ? s[G_ON] : s[G_OFF];
    s[FIRST_T] = NaN;
    this.#meter = new DeviceMeter(ratings.currentThreshold);
    this.#ratings = ratings;
    this.#ctx = ctx;
  }

  /** True when the switch is (moving to) closed. */
  get closed(): boolean {
    return this.#s[CLOSED] === 1;
  }

  /** Conductance at t = s[T_IN] into s[G_OUT] [S]: the end value, or on the geometric ramp after a change. */
  #g(): void {
    const s = this.#s;
    const t = s[T_IN];
    const gEnd = s[CLOSED] === 1 ? s[G_ON] : s[G_OFF];
    const tt = s[T_TRANS];
    const x = tt > 0 ? (t - s[T_SWITCH]) / tt : 1;
    s[G_OUT] = x >= 1 ? gEnd : x <= 0 ? s[G_FROM] : s[G_FROM] * Math.pow(gEnd / s[G_FROM], x);
  }

  /** Step hook: i = g(t) v. */
  evaluate(vV: number, tS: number, out: Float64Array): void {
    const s = this.#s;
    s[T_IN] = tS;
    this.#g();
    const g = s[G_OUT];
    out[0] = g * vV;
    out[1] = g;
  }

  /** Frequency-domain hook: admittance in the initial state, 1/R [S] (the controls act in time only). */
  admittance(_omegaRadS: number, out: Float64Array): void {
    const s = this.#s;
    out[0] = s[G_FROM];
    out[1] = 0;
  }

  /** Frequency-domain hook at s = sigma + j omega: the same real constant (analytic in s) [S]. */
  admittanceAt(_sigma: number, omegaRadS: number, out: Float64Array): void {
    this.admittance(omegaRadS, out);
  }

  /** Step hook after convergence: the control logic and the meter. */
  accept(vV: number, iA: number, tS: number): void {
    const s = this.#s;
    const m = this.#meter;
    m.io[0] = vV;
    m.io[1] = iA;
    m.io[2] = tS;
    m.record();
    if (s[LATCH] === 1 && s[SWITCHES] > 0) return;
    const c = s[BY_CURRENT] === 1 ? Math.abs(iA) : Math.abs(vV);
    const above = c > s[THR];
    const below = c < s[THR] - s[HYST];
    // Target state: 'close' action closes above, opens below; 'open' action the reverse.
    let target = s[CLOSED];
    if (above) target = s[ACTION_CLOSE];
    else if (below) target = 1 - s[ACTION_CLOSE];
    if (target !== s[CLOSED]) {
      s[T_IN] = tS;
      this.#g();
      s[G_FROM] = s[G_OUT];
      s[CLOSED] = target;
      s[T_SWITCH] = tS;
      s[SWITCHES] += 1;
      if (s[FIRST_T] !== s[FIRST_T]) s[FIRST_T] = tS;
    }
  }

  /** Finish: switching count and first switching time, energy; warns when a rating is exceeded. */
  finish(error?: unknown): StructuredOutput {
    const s = this.#s;
    return finishDevice(this.#meter, this.#ratings, this.#ctx, 'controlled-switch', {
      switchings: s[SWITCHES],
      firstSwitchingTimeS: s[FIRST_T] === s[FIRST_T] ? s[FIRST_T] : null,
      closedAtEnd: s[CLOSED] === 1,
    }, error);
  }
}

/**
 * The controlled-switch load plugin. Params: control ('voltage' (default) or 'current'), action
 * ('close' (default) or 'open': what happens above the threshold), threshold (drive of the control:
 * volts or amperes, a plain number, > 0), hysteresis (same unit, default 0, below threshold),
 * latch (default false), initiallyClosed (default false), onResistance [ohm, 1 mohm],
 * offResistance [ohm, 1 Gohm], transitionTime [s, 0], ratings.
 * @throws InputError (E_PARAM) when hysteresis is not below threshold or offResistance not above onResistance.
 * @example create({ control: 'current', action: 'open', threshold: 100, latch: true, ... }) // a latching 100 A trip
 */
export const controlledSwitchLoad = defineLoad({
  type: 'controlled-switch',
  summary: 'A switch driven by its own voltage or current: threshold, hysteresis, latch, resistance ramp',
  params: {
    control: { kind: 'enum', values: ['voltage', 'current'], default: 'voltage', summary: 'control quantity: the switch branch voltage |v| or current |i|' },
    action: { kind: 'enum', values: ['close', 'open'], default: 'close', summary: 'what the switch does when the control rises above the threshold' },
    threshold: { unit: '1', default: 100, min: 0, exclusiveMin: true, summary: 'threshold in the control unit: volts for voltage control, amperes for current control (a plain number)' },
    hysteresis: { unit: '1', default: 0, min: 0, summary: 'the reverse change happens below threshold - hysteresis (control unit)' },
    latch: { kind: 'boolean', default: false, summary: 'true: the first change is final' },
    initiallyClosed: { kind: 'boolean', default: false, summary: 'state at t = 0' },
    onResistance: { unit: 'ohm', default: 1e-3, min: 0, exclusiveMin: true, summary: 'resistance when closed' },
    offResistance: { unit: 'ohm', default: 1e9, min: 0, exclusiveMin: true, summary: 'resistance when open' },
    transitionTime: { unit: 's', default: 0, min: 0, summary: 'time of the geometric resistance ramp after a change (0: at the next step)' },
    ...RATING_PARAMS,
  },
  create(p, ctx) {
    if (!(p.hysteresis < p.threshold)) throw badInput(['hysteresis'], `must be below threshold (${p.threshold})`, p.hysteresis, 'E_PARAM');
    if (!(p.offResistance > p.onResistance)) throw badInput(['offResistance'], `must be greater than onResistance (${p.onResistance} ohm)`, p.offResistance, 'E_PARAM');
    return new ControlledSwitchDevice({
      onOhm: p.onResistance, offOhm: p.offResistance, threshold: p.threshold, hysteresis: p.hysteresis, byCurrent: p.control === 'current',
      actionClose: p.action === 'close', latch: p.latch, transitionS: p.transitionTime, initiallyClosed: p.initiallyClosed,
    }, p, ctx);
  },
});
