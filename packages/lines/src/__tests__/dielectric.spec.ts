import { describe, it, expect } from 'vitest';
import { constantDielectric, djordjevicSarkarDielectric } from '../index.ts';
import { expectClose } from './compare.ts';

describe('constantDielectric', () => {
  it('returns eps and eps tan delta at every frequency above DC', () => {
    const d = constantDielectric(4.4, 0.02);
    expect(d.at(1e3)).toEqual({ re: 4.4, im: 4.4 * 0.02 });
    expect(d.at(1e10)).toEqual({ re: 4.4, im: 4.4 * 0.02 });
    expect(d.at(0).im).toBe(0);
  });
});

describe('djordjevicSarkarDielectric', () => {
  const d = djordjevicSarkarDielectric(4.4, 0.02, 1e9, 1e3, 1e12);

  it('reproduces eps and tan delta at the specification frequency', () => {
    const e = d.at(1e9);
    expectClose("eps'", e.re, 4.4, 1e-12);
    expectClose('tan delta', e.im / e.re, 0.02, 1e-12);
  });

  it('has the nearly constant mid-band loss of the model, d_eps pi / (2 ln(w2/w1))', () => {
    // Djordjevic et al., IEEE Trans. EMC 43(4), 2001: for w1 << w << w2 the imaginary part is
    // d_eps (atan(w/w1) - atan(w/w2)) / ln(w2/w1) -> d_eps pi/2 / ln(w2/w1). At 1 MHz the
    // atan deviations are w1/w + w/w2 = 1e-3 + 1e-6 relative -> tolerance 2e-3.
    const e6 = d.at(1e6).im;
    const e8 = d.at(1e8).im;
    expectClose('flat eps"', e6, e8, 2e-3);
  });

  it("decreases eps' with frequency (causal dispersion) and approaches eps_inf", () => {
    let prev = Infinity;
    for (let e = 2; e <= 13; e++) {
      const v = d.at(10 ** e).re;
      expect(v).toBeLessThan(prev);
      prev = v;
    }
    expectClose('eps_inf', d.at(1e16).re, d.highFrequency, 1e-6);
    expect(d.at(0).im).toBe(0);
  });

  it('satisfies the Kramers-Kronig pair: the drop in eps\' over the band equals (2/pi) times the integral of eps" over ln w', () => {
    // For this model eps'(0) - eps'(inf) = d_eps and (2/pi) int eps''(w) d ln w = d_eps (Kramers-Kronig,
    // Jackson, Classical Electrodynamics 3rd ed. sec. 7.10). Trapezoid on 0.01-decade steps over 21 decades, tails cut: 1e-3.
    let s = 0;
    const h = 0.01 * Math.log(10);
    for (let e = -3; e <= 18; e += 0.01) {
      const w = 10 ** e;
      s += d.at(w / (2 * Math.PI)).im * h;
    }
    const drop = d.at(0).re - d.highFrequency;
    expectClose('KK', (2 / Math.PI) * s, drop, 1e-3);
  });
});
