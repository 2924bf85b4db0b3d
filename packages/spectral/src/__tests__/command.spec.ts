import { describe, expect, it } from 'vitest';
import { resolveScenarioText } from '@skein/core';
import { parseSpectrumArgs, parseTouchstone, runSpectrumCommand } from '../index.ts';
import { spectralRegistry } from './fixtures.ts';

const reg = spectralRegistry();

describe('parseSpectrumArgs', () => {
  it('reads the sweep, outputs, ports and Touchstone settings', () => {
    const c = parseSpectrumArgs(['a.yaml', '--from', '1kHz', '--to', '1GHz', '--points', '7', '--log', '--out', 'v(L.l)', '--port', 'A.p:75ohm', '--touchstone', 'x.s1p']);
    expect(c.scenarioFile).toBe('a.yaml');
    expect(c.frequenciesHz.length).toBe(7);
    expect(Math.abs(c.frequenciesHz[1] / 1e4 - 1)).toBeLessThan(1e-14);
    expect(c.ports).toEqual([{ node: 'A.p', referenceOhm: 75 }]);
    expect(c.touchstone.version).toBe(1);
  });

  it('names a bad option and a missing value', () => {
    expect(() => parseSpectrumArgs(['a.yaml', '--from', '1kHz', '--to', '1GHz', '--bogus'])).toThrow(expect.objectContaining({ code: 'E_SPECTRAL_ARGS' }));
    expect(() => parseSpectrumArgs(['a.yaml', '--from', 'fast', '--to', '1GHz'])).toThrow(/must be a frequency such as 1kHz/);
    expect(() => parseSpectrumArgs(['a.yaml', '--to', '1GHz'])).toThrow(/must be given \(start frequency/);
  });
});

describe('runSpectrumCommand', () => {
  it('returns the results section, a table and a Touchstone file of a matched line', async () => {
    const s = resolveScenarioText(`
skein: 1
time: { end: 1us }
lines:
  tl: { from: A, to: B, length: 1m, impedance: 50ohm, velocity: 2e8m/s }
junctions:
  A: { nodes: { p: [tl] } }
  B: { nodes: { p: [tl] } }
`, { registry: reg, file: 'm.yaml' });
    const cmd = parseSpectrumArgs(['m.yaml', '--from', '1MHz', '--to', '100MHz', '--points', '3', '--port', 'A.p', '--port', 'B.p', '--out', 'z(A.p)', '--touchstone', 'm.s2p']);
    const out = await runSpectrumCommand(cmd, s, reg);
    expect(out.section.series.map((x) => x.name)).toEqual(['z(A.p)', 'S11', 'S12', 'S21', 'S22']);
    // A 50 ohm line left open at B: Zin = -j 50 cot(beta l) (Pozar ch. 2), real part 0.
    const bl = (2 * Math.PI * 1e6 * 1) / 2e8;
    expect(Math.abs(out.section.series[0].im[0] + 50 / Math.tan(bl))).toBeLessThan(1e-9);
    expect(out.table.split('\n')[0]).toBe('f [Hz]\t|z(A.p)| [ohm]\targ z(A.p) [deg]\t|S11| [1]\targ S11 [deg]\t|S12| [1]\targ S12 [deg]\t|S21| [1]\targ S21 [deg]\t|S22| [1]\targ S22 [deg]');
    const ts = parseTouchstone(out.touchstone!, 2);
    expect(Math.abs(Math.hypot(ts.re[2], ts.im[2]) - 1)).toBeLessThan(1e-11);
  });
});
