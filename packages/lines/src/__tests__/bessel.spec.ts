import { describe, it, expect } from 'vitest';
import { besselJ0, besselJ1, besselJ0Scaled, besselJ0OverJ1 } from '../index.ts';
import { expectClose } from './compare.ts';

// Double precision series/asymptotic: 1e-12 relative leaves room for the ~1e-13 cancellation
// of the power series on the skin-effect diagonal and for the 10-digit table values.
describe('besselJ0', () => {
  it('matches Abramowitz & Stegun table 9.1 on the real axis', () => {
    // A&S, Handbook of Mathematical Functions, table 9.1 (values cross-checked with mpmath 1.3.0 at 20 digits).
    // Near |z| = 17 the real-axis series loses digits; these points are away from that switch.
    const table: [number, number, number][] = [
      [1, 0.76519768655796655, 0.44005058574493352],
      [5, -0.1775967713143383, -0.32757913759146522],
      [10, -0.24593576445134834, 0.043472746168861437],
      [20, 0.16702466434058315, 0.066833124175850046],
    ];
    for (const [x, j0, j1] of table) {
      expectClose(`J0(${x})`, besselJ0({ re: x, im: 0 }).re, j0, 1e-12);
      expectClose(`J1(${x})`, besselJ1({ re: x, im: 0 }).re, j1, 1e-12);
    }
  });

  it('gives the Kelvin functions ber and bei of A&S table 9.12 on the 135-degree ray', () => {
    // A&S 9.9.1: ber x + j bei x = J0(x e^{3 pi j/4}); values of table 9.12 (more digits from mpmath 1.3.0).
    const table: [number, number, number][] = [
      [1, 0.98438178121308688, 0.24956604003665972],
      [2, 0.75173418271380823, 0.97229162730666121],
      [5, -6.2300824786663577, 0.11603438155020038],
      [10, 138.84046594163265, 56.370458553906638],
      [30, -46117602.577984999, 109955713.18250610],
    ];
    const c = Math.SQRT1_2;
    for (const [x, ber, bei] of table) {
      const j = besselJ0({ re: -x * c, im: x * c });
      const mag = Math.hypot(ber, bei);
      expectClose(`ber(${x})`, j.re, ber, 0, 1e-12 * mag);
      expectClose(`bei(${x})`, j.im, bei, 0, 1e-12 * mag);
    }
  });

  it('matches the reference library at complex points on both sides of the series/asymptotic switch', () => {
    // mpmath 1.3.0 besselj, 20 digits (general reference library).
    const j = besselJ0({ re: 12, im: 7 });
    expectClose('Re J0(12+7j)', j.re, 53.916244484373768, 1e-12);
    expectClose('Im J0(12+7j)', j.im, 104.83642087322275, 1e-12);
    const k = besselJ0({ re: 30, im: -30 });
    expectClose('Re J0(30-30j)', k.re, -155873574616.31948, 1e-12);
    expectClose('Im J0(30-30j)', k.im, -637098819459.45591, 1e-12);
  });

  it('is continuous across |z| = 17 where the method changes', () => {
    // Both methods agree there to ~1e-10 on the real axis (series cancellation), much better off it.
    const a = besselJ0({ re: 16.999999, im: -3 });
    const b = besselJ0({ re: 17.000001, im: -3 });
    // derivative J0' = -J1: the two sides differ by the step times J1 only
    const j1 = besselJ1({ re: 17, im: -3 });
    expectClose('jump re', b.re - a.re, -2e-6 * j1.re, 1e-4);
    expectClose('jump im', b.im - a.im, -2e-6 * j1.im, 1e-4);
  });
});

describe('besselJ1', () => {
  it('is odd and satisfies J1(z) ~ z/2 for small z', () => {
    // A&S 9.1.10 leading term and 9.1.35 symmetry.
    const z = { re: 1e-4, im: 2e-4 };
    const j = besselJ1(z);
    expectClose('re', j.re, 0.5e-4, 1e-7);
    expectClose('im', j.im, 1e-4, 1e-7);
    const m = besselJ1({ re: -3, im: 1 });
    const p = besselJ1({ re: 3, im: -1 });
    expect(m.re).toBeCloseTo(-p.re, 14);
    expect(m.im).toBeCloseTo(-p.im, 14);
  });
});

describe('besselJ0Scaled', () => {
  it('stays finite where J0 itself overflows', () => {
    const s = besselJ0Scaled({ re: 1000, im: -1000 });
    expect(Number.isFinite(s.re) && Number.isFinite(s.im)).toBe(true);
    // Leading Hankel term: |J0(z)| e^{-|Im z|} -> 1/sqrt(2 pi |z|) (A&S 9.2.1).
    expectClose('|J0 scaled|', Math.hypot(s.re, s.im), 1 / Math.sqrt(2 * Math.PI * Math.hypot(1000, 1000)), 1e-3);
  });
});

describe('besselJ0OverJ1', () => {
  it('tends to j on the skin-effect diagonal for large arguments', () => {
    // A&S 9.2.1: J0/J1 -> e^{j pi/2} for Im z -> -infinity.
    const r = besselJ0OverJ1({ re: 5000, im: -5000 });
    expectClose('re', r.re, 0, 0, 2e-4);
    expectClose('im', r.im, 1, 2e-4);
  });
});
