/**
 * `skein sweep`: the command line of the sweep package, as a function the `skein` command calls.
 * Exit codes: 0 done (failing cases are recorded in the table, not an error), 2 bad input,
 * 1 any other failure, 130 interrupted (finished cases are kept; run again to resume).
 */
import { basename, dirname, join } from 'node:path';
import { parseArgs } from 'node:util';
import { formatQuantity, InputError, SkeinError, type PluginRegistry } from '@skein/core';
import { createSweepProgress } from './progress.ts';
import { createQueueExecutor, DEFAULT_QUEUE_NAME, serveQueue } from './queue.ts';
import { loadSweepFile } from './spec.ts';
import { runSweep, type SweepOutcome } from './sweep.ts';
import { mergeTables, readTable, writeTable, type SweepTable } from './table.ts';

/** Text output of the command. */
export interface SweepIo {
  out(s: string): void;
  err(s: string): void;
}

/** How the command gets its plugins: the `skein` command's registry builder (standard set, configuration, --plugin). */
export type RegistryBuilder = (flags: { plugin?: string[]; config?: string }) => Promise<PluginRegistry>;

/** Options of sweepCommand. */
export interface SweepCommandOptions {
  /** Builds the plugin registry; default: @skein/cli's buildRegistry, loaded when first needed. */
  buildRegistry?: RegistryBuilder;
  /** Where the progress bar goes (default process.stderr; a terminal gets a redrawn bar). */
  progressStream?: { write(s: string): unknown; isTTY?: boolean };
}

/** Usage text of `skein sweep`. */
export const SWEEP_USAGE = `usage: skein sweep SWEEP.yaml [options]
       skein sweep SWEEP.yaml --queue redis://HOST:PORT [options]   (producer)
       skein sweep --worker-of redis://HOST:PORT [options]         (consumer)
       skein sweep merge TABLE.msgpack... --out PATH [--csv PATH]

Runs every case of a sweep file and writes a table of cases x outputs.

options:
  --workers N        worker threads (default: the machine's available parallelism; 0: no threads)
  --out PATH         the table, MessagePack (default: SWEEP.table.msgpack beside the sweep file)
  --csv PATH         the table as CSV (default: the table path with .csv)
  --results DIR      also write each case's results file, DIR/case-<index>.results.msgpack
  --cache DIR        finished cases by digest, read on resume (default: the table path with .cache)
  --no-cache         neither read nor write the cache
  --shard K/N        run only cases with index mod N = K (K from 0); tables merge by case
  --queue URL        send the cases to a Redis queue and collect the results
  --worker-of URL    take cases from a Redis queue and run them here
  --queue-name NAME  queue name (default ${DEFAULT_QUEUE_NAME})
  --idle-exit S      a consumer stops after S seconds without a case
  --plugin SPEC      also load this plugin module (repeatable)
  --config PATH      configuration file with { "plugins": [...] }
  --quiet            no progress output
`;

interface Flags {
  workers?: string;
  out?: string;
  csv?: string;
  results?: string;
  cache?: string;
  'no-cache'?: boolean;
  shard?: string;
  queue?: string;
  'worker-of'?: string;
  'queue-name'?: string;
  'idle-exit'?: string;
  plugin?: string[];
  config?: string;
  quiet?: boolean;
  help?: boolean;
}

async function defaultBuildRegistry(flags: { plugin?: string[]; config?: string }): Promise<PluginRegistry> {
  const cli = (await import('@skein/cli')) as { buildRegistry: RegistryBuilder };
  return cli.buildRegistry(flags);
}

function parseWorkers(v: string | undefined): number | undefined {
  if (v === undefined) return undefined;
  const n = Number(v);
  if (!Number.isInteger(n) || n < 0) throw new InputError('E_USAGE', ['--workers'], 'must be a whole number of worker threads (0 runs in the main thread)', v);
  return n;
}

/**
 * Parses `K/N` into a shard (K from 0 to N - 1).
 * @throws InputError E_USAGE.
 * @example parseShard('1/4') // { index: 1, count: 4 }
 */
export function parseShard(v: string): { index: number; count: number } {
  const m = /^(\d+)\/(\d+)$/.exec(v);
  const index = m ? Number(m[1]) : NaN;
  const count = m ? Number(m[2]) : NaN;
  if (!m || !(count >= 1) || !(index < count)) throw new InputError('E_USAGE', ['--shard'], 'must be K/N with 0 <= K < N, e.g. 0/4', v);
  return { index, count };
}

function num(x: number): string {
  if (!Number.isFinite(x)) return '-';
  const a = Math.abs(x);
  return a !== 0 && (a < 1e-3 || a >= 1e6) ? x.toExponential(3) : String(Number(x.toPrecision(4)));
}

/** A text summary of a finished sweep: counts and the statistics of every column. */
export function formatSweepSummary(table: SweepTable, outcome: Pick<SweepOutcome, 'counts' | 'elapsedS'> | undefined, paths: string[]): string {
  const lines: string[] = [];
  lines.push(`sweep: ${table.title}`);
  if (outcome) {
    const c = outcome.counts;
    lines.push(`  cases ${c.cases}: ${c.computed} computed, ${c.cached} from cache, ${c.duplicates} repeats, ${c.failed} failed, in ${formatQuantity(outcome.elapsedS, 's', 3)}`);
  } else {
    lines.push(`  cases ${table.rows.length} of ${table.totalCases}`);
  }
  const names = Object.keys(table.summary);
  if (names.length > 0) {
    const w = Math.max(6, ...names.map((n) => n.length));
    lines.push(`  ${'column'.padEnd(w)}  ${['n', 'min', 'max', 'mean', 'std', 'p5', 'p50', 'p95'].map((h) => h.padStart(11)).join(' ')}`);
    for (const n of names) {
      const s = table.summary[n];
      lines.push(`  ${n.padEnd(w)}  ${[String(s.n), num(s.min), num(s.max), num(s.mean), num(s.std), num(s.p5), num(s.p50), num(s.p95)].map((x) => x.padStart(11)).join(' ')}`);
    }
  }
  const failed = table.rows.filter((r) => r.status === 'failed');
  for (const r of failed.slice(0, 5)) lines.push(`  case ${r.index} failed: ${r.error?.message ?? 'unknown error'} [${r.error?.code ?? '?'}]`);
  if (failed.length > 5) lines.push(`  ... and ${failed.length - 5} more failed cases (see the table)`);
  for (const p of paths) lines.push(`  wrote ${p}`);
  return lines.join('\n');
}

/** Default table path: beside the sweep file, `<base>.table.msgpack`. */
export function defaultTablePath(sweepFile: string): string {
  return join(dirname(sweepFile), `${basename(sweepFile).replace(/\.(ya?ml|json)$/i, '')}.table.msgpack`);
}

/**
 * Runs `skein sweep` with the arguments after "sweep".
 * @param argv e.g. ["scan.yaml", "--workers", "4"].
 * @param io where text goes.
 * @param options the registry builder (the CLI passes its own) and the progress stream.
 * @returns the exit code.
 * @example process.exitCode = await sweepCommand(['scan.yaml', '--workers', '2'], { out: console.log, err: console.error })
 */
export async function sweepCommand(argv: string[], io: SweepIo, options: SweepCommandOptions = {}): Promise<number> {
  let parsed: ReturnType<typeof parseArgs>;
  try {
    parsed = parseArgs({
      args: argv,
      allowPositionals: true,
      options: {
        workers: { type: 'string', short: 'j' },
        out: { type: 'string', short: 'o' },
        csv: { type: 'string' },
        results: { type: 'string' },
        cache: { type: 'string' },
        'no-cache': { type: 'boolean' },
        shard: { type: 'string' },
        queue: { type: 'string' },
        'worker-of': { type: 'string' },
        'queue-name': { type: 'string' },
        'idle-exit': { type: 'string' },
        plugin: { type: 'string', multiple: true },
        config: { type: 'string' },
        quiet: { type: 'boolean', short: 'q' },
        help: { type: 'boolean', short: 'h' },
      },
    });
  } catch (e) {
    io.err(`skein sweep: ${(e as Error).message}\n\n${SWEEP_USAGE}`);
    return 2;
  }
  const flags = parsed.values as Flags;
  const pos = parsed.positionals;
  if (flags.help) {
    io.out(SWEEP_USAGE);
    return 0;
  }
  const build = options.buildRegistry ?? defaultBuildRegistry;
  const stream = options.progressStream ?? process.stderr;
  const controller = new AbortController();
  const onSignal = (): void => controller.abort();
  process.once('SIGINT', onSignal);
  process.once('SIGTERM', onSignal);
  try {
    if (pos[0] === 'merge') {
      if (pos.length < 2 || !flags.out) throw new InputError('E_USAGE', [], 'skein sweep merge takes one or more table files and --out PATH', pos.slice(1).join(' ') || undefined);
      const table = mergeTables(pos.slice(1).map((p) => readTable(p)));
      writeTable(table, flags.out, flags.csv);
      io.out(formatSweepSummary(table, undefined, [flags.out, ...(flags.csv ? [flags.csv] : [])]));
      return 0;
    }
    const workers = parseWorkers(flags.workers);
    if (flags['worker-of']) {
      if (pos.length > 0) throw new InputError('E_USAGE', [], 'skein sweep --worker-of takes no sweep file (cases come from the queue)', pos.join(' '));
      const idle = flags['idle-exit'] === undefined ? undefined : Number(flags['idle-exit']);
      if (idle !== undefined && !(idle > 0)) throw new InputError('E_USAGE', ['--idle-exit'], 'must be a positive number of seconds', flags['idle-exit']);
      const registry = await build(flags);
      const consumer = serveQueue({ url: flags['worker-of'], name: flags['queue-name'], registry, workers, idleExitS: idle });
      controller.signal.addEventListener('abort', () => void consumer.close());
      if (!flags.quiet) io.err(`skein sweep: serving queue ${flags['queue-name'] ?? DEFAULT_QUEUE_NAME} at ${flags['worker-of']}`);
      const { processed } = await consumer.stopped;
      io.out(`skein sweep: consumer stopped after ${processed} cases`);
      return controller.signal.aborted ? 130 : 0;
    }
    if (pos.length !== 1) throw new InputError('E_USAGE', [], 'skein sweep takes one sweep file', pos.join(' ') || undefined);
    const file = pos[0];
    const registry = await build(flags);
    const spec = loadSweepFile(file);
    const tablePath = flags.out ?? defaultTablePath(file);
    const csvPath = flags.csv ?? tablePath.replace(/\.msgpack$/i, '') + '.csv';
    const cacheDir = flags['no-cache'] ? undefined : (flags.cache ?? `${tablePath.replace(/\.msgpack$/i, '')}.cache`);
    const shard = flags.shard ? parseShard(flags.shard) : undefined;
    const executor = flags.queue ? await createQueueExecutor({ url: flags.queue, name: flags['queue-name'] }) : undefined;
    const progress = createSweepProgress((s) => stream.write(s), stream.isTTY === true, flags.quiet);
    let outcome: SweepOutcome;
    try {
      outcome = await runSweep(spec, {
        registry, workers, executor, cacheDir, resultsDir: flags.results, shard, tablePath, csvPath,
        onProgress: (p) => progress.update(p), signal: controller.signal,
      });
    } finally {
      progress.done();
      await executor?.close();
    }
    io.out(formatSweepSummary(outcome.table, outcome, [tablePath, csvPath]));
    if (outcome.interrupted) {
      io.err('skein sweep: interrupted; finished cases are kept, run the same command again to resume');
      return 130;
    }
    return 0;
  } catch (e) {
    if (e instanceof InputError) {
      io.err(`skein sweep: ${e.message}`);
      return 2;
    }
    if (e instanceof SkeinError) {
      io.err(`skein sweep: ${e.message} [${e.code}]`);
      return 1;
    }
    io.err(`skein sweep: bug: ${(e as Error).stack ?? String(e)}`);
    return 1;
  } finally {
    process.off('SIGINT', onSignal);
    process.off('SIGTERM', onSignal);
  }
}

