import { describe, expect, it } from 'vitest';
import { inverse, Matrix } from 'ml-matrix';
import { invertInPlace } from '../invert.ts';

describe('invertInPlace', () => {
  it('agrees with ml-matrix on random well-conditioned matrices, at an offset', () => {
    let seed = 7;
    const rnd = (): number => ((seed = (seed * 1103515245 + 12345) % 2147483648) / 2147483648) - 0.5;
    for (const n of [1, 2, 3, 5, 8]) {
      const a = new Float64Array(3 + n * n).fill(NaN);
      const rows: number[][] = [];
      for (let i = 0; i < n; i++) {
        rows.push([]);
        for (let j = 0; j < n; j++) {
          const v = rnd() + (i === j ? n : 0);
          a[3 + i * n + j] = v;
          rows[i].push(v);
        }
      }
      const out = new Float64Array(2 + n * n).fill(NaN);
      const work = new Float64Array(2 * n * n);
      expect(invertInPlace(n, a, 3, out, 2, work)).toBeGreaterThan(0);
      const ref = inverse(new Matrix(rows));
      // Both are backward-stable eliminations of a matrix with condition number below ~10: 1e-12.
      for (let i = 0; i < n; i++) for (let j = 0; j < n; j++) expect(Math.abs(out[2 + i * n + j] - ref.get(i, j))).toBeLessThan(1e-12);
      expect(Number.isNaN(out[0]) && Number.isNaN(out[1])).toBe(true);
    }
  });

  it('reports a singular matrix with a zero pivot', () => {
    const a = Float64Array.of(1, 2, 2, 4);
    expect(invertInPlace(2, a, 0, new Float64Array(4), 0, new Float64Array(8))).toBe(0);
  });
});
