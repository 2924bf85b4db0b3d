/**
 * Running a sweep: expand the cases, key each by the digest of its resolved scenario, take
 * finished cases from the cache folder, compute the others on an executor (the worker pool or a
 * queue), and keep the table up to date on disk. A case whose digest repeats is computed once;
 * an interrupted sweep run again computes only the cases it had not finished.
 */
import { copyFileSync, existsSync, mkdirSync, readFileSync } from 'node:fs';
import { availableParallelism } from 'node:os';
import { join, relative } from 'node:path';
import { digestOf, ENGINE_VERSION, InputError, resolveScenarioData, resolveScenarioText, writeFileAtomic, type PluginRegistry } from '@skein/core';
import { decodeCaseRecord, encodeCaseRecord, failedRecord, type CaseRecord, type CaseTask } from './caseRun.ts';
import { caseCount, caseMaker } from './expand.ts';
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
 * Runs a sweep. Cases are built, resolved and keyed one at a time as workers become free, so a
 * sweep of millions of cases holds only its table rows, not its scenarios.
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
  else {
    try {
      resolveScenarioData(spec.scenario, { registry, file: spec.file });
    } catch (e) {
      // An inline scenario's error points into the sweep file, under `scenario`.
      if (e instanceof InputError && spec.locateScenario) throw new InputError(e.code, ['scenario', ...e.path], e.rule, e.value, spec.locateScenario(e.path));
      throw e;
    }
  }

  const makeCase = caseMaker(spec);
  const nAll = caseCount(spec);
  const first = options.shard ? options.shard.index : 0;
  const stride = options.shard ? options.shard.count : 1;
  const total = first < nAll ? Math.ceil((nAll - first) / stride) : 0;
  const outputsKey = digestOf(spec.outputs).slice(0, 16);
  if (options.cacheDir) mkdirSync(options.cacheDir, { recursive: true });
  if (options.resultsDir) mkdirSync(options.resultsDir, { recursive: true });

  const rows: SweepRow[] = new Array(total);
  const counts = { cases: total, computed: 0, cached: 0, duplicates: 0, failed: 0 };
  // The first case of each key: its record (once known) and its results file.
  const byKey = new Map<string, { record: Promise<CaseRecord>; resultsFile: string | null }>();
  const parameters = spec.parameters.map((p) => ({ name: p.name, path: p.path.join('.'), kind: p.values.kind === 'draw' ? `draw ${p.values.dist}` : p.values.kind }));
  const outputs = spec.outputs.map((o) => ({ name: o.name, kind: o.kind }));

  const tableOf = (complete: boolean): SweepTable => {
    const done = rows.filter((r) => r !== undefined);
    return {
      format: TABLE_FORMAT,
      version: TABLE_VERSION,
      engine: { name: 'skein', version: ENGINE_VERSION },
      created: new Date().toISOString(),
      title: spec.title,
      seed: spec.seed,
      combine: spec.combine,
      totalCases: nAll,
      parameters,
      outputs,
      rows: done,
      summary: summariseRows(parameters, outputs, done),
      complete,
    };
  };

  let finished = 0;
  let tFirst = 0;
  const report = (): void => {
    if (!options.onProgress) return;
    if (counts.computed === 1 && tFirst === 0) tFirst = performance.now();
    // The rate from the first computed case on, so that worker start-up does not inflate the ETA.
    const rate = (counts.computed - 1) / ((performance.now() - tFirst) / 1000);
    const left = total - finished;
    options.onProgress({ done: finished, total, computed: counts.computed, failed: counts.failed, etaS: left === 0 ? 0 : counts.computed > 1 && rate > 0 ? left / rate : NaN });
  };
  report();

  // The pool starts only when a case must be computed (a fully cached resume starts no thread).
  let executor: CaseExecutor | undefined = options.executor;
  let starting: Promise<CaseExecutor> | undefined;
  const getExecutor = (): Promise<CaseExecutor> => {
    if (executor) return Promise.resolve(executor);
    starting ??= Promise.resolve().then(() => {
      const pool = createCasePool({ modules: registry.modules, workers: options.workers });
      executor = { capacity: Math.max(1, pool.workers) * 2, run: (t) => pool.run(t), close: () => pool.close() };
      return executor;
    });
    return starting;
  };
  const lanes = options.executor ? options.executor.capacity : Math.max(1, options.workers ?? availableParallelism()) * 2;

  let lastFlush = performance.now();
  let flushCostMs = 0;
  const flushEveryMs = (options.flushEveryS ?? 2) * 1000;
  let interrupted = false;
  let cursor = 0;

  const one = async (slot: number): Promise<void> => {
    const c = makeCase(first + slot * stride);
    const rowOf = (rec: CaseRecord, source: SweepRow['source'], resultsFile: string | null): SweepRow => ({
      index: c.index,
      digest: rec.digest,
      status: rec.ok ? 'ok' : 'failed',
      values: c.values,
      outputs: rec.outputs,
      error: rec.error ?? null,
      resultsFile: resultsFile ? relativeTo(options.tablePath, resultsFile) : null,
      source,
    });
    let digest: string;
    try {
      digest = resolveScenarioData(c.scenario, { registry }).digest;
    } catch (e) {
      // A value the engine refuses (a drawn negative resistance): recorded, never run.
      rows[slot] = rowOf(failedRecord({ key: '', digest: digestOf(c.scenario), outputs: spec.outputs }, e), 'input', null);
      counts.failed++;
      return;
    }
    const key = `${digest}-${outputsKey}`;
    const resultsFile = options.resultsDir ? join(options.resultsDir, `case-${c.index}.results.msgpack`) : null;
    const earlier = byKey.get(key);
    if (earlier) {
      const rec = await earlier.record;
      // A repeat gets its own copy of the results file, so that every case index has one.
      const copied = resultsFile !== null && earlier.resultsFile !== null && existsSync(earlier.resultsFile);
      if (copied) copyFileSync(earlier.resultsFile!, resultsFile!);
      rows[slot] = rowOf(rec, 'duplicate', copied ? resultsFile : null);
      counts.duplicates++;
      if (!rec.ok) counts.failed++;
      return;
    }
    const cacheFile = options.cacheDir ? cachePath(options.cacheDir, key) : undefined;
    if (cacheFile && existsSync(cacheFile) && (!resultsFile || existsSync(resultsFile))) {
      let rec: CaseRecord | undefined;
      try {
        rec = decodeCaseRecord(readFileSync(cacheFile));
      } catch {
        // An unreadable cache entry is computed again (and overwritten).
      }
      if (rec) {
        byKey.set(key, { record: Promise.resolve(rec), resultsFile });
        rows[slot] = rowOf(rec, 'cached', resultsFile);
        counts.cached++;
        if (!rec.ok) counts.failed++;
        return;
      }
    }
    const task: CaseTask = { key, digest, scenario: c.scenario, outputs: spec.outputs, keepResults: resultsFile !== null };
    const record = getExecutor()
      .then((exec) => exec.run(task))
      .catch((e: unknown) => failedRecord(task, e))
      .then((rec) => {
        if (resultsFile && rec.results) writeFileAtomic(resultsFile, rec.results);
        const keep: CaseRecord = { ...rec, results: undefined };
        if (cacheFile && (rec.ok || rec.deterministic)) writeFileAtomic(cacheFile, encodeCaseRecord(keep));
        return keep;
      });
    byKey.set(key, { record, resultsFile });
    const rec = await record;
    rows[slot] = rowOf(rec, 'computed', resultsFile);
    counts.computed++;
    if (!rec.ok) counts.failed++;
  };

  const lane = async (): Promise<void> => {
    while (cursor < total) {
      if (options.signal?.aborted) {
        interrupted = true;
        return;
      }
      await one(cursor++);
      finished++;
      report();
      // Rewrite the table now and then; never spend more than a tenth of the time on it.
      if (options.tablePath && performance.now() - lastFlush > Math.max(flushEveryMs, 10 * flushCostMs)) {
        const tf = performance.now();
        writeTable(tableOf(false), options.tablePath);
        lastFlush = performance.now();
        flushCostMs = lastFlush - tf;
      }
    }
  };
  try {
    await Promise.all(Array.from({ length: Math.min(lanes, Math.max(1, total)) }, lane));
  } finally {
    if (!options.executor && executor) await executor.close();
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
