import type { LoadPlugin, NonlinearLoadInstance, SetupContext } from '@skein/core';

/** A setup context for tests: collects warnings. */
export function testContext(dtS = 1e-9, warnings: string[] = []): SetupContext {
  return { dtS, endS: 1, id: 'D1', warn: (m) => warnings.push(m) };
}

/** Creates a load with its schema defaults under the given parameters (SI numbers). */
export function makeLoad<T = NonlinearLoadInstance>(plugin: LoadPlugin, given: Record<string, unknown>, ctx: SetupContext = testContext()): T {
  const p: Record<string, unknown> = {};
  for (const [k, spec] of Object.entries(plugin.params)) if ('default' in spec && spec.default !== undefined) p[k] = spec.default;
  return plugin.create({ ...p, ...given } as never, ctx) as T;
}

const out = new Float64Array(2);

/** i(v) [A] of a nonlinear load at t = 0. */
export function current(d: NonlinearLoadInstance, v: number): number {
  d.evaluate(v, 0, out);
  return out[0];
}

/** di/dv(v) [S] of a nonlinear load at t = 0. */
export function slope(d: NonlinearLoadInstance, v: number): number {
  d.evaluate(v, 0, out);
  return out[1];
}

/** Relative closeness with an absolute floor; the message names the place. */
export function expectClose(name: string, got: number, expected: number, rel: number, abs = 0): void {
  const err = Math.abs(got - expected);
  if (!(err <= rel * Math.abs(expected) + abs)) {
    throw new Error(`${name}: got ${got}, expected ${expected}, relative error ${(err / Math.abs(expected)).toExponential(3)} (tolerance ${rel}, floor ${abs})`);
  }
}

/**
 * Solves source Vs behind R into a nonlinear load by Newton's method on the node voltage v:
 * f(v) = (Vs - v)/R - i(v) = 0, each update passed through the load's limit hook.
 * Stops when |f| < tolA [A].
 * @returns the solution, the iterations taken and the final |f| [A].
 */
export function newtonSolve(d: NonlinearLoadInstance, vs: number, r: number, v0: number, useLimit = true, tolA = 1e-12, maxIt = 500): { v: number; iterations: number; residualA: number } {
  let v = v0;
  for (let it = 1; it <= maxIt; it++) {
    d.evaluate(v, 0, out);
    const f = (vs - v) / r - out[0];
    const df = -1 / r - out[1];
    let vNew = v - f / df;
    if (useLimit && d.limit) vNew = d.limit(vNew, v);
    v = vNew;
    d.evaluate(v, 0, out);
    const res = Math.abs((vs - v) / r - out[0]);
    if (res < tolA) return { v, iterations: it, residualA: res };
  }
  d.evaluate(v, 0, out);
  return { v, iterations: maxIt + 1, residualA: Math.abs((vs - v) / r - out[0]) };
}
