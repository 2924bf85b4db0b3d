import { describe, it, expect } from 'vitest';
import {
  computeSection,
  coax,
  microstrip,
  stripline,
  solveInsulatedBundle,
  roundWireInternalImpedance,
  carsonEarthImpedance,
  djordjevicSarkarDielectric,
  ALUMINIUM_CONDUCTIVITY,
  C0,
  EPS0,
  MU0,
  skinDepth,
} from '../index.ts';
import type { LineSection } from '../index.ts';
import { expectClose, expectAllClose } from './compare.ts';

const SIGMA_CU = 5.8e7;

function lcProduct(s: LineSection): Float64Array {
  const n = s.n;
  const p = new Float64Array(n * n);
  for (let i = 0; i < n; i++) for (let j = 0; j < n; j++) for (let k = 0; k < n; k++) p[i * n + j] += s.L[i * n + k] * s.C[k * n + j];
  return p;
}

describe('computeSection', () => {
  it('returns the contract shape: names, n, n*n matrices and consistent rlgcAt / zyAt', () => {
    const s = computeSection({
      kind: 'wires',
      ground: 'perfect',
      wires: [
        { name: 'a', x: 0, y: 0.02, radius: 0.4064e-3 },
        { name: 'b', x: 0.02, y: 0.02, radius: 0.4064e-3 },
      ],
    });
    expect(s.conductors).toEqual(['a', 'b']);
    expect(s.n).toBe(2);
    expect(s.L).toBeInstanceOf(Float64Array);
    expect(s.L.length).toBe(4);
    expect(s.C.length).toBe(4);
    expect(typeof s.describe).toBe('string');
    const f = 1e6;
    const r = s.rlgcAt(f);
    const z = s.zyAt(f);
    for (const k of [0, 1, 2, 3]) {
      expect(z.Zre[k]).toBe(r.R[k]);
      expectClose('Zim', z.Zim[k], 2 * Math.PI * f * r.L[k], 1e-15);
      expect(z.Yre[k]).toBe(r.G[k]);
      expectClose('Yim', z.Yim[k], 2 * Math.PI * f * r.C[k], 1e-15);
    }
    // Image-method matrices of REFERENCES.md (Paul, MTL): the lossless L and C.
    expectAllClose('L [uH/m]', Array.from(s.L, (v) => v * 1e6), [0.917859, 0.160944, 0.160944, 0.917859], 2e-6);
  });

  it('gives the DC resistance of the wires at f = 0, and the reference wire in every loop in free space', () => {
    // R = 1/(pi a^2 sigma) (common practice); Paul, MTL: r_ii = r_i + r_0, r_ij = r_0 (from memory).
    const s = computeSection({
      kind: 'wires',
      ground: 'none',
      reference: 'ret',
      wires: [
        { name: 'sig1', x: 0, y: 0, radius: 0.5e-3 },
        { name: 'ret', x: 5e-3, y: 0, radius: 1e-3 },
        { name: 'sig2', x: 10e-3, y: 0, radius: 0.5e-3 },
      ],
    });
    expect(s.conductors).toEqual(['sig1', 'sig2']);
    const r = s.rlgcAt(0);
    const r1 = 1 / (Math.PI * 0.5e-3 ** 2 * SIGMA_CU);
    const r0 = 1 / (Math.PI * 1e-3 ** 2 * SIGMA_CU);
    expectAllClose('R(0)', r.R, [r1 + r0, r0, r0, r1 + r0], 1e-14);
    // internal inductance mu0/(8 pi) of both the wire and the return at DC
    expectClose('L(0) - L', r.L[0] - s.L[0], 2 * (MU0 / (8 * Math.PI)), 1e-12);
    expect(Array.from(r.G)).toEqual([0, 0, 0, 0]);
  });

  it('lowers the capacitance to earth as an overhead wire is raised', () => {
    // Common practice (REFERENCES.md): r = 10 mm: 8.05 pF/m at 5 m, 7.32 at 10 m, 6.71 at 20 m (3 digits -> 1e-3).
    const c = [5, 10, 20].map((h) => computeSection({ kind: 'wires', ground: { resistivityOhmM: 100 }, wires: [{ name: 'p', x: 0, y: h, radius: 0.01 }] }).C[0] * 1e12);
    expectClose('5 m', c[0], 8.05, 1e-3);
    expectClose('10 m', c[1], 7.32, 1e-3);
    expectClose('20 m', c[2], 6.71, 1e-3);
    expect(c[1]).toBeLessThan(c[0]);
    expect(c[2]).toBeLessThan(c[1]);
  });

  it('adds internal impedance and Carson earth return for an overhead line, and leaves earth out at DC', () => {
    const wires = [
      { name: 'a', x: -3, y: 10, radius: 0.01, material: 'aluminium' as const },
      { name: 'b', x: 3, y: 12, radius: 0.01, material: 'aluminium' as const },
    ];
    const s = computeSection({ kind: 'wires', ground: { resistivityOhmM: 100 }, wires });
    const f = 50;
    const r = s.rlgcAt(f);
    const zi = roundWireInternalImpedance(0.01, f, ALUMINIUM_CONDUCTIVITY);
    const e11 = carsonEarthImpedance(10, 10, 0, f, { resistivityOhmM: 100 });
    const e12 = carsonEarthImpedance(10, 12, -6, f, { resistivityOhmM: 100 });
    expectClose('R11', r.R[0], zi.re + e11.re, 1e-12);
    expectClose('R12', r.R[1], e12.re, 1e-12);
    expectClose('L12', r.L[1], s.L[1] + e12.im / (2 * Math.PI * f), 1e-12);
    // Carson 1926 low-frequency mutual resistance omega mu0/8; first series correction is 2.3 % here -> 3 %.
    expectClose('R12 ~ omega mu0/8', r.R[1], (2 * Math.PI * f * MU0) / 8, 0.03);
    const dc = s.rlgcAt(0);
    expectAllClose('R(0)', dc.R, [1 / (Math.PI * 1e-4 * ALUMINIUM_CONDUCTIVITY), 0, 0, 1 / (Math.PI * 1e-4 * ALUMINIUM_CONDUCTIVITY)], 1e-14, 1e-20);
    // complex-depth option stays within 5 % of Carson (Deri et al. 1981, from memory)
    const d = computeSection({ kind: 'wires', ground: { resistivityOhmM: 100, model: 'complex-depth' }, wires }).rlgcAt(1e5);
    const c = s.rlgcAt(1e5);
    expectClose('Deri R12', d.R[1], c.R[1], 0.05);
    expectClose('Deri L12', d.L[1], c.L[1], 0.05);
  });

  it('uses the equivalent radius of a bundle of sub-conductors', () => {
    // Bundle equivalent radius (N r R^{N-1})^{1/N}, R = s/(2 sin(pi/N)): common practice
    // (e.g. Grainger & Stevenson, Power System Analysis, from memory). Twin bundle: sqrt(r s).
    const s = computeSection({ kind: 'wires', ground: 'perfect', wires: [{ name: 'p', x: 0, y: 15, radius: 0.015, material: 'perfect', bundle: { count: 2, spacing: 0.4 } }] });
    expectClose('L', s.L[0], (MU0 / (2 * Math.PI)) * Math.log(30 / Math.sqrt(0.015 * 0.4)), 1e-12);
    // sub-conductors in parallel: half the internal impedance of one
    const t = computeSection({ kind: 'wires', ground: 'perfect', wires: [{ name: 'p', x: 0, y: 15, radius: 0.015, bundle: { count: 2, spacing: 0.4 } }] });
    expectClose('R(0)', t.rlgcAt(0).R[0], 1 / (2 * Math.PI * 0.015 ** 2 * SIGMA_CU), 1e-14);
  });

  it('solves insulated wires numerically, with dielectric loss following the coax-in-series formula', () => {
    // One coated wire high above ground: C* = 2 pi eps0 / (ln(b/a)/eps* + acosh(h/b)), eps* = eps'(1 - j tan d);
    // G = -omega Im C* (Pozar coax formula + Paul wire over ground). Linearised loss is exact to
    // O(tan d^2) = 1e-6, the series formula to 2e-6 -> tolerance 1e-4.
    const a = 1e-3;
    const b = 2.5e-3;
    const h = 0.8;
    const s = computeSection({ kind: 'wires', ground: 'perfect', wires: [{ name: 'w', x: 0, y: h, radius: a, insulation: { thickness: b - a, relPermittivity: 3, lossTangent: 1e-3 } }] });
    expect(s.describe).toContain('multipole');
    const f = 1e6;
    const A = Math.log(b / a);
    const B = Math.acosh(h / b);
    // 1/eps* = (1 + j tan d)/(eps' (1 + tan^2 d))
    const td = 1e-3;
    const ir = 1 / (3 * (1 + td * td));
    const denRe = A * ir + B;
    const denIm = A * ir * td;
    const m2 = denRe * denRe + denIm * denIm;
    const cRe = (2 * Math.PI * EPS0 * denRe) / m2;
    const cIm = (-2 * Math.PI * EPS0 * denIm) / m2;
    const r = s.rlgcAt(f);
    expectClose('C', r.C[0], cRe, 1e-4);
    expectClose('G', r.G[0], -2 * Math.PI * f * cIm, 1e-4);
    expectClose('G(2f)', s.rlgcAt(2 * f).G[0], 2 * r.G[0], 1e-12);
    const direct = solveInsulatedBundle({ wires: [{ x: 0, y: h, radius: a, insulation: { thickness: b - a, relPermittivity: 3 } }], ground: 'perfect' });
    expectClose('C hf', s.C[0], direct.C[0], 1e-14);
  });

  it('gives the coax closed form, its conductor loss and G = omega C tan delta', () => {
    // Pozar ch. 2-3 (REFERENCES.md); homogeneous dielectric: G = omega C tan delta exactly.
    const s = computeSection({ kind: 'coax', innerRadius: 0.405e-3, shieldInnerRadius: 1.475e-3, dielectric: { relPermittivity: 2.25, lossTangent: 3e-4 }, shield: { thickness: 0.1e-3 } });
    const c = coax(0.405e-3, 1.475e-3, 2.25);
    expectClose('L', s.L[0], c.L, 1e-14);
    expectClose('C', s.C[0], c.C, 1e-14);
    const f = 1e7;
    const r = s.rlgcAt(f);
    expectClose('G', r.G[0], 2 * Math.PI * f * c.C * 3e-4, 1e-12);
    // High frequency: inner Bessel impedance + shield surface resistance Rs/(2 pi b) (t/delta = 4.8,
    // coth = 1 + 1e-4 -> tolerance 1e-3) (Pozar, coax attenuation, from memory).
    const rs = 1 / (SIGMA_CU * skinDepth(f, SIGMA_CU));
    const expectR = roundWireInternalImpedance(0.405e-3, f, SIGMA_CU).re + rs / (2 * Math.PI * (1.475e-3 + 0.05e-3));
    expectClose('R', r.R[0], expectR, 1e-3);
    // DC: inner + shield tube 1/(sigma pi ((b+t)^2 - b^2)) exactly
    const rdc = 1 / (Math.PI * 0.405e-3 ** 2 * SIGMA_CU) + 1 / (SIGMA_CU * Math.PI * (1.575e-3 ** 2 - 1.475e-3 ** 2));
    expectClose('R(0)', s.rlgcAt(0).R[0], rdc, 1e-12);
    expectAllClose('LC = mu eps', lcProduct(s), [MU0 * EPS0 * 2.25], 1e-12);
  });

  it('makes the shield a second conductor over ground with the inner-shield loop inside', () => {
    const s = computeSection({
      kind: 'coax',
      innerRadius: 0.5e-3,
      shieldInnerRadius: 2e-3,
      dielectric: { relPermittivity: 2.3 },
      shield: { thickness: 0.2e-3 },
      overGround: { height: 0.1, ground: 'perfect' },
    });
    expect(s.conductors).toEqual(['inner', 'shield']);
    const lc = coax(0.5e-3, 2e-3).L;
    const ls = (MU0 / (2 * Math.PI)) * Math.acosh(0.1 / 2.2e-3);
    expectAllClose('L', s.L, [lc + ls, ls, ls, ls], 1e-12);
    // differential (inner against shield) inductance and capacitance are the coax's
    expectClose('L diff', s.L[0] - 2 * s.L[1] + s.L[3], lc, 1e-9);
    const cc = coax(0.5e-3, 2e-3, 2.3).C;
    const cs = (2 * Math.PI * EPS0) / Math.acosh(0.1 / 2.2e-3);
    expectAllClose('C', s.C, [cc, -cc, -cc, cc + cs], 1e-12);
    // DC: each conductor its own resistance, no coupling
    const r = s.rlgcAt(0).R;
    expectClose('R inner', r[0], 1 / (Math.PI * 0.25e-6 * SIGMA_CU), 1e-12);
    expectClose('R shield', r[3], 1 / (SIGMA_CU * Math.PI * (2.2e-3 ** 2 - 2e-3 ** 2)), 1e-12);
    expectClose('R mutual', r[1], 0, 0, 1e-15);
    // At high frequency the shield decouples (transfer impedance -> 0): Z12 -> Z22
    const h = s.zyAt(1e8);
    expectClose('Z12 -> Z22', h.Zre[1], h.Zre[3], 1e-6);
  });

  it('gives the microstrip closed form with Pozar-style conductor and dielectric loss', () => {
    // Hammerstad-Jensen (thickness-corrected) and Pozar, Microwave Engineering 4th ed., sec. 3.8
    // (from memory): alpha_d = k0 er (eeff - 1) tan d / (2 sqrt(eeff) (er - 1)), alpha_c ~ Rs/(Z0 W).
    const s = computeSection({ kind: 'microstrip', width: 1e-3, substrateHeight: 1e-3, thickness: 35e-6, substrate: { relPermittivity: 4.4, lossTangent: 0.02 } });
    const m = microstrip(1e-3, 1e-3, 4.4, 35e-6);
    expectClose('L', s.L[0], m.L, 1e-14);
    expectClose('C', s.C[0], m.C, 1e-14);
    const f = 1e9;
    const r = s.rlgcAt(f);
    const k0 = (2 * Math.PI * f) / C0;
    const alphaD = (k0 * 4.4 * (m.epsEff - 1) * 0.02) / (2 * Math.sqrt(m.epsEff) * 3.4);
    // low-loss: alpha_d = G Z0 / 2 (G Z0 = 0.04 ohm*S: second-order terms ~ 1e-4)
    expectClose('alpha_d', (r.G[0] * m.z0) / 2, alphaD, 1e-9);
    // alpha_c = R/(2 Z0) -> R = 2 Rs / W at t/delta = 17
    const rs = 1 / (SIGMA_CU * skinDepth(f, SIGMA_CU));
    expectClose('R', r.R[0], (2 * rs) / 1e-3, 1e-3);
  });

  it('has L C = mu0 eps0 er I for the homogeneous striplines', () => {
    // TEM lines in a homogeneous medium (Paul, MTL, from memory).
    const s = computeSection({ kind: 'stripline', width: 0.3e-3, plateSpacing: 0.6e-3, thickness: 17e-6, dielectric: { relPermittivity: 3.5 } });
    expectClose('Z0', Math.sqrt(s.L[0] / s.C[0]), stripline(0.3e-3, 0.6e-3, 3.5).z0, 1e-12);
    expectAllClose('LC', lcProduct(s), [MU0 * EPS0 * 3.5], 1e-12);
    const c = computeSection({ kind: 'coupled-stripline', width: 0.3e-3, gap: 0.2e-3, plateSpacing: 0.6e-3, material: 'perfect', dielectric: { relPermittivity: 3.5 } });
    expect(c.conductors).toEqual(['strip1', 'strip2']);
    expectAllClose('LC pair', lcProduct(c), [MU0 * EPS0 * 3.5, 0, 0, MU0 * EPS0 * 3.5], 1e-12, 1e-12 * MU0 * EPS0);
    expect(Array.from(c.rlgcAt(1e9).R)).toEqual([0, 0, 0, 0]);
  });

  it('follows the Djordjevic-Sarkar model when asked, with the lossless C at eps_inf', () => {
    const diel = { relPermittivity: 4.2, lossTangent: 0.015, model: 'djordjevic-sarkar' as const };
    const s = computeSection({ kind: 'coax', innerRadius: 0.3e-3, shieldInnerRadius: 1e-3, dielectric: diel });
    const d = djordjevicSarkarDielectric(4.2, 0.015);
    const unit = coax(0.3e-3, 1e-3, 1).C;
    expectClose('C hf', s.C[0], unit * d.highFrequency, 1e-12);
    expectClose('C(1 GHz)', s.rlgcAt(1e9).C[0], unit * 4.2, 1e-12);
    expect(s.rlgcAt(1e6).C[0]).toBeGreaterThan(s.rlgcAt(1e9).C[0]);
  });

  it('answers thousands of calls quickly and returns fresh arrays', () => {
    const s = computeSection({
      kind: 'wires',
      ground: { resistivityOhmM: 100 },
      wires: [0, 1, 2].map((i) => ({ name: `p${i}`, x: (i - 1) * 5, y: 12, radius: 0.012, material: 'aluminium' as const })),
    });
    const a = s.rlgcAt(1e3);
    a.R[0] = -1;
    expect(s.rlgcAt(1e3).R[0]).toBeGreaterThan(0);
    const t0 = performance.now();
    let acc = 0;
    for (let k = 0; k < 5000; k++) acc += s.zyAt(10 ** (1 + (k % 50) / 10)).Zre[0];
    const ms = performance.now() - t0;
    expect(acc).toBeGreaterThan(0);
    // 50 distinct frequencies, cached: well under a second on any CI machine.
    expect(ms).toBeLessThan(2000);
  });
});
