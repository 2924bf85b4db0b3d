/**
 * Small circuits stepped by hand with a load's own hooks, in the order the engine uses
 * (history before the solve at t_n, accept after; see core's run/step.ts).
 */
import type { LinearLoadInstance, LoadPlugin, SetupContext } from '@skein/core';

/** Makes a linear load instance for a time step dt [s]. */
export function makeLinear(plugin: LoadPlugin<any>, params: Record<string, unknown>, dtS: number): LinearLoadInstance {
  const ctx: SetupContext = { dtS, endS: 1, id: 'test', warn: () => {} };
  const inst = plugin.create(params as never, ctx);
  if (inst instanceof Promise || inst.kind !== 'linear') throw new Error('expected a synchronous linear load');
  return inst;
}

/** Result of a stepped circuit: branch voltage and current of the load at t_n = n dt. */
export interface Stepped { v: Float64Array; i: Float64Array }

/**
 * Voltage source vs(t) in series with a resistor R [ohm] feeding the load (load minus at the reference).
 * Node equation at t_n: (vs - v)/R = g v + h.
 */
export function stepThroughResistor(load: LinearLoadInstance, vs: (t: number) => number, rOhm: number, dtS: number, n: number): Stepped {
  const out = { v: new Float64Array(n + 1), i: new Float64Array(n + 1) };
  for (let k = 0; k <= n; k++) {
    const t = k * dtS;
    const h = load.history ? load.history() : 0;
    const g = load.conductanceAt ? load.conductanceAt(t) : load.conductanceS;
    const v = (vs(t) / rOhm - h) / (1 / rOhm + g);
    const i = g * v + h;
    load.accept?.(v, i, t);
    out.v[k] = v;
    out.i[k] = i;
  }
  return out;
}

/** Ideal voltage source vs(t) straight across the load: v = vs, i = g v + h. */
export function stepVoltageDriven(load: LinearLoadInstance, vs: (t: number) => number, dtS: number, n: number): Stepped {
  const out = { v: new Float64Array(n + 1), i: new Float64Array(n + 1) };
  for (let k = 0; k <= n; k++) {
    const t = k * dtS;
    const h = load.history ? load.history() : 0;
    const v = vs(t);
    const i = load.conductanceS * v + h;
    load.accept?.(v, i, t);
    out.v[k] = v;
    out.i[k] = i;
  }
  return out;
}

/** Ideal current source is(t) into the load: is = g v + h, so v = (is - h)/g. */
export function stepCurrentDriven(load: LinearLoadInstance, is: (t: number) => number, dtS: number, n: number): Stepped {
  const out = { v: new Float64Array(n + 1), i: new Float64Array(n + 1) };
  for (let k = 0; k <= n; k++) {
    const t = k * dtS;
    const h = load.history ? load.history() : 0;
    const v = (is(t) - h) / load.conductanceS;
    const i = is(t);
    load.accept?.(v, i, t);
    out.v[k] = v;
    out.i[k] = i;
  }
  return out;
}

/** Largest |got[k] - exact(k dt)| over all steps. */
export function maxError(got: Float64Array, exact: (t: number) => number, dtS: number): number {
  let e = 0;
  for (let k = 0; k < got.length; k++) e = Math.max(e, Math.abs(got[k] - exact(k * dtS)));
  return e;
}
