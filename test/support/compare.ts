/**
 * The one compare helper of the validation suites: relative tolerance with an absolute floor.
 * A failure names the place, what was got and expected, and the relative error.
 */
import { expect } from 'vitest';

/** Tolerance: |got - expected| <= max(rel * |expected|, abs). */
export interface Tolerance {
  rel: number;
  abs?: number;
}

/** Asserts got ~ expected; `place` says where (trace and time, matrix entry...). */
export function expectClose(place: string, got: number, expected: number, tol: Tolerance): void {
  const err = Math.abs(got - expected);
  const allowed = Math.max(tol.rel * Math.abs(expected), tol.abs ?? 0);
  const rel = expected !== 0 ? err / Math.abs(expected) : err;
  if (!(err <= allowed)) {
    expect.fail(`${place}: got ${got}, expected ${expected}, relative error ${rel.toExponential(3)} (allowed ${tol.rel}${tol.abs !== undefined ? `, floor ${tol.abs}` : ''})`);
  }
}

/** Largest |a_i - b_i| over the samples, relative to the largest |b_i| (the reference's peak). */
export function worstRelativeToPeak(a: ArrayLike<number>, b: ArrayLike<number>): { worst: number; peak: number } {
  let peak = 0;
  for (let i = 0; i < b.length; i++) peak = Math.max(peak, Math.abs(b[i]));
  let w = 0;
  for (let i = 0; i < a.length; i++) w = Math.max(w, Math.abs(a[i] - b[i]));
  return { worst: w / peak, peak };
}
