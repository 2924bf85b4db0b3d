import { describe, it, expect } from 'vitest';
import { main } from '../../examples/overheadLine.ts';

describe('examples/overheadLine main', () => {
  it('prints the matrices of the invented feeder with physically ordered values', () => {
    let printed = '';
    const { section, text } = main((s) => {
      printed += s;
    });
    expect(printed).toBe(text);
    expect(section.conductors).toEqual(['phaseA', 'phaseB', 'phaseC', 'earthWire']);
    expect(text).toContain('phaseA');
    expect(text).toContain('f = 50 Hz');
    const n = section.n;
    // Carson: earth-return resistance appears in every entry at 50 Hz (about omega mu0/8 = 0.049 ohm/km).
    const r50 = section.rlgcAt(50).R;
    expect(r50[1] * 1e3).toBeGreaterThan(0.045);
    expect(r50[1] * 1e3).toBeLessThan(0.05);
    // The earth wire, higher and thinner, has the larger self inductance; the symmetric outer phases agree.
    expect(section.L[3 * n + 3]).toBeGreaterThan(section.L[0]);
    expect(section.L[0]).toBeCloseTo(section.L[2 * n + 2], 18);
    // Inductance falls with frequency as the earth-return current rises toward the surface.
    expect(section.rlgcAt(1e6).L[0]).toBeLessThan(section.rlgcAt(50).L[0]);
  });
});
