/**
 * Summary statistics of a sweep column: count, min, max, mean, standard deviation and the 5th,
 * 50th and 95th percentiles. Percentiles interpolate linearly between order statistics
 * (definition 7 of R. J. Hyndman and Y. Fan, "Sample quantiles in statistical packages",
 * The American Statistician 50(4), 361-365, 1996).
 */

/** Statistics of the finite values of one column. */
export interface Summary {
  /** Number of finite values used. */
  n: number;
  min: number;
  max: number;
  mean: number;
  /** Sample standard deviation (n - 1 in the denominator); NaN below two values. */
  std: number;
  p5: number;
  p50: number;
  p95: number;
}

/**
 * Percentile of sorted values by linear interpolation (Hyndman-Fan definition 7).
 * @param sorted ascending finite values.
 * @param p the percentile, 0..100.
 * @returns NaN for no values.
 * @example percentile([1, 2, 3, 4], 50) // 2.5
 */
export function percentile(sorted: ArrayLike<number>, p: number): number {
  const n = sorted.length;
  if (n === 0) return NaN;
  const h = ((n - 1) * p) / 100;
  const lo = Math.floor(h);
  const hi = Math.min(lo + 1, n - 1);
  return sorted[lo] + (h - lo) * (sorted[hi] - sorted[lo]);
}

/**
 * Summarises the finite values of a column (NaN and infinities, e.g. failed cases, are left out).
 * Mean and variance use Welford's one-pass update (B. P. Welford, Technometrics 4(3), 1962).
 * @example summarise([1, 2, 3]).mean // 2
 */
export function summarise(values: ArrayLike<number>): Summary {
  const finite: number[] = [];
  for (let i = 0; i < values.length; i++) if (Number.isFinite(values[i])) finite.push(values[i]);
  finite.sort((a, b) => a - b);
  let mean = 0;
  let m2 = 0;
  for (let i = 0; i < finite.length; i++) {
    const d = finite[i] - mean;
    mean += d / (i + 1);
    m2 += d * (finite[i] - mean);
  }
  const n = finite.length;
  return {
    n,
    min: n > 0 ? finite[0] : NaN,
    max: n > 0 ? finite[n - 1] : NaN,
    mean: n > 0 ? mean : NaN,
    std: n > 1 ? Math.sqrt(m2 / (n - 1)) : NaN,
    p5: percentile(finite, 5),
    p50: percentile(finite, 50),
    p95: percentile(finite, 95),
  };
}
