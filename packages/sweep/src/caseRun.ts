/**
 * Running one case: resolve the scenario data, run it, evaluate the named outputs. Used the same
 * way by the worker threads, the queue consumer and the in-thread runner, so every mode gives
 * the same numbers. A case's record travels as MessagePack bytes (plain types only).
 */
import { threadId } from 'node:worker_threads';
import { encodeResults, resolveScenarioData, resultsDocument, runScenario, SkeinError, type PluginRegistry } from '@skein/core';
import { Packr, Unpackr } from 'msgpackr';
import { outputValue } from './outputs.ts';
import type { OutputSpec } from './spec.ts';

/** What a worker is asked to do for one case. Plain data only (it crosses threads and machines). */
export interface CaseTask {
  /** Cache key: scenario digest plus outputs key. */
  key: string;
  /** Digest of the resolved scenario. */
  digest: string;
  /** The scenario data of the case. */
  scenario: unknown;
  outputs: OutputSpec[];
  /** Also return the whole results document (MessagePack) of the run. */
  keepResults: boolean;
}

/** What a case gave. Failed cases carry their error; their outputs are NaN. */
export interface CaseRecord {
  key: string;
  digest: string;
  ok: boolean;
  /** One value per output, in the sweep's output order. */
  outputs: number[];
  error?: { code: string; message: string };
  /** True when the failure comes from the case itself (bad value, non-convergence) and would repeat. */
  deterministic: boolean;
  /** Wall time of the run [s]. */
  elapsedS: number;
  /** The thread that ran it (worker_threads threadId; 0 is the main thread). */
  thread?: number;
  /** The run's results document as MessagePack, when asked for. */
  results?: Uint8Array;
}

const packr = new Packr({ useRecords: false, moreTypes: false, structuredClone: false, bundleStrings: false, useFloat32: 0, int64AsType: 'number' } as never);
const unpackr = new Unpackr({ useRecords: false, moreTypes: false, structuredClone: false, mapsAsObjects: true, int64AsType: 'number' } as never);

/**
 * Encodes a case record as plain MessagePack.
 * @example decodeCaseRecord(encodeCaseRecord(rec)).outputs // rec.outputs
 */
export function encodeCaseRecord(r: CaseRecord): Uint8Array {
  return packr.pack(r) as Uint8Array;
}

/**
 * Decodes MessagePack bytes made by encodeCaseRecord.
 * @throws SkeinError E_CASE_RECORD when the bytes are not a case record.
 */
export function decodeCaseRecord(bytes: Uint8Array): CaseRecord {
  let r: CaseRecord;
  try {
    r = unpackr.unpack(bytes) as CaseRecord;
  } catch (e) {
    throw new SkeinError('E_CASE_RECORD', `not a sweep case record: ${(e as Error).message}`);
  }
  if (!r || typeof r.key !== 'string' || !Array.isArray(r.outputs)) throw new SkeinError('E_CASE_RECORD', 'not a sweep case record (no key or outputs)');
  if (r.results && !(r.results instanceof Uint8Array)) r.results = new Uint8Array(r.results as ArrayLike<number>);
  return r;
}

/** A record for a case that failed with `e`. */
export function failedRecord(task: Pick<CaseTask, 'key' | 'digest' | 'outputs'>, e: unknown, elapsedS = 0): CaseRecord {
  const deterministic = e instanceof SkeinError && e.code !== 'E_BUG';
  const code = e instanceof SkeinError ? e.code : 'E_CASE';
  const message = e instanceof Error ? e.message : String(e);
  return { key: task.key, digest: task.digest, ok: false, outputs: task.outputs.map(() => NaN), error: { code, message }, deterministic, elapsedS };
}

/**
 * Runs one case with the given plugins. Never throws for a failing case: the error is recorded.
 * @param registry the plugins (the same modules, in the same order, in every thread).
 * @param task the case.
 * @returns its record.
 * @example (await runCase(registry, task)).outputs
 */
export async function runCase(registry: PluginRegistry, task: CaseTask): Promise<CaseRecord> {
  const t0 = performance.now();
  try {
    const sc = resolveScenarioData(task.scenario, { registry });
    const r = await runScenario(sc, { registry });
    const outputs = task.outputs.map((o) => outputValue(r, o));
    const rec: CaseRecord = { key: task.key, digest: task.digest, ok: true, outputs, deterministic: true, elapsedS: (performance.now() - t0) / 1000, thread: threadId };
    if (task.keepResults) rec.results = encodeResults(resultsDocument(r));
    return rec;
  } catch (e) {
    return { ...failedRecord(task, e, (performance.now() - t0) / 1000), thread: threadId };
  }
}
