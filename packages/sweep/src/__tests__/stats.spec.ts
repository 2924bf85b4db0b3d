import { describe, expect, it } from 'vitest';
import { percentile, summarise } from '../index.ts';

describe('percentile', () => {
  it('interpolates between order statistics as Hyndman and Fan definition 7', () => {
    // 1..10: h = (n - 1) p; p5 -> 1 + 0.45 = 1.45, p50 -> 5.5, p95 -> 9.55 (by hand from the
    // definition; R's quantile(1:10, c(.05, .5, .95)) gives the same, from memory).
    const x = Array.from({ length: 10 }, (_, i) => i + 1);
    expect(percentile(x, 5)).toBeCloseTo(1.45, 12);
    expect(percentile(x, 50)).toBeCloseTo(5.5, 12);
    expect(percentile(x, 95)).toBeCloseTo(9.55, 12);
    expect(percentile([], 50)).toBeNaN();
  });
});

describe('summarise', () => {
  it('gives min, max, mean, sample standard deviation and percentiles, leaving out NaN', () => {
    // 2, 4, 4, 4, 5, 5, 7, 9: mean 5, sum of squares 32, sample variance 32/7 (by hand).
    const s = summarise([2, 4, NaN, 4, 4, 5, 5, 7, 9]);
    expect(s).toMatchObject({ n: 8, min: 2, max: 9, mean: 5, p50: 4.5 });
    expect(s.std).toBeCloseTo(Math.sqrt(32 / 7), 12);
  });
});
