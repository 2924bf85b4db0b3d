import { describe, it, expect } from 'vitest';
import { computeSection, sampleSection, SectionError } from '../index.ts';

describe('sampleSection', () => {
  it('lays out rlgcAt frequency-major at offset k*n*n + i*n + j', () => {
    const s = computeSection({ kind: 'wires', ground: { resistivityOhmM: 100 }, wires: [{ name: 'a', x: 0, y: 10, radius: 0.01 }, { name: 'b', x: 3, y: 10, radius: 0.01 }] });
    const f = [0, 50, 1e4, 1e6];
    const t = sampleSection(s, f);
    expect(t.R.length).toBe(4 * 4);
    expect(Array.from(t.fHz)).toEqual(f);
    f.forEach((fk, k) => {
      const r = s.rlgcAt(fk);
      for (let q = 0; q < 4; q++) {
        expect(t.R[k * 4 + q]).toBe(r.R[q]);
        expect(t.L[k * 4 + q]).toBe(r.L[q]);
        expect(t.G[k * 4 + q]).toBe(r.G[q]);
        expect(t.C[k * 4 + q]).toBe(r.C[q]);
      }
    });
    expect(() => sampleSection(s, [1, -1])).toThrow(SectionError);
  });
});
