import { describe, expect, it } from 'vitest';
import type { Plan } from '../../compile/compile.ts';
import { junctionStep } from '../junctionStep.ts';
import { junctionStepBlocked } from '../junctionStepBlocked.ts';
import { compileWide, coupledScenario } from './blockedFixtures.ts';

// The blocked kernel performs, per junction and step, the same floating-point operations in the
// same order as junctionStep; only the order of junction visits changes, which the
// method-of-characteristics update allows (a wave written at step m is read no earlier than
// m + kMin). So every comparison below is exact (toEqual on Float64Array compares each element,
// and Object.is distinguishes -0).

function bitsEqual(a: Float64Array, b: Float64Array): boolean {
  if (a.length !== b.length) return false;
  for (let i = 0; i < a.length; i++) if (!Object.is(a[i], b[i])) return false;
  return true;
}

/** Runs the reference kernel nSteps steps; returns x after every step (nSteps x nX). */
function reference(plan: Plan, nSteps: number): Float64Array {
  const p = plan;
  const nX = p.x.length;
  const xs = new Float64Array(nSteps * nX);
  for (let n = 0; n < nSteps; n++) {
    p.slot[0] = p.waveforms[0].instance.value(n * p.dtS);
    junctionStep(0, p.nJunctions, n, p.jPort, p.jX, p.jN, p.jB, p.jK, p.jA, p.jEx, p.pIn, p.pInMask, p.pK, p.pF,
      p.pOut, p.pOutMask, p.exRow, p.exSlot, p.exCoef, p.slot, p.mat, p.wave, p.rhs, p.inc, p.x);
    xs.set(p.x, n * nX);
  }
  return xs;
}

/**
 * Runs the blocked kernel in blocks of nB with slot rows placed at slotOff with stride slotStride
 * (unused slot entries hold NaN) and x rows written per step at xOff with stride nX.
 */
function blocked(plan: Plan, nSteps: number, nB: number, slotOff: number, slotStride: number, xOff: number): Float64Array {
  const p = plan;
  const nX = p.x.length;
  const slot = new Float64Array(slotOff + nB * slotStride).fill(NaN);
  const xs = new Float64Array(xOff + nSteps * nX).fill(NaN);
  for (let n0 = 0; n0 < nSteps; n0 += nB) {
    const b = Math.min(nB, nSteps - n0);
    for (let r = 0; r < b; r++) slot[slotOff + r * slotStride] = p.waveforms[0].instance.value((n0 + r) * p.dtS);
    const done = junctionStepBlocked(0, p.nJunctions, n0, b, p.jPort, p.jX, p.jN, p.jB, p.jK, p.jA, p.jEx, p.pIn, p.pInMask,
      p.pK, p.pF, p.pOut, p.pOutMask, p.exRow, p.exSlot, p.exCoef, slot, slotStride, slotOff, p.mat, p.wave, p.rhs, p.inc,
      xs, nX, xOff + n0 * nX);
    expect(done).toBe(p.nJunctions * b);
  }
  return xs.subarray(xOff);
}

describe('junctionStepBlocked', () => {
  it('gives bit-identical waves and node voltages to junctionStep for every block length up to the shortest delay', async () => {
    const nSteps = 250;
    const ref = await compileWide(coupledScenario, 8);
    expect(ref.kMin).toBe(8);
    expect(ref.plan.pF.some((f) => f > 0)).toBe(true);
    const xRef = reference(ref.plan, nSteps);
    // The comparison can fail: the response is not trivial (the step reached the far loads).
    expect(Math.max(...xRef.subarray((nSteps - 1) * ref.plan.x.length).map(Math.abs))).toBeGreaterThan(0.05);
    for (const nB of [1, 2, 5, 8]) {
      const b = await compileWide(coupledScenario, 8);
      const xB = blocked(b.plan, nSteps, nB, 3, 2, 4);
      expect(bitsEqual(xB, xRef)).toBe(true);
      expect(bitsEqual(b.plan.wave, ref.plan.wave)).toBe(true);
    }
  });

  it('differs from the reference when the block is longer than the shortest delay', async () => {
    // Shows the comparison above is sharp: with nB > kMin a junction reads waves not yet written.
    const nSteps = 250;
    const ref = await compileWide(coupledScenario, 14);
    const xRef = reference(ref.plan, nSteps);
    const b = await compileWide(coupledScenario, 14);
    const xB = blocked(b.plan, nSteps, 14, 0, 1, 0);
    expect(bitsEqual(xB, xRef)).toBe(false);
  });

  it('keeps only the last step of a block with xStride 0 and leaves junctions outside [j0, j1) alone', async () => {
    const { plan: p } = await compileWide(coupledScenario, 8);
    p.x.fill(NaN);
    const slot = Float64Array.of(1, 1, 1, 1, 1, 1);
    const done = junctionStepBlocked(1, 3, 0, 6, p.jPort, p.jX, p.jN, p.jB, p.jK, p.jA, p.jEx, p.pIn, p.pInMask, p.pK, p.pF,
      p.pOut, p.pOutMask, p.exRow, p.exSlot, p.exCoef, slot, 1, 0, p.mat, p.wave, p.rhs, p.inc, p.x, 0, 0);
    expect(done).toBe(12);
    // Junctions 1 and 2 (H, P) have no source and see no wave yet: their x is exactly 0.
    for (let j = 0; j < p.nJunctions; j++) {
      for (let i = p.jX[j]; i < p.jX[j + 1]; i++) {
        if (j === 1 || j === 2) expect(p.x[i]).toBe(0);
        else expect(Number.isNaN(p.x[i])).toBe(true);
      }
    }
  });

  it('does nothing for nB = 0 or an empty junction range', async () => {
    const { plan: p } = await compileWide(coupledScenario, 8);
    p.x.fill(NaN);
    const slot = Float64Array.of(1);
    const args = [p.jPort, p.jX, p.jN, p.jB, p.jK, p.jA, p.jEx, p.pIn, p.pInMask, p.pK, p.pF, p.pOut, p.pOutMask, p.exRow, p.exSlot, p.exCoef] as const;
    expect(junctionStepBlocked(0, p.nJunctions, 0, 0, ...args, slot, 0, 0, p.mat, p.wave, p.rhs, p.inc, p.x, 0, 0)).toBe(0);
    expect(junctionStepBlocked(2, 2, 0, 6, ...args, slot, 0, 0, p.mat, p.wave, p.rhs, p.inc, p.x, 0, 0)).toBe(0);
    expect(p.x.every(Number.isNaN)).toBe(true);
    expect(p.wave.every((w) => w === 0)).toBe(true);
  });
});
