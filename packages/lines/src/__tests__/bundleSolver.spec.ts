import { describe, it, expect } from 'vitest';
import { solveInsulatedBundle, wireOverGround, twoWire, imageMethodWires, EPS0 } from '../index.ts';
import { expectClose, expectAllClose } from './compare.ts';

describe('solveInsulatedBundle', () => {
  it('reproduces the exact wire-over-ground capacitance and inductance for a bare wire close to ground', () => {
    // Exact: C = 2 pi eps0 / acosh(h/r) (Paul, MTL, from memory). h/r = 3, where the thin-wire
    // ln(2h/r) is 2.6 % off; with 16 harmonics the expansion error is below 1e-12.
    const r = solveInsulatedBundle({ wires: [{ x: 0, y: 3e-3, radius: 1e-3 }], ground: 'perfect', harmonics: 16 });
    const exact = wireOverGround(3e-3, 1e-3);
    expectClose('C', r.C[0], exact.C, 1e-12);
    expectClose('L', r.L[0], exact.L, 1e-12);
  });

  it('reproduces the exact two-wire line in free space (image method limit with proximity effect)', () => {
    // Exact: C = pi eps0 / acosh(D/2r) (Pozar ch. 2, from memory); D/2r = 1.5.
    const r = solveInsulatedBundle({ wires: [{ x: 0, y: 0, radius: 1e-3 }, { x: 3e-3, y: 0, radius: 1e-3 }], ground: 'none', referenceIndex: 1, harmonics: 16 });
    expectClose('C', r.C[0], twoWire(3e-3, 1e-3).C, 1e-10);
  });

  it('agrees with the thin-wire image method for bare wires far apart, to order (r/d)^2', () => {
    // Paul, MTL image-method matrices (REFERENCES.md geometry): r/d = 0.02, so the proximity
    // correction is of order (r/d)^2 = 4e-4 -> tolerance 1e-3.
    const wires = [{ x: 0, y: 0.02, radius: 0.4064e-3 }, { x: 0.02, y: 0.02, radius: 0.4064e-3 }];
    const r = solveInsulatedBundle({ wires, ground: 'perfect' });
    const im = imageMethodWires(wires, 'perfect');
    expectAllClose('L', r.L, im.L, 1e-3);
    expectAllClose('C', r.C, im.C, 1e-3);
  });

  it('gives the coax (layers in series) formula for one wire in a thick coating high above ground', () => {
    // A wire of radius a in a concentric coating (radius b, er) is a coax in series with the
    // wire-over-ground outside: 1/C = (ln(b/a)/er + acosh(h/b)) / (2 pi eps0) (Pozar coax formula,
    // Paul wire over ground). The coating's image interaction is O((b/2h)^2) ~ 2e-6 -> tolerance 1e-5.
    const a = 1e-3;
    const t = 2e-3;
    const er = 3;
    const h = 1;
    const r = solveInsulatedBundle({ wires: [{ x: 0, y: h, radius: a, insulation: { thickness: t, relPermittivity: er } }], ground: 'perfect' });
    const b = a + t;
    const expected = (2 * Math.PI * EPS0) / (Math.log(b / a) / er + Math.acosh(h / b));
    expectClose('C', r.C[0], expected, 1e-5);
    // The inductance does not see the dielectric.
    expectClose('L', r.L[0], wireOverGround(h, a).L, 1e-9);
  });

  it("matches Paul's ribbon-cable example with dielectric insulation", () => {
    // C. R. Paul, Analysis of Multiconductor Transmission Lines, 2nd ed., Wiley 2008, ch. 5,
    // three-wire ribbon cable (from memory): wire radius 7.5 mil, separation 50 mil, insulation
    // 10 mil thick, er = 3.5, reference an outer wire; the book's results
    // l11 = 0.7485, l12 = 0.5077 uH/m; c11 = 37.432, c12 = -18.716 pF/m (with insulation).
    // 4-5 printed digits -> tolerance 2e-4.
    const mil = 25.4e-6;
    const ins = { thickness: 10 * mil, relPermittivity: 3.5 };
    const w = (x: number): { x: number; y: number; radius: number; insulation: typeof ins } => ({ x, y: 0, radius: 7.5 * mil, insulation: ins });
    const r = solveInsulatedBundle({ wires: [w(0), w(50 * mil), w(100 * mil)], ground: 'none', referenceIndex: 0, harmonics: 16 });
    expectClose('l11', r.L[0] * 1e6, 0.7485, 2e-4);
    expectClose('l12', r.L[1] * 1e6, 0.5077, 2e-4);
    expectClose('c11', r.C[0] * 1e12, 37.432, 2e-4);
    expectClose('c12', r.C[1] * 1e12, -18.716, 2e-4);
  });

  it('converges geometrically as the number of harmonics grows', () => {
    // Two insulated wires nearly touching each other and the ground: the hardest case for the
    // expansion. Reference N = 48. Measured: the error in c11 falls by a factor ~4 per added
    // harmonic (0.10, 2.6e-2, 1.4e-3, 4.3e-6, 4.4e-11 at N = 1, 2, 4, 8, 16). We assert every
    // doubling of N gains at least a factor 3 and the fitted rate is at least 3x per harmonic.
    const ins = { thickness: 0.3e-3, relPermittivity: 3 };
    const solve = (N: number): Float64Array =>
      solveInsulatedBundle({ wires: [{ x: 0, y: 1.5e-3, radius: 0.5e-3, insulation: ins }, { x: 2e-3, y: 1.5e-3, radius: 0.5e-3, insulation: ins }], ground: 'perfect', harmonics: N }).C;
    const ref = solve(48);
    const Ns = [1, 2, 4, 8, 16];
    const err = Ns.map((N) => Math.abs(solve(N)[0] - ref[0]) / ref[0]);
    for (let i = 1; i < err.length; i++) expect(err[i]).toBeLessThan(err[i - 1] / 3);
    const rate = Math.exp(Math.log(err[1] / err[4]) / (Ns[4] - Ns[1]));
    expect(rate).toBeGreaterThan(3);
    expect(err[4]).toBeLessThan(1e-9);
  });

  it('gives symmetric matrices with positive diagonal and negative off-diagonal capacitance', () => {
    const ins = { thickness: 0.4e-3, relPermittivity: 2.5 };
    const r = solveInsulatedBundle({ wires: [0, 1, 2].map((i) => ({ x: i * 2.2e-3, y: 3e-3 + i * 1e-3, radius: 0.6e-3, insulation: ins })), ground: 'perfect' });
    const n = r.n;
    for (let i = 0; i < n; i++) {
      expect(r.C[i * n + i]).toBeGreaterThan(0);
      for (let j = 0; j < n; j++) {
        expect(r.C[i * n + j]).toBe(r.C[j * n + i]);
        if (i !== j) expect(r.C[i * n + j]).toBeLessThan(0);
      }
    }
  });
});
