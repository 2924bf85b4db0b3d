import { describe, expect, it } from 'vitest';
import { resolveScenarioText } from '@skein/core';
import { cFrom, lineBlock, parseOutputSpec, parsePortSpec, solveSpectrum, spectrumSweep } from '../index.ts';
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
    // 1e-8 relative: the reference values are printed to 9-10 digits.
    expect(Math.abs(v.re[0] - -0.437664409) / 0.437664409).toBeLessThan(1e-8);
  });
});

describe('solveSpectrum', () => {
  it('gives gamma and the input impedance of the lossy-line reference to 1e-8', async () => {
    // Same reference (Paul, MTL, frequency-domain chapter, from memory; REFERENCES.md).
    const s = resolveScenarioText(LOSSY, { registry: reg, file: 'lossy.yaml' });
    const r = await solveSpectrum(s, reg, {
      frequenciesHz: [10e6],
      outputs: [{ kind: 'voltage', node: 'L.l' }, { kind: 'impedance', node: 'S.s' }, parseOutputSpec('i(tl.from)'), parseOutputSpec('ip(RL)')],
    });
    const [v, z, i0, iL] = r.series;
    const rel = (got: number, want: number): number => Math.abs(got - want) / Math.abs(want);
    expect(rel(v.re[0], -0.437664409)).toBeLessThan(1e-8);
    expect(rel(v.im[0], -0.495836941)).toBeLessThan(1e-8);
    expect(rel(z.re[0], 37.481952)).toBeLessThan(1e-7); // printed to 8 digits
    expect(rel(z.im[0], 27.182174)).toBeLessThan(1e-7);
    // Source current (1 - V(0)) / 50 enters the line; load current V(L) / 100 (Ohm's law).
    const zr = z.re[0], zi = z.im[0];
    const d = (zr + 50) ** 2 + zi ** 2;
    expect(rel(i0.re[0], (zr + 50) / d)).toBeLessThan(1e-8);
    expect(rel(i0.im[0], -zi / d)).toBeLessThan(1e-8);
    expect(rel(iL.re[0], v.re[0] / 100)).toBeLessThan(1e-12);
    const omega = 2 * Math.PI * 10e6;
    const b = lineBlock(cFrom(1, 1, [0.1], [omega * 250e-9]), cFrom(1, 1, [1e-6], [omega * 100e-12]), 7.3);
    expect(rel(b.gammaRe[0], 1.024995064e-3)).toBeLessThan(1e-8);
    expect(rel(b.gammaIm[0], 0.3141607783)).toBeLessThan(1e-8);
  });

  it('matches the even/odd-mode closed form of two coupled lines in the frequency domain', async () => {
    // The crosstalk case of test/crosstalk (image-method L and C of REFERENCES.md; Paul, MTL,
    // crosstalk chapter, from memory): all ends 50 ohm, conductor 1 driven by 1 V behind 50 ohm.
    // Even and odd modes are single lines of Ze, Zo at speed c; per mode (Pozar ch. 2):
    // V(0) = (Vs/2) Zin / (Zin + R), Zin = Z (R + j Z t) / (Z + j R t), V(l) = V(0) / (cos bl + j (Z/R) sin bl).
    const l11 = 0.917859e-6, l12 = 0.160944e-6, c11 = 12.506768e-12, c12 = -2.193023e-12;
    const s = resolveScenarioText(`
skein: 1
time: { end: 12ns }
lines:
  pair:
    from: N
    to: F
    length: 1m
    conductors: [c1, c2]
    inductance: [[${l11}, ${l12}], [${l12}, ${l11}]]
    capacitance: [[${c11}, ${c12}], [${c12}, ${c11}]]
junctions:
  N:
    nodes: { a: [pair.c1], b: [pair.c2] }
    parts:
      gen: { source: step, between: [a, ref], amplitude: 1, resistance: 50ohm }
      Rb: { load: resistor, between: [b, ref], resistance: 50ohm }
  F:
    nodes: { a: [pair.c1], b: [pair.c2] }
    parts:
      Ra: { load: resistor, between: [a, ref], resistance: 50ohm }
      Rb2: { load: resistor, between: [b, ref], resistance: 50ohm }
`, { registry: reg, file: 'xt.yaml' });
    const f = [1e5, 1e6, 1e8];
    const r = await solveSpectrum(s, reg, { frequenciesHz: f, outputs: ['v(N.a)', 'v(N.b)', 'v(F.a)', 'v(F.b)'].map((x) => parseOutputSpec(x)) });
    const R = 50;
    const mode = (Z: number, v: number, fk: number): { v0: [number, number]; vl: [number, number] } => {
      const bl = (2 * Math.PI * fk * 1) / v;
      const t = Math.tan(bl);
      const nr = R, ni = Z * t, dr = Z, di = R * t;
      const d = dr * dr + di * di;
      const zr = (Z * (nr * dr + ni * di)) / d, zi = (Z * (ni * dr - nr * di)) / d;
      const q = (zr + R) ** 2 + zi ** 2;
      const v0: [number, number] = [(0.5 * (zr * (zr + R) + zi * zi)) / q, (0.5 * (zi * (zr + R) - zr * zi)) / q];
      const er = Math.cos(bl), ei = (Z / R) * Math.sin(bl);
      const e = er * er + ei * ei;
      return { v0, vl: [(v0[0] * er + v0[1] * ei) / e, (v0[1] * er - v0[0] * ei) / e] };
    };
    const Ze = Math.sqrt((l11 + l12) / (c11 + c12)), Zo = Math.sqrt((l11 - l12) / (c11 - c12));
    const ve = 1 / Math.sqrt((l11 + l12) * (c11 + c12)), vo = 1 / Math.sqrt((l11 - l12) * (c11 - c12));
    f.forEach((fk, k) => {
      const e = mode(Ze, ve, fk), o = mode(Zo, vo, fk);
      const want = [
        [e.v0[0] + o.v0[0], e.v0[1] + o.v0[1]], [e.v0[0] - o.v0[0], e.v0[1] - o.v0[1]],
        [e.vl[0] + o.vl[0], e.vl[1] + o.vl[1]], [e.vl[0] - o.vl[0], e.vl[1] - o.vl[1]],
      ];
      want.forEach(([wr, wi], i) => {
        // 1e-9 of the 1 V drive: the two modal speeds differ by 1e-6 (rounded matrices), so the
        // modes of Y Z are nearly degenerate and the eigenvectors carry about 1e-10.
        expect(Math.abs(r.series[i].re[k] - wr)).toBeLessThan(1e-9);
        expect(Math.abs(r.series[i].im[k] - wi)).toBeLessThan(1e-9);
      });
    });
    // At 1 MHz the near-end crosstalk is small and grows with frequency (inductive/capacitive coupling).
    expect(Math.hypot(r.series[1].re[0], r.series[1].im[0])).toBeLessThan(Math.hypot(r.series[1].re[1], r.series[1].im[1]));
  });

  it('gives the skin-effect attenuation alpha = R / (2 Z0) of a coax section at high frequency', async () => {
    // Low-loss line (Pozar, Microwave Engineering, 4th ed., sec. 2.7, from memory):
    // alpha = R/(2 Z0) + G Z0 / 2; lossless dielectric here, so G = 0. The approximation drops
    // terms of order (R / omega L)^2 ~ 1e-4 at 100 MHz: tolerance 1e-3.
    const s = resolveScenarioText(`
skein: 1
time: { end: 1us }
lines:
  cx:
    from: A
    to: B
    length: 10m
    section: { kind: coax, innerRadius: 0.405e-3, shieldInnerRadius: 1.475e-3, dielectric: { relPermittivity: 2.25 }, innerMaterial: copper, shield: { thickness: 0.1e-3, material: copper } }
junctions:
  A: { nodes: { p: [cx] } }
  B: { nodes: { p: [cx] } }
`, { registry: reg, file: 'coax.yaml' });
    const section = s.lines[0].section!;
    for (const fHz of [1e8, 1e9]) {
      const rl = section.rlgcAt(fHz);
      const z0 = Math.sqrt(rl.L[0] / rl.C[0]);
      const alpha = rl.R[0] / (2 * z0);
      // From the spectral solver: a matched 10 m line, |S21| = exp(-alpha l) with ports at Z0.
      const r = await solveSpectrum(s, reg, { frequenciesHz: [fHz], ports: [{ node: 'A.p', referenceOhm: z0 }, { node: 'B.p', referenceOhm: z0 }] });
      const sp = r.sParameters!;
      const got = -Math.log(Math.hypot(sp.re[2], sp.im[2])) / 10;
      expect(Math.abs(got - alpha) / alpha).toBeLessThan(1e-3);
      expect(alpha).toBeGreaterThan(0.01); // skin effect present: ~0.03 Np/m at 100 MHz
    }
  });

  it('refuses a load without the admittance hook, naming plugin and hook', async () => {
    const s = resolveScenarioText(LOSSY.replace('load: resistor', 'load: bare-resistor'), { registry: reg, file: 'bare.yaml' });
    await expect(solveSpectrum(s, reg, { frequenciesHz: [1e6] })).rejects.toMatchObject({
      code: 'E_SPECTRAL_HOOK_MISSING', details: { plugin: 'bare-resistor', hook: 'admittance', part: 'RL' },
    });
  });

  it('uses the waveform spectrum from its laplace hook when asked', async () => {
    const s = resolveScenarioText(LOSSY, { registry: reg, file: 'lossy.yaml' });
    const [u, w] = await Promise.all([
      solveSpectrum(s, reg, { frequenciesHz: [10e6], outputs: [parseOutputSpec('v(L.l)')] }),
      solveSpectrum(s, reg, { frequenciesHz: [10e6], outputs: [parseOutputSpec('v(L.l)')], excitation: 'waveform' }),
    ]);
    // Step: W(j omega) = 1 / (j omega), so V_waveform = V_unit / (j omega) (linearity).
    const om = 2 * Math.PI * 10e6;
    expect(Math.abs(w.series[0].re[0] - u.series[0].im[0] / om)).toBeLessThan(1e-20);
    expect(Math.abs(w.series[0].im[0] + u.series[0].re[0] / om)).toBeLessThan(1e-20);
    const e = await solveSpectrum(resolveScenarioText(LOSSY.replace('source: step, between: [s, ref], amplitude: 1,', 'source: edge, between: [s, ref], rise: 1ns,'), { registry: reg, file: 'e.yaml' }), reg, { frequenciesHz: [1e6], excitation: 'waveform' }).catch((x: unknown) => x);
    expect(e).toMatchObject({ code: 'E_SPECTRAL_HOOK_MISSING', details: { hook: 'laplace' } });
  });
});

describe('solveSpectrum', () => {
  it('delivers 1 / Zin out of the source terminal (constraint row of the nodal system)', async () => {
    // Same lossy line, source resistance 0: V(S) = 1 V, current delivered = 1 / Zin (REFERENCES.md Zin).
    const s = resolveScenarioText(LOSSY.replace('amplitude: 1, resistance: 50ohm', 'amplitude: 1'), { registry: reg, file: 'ideal.yaml' });
    const r = await solveSpectrum(s, reg, { frequenciesHz: [10e6], outputs: [parseOutputSpec('v(S.s)'), parseOutputSpec('ip(gen)'), parseOutputSpec('z(S.s)')] });
    const [v, i, z] = r.series;
    expect(Math.abs(v.re[0] - 1)).toBeLessThan(1e-14);
    expect(Math.abs(v.im[0])).toBeLessThan(1e-14);
    const zr = 37.481952, zi = 27.182174, d = zr * zr + zi * zi;
    // 1e-7: Zin is printed to 8 digits.
    expect(Math.abs(i.re[0] - zr / d) / (zr / d)).toBeLessThan(1e-7);
    expect(Math.abs(i.im[0] + zi / d) / (zi / d)).toBeLessThan(1e-7);
    expect(Math.abs(z.re[0] - zr) / zr).toBeLessThan(1e-7);
  });
});

describe('parseOutputSpec', () => {
  it('reads every output form and names a bad one', () => {
    expect(parseOutputSpec('h(L.l/S.s)')).toEqual({ kind: 'transfer', to: 'L.l', from: 'S.s' });
    expect(parseOutputSpec('i(pair.to.c2)')).toEqual({ kind: 'current', line: 'pair', end: 'to', conductor: 'c2' });
    expect(parseOutputSpec('z(S.s)')).toEqual({ kind: 'impedance', node: 'S.s' });
    expect(() => parseOutputSpec('q(S.s)')).toThrow(expect.objectContaining({ code: 'E_SPECTRAL_OUTPUT' }));
  });
});

describe('parsePortSpec', () => {
  it('reads a node with an optional reference impedance', () => {
    expect(parsePortSpec('J1.a:75ohm')).toEqual({ node: 'J1.a', referenceOhm: 75 });
    expect(parsePortSpec('J1.a')).toEqual({ node: 'J1.a', referenceOhm: 50 });
    expect(() => parsePortSpec('J1.a:-5ohm')).toThrow(expect.objectContaining({ code: 'E_SPECTRAL_PORT' }));
  });
});

describe('spectrumSweep', () => {
  it('spaces points by decades or evenly and refuses a log sweep from 0', () => {
    const f = spectrumSweep(1e3, 1e9, 7, true);
    f.forEach((x, i) => expect(Math.abs(x / 10 ** (3 + i) - 1)).toBeLessThan(1e-14));
    expect(spectrumSweep(0.5, 2.5, 3, false)).toEqual([0.5, 1.5, 2.5]);
    expect(() => spectrumSweep(0, 1e6, 3, true)).toThrow(expect.objectContaining({ code: 'E_SPECTRAL_SWEEP' }));
  });
});
