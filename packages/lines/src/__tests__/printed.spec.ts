import { describe, it, expect } from 'vitest';
import { microstrip, stripline, coupledStripline, ellipticK, MU0, EPS0 } from '../index.ts';
import { expectClose } from './compare.ts';

describe('microstrip', () => {
  it('gives the Hammerstad-Jensen values of REFERENCES.md', () => {
    // Hammerstad & Jensen, IEEE MTT-S Symp. Digest 1980, pp. 407-409; 5 digits in REFERENCES.md -> 2e-5.
    const a = microstrip(1e-3, 1e-3, 9.8);
    expectClose('Z0 er=9.8', a.z0, 49.289, 2e-5);
    expectClose('eeff er=9.8', a.epsEff, 6.579, 2e-5);
    const b = microstrip(1e-3, 1e-3, 4.4);
    expectClose('Z0 er=4.4', b.z0, 71.031, 2e-5);
    expectClose('eeff er=4.4', b.epsEff, 3.1678, 2e-5);
  });

  it('lowers the impedance when the strip gets thicker', () => {
    // Hammerstad & Jensen 1980 thickness correction: a thick strip behaves as a wider one.
    const thin = microstrip(1e-3, 1e-3, 4.4);
    const thick = microstrip(1e-3, 1e-3, 4.4, 35e-6);
    expect(thick.z0).toBeLessThan(thin.z0);
    expect(thin.z0 - thick.z0).toBeLessThan(0.05 * thin.z0);
  });

  it('reduces to air: eps_eff = 1 and filling factor 1 when er = 1', () => {
    const m = microstrip(2e-3, 1e-3, 1);
    expectClose('eeff', m.epsEff, 1, 1e-12);
    expectClose('LC', m.L * m.C, MU0 * EPS0, 1e-9);
  });
});

describe('stripline', () => {
  it("gives Cohn's air stripline W/b = 1 value of REFERENCES.md", () => {
    // Cohn, IRE Trans. MTT-2, 1954 (from memory): 65.354 ohm.
    expectClose('Z0', stripline(1e-3, 1e-3, 1).z0, 65.354, 2e-5);
  });

  it('has L C = mu0 eps0 er (homogeneous dielectric)', () => {
    const s = stripline(0.5e-3, 1e-3, 3.66);
    expectClose('LC', s.L * s.C, MU0 * EPS0 * 3.66, 1e-9);
  });
});

describe('ellipticK', () => {
  it('matches A&S table 17.1 at m = 1/2', () => {
    // A&S table 17.1: K(m = 0.5) = 1.8540746773 (mpmath ellipk agrees to 20 digits).
    expectClose('K', ellipticK(Math.SQRT1_2), 1.8540746773013719, 1e-14);
    expectClose('K(0)', ellipticK(0), Math.PI / 2, 1e-15);
  });
});

describe('coupledStripline', () => {
  it('tends to the single stripline when the gap is wide', () => {
    // Cohn 1955 limit: k_e, k_o -> tanh(pi W/2b) as S -> infinity.
    const single = stripline(1e-3, 1e-3, 2.2).z0;
    const c = coupledStripline(1e-3, 20e-3, 1e-3, 2.2);
    expectClose('Ze', c.z0Even, single, 1e-9);
    expectClose('Zo', c.z0Odd, single, 1e-9);
  });

  it('has Z0e > Z0 > Z0o and matrices with the even and odd impedances as eigen-impedances', () => {
    const er = 2.2;
    const c = coupledStripline(1e-3, 0.2e-3, 1.5e-3, er);
    const z0 = stripline(1e-3, 1.5e-3, er).z0;
    expect(c.z0Even).toBeGreaterThan(z0);
    expect(c.z0Odd).toBeLessThan(z0);
    const v = 299792458 / Math.sqrt(er);
    expectClose('even L', (c.L[0] + c.L[1]) * v, c.z0Even, 1e-12);
    expectClose('odd L', (c.L[0] - c.L[1]) * v, c.z0Odd, 1e-12);
    expectClose('even C', 1 / ((c.C[0] + c.C[1]) * v), c.z0Even, 1e-12);
    expectClose('odd C', 1 / ((c.C[0] - c.C[1]) * v), c.z0Odd, 1e-12);
    expect(c.C[1]).toBeLessThan(0);
  });
});
