import { describe, expect, it } from 'vitest';
import { compileScenario, resolveScenarioText, type Plan } from '../../index.ts';
import { testRegistry } from '../../__tests__/fixtures.ts';
import { junctionStep } from '../junctionStep.ts';
import { junctionStepScalar } from '../junctionStepScalar.ts';

// A small branched network of one-conductor lines with sources, loads and fractional delays.
const NET = `
skein: 1
time: { end: 50ns, step: 0.3ns }
lines:
  a: { from: J0, to: J1, length: 1.1m, impedance: 50ohm, velocity: 2e8m/s }
  b: { from: J1, to: J2, length: 0.7m, impedance: 75ohm, velocity: 2e8m/s }
  c: { from: J1, to: J3, length: 2.3m, impedance: 120ohm, velocity: 1.5e8m/s }
  d: { from: J3, to: J2, length: 0.9m, impedance: 90ohm, velocity: 2.5e8m/s }
junctions:
  J0:
    nodes: { s: [a] }
    parts: { g: { source: test-step, between: [s, ref], amplitude: 1, resistance: 20ohm } }
  J1:
    nodes: { m: [a, b], n: [c] }
    parts: { Rmn: { load: test-resistor, between: [m, n], resistance: 33ohm }, Rn: { load: test-resistor, between: [n, ref], resistance: 500ohm } }
  J2:
    nodes: { e: [b, d] }
    parts: { Re: { load: test-resistor, between: [e, ref], resistance: 10ohm } }
  J3:
    nodes: { f: [c], h: [d] }
    parts: { Rf: { load: test-resistor, between: [f, h], resistance: 1ohm }, Rh: { load: test-resistor, between: [h, ref], resistance: 1000ohm } }
`;

async function plan(): Promise<Plan> {
  const registry = testRegistry();
  return compileScenario(resolveScenarioText(NET, { registry }), { registry });
}

function fill(p: Plan, seed: number): void {
  let s = seed;
  for (let i = 0; i < p.wave.length; i++) p.wave[i] = ((s = (s * 16807) % 2147483647) / 2147483647) - 0.5;
  p.slot.fill(0.7);
}

function general(p: Plan, j0: number, j1: number, n: number): number {
  return junctionStep(j0, j1, n, p.jPort, p.jX, p.jN, p.jB, p.jK, p.jA, p.jEx, p.pIn, p.pInMask, p.pK, p.pF, p.pOut, p.pOutMask,
    p.exRow, p.exSlot, p.exCoef, p.slot, p.mat, p.wave, p.rhs, p.inc, p.x);
}

function scalar(p: Plan, j0: number, j1: number, n: number): number {
  return junctionStepScalar(j0, j1, n, p.jPort, p.jX, p.jK, p.jEx, p.pIn, p.pInMask, p.pK, p.pF, p.pOut, p.pOutMask, p.pNode, p.pY2,
    p.exRow, p.exSlot, p.exCoef, p.slot, p.mat, p.wave, p.rhs, p.inc, p.x);
}

describe('junctionStepScalar', () => {
  it('gives bit-identical results to the general junction kernel', async () => {
    const a = await plan();
    const b = await plan();
    expect(Array.from(a.jScalar)).toEqual([1, 1, 1, 1]);
    expect(Array.from(a.pF).some((f) => f > 0)).toBe(true);
    fill(a, 11);
    fill(b, 11);
    for (let n = 0; n < 200; n++) {
      expect(scalar(a, 0, a.nJunctions, n)).toBe(4);
      expect(general(b, 0, b.nJunctions, n)).toBe(4);
    }
    expect(Array.from(a.wave)).toEqual(Array.from(b.wave));
    expect(Array.from(a.x)).toEqual(Array.from(b.x));
  });

  it('updates nothing for an empty range and only its own junctions for a sub-range', async () => {
    const p = await plan();
    fill(p, 3);
    p.x.fill(NaN);
    expect(scalar(p, 2, 2, 5)).toBe(0);
    expect(general(p, 2, 2, 5)).toBe(0);
    expect(p.x.every((v) => Number.isNaN(v))).toBe(true);
    expect(scalar(p, 1, 3, 5)).toBe(2);
    for (let j = 0; j < p.nJunctions; j++) {
      for (let i = p.jX[j]; i < p.jX[j + 1]; i++) expect(Number.isNaN(p.x[i])).toBe(j === 0 || j === 3);
    }
  });
});

describe('junctionStep', () => {
  it('conserves power at a junction: sum of v*i over line ends and parts is zero', async () => {
    // Tellegen's theorem at one junction, one step: the kernel's node voltages satisfy KCL.
    const p = await plan();
    fill(p, 5);
    general(p, 0, p.nJunctions, 9);
    // J2: one node e with lines b (to end) and d (to end) and Re to ref.
    const j = 2;
    const e = p.x[p.jX[j]];
    let iLines = 0;
    for (let q = p.jPort[j]; q < p.jPort[j + 1]; q++) {
      const out = p.wave[p.pOut[q] + (9 & p.pOutMask[q])];
      iLines += (out - p.inc[q]) * (p.pY2[q] / 2);
    }
    const iLoad = e / 10;
    expect(Math.abs(iLines + iLoad)).toBeLessThan(1e-14);
  });
});
