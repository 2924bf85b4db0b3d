/**
 * Ring-buffer layout of the travelling waves, widened after compile for a partitioned run.
 *
 * Mode q of a line keeps its last L_q wave samples, L_q = nextPow2(k_q + 2 + extra): a reader at
 * step n needs the samples of steps n - k_q and n - k_q - 1, and a writer at step n overwrites
 * step n - L_q. On one thread the writer is never ahead of the reader, so extra = 0 is enough.
 * A line whose ends belong to different threads is written by one thread while the other may be
 * up to K - 1 steps behind within the same block (K steps per block), so it needs extra >= K - 1;
 * a replay one block behind the workers that reads waves needs 2 K.
 */
import type { Plan } from './compile.ts';

/** Samples a mode of whole-step delay k keeps with `extra` steps more history: nextPow2(k + 2 + extra). */
export function ringLength(k: number, extra: number): number {
  let p = 1;
  while (p < k + 2 + extra) p <<= 1;
  return p;
}

/**
 * Re-lays the rings with `extra[line]` more steps of history per line and points every port at the new offsets. Deterministic: the same plan
 * and `extra` give the same layout on every thread. The plan's waves are reset to zero.
 * @param extra steps of extra history per line index.
 */
export function widenRings(plan: Plan, extra: Int32Array): void {
  const nLines = plan.scenario.lines.length;
  let waveLen = 0;
  for (let i = 0; i < nLines; i++) {
    for (let q = plan.lineModeOff[i]; q < plan.lineModeOff[i + 1]; q++) {
      const len = ringLength(plan.delays[q].k, extra[i]);
      plan.ringMask[q] = len - 1;
      plan.fwdOff[q] = waveLen;
      waveLen += len;
      plan.bwdOff[q] = waveLen;
      waveLen += len;
    }
  }
  for (let p = 0; p < plan.nPorts; p++) {
    const q = plan.lineModeOff[plan.pLine[p]] + plan.pMode[p];
    const atFrom = plan.pEnd[p] === 0;
    plan.pIn[p] = atFrom ? plan.bwdOff[q] : plan.fwdOff[q];
    plan.pOut[p] = atFrom ? plan.fwdOff[q] : plan.bwdOff[q];
    plan.pInMask[p] = plan.ringMask[q];
    plan.pOutMask[p] = plan.ringMask[q];
  }
  plan.wave = new Float64Array(waveLen);
}
