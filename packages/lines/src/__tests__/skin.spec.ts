import { describe, it, expect } from 'vitest';
import { skinDepth, roundWireInternalImpedance, roundWireDcInternalInductance, slabImpedance, MU0 } from '../index.ts';
import { expectClose } from './compare.ts';

const SIGMA_CU = 5.8e7;

describe('skinDepth', () => {
  it('gives the copper skin depths listed in REFERENCES.md', () => {
    // delta = 1/sqrt(pi f mu0 sigma), REFERENCES.md (conductor and earth); 5 digits given there.
    expectClose('60 Hz', skinDepth(60, SIGMA_CU), 8.5316e-3, 1e-4);
    expectClose('1 MHz', skinDepth(1e6, SIGMA_CU), 66.085e-6, 1e-4);
    expectClose('100 MHz', skinDepth(1e8, SIGMA_CU), 6.6085e-6, 1e-4);
    expect(skinDepth(0, SIGMA_CU)).toBe(Infinity);
  });
});

describe('roundWireInternalImpedance', () => {
  it('matches the exact Bessel-form value for a 1 mm copper wire at 1 MHz', () => {
    // Schelkunoff, Bell Syst. Tech. J. 13, 1934 (from memory); value from REFERENCES.md, 7 digits.
    const z = roundWireInternalImpedance(1e-3, 1e6, SIGMA_CU);
    expectClose('Re Z', z.re, 4.292866e-2, 2e-7);
    expectClose('Im Z', z.im, 4.148639e-2, 2e-7);
  });

  it('tends to the DC resistance and mu0/(8 pi) internal inductance at low frequency', () => {
    // REFERENCES.md: R = 5.488101 mohm/m, L_int = 50 nH/m (a = 1 mm copper). At 1 Hz a/delta = 0.015,
    // so the corrections (of order (a/delta)^4) are below 1e-7.
    const dc = roundWireInternalImpedance(1e-3, 0, SIGMA_CU);
    expectClose('R(0)', dc.re, 5.488101e-3, 2e-7);
    expect(dc.im).toBe(0);
    const z = roundWireInternalImpedance(1e-3, 1, SIGMA_CU);
    expectClose('R(1 Hz)', z.re, 5.488101e-3, 2e-7);
    expectClose('L_int(1 Hz)', z.im / (2 * Math.PI), 50e-9, 1e-6);
    expectClose('mu0/(8 pi)', roundWireDcInternalInductance(), MU0 / (8 * Math.PI), 1e-15);
  });

  it('approaches the surface-resistance form (1+j) Rs/(2 pi a) + Rdc/4 at high frequency', () => {
    // Ramo, Whinnery & Van Duzer, Fields and Waves, sec. on internal impedance of round wires
    // (asymptotic expansion, from memory): R ~ Rs/(2 pi a) + Rdc/4, X ~ Rs/(2 pi a).
    // At 100 GHz a/delta = 4800, the next term is O(delta/a)^2 relative: 1e-6 tolerance.
    const f = 1e11;
    const a = 1e-3;
    const rs = 1 / (SIGMA_CU * skinDepth(f, SIGMA_CU));
    const z = roundWireInternalImpedance(a, f, SIGMA_CU);
    const rdc = 1 / (Math.PI * a * a * SIGMA_CU);
    expectClose('R', z.re, rs / (2 * Math.PI * a) + rdc / 4, 1e-6);
    expectClose('X', z.im, rs / (2 * Math.PI * a), 1e-6);
  });

  it('stays finite and increases monotonically in resistance over 12 decades', () => {
    let prev = 0;
    for (let e = -2; e <= 12; e += 0.5) {
      const z = roundWireInternalImpedance(1e-3, 10 ** e, SIGMA_CU);
      expect(Number.isFinite(z.re) && Number.isFinite(z.im)).toBe(true);
      expect(z.re).toBeGreaterThanOrEqual(prev);
      prev = z.re;
    }
  });
});

describe('slabImpedance', () => {
  it('gives 1/(sigma t) at DC and 1/(sigma delta) per face when the slab is many skin depths thick', () => {
    // Planar skin effect (Ramo, Whinnery & Van Duzer, from memory): Zs = (1+j)/(sigma delta) for a thick slab.
    const t = 1e-3;
    expectClose('DC', slabImpedance(t, 0, SIGMA_CU).surface.re, 1 / (SIGMA_CU * t), 1e-15);
    const f = 1e9; // delta = 2.1 um, t/delta = 480
    const d = skinDepth(f, SIGMA_CU);
    const z = slabImpedance(t, f, SIGMA_CU);
    expectClose('Re Zs', z.surface.re, 1 / (SIGMA_CU * d), 1e-12);
    expectClose('Im Zs', z.surface.im, 1 / (SIGMA_CU * d), 1e-12);
    // transfer impedance decays as e^{-t/delta}
    expect(Math.hypot(z.transfer.re, z.transfer.im)).toBeLessThan(1e-100);
  });
});
