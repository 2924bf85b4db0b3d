import { describe, it, expect } from 'vitest';
import { computeSection, carsonEarthImpedance, twoWire, SectionError, solveInsulatedBundle } from '../index.ts';
import { expectClose } from './compare.ts';

const sections: Record<string, unknown> = {
  overhead: { kind: 'wires', ground: { resistivityOhmM: 1000, relPermittivity: 10 }, wires: [{ name: 'p', x: 0, y: 10, radius: 0.01, material: { conductivity: 5e6, relPermeability: 200 } }, { name: 'q', x: 2, y: 11, radius: 0.01, material: 'aluminium' }] },
  deri: { kind: 'wires', ground: { resistivityOhmM: 10, model: 'complex-depth' }, wires: [{ name: 'p', x: 0, y: 8, radius: 0.01 }] },
  harness: { kind: 'wires', ground: 'perfect', wires: [0, 1, 2].map((i) => ({ name: `w${i}`, x: i * 2.4e-3, y: 5e-3, radius: 0.5e-3, insulation: { thickness: 0.6e-3, relPermittivity: 3, lossTangent: 0.01, model: 'djordjevic-sarkar' } })) },
  coax2: { kind: 'coax', innerRadius: 0.5e-3, shieldInnerRadius: 2e-3, dielectric: { relPermittivity: 2.3, lossTangent: 1e-3 }, shield: { thickness: 0.1e-3 }, overGround: { height: 0.2, ground: { resistivityOhmM: 100 }, jacket: { thickness: 1e-3, relPermittivity: 3, lossTangent: 0.01 } } },
  microstrip: { kind: 'microstrip', width: 0.3e-3, substrateHeight: 0.2e-3, thickness: 18e-6, substrate: { relPermittivity: 3.8, lossTangent: 0.01, model: 'djordjevic-sarkar' } },
  pair: { kind: 'coupled-stripline', width: 0.2e-3, gap: 0.15e-3, plateSpacing: 0.5e-3, thickness: 17e-6, dielectric: { relPermittivity: 3.5, lossTangent: 0.004 } },
};

describe('computeSection', () => {
  it('gives finite, passive matrices from DC to 10 GHz for every kind', () => {
    // Passivity (common practice): diagonal R, L, G >= 0 and C diagonal > 0 at every frequency.
    for (const [name, input] of Object.entries(sections)) {
      const s = computeSection(input);
      const n = s.n;
      for (const f of [0, 1e-2, 1, 50, 1e3, 1e5, 1e7, 1e9, 1e10]) {
        const r = s.rlgcAt(f);
        for (const k of ['R', 'L', 'G', 'C'] as const) {
          for (const v of r[k]) expect(Number.isFinite(v), `${name} ${k} at ${f} Hz`).toBe(true);
        }
        for (let i = 0; i < n; i++) {
          expect(r.R[i * n + i], `${name} R at ${f}`).toBeGreaterThanOrEqual(0);
          expect(r.L[i * n + i], `${name} L at ${f}`).toBeGreaterThan(0);
          expect(r.G[i * n + i], `${name} G at ${f}`).toBeGreaterThanOrEqual(0);
          expect(r.C[i * n + i], `${name} C at ${f}`).toBeGreaterThan(0);
        }
      }
    }
  });

  it('switches to the numerical solver for bare wires close together and then matches the exact two-wire line', () => {
    // Exact two-wire line: C = pi eps0 / acosh(D/2r) (Pozar ch. 2, from memory); D/2r = 1.5, where the
    // thin-wire ln(D/r) is 12 % off. 12 harmonics reach ~1e-8.
    const s = computeSection({ kind: 'wires', ground: 'none', reference: 'b', wires: [{ name: 'a', x: 0, y: 0, radius: 1e-3 }, { name: 'b', x: 3e-3, y: 0, radius: 1e-3 }] });
    expect(s.describe).toContain('multipole');
    expectClose('C', s.C[0], twoWire(3e-3, 1e-3).C, 1e-7);
  });
});

describe('carsonEarthImpedance', () => {
  it("leaves Carson's result unchanged at power frequency when the earth permittivity is added", () => {
    // omega eps / sigma = 2.8e-5 at 50 Hz, 1000 ohm*m, er = 10: the change is of that order -> 1e-4.
    const a = carsonEarthImpedance(10, 10, 0, 50, { resistivityOhmM: 1000 });
    const b = carsonEarthImpedance(10, 10, 0, 50, { resistivityOhmM: 1000, relPermittivity: 10 });
    expectClose('Re', b.re, a.re, 1e-4);
    expectClose('Im', b.im, a.im, 1e-4);
    // At 10 MHz displacement current dominates (omega eps / sigma = 5.6): the earth looks less resistive.
    const c = carsonEarthImpedance(10, 10, 0, 1e7, { resistivityOhmM: 1000 });
    const d = carsonEarthImpedance(10, 10, 0, 1e7, { resistivityOhmM: 1000, relPermittivity: 10 });
    expect(d.re).toBeLessThan(c.re);
  });
});

describe('SectionError', () => {
  it('rejects microstrip outside the Hammerstad-Jensen range', () => {
    try {
      computeSection({ kind: 'microstrip', width: 1e-6, substrateHeight: 1e-3, thickness: 1e-7, substrate: { relPermittivity: 4 } });
      expect.unreachable();
    } catch (e) {
      expect(e).toBeInstanceOf(SectionError);
      expect((e as SectionError).code).toBe('SECTION_RANGE');
      expect((e as SectionError).path).toEqual(['width']);
    }
  });
});

describe('computeSection', () => {
  it('refines the harmonics automatically until touching insulation has converged', () => {
    // Reference: the solver at N = 64 (convergence measured in bundleSolver.spec: geometric).
    // The automatic loop stops when the last doubling changed C by < 1e-7 or at N = 48: the
    // error at N = 48 is 4.5e-9 here, tolerance 1e-7.
    const ins = { thickness: 0.5e-3, relPermittivity: 3 };
    const w = [
      { x: 0, y: 2e-3, radius: 1e-3, insulation: ins },
      { x: 3e-3, y: 2e-3, radius: 1e-3, insulation: ins },
    ];
    const s = computeSection({ kind: 'wires', ground: 'perfect', wires: w.map((v, i) => ({ name: `w${i}`, ...v })) });
    expect(s.describe).toContain('48 harmonics');
    const ref = solveInsulatedBundle({ wires: w, ground: 'perfect', harmonics: 64 });
    expectClose('c11', s.C[0], ref.C[0], 1e-7);
    expectClose('c12', s.C[1], ref.C[1], 1e-7);
    const fixed = computeSection({ kind: 'wires', ground: 'perfect', harmonics: 4, wires: w.map((v, i) => ({ name: `w${i}`, ...v })) });
    expect(fixed.describe).toContain('4 harmonics');
    expect(Math.abs(fixed.C[0] - ref.C[0]) / ref.C[0]).toBeGreaterThan(1e-3);
  });
});
