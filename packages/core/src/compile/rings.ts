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
  const modeK = Int32Array.from(plan.delays, (d) => d.k);
  const waveLen = layRings(plan.lineModeOff, modeK, extra, plan.fwdOff, plan.bwdOff, plan.ringMask);
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

/**
 * Lays out the forward and backward ring of every mode, line by line, mode by mode.
 * @param lineModeOff first mode of each line (nLines + 1 entries)
 * @param modeK whole-step delay of each mode
 * @param extra extra history per line, or undefined for none
 * @returns the length of the wave store; fills fwdOff, bwdOff and ringMask (length - 1).
 */
export function layRings(
  lineModeOff: Int32Array, modeK: ArrayLike<number>, extra: ArrayLike<number> | undefined,
  fwdOff: Int32Array, bwdOff: Int32Array, ringMask: Int32Array,
): number {
  let waveLen = 0;
  for (let i = 0; i + 1 < lineModeOff.length; i++) {
    for (let q = lineModeOff[i]; q < lineModeOff[i + 1]; q++) {
      const len = ringLength(modeK[q], extra ? extra[i] : 0);
      ringMask[q] = len - 1;
      fwdOff[q] = waveLen;
      waveLen += len;
      bwdOff[q] = waveLen;
      waveLen += len;
    }
  }
  return waveLen;
}
