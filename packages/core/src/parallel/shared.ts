/**
 * The shared memory of a partitioned run and its block protocol.
 *
 * Control words (Int32, SharedArrayBuffer): GO is set to 1 when every worker is ready; DONE
 * counts finished worker-blocks; REPLAYED counts the blocks the main thread has replayed; ERROR is
 * set by a failing worker or by the main thread to stop. Block b covers steps [b K, (b + 1) K).
 * A worker starts block b once DONE >= workers * b (every worker finished block b - 1: the waves
 * it reads from other threads are written) and REPLAYED >= b - 1 (block b - 2, whose history rows
 * block b overwrites, is replayed); it steps its own junctions, writes its node voltages, slots
 * and device currents of every step into history buffer b mod 2, then adds 1 to DONE. The
 * workers thus meet each other directly; the main thread waits for DONE >= workers * (b + 1),
 * replays block b from the history (parts, ledger, probes) while the workers compute b + 1, and
 * stores REPLAYED = b + 1. Waves cross partitions through the shared ring buffers: a line
 * crossing threads has a delay of at least K steps, so a wave read in block b + 1 was written in
 * block b or earlier, before the DONE that released b + 1 (Atomics order the accesses).
 */

export const GO = 0;
export const DONE = 1;
export const ERROR = 2;
export const REPLAYED = 3;
export const CONTROL_WORDS = 4;

/** Buffers shared between the main thread and the workers. */
export interface SharedBuffers {
  control: SharedArrayBuffer;
  wave: SharedArrayBuffer;
  xHist: SharedArrayBuffer;
  slotHist: SharedArrayBuffer;
  nlHist: SharedArrayBuffer;
}

/** Sizes that fix the history layout: history h of step s in block b is at ((b % 2) * K + s - b K). */
export interface HistoryLayout {
  K: number;
  nX: number;
  nSlots: number;
  nParts: number;
  waveLength: number;
}

/** Allocates the control words (before the workers start). */
export function allocateControl(): SharedArrayBuffer {
  return new SharedArrayBuffer(4 * CONTROL_WORDS);
}

/** Allocates the shared buffers for a layout, around control words already shared. */
export function allocateShared(l: HistoryLayout, control: SharedArrayBuffer): SharedBuffers {
  return {
    control,
    wave: new SharedArrayBuffer(8 * l.waveLength),
    xHist: new SharedArrayBuffer(8 * Math.max(1, 2 * l.K * l.nX)),
    slotHist: new SharedArrayBuffer(8 * Math.max(1, 2 * l.K * l.nSlots)),
    nlHist: new SharedArrayBuffer(8 * Math.max(1, 2 * l.K * l.nParts)),
  };
}

/** Index of a step's row in the double-buffered history. */
export function historyRow(step: number, K: number): number {
  const b = Math.floor(step / K);
  return (b % 2) * K + (step - b * K);
}
