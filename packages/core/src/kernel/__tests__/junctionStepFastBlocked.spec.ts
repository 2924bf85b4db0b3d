import { describe, expect, it } from 'vitest';
import type { Plan } from '../../compile/compile.ts';
import { junctionStepBlocked } from '../junctionStepBlocked.ts';
import { junctionStepFourNodeBlocked } from '../junctionStepFourNodeBlocked.ts';
import { junctionStepOneNodeBlocked } from '../junctionStepOneNodeBlocked.ts';
import { junctionStepOneNodeUnrolled } from '../junctionStepOneNodeUnrolled.ts';
import { junctionStepScalarBlocked } from '../junctionStepScalarBlocked.ts';
import { compileWide, fourScenario, hubScenario, scalarScenario } from './blockedFixtures.ts';

// The fast paths keep sums in locals but perform the same operations in the same order as the
// blocked reference loops (which are themselves bit-identical to the step-by-step kernels), so
// the comparisons are exact (Object.is per element, which also tells -0 from 0).

function bitsEqual(a: Float64Array, b: Float64Array): boolean {
  if (a.length !== b.length) return false;
  for (let i = 0; i < a.length; i++) if (!Object.is(a[i], b[i])) return false;
  return true;
}

type Stepper = (p: Plan, n0: number, b: number, slot: Float64Array, xs: Float64Array, xOff: number) => void;

/** Runs nSteps in blocks of nB; slot rows at offset 2 with stride 3 (other entries NaN); x per step. */
function run(plan: Plan, nSteps: number, nB: number, step: Stepper): Float64Array {
  const nX = plan.x.length;
  const nW = plan.waveforms.length;
  const slot = new Float64Array(2 + 3 * nB).fill(NaN);
  const xs = new Float64Array(nSteps * nX);
  for (let n0 = 0; n0 < nSteps; n0 += nB) {
    const b = Math.min(nB, nSteps - n0);
    for (let r = 0; r < b; r++) for (let w = 0; w < nW; w++) slot[2 + 3 * r + plan.waveforms[w].slot] = plan.waveforms[w].instance.value((n0 + r) * plan.dtS);
    step(plan, n0, b, slot, xs, n0 * nX);
  }
  return xs;
}

const scalarRef: Stepper = (p, n0, b, slot, xs, xOff) => {
  junctionStepScalarBlocked(0, p.nJunctions, n0, b, p.jPort, p.jX, p.jK, p.jEx, p.pIn, p.pInMask, p.pK, p.pF, p.pOut, p.pOutMask,
    p.pNode, p.pY2, p.exRow, p.exSlot, p.exCoef, slot, 3, 2, p.mat, p.wave, p.rhs, p.inc, xs, p.x.length, xOff);
};
const oneNode: Stepper = (p, n0, b, slot, xs, xOff) => {
  expect(junctionStepOneNodeBlocked(0, p.nJunctions, n0, b, p.jPort, p.jX, p.jK, p.jEx, p.pIn, p.pInMask, p.pK, p.pF, p.pOut, p.pOutMask,
    p.pY2, p.exRow, p.exSlot, p.exCoef, slot, 3, 2, p.mat, p.wave, p.inc, xs, p.x.length, xOff)).toBe(p.nJunctions * b);
};
const unrolled: Stepper = (p, n0, b, slot, xs, xOff) => {
  expect(junctionStepOneNodeUnrolled(0, p.nJunctions, n0, b, p.jPort, p.jX, p.jK, p.jEx, p.pIn, p.pInMask, p.pK, p.pF, p.pOut, p.pOutMask,
    p.pY2, p.exRow, p.exSlot, p.exCoef, slot, 3, 2, p.mat, p.wave, p.inc, xs, p.x.length, xOff)).toBe(p.nJunctions * b);
};
const generalRef: Stepper = (p, n0, b, slot, xs, xOff) => {
  junctionStepBlocked(0, p.nJunctions, n0, b, p.jPort, p.jX, p.jN, p.jB, p.jK, p.jA, p.jEx, p.pIn, p.pInMask, p.pK, p.pF,
    p.pOut, p.pOutMask, p.exRow, p.exSlot, p.exCoef, slot, 3, 2, p.mat, p.wave, p.rhs, p.inc, xs, p.x.length, xOff);
};
const fourNode: Stepper = (p, n0, b, slot, xs, xOff) => {
  expect(junctionStepFourNodeBlocked(0, p.nJunctions, n0, b, p.jPort, p.jX, p.jB, p.jK, p.jA, p.jEx, p.pIn, p.pInMask, p.pK, p.pF,
    p.pOut, p.pOutMask, p.exRow, p.exSlot, p.exCoef, slot, 3, 2, p.mat, p.wave, p.inc, xs, p.x.length, xOff)).toBe(p.nJunctions * b);
};

describe('junctionStepOneNodeBlocked', () => {
  it('gives bit-identical results to junctionStepScalarBlocked on one-node junctions', async () => {
    for (const nB of [1, 3, 6]) {
      const a = await compileWide(scalarScenario, 6);
      const b = await compileWide(scalarScenario, 6);
      const xa = run(a.plan, 300, nB, scalarRef);
      const xb = run(b.plan, 300, nB, oneNode);
      expect(Math.max(...xa.map(Math.abs))).toBeGreaterThan(0.05);
      expect(bitsEqual(xb, xa)).toBe(true);
      expect(bitsEqual(b.plan.wave, a.plan.wave)).toBe(true);
    }
  });
});

describe('junctionStepOneNodeUnrolled', () => {
  it('gives bit-identical results to junctionStepScalarBlocked for junctions of one to five line ends', async () => {
    for (const text of [scalarScenario, hubScenario]) {
      const probe = await compileWide(text, 6);
      const degrees = new Set(Array.from({ length: probe.plan.nJunctions }, (_, j) => probe.plan.jPort[j + 1] - probe.plan.jPort[j]));
      expect(probe.kMin).toBeGreaterThanOrEqual(6);
      for (const nB of [1, 4, 6]) {
        const a = await compileWide(text, 6);
        const b = await compileWide(text, 6);
        const xa = run(a.plan, 300, nB, scalarRef);
        const xb = run(b.plan, 300, nB, unrolled);
        expect(Math.max(...xa.map(Math.abs))).toBeGreaterThan(0.05);
        expect(bitsEqual(xb, xa)).toBe(true);
        expect(bitsEqual(b.plan.wave, a.plan.wave)).toBe(true);
        // inc holds the incident waves of the last step, as the reference leaves it.
        expect(bitsEqual(b.plan.inc, a.plan.inc)).toBe(true);
      }
      if (text === hubScenario) expect([...degrees].sort()).toEqual([1, 4, 5]);
    }
  });
});

describe('junctionStepFourNodeBlocked', () => {
  it('gives bit-identical results to junctionStepBlocked on four-node junctions with sources on two rows', async () => {
    const probe = await compileWide(fourScenario, 8);
    expect(probe.plan.jN.every((n) => n === 4)).toBe(true);
    expect(probe.kMin).toBeGreaterThanOrEqual(8);
    for (const nB of [1, 4, 8]) {
      const a = await compileWide(fourScenario, 8);
      const b = await compileWide(fourScenario, 8);
      const xa = run(a.plan, 300, nB, generalRef);
      const xb = run(b.plan, 300, nB, fourNode);
      expect(Math.max(...xa.map(Math.abs))).toBeGreaterThan(0.05);
      expect(bitsEqual(xb, xa)).toBe(true);
      expect(bitsEqual(b.plan.wave, a.plan.wave)).toBe(true);
    }
  });
});
