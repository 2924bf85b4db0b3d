import { describe, expect, it } from 'vitest';
import { resolveScenarioText } from '@skein/core';
import { parseTouchstone, solveSpectrum, spectrumSweep, toTouchstone } from '../index.ts';
import { spectralRegistry } from './fixtures.ts';

const reg = spectralRegistry();

const twoPort = (line: string): string => `
skein: 1
time: { end: 1us }
lines:
  tl: { from: A, to: B, ${line} }
junctions:
  A: { nodes: { p: [tl] } }
  B: { nodes: { p: [tl] } }
`;

describe('solveSpectrum', () => {
  it('gives |S21| = 1 and phase -omega T for a matched lossless line', async () => {
    // Classic result (Pozar, Microwave Engineering, 4th ed., ch. 4, from memory): a line of Z0
    // between ports of reference Z0 has S11 = 0, S21 = exp(-j omega T).
    const s = resolveScenarioText(twoPort('length: 1m, impedance: 50ohm, velocity: 2e8m/s'), { registry: reg, file: 'm.yaml' });
    const f = spectrumSweep(1e6, 1e9, 31, true);
    const r = await solveSpectrum(s, reg, { frequenciesHz: f, ports: [{ node: 'A.p' }, { node: 'B.p' }] });
    const sp = r.sParameters!;
    f.forEach((fk, k) => {
      const wT = 2 * Math.PI * fk * 5e-9;
      // 1e-12: only rounding in the eigen-decomposition and LU remains.
      expect(Math.hypot(sp.re[k * 4 + 0], sp.im[k * 4 + 0])).toBeLessThan(1e-12);
      expect(Math.abs(sp.re[k * 4 + 2] - Math.cos(wT))).toBeLessThan(1e-12);
      expect(Math.abs(sp.im[k * 4 + 2] + Math.sin(wT))).toBeLessThan(1e-12);
      expect(Math.abs(sp.re[k * 4 + 1] - sp.re[k * 4 + 2])).toBeLessThan(1e-12);
    });
  });

  it('matches the quarter-wave transformer closed form between 50 and 200 ohm', async () => {
    // Pozar, Microwave Engineering, 4th ed., sec. 5.5 (from memory): Z1 = sqrt(Z0 ZL) = 100 ohm,
    // l = lambda/4 at f0; Zin = Z1 (ZL + j Z1 t) / (Z1 + j ZL t), t = tan(beta l); S11 = (Zin - Z0)/(Zin + Z0).
    const s = resolveScenarioText(twoPort('length: 0.5m, impedance: 100ohm, velocity: 2e8m/s'), { registry: reg, file: 'q.yaml' });
    const f0 = 100e6; // lambda/4 = 0.5 m at v = 2e8 m/s
    const f = [0.5 * f0, 0.8 * f0, f0, 1.3 * f0];
    const r = await solveSpectrum(s, reg, { frequenciesHz: f, ports: [{ node: 'A.p', referenceOhm: 50 }, { node: 'B.p', referenceOhm: 200 }] });
    const sp = r.sParameters!;
    f.forEach((fk, k) => {
      const t = Math.tan((2 * Math.PI * fk * 0.5) / 2e8);
      // Zin = 100 (200 + j100 t) / (100 + j200 t)
      const nr = 200, ni = 100 * t, dr = 100, di = 200 * t;
      const d = dr * dr + di * di;
      const zr = (100 * (nr * dr + ni * di)) / d, zi = (100 * (ni * dr - nr * di)) / d;
      const gd = (zr + 50) ** 2 + zi ** 2;
      const gr = ((zr - 50) * (zr + 50) + zi * zi) / gd, gi = (zi * (zr + 50) - (zr - 50) * zi) / gd;
      // 1e-12: exact closed form, rounding only.
      expect(Math.abs(sp.re[k * 4] - gr)).toBeLessThan(1e-12);
      expect(Math.abs(sp.im[k * 4] - gi)).toBeLessThan(1e-12);
      // Lossless and reciprocal: |S11|^2 + |S21|^2 = 1 (power waves, real references).
      const p = sp.re[k * 4] ** 2 + sp.im[k * 4] ** 2 + sp.re[k * 4 + 2] ** 2 + sp.im[k * 4 + 2] ** 2;
      expect(Math.abs(p - 1)).toBeLessThan(1e-12);
    });
    expect(Math.hypot(sp.re[8], sp.im[8])).toBeLessThan(1e-12);
  });
});

describe('toTouchstone', () => {
  it('writes version 1 and 2 files that parse back to the same S-parameters', async () => {
    const s = resolveScenarioText(twoPort('length: 0.5m, impedance: 100ohm, velocity: 2e8m/s'), { registry: reg, file: 'q.yaml' });
    const f = spectrumSweep(1e6, 1e9, 11, true);
    const r = await solveSpectrum(s, reg, { frequenciesHz: f, ports: [{ node: 'A.p' }, { node: 'B.p' }] });
    const sp = r.sParameters!;
    for (const version of [1, 2] as const) {
      for (const format of ['RI', 'MA', 'DB'] as const) {
        const text = toTouchstone(sp, { version, format, frequencyUnit: 'MHz' });
        if (version === 2) expect(text).toContain('[Network Data]');
        else expect(text).toMatch(/^# MHz S \w\w R 50$/m);
        const back = parseTouchstone(text, 2);
        expect(back.frequenciesHz.length).toBe(f.length);
        back.frequenciesHz.forEach((x, k) => expect(Math.abs(x - f[k]) / f[k]).toBeLessThan(1e-11));
        // 12 significant digits written: 1e-10 after the magnitude/angle round trip.
        for (let q = 0; q < sp.re.length; q++) {
          expect(Math.abs(back.re[q] - sp.re[q])).toBeLessThan(1e-10);
          expect(Math.abs(back.im[q] - sp.im[q])).toBeLessThan(1e-10);
        }
      }
    }
  });

  it('refuses a version 1 file for ports with different reference impedances', async () => {
    const s = resolveScenarioText(twoPort('length: 0.5m, impedance: 100ohm, velocity: 2e8m/s'), { registry: reg, file: 'q.yaml' });
    const r = await solveSpectrum(s, reg, { frequenciesHz: [1e6], ports: [{ node: 'A.p', referenceOhm: 50 }, { node: 'B.p', referenceOhm: 75 }] });
    expect(() => toTouchstone(r.sParameters!, { version: 1 })).toThrow(expect.objectContaining({ code: 'E_TOUCHSTONE_REFERENCE' }));
    const v2 = parseTouchstone(toTouchstone(r.sParameters!, { version: 2 }));
    expect(v2.referenceOhm).toEqual([50, 75]);
  });

  it('writes a 3-port file row by row that parses back', async () => {
    const s = resolveScenarioText(`
skein: 1
time: { end: 1us }
lines:
  a: { from: J, to: A, length: 1m, impedance: 50ohm, velocity: 2e8m/s }
  b: { from: J, to: B, length: 2m, impedance: 50ohm, velocity: 2e8m/s }
  c: { from: J, to: C, length: 3m, impedance: 50ohm, velocity: 2e8m/s }
junctions:
  J: { nodes: { x: [a, b, c] } }
  A: { nodes: { p: [a] } }
  B: { nodes: { p: [b] } }
  C: { nodes: { p: [c] } }
`, { registry: reg, file: 't.yaml' });
    const r = await solveSpectrum(s, reg, { frequenciesHz: [1e6, 1e7], ports: [{ node: 'A.p' }, { node: 'B.p' }, { node: 'C.p' }] });
    const sp = r.sParameters!;
    // Three equal lines at a junction (REFERENCES.md): reflection -1/3, transmission 2/3, here with
    // each line's delay as phase; |S11| = 1/3 and |S21| = 2/3 at every frequency, to rounding.
    expect(Math.abs(Math.hypot(sp.re[0], sp.im[0]) - 1 / 3)).toBeLessThan(1e-12);
    expect(Math.abs(Math.hypot(sp.re[3], sp.im[3]) - 2 / 3)).toBeLessThan(1e-12);
    const back = parseTouchstone(toTouchstone(sp, { version: 1 }), 3);
    for (let q = 0; q < sp.re.length; q++) expect(Math.abs(back.re[q] - sp.re[q])).toBeLessThan(1e-11);
  });
});
