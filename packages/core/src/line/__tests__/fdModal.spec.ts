// The constant modal transformation of frequency-dependent multiconductor lines
// (../fdModal.ts) on lines with closed-form modes; the transient checks against the
// frequency-domain solver are in test/transient-vs-spectral/multiconductorFd.spec.ts.
import { describe, expect, it } from 'vitest';
import { computeSection } from '@skein/lines';
import { constantModalTransform, couplingOverBand, defaultModalFrequency, modeSection } from '../fdModal.ts';

// Two bare copper wires 2 cm over perfect ground, 2 cm apart (the image-method pair of C. R. Paul,
// Analysis of Multiconductor Transmission Lines, 2nd ed., per-unit-length parameters chapter,
// from memory), with skin effect.
const pair = computeSection({ kind: 'wires', ground: 'perfect', wires: [{ name: 'a', x: -0.01, y: 0.02, radius: 0.4064e-3 }, { name: 'b', x: 0.01, y: 0.02, radius: 0.4064e-3 }] });
// Three unequal wires at unequal heights over earth of 1000 ohm*m (Carson; invented geometry).
const three = computeSection({ kind: 'wires', ground: { resistivityOhmM: 1000 }, wires: [
  { name: 'a', x: -3, y: 9, radius: 0.012, material: 'aluminium' }, { name: 'b', x: 2.5, y: 12, radius: 0.008, material: 'aluminium' }, { name: 'c', x: 0, y: 18, radius: 0.004, material: 'copper' },
] });

describe('constantModalTransform', () => {
  it('gives the even and odd modes of a symmetric pair', () => {
    // A symmetric pair's modes are the even (1, 1) and odd (1, -1) modes at every frequency
    // (Paul, MTL, modal decoupling, from memory); each column is scaled to a largest entry of +1.
    const t = constantModalTransform(pair, 1e6);
    const cols = [0, 1].map((m) => [t.Tv[m], t.Tv[2 + m]]);
    const even = cols.findIndex((c) => c[0] * c[1] > 0);
    expect(even).toBeGreaterThanOrEqual(0);
    expect(Math.abs(cols[even][0] - 1)).toBeLessThan(1e-12);
    expect(Math.abs(cols[even][1] - 1)).toBeLessThan(1e-12);
    const odd = 1 - even;
    expect(Math.abs(Math.abs(cols[odd][0]) - 1)).toBeLessThan(1e-12);
    expect(Math.abs(cols[odd][0] + cols[odd][1])).toBeLessThan(1e-12);
  });

  it('keeps Ti = Tv^-T, so that v^T i = vm^T im (common practice)', () => {
    const t = constantModalTransform(three, 25e3);
    const n = 3;
    for (let a = 0; a < n; a++) for (let b = 0; b < n; b++) {
      let s = 0;
      for (let m = 0; m < n; m++) s += t.Tv[m * n + a] * t.Ti[m * n + b];
      expect(Math.abs(s - (a === b ? 1 : 0))).toBeLessThan(1e-12);
      expect(Math.abs(t.TvInv[a * n + b] - t.Ti[b * n + a])).toBeLessThan(1e-12);
    }
  });

  it('rejects a frequency that is not positive', () => {
    expect(() => constantModalTransform(pair, 0)).toThrow(/modalFrequency: must be a positive frequency/);
  });
});

describe('modeSection', () => {
  it('gives the pair the even and odd mode Z and Y of the closed form', () => {
    // With Tv = [[1, 1], [1, -1]]: Zm = Tv^-1 Z Tv^-T has (Z11 +- Z12) / 2 and
    // Ym = Tv^T Y Tv has 2 (Y11 +- Y12) on its diagonal, so gamma^2 = (Z11 +- Z12)(Y11 +- Y12)
    // (Paul, MTL, even and odd modes of a symmetric pair, from memory; re-derived here).
    const t = constantModalTransform(pair, 1e6);
    const f = 3.7e7;
    const zy = pair.zyAt(f);
    for (let k = 0; k < 2; k++) {
      const s = t.Tv[k] * t.Tv[2 + k] > 0 ? 1 : -1;
      const m = modeSection(pair, t, k).zyAt(f);
      const rel = (got: number, want: number, scale: number): number => Math.abs(got - want) / scale;
      const zs = Math.hypot(zy.Zre[0], zy.Zim[0]);
      const ys = Math.hypot(zy.Yre[0], zy.Yim[0]);
      expect(rel(m.Zre[0], (zy.Zre[0] + s * zy.Zre[1]) / 2, zs)).toBeLessThan(1e-12);
      expect(rel(m.Zim[0], (zy.Zim[0] + s * zy.Zim[1]) / 2, zs)).toBeLessThan(1e-12);
      expect(rel(m.Yre[0], 2 * (zy.Yre[0] + s * zy.Yre[1]), ys)).toBeLessThan(1e-12);
      expect(rel(m.Yim[0], 2 * (zy.Yim[0] + s * zy.Yim[1]), ys)).toBeLessThan(1e-12);
    }
  });
});

describe('couplingOverBand', () => {
  it('is zero to rounding for the symmetric pair and not for the unsymmetric line', () => {
    expect(couplingOverBand(pair, constantModalTransform(pair, 1e6), 1, 1e9).max).toBeLessThan(1e-12);
    // Measured 8.2e-3 at the quarter-wave frequency of 3 km (25 kHz) and 2.9e-2 at 10 MHz over
    // 33 kHz .. 25 MHz; the bounds leave 20 % either way.
    const good = couplingOverBand(three, constantModalTransform(three, 25e3), 1 / 30e-6, 25e6);
    const poor = couplingOverBand(three, constantModalTransform(three, 1e7), 1 / 30e-6, 25e6);
    expect(good.max).toBeGreaterThan(0.0066);
    expect(good.max).toBeLessThan(0.0099);
    expect(poor.max).toBeGreaterThan(0.023);
    expect(poor.max).toBeLessThan(0.035);
  });
});

describe('defaultModalFrequency', () => {
  it('is the quarter-wave frequency of the slowest lossless mode', () => {
    // Bare wires over perfect ground in air: every mode travels at c (homogeneous medium; Paul,
    // MTL, from memory), so 1 km gives c / 4 km = 74 948.1 Hz.
    expect(Math.abs(defaultModalFrequency(pair, 1000) - 299792458 / 4000) / 74948.1).toBeLessThan(1e-6);
  });
});
