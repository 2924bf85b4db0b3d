import { describe, it, expect } from 'vitest';
import { coax, twoWire, wireOverGround, imageMethodWires, MU0, EPS0, C0 } from '../index.ts';
import { expectClose, expectAllClose } from './compare.ts';

// REFERENCES.md lists 5-6 digits; 2e-5 relative covers the last printed digit.
describe('coax', () => {
  it('gives the REFERENCES.md coax values (a = 0.405 mm, b = 1.475 mm, er = 2.25)', () => {
    // Pozar, Microwave Engineering, 4th ed., ch. 2-3 (from memory); eta0 form.
    const c = coax(0.405e-3, 1.475e-3, 2.25);
    expectClose('Z0', c.z0, 51.665, 2e-5);
    expectClose("L'", c.L, 258.505e-9, 2e-5);
    expectClose("C'", c.C, 96.844e-12, 2e-5);
    expectClose('v', c.velocity, C0 / 1.5, 1e-9);
  });

  it('has L C = mu eps for its homogeneous dielectric', () => {
    // TEM line in a homogeneous medium (Paul, MTL, per-unit-length chapter, from memory).
    const c = coax(1e-3, 4e-3, 3.1, 1);
    expectClose('LC', c.L * c.C, MU0 * EPS0 * 3.1, 1e-12);
  });
});

describe('twoWire', () => {
  it('gives the REFERENCES.md two-wire values (D = 10 mm, d = 2 mm, air)', () => {
    // Pozar ch. 2 table of lines (from memory).
    const t = twoWire(10e-3, 1e-3);
    expectClose('Z0', t.z0, 274.902, 2e-5);
    expectClose("L'", t.L, 0.916973e-6, 2e-5);
    expectClose("C'", t.C, 12.134e-12, 2e-5);
  });
});

describe('wireOverGround', () => {
  it('gives the REFERENCES.md wire-over-ground values (h = 10 m, r = 5 mm)', () => {
    // Paul, MTL 2nd ed., per-unit-length parameters chapter (from memory).
    const w = wireOverGround(10, 5e-3);
    expectClose('Z0', w.z0, 497.299, 2e-5);
    expectClose("L'", w.L, 1.65881e-6, 2e-5);
    expectClose("C'", w.C, 6.70752e-12, 2e-5);
  });
});

describe('imageMethodWires', () => {
  it('gives the REFERENCES.md image-method matrices for two wires over ground', () => {
    // Paul, MTL, image method: r = 0.4064 mm, h = 2 cm, 2 cm apart.
    const r = imageMethodWires([{ x: 0, y: 0.02, radius: 0.4064e-3 }, { x: 0.02, y: 0.02, radius: 0.4064e-3 }], 'perfect');
    expectAllClose('L [uH/m]', Array.from(r.L, (v) => v * 1e6), [0.917859, 0.160944, 0.160944, 0.917859], 2e-6);
    expectAllClose('C [pF/m]', Array.from(r.C, (v) => v * 1e12), [12.506768, -2.193023, -2.193023, 12.506768], 2e-6);
  });

  it('has L C = mu0 eps0 I in air, over ground and in free space', () => {
    // Homogeneous medium: L C = mu eps I (Paul, MTL, from memory).
    const wires = [
      { x: 0, y: 1, radius: 1e-3 },
      { x: 0.3, y: 1.2, radius: 2e-3 },
      { x: -0.2, y: 0.8, radius: 1.5e-3 },
    ];
    for (const [ground, ref] of [['perfect', -1], ['none', 1]] as const) {
      const r = imageMethodWires(wires, ground, ref);
      const n = r.n;
      for (let i = 0; i < n; i++) {
        for (let j = 0; j < n; j++) {
          let s = 0;
          for (let k = 0; k < n; k++) s += r.L[i * n + k] * r.C[k * n + j];
          expectClose(`${ground} (LC)[${i}${j}]`, s, i === j ? MU0 * EPS0 : 0, 1e-10, 1e-10 * MU0 * EPS0);
        }
      }
    }
  });

  it('reduces to the thin-wire two-wire line in free space', () => {
    // Paul, MTL: l = mu0/pi ln(D/r) for two identical wires (thin-wire limit of acosh(D/2r)).
    const r = imageMethodWires([{ x: 0, y: 0, radius: 1e-3 }, { x: 0.1, y: 0, radius: 1e-3 }], 'none', 1);
    expectClose('l', r.L[0], (MU0 / Math.PI) * Math.log(100), 1e-12);
    expect(r.n).toBe(1);
  });
});
