import { describe, expect, it } from 'vitest';
import { CholeskyDecomposition, Matrix } from 'ml-matrix';
import { isPositiveDefinite } from '../../index.ts';

/** Deterministic entries in [-1, 1] (no random draws needed: the sine of integers is spread enough). */
const entry = (k: number): number => Math.sin(12.9898 * k + 78.233);

describe('isPositiveDefinite', () => {
  it('agrees with ml-matrix CholeskyDecomposition on 2000 symmetric matrices of 1 to 8 rows', () => {
    // Reference: ml-matrix's Cholesky factorisation (Golub and Van Loan sec. 4.2). Entries in
    // [-1, 1] and a diagonal shift from -0.3 m to 0.7 m make some of the matrices definite and
    // some not (both counts asserted below).
    let draw = 0;
    const rnd = (): number => 0.5 + 0.5 * entry(draw++);
    let definite = 0;
    for (let t = 0; t < 2000; t++) {
      const m = 1 + (t % 8);
      const a = new Float64Array(m * m);
      for (let i = 0; i < m; i++) for (let j = 0; j <= i; j++) a[i * m + j] = a[j * m + i] = 2 * rnd() - 1;
      const shift = (rnd() - 0.3) * m;
      for (let i = 0; i < m; i++) a[i * m + i] += shift;
      const rows = Array.from({ length: m }, (_, i) => Array.from(a.subarray(i * m, (i + 1) * m)));
      const expected = new CholeskyDecomposition(new Matrix(rows)).isPositiveDefinite();
      expect(isPositiveDefinite(a, m)).toBe(expected);
      if (expected) definite++;
    }
    expect(definite).toBeGreaterThan(400);
    expect(definite).toBeLessThan(1600);
  });

  it('accepts a physical inductance matrix and refuses one whose mutual term exceeds the self terms', () => {
    // Two coupled wires: L = [[L1, M], [M, L2]] is definite iff M^2 < L1 L2 (common practice).
    expect(isPositiveDefinite(Float64Array.of(0.5e-6, 0.1e-6, 0.1e-6, 0.5e-6), 2)).toBe(true);
    expect(isPositiveDefinite(Float64Array.of(0.5e-6, 0.6e-6, 0.6e-6, 0.5e-6), 2)).toBe(false);
    expect(isPositiveDefinite(Float64Array.of(0), 1)).toBe(false);
    expect(isPositiveDefinite(Float64Array.of(NaN), 1)).toBe(false);
  });
});
