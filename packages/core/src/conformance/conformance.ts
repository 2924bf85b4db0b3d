/**
 * The plugin conformance suite: every plugin, built-in or a user's, must pass it. It imports the
 * module by specifier inside a worker thread (as the engine's workers will) and checks the
 * default export's plugins: shape and kebab-case type, parameter schema (summaries, units),
 * create with valid parameters, finite step values, no allocation in the step hooks, no state
 * shared between instances, finish callable after a failure.
 */
import { pathToFileURL } from 'node:url';
import { Worker } from 'node:worker_threads';
import { conformanceFailed, type ConformanceReport } from './report.ts';
import type { WorkerInput } from './workerChecks.ts';

/** Options of the conformance suite. */
export interface ConformanceOptions {
  /** URL bare specifiers and relative paths are resolved from (e.g. `import.meta.url`); default: the current directory. */
  parentUrl?: string;
  /**
   * Parameters by plugin type, as the factory receives them (SI numbers, resolved tables), merged
   * over synthesised ones (each default, else a typical value within the bounds). Needed where
   * parameters constrain each other (tau2 > tau1) or must name something.
   */
  params?: Record<string, Record<string, unknown>>;
  /** Step-hook calls measured by the allocation check; default 1e5. */
  steps?: number;
  /**
   * Largest heap growth allowed over `steps` calls after the harness's own is subtracted [bytes];
   * default 262144 (256 KiB). One allocated heap number per call (16 bytes) over 1e5 calls is
   * 1.6 MB, six times this bound; the harness's own noise is under 40 kB.
   */
  allocationBoundBytes?: number;
  /** Time step [s] and end time [s] the fake contexts give; defaults 1e-10 and 1e-5. */
  dtS?: number;
  endS?: number;
  /** Give up after this long [ms]; default 120000. */
  timeoutMs?: number;
}

const WORKER_URL = new URL('./conformanceWorker.mjs', import.meta.url);

/**
 * Runs the conformance suite over one plugin module.
 * @param specifier a bare package name ('@skein/plugin-loads'), a relative or absolute path, or a URL.
 * @param options see ConformanceOptions.
 * @returns the report: every check with pass/fail and a message; `ok` when all pass. A module that
 *   does not load gives a report with a failed `loads-in-worker` check, not a rejection.
 * @throws Error when the worker dies or times out.
 * @example const r = await checkPluginConformance('@skein/plugin-loads', { parentUrl: import.meta.url }); r.ok // true
 */
export async function checkPluginConformance(specifier: string, options: ConformanceOptions = {}): Promise<ConformanceReport> {
  const input: WorkerInput = {
    specifier,
    parentUrl: options.parentUrl ?? pathToFileURL(`${process.cwd()}/`).href,
    params: options.params ?? {},
    steps: options.steps ?? 100_000,
    allocationBoundBytes: options.allocationBoundBytes ?? 262_144,
    dtS: options.dtS ?? 1e-10,
    endS: options.endS ?? 1e-5,
  };
  const timeoutMs = options.timeoutMs ?? 120_000;
  return new Promise<ConformanceReport>((resolve, reject) => {
    const worker = new Worker(WORKER_URL, { workerData: input, stdout: false, stderr: false });
    let settled = false;
    const timer = setTimeout(() => {
      settle(() => reject(new Error(`conformance suite for ${specifier} did not finish within ${timeoutMs} ms`)));
    }, timeoutMs);
    const settle = (f: () => void): void => {
      if (settled) return;
      settled = true;
      clearTimeout(timer);
      void worker.terminate();
      f();
    };
    worker.once('message', (report: ConformanceReport) => settle(() => resolve(report)));
    worker.once('error', (e) => settle(() => reject(new Error(`conformance worker for ${specifier} failed: ${e.message}`, { cause: e }))));
    worker.once('exit', (code) => settle(() => reject(new Error(`conformance worker for ${specifier} exited with code ${code} before reporting`))));
  });
}

/**
 * Runs the suite and throws when any check fails: one line for a test.
 * @example it('passes the conformance suite', () => assertPluginConformance('@skein/plugin-probes', { parentUrl: import.meta.url }));
 * @returns the report when every check passed.
 * @throws SkeinError E_CONFORMANCE listing each failed check (details.report holds the report).
 */
export async function assertPluginConformance(specifier: string, options: ConformanceOptions = {}): Promise<ConformanceReport> {
  const report = await checkPluginConformance(specifier, options);
  if (!report.ok) throw conformanceFailed(report);
  return report;
}
