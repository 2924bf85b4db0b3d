/**
 * `tvs-clamp`: a transient-voltage-suppressor clamp. The breakdown junction conducts
 * j = It exp((x - Vbr)/Vs) - It exp(-Vbr/Vs) (zero at 0), Vbr the breakdown voltage at the test
 * current It, Vs the slope voltage of the knee; the dynamic resistance Rd (series) is chosen so
 * that the clamp voltage at the peak pulse current is Vc:
 *   Rd = (Vc - Vbr - Vs ln(Ipp/It)) / Ipp.
 * Bidirectional: the same law mirrored, j(x) = It (e^{(x - Vbr)/Vs} - e^{(-x - Vbr)/Vs}).
 * Unidirectional: the breakdown for v > 0 (cathode at plus) and a forward Shockley diode for v < 0.
 * The datasheet figures Vbr at It and Vc at Ipp are how the trade specifies these parts (common practice).
 */
import { badInput, defineLoad, type SetupContext } from '@skein/core';
import { thermalVoltage } from './diode.ts';
import { expArgMax, expLinear, JunctionDevice } from './junction.ts';
import { RATING_PARAMS, type Ratings } from './meter.ts';

/** Forward diode of a unidirectional TVS: Is [A] and n (common practice values for a power diode). */
const FORWARD_IS_A = 1e-12;
const FORWARD_N = 1.5;

/**
 * Per-run object of the TVS clamp.
 * @example (tvsClampLoad.create({ breakdownVoltage: 33, clampVoltage: 53, peakPulseCurrent: 28, ... }, ctx) as TvsDevice).evaluate(53, 0, out) // out[0] ~ 28 A
 */
export class TvsDevice extends JunctionDevice {
  // [It, Vbr, Vs, bidirectional (1/0), Is_f, nVt_f, vcrit_br, vcrit_f, scratch e1, de1, e2, de2, zMax_br, zMax_f]
  readonly #q: Float64Array;

  constructor(breakdownV: number, testA: number, slopeV: number, bidirectional: boolean, rdOhm: number, capF: number, ratings: Ratings, ctx: SetupContext) {
    super('tvs-clamp', rdOhm, capF, ratings, ctx);
    const nvt = FORWARD_N * thermalVoltage(300);
    this.#q = new Float64Array([
      testA, breakdownV, slopeV, bidirectional ? 1 : 0, FORWARD_IS_A, nvt,
      breakdownV + slopeV * Math.log(slopeV / (Math.SQRT2 * testA)), nvt * Math.log(nvt / (Math.SQRT2 * FORWARD_IS_A)), 0, 0, 0, 0,
      expArgMax(testA), expArgMax(FORWARD_IS_A),
    ]);
  }

  protected junction(buf: Float64Array, at: number): void {
    const q = this.#q;
    const x = buf[at];
    const it = q[0];
    const vbr = q[1];
    const vs = q[2];
    q[8] = (x - vbr) / vs;
    q[9] = q[12];
    expLinear(q, 8);
    const off = it * Math.exp(-vbr / vs);
    let j = it * q[8] - off;
    let dj = (it * q[9]) / vs;
    if (q[3] === 1) {
      q[10] = (-x - vbr) / vs;
      q[11] = q[12];
      expLinear(q, 10);
      j -= it * q[10] - off;
      dj += (it * q[11]) / vs;
    } else {
      q[10] = -x / q[5];
      q[11] = q[13];
      expLinear(q, 10);
      j -= q[4] * (q[10] - 1);
      dj += (q[4] * q[11]) / q[5];
    }
    buf[at + 1] = j;
    buf[at + 2] = dj;
  }

  protected limitJunction(xNew: number, xOld: number): number {
    // limitExponentialStep on the breakdown knee, then mirrored for the negative direction,
    // written out: three calls of the helper here kept V8 from inlining it (boxed doubles).
    const q = this.#q;
    const vs = q[2];
    if (xNew > q[6] && xNew > xOld && xNew - xOld > 2 * vs) {
      const base = xOld > q[1] ? xOld : q[1];
      return xNew <= base ? xNew : base + vs * Math.log(1 + (xNew - base) / vs);
    }
    const bi = q[3] === 1;
    const vt = bi ? vs : q[5];
    const crit = bi ? q[6] : q[7];
    const x0 = bi ? q[1] : 0;
    const yN = -xNew;
    const yO = -xOld;
    if (yN > crit && yN > yO && yN - yO > 2 * vt) {
      const base = yO > x0 ? yO : x0;
      return yN <= base ? xNew : -(base + vt * Math.log(1 + (yN - base) / vt));
    }
    return xNew;
  }
}

/**
 * The TVS clamp load plugin. Params: breakdownVoltage [V], testCurrent [A, default 1 mA],
 * clampVoltage [V, > breakdown], peakPulseCurrent [A], slopeVoltage [V, default 2 % of breakdown],
 * polarity ('bidirectional' (default) or 'unidirectional', cathode at plus), capacitance [F, 0], ratings.
 * @throws InputError (E_PARAM) when the clamp voltage leaves no room for a dynamic resistance.
 * @example create({ breakdownVoltage: 33, clampVoltage: 53, peakPulseCurrent: 28, ... }) // clamps at 53 V at 28 A
 */
export const tvsClampLoad = defineLoad({
  type: 'tvs-clamp',
  summary: 'A TVS clamp: exponential breakdown knee with dynamic resistance, uni- or bidirectional',
  params: {
    breakdownVoltage: { unit: 'V', default: 33, min: 0, exclusiveMin: true, summary: 'breakdown voltage Vbr at the test current' },
    testCurrent: { unit: 'A', default: 1e-3, min: 0, exclusiveMin: true, summary: 'test current It at which the breakdown voltage is specified' },
    clampVoltage: { unit: 'V', default: 53, min: 0, exclusiveMin: true, summary: 'clamp voltage Vc at the peak pulse current' },
    peakPulseCurrent: { unit: 'A', default: 28, min: 0, exclusiveMin: true, summary: 'peak pulse current Ipp at which the clamp voltage is specified' },
    slopeVoltage: { unit: 'V', optional: true, min: 0, exclusiveMin: true, summary: 'slope voltage Vs of the knee (default 2 % of the breakdown voltage)' },
    polarity: { kind: 'enum', values: ['bidirectional', 'unidirectional'], default: 'bidirectional', summary: 'bidirectional, or unidirectional with the cathode at plus (forward diode for v < 0)' },
    capacitance: { unit: 'F', default: 0, min: 0, summary: 'junction capacitance (constant)' },
    ...RATING_PARAMS,
  },
  create(p, ctx) {
    const vs = p.slopeVoltage ?? 0.02 * p.breakdownVoltage;
    const rd = (p.clampVoltage - p.breakdownVoltage - vs * Math.log(p.peakPulseCurrent / p.testCurrent)) / p.peakPulseCurrent;
    if (!(rd > 0)) {
      throw badInput(['clampVoltage'], `must exceed breakdownVoltage + slopeVoltage ln(peakPulseCurrent/testCurrent) = ${(p.breakdownVoltage + vs * Math.log(p.peakPulseCurrent / p.testCurrent)).toPrecision(4)} V so that the dynamic resistance is positive`, p.clampVoltage, 'E_PARAM');
    }
    return new TvsDevice(p.breakdownVoltage, p.testCurrent, vs, p.polarity === 'bidirectional', rd, p.capacitance, p, ctx);
  },
});
