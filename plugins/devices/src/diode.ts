/**
 * `diode`: the Shockley junction i_j = Is (exp(x / (n Vt)) - 1), Vt = k T / q, with a series
 * resistance and a constant junction capacitance (see junction.ts).  * Source: W. Shockley, Bell Syst. Tech. J. 28, 435-489, 1949; Sze, Physics of Semiconductor
 * Devices, ch. 2 (from memory). The exponential continues linearly beyond a junction current of
 * 1 MA (EXP_LINEAR_CURRENT_A). Reverse breakdown is not modelled (use `tvs-clamp`).
 */
import { defineLoad, type SetupContext } from '@skein/core';
import { expArgMax, expLinear, JunctionDevice, limitExponentialStep } from './junction.ts';
import { RATING_PARAMS, type Ratings } from './meter.ts';

/** Boltzmann constant / elementary charge [V/K] (CODATA 2018 exact values). @example K_OVER_Q * 300 // 0.025852 V */
export const K_OVER_Q = 1.380649e-23 / 1.602176634e-19;

/**
 * Thermal voltage k T / q [V].
 * @param temperatureK junction temperature [K].
 * @example thermalVoltage(300) // 0.025852
 */
export function thermalVoltage(temperatureK: number): number {
  return K_OVER_Q * temperatureK;
}

/** Parameters of a Shockley junction: Is [A], n [1], T [K]. @example { saturationCurrentA: 1e-14, emissionCoefficient: 1, temperatureK: 300 } */
export interface ShockleyParams {
  saturationCurrentA: number;
  emissionCoefficient: number;
  temperatureK: number;
}

/**
 * Per-run object of the diode (class so that its state stays private; hooks on the prototype).
 * @example const d = diodeLoad.create(params, ctx) as DiodeDevice; d.evaluate(0.7, 0, out) // out[0] = 5.75 mA
 */
export class DiodeDevice extends JunctionDevice {
  readonly #q: Float64Array; // [Is, nVt, vcrit, scratch e, de, zMax]

  constructor(j: ShockleyParams, seriesResistanceOhm: number, capacitanceF: number, ratings: Ratings, ctx: SetupContext) {
    super('diode', seriesResistanceOhm, capacitanceF, ratings, ctx);
    const nvt = j.emissionCoefficient * thermalVoltage(j.temperatureK);
    // Critical voltage of the logarithmic limiting: nVt ln(nVt / (sqrt 2 Is)).
    this.#q = new Float64Array([j.saturationCurrentA, nvt, nvt * Math.log(nvt / (Math.SQRT2 * j.saturationCurrentA)), 0, 0, expArgMax(j.saturationCurrentA)]);
  }

  protected junction(buf: Float64Array, at: number): void {
    const q = this.#q;
    q[3] = buf[at] / q[1];
    q[4] = q[5];
    expLinear(q, 3);
    buf[at + 1] = q[0] * (q[3] - 1);
    buf[at + 2] = (q[0] * q[4]) / q[1];
  }

  protected limitJunction(xNew: number, xOld: number): number {
    const q = this.#q;
    return limitExponentialStep(xNew, xOld, q[1], q[2], 0);
  }
}

/**
 * The diode load plugin. Params: saturationCurrent [A, default 1e-14], emissionCoefficient [1, default 1],
 * temperature [K, default 300], seriesResistance [ohm, default 0], junctionCapacitance [F, default 0],
 * and the ratings (ratedEnergy J, ratedCurrent A, ratedI2t A2s, currentThreshold A; optional).
 * Current flows plus (anode) to minus (cathode).
 * @example const d = create({ saturationCurrent: 1e-14, emissionCoefficient: 1, temperature: 300, seriesResistance: 0, junctionCapacitance: 0 }); d.evaluate(0.6, 0, out) // out[0] = 1.201e-4 A
 */
export const diodeLoad = defineLoad({
  type: 'diode',
  summary: 'A Shockley diode with series resistance and junction capacitance',
  params: {
    saturationCurrent: { unit: 'A', default: 1e-14, min: 0, exclusiveMin: true, summary: 'saturation current Is' },
    emissionCoefficient: { unit: '1', default: 1, min: 0, exclusiveMin: true, summary: 'emission coefficient (ideality factor) n' },
    temperature: { unit: 'K', default: 300, min: 0, exclusiveMin: true, summary: 'junction temperature (sets Vt = kT/q)' },
    seriesResistance: { unit: 'ohm', default: 0, min: 0, summary: 'series (bulk) resistance Rs' },
    junctionCapacitance: { unit: 'F', default: 0, min: 0, summary: 'junction capacitance, constant, across the junction inside Rs' },
    ...RATING_PARAMS,
  },
  create(p, ctx) {
    return new DiodeDevice(
      { saturationCurrentA: p.saturationCurrent, emissionCoefficient: p.emissionCoefficient, temperatureK: p.temperature },
      p.seriesResistance, p.junctionCapacitance, p, ctx,
    );
  },
});
