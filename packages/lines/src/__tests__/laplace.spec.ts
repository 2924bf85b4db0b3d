// Per-unit-length Z(s), Y(s) at complex frequency s = sigma + j omega (zyAtLaplace), the analytic
// continuation the numerical Laplace transform needs.
import { describe, expect, it } from 'vitest';
import { computeSection, roundWireInternalImpedanceS, slabImpedance, slabImpedanceS, MU0, type LineSection, type ZY } from '../index.ts';
import { expectClose } from './compare.ts';

const SIGMA_CU = 5.8e7;

/** Sections covering every model that continues: skin effect, tubes, Carson and Deri earth, the wideband dielectric. */
const SECTIONS: Record<string, unknown> = {
  'insulated wires over Carson earth': {
    kind: 'wires',
    ground: { resistivityOhmM: 100 },
    wires: [
      { name: 'a', x: 0, y: 0.5, radius: 1e-3, insulation: { thickness: 0.5e-3, relPermittivity: 3.2, lossTangent: 0.01, model: 'djordjevic-sarkar' } },
      { name: 'b', x: 0.1, y: 0.5, radius: 1e-3, insulation: { thickness: 0.5e-3, relPermittivity: 3.2, lossTangent: 0.01, model: 'djordjevic-sarkar' } },
    ],
  },
  'bare wires over complex-depth earth with permittivity': {
    kind: 'wires',
    ground: { resistivityOhmM: 300, relPermittivity: 10, model: 'complex-depth' },
    wires: [{ name: 'a', x: 0, y: 10, radius: 0.01, material: 'aluminium' }, { name: 'b', x: 2, y: 12, radius: 0.01 }],
  },
  'coax with a copper tube shield and a wideband dielectric': {
    kind: 'coax', innerRadius: 0.405e-3, shieldInnerRadius: 1.475e-3,
    dielectric: { relPermittivity: 2.25, lossTangent: 3e-4, model: 'djordjevic-sarkar' },
    shield: { thickness: 0.1e-3, material: 'copper' },
  },
  'coax over Carson earth with a jacket': {
    kind: 'coax', innerRadius: 0.405e-3, shieldInnerRadius: 1.475e-3,
    dielectric: { relPermittivity: 2.25 },
    shield: { thickness: 0.1e-3 },
    overGround: { height: 0.3, ground: { resistivityOhmM: 50 }, jacket: { thickness: 0.5e-3, relPermittivity: 2.5, lossTangent: 1e-3, model: 'djordjevic-sarkar' } },
  },
  'lossless microstrip with copper loss': {
    kind: 'microstrip', width: 1e-3, substrateHeight: 1e-3, thickness: 35e-6, substrate: { relPermittivity: 4.4 },
  },
};

const at = (zy: ZY, key: 'Z' | 'Y', k: number): { re: number; im: number } =>
  key === 'Z' ? { re: zy.Zre[k], im: zy.Zim[k] } : { re: zy.Yre[k], im: zy.Yim[k] };

describe('zyAtLaplace', () => {
  for (const [name, input] of Object.entries(SECTIONS)) {
    it(`continues the ${name}: equal to zyAt on the axis, real on the real axis, analytic (Cauchy-Riemann)`, () => {
      const s: LineSection = computeSection(input);
      const n = s.n;
      for (const f of [1e3, 1e6, 1e8]) {
        const w = 2 * Math.PI * f;
        const a = s.zyAt(f);
        const b = s.zyAtLaplace!(0, w);
        // Same formulas with j omega written as s: agreement to rounding (1e-12 relative to the
        // largest entry, a floor for the zero off-diagonals of the coax).
        for (const key of ['Z', 'Y'] as const) {
          let scale = 0;
          for (let k = 0; k < n * n; k++) scale = Math.max(scale, Math.hypot(at(a, key, k).re, at(a, key, k).im));
          for (let k = 0; k < n * n; k++) {
            expectClose(`${key}[${k}] re at ${f} Hz`, at(b, key, k).re, at(a, key, k).re, 1e-10, 1e-12 * scale);
            expectClose(`${key}[${k}] im at ${f} Hz`, at(b, key, k).im, at(a, key, k).im, 1e-10, 1e-12 * scale);
          }
        }
      }
      // A causal, real impulse response has a real transform for real s (Schwarz reflection,
      // common practice): Im Z(sigma) = Im Y(sigma) = 0.
      for (const sigma of [1e3, 1e6, 1e8]) {
        const r = s.zyAtLaplace!(sigma, 0);
        for (let k = 0; k < n * n; k++) {
          expect(Math.abs(r.Zim[k]), `Im Z[${k}] at sigma ${sigma}`).toBeLessThanOrEqual(1e-12 * Math.abs(r.Zre[k]) + 1e-300);
          expect(Math.abs(r.Yim[k]), `Im Y[${k}] at sigma ${sigma}`).toBeLessThanOrEqual(1e-12 * Math.abs(r.Yre[k]) + 1e-300);
        }
      }
      // Analytic: dF/ds along sigma equals dF/ds along j omega (Cauchy-Riemann; Ahlfors, Complex
      // Analysis, ch. 2, from memory). Central differences, step 1e-4 |s|: truncation ~1e-8 of the
      // derivative; 1e-5 leaves room for the earth quadrature (tolerance 1e-11 relative).
      const s0 = { re: 2e5, im: 2 * Math.PI * 3e5 };
      const h = 1e-4 * Math.hypot(s0.re, s0.im);
      const p = s.zyAtLaplace!(s0.re + h, s0.im), m = s.zyAtLaplace!(s0.re - h, s0.im);
      const pj = s.zyAtLaplace!(s0.re, s0.im + h), mj = s.zyAtLaplace!(s0.re, s0.im - h);
      for (const key of ['Z', 'Y'] as const) {
        for (let k = 0; k < n * n; k++) {
          const dr = { re: (at(p, key, k).re - at(m, key, k).re) / (2 * h), im: (at(p, key, k).im - at(m, key, k).im) / (2 * h) };
          // dF/d(j omega) = (F(s + j h) - F(s - j h)) / (2 j h)
          const di = { re: (at(pj, key, k).im - at(mj, key, k).im) / (2 * h), im: -(at(pj, key, k).re - at(mj, key, k).re) / (2 * h) };
          const mag = Math.hypot(dr.re, dr.im);
          expect(Math.hypot(dr.re - di.re, dr.im - di.im), `${name} d${key}[${k}]/ds`).toBeLessThanOrEqual(1e-5 * mag + 1e-30);
        }
      }
    });
  }

  it('refuses a constant loss tangent and a lossy printed substrate, naming the model', () => {
    const coax = computeSection({ kind: 'coax', innerRadius: 0.405e-3, shieldInnerRadius: 1.475e-3, dielectric: { relPermittivity: 2.25, lossTangent: 2e-4 } });
    expect(() => coax.zyAtLaplace!(1e5, 1e6)).toThrow(expect.objectContaining({ code: 'SECTION_NOT_CONTINUABLE', path: ['dielectric'] }));
    expect(() => coax.zyAtLaplace!(1e5, 1e6)).toThrow(/djordjevic-sarkar/);
    const ms = computeSection({ kind: 'microstrip', width: 1e-3, substrateHeight: 1e-3, thickness: 35e-6, substrate: { relPermittivity: 4.4, lossTangent: 0.02 } });
    expect(() => ms.zyAtLaplace!(1e5, 1e6)).toThrow(expect.objectContaining({ code: 'SECTION_NOT_CONTINUABLE', path: ['substrate'] }));
    const wires = computeSection({ kind: 'wires', ground: 'perfect', wires: [{ name: 'a', x: 0, y: 0.02, radius: 1e-3, insulation: { thickness: 0.5e-3, relPermittivity: 3, lossTangent: 0.01 } }] });
    expect(() => wires.zyAtLaplace!(1e5, 1e6)).toThrow(expect.objectContaining({ code: 'SECTION_NOT_CONTINUABLE', path: ['wires', 0, 'insulation'] }));
    // The lossless constant dielectric continues: Y = s C.
    const lossless = computeSection({ kind: 'coax', innerRadius: 0.405e-3, shieldInnerRadius: 1.475e-3, dielectric: { relPermittivity: 2.25 } });
    const y = lossless.zyAtLaplace!(1e5, 1e6);
    expectClose('Re Y = sigma C', y.Yre[0], 1e5 * lossless.C[0], 1e-14);
    expectClose('Im Y = omega C', y.Yim[0], 1e6 * lossless.C[0], 1e-14);
    expect(() => lossless.zyAtLaplace!(-1, 1e6)).toThrow(expect.objectContaining({ code: 'SECTION_FREQUENCY' }));
  });
});

describe('roundWireInternalImpedanceS', () => {
  it('gives the Bessel form on the axis and the modified-Bessel form on the real axis', () => {
    // REFERENCES.md (Schelkunoff 1934, from memory): a = 1 mm copper at 1 MHz: 4.292866e-2 + j4.148639e-2 ohm/m.
    const z = roundWireInternalImpedanceS(1e-3, { re: 0, im: 2 * Math.PI * 1e6 }, SIGMA_CU);
    expectClose('Re Z(j omega)', z.re, 4.292866e-2, 2e-7);
    expectClose('Im Z(j omega)', z.im, 4.148639e-2, 2e-7);
    // Real s with q a = 1, q^2 = s mu0 sigma: k = j q, J0(j x) = I0(x), J1(j x) = j I1(x), so
    // Z = Rdc / 2 * I0(1) / I1(1), I0(1) = 1.266065878, I1(1) = 0.565159104 (Abramowitz & Stegun,
    // table 9.8, from memory); Rdc = 5.488101 mohm/m (REFERENCES.md).
    const sigma = 1 / (1e-6 * MU0 * SIGMA_CU);
    const r = roundWireInternalImpedanceS(1e-3, { re: sigma, im: 0 }, SIGMA_CU);
    expectClose('Z(sigma)', r.re, (5.488101e-3 / 2) * (1.266065878 / 0.565159104), 2e-7);
    expect(Math.abs(r.im)).toBeLessThan(1e-15);
    // DC limit and the low-frequency series: Z = Rdc + s mu0 / (8 pi) (internal inductance 50 nH/m),
    // by the Bessel ratio (|k a|^2 = 1.6e-7) and by the series branch (|k a|^2 = 1.6e-9); the next
    // term, Rdc (k a)^4 / 192, is below 1e-18 ohm/m.
    for (const sc of [{ re: 1e-3, im: 2e-3 }, { re: 1e-5, im: 2e-5 }]) {
      const low = roundWireInternalImpedanceS(1e-3, sc, SIGMA_CU);
      expectClose(`Re Z at ${sc.re}`, low.re, 5.488101e-3 + (sc.re * MU0) / (8 * Math.PI), 2e-7);
      expectClose(`Im Z at ${sc.re}`, low.im, (sc.im * MU0) / (8 * Math.PI), 1e-6);
    }
  });
});

describe('slabImpedanceS', () => {
  it('equals slabImpedance on the axis and stays real on the real axis', () => {
    // Same closed form (Schelkunoff 1934, from memory) with j omega written as s.
    for (const f of [1e3, 1e6, 1e9]) {
      const a = slabImpedance(0.1e-3, f, SIGMA_CU);
      const b = slabImpedanceS(0.1e-3, { re: 0, im: 2 * Math.PI * f }, SIGMA_CU);
      for (const k of ['surface', 'transfer'] as const) {
        const scale = Math.hypot(a[k].re, a[k].im);
        expect(Math.hypot(b[k].re - a[k].re, b[k].im - a[k].im), `${k} at ${f} Hz`).toBeLessThanOrEqual(1e-12 * scale);
      }
    }
    // Real s: (q / sigma) coth(q t) and (q / sigma) / sinh(q t), q = sqrt(s mu0 sigma), here q t = 2
    // (coth 2 = 1.037314721, sinh 2 = 3.626860408, from memory; checked by Math.tanh/Math.sinh).
    const t = 0.1e-3;
    const s = 4 / (t * t * MU0 * SIGMA_CU);
    const r = slabImpedanceS(t, { re: s, im: 0 }, SIGMA_CU);
    const q = 2 / t;
    expectClose('surface(sigma)', r.surface.re, (q / SIGMA_CU) / Math.tanh(2), 1e-12);
    expectClose('transfer(sigma)', r.transfer.re, (q / SIGMA_CU) / Math.sinh(2), 1e-12);
    expectClose('coth 2', 1 / Math.tanh(2), 1.037314721, 1e-9);
  });
});
