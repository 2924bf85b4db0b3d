/**
 * `pnpm bench`: stepping throughput of large generated networks, TypeScript kernels against their
 * C twin (gcc -O3 -march=native) in the same run, plus memory bandwidth (copy / triad).
 *
 *   pnpm bench                 the full sweep (10^3 .. 10^6 junctions), writes results/latest.json
 *   pnpm bench --quick         a tiny sweep (a few seconds), for tests
 *   pnpm bench --out FILE      write the JSON elsewhere
 *
 * Exit code 1 when an output comparison fails (C twin vs TypeScript beyond 1e-12, or the blocked
 * kernel not bit-identical to the reference).
 */
import { execSync } from 'node:child_process';
import { mkdirSync, mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { cpus, loadavg, tmpdir } from 'node:os';
import { dirname, join, resolve } from 'node:path';
import { fileURLToPath } from 'node:url';
import { buildCTwin, cStream, gccVersion, runCTwin, writeCase, type Bandwidth, type KernelRun } from './cTwin.ts';
import { generateKernelNet, type KernelNet, type Numbering, type Topology } from './generate.ts';
import { compareArrays, maxAbs, tsStream, usefulBytesPerStep } from './metrics.ts';
import { resetNet, runTs, slotRowsFor, stepNet } from './tsRun.ts';

/** One benchmark case. */
export interface BenchCase {
  nJunctions: number;
  conductors: 1 | 4;
  topology: Topology;
  numbering: Numbering;
  delayMin: number;
  delayMax: number;
}

/** Measured figures of one kernel variant in one language. */
export interface VariantResult {
  seconds: number;
  /** Line ends advanced per second (a line end of n conductors counts once). */
  lineEndUpdatesPerS: number;
  /** usefulBytesPerStep * steps / seconds, as a fraction of the C triad bandwidth. */
  bandwidthFraction: number;
  checksum: number;
}

/** Results of one case. */
export interface CaseResult extends BenchCase {
  nLines: number;
  lineEnds: number;
  modalPorts: number;
  kMin: number;
  kMax: number;
  steps: number;
  /** Timed repetitions (the shortest counts). */
  reps: number;
  blockSteps: number;
  waveMiB: number;
  usefulBytesPerLineEndUpdate: number;
  /** Reference loop (junctionStepScalar / junctionStep), one step per visit. */
  ts: VariantResult;
  /** Temporally blocked loop (junctionStepScalarBlocked / junctionStepBlocked), blockSteps per visit. */
  tsBlocked: VariantResult;
  /** Blocked fast path with locals, unrolled (junctionStepOneNodeUnrolled / junctionStepFourNodeBlocked). */
  tsFast: VariantResult;
  c?: VariantResult;
  cBlocked?: VariantResult;
  cFast?: VariantResult;
  /** C time / TS time (TS speed as a fraction of C's) for each loop. */
  ratio?: number;
  ratioBlocked?: number;
  ratioFast?: number;
  /** Worst relative deviation of the C twin's final wave and x from the TypeScript reference. */
  cDeviation?: number;
  /** TS blocked and fast final states equal the TS reference bit for bit. */
  blockedBitIdentical: boolean;
}

/** Everything one run of the benchmark measured. */
export interface BenchResults {
  date: string;
  /** loadAverage: 1, 5, 15 minute load at the start and end of the run (the machine may be shared). */
  machine: { nproc: number; cpuModel: string; node: string; gcc: string | null; loadAverageStart: number[]; loadAverageEnd: number[] };
  bandwidth: { c: Bandwidth | null; ts: Bandwidth };
  tolerance: { relative: number; floorOfMaxAbs: number };
  cases: CaseResult[];
  failures: string[];
}

/** Options of runBenchmark. */
export interface BenchOptions {
  quick?: boolean;
  /** JSON output path; default results/latest.json (full) or a temp file (quick). */
  out?: string;
  /** Progress lines (default: to stderr). */
  log?: (line: string) => void;
  /** Target seconds of the TypeScript reference run of each case. Default 0.25 (quick: 0.05). */
  targetSeconds?: number;
  /** Timed repetitions of each run; the shortest counts (the machine may be shared). Default 3; 2 at 10^5 junctions (1 with 4 conductors); 1 at 10^6 (quick: 1). */
  reps?: number;
}

/** Relative tolerance of the C vs TypeScript comparison; see compareArrays for the floor. */
export const TOLERANCE = 1e-12;
/**
 * Absolute floor of the comparison as a fraction of max|reference|: values below a thousandth of
 * the largest are judged by their absolute error (<= 1e-15 max|ref|), since rounding in a sum is
 * relative to its largest terms, not to a small result.
 */
export const FLOOR_OF_MAX = 1e-3;

function fullCases(): BenchCase[] {
  const out: BenchCase[] = [];
  for (const N of [1e3, 1e4, 1e5, 1e6]) {
    for (const conductors of [1, 4] as const) {
      // Ring memory: a line mode with delay k holds 2 nextPow2(k + nB + 1) doubles. Long delays at
      // 10^6 junctions (and 4 conductors at 10^5) would need several GiB: shorter ranges there.
      let delayMax = 200;
      if (N >= 1e6) delayMax = conductors === 1 ? 20 : 10;
      else if (N >= 1e5 && conductors === 4) delayMax = 50;
      out.push({ nJunctions: N, conductors, topology: 'tree', numbering: 'bfs', delayMin: 5, delayMax });
      // Numbering and mesh variants where the run time allows (the 2-core budget of ~6 minutes).
      if (conductors === 1) out.push({ nJunctions: N, conductors, topology: 'tree', numbering: 'random', delayMin: 5, delayMax });
      if (N < 1e6) out.push({ nJunctions: N, conductors, topology: 'mesh', numbering: 'bfs', delayMin: 5, delayMax });
    }
  }
  return out;
}

function quickCases(): BenchCase[] {
  const out: BenchCase[] = [];
  for (const N of [300, 3000]) {
    for (const conductors of [1, 4] as const) {
      out.push({ nJunctions: N, conductors, topology: 'tree', numbering: 'bfs', delayMin: 5, delayMax: 60 });
      out.push({ nJunctions: N, conductors, topology: 'mesh', numbering: 'random', delayMin: 5, delayMax: 60 });
    }
  }
  return out;
}

function variant(seconds: number, steps: number, net: KernelNet, usefulBytes: number, triad: number, checksum: number): VariantResult {
  const lineEnds = 2 * net.nLines;
  return {
    seconds,
    lineEndUpdatesPerS: (lineEnds * steps) / seconds,
    bandwidthFraction: (usefulBytes * steps) / seconds / triad,
    checksum,
  };
}

function fmt(x: number | undefined, digits = 2): string {
  if (x === undefined) return '-';
  return x >= 100 ? x.toFixed(0) : x.toPrecision(digits + 1);
}

/**
 * Runs the benchmark sweep and writes its JSON.
 * @returns the results (also written to options.out).
 * @throws Error when gcc is present but fails to compile the twin.
 * @example await runBenchmark({ quick: true }) // ~10 s, 8 cases
 */
export async function runBenchmark(options: BenchOptions = {}): Promise<BenchResults> {
  const log = options.log ?? ((l: string) => process.stderr.write(`${l}\n`));
  const quick = options.quick ?? false;
  const target = options.targetSeconds ?? (quick ? 0.05 : 0.25);
  const loadAverageStart = loadavg();
  const gcc = gccVersion() ?? null;
  const bin = gcc ? buildCTwin() : undefined;
  if (!gcc) log('gcc not found on PATH: the C twin is skipped and no ratio is reported (Debian: apt-get install build-essential)');
  const work = mkdtempSync(join(tmpdir(), 'skein-bench-run-'));
  const failures: string[] = [];
  let cpuModel = cpus()[0]?.model ?? 'unknown';
  try {
    const m = /Model name:\s*(.+)/.exec(execSync('lscpu', { encoding: 'utf8' }));
    if (m) cpuModel = m[1].trim();
  } catch {
    // lscpu is optional; os.cpus() gave a model already.
  }
  const streamN = quick ? 1 << 21 : 1 << 24;
  log(`bandwidth probe: copy and triad over 3 x ${(streamN * 8) / 2 ** 20} MiB`);
  const cBw = bin ? cStream(bin, streamN, quick ? 3 : 5) : null;
  const tsBwFull = tsStream(streamN, quick ? 3 : 5);
  const tsBw: Bandwidth = { copyBytesPerS: tsBwFull.copyBytesPerS, triadBytesPerS: tsBwFull.triadBytesPerS };
  const triad = cBw?.triadBytesPerS ?? tsBw.triadBytesPerS;
  log(`  C copy ${fmt((cBw?.copyBytesPerS ?? NaN) / 1e9)} GB/s, triad ${fmt((cBw?.triadBytesPerS ?? NaN) / 1e9)} GB/s; TS copy ${fmt(tsBw.copyBytesPerS / 1e9)} GB/s, triad ${fmt(tsBw.triadBytesPerS / 1e9)} GB/s`);

  const cases = quick ? quickCases() : fullCases();
  const results: CaseResult[] = [];
  try {
    for (let ci = 0; ci < cases.length; ci++) {
      const bc = cases[ci];
      const tag = `[${ci + 1}/${cases.length}] ${bc.topology} ${bc.numbering} N=${bc.nJunctions} n=${bc.conductors} delays ${bc.delayMin}..${bc.delayMax}`;
      const nB = bc.delayMin;
      const t0 = performance.now();
      const net = generateKernelNet({ ...bc, seed: 1000 + ci }, nB);
      const kind: 0 | 1 = bc.conductors === 1 ? 0 : 1;
      const lineEnds = 2 * net.nLines;
      const useful = usefulBytesPerStep(net, kind);
      // Calibrate the step count on the reference loop (outside the timed runs).
      const rows = slotRowsFor(net, 1);
      // Twice: the first pass also gets the kernel compiled by the JIT.
      const probe = Math.max(nB, Math.ceil(3e5 / net.nPorts));
      let perStep = Infinity;
      for (let pass = 0; pass < 2; pass++) {
        const tp = performance.now();
        stepNet(net, kind, probe, 1, rows);
        perStep = ((performance.now() - tp) * 1e-3) / probe;
      }
      resetNet(net);
      // Large cases: fewer steps and repetitions, to keep the sweep within minutes on 2 cores.
      const large = bc.nJunctions >= 1e5;
      const minSteps = quick || large ? 4 * nB : 8 * nB;
      const reps = options.reps ?? (quick ? 1 : bc.nJunctions >= 1e6 || (large && bc.conductors === 4) ? 1 : large ? 2 : 3);
      let steps = Math.max(minSteps, Math.min(1e6, Math.round(target / perStep)));
      steps = Math.ceil(steps / nB) * nB;
      const warm = Math.max(nB, Math.ceil(steps / 10 / nB) * nB);
      log(`${tag}: built in ${((performance.now() - t0) / 1e3).toFixed(1)} s, ${steps} steps`);

      // TypeScript and C runs alternate, rep by rep, so that both see the same machine load.
      const casePath = join(work, 'case.bin');
      if (bin) writeCase(casePath, net, kind);
      const paths = [{ name: 'reference', nB: 1, fast: false }, { name: 'blocked', nB, fast: false }, { name: 'fast', nB, fast: true }] as const;
      const tsBest: KernelRun[] = [];
      const cBest: KernelRun[] = [];
      let ref: KernelRun | undefined;
      let identical = true;
      let worst = 0;
      for (const path of paths) {
        for (let rep = 0; rep < reps; rep++) {
          const t = runTs(net, kind, steps, path.nB, warm, path.fast, 1);
          if (rep === 0) {
            if (ref === undefined) ref = t;
            else {
              let ok = ref.wave.length === t.wave.length;
              for (let i = 0; ok && i < ref.wave.length; i++) if (!Object.is(ref.wave[i], t.wave[i])) ok = false;
              for (let i = 0; ok && i < ref.x.length; i++) if (!Object.is(ref.x[i], t.x[i])) ok = false;
              if (!ok) {
                identical = false;
                failures.push(`${tag}: ${path.name} TypeScript kernel differs from the reference`);
              }
            }
          }
          const pi = paths.indexOf(path);
          if (tsBest[pi] === undefined || t.seconds < tsBest[pi].seconds) tsBest[pi] = { ...t, wave: new Float64Array(0), x: new Float64Array(0) };
          if (!bin) continue;
          const c = runCTwin(bin, casePath, net, steps, path.nB, warm, path.fast, 1);
          if (rep === 0 && ref !== undefined) {
            const dw = compareArrays(c.wave, ref.wave, FLOOR_OF_MAX * maxAbs(ref.wave));
            const dx = compareArrays(c.x, ref.x, FLOOR_OF_MAX * maxAbs(ref.x));
            worst = Math.max(worst, dw.relative, dx.relative);
            for (const [d, name] of [[dw, 'wave'], [dx, 'x']] as const) {
              if (!(d.relative <= TOLERANCE)) failures.push(`${tag}: C ${path.name} ${name}[${d.index}] = ${d.got}, TypeScript ${d.expected}, relative error ${d.relative.toExponential(2)} > ${TOLERANCE}`);
            }
          }
          if (cBest[pi] === undefined || c.seconds < cBest[pi].seconds) cBest[pi] = { ...c, wave: new Float64Array(0), x: new Float64Array(0) };
        }
      }
      rmSync(casePath, { force: true });
      const v = (k: KernelRun): VariantResult => variant(k.seconds, steps, net, useful, triad, k.checksum);
      const r: CaseResult = {
        ...bc, nLines: net.nLines, lineEnds, modalPorts: net.nPorts, kMin: net.kMin, kMax: net.kMax, steps, reps, blockSteps: nB,
        waveMiB: (net.wave.length * 8) / 2 ** 20, usefulBytesPerLineEndUpdate: useful / lineEnds,
        ts: v(tsBest[0]), tsBlocked: v(tsBest[1]), tsFast: v(tsBest[2]),
        blockedBitIdentical: identical,
      };
      if (bin) {
        r.c = v(cBest[0]);
        r.cBlocked = v(cBest[1]);
        r.cFast = v(cBest[2]);
        r.ratio = r.c.seconds / r.ts.seconds;
        r.ratioBlocked = r.cBlocked.seconds / r.tsBlocked.seconds;
        r.ratioFast = r.cFast.seconds / r.tsFast.seconds;
        r.cDeviation = worst;
      }
      results.push(r);
      log(`${tag}: line-end updates/s TS ${fmt(r.ts.lineEndUpdatesPerS / 1e6)}M, C ${fmt((r.c?.lineEndUpdatesPerS ?? NaN) / 1e6)}M (ratio ${fmt(r.ratio)}); blocked TS ${fmt(r.tsBlocked.lineEndUpdatesPerS / 1e6)}M, C ${fmt((r.cBlocked?.lineEndUpdatesPerS ?? NaN) / 1e6)}M (ratio ${fmt(r.ratioBlocked)}); fast TS ${fmt(r.tsFast.lineEndUpdatesPerS / 1e6)}M, C ${fmt((r.cFast?.lineEndUpdatesPerS ?? NaN) / 1e6)}M (ratio ${fmt(r.ratioFast)})`);
    }
  } finally {
    rmSync(work, { recursive: true, force: true });
  }

  const out: BenchResults = {
    date: new Date().toISOString(),
    machine: { nproc: cpus().length, cpuModel, node: process.version, gcc, loadAverageStart, loadAverageEnd: loadavg() },
    bandwidth: { c: cBw, ts: tsBw },
    tolerance: { relative: TOLERANCE, floorOfMaxAbs: FLOOR_OF_MAX },
    cases: results,
    failures,
  };
  const here = dirname(fileURLToPath(import.meta.url));
  const path = options.out ?? (quick ? join(tmpdir(), 'skein-bench-quick.json') : resolve(here, '..', 'results', 'latest.json'));
  mkdirSync(dirname(path), { recursive: true });
  writeFileSync(path, `${JSON.stringify(out, null, 1)}\n`);
  log(`results written to ${path}`);
  return out;
}

/** The results as a plain-text table (one row per case). */
export function formatTable(r: BenchResults): string {
  const head = ['junctions', 'n', 'topology', 'numbering', 'delays', 'steps', 'TS', 'C', 'TS/C', 'TS blk', 'C blk', 'TS/C blk', 'TS fast', 'C fast', 'TS/C fast', 'blk gain TS', 'blk gain C', 'BW TS', 'BW C', 'BW TS fast', 'BW C fast'];
  const rows = r.cases.map((c) => [
    String(c.nJunctions), String(c.conductors), c.topology, c.numbering, `${c.delayMin}..${c.delayMax}`, String(c.steps),
    fmt(c.ts.lineEndUpdatesPerS / 1e6), fmt(c.c && c.c.lineEndUpdatesPerS / 1e6), fmt(c.ratio),
    fmt(c.tsBlocked.lineEndUpdatesPerS / 1e6), fmt(c.cBlocked && c.cBlocked.lineEndUpdatesPerS / 1e6), fmt(c.ratioBlocked),
    fmt(c.tsFast.lineEndUpdatesPerS / 1e6), fmt(c.cFast && c.cFast.lineEndUpdatesPerS / 1e6), fmt(c.ratioFast),
    fmt(c.ts.seconds / c.tsBlocked.seconds), fmt(c.c && c.cBlocked && c.c.seconds / c.cBlocked.seconds),
    fmt(c.ts.bandwidthFraction, 1), fmt(c.c?.bandwidthFraction, 1), fmt(c.tsFast.bandwidthFraction, 1), fmt(c.cFast?.bandwidthFraction, 1),
  ]);
  const w = head.map((h, i) => Math.max(h.length, ...rows.map((row) => row[i].length)));
  const line = (cells: string[]): string => `| ${cells.map((c, i) => c.padStart(w[i])).join(' | ')} |`;
  return [line(head), `|${w.map((x) => '-'.repeat(x + 2)).join('|')}|`, ...rows.map(line)].join('\n');
}

async function main(): Promise<void> {
  const args = process.argv.slice(2);
  const quick = args.includes('--quick');
  const oi = args.indexOf('--out');
  const out = oi >= 0 ? args[oi + 1] : undefined;
  for (const a of args) {
    if (a.startsWith('--') && a !== '--quick' && a !== '--out') {
      process.stderr.write(`bench: unknown option ${a}; accepted: --quick, --out FILE\n`);
      process.exit(2);
    }
  }
  const r = await runBenchmark({ quick, out });
  process.stdout.write(`${formatTable(r)}\n`);
  process.stdout.write(`memory bandwidth (triad): C ${fmt((r.bandwidth.c?.triadBytesPerS ?? NaN) / 1e9)} GB/s, TS ${fmt(r.bandwidth.ts.triadBytesPerS / 1e9)} GB/s; TS, C = 10^6 line-end updates per second; blk = temporally blocked; fast = blocked with locals; BW = useful bytes/s over the C triad bandwidth\n`);
  if (r.failures.length > 0) {
    process.stderr.write(`${r.failures.join('\n')}\n`);
    process.exit(1);
  }
}

if (process.argv[1] && resolve(process.argv[1]) === fileURLToPath(import.meta.url)) {
  main().catch((e: unknown) => {
    process.stderr.write(`${e instanceof Error ? (e.stack ?? e.message) : String(e)}\n`);
    process.exit(1);
  });
}
