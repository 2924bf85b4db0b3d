/**
 * Sweeps across machines through a Redis queue (BullMQ). The producer adds one job per case with
 * the case key (scenario digest plus outputs key) as the job id, so adding a case twice makes one
 * job; consumers run jobs on their local worker pool and store each record in a Redis hash under
 * the same key, so a retried job overwrites its own entry and never duplicates or loses a result.
 * The producer reads records back from the hash.
 */
import { InputError, type PluginRegistry } from '@skein/core';
import { Queue, Worker, type Job } from 'bullmq';
import { Redis } from 'ioredis';
import { decodeCaseRecord, encodeCaseRecord, type CaseRecord, type CaseTask } from './caseRun.ts';
import { createCasePool } from './pool.ts';
import type { CaseExecutor } from './sweep.ts';

/** Default queue name. */
export const DEFAULT_QUEUE_NAME = 'skein-sweep';

/** Where the queue lives. */
export interface QueueTarget {
  /** redis://[user:password@]host:port[/db] */
  url: string;
  /** Queue name (default "skein-sweep"); producer and consumers must agree. */
  name?: string;
}

function connectionOf(url: string): { host: string; port: number; db: number; username?: string; password?: string; maxRetriesPerRequest: null } {
  let u: URL;
  try {
    u = new URL(url);
  } catch {
    throw new InputError('E_QUEUE_URL', ['--queue'], 'must be a Redis URL such as redis://127.0.0.1:6379', url);
  }
  if (u.protocol !== 'redis:') throw new InputError('E_QUEUE_URL', ['--queue'], 'must be a Redis URL such as redis://127.0.0.1:6379', url);
  const db = u.pathname.length > 1 ? Number(u.pathname.slice(1)) : 0;
  if (!Number.isInteger(db) || db < 0) throw new InputError('E_QUEUE_URL', ['--queue'], 'must name a database number after the port, e.g. redis://host:6379/0', url);
  return {
    host: u.hostname || '127.0.0.1',
    port: u.port ? Number(u.port) : 6379,
    db,
    username: u.username || undefined,
    password: u.password ? decodeURIComponent(u.password) : undefined,
    // Required by BullMQ workers: commands wait for a reconnect instead of failing.
    maxRetriesPerRequest: null,
  };
}

/** The Redis hash holding finished case records of a queue. */
export function resultsHashOf(name: string): string {
  return `${name}:skein-results`;
}

/** Options of the producer side. */
export interface QueueExecutorOptions extends QueueTarget {
  /** Cases in flight at once (default 1000). */
  capacity?: number;
  /** Attempts per job when a consumer crashes or a case fails for a reason outside the case (default 3). */
  attempts?: number;
  /** Poll interval for finished records [ms] (default 200). */
  pollMs?: number;
}

/**
 * Creates the producer: an executor for runSweep that sends cases to the queue and waits for
 * their records.
 * @param options Redis URL, queue name, in-flight cases, attempts.
 * @returns a CaseExecutor (close it when done).
 * @throws InputError E_QUEUE_URL for a malformed URL.
 * @example await runSweep(spec, { registry, executor: await createQueueExecutor({ url: 'redis://127.0.0.1:6379' }) })
 */
export async function createQueueExecutor(options: QueueExecutorOptions): Promise<CaseExecutor> {
  const name = options.name ?? DEFAULT_QUEUE_NAME;
  const connection = connectionOf(options.url);
  const redis = new Redis(connection);
  const queue = new Queue(name, { connection });
  const hash = resultsHashOf(name);
  const waiting = new Map<string, Array<(r: CaseRecord) => void>>();
  let closed = false;
  const pollMs = options.pollMs ?? 200;
  let timer: NodeJS.Timeout | undefined;
  const poll = async (): Promise<void> => {
    timer = undefined;
    if (closed || waiting.size === 0) return;
    const keys = [...waiting.keys()];
    try {
      const found = await redis.hmgetBuffer(hash, ...keys);
      found.forEach((b, i) => {
        if (!b) return;
        const rec = decodeCaseRecord(b);
        const fns = waiting.get(keys[i]) ?? [];
        waiting.delete(keys[i]);
        for (const f of fns) f(rec);
      });
    } finally {
      schedule();
    }
  };
  const schedule = (): void => {
    if (!closed && !timer && waiting.size > 0) timer = setTimeout(() => void poll(), pollMs);
  };
  return {
    capacity: options.capacity ?? 1000,
    async run(task: CaseTask): Promise<CaseRecord> {
      const have = await redis.hgetBuffer(hash, task.key);
      if (have) return decodeCaseRecord(have);
      const result = new Promise<CaseRecord>((resolve) => {
        const list = waiting.get(task.key) ?? [];
        list.push(resolve);
        waiting.set(task.key, list);
      });
      // Same job id, same job: BullMQ ignores an add whose id exists.
      await queue.add('case', task, { jobId: task.key, attempts: options.attempts ?? 3, backoff: { type: 'fixed', delay: 500 }, removeOnComplete: true, removeOnFail: 10_000 });
      schedule();
      return result;
    },
    async close() {
      closed = true;
      if (timer) clearTimeout(timer);
      await queue.close();
      redis.disconnect();
    },
  };
}

/** Options of a queue consumer. */
export interface ServeQueueOptions extends QueueTarget {
  registry: PluginRegistry;
  /** Local worker threads (default: available parallelism). */
  workers?: number;
  /** Stop after this many seconds without a job (default: run until closed). */
  idleExitS?: number;
  /** Called after each case. */
  onCase?: (rec: CaseRecord) => void;
}

/** A running consumer. */
export interface QueueConsumer {
  /** Resolves when the consumer has stopped, with the number of cases it computed. */
  readonly stopped: Promise<{ processed: number }>;
  close(): Promise<void>;
}

/**
 * Starts a consumer: takes cases from the queue and runs them on a local worker pool.
 * @param options Redis URL, queue name, plugins, workers, idle exit.
 * @returns the consumer; `stopped` resolves after close() or the idle timeout.
 * @throws InputError E_QUEUE_URL for a malformed URL.
 * @example const c = serveQueue({ url: 'redis://10.0.0.5:6379', registry, workers: 8 }); await c.stopped;
 */
export function serveQueue(options: ServeQueueOptions): QueueConsumer {
  const name = options.name ?? DEFAULT_QUEUE_NAME;
  const connection = connectionOf(options.url);
  const pool = createCasePool({ modules: options.registry.modules, workers: options.workers });
  const redis = new Redis(connection);
  const hash = resultsHashOf(name);
  let processed = 0;
  let active = 0;
  let last = Date.now();
  const worker = new Worker(
    name,
    async (job: Job<CaseTask>) => {
      active++;
      try {
        const rec = await pool.run(job.data);
        const attempts = job.opts.attempts ?? 1;
        // A failure from outside the case (a crashed worker) is retried by BullMQ; the last attempt is recorded.
        if (!rec.ok && !rec.deterministic && job.attemptsMade + 1 < attempts) throw new Error(rec.error?.message ?? 'case failed');
        await redis.hset(hash, rec.key, Buffer.from(encodeCaseRecord(rec)));
        processed++;
        options.onCase?.(rec);
        return rec.ok;
      } finally {
        active--;
        last = Date.now();
      }
    },
    { connection, concurrency: Math.max(1, pool.workers) },
  );
  let stopping: Promise<void> | undefined;
  let idleTimer: NodeJS.Timeout | undefined;
  let resolveStopped!: (v: { processed: number }) => void;
  const stopped = new Promise<{ processed: number }>((r) => (resolveStopped = r));
  const close = (): Promise<void> => {
    stopping ??= (async () => {
      if (idleTimer) clearInterval(idleTimer);
      await worker.close();
      await pool.close();
      redis.disconnect();
      resolveStopped({ processed });
    })();
    return stopping;
  };
  if (options.idleExitS !== undefined) {
    const idleMs = options.idleExitS * 1000;
    idleTimer = setInterval(() => {
      if (active === 0 && Date.now() - last > idleMs) void close();
    }, Math.min(500, idleMs));
  }
  return { stopped, close };
}
