/**
 * The case pool: worker threads (piscina) that run cases, each worker loading the same plugin
 * modules in the same order as the main thread. With 0 workers the cases run in the calling
 * thread (same code path, for debugging and tiny sweeps).
 */
import { availableParallelism } from 'node:os';
import { loadPluginModules, PluginRegistry } from '@skein/core';
import { Piscina } from 'piscina';
import { decodeCaseRecord, runCase, type CaseRecord, type CaseTask } from './caseRun.ts';

/** Runs cases; `close` ends the workers. */
export interface CasePool {
  /** Number of worker threads (0: in the calling thread). */
  readonly workers: number;
  run(task: CaseTask): Promise<CaseRecord>;
  /**
   * Starts every worker and loads its plugins; with `sample`, also runs it `rounds` times per
   * worker so that the engine's code is compiled by the JIT before a timed run.
   */
  warm(sample?: CaseTask, rounds?: number): Promise<void>;
  close(): Promise<void>;
}

/** Options of createCasePool. */
export interface CasePoolOptions {
  /** Plugin module URLs in load order: a loaded registry's `modules`. */
  modules: readonly string[];
  /** Worker threads; default: the machine's available parallelism. 0 runs in this thread. */
  workers?: number;
}

const BOOTSTRAP = new URL('./worker/bootstrap.mjs', import.meta.url).href;

/**
 * Creates a pool of case workers.
 * @param options plugin module URLs and the number of workers.
 * @returns the pool (call close when done).
 * @example const pool = createCasePool({ modules: registry.modules, workers: 2 }); await pool.run(task); await pool.close();
 */
export function createCasePool(options: CasePoolOptions): CasePool {
  const workers = options.workers ?? availableParallelism();
  const modules = [...options.modules];
  if (workers === 0) {
    let registry: Promise<PluginRegistry> | undefined;
    const get = (): Promise<PluginRegistry> => (registry ??= loadPluginModules(new PluginRegistry(), modules));
    return {
      workers,
      run: async (task) => runCase(await get(), task),
      warm: async (sample, rounds = 20) => {
        const registry = await get();
        if (sample) for (let k = 0; k < rounds; k++) await runCase(registry, sample);
      },
      close: async () => {},
    };
  }
  const piscina = new Piscina({
    filename: BOOTSTRAP,
    minThreads: workers,
    maxThreads: workers,
    idleTimeout: 60_000,
    workerData: { modules },
    // No per-task timing histograms: the main thread's time per case is the pool's overhead.
    recordTiming: false,
  });
  return {
    workers,
    async run(task) {
      const bytes = (await piscina.run(task)) as Uint8Array;
      return decodeCaseRecord(bytes);
    },
    async warm(sample, rounds = 20) {
      // Each ping holds a worker long enough that the next ping must go to another worker.
      await Promise.all(Array.from({ length: workers }, () => piscina.run({ pingMs: 150 })));
      if (!sample) return;
      // One lane per worker: a free worker takes the next sample, so every worker gets about `rounds`.
      let left = rounds * workers;
      const lane = async (): Promise<void> => {
        while (left-- > 0) await piscina.run(sample);
      };
      await Promise.all(Array.from({ length: workers }, lane));
    },
    close: () => piscina.destroy(),
  };
}
