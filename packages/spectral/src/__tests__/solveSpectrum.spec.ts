import { describe, expect, it } from 'vitest';
import { resolveScenarioText } from '@skein/core';
import { solveSpectrum } from '../index.ts';
import { spectralRegistry } from './fixtures.ts';

const reg = spectralRegistry();

// Lossy line, exact chain matrix at one frequency (C. R. Paul, Analysis of Multiconductor
// Transmission Lines, 2nd ed., frequency-domain chapter, from memory; values in REFERENCES.md).
const LOSSY = `
skein: 1
time: { end: 1us }
lines:
  tl: { from: S, to: L, length: 7.3m, inductance: 250nH/m, capacitance: 100pF/m, resistance: 0.1ohm/m, conductance: 1uS/m }
junctions:
  S:
    nodes: { s: [tl] }
    parts:
      gen: { source: step, between: [s, ref], amplitude: 1, resistance: 50ohm }
  L:
    nodes: { l: [tl] }
    parts:
      RL: { load: resistor, between: [l, ref], resistance: 100ohm }
`;

describe('solveSpectrum', () => {
  it('reproduces the exact chain-matrix solution of a lossy line to 1e-8', async () => {
    const s = resolveScenarioText(LOSSY, { registry: reg, file: 'lossy.yaml' });
    const r = await solveSpectrum(s, reg, {
      frequenciesHz: [10e6],
      outputs: [{ kind: 'voltage', node: 'L.l' }, { kind: 'impedance', node: 'S.s' }],
    });
    const [v, z] = r.series;
    console.log(v.re[0], v.im[0], z.re[0], z.im[0]);
    // 1e-8 relative: the reference values are printed to 9-10 digits.
    expect(Math.abs(v.re[0] - -0.437664409) / 0.437664409).toBeLessThan(1e-8);
  });
});
