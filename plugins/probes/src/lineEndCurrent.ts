/**
 * `line-end-current`: the current into a line at one of its ends, per conductor.
 */
import { defineProbe, type PortHandle, type TraceHandle } from '@skein/core';
import { PeakTracker } from './peaks.ts';

/**
 * The line-end current probe. Params: line, end (from | to), conductor (optional; default every
 * conductor). Traces: `i.<conductor>` [A], positive into the line (away from the junction).
 * Finish output: { peaks: { 'i.<conductor>': {...} } }.
 * @example probes: { ifeed: { probe: line-end-current, line: feeder, end: from } } // ifeed.i.a, ...
 */
export const lineEndCurrentProbe = defineProbe({
  type: 'line-end-current',
  summary: 'Current into a line at one end, one trace per conductor',
  params: {
    line: { kind: 'string', summary: 'the line id' },
    end: { kind: 'enum', values: ['from', 'to'], summary: 'which end of the line' },
    conductor: { kind: 'string', optional: true, summary: 'one conductor of the line; leave out for all conductors' },
  },
  create(p, ctx) {
    const end = p.end as 'from' | 'to';
    const conductors = p.conductor !== undefined ? [p.conductor] : [...ctx.conductorsOf(p.line, 'line')];
    const names = conductors.map((c) => `i.${c}`);
    const ports: PortHandle[] = conductors.map((c) => ctx.lineEnd(p.line, end, c, p.conductor !== undefined ? 'conductor' : 'line'));
    const traces: TraceHandle[] = names.map((n) => ctx.trace(n, 'A'));
    const peaks = new PeakTracker(names, names.map(() => 'A'));
    const n = ports.length;
    return {
      sample(state) {
        const t = state.tS;
        for (let k = 0; k < n; k++) {
          const i = state.portCurrent(ports[k]);
          state.record(traces[k], i);
          peaks.add(k, i, t);
        }
      },
      finish: () => ({ peaks: peaks.result() }),
    };
  },
});
