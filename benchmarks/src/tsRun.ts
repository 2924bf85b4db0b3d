/**
 * Runs core's TypeScript stepping kernels over a generated network, the same way the C twin runs
 * its copies (benchmarks/c/kernel.c): a warm-up run, state zeroed, then the timed run.
 */
import { junctionStep } from '../../packages/core/src/kernel/junctionStep.ts';
import { junctionStepBlocked } from '../../packages/core/src/kernel/junctionStepBlocked.ts';
import { junctionStepFourNodeBlocked } from '../../packages/core/src/kernel/junctionStepFourNodeBlocked.ts';
import { junctionStepOneNodeUnrolled } from '../../packages/core/src/kernel/junctionStepOneNodeUnrolled.ts';
import { junctionStepScalar } from '../../packages/core/src/kernel/junctionStepScalar.ts';
import { junctionStepScalarBlocked } from '../../packages/core/src/kernel/junctionStepScalarBlocked.ts';
import type { KernelRun } from './cTwin.ts';
import type { KernelNet } from './generate.ts';

/**
 * Advances a network nSteps steps from the current state with the reference (nB = 1) or the
 * temporally blocked kernel (nB > 1 steps per junction visit; needs nB <= net.kMin and
 * nB <= net.maxBlockSteps). `fast` uses the unrolled one-node (kind 0) or four-node (kind 1) fast path
 * with nB steps per visit (nB = 1 allowed); generated networks have one node per conductor.
 * @param kind 0: one-conductor kernel, 1: general kernel.
 * @throws Error when nB is larger than the network allows.
 */
export function stepNet(net: KernelNet, kind: 0 | 1, nSteps: number, nB: number, slotRows: Float64Array, fast = false): void {
  const t = net;
  if (nB > 1 && (nB > t.kMin || nB > t.maxBlockSteps)) throw new Error(`benchmarks: nB = ${nB} exceeds the shortest delay (${t.kMin}) or what the rings were sized for (${t.maxBlockSteps})`);
  const nJ = t.nJunctions;
  const nSlot = t.slot.length;
  if (fast) {
    for (let n0 = 0; n0 < nSteps; n0 += nB) {
      const b = Math.min(nB, nSteps - n0);
      if (kind === 0) {
        junctionStepOneNodeUnrolled(0, nJ, n0, b, t.jPort, t.jX, t.jK, t.jEx, t.pIn, t.pInMask, t.pK, t.pF, t.pOut, t.pOutMask,
          t.pY2, t.exRow, t.exSlot, t.exCoef, slotRows, nSlot, 0, t.mat, t.wave, t.inc, t.x, 0, 0);
      } else {
        junctionStepFourNodeBlocked(0, nJ, n0, b, t.jPort, t.jX, t.jB, t.jK, t.jA, t.jEx, t.pIn, t.pInMask, t.pK, t.pF,
          t.pOut, t.pOutMask, t.exRow, t.exSlot, t.exCoef, slotRows, nSlot, 0, t.mat, t.wave, t.inc, t.x, 0, 0);
      }
    }
    return;
  }
  if (nB <= 1) {
    for (let n = 0; n < nSteps; n++) {
      if (kind === 0) {
        junctionStepScalar(0, nJ, n, t.jPort, t.jX, t.jK, t.jEx, t.pIn, t.pInMask, t.pK, t.pF, t.pOut, t.pOutMask,
          t.pNode, t.pY2, t.exRow, t.exSlot, t.exCoef, t.slot, t.mat, t.wave, t.rhs, t.inc, t.x);
      } else {
        junctionStep(0, nJ, n, t.jPort, t.jX, t.jN, t.jB, t.jK, t.jA, t.jEx, t.pIn, t.pInMask, t.pK, t.pF,
          t.pOut, t.pOutMask, t.exRow, t.exSlot, t.exCoef, t.slot, t.mat, t.wave, t.rhs, t.inc, t.x);
      }
    }
    return;
  }
  for (let n0 = 0; n0 < nSteps; n0 += nB) {
    const b = Math.min(nB, nSteps - n0);
    if (kind === 0) {
      junctionStepScalarBlocked(0, nJ, n0, b, t.jPort, t.jX, t.jK, t.jEx, t.pIn, t.pInMask, t.pK, t.pF, t.pOut, t.pOutMask,
        t.pNode, t.pY2, t.exRow, t.exSlot, t.exCoef, slotRows, nSlot, 0, t.mat, t.wave, t.rhs, t.inc, t.x, 0, 0);
    } else {
      junctionStepBlocked(0, nJ, n0, b, t.jPort, t.jX, t.jN, t.jB, t.jK, t.jA, t.jEx, t.pIn, t.pInMask, t.pK, t.pF,
        t.pOut, t.pOutMask, t.exRow, t.exSlot, t.exCoef, slotRows, nSlot, 0, t.mat, t.wave, t.rhs, t.inc, t.x, 0, 0);
    }
  }
}

/** Source values for each step of a block: the (constant) slot row repeated nB times. */
export function slotRowsFor(net: KernelNet, nB: number): Float64Array {
  const rows = new Float64Array(Math.max(1, net.slot.length * nB));
  for (let r = 0; r < nB; r++) rows.set(net.slot, r * net.slot.length);
  return rows;
}

/** Zeroes the stepping state (waves, incident waves, node voltages). */
export function resetNet(net: KernelNet): void {
  net.wave.fill(0);
  net.inc.fill(0);
  net.x.fill(0);
  net.rhs.fill(0);
}

/**
 * Warm-up run of nWarm steps, then reps times: state zeroed, nSteps timed steps. Returns the
 * shortest time, the checksum and copies of the final wave and x; the network holds the final
 * state afterwards.
 * @example runTs(net, 0, 200, 1, 20).seconds
 */
export function runTs(net: KernelNet, kind: 0 | 1, nSteps: number, nB: number, nWarm: number, fast = false, reps = 1): KernelRun {
  const rows = slotRowsFor(net, Math.max(1, nB));
  resetNet(net);
  stepNet(net, kind, nWarm, nB, rows, fast);
  let seconds = Infinity;
  for (let r = 0; r < reps; r++) {
    resetNet(net);
    const t0 = process.hrtime.bigint();
    stepNet(net, kind, nSteps, nB, rows, fast);
    seconds = Math.min(seconds, Number(process.hrtime.bigint() - t0) * 1e-9);
  }
  let checksum = 0;
  for (let i = 0; i < net.x.length; i++) checksum += net.x[i];
  return { seconds, checksum, wave: net.wave.slice(), x: net.x.slice() };
}
