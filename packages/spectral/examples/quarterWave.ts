// S-parameters of a quarter-wave transformer (an invented demo: 100 ohm, 0.5 m at 2e8 m/s, so a
// quarter wave at 100 MHz) between a 50 ohm and a 200 ohm port, written as Touchstone 2.
// Run: npx tsx packages/spectral/examples/quarterWave.ts
import { PluginRegistry, resolveScenarioText } from '@skein/core';
import { solveSpectrum, spectrumSweep, toTouchstone } from '@skein/spectral';

const registry = new PluginRegistry();
const scenario = resolveScenarioText(`
skein: 1
title: quarter-wave transformer
time: { end: 1us }
lines:
  qw: { from: A, to: B, length: 0.5m, impedance: 100ohm, velocity: 2e8m/s }
junctions:
  A: { nodes: { p: [qw] } }
  B: { nodes: { p: [qw] } }
`, { registry, file: 'quarterWave.yaml' });

const r = await solveSpectrum(scenario, registry, {
  frequenciesHz: spectrumSweep(50e6, 150e6, 11, false),
  ports: [{ node: 'A.p', referenceOhm: 50 }, { node: 'B.p', referenceOhm: 200 }],
});
process.stdout.write(toTouchstone(r.sParameters!, { version: 2, format: 'DB', frequencyUnit: 'MHz', comments: ['quarter-wave transformer demo'] }));
