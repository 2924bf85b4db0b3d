/**
 * `voltage-between`: v(plus) - v(minus) for two nodes anywhere in the network.
 */
import { defineProbe } from '@skein/core';
import { PeakTracker } from './peaks.ts';

/**
 * The differential voltage probe. Params: plus, minus (each "junction.node"; they may sit in
 * different junctions, then the difference is between two reference-based voltages at the same instant).
 * Trace: `v` [V]. Finish output: { peaks: { v: {...} } }.
 * @example probes: { vd: { probe: voltage-between, plus: J1.a, minus: J2.a } }
 */
export const voltageBetweenProbe = defineProbe({
  type: 'voltage-between',
  summary: 'Voltage between two nodes (plus minus minus), possibly in different junctions',
  params: {
    plus: { kind: 'string', summary: 'the plus node, as "junction.node"' },
    minus: { kind: 'string', summary: 'the minus node, as "junction.node"' },
  },
  create(p, ctx) {
    const a = ctx.node(p.plus, 'plus');
    const b = ctx.node(p.minus, 'minus');
    const tv = ctx.trace('v', 'V');
    const peaks = new PeakTracker(['v'], ['V']);
    return {
      sample(state) {
        const v = state.nodeVoltage(a) - state.nodeVoltage(b);
        state.record(tv, v);
        peaks.add(0, v, state.tS);
      },
      finish: () => ({ peaks: peaks.result() }),
    };
  },
});
