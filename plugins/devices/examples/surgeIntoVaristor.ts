/**
 * A 4 kV IEC 61000-4-5 combination-wave voltage behind 2 ohm into a 470 V varistor, solved step
 * by step with a small Newton loop that uses the device's evaluate / limit / accept hooks the way
 * the engine does. Prints the clamp voltage, peak current and absorbed energy:
 *   npx tsx plugins/devices/examples/surgeIntoVaristor.ts
 * (Demo values of our own; not a design. Surge protection follows the applicable standards.)
 */
import type { NonlinearLoadInstance, SetupContext, WaveformInstance } from '@skein/core';
import { varistorLoad } from '@skein/plugin-devices';
import { combinationWaveSource } from '@skein/plugin-surge-waveforms';

const dt = 10e-9;
const warnings: string[] = [];
const ctx: SetupContext = { dtS: dt, endS: 200e-6, id: 'MOV1', warn: (m) => warnings.push(m) };
const surge = combinationWaveSource.create({ waveform: 'open-circuit-voltage', peak: 4000, delay: 0 }, ctx) as WaveformInstance;
const mov = varistorLoad.create({ referenceVoltage: 470, referenceCurrent: 1e-3, exponent: 30, ratedEnergy: 20 }, ctx) as NonlinearLoadInstance;

const r = 2; // generator's effective output impedance [ohm]
const out = new Float64Array(2);
let v = 0;
let vMax = 0;
let iterationsMax = 0;
for (let k = 0; k * dt <= ctx.endS; k++) {
  const t = k * dt;
  const e = surge.value(t);
  let it = 0;
  for (; it < 100; it++) {
    mov.evaluate(v, t, out);
    const f = (e - v) / r - out[0];
    if (Math.abs(f) < 1e-9 * (1 + Math.abs(out[0]))) break;
    v = mov.limit ? mov.limit(v - f / (-1 / r - out[1]), v) : v - f / (-1 / r - out[1]);
  }
  iterationsMax = Math.max(iterationsMax, it);
  mov.evaluate(v, t, out);
  mov.accept?.(v, out[0], t);
  vMax = Math.max(vMax, v);
}
const res = mov.finish?.() as { energyJ: number; peakCurrentA: number; i2tA2s: number };
console.log(`clamp voltage ${vMax.toFixed(1)} V, peak current ${res.peakCurrentA.toFixed(1)} A, energy ${res.energyJ.toFixed(3)} J, i2t ${res.i2tA2s.toFixed(2)} A2s, Newton iterations per step <= ${iterationsMax}`);
console.log(JSON.stringify(res));
console.log(warnings.length ? warnings.join('\n') : 'no rating exceeded');
