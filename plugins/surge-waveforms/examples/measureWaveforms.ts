/**
 * Prints each standard waveform's measured parameters next to the standard's nominal values:
 *   npx tsx plugins/surge-waveforms/examples/measureWaveforms.ts
 */
import type { SetupContext, SourcePlugin } from '@skein/core';
import { combinationWaveSource, esdContactSource, integrateCurrent, lightningCurrentSource, measureImpulse } from '@skein/plugin-surge-waveforms';

const ctx: SetupContext = { dtS: 1e-9, endS: 1e-3, id: 'example', warn: () => {} };
const make = (p: SourcePlugin, params: Record<string, unknown>) => p.create(params as never, ctx) as { value(t: number): number };
const us = (s: number): string => `${(s * 1e6).toFixed(3)} us`;

const voc = make(combinationWaveSource, { waveform: 'open-circuit-voltage', peak: 1000, delay: 0 });
const mv = measureImpulse((t) => voc.value(t), 400e-6, 'voltage');
console.log(`combination wave, open-circuit voltage: peak ${mv.peak.toFixed(3)} V, T1 ${us(mv.frontTimeS)} (1.2 us +-30 %), T2 ${us(mv.timeToHalfS)} (50 us +-20 %)`);
const isc = make(combinationWaveSource, { waveform: 'short-circuit-current', peak: 500, delay: 0 });
const mi = measureImpulse((t) => isc.value(t), 100e-6, 'current');
console.log(`combination wave, short-circuit current: peak ${mi.peak.toFixed(3)} A, T1 ${us(mi.frontTimeS)} (8 us +-20 %), T2 ${us(mi.timeToHalfS)} (20 us +-20 %)`);

for (const [stroke, t2] of [['first-positive', 350e-6], ['first-negative', 200e-6], ['subsequent', 100e-6]] as const) {
  const w = make(lightningCurrentSource, { stroke, level: 'I', polarity: 'positive', delay: 0 });
  const m = measureImpulse((t) => w.value(t), 3 * t2, 'current', 600_000);
  const q = integrateCurrent((t) => w.value(t), 40 * t2, 1_000_000);
  console.log(`lightning ${stroke} (level I): peak ${(m.peak / 1e3).toFixed(2)} kA, T1 ${us(m.frontTimeS)}, T2 ${us(m.timeToHalfS)}, Q ${q.chargeC.toFixed(2)} C, W/R ${(q.specificEnergyJPerOhm / 1e6).toFixed(3)} MJ/ohm`);
}

for (const level of ['1', '2', '3', '4']) {
  const w = make(esdContactSource, { level, delay: 0 });
  const m = measureImpulse((t) => (t <= 5e-9 ? w.value(t) : 0), 10e-9, 'current', 200_000);
  console.log(`ESD level ${level}: first peak ${m.peak.toFixed(2)} A, rise ${(m.rise10to90S * 1e9).toFixed(3)} ns, i(30 ns) ${w.value(30e-9).toFixed(2)} A, i(60 ns) ${w.value(60e-9).toFixed(2)} A`);
}
