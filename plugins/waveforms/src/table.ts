/**
 * `table`: piecewise-linear through [t, value] points; the first value before the first point,
 * the last value after the last.
 */
import { defineSource } from '@skein/core';

/**
 * The table waveform plugin. Params: points, a list of [time s, value] pairs with increasing
 * times (values in the drive unit: V or A).
 * @example create({ points: [[0, 0], [1e-9, 1], [3e-9, 0]] }).value(2e-9) // 0.5
 */
export const tableSource = defineSource({
  type: 'table',
  summary: 'A piecewise-linear waveform through [time, value] points, holding the end values',
  params: {
    points: {
      kind: 'table',
      columns: ['s', '1'],
      increasingFirst: true,
      summary: 'list of [time, value] pairs, times increasing; values in the drive unit (V or A)',
    },
  },
  create(p) {
    const n = p.points.length;
    const ts = new Float64Array(n);
    const vs = new Float64Array(n);
    let shortest = Infinity;
    for (let i = 0; i < n; i++) {
      ts[i] = p.points[i][0];
      vs[i] = p.points[i][1];
      if (i > 0) shortest = Math.min(shortest, ts[i] - ts[i - 1]);
    }
    const last = n - 1;
    return {
      shortestFeatureS: shortest,
      settledAfterS: ts[last],
      value(tS: number): number {
        if (tS <= ts[0]) return vs[0];
        if (tS >= ts[last]) return vs[last];
        // Binary search for the interval ts[lo] <= t < ts[hi]: stateless, so calls in any order agree.
        let lo = 0;
        let hi = last;
        while (hi - lo > 1) {
          const mid = (lo + hi) >> 1;
          if (ts[mid] <= tS) lo = mid;
          else hi = mid;
        }
        const f = (tS - ts[lo]) / (ts[hi] - ts[lo]);
        return vs[lo] + f * (vs[hi] - vs[lo]);
      },
    };
  },
});
