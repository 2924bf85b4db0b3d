/**
 * The one compare helper of the lines tests: relative tolerance with an absolute floor.
 * A failure prints place, got, expected and the relative error.
 */
import { expect } from 'vitest';

/**
 * Asserts |got - expected| <= max(relTol |expected|, absFloor).
 *
 * @param place what is compared, printed on failure
 * @param got computed value
 * @param expected reference value
 * @param relTol relative tolerance
 * @param absFloor absolute floor, default 0
 */
export function expectClose(place: string, got: number, expected: number, relTol: number, absFloor = 0): void {
  const err = Math.abs(got - expected);
  const rel = expected === 0 ? Infinity : err / Math.abs(expected);
  const ok = err <= Math.max(relTol * Math.abs(expected), absFloor);
  expect(ok, `${place}: got ${got}, expected ${expected}, relative error ${rel.toExponential(3)} (tolerance ${relTol})`).toBe(true);
}

/** Element-wise {@link expectClose} over arrays. */
export function expectAllClose(place: string, got: ArrayLike<number>, expected: ArrayLike<number>, relTol: number, absFloor = 0): void {
  expect(got.length, `${place}: length`).toBe(expected.length);
  for (let i = 0; i < expected.length; i++) expectClose(`${place}[${i}]`, got[i], expected[i], relTol, absFloor);
}
