import { describe, expect, it } from 'vitest';
import { EigenvalueDecomposition, Matrix } from 'ml-matrix';
import { cEigen, cFrom, cIdentity, cInverse, cMul, csqrt, type CMatrix } from '../index.ts';

/** max |a - b| over entries. */
function diff(a: CMatrix, b: CMatrix): number {
  let m = 0;
  for (let i = 0; i < a.re.length; i++) m = Math.max(m, Math.hypot(a.re[i] - b.re[i], a.im[i] - b.im[i]));
  return m;
}

/** A reproducible pseudo-random complex matrix (LCG). */
function randomMatrix(n: number, seed: number): CMatrix {
  let x = seed;
  const r = (): number => { x = (1103515245 * x + 12345) % 2147483648; return x / 2147483648 - 0.5; };
  const m = cFrom(n, n, new Float64Array(n * n), new Float64Array(n * n));
  for (let i = 0; i < n * n; i++) { m.re[i] = r(); m.im[i] = r(); }
  return m;
}

/** Residual max |A v - lambda v| over all eigenpairs. */
function residual(a: CMatrix): number {
  const n = a.rows;
  const e = cEigen(a);
  const av = cMul(a, e.vectors);
  let m = 0;
  for (let i = 0; i < n; i++) {
    for (let k = 0; k < n; k++) {
      const vr = e.vectors.re[i * n + k], vi = e.vectors.im[i * n + k];
      const lr = e.valuesRe[k] * vr - e.valuesIm[k] * vi, li = e.valuesRe[k] * vi + e.valuesIm[k] * vr;
      m = Math.max(m, Math.hypot(av.re[i * n + k] - lr, av.im[i * n + k] - li));
    }
  }
  return m;
}

describe('cEigen', () => {
  it('finds a +- b and the even and odd vectors of [[a, b], [b, a]] (closed form)', () => {
    // Symmetric 2x2 with equal diagonal: eigenvalues a +- b, vectors (1, +-1)/sqrt 2 (common practice).
    const a = cFrom(2, 2, [2, 0.5, 0.5, 2], [1, -0.25, -0.25, 1]);
    const e = cEigen(a);
    const vals = [0, 1].map((k) => [e.valuesRe[k], e.valuesIm[k]]).sort((p, q) => p[0] - q[0]);
    expect(Math.hypot(vals[0][0] - 1.5, vals[0][1] - 1.25)).toBeLessThan(1e-14);
    expect(Math.hypot(vals[1][0] - 2.5, vals[1][1] - 0.75)).toBeLessThan(1e-14);
    for (let k = 0; k < 2; k++) {
      const ratio = Math.hypot(e.vectors.re[2 + k], e.vectors.im[2 + k]) / Math.hypot(e.vectors.re[k], e.vectors.im[k]);
      expect(Math.abs(ratio - 1)).toBeLessThan(1e-13);
    }
  });

  it('has residuals at rounding level for random complex matrices up to 12 x 12', () => {
    // 1e-13: backward-stable QR gives residuals of a few eps times the norm (about 3 here).
    for (const n of [1, 2, 3, 5, 8, 12]) expect(residual(randomMatrix(n, 7 + n))).toBeLessThan(1e-13);
  });

  it('handles a multiple of the identity (fully degenerate modes of a homogeneous line)', () => {
    const a = cFrom(3, 3, [-4, 0, 0, 0, -4, 0, 0, 0, -4], new Float64Array(9));
    const e = cEigen(a);
    expect(residual(a)).toBeLessThan(1e-14);
    // The vectors are independent: the inverse exists and is well conditioned.
    const inv = cInverse(e.vectors);
    expect(diff(cMul(inv, e.vectors), cIdentity(3))).toBeLessThan(1e-12);
  });

  it('agrees with ml-matrix on real nonsymmetric matrices, complex pairs included', () => {
    for (const n of [2, 4, 6]) {
      const c = randomMatrix(n, 100 + n);
      const real = Array.from({ length: n }, (_, i) => Array.from(c.re.subarray(i * n, (i + 1) * n)));
      const ref = new EigenvalueDecomposition(new Matrix(real));
      const got = cEigen(cFrom(n, n, c.re));
      const want = ref.realEigenvalues.map((r, i) => [r, ref.imaginaryEigenvalues[i]]);
      for (let k = 0; k < n; k++) {
        const nearest = Math.min(...want.map(([r, i]) => Math.hypot(got.valuesRe[k] - r, got.valuesIm[k] - i)));
        expect(nearest).toBeLessThan(1e-12);
      }
    }
  });
});

describe('cInverse', () => {
  it('inverts a random complex matrix to rounding', () => {
    const a = randomMatrix(6, 3);
    expect(diff(cMul(a, cInverse(a)), cIdentity(6))).toBeLessThan(1e-12);
  });
});

describe('csqrt', () => {
  it('takes the principal root on both sides of the negative real axis', () => {
    expect(csqrt(-4, 0)).toEqual([0, 2]);
    const [r, i] = csqrt(-4, -1e-30);
    expect(r).toBeGreaterThanOrEqual(0);
    expect(i).toBeCloseTo(-2, 14);
    const [a, b] = csqrt(3, 4);
    expect([a, b]).toEqual([2, 1]);
  });
});
