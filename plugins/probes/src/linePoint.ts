/**
 * `line-point`: voltage, current or power at a cross-section along a line.
 */
import { badInput, defineProbe, type TraceHandle } from '@skein/core';
import { PeakTracker } from './peaks.ts';

/**
 * The line point probe. Params: line, position [m from the `from` end], quantity
 * (voltage | current | power, default voltage), conductor (optional; default every conductor).
 * Traces: voltage `v.<conductor>` [V]; current `i.<conductor>` [A], positive towards the `to` end;
 * power one trace `p` [W] = sum over the chosen conductors of v i (the power flowing towards `to`).
 * Finish output: { peaks: { <trace>: {...} } }.
 * @throws InputError (E_PROBE_PLACE) for a conductor the line does not have.
 * @example probes: { mid: { probe: line-point, line: feeder, position: 50m, quantity: power } } // mid.p
 */
export const linePointProbe = defineProbe({
  type: 'line-point',
  summary: 'Voltage, current or power at a point along a line',
  params: {
    line: { kind: 'string', summary: 'the line id' },
    position: { unit: 'm', min: 0, summary: 'distance from the line\'s from end' },
    quantity: { kind: 'enum', values: ['voltage', 'current', 'power'], default: 'voltage', summary: 'what to record' },
    conductor: { kind: 'string', optional: true, summary: 'one conductor of the line; leave out for all conductors' },
  },
  create(p, ctx) {
    const all = ctx.conductorsOf(p.line, 'line');
    let ks: number[];
    if (p.conductor !== undefined) {
      const k = all.indexOf(p.conductor);
      if (k < 0) throw badInput(['conductor'], `must name a conductor of line ${p.line}: ${all.join(', ')}`, p.conductor, 'E_PROBE_PLACE');
      ks = [k];
    } else {
      ks = all.map((_, k) => k);
    }
    const point = ctx.linePoint(p.line, p.position, 'position');
    const index = Int32Array.from(ks);
    const n = index.length;
    if (p.quantity === 'power') {
      const tp = ctx.trace('p', 'W');
      const peaks = new PeakTracker(['p'], ['W']);
      return {
        sample(state) {
          let s = 0;
          for (let j = 0; j < n; j++) s += state.pointVoltage(point, index[j]) * state.pointCurrent(point, index[j]);
          state.record(tp, s);
          peaks.add(0, s, state.tS);
        },
        finish: () => ({ kind: 'line-point', line: p.line, positionM: p.position, quantity: p.quantity, peaks: peaks.result() }),
      };
    }
    const current = p.quantity === 'current';
    const unit = current ? 'A' : 'V';
    const names = ks.map((k) => `${current ? 'i' : 'v'}.${all[k]}`);
    const traces: TraceHandle[] = names.map((nm) => ctx.trace(nm, unit));
    const peaks = new PeakTracker(names, names.map(() => unit));
    return {
      sample(state) {
        const t = state.tS;
        for (let j = 0; j < n; j++) {
          const x = current ? state.pointCurrent(point, index[j]) : state.pointVoltage(point, index[j]);
          state.record(traces[j], x);
          peaks.add(j, x, t);
        }
      },
      finish: () => ({ kind: 'line-point', line: p.line, positionM: p.position, quantity: p.quantity, peaks: peaks.result() }),
    };
  },
});
