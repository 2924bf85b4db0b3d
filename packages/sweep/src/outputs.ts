/**
 * Named outputs of one case, taken from its run result: a trace's peak, its value at a time, the
 * arrival time of a level, the energy a part took from the energy ledger, or any number in a
 * probe's structured output.
 */
import { SkeinError, type RunResult } from '@skein/core';
import { getAt } from './paths.ts';
import type { OutputSpec } from './spec.ts';

function traceSamples(r: RunResult, spec: OutputSpec & { trace: string }): Float64Array {
  const i = r.traceNames.indexOf(spec.trace);
  if (i < 0) {
    throw new SkeinError('E_OUTPUT', `output ${spec.name}: the run has no trace ${spec.trace}; traces: ${r.traceNames.join(', ')}`, { output: spec.name, trace: spec.trace });
  }
  return r.traces.data.subarray(i * r.nSamples, (i + 1) * r.nSamples);
}

/**
 * Evaluates one output on a run result.
 * - peak: max |v| over the recorded samples;
 * - value-at: v at time t, linear between the two recorded samples around t;
 * - arrival: the first time |v| reaches the threshold, linear between the samples around the
 *   crossing; NaN when it never does;
 * - energy: the ledger probe's absorbed (or delivered, stored) energy of a part or line [J];
 * - output: the number at a path in a probe's structured output.
 * @throws SkeinError E_OUTPUT when the trace, probe, part or path does not exist or is not a number.
 * @example outputValue(result, { name: 'vPeak', kind: 'peak', trace: 'vl.v' }) // 0.8889
 */
export function outputValue(r: RunResult, spec: OutputSpec): number {
  switch (spec.kind) {
    case 'peak': {
      const v = traceSamples(r, spec);
      let m = 0;
      for (let k = 0; k < v.length; k++) {
        const a = Math.abs(v[k]);
        if (a > m) m = a;
      }
      return m;
    }
    case 'value-at': {
      const v = traceSamples(r, spec);
      const dt = r.dtS * r.recordEvery;
      const x = spec.timeS / dt;
      const k = Math.floor(x);
      if (k > v.length - 1 || (k === v.length - 1 && x > k + 1e-9)) {
        throw new SkeinError('E_OUTPUT', `output ${spec.name}: time ${spec.timeS} s is after the last recorded sample at ${(v.length - 1) * dt} s`, { output: spec.name });
      }
      if (k >= v.length - 1) return v[v.length - 1];
      return v[k] + (x - k) * (v[k + 1] - v[k]);
    }
    case 'arrival': {
      const v = traceSamples(r, spec);
      const dt = r.dtS * r.recordEvery;
      for (let k = 0; k < v.length; k++) {
        const a = Math.abs(v[k]);
        if (a >= spec.threshold) {
          if (k === 0) return 0;
          const b = Math.abs(v[k - 1]);
          return (k - 1 + (spec.threshold - b) / (a - b)) * dt;
        }
      }
      return NaN;
    }
    case 'energy': {
      const out = r.outputs[spec.probe] as Record<string, unknown> | undefined;
      const table = out?.[spec.of] as Record<string, unknown> | undefined;
      const x = table?.[spec.part];
      if (typeof x !== 'number') {
        const known = table && typeof table === 'object' ? Object.keys(table).join(', ') : '(probe has no energy ledger output)';
        throw new SkeinError('E_OUTPUT', `output ${spec.name}: probe ${spec.probe} has no ${spec.of} energy for ${spec.part}; known: ${known}`, { output: spec.name });
      }
      return x;
    }
    case 'output': {
      const out = r.outputs[spec.probe];
      const x = getAt(out, spec.path);
      if (typeof x !== 'number') {
        throw new SkeinError('E_OUTPUT', `output ${spec.name}: probe ${spec.probe} output at ${spec.path.join('.')} is not a number (got ${x === undefined ? 'nothing' : JSON.stringify(x)})`, { output: spec.name });
      }
      return x;
    }
  }
}
