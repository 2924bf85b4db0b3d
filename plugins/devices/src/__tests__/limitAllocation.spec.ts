import v8 from 'node:v8';
import vm from 'node:vm';
import { describe, expect, it } from 'vitest';
import type { NonlinearLoadInstance } from '@skein/core';
import { diodeLoad, tvsClampLoad, varistorLoad } from '../index.ts';
import { makeLoad } from './helpers.ts';

// The conformance suite measures evaluate and accept but not limit, which the engine calls at
// every Newton update. Same method as the suite (heap growth over chunks, least of three passes),
// same bound: 256 KiB over 1e5 calls, a sixth of one boxed double (16 B) per call.
v8.setFlagsFromString('--expose-gc');
const gc = vm.runInNewContext('gc') as () => void;

function growth(inst: NonlinearLoadInstance, scale: number): number {
  const loop = new Function('inst', 'n', 'k0', 's', 'let acc = 0; for (let k = k0; k < k0 + n; k++) { const v = s * Math.sin(0.01 * k); acc += inst.limit(1.5 * v + s * 0.1, v); } return acc;') as (i: unknown, n: number, k0: number, s: number) => number;
  let k = 0;
  for (let c = 0; c < 50; c++, k += 1000) loop(inst, 1000, k, scale);
  let least = Infinity;
  for (let pass = 0; pass < 3; pass++) {
    gc();
    let grown = 0;
    let last = process.memoryUsage().heapUsed;
    for (let c = 0; c < 100; c++, k += 1000) {
      loop(inst, 1000, k, scale);
      const now = process.memoryUsage().heapUsed;
      if (now > last) grown += now - last;
      last = now;
    }
    least = Math.min(least, grown);
  }
  return least;
}

describe('JunctionDevice', () => {
  it('limits Newton updates without allocating (diode, TVS clamp both polarities)', () => {
    expect(growth(makeLoad(diodeLoad, { seriesResistance: 0.1 }), 1)).toBeLessThan(262_144);
    expect(growth(makeLoad(tvsClampLoad, {}), 40)).toBeLessThan(262_144);
    expect(growth(makeLoad(tvsClampLoad, { polarity: 'unidirectional' }), 40)).toBeLessThan(262_144);
  });
});

describe('VaristorDevice', () => {
  it('limits Newton updates without allocating', () => {
    expect(growth(makeLoad(varistorLoad, {}), 600)).toBeLessThan(262_144);
  });
});
