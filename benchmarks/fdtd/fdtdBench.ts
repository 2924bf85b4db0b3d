/**
 * FDTD segment kernel throughput: core's `fdtdStep` (TypeScript) against its C twin `fdtd.c`
 * (same loops, layout and update order, gcc -O3 -march=native) in the same run, on segments of 1
 * and 4 conductors with 10^3 .. 10^6 cells. Inputs are built before the timer; the outputs of the
 * two are compared to 1e-12 (relative to the largest magnitude) after the timed steps.
 *
 * Run: `npx tsx benchmarks/fdtd/fdtdBench.ts [--quick] [--out FILE]`.
 */
import { execFileSync } from 'node:child_process';
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { Matrix, inverse } from 'ml-matrix';
import { createFdtdLine, type FdtdLine } from '../../packages/core/src/compile/fdtd.ts';
import { fdtdStep } from '../../packages/core/src/kernel/fdtdStep.ts';
import type { ResolvedLine } from '../../packages/core/src/model.ts';
import { fdtdStep4 } from './fdtdStep4.ts';

/** One benchmark case: conductors n, cells, steps per timed run. */
export interface FdtdCase {
  n: number;
  cells: number;
  steps: number;
}

/** Figures of one case. */
export interface FdtdCaseResult extends FdtdCase {
  /** Best wall time of the timed runs [s]. */
  tsS: number;
  cS: number;
  /** Cell updates per second (one cell-step = one cell's current and voltage update) [1/s]. */
  tsCellStepsPerS: number;
  cCellStepsPerS: number;
  /** TS throughput over C throughput. */
  ratio: number;
  /** Largest |TS - C| over the state after the timed steps, relative to the largest |value|. */
  deviation: number;
  checksumTs: number;
  checksumC: number;
  /** n = 4 only: the hand-specialised TS kernel (fdtdStep4.ts, an experiment) [1/s], its ratio to C, its deviation from C. */
  ts4CellStepsPerS?: number;
  ratio4?: number;
  deviation4?: number;
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

/** Runs `steps` kernel steps on the segment's state in place; returns the cells updated. */
export function runTs(f: FdtdLine, steps: number): number {
  let updated = 0;
  for (let s = 0; s < steps; s++) updated += fdtdStep(f.n, f.cells, f.Av, f.Bv, f.Ai, f.Bi, f.gm, f.V, f.I, f.iEnd, f.hEnd, f.tmp);
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
  const parts = [Float64Array.of(f.n, f.cells), f.Av, f.Bv, f.Ai, f.Bi, f.gm, f.V, f.I, f.iEnd];
  const total = parts.reduce((s, p) => s + p.length, 0);
  const all = new Float64Array(total);
  let o = 0;
  for (const p of parts) { all.set(p, o); o += p.length; }
  writeFileSync(path, new Uint8Array(all.buffer));
}

/**
 * Runs the C twin: `steps` steps from the input state, best of `reps`.
 * @returns best time [s], checksum, cells updated and the final V, I, hEnd.
 */
export function runC(exe: string, dir: string, f: FdtdLine, steps: number, reps: number): { timeS: number; checksum: number; updated: number; V: Float64Array; I: Float64Array; hEnd: Float64Array } {
  const inp = join(dir, 'in.bin');
  const out = join(dir, 'out.bin');
  writeInput(inp, f);
  const line = execFileSync(exe, [inp, out, String(steps), String(reps)], { encoding: 'utf8' }).trim().split(/\s+/);
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

/**
 * Times one case in both languages: TS best of `reps` runs (state reset from the initial copy
 * outside the timer), the C twin the same, then compares the final states.
 */
export function runCase(c: FdtdCase, exe: string, dir: string, reps = 3): FdtdCaseResult {
  const f = buildSegment(c.n, c.cells);
  const V0 = f.V.slice();
  const I0 = f.I.slice();
  const cr = runC(exe, dir, f, c.steps, reps);
  // Warm-up on a copy so the JIT has compiled the kernel before the timer.
  runTs(buildSegment(c.n, Math.min(c.cells, 1000)), 200);
  let best = Infinity;
  let updated = 0;
  for (let r = 0; r < reps; r++) {
    f.V.set(V0);
    f.I.set(I0);
    const t0 = process.hrtime.bigint();
    updated = runTs(f, c.steps);
    const t = Number(process.hrtime.bigint() - t0) * 1e-9;
    best = Math.min(best, t);
  }
  if (updated !== cr.updated) throw new Error(`cell count differs: TS ${updated}, C ${cr.updated}`);
  const cellSteps = c.cells * c.steps;
  let extra: Partial<FdtdCaseResult> = {};
  if (c.n === 4) {
    const w = buildSegment(4, 1000);
    for (let s = 0; s < 200; s++) fdtdStep4(w.cells, w.Av, w.Bv, w.Ai, w.Bi, w.gm, w.V, w.I, w.iEnd, w.hEnd);
    const g = buildSegment(4, c.cells);
    let best4 = Infinity;
    for (let r = 0; r < reps; r++) {
      g.V.set(V0);
      g.I.set(I0);
      const t0 = process.hrtime.bigint();
      for (let s = 0; s < c.steps; s++) fdtdStep4(g.cells, g.Av, g.Bv, g.Ai, g.Bi, g.gm, g.V, g.I, g.iEnd, g.hEnd);
      best4 = Math.min(best4, Number(process.hrtime.bigint() - t0) * 1e-9);
    }
    extra = { ts4CellStepsPerS: cellSteps / best4, ratio4: cr.timeS / best4, deviation4: deviation(g, cr) };
  }
  return {
    ...c, tsS: best, cS: cr.timeS,
    tsCellStepsPerS: cellSteps / best, cCellStepsPerS: cellSteps / cr.timeS,
    ratio: cr.timeS / best,
    deviation: deviation(f, cr),
    checksumTs: checksum(f), checksumC: cr.checksum,
    ...extra,
  };
}

/** The cases: n = 1 and 4, cells 10^3 .. 10^6 by decades (quick: 10^3, 10^4), steps for ~targetCellSteps. */
export function cases(quick: boolean): FdtdCase[] {
  const sizes = quick ? [1e3, 1e4] : [1e3, 1e4, 1e5, 1e6];
  const out: FdtdCase[] = [];
  for (const n of [1, 4]) {
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
  const { dir, exe } = buildCTwin();
  const results: FdtdCaseResult[] = [];
  try {
    for (const c of cases(quick)) {
      const r = runCase(c, exe, dir, quick ? 1 : 3);
      const x = r.ts4CellStepsPerS ? `; specialised TS ${fmt(r.ts4CellStepsPerS)}/s ratio ${r.ratio4!.toFixed(3)} dev ${r.deviation4!.toExponential(1)}` : '';
      process.stderr.write(`n=${r.n} cells=${r.cells} steps=${r.steps}: TS ${fmt(r.tsCellStepsPerS)}/s C ${fmt(r.cCellStepsPerS)}/s ratio ${r.ratio.toFixed(3)} dev ${r.deviation.toExponential(1)}${x}\n`);
      results.push(r);
    }
  } finally {
    rmSync(dir, { recursive: true, force: true });
  }
  console.log('| n | cells | steps | TS cell-steps/s | C cell-steps/s | TS/C | deviation | specialised TS (n = 4) | its TS/C |');
  console.log('|---|---|---|---|---|---|---|---|---|');
  for (const r of results) {
    const x = r.ts4CellStepsPerS ? `${fmt(r.ts4CellStepsPerS)} | ${r.ratio4!.toFixed(3)}` : '- | -';
    console.log(`| ${r.n} | ${r.cells} | ${r.steps} | ${fmt(r.tsCellStepsPerS)} | ${fmt(r.cCellStepsPerS)} | ${r.ratio.toFixed(3)} | ${r.deviation.toExponential(1)} | ${x} |`);
  }
  if (oi >= 0) writeFileSync(argv[oi + 1], JSON.stringify(results, null, 2));
  if (results.some((r) => !(r.deviation <= 1e-12) || (r.deviation4 !== undefined && !(r.deviation4 <= 1e-12)))) {
    console.error('FAIL: the C twin and the TS kernel differ by more than 1e-12');
    process.exitCode = 1;
  }
  return results;
}

if (process.argv[1] && fileURLToPath(import.meta.url) === process.argv[1]) main(process.argv.slice(2));
