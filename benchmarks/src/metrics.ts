/**
 * What the benchmark reports besides time: the bytes a kernel must touch per step, a memory
 * bandwidth probe in TypeScript (the C one is in kernel.c), and the output comparison.
 */
import type { KernelNet } from './generate.ts';

/**
 * Bytes the kernel must move per step of the whole network, counting every array element it
 * reads or writes once per step (index and coefficient arrays, one ring read and one ring write
 * per modal port, inc written, x written, the junction's matrices), as int32 = 4 and float64 = 8
 * bytes. The second ring slot read for f = 0 sits next to the first and is not counted; nor are
 * cache-line and write-allocate overheads: it is the useful traffic, a lower bound.
 * One conductor, per modal port: pIn pInMask pK pOut pOutMask pNode (24) + pF pY2 (16) + ring read
 * and write (16) + inc (8) = 64; per junction: jPort jX jK jEx (16) + K (8 R^2) + x (8 R) +
 * per excitation entry exRow exSlot exCoef slot (24).
 * General kernel, per modal port: 5 int32 (20) + pF (8) + ring read and write (16) + inc write and
 * read (16) = 60; per junction: 7 int32 (28) + B (8 R M) + K (8 R^2) + A (8 M N) + x (8 R) + 24 per
 * excitation entry.
 * @param kind 0 for the one-conductor kernel, 1 for the general kernel.
 * @returns bytes per step.
 */
export function usefulBytesPerStep(net: KernelNet, kind: 0 | 1): number {
  let bytes = 0;
  const perPort = kind === 0 ? 64 : 60;
  const perJunction = kind === 0 ? 16 : 28;
  for (let j = 0; j < net.nJunctions; j++) {
    const M = net.jPort[j + 1] - net.jPort[j];
    const R = net.jX[j + 1] - net.jX[j];
    const N = net.jN[j];
    bytes += perJunction + perPort * M + 8 * R * R + 8 * R + 24 * (net.jEx[j + 1] - net.jEx[j]);
    if (kind === 1) bytes += 8 * R * M + 8 * M * N;
  }
  return bytes;
}

/**
 * Memory bandwidth of copy (c = a) and triad (a = b + s c) loops in TypeScript over n doubles,
 * best of reps, counting each loop's own reads and writes (16 and 24 bytes per element).
 * @example tsStream(1 << 24, 5).triadBytesPerS // ~2e10 on a current server core
 */
export function tsStream(n = 1 << 24, reps = 5): { copyBytesPerS: number; triadBytesPerS: number; check: number } {
  const a = new Float64Array(n).fill(1);
  const b = new Float64Array(n).fill(2);
  const c = new Float64Array(n).fill(0.5);
  let bestCopy = Infinity;
  let bestTriad = Infinity;
  const s = 3;
  for (let r = 0; r < reps; r++) {
    const t0 = performance.now();
    for (let i = 0; i < n; i++) c[i] = a[i];
    const t1 = performance.now();
    for (let i = 0; i < n; i++) a[i] = b[i] + s * c[i];
    const t2 = performance.now();
    bestCopy = Math.min(bestCopy, (t1 - t0) * 1e-3);
    bestTriad = Math.min(bestTriad, (t2 - t1) * 1e-3);
  }
  let check = 0;
  for (let i = 0; i < n; i += 4096) check += a[i];
  return { copyBytesPerS: (16 * n) / bestCopy, triadBytesPerS: (24 * n) / bestTriad, check };
}

/** Worst deviation of got from expected: relative to max(|expected|, floor). */
export interface Deviation {
  /** max |got - expected| / max(|expected_i|, floor) over all i. */
  relative: number;
  /** Index of the worst element, -1 when none. */
  index: number;
  got: number;
  expected: number;
}

/**
 * Compares two arrays elementwise with a relative tolerance and an absolute floor: the error of
 * element i is |got_i - expected_i| / max(|expected_i|, floor). A NaN anywhere counts as infinite.
 * @param floor absolute floor [same unit as the values]; the benchmark uses 1e-12 max|expected|.
 * @throws Error when the lengths differ.
 */
export function compareArrays(got: Float64Array, expected: Float64Array, floor: number): Deviation {
  if (got.length !== expected.length) throw new Error(`benchmarks: compare ${got.length} values against ${expected.length}`);
  let worst: Deviation = { relative: 0, index: -1, got: 0, expected: 0 };
  for (let i = 0; i < got.length; i++) {
    const e = expected[i];
    const d = Math.abs(got[i] - e) / Math.max(Math.abs(e), floor);
    if (!(d <= worst.relative)) {
      worst = { relative: Number.isNaN(d) ? Infinity : d, index: i, got: got[i], expected: e };
      if (Number.isNaN(d)) break;
    }
  }
  return worst;
}

/** Largest |value| of an array. */
export function maxAbs(a: Float64Array): number {
  let m = 0;
  for (let i = 0; i < a.length; i++) m = Math.max(m, Math.abs(a[i]));
  return m;
}
