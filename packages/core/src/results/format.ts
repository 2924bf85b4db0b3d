/**
 * The results file: one MessagePack map per run, plain types only (maps, arrays, strings,
 * numbers, booleans, nil, bin), so any MessagePack reader in any language opens it.
 *
 *   format: "skein-results", version: 1
 *   engine: { name, version }
 *   created: ISO 8601 text (the only field that differs between two runs of one scenario)
 *   scenario: { title, digest (SHA-256 hex of the resolved scenario), file }
 *   units: { time: "s", ... }
 *   time: { stepS, recordEvery, sampleIntervalS, count }        sample i is at i * sampleIntervalS
 *   traces: { names[], units[], probes[], dtype: "float64", byteOrder: "little", shape: [traces, samples], data: bin }
 *   outputs: { probeId: structured output }
 *   summary: { peaks[], ledger, warnings[], timing }
 *   derived: { lines[], delays[] }
 *   network: { lines[], junctions[], probes[] }
 *   spectral: optional, written by the frequency-domain solver
 */
import { randomBytes } from 'node:crypto';
import { closeSync, fsyncSync, openSync, renameSync, unlinkSync, writeSync, readFileSync } from 'node:fs';
import { Packr, Unpackr } from 'msgpackr';
import ndarray, { type NdArray } from 'ndarray';
import { badResults } from '../errors.ts';
import type { RunResult } from '../run/run.ts';

/** Format name and version written in every results file. */
export const RESULTS_FORMAT = 'skein-results';
export const RESULTS_VERSION = 1;
/** Engine version written in results headers. */
export const ENGINE_VERSION = '0.1.0';

const packr = new Packr({ useRecords: false, moreTypes: false, structuredClone: false, bundleStrings: false, useFloat32: 0, int64AsType: 'number' } as never);
const unpackr = new Unpackr({ useRecords: false, moreTypes: false, structuredClone: false, mapsAsObjects: true, int64AsType: 'number' } as never);

const LITTLE = new Uint8Array(new Float64Array([1]).buffer)[7] === 0x3f;

/** Little-endian bytes of a Float64Array (a view when the machine is little-endian). */
export function float64ToBytes(a: Float64Array): Uint8Array {
  if (LITTLE) return new Uint8Array(a.buffer, a.byteOffset, a.byteLength);
  const out = new Uint8Array(a.byteLength);
  const dv = new DataView(out.buffer);
  for (let i = 0; i < a.length; i++) dv.setFloat64(i * 8, a[i], true);
  return out;
}

/** Float64Array from little-endian bytes (copied, so it is aligned). */
export function bytesToFloat64(b: Uint8Array): Float64Array {
  if (b.byteLength % 8 !== 0) throw badResults('(bytes)', `float64 data of ${b.byteLength} bytes is not a multiple of 8`);
  const out = new Float64Array(b.byteLength / 8);
  const dv = new DataView(b.buffer, b.byteOffset, b.byteLength);
  for (let i = 0; i < out.length; i++) out[i] = dv.getFloat64(i * 8, true);
  return out;
}

/** The document stored in a results file, with the traces as a typed view once read. */
export interface ResultsDocument {
  format: string;
  version: number;
  engine: { name: string; version: string };
  created: string;
  scenario: { title: string; digest: string; file: string | null };
  units: Record<string, string>;
  time: { stepS: number; recordEvery: number; sampleIntervalS: number; count: number; steps: number };
  traces: { names: string[]; units: string[]; probes: string[]; dtype: 'float64'; byteOrder: 'little'; shape: [number, number]; data: Uint8Array };
  outputs: Record<string, unknown>;
  summary: { peaks: unknown[]; ledger: unknown; warnings: string[]; timing: Record<string, number> };
  derived: { lines: unknown[]; delays: unknown[] };
  network: unknown;
  spectral?: unknown;
}

/** Builds the results document of a run. */
export function resultsDocument(r: RunResult, file?: string, created = new Date()): ResultsDocument {
  return {
    format: RESULTS_FORMAT,
    version: RESULTS_VERSION,
    engine: { name: 'skein', version: ENGINE_VERSION },
    created: created.toISOString(),
    scenario: { title: r.title, digest: r.digest, file: file ?? null },
    units: { time: 's', voltage: 'V', current: 'A', energy: 'J', length: 'm' },
    time: { stepS: r.dtS, recordEvery: r.recordEvery, sampleIntervalS: r.dtS * r.recordEvery, count: r.nSamples, steps: r.nSteps },
    traces: {
      names: r.traceNames,
      units: r.traceUnits,
      probes: r.traceProbes,
      dtype: 'float64',
      byteOrder: 'little',
      shape: [r.traceNames.length, r.nSamples],
      data: float64ToBytes(r.traces.data.subarray(0, r.traceNames.length * r.nSamples)),
    },
    outputs: r.outputs,
    summary: { peaks: r.peaks, ledger: r.ledger ?? null, warnings: r.warnings, timing: r.timing },
    derived: { lines: r.lines, delays: r.delays },
    network: r.network,
  };
}

/** Encodes a results document as plain MessagePack. */
export function encodeResults(doc: ResultsDocument): Uint8Array {
  return packr.pack(sanitize(doc)) as Uint8Array;
}

// Plain types only: typed arrays other than bytes become lists, Maps become objects, non-finite
// numbers stay floats (MessagePack has them), undefined becomes nil.
function sanitize(x: unknown): unknown {
  if (x instanceof Uint8Array) return x;
  if (ArrayBuffer.isView(x)) return Array.from(x as unknown as ArrayLike<number>);
  if (x instanceof Map) return Object.fromEntries([...x].map(([k, v]) => [String(k), sanitize(v)]));
  if (Array.isArray(x)) return x.map(sanitize);
  if (x !== null && typeof x === 'object') {
    const o: Record<string, unknown> = {};
    for (const [k, v] of Object.entries(x)) if (v !== undefined) o[k] = sanitize(v);
    return o;
  }
  return x === undefined ? null : x;
}

/**
 * Writes bytes atomically: a temporary file beside the target, flushed, then renamed over it, so a
 * crash never leaves a half file under the final name.
 */
export function writeFileAtomic(path: string, bytes: Uint8Array | string): void {
  const tmp = `${path}.${process.pid}.${randomBytes(4).toString('hex')}.tmp`;
  const fd = openSync(tmp, 'w');
  try {
    const buf = typeof bytes === 'string' ? Buffer.from(bytes, 'utf8') : bytes;
    let off = 0;
    while (off < buf.byteLength) off += writeSync(fd, buf, off, buf.byteLength - off);
    fsyncSync(fd);
  } catch (e) {
    closeSync(fd);
    try { unlinkSync(tmp); } catch { /* already gone */ }
    throw e;
  }
  closeSync(fd);
  renameSync(tmp, path);
}

/** Writes a run's results file atomically. */
export function writeResults(path: string, r: RunResult, scenarioFile?: string): ResultsDocument {
  const doc = resultsDocument(r, scenarioFile);
  writeFileAtomic(path, encodeResults(doc));
  return doc;
}

/** A results file read back: the document plus the traces as an ndarray [trace, sample]. */
export interface LoadedResults {
  doc: ResultsDocument;
  traces: NdArray<Float64Array>;
  /** Sample times [s]. */
  time: Float64Array;
  /** The samples of one trace by name. */
  trace(name: string): Float64Array;
}

/**
 * Decodes results bytes.
 * @throws SkeinError E_RESULTS when the bytes are not a skein results file of a known version.
 */
export function decodeResults(bytes: Uint8Array, file = '(bytes)'): LoadedResults {
  let doc: ResultsDocument;
  try {
    doc = unpackr.unpack(bytes) as ResultsDocument;
  } catch (e) {
    throw badResults(file, `not MessagePack (${(e as Error).message})`);
  }
  if (doc === null || typeof doc !== 'object' || doc.format !== RESULTS_FORMAT) throw badResults(file, `format is not "${RESULTS_FORMAT}"`);
  if (doc.version !== RESULTS_VERSION) throw badResults(file, `version ${doc.version} is not ${RESULTS_VERSION}`);
  const [nT, nS] = doc.traces.shape;
  const data = bytesToFloat64(doc.traces.data);
  if (data.length !== nT * nS) throw badResults(file, `trace data holds ${data.length} values, shape says ${nT} x ${nS}`);
  const traces = ndarray(data.length > 0 ? data : new Float64Array(1), [nT, nS]);
  const time = new Float64Array(nS);
  for (let i = 0; i < nS; i++) time[i] = i * doc.time.sampleIntervalS;
  return {
    doc,
    traces,
    time,
    trace(name: string): Float64Array {
      const i = doc.traces.names.indexOf(name);
      if (i < 0) throw badResults(file, `has no trace "${name}"; it has ${doc.traces.names.join(', ')}`);
      return data.subarray(i * nS, (i + 1) * nS);
    },
  };
}

/** Reads a results file from disk. */
export function readResults(path: string): LoadedResults {
  let bytes: Buffer;
  try {
    bytes = readFileSync(path);
  } catch (e) {
    throw badResults(path, (e as Error).message);
  }
  return decodeResults(new Uint8Array(bytes.buffer, bytes.byteOffset, bytes.byteLength), path);
}
