/**
 * The task function of a pool worker. It loads the plugin modules named in `workerData.modules`
 * (resolved URLs, the main thread's list in the main thread's order) once, then runs cases. Each
 * case's record goes back as MessagePack bytes in an ArrayBuffer that is transferred, not copied.
 */
import { workerData } from 'node:worker_threads';
import { loadPluginModules, PluginRegistry } from '@skein/core';
import { move } from 'piscina';
import { encodeCaseRecord, runCase, type CaseTask } from '../caseRun.ts';

const modules = (workerData as { modules?: string[] } | undefined)?.modules ?? [];
const registry = await loadPluginModules(new PluginRegistry(), modules);

/** A warm-up task: hold the worker for `pingMs` [ms] so that every worker gets one. */
interface PingTask { pingMs: number }

export default async function caseTask(task: CaseTask | PingTask): Promise<unknown> {
  if ('pingMs' in task) {
    await new Promise((r) => setTimeout(r, task.pingMs));
    return registry.modules.length;
  }
  const packed = encodeCaseRecord(await runCase(registry, task));
  // msgpackr packs into a shared scratch buffer: give the record a buffer of its own to transfer.
  const own = new Uint8Array(packed.byteLength);
  own.set(packed);
  return move(own);
}
