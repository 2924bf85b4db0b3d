/**
 * `node-voltage`: the voltage of one junction node to the reference.
 */
import { defineProbe, type NodeHandle } from '@skein/core';
import { PeakTracker } from './peaks.ts';

/**
 * The node voltage probe. Params: node ("junction.node"). Trace: `v` [V].
 * Finish output: { peaks: { v: { unit, max, maxAtS, min, minAtS, peak, peakAtS } } }.
 * @example probes: { vin: { probe: node-voltage, node: J1.in } } // trace vin.v
 */
export const nodeVoltageProbe = defineProbe({
  type: 'node-voltage',
  summary: 'Voltage of a junction node to the reference',
  params: {
    node: { kind: 'string', summary: 'the node, as "junction.node" (e.g. J1.in)' },
  },
  create(p, ctx) {
    const node: NodeHandle = ctx.node(p.node, 'node');
    const tv = ctx.trace('v', 'V');
    const peaks = new PeakTracker(['v'], ['V']);
    return {
      sample(state) {
        const v = state.nodeVoltage(node);
        state.record(tv, v);
        peaks.add(0, v, state.tS);
      },
      finish: () => ({ peaks: peaks.result() }),
    };
  },
});
