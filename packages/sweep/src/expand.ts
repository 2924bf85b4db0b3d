/**
 * Expanding a sweep into cases: each parameter's values (list, range or seeded draws), combined
 * as a grid (every combination; the last parameter varies fastest) or zipped (the i-th values
 * together).
 */
import { createRandom, streamSeed } from './prng.ts';
import { setAt } from './paths.ts';
import type { ParameterSpec, SweepSpec } from './spec.ts';

/** One case: its index in the sweep, the parameter values and the scenario data to run. */
export interface SweepCase {
  index: number;
  /** Parameter values in table order (as written into the scenario). */
  values: unknown[];
  /** The base scenario with the values set (a fresh copy). */
  scenario: unknown;
}

/**
 * The values of one parameter.
 * Linear range: from + (to - from) k/(n - 1); log range: from (to/from)^(k/(n - 1)), k = 0..n-1.
 * Draws use the parameter's own xoshiro128** stream, seeded from the sweep seed and its name.
 * Log-normal: median exp(sigma z), z standard normal.
 * @param p the parameter.
 * @param seed the sweep seed.
 * @returns the values (numbers in SI for ranges and draws).
 * @example parameterValues({ name: 'R', path: [], values: { kind: 'range', from: 1, to: 100, count: 3, scale: 'log', unit: 'ohm' } }, 1) // [1, 10, 100]
 */
export function parameterValues(p: ParameterSpec, seed: number): unknown[] {
  const v = p.values;
  if (v.kind === 'list') return v.values.slice();
  const out = new Array<number>(v.count);
  if (v.kind === 'range') {
    const n = v.count;
    for (let k = 0; k < n; k++) {
      const f = n === 1 ? 0 : k / (n - 1);
      out[k] = v.scale === 'linear' ? v.from + (v.to - v.from) * f : v.from * Math.pow(v.to / v.from, f);
    }
    // The end points exactly as written, not as rounded by the formula.
    out[n - 1] = v.to;
    out[0] = v.from;
    return out;
  }
  const rnd = createRandom(streamSeed(seed, p.name));
  for (let k = 0; k < v.count; k++) {
    if (v.dist === 'uniform') out[k] = v.a + (v.b - v.a) * rnd.uniform();
    else if (v.dist === 'normal') out[k] = v.a + v.b * rnd.normal();
    else out[k] = v.a * Math.exp(v.b * rnd.normal());
  }
  return out;
}

/** Number of cases of a sweep (grid: product of the lengths; zip: the common length). */
export function caseCount(spec: SweepSpec): number {
  const lens = spec.parameters.map((p) => (p.values.kind === 'list' ? p.values.values.length : p.values.count));
  return spec.combine === 'zip' ? lens[0] : lens.reduce((a, b) => a * b, 1);
}

/**
 * Builds every case of a sweep, optionally only one shard of them.
 * @param spec the validated sweep.
 * @param shard run only cases with index % count === index (0-based), e.g. { index: 1, count: 4 }.
 * @returns the cases in index order.
 * @example expandCases(spec).length === caseCount(spec)
 */
export function expandCases(spec: SweepSpec, shard?: { index: number; count: number }): SweepCase[] {
  const make = caseMaker(spec);
  const cases: SweepCase[] = [];
  const n = caseCount(spec);
  for (let i = shard ? shard.index : 0; i < n; i += shard ? shard.count : 1) cases.push(make(i));
  return cases;
}

/**
 * A function that builds case `i` of a sweep on demand (the parameter values are drawn once), so
 * that a sweep of millions of cases never holds them all.
 * @example caseMaker(spec)(3).values
 */
export function caseMaker(spec: SweepSpec): (index: number) => SweepCase {
  const lists = spec.parameters.map((p) => parameterValues(p, spec.seed));
  const baseJson = JSON.stringify(spec.scenario);
  return (i) => {
    const values = new Array<unknown>(lists.length);
    if (spec.combine === 'zip') {
      for (let k = 0; k < lists.length; k++) values[k] = lists[k][i];
    } else {
      let rest = i;
      for (let k = lists.length - 1; k >= 0; k--) {
        values[k] = lists[k][rest % lists[k].length];
        rest = Math.floor(rest / lists[k].length);
      }
    }
    const scenario = JSON.parse(baseJson) as unknown;
    spec.parameters.forEach((p, k) => setAt(scenario, p.path, values[k]));
    return { index: i, values, scenario };
  };
}
