/**
 * `part`: voltage, current and power of one lumped part (load or source).
 */
import { defineProbe } from '@skein/core';
import { PeakTracker } from './peaks.ts';

/**
 * The part probe. Params: part (the part id). Traces: `v` [V] from plus to minus, `i` [A] (loads:
 * through the part from plus to minus; sources: delivered out of the plus terminal), `p` = v i [W]
 * (loads: power absorbed; sources: power delivered to the network). Finish output:
 * { peaks: { v, i, p }, energyJ: time integral of p by the trapezoidal rule }.
 * @example probes: { r1: { probe: part, part: R1 } } // r1.v, r1.i, r1.p
 */
export const partProbe = defineProbe({
  type: 'part',
  summary: 'Voltage, current and power of a lumped part',
  params: {
    part: { kind: 'string', summary: 'the part id (a load or a source)' },
  },
  create(p, ctx) {
    const h = ctx.part(p.part, 'part');
    const tv = ctx.trace('v', 'V');
    const ti = ctx.trace('i', 'A');
    const tp = ctx.trace('p', 'W');
    const peaks = new PeakTracker(['v', 'i', 'p'], ['V', 'A', 'W']);
    // Energy by the trapezoidal rule over the recorded samples: state[0] last power, [1] last t, [2] energy, [3] count.
    const acc = new Float64Array(4);
    return {
      sample(state) {
        const v = state.partVoltage(h);
        const i = state.partCurrent(h);
        const pw = v * i;
        const t = state.tS;
        state.record(tv, v);
        state.record(ti, i);
        state.record(tp, pw);
        peaks.add(0, v, t);
        peaks.add(1, i, t);
        peaks.add(2, pw, t);
        if (acc[3] > 0) acc[2] += 0.5 * (pw + acc[0]) * (t - acc[1]);
        acc[0] = pw;
        acc[1] = t;
        acc[3] += 1;
      },
      finish: () => ({ peaks: peaks.result(), energyJ: acc[2] }),
    };
  },
});
