/**
 * Running a sweep: expand the cases, key each by the digest of its resolved scenario, take
 * finished cases from the cache folder, compute the others on an executor (the worker pool or a
 * queue), and keep the table up to date on disk. A case whose digest repeats is computed once;
 * an interrupted sweep run again computes only the cases it had not finished.
 */
import { copyFileSync, existsSync, mkdirSync, readFileSync } from 'node:fs';
import { join, relative } from 'node:path';
import { digestOf, ENGINE_VERSION, resolveScenarioData, resolveScenarioText, writeFileAtomic, type PluginRegistry } from '@skein/core';
import { decodeCaseRecord, encodeCaseRecord, failedRecord, type CaseRecord, type CaseTask } from './caseRun.ts';
import { caseCount, expandCases } from './expand.ts';
import { createCasePool } from './pool.ts';
import type { SweepSpec } from './spec.ts';
import { summariseRows, TABLE_FORMAT, TABLE_VERSION, tableToCsv, writeTable, type SweepRow, type SweepTable } from './table.ts';

/** Something that computes cases: the local worker pool, or a queue of remote workers. */
export interface CaseExecutor {
  /** How many cases to keep in flight at once. */
  readonly capacity: number;
  run(task: CaseTask): Promise<CaseRecord>;
  close(): Promise<void>;
}

/** Progress of a sweep. */
export interface SweepProgress {
  /** Cases finished (computed, cached or repeated) of `total`. */
  done: number;
  total: number;
  computed: number;
  failed: number;
  /** Estimated time to finish [s] from the rate of computed cases; NaN before the first. */
  etaS: number;
}

/** Options of runSweep. */
export interface RunSweepOptions {
  /** The plugins (its `modules` list is what every worker loads, in order). */
  registry: PluginRegistry;
  /** Worker threads of the local pool (default: available parallelism; 0: this thread). Ignored with `executor`. */
  workers?: number;
  /** Computes cases instead of a local pool (a queue, or a pool shared between sweeps). Not closed by runSweep. */
  executor?: CaseExecutor;
  /** Folder of finished case records, by key; resuming reads it. Undefined: no cache. */
  cacheDir?: string;
  /** Folder for each case's results file (`case-<index>.results.msgpack`). */
  resultsDir?: string;
  /** Run only this shard: cases with index % count === index. */
  shard?: { index: number; count: number };
  /** Write the table here while running (every `flushEveryS`) and at the end. */
  tablePath?: string;
  /** CSV beside the table, written at the end. */
  csvPath?: string;
  /** Seconds between table writes while running (default 2). */
  flushEveryS?: number;
  onProgress?: (p: SweepProgress) => void;
  /** Stops dispatching new cases; the cases in flight finish and are kept. */
  signal?: AbortSignal;
}

/** The outcome of runSweep. */
export interface SweepOutcome {
  table: SweepTable;
  counts: { cases: number; computed: number; cached: number; duplicates: number; failed: number };
  /** Wall time [s]. */
  elapsedS: number;
  /** True when the signal stopped the sweep before every case finished. */
  interrupted: boolean;
}

/** The cache file of a case key. */
function cachePath(dir: string, key: string): string {
  return join(dir, `${key}.case.msgpack`);
}

/**
 * Runs a sweep.
 * @param spec from loadSweep / loadSweepFile.
 * @param options plugins, workers or executor, cache and results folders, shard, table paths.
 * @returns the table and how many cases were computed, cached and repeated.
 * @throws InputError when the base scenario itself is invalid (located in its file). Failing cases never throw.
 * @example const { table } = await runSweep(loadSweepFile('scan.yaml'), { registry, workers: 2, cacheDir: 'scan.cache' })
 */
export async function runSweep(spec: SweepSpec, options: RunSweepOptions): Promise<SweepOutcome> {
  const t0 = performance.now();
  const { registry } = options;
  // The base scenario must be valid on its own: its errors point into its own file.
  if (spec.scenarioText !== undefined) resolveScenarioText(spec.scenarioText, { registry, file: spec.scenarioFile });
  else resolveScenarioData(spec.scenario, { registry, file: spec.file ? `${spec.file} (scenario)` : undefined });

  const cases = expandCases(spec, options.shard);
  const outputsKey = digestOf(spec.outputs).slice(0, 16);
  if (options.cacheDir) mkdirSync(options.cacheDir, { recursive: true });
  if (options.resultsDir) mkdirSync(options.resultsDir, { recursive: true });

  const rows: SweepRow[] = new Array(cases.length);
  const counts = { cases: cases.length, computed: 0, cached: 0, duplicates: 0, failed: 0 };
  const pending: Array<{ slot: number; task: CaseTask; resultsFile: string | null }> = [];
  const firstOfKey = new Map<string, number>();
  const firstResultsFile = new Map<number, string>();
  const repeats: Array<{ slot: number; of: number; resultsFile: string | null }> = [];

  const rowOf = (slot: number, rec: CaseRecord, source: SweepRow['source'], resultsFile: string | null): SweepRow => ({
    index: cases[slot].index,
    digest: rec.digest,
    status: rec.ok ? 'ok' : 'failed',
    values: cases[slot].values,
    outputs: rec.outputs,
    error: rec.error ?? null,
    resultsFile,
    source,
  });

  cases.forEach((c, slot) => {
    let digest: string;
    try {
      digest = resolveScenarioData(c.scenario, { registry }).digest;
    } catch (e) {
      // A value the engine refuses (a drawn negative resistance): recorded, never run.
      const rec = failedRecord({ key: '', digest: digestOf(c.scenario), outputs: spec.outputs }, e);
      rows[slot] = rowOf(slot, rec, 'input', null);
      counts.failed++;
      return;
    }
    const key = `${digest}-${outputsKey}`;
    const resultsFile = options.resultsDir ? join(options.resultsDir, `case-${c.index}.results.msgpack`) : null;
    const first = firstOfKey.get(key);
    if (first !== undefined) {
      repeats.push({ slot, of: first, resultsFile });
      return;
    }
    firstOfKey.set(key, slot);
    if (resultsFile) firstResultsFile.set(slot, resultsFile);
    if (options.cacheDir && existsSync(cachePath(options.cacheDir, key)) && (!resultsFile || existsSync(resultsFile))) {
      try {
        const rec = decodeCaseRecord(readFileSync(cachePath(options.cacheDir, key)));
        rows[slot] = rowOf(slot, rec, 'cached', resultsFile ? relativeTo(options.tablePath, resultsFile) : null);
        counts.cached++;
        if (!rec.ok) counts.failed++;
        return;
      } catch {
        // An unreadable cache entry is computed again (and overwritten).
      }
    }
    pending.push({ slot, task: { key, digest, scenario: c.scenario, outputs: spec.outputs, keepResults: resultsFile !== null }, resultsFile });
  });

  const tableOf = (complete: boolean): SweepTable => {
    const done = rows.filter((r) => r !== undefined);
    const parameters = spec.parameters.map((p) => ({ name: p.name, path: p.path.join('.'), kind: p.values.kind === 'draw' ? `draw ${p.values.dist}` : p.values.kind }));
    const outputs = spec.outputs.map((o) => ({ name: o.name, kind: o.kind }));
    return {
      format: TABLE_FORMAT,
      version: TABLE_VERSION,
      engine: { name: 'skein', version: ENGINE_VERSION },
      created: new Date().toISOString(),
      title: spec.title,
      seed: spec.seed,
      combine: spec.combine,
      totalCases: caseCount(spec),
      parameters,
      outputs,
      rows: done,
      summary: summariseRows(parameters, outputs, done),
      complete,
    };
  };

  const total = cases.length;
  let finished = total - pending.length - repeats.length;
  let tFirst = performance.now();
  const report = (): void => {
    if (!options.onProgress) return;
    const left = pending.length - counts.computed;
    // The rate from the first finished case on, so that worker start-up does not inflate the ETA.
    if (counts.computed === 1) tFirst = performance.now();
    const rate = (counts.computed - 1) / ((performance.now() - tFirst) / 1000);
    options.onProgress({ done: finished, total, computed: counts.computed, failed: counts.failed, etaS: counts.computed > 1 && rate > 0 ? left / rate : left === 0 ? 0 : NaN });
  };
  report();

  const ownExecutor = options.executor === undefined;
  let executor: CaseExecutor | undefined = options.executor;
  let lastFlush = performance.now();
  const flushEveryMs = (options.flushEveryS ?? 2) * 1000;
  let interrupted = false;
  try {
    if (pending.length > 0) {
      if (!executor) {
        const pool = createCasePool({ modules: registry.modules, workers: options.workers });
        executor = { capacity: Math.max(1, pool.workers) * 2, run: (t) => pool.run(t), close: () => pool.close() };
      }
      const exec = executor;
      let next = 0;
      const lane = async (): Promise<void> => {
        while (next < pending.length) {
          if (options.signal?.aborted) {
            interrupted = true;
            return;
          }
          const job = pending[next++];
          let rec: CaseRecord;
          try {
            rec = await exec.run(job.task);
          } catch (e) {
            rec = failedRecord(job.task, e);
          }
          if (job.resultsFile && rec.results) writeFileAtomic(job.resultsFile, rec.results);
          const keep = { ...rec, results: undefined };
          if (options.cacheDir && (rec.ok || rec.deterministic)) writeFileAtomic(cachePath(options.cacheDir, job.task.key), encodeCaseRecord(keep));
          rows[job.slot] = rowOf(job.slot, keep, 'computed', job.resultsFile ? relativeTo(options.tablePath, job.resultsFile) : null);
          counts.computed++;
          if (!rec.ok) counts.failed++;
          finished++;
          report();
          if (options.tablePath && performance.now() - lastFlush > flushEveryMs) {
            lastFlush = performance.now();
            writeTable(tableOf(false), options.tablePath);
          }
        }
      };
      await Promise.all(Array.from({ length: Math.min(exec.capacity, pending.length) }, lane));
    }
  } finally {
    if (ownExecutor && executor) await executor.close();
  }
  for (const { slot, of, resultsFile } of repeats) {
    const src = rows[of];
    if (!src) continue;
    // A repeat gets its own copy of the results file, so that every case index has one.
    const srcFile = firstResultsFile.get(of);
    if (resultsFile && srcFile && existsSync(srcFile)) copyFileSync(srcFile, resultsFile);
    rows[slot] = { ...src, index: cases[slot].index, values: cases[slot].values, source: 'duplicate', resultsFile: resultsFile && srcFile ? relativeTo(options.tablePath, resultsFile) : null };
    counts.duplicates++;
    if (src.status === 'failed') counts.failed++;
    finished++;
  }
  report();
  const table = tableOf(!interrupted && !options.shard);
  if (options.tablePath) writeTable(table, options.tablePath, options.csvPath);
  else if (options.csvPath) writeFileAtomic(options.csvPath, tableToCsv(table));
  return { table, counts, elapsedS: (performance.now() - t0) / 1000, interrupted };
}

function relativeTo(tablePath: string | undefined, file: string): string {
  if (!tablePath) return file;
  const r = relative(join(tablePath, '..'), file);
  return r.startsWith('..') ? file : r;
}
