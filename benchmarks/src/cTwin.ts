/**
 * The C twin of the stepping kernels (benchmarks/c/kernel.c): compiling it with
 * `gcc -O3 -march=native`, writing a case as a binary file, running it, reading back the state.
 *
 * Case file (little-endian): 8 int32 header [magic 0x424e4b53 ("SKNB"), kind (0 scalar, 1 general),
 * nJunctions, 0, 0, 0, 0, 0], then 24 int32 array
 * lengths in ARRAY_ORDER, then the arrays themselves (int32 or float64 as the Plan holds them).
 * Output file: float64 seconds, float64 checksum (sum of x), the final wave, the final x.
 */
import { execFileSync, spawnSync } from 'node:child_process';
import { createHash } from 'node:crypto';
import { closeSync, existsSync, mkdirSync, openSync, readFileSync, readSync, statSync, unlinkSync, writeSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';
import type { KernelNet } from './generate.ts';

/** Array order of the case file (must match the enum in kernel.c). */
export const ARRAY_ORDER = [
  'jPort', 'jX', 'jN', 'jB', 'jK', 'jA', 'jEx', 'pIn', 'pInMask', 'pK', 'pF', 'pOut', 'pOutMask', 'pNode', 'pY2',
  'exRow', 'exSlot', 'exCoef', 'slot', 'mat', 'wave', 'rhs', 'inc', 'x',
] as const;

const MAGIC = 0x424e4b53;
/** Path of the C source. */
export const C_SOURCE = join(dirname(fileURLToPath(import.meta.url)), '..', 'c', 'kernel.c');
/** Compiler flags, as the benchmark requirement states them. */
export const C_FLAGS = ['-O3', '-march=native'];
/** Warnings are errors when building the twin, so a slip in kernel.c cannot pass silently. */
const C_CHECKS = ['-Wall', '-Wextra', '-Werror'];

/** Result of one run of a kernel (either language). */
export interface KernelRun {
  seconds: number;
  /** Sum of the final x (node voltages), so that no work can be optimised away. */
  checksum: number;
  wave: Float64Array;
  x: Float64Array;
}

/** The gcc version line, or undefined when gcc is not on PATH. */
export function gccVersion(): string | undefined {
  const r = spawnSync('gcc', ['--version'], { encoding: 'utf8' });
  if (r.status !== 0 || typeof r.stdout !== 'string') return undefined;
  return r.stdout.split('\n')[0];
}

/**
 * Compiles kernel.c into a temporary folder (once per source text and flags) and returns the binary.
 * @throws Error naming the compiler output when gcc fails or is missing.
 * @example const bin = buildCTwin(); // '/tmp/skein-bench-<hash>/kernel'
 */
export function buildCTwin(): string {
  const src = readFileSync(C_SOURCE, 'utf8');
  const hash = createHash('sha256').update(src).update(C_FLAGS.join(' ')).digest('hex').slice(0, 16);
  const dir = join(tmpdir(), `skein-bench-${hash}`);
  const bin = join(dir, 'kernel');
  if (existsSync(bin)) return bin;
  mkdirSync(dir, { recursive: true });
  const r = spawnSync('gcc', [...C_FLAGS, ...C_CHECKS, '-o', bin, C_SOURCE], { encoding: 'utf8' });
  if (r.error) throw new Error(`benchmarks: cannot run gcc (${r.error.message}); install a C compiler (Debian: apt-get install build-essential)`);
  if (r.status !== 0) throw new Error(`benchmarks: gcc failed on ${C_SOURCE}:\n${r.stderr}`);
  return bin;
}

function writeAll(fd: number, a: ArrayBufferView): void {
  const bytes = new Uint8Array(a.buffer, a.byteOffset, a.byteLength);
  // writeSync may write fewer bytes than asked (large buffers): loop.
  let off = 0;
  while (off < bytes.length) off += writeSync(fd, bytes, off, Math.min(bytes.length - off, 1 << 30));
}

/**
 * Writes a network as a case file for the C twin.
 * @param kind 0 for the one-conductor kernel, 1 for the general kernel.
 */
export function writeCase(path: string, net: KernelNet, kind: 0 | 1): void {
  const fd = openSync(path, 'w');
  try {
    writeAll(fd, Int32Array.of(MAGIC, kind, net.nJunctions, 0, 0, 0, 0, 0));
    const arrays = ARRAY_ORDER.map((k) => net[k] as Int32Array | Float64Array);
    writeAll(fd, Int32Array.from(arrays.map((a) => a.length)));
    for (const a of arrays) writeAll(fd, a);
  } finally {
    closeSync(fd);
  }
}

/**
 * Runs the C twin on a case file written by writeCase: nWarm warm-up steps, then reps times (state
 * zeroed, nSteps timed steps; the shortest time is reported) with nB steps per junction visit (1: reference loop); `fast` runs the one-node (one
 * conductor) or four-node (four conductors) fast path instead. Reads back the final state.
 * @param net the network the case file holds (for the array lengths).
 * @throws Error with the twin's message when it fails.
 */
export function runCTwin(bin: string, casePath: string, net: KernelNet, nSteps: number, nB: number, nWarm: number, fast = false, reps = 1): KernelRun {
  const outPath = `${casePath}.out`;
  execFileSync(bin, ['run', casePath, outPath, String(nSteps), String(nB), String(nWarm), fast ? '1' : '0', String(reps)], { stdio: ['ignore', 'ignore', 'pipe'] });
  const expected = 2 + net.wave.length + net.x.length;
  const size = statSync(outPath).size;
  if (size !== expected * 8) throw new Error(`benchmarks: C twin wrote ${size} bytes, expected ${expected * 8}`);
  const all = new Float64Array(expected);
  const bytes = new Uint8Array(all.buffer);
  const fd = openSync(outPath, 'r');
  try {
    let off = 0;
    while (off < bytes.length) {
      const got = readSync(fd, bytes, off, Math.min(bytes.length - off, 1 << 30), off);
      if (got <= 0) throw new Error(`benchmarks: C twin output ${outPath} ended early`);
      off += got;
    }
  } finally {
    closeSync(fd);
    unlinkSync(outPath);
  }
  return {
    seconds: all[0], checksum: all[1],
    wave: all.subarray(2, 2 + net.wave.length), x: all.subarray(2 + net.wave.length),
  };
}

/** Memory bandwidth measured by copy and triad loops [bytes/s] (each loop's own reads and writes). */
export interface Bandwidth {
  copyBytesPerS: number;
  triadBytesPerS: number;
}

/**
 * Measures memory bandwidth in C: copy c = a and triad a = b + s c over n doubles, best of reps.
 * @param n doubles per array (3 arrays); default 2^24 (3 x 128 MiB, well beyond the caches).
 */
export function cStream(bin: string, n = 1 << 24, reps = 5): Bandwidth {
  const out = execFileSync(bin, ['stream', String(n), String(reps)], { encoding: 'utf8' });
  const j = JSON.parse(out) as Bandwidth;
  return { copyBytesPerS: j.copyBytesPerS, triadBytesPerS: j.triadBytesPerS };
}
