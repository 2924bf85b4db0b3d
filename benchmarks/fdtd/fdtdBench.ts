/**
 * FDTD segment kernel throughput: the kernel core steps a segment with (`fdtdKernelFor(n)`, the
 * unrolled fast path for n = 1..4) against its C twin in `fdtd.c` (same loops, layout and update
 * order, gcc -O3 -march=native) in the same run, on segments of 1 and 4 conductors (optionally 2
 * and 3) with 10^3 .. 10^6 cells; core's general loop `fdtdStep` and its C twin are timed beside
 * them. Inputs are built before the timer; the outputs of each TS kernel and the C twins are
 * compared to 1e-12 (relative to the largest magnitude) after the timed steps.
 *
 * Run: `npx tsx benchmarks/fdtd/fdtdBench.ts [--quick] [--n 1,2,3,4] [--out FILE]`.
 */
import { execFileSync } from 'node:child_process';
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { Matrix, inverse } from 'ml-matrix';
import { createFdtdLine, type FdtdKernel, type FdtdLine } from '../../packages/core/src/compile/fdtd.ts';
import { fdtdStep } from '../../packages/core/src/kernel/fdtdStep.ts';
import type { ResolvedLine } from '../../packages/core/src/model.ts';

/** One benchmark case: conductors n, cells, steps per timed run. */
export interface FdtdCase {
  n: number;
  cells: number;
  steps: number;
}

/** Figures of one case. */
export interface FdtdCaseResult extends FdtdCase {
  /** Best wall time of the timed runs [s]: core's kernel for this n and its C twin. */
  tsS: number;
  cS: number;
  /** Cell updates per second (one cell-step = one cell's current and voltage update) [1/s]. */
  tsCellStepsPerS: number;
  cCellStepsPerS: number;
  /** Core's kernel's throughput over its C twin's. */
  ratio: number;
  /** Largest |TS - C| over the state after the timed steps, relative to the largest |value|. */
  deviation: number;
  checksumTs: number;
  checksumC: number;
  /** Core's general loop fdtdStep and its C twin (the same as above for n > 4) [1/s]. */
  tsGeneralCellStepsPerS: number;
  cGeneralCellStepsPerS: number;
  /** Core's kernel over the C twin of the general loop, and the general loops' ratio. */
  ratioToCGeneral: number;
  ratioGeneral: number;
  deviationGeneral: number;
}

/** Seeded PRNG (mulberry32, common practice) in [0, 1). */
function prng(seed: number): () => number {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

/**
 * A realistic lossy segment of n conductors, 1 km long, built by core's own `createFdtdLine`:
 * n = 1 a 50 ohm cable (L 250 nH/m, C 100 pF/m, R 0.05 ohm/m, G 1e-6 S/m); n = 4 a bundle with a
 * coupled SPD C (100 pF/m self, -20 / -8 / -3 pF/m mutual) and L = C^-1 / v^2 (v = 2e8 m/s).
 * Time step 0.9 of the cell delay (Courant), initial state random in [-1, 1] (seeded), end node
 * voltages held (as the junction solve would) so the state settles to a non-zero profile.
 */
export function buildSegment(n: number, cells: number, seed = 1): FdtdLine {
  const v = 2e8;
  const C = new Matrix(n, n);
  const mut = [100e-12, -20e-12, -8e-12, -3e-12];
  for (let i = 0; i < n; i++) for (let j = 0; j < n; j++) C.set(i, j, mut[Math.abs(i - j)]);
  const L = inverse(C).mul(1 / (v * v));
  const flat = (m: Matrix): Float64Array => Float64Array.from(m.to1DArray());
  const R = new Float64Array(n * n);
  const G = new Float64Array(n * n);
  for (let i = 0; i < n; i++) { R[i * n + i] = 0.05; G[i * n + i] = 1e-6; }
  const lengthM = 1000;
  const line = {
    id: 'bench', index: 0, from: 0, to: 1, lengthM, conductors: Array.from({ length: n }, (_, i) => `c${i}`),
    L: flat(L), C: flat(C), R, G,
  } as unknown as ResolvedLine;
  const dtS = (0.9 * lengthM) / cells / v;
  const f = createFdtdLine(line, cells, dtS, 0);
  const rnd = prng(seed);
  for (let i = 0; i < f.V.length; i++) f.V[i] = 2 * rnd() - 1;
  for (let i = 0; i < f.I.length; i++) f.I[i] = (2 * rnd() - 1) / 50;
  for (let i = 0; i < f.iEnd.length; i++) f.iEnd[i] = (2 * rnd() - 1) / 50;
  return f;
}

/**
 * Runs `steps` kernel steps on the segment's state in place: core's kernel for the segment
 * (`f.step`, chosen by createFdtdLine) unless another is given; returns the cells updated.
 */
export function runTs(f: FdtdLine, steps: number, kernel: FdtdKernel = f.step): number {
  let updated = 0;
  for (let s = 0; s < steps; s++) updated += kernel(f.n, f.cells, f.Av, f.Bv, f.Ai, f.Bi, f.gm, f.V, f.I, f.iEnd, f.hEnd, f.tmp);
  return updated;
}

/** Sum of V, I and hEnd (the checksum both twins print). */
export function checksum(f: { V: Float64Array; I: Float64Array; hEnd: Float64Array }): number {
  let s = 0;
  for (const x of f.V) s += x;
  for (const x of f.I) s += x;
  for (const x of f.hEnd) s += x;
  return s;
}

/** Path of fdtd.c next to this file. */
export const C_SOURCE = fileURLToPath(new URL('./fdtd.c', import.meta.url));

/**
 * Compiles the C twin with gcc -O3 -march=native into a fresh temporary directory.
 * @returns the directory and the executable's path; remove the directory when done.
 * @throws Error when gcc is not on PATH (Debian: apt-get install gcc) or the build fails.
 */
export function buildCTwin(): { dir: string; exe: string } {
  try {
    execFileSync('gcc', ['--version'], { stdio: 'ignore' });
  } catch {
    throw new Error('gcc not found on PATH: the C twin of the FDTD kernel cannot be built (Debian: apt-get install gcc)');
  }
  const dir = mkdtempSync(join(tmpdir(), 'skein-fdtd-'));
  const exe = join(dir, 'fdtd');
  execFileSync('gcc', ['-O3', '-march=native', '-o', exe, C_SOURCE], { stdio: ['ignore', 'ignore', 'inherit'] });
  return { dir, exe };
}

/** Writes the C twin's input file (see fdtd.c) for the segment's current state. */
export function writeInput(path: string, f: FdtdLine): void {
  const parts = [Float64Array.of(f.n, f.cells), f.Av, f.Bv, f.Ai, f.Bi, f.gm.subarray(0, f.n * f.n), f.V, f.I, f.iEnd];
  const total = parts.reduce((s, p) => s + p.length, 0);
  const all = new Float64Array(total);
  let o = 0;
  for (const p of parts) { all.set(p, o); o += p.length; }
  writeFileSync(path, new Uint8Array(all.buffer));
}

/**
 * Runs the C twin: `steps` steps from the input state, best of `reps`, with the C twin of core's
 * general loop or of the unrolled kernel core picks for n = 1..4.
 * @returns best time [s], checksum, cells updated and the final V, I, hEnd.
 */
export function runC(exe: string, dir: string, f: FdtdLine, steps: number, reps: number, kernel: 'general' | 'unrolled' = 'unrolled'): { timeS: number; checksum: number; updated: number; V: Float64Array; I: Float64Array; hEnd: Float64Array } {
  const inp = join(dir, 'in.bin');
  const out = join(dir, 'out.bin');
  writeInput(inp, f);
  const line = execFileSync(exe, [inp, out, String(steps), String(reps), kernel], { encoding: 'utf8' }).trim().split(/\s+/);
  const buf = readFileSync(out);
  const all = new Float64Array(buf.buffer.slice(buf.byteOffset, buf.byteOffset + buf.byteLength));
  const nv = f.V.length;
  const ni = f.I.length;
  return {
    timeS: Number(line[0]), checksum: Number(line[1]), updated: Number(line[2]),
    V: all.slice(0, nv), I: all.slice(nv, nv + ni), hEnd: all.slice(nv + ni, nv + ni + 2 * f.n),
  };
}

/** Largest |a - b| over the three state arrays relative to the largest |a|. */
export function deviation(a: { V: Float64Array; I: Float64Array; hEnd: Float64Array }, b: { V: Float64Array; I: Float64Array; hEnd: Float64Array }): number {
  let d = 0;
  let m = 0;
  for (const k of ['V', 'I', 'hEnd'] as const) {
    const x = a[k];
    const y = b[k];
    if (x.length !== y.length) return Infinity;
    for (let i = 0; i < x.length; i++) { d = Math.max(d, Math.abs(x[i] - y[i])); m = Math.max(m, Math.abs(x[i])); }
  }
  return d / (m || 1);
}

/** Best of `reps` timed runs of `kernel` on the segment from its initial state (reset outside the timer) [s]. */
function timeTs(f: FdtdLine, V0: Float64Array, I0: Float64Array, steps: number, reps: number, kernel: FdtdKernel): { timeS: number; updated: number } {
  // Warm-up on a small copy so the JIT has compiled the kernel before the timer.
  runTs(buildSegment(f.n, Math.min(f.cells, 1000)), 200, kernel);
  let best = Infinity;
  let updated = 0;
  for (let r = 0; r < reps; r++) {
    f.V.set(V0);
    f.I.set(I0);
    const t0 = process.hrtime.bigint();
    updated = runTs(f, steps, kernel);
    best = Math.min(best, Number(process.hrtime.bigint() - t0) * 1e-9);
  }
  return { timeS: best, updated };
}

/**
 * Times one case: core's kernel for this n and its C twin, then core's general loop and its C
 * twin, each best of `reps` (state reset outside the timer), and compares the final states.
 */
export function runCase(c: FdtdCase, exe: string, dir: string, reps = 3): FdtdCaseResult {
  const f = buildSegment(c.n, c.cells);
  const V0 = f.V.slice();
  const I0 = f.I.slice();
  const cr = runC(exe, dir, f, c.steps, reps, 'unrolled');
  const tr = timeTs(f, V0, I0, c.steps, reps, f.step);
  if (tr.updated !== cr.updated) throw new Error(`cell count differs: TS ${tr.updated}, C ${cr.updated}`);
  const g = buildSegment(c.n, c.cells);
  const cg = runC(exe, dir, g, c.steps, reps, 'general');
  const tg = timeTs(g, V0, I0, c.steps, reps, fdtdStep);
  const cellSteps = c.cells * c.steps;
  return {
    ...c, tsS: tr.timeS, cS: cr.timeS,
    tsCellStepsPerS: cellSteps / tr.timeS, cCellStepsPerS: cellSteps / cr.timeS,
    ratio: cr.timeS / tr.timeS,
    deviation: deviation(f, cr),
    checksumTs: checksum(f), checksumC: cr.checksum,
    tsGeneralCellStepsPerS: cellSteps / tg.timeS, cGeneralCellStepsPerS: cellSteps / cg.timeS,
    ratioToCGeneral: cg.timeS / tr.timeS,
    ratioGeneral: cg.timeS / tg.timeS,
    deviationGeneral: Math.max(deviation(g, cg), deviation(f, g)),
  };
}

/** The cases: n = 1 and 4 (or `ns`), cells 10^3 .. 10^6 by decades (quick: 10^3, 10^4), about 6e7 / n^2 cell-steps each (quick 2e6 / n^2). */
export function cases(quick: boolean, ns: number[] = [1, 4]): FdtdCase[] {
  const sizes = quick ? [1e3, 1e4] : [1e3, 1e4, 1e5, 1e6];
  const out: FdtdCase[] = [];
  for (const n of ns) {
    for (const cells of sizes) {
      const target = (quick ? 2e6 : 6e7) / (n * n);
      out.push({ n, cells, steps: Math.max(5, Math.round(target / cells)) });
    }
  }
  return out;
}

function fmt(x: number): string {
  return x.toExponential(3);
}

/** Runs all cases and prints a table; returns the results. Exit code 1 when a comparison fails. */
export function main(argv: string[]): FdtdCaseResult[] {
  const quick = argv.includes('--quick');
  const oi = argv.indexOf('--out');
  const ni = argv.indexOf('--n');
  const ns = ni >= 0 ? argv[ni + 1].split(',').map(Number) : [1, 4];
  if (!ns.every((n) => Number.isInteger(n) && n >= 1 && n <= 8)) throw new Error(`--n must list conductor counts from 1 to 8, got ${argv[ni + 1]}`);
  const { dir, exe } = buildCTwin();
  const results: FdtdCaseResult[] = [];
  try {
    for (const c of cases(quick, ns)) {
      const r = runCase(c, exe, dir, quick ? 1 : 3);
      process.stderr.write(`n=${r.n} cells=${r.cells} steps=${r.steps}: core TS ${fmt(r.tsCellStepsPerS)}/s C twin ${fmt(r.cCellStepsPerS)}/s ratio ${r.ratio.toFixed(3)} dev ${r.deviation.toExponential(1)}; `
        + `general loops TS ${fmt(r.tsGeneralCellStepsPerS)}/s C ${fmt(r.cGeneralCellStepsPerS)}/s ratio ${r.ratioGeneral.toFixed(3)}; core TS / C general ${r.ratioToCGeneral.toFixed(3)}\n`);
      results.push(r);
    }
  } finally {
    rmSync(dir, { recursive: true, force: true });
  }
  console.log('| n | cells | steps | core TS cell-steps/s | C twin | TS/C | deviation | general loop TS | general loop C | TS/C (general) | core TS / C general |');
  console.log('|---|---|---|---|---|---|---|---|---|---|---|');
  for (const r of results) {
    console.log(`| ${r.n} | ${r.cells} | ${r.steps} | ${fmt(r.tsCellStepsPerS)} | ${fmt(r.cCellStepsPerS)} | ${r.ratio.toFixed(3)} | ${r.deviation.toExponential(1)} | ${fmt(r.tsGeneralCellStepsPerS)} | ${fmt(r.cGeneralCellStepsPerS)} | ${r.ratioGeneral.toFixed(3)} | ${r.ratioToCGeneral.toFixed(3)} |`);
  }
  if (oi >= 0) writeFileSync(argv[oi + 1], JSON.stringify(results, null, 2));
  if (results.some((r) => !(r.deviation <= 1e-12) || !(r.deviationGeneral <= 1e-12))) {
    console.error('FAIL: a C twin and its TS kernel differ by more than 1e-12');
    process.exitCode = 1;
  }
  return results;
}

if (process.argv[1] && fileURLToPath(import.meta.url) === process.argv[1]) main(process.argv.slice(2));
