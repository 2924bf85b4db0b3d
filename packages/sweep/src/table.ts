/**
 * The sweep table: one row per case (index, digest, status, parameter values, output values,
 * error), plus summary statistics per column. Written as plain MessagePack and as CSV, each
 * through a temporary file and a rename, so a crash never leaves a half table.
 */
import { readFileSync } from 'node:fs';
import { ENGINE_VERSION, SkeinError, writeFileAtomic } from '@skein/core';
import { Packr, Unpackr } from 'msgpackr';
import { summarise, type Summary } from './stats.ts';

/** The table format name and version written in every table. */
export const TABLE_FORMAT = 'skein-sweep-table';
export const TABLE_VERSION = 1;

/** One case of the table. */
export interface SweepRow {
  index: number;
  /** Digest of the resolved scenario (of the scenario data when it did not resolve). */
  digest: string;
  status: 'ok' | 'failed';
  values: unknown[];
  /** One per output; NaN for a failed case or an arrival that never happened. */
  outputs: number[];
  error: { code: string; message: string } | null;
  /** Path of the case's results file, when written. */
  resultsFile: string | null;
  /** Where the record came from in this run: computed, read from the cache, or a repeat of another case. */
  source: 'computed' | 'cached' | 'duplicate' | 'input';
}

/** The table document. */
export interface SweepTable {
  format: string;
  version: number;
  engine: { name: string; version: string };
  created: string;
  title: string;
  seed: number;
  combine: 'grid' | 'zip';
  /** Total cases of the sweep (all shards). */
  totalCases: number;
  parameters: Array<{ name: string; path: string; kind: string }>;
  outputs: Array<{ name: string; kind: string }>;
  rows: SweepRow[];
  /** Statistics per output and per numeric parameter, over the finished cases. */
  summary: Record<string, Summary>;
  complete: boolean;
}

const packr = new Packr({ useRecords: false, moreTypes: false, structuredClone: false, bundleStrings: false, useFloat32: 0, int64AsType: 'number' } as never);
const unpackr = new Unpackr({ useRecords: false, moreTypes: false, structuredClone: false, mapsAsObjects: true, int64AsType: 'number' } as never);

/**
 * Statistics of every output column over the ok rows, and of every parameter column whose
 * values are all numbers (ranges and draws).
 */
export function summariseRows(parameters: SweepTable['parameters'], outputs: SweepTable['outputs'], rows: SweepRow[]): Record<string, Summary> {
  const out: Record<string, Summary> = {};
  const ok = rows.filter((r) => r.status === 'ok');
  parameters.forEach((p, k) => {
    if (rows.length > 0 && rows.every((r) => typeof r.values[k] === 'number')) out[p.name] = summarise(rows.map((r) => r.values[k] as number));
  });
  outputs.forEach((o, k) => {
    out[o.name] = summarise(ok.map((r) => r.outputs[k]));
  });
  return out;
}

/**
 * Encodes a table as plain MessagePack.
 * @example decodeTable(encodeTable(t)).rows.length === t.rows.length
 */
export function encodeTable(t: SweepTable): Uint8Array {
  return packr.pack(t) as Uint8Array;
}

/**
 * Decodes a table.
 * @throws SkeinError E_TABLE when the bytes are not a sweep table.
 */
export function decodeTable(bytes: Uint8Array, file = '(bytes)'): SweepTable {
  let t: SweepTable;
  try {
    t = unpackr.unpack(bytes) as SweepTable;
  } catch (e) {
    throw new SkeinError('E_TABLE', `${file}: not MessagePack (${(e as Error).message})`, { file });
  }
  if (!t || t.format !== TABLE_FORMAT) throw new SkeinError('E_TABLE', `${file}: not a ${TABLE_FORMAT} document`, { file });
  if (t.version !== TABLE_VERSION) throw new SkeinError('E_TABLE', `${file}: table version ${t.version}, this package reads ${TABLE_VERSION}`, { file });
  return t;
}

/** Reads a table file. @throws SkeinError E_TABLE. */
export function readTable(path: string): SweepTable {
  let bytes: Buffer;
  try {
    bytes = readFileSync(path);
  } catch (e) {
    throw new SkeinError('E_TABLE', `${path}: cannot read: ${(e as Error).message}`, { file: path });
  }
  return decodeTable(bytes, path);
}

function csvCell(x: unknown): string {
  if (x === null || x === undefined) return '';
  if (typeof x === 'number') return Number.isFinite(x) ? String(x) : Number.isNaN(x) ? '' : String(x);
  const s = typeof x === 'string' ? x : JSON.stringify(x);
  return /[",\n\r]/.test(s) ? `"${s.replace(/"/g, '""')}"` : s;
}

/**
 * The table as CSV: index, digest, status, one column per parameter and output, error code and
 * message. Numbers in full precision (shortest round-trip form); NaN is an empty cell.
 * @example tableToCsv(t).split('\n')[0] // "index,digest,status,RL,vPeak,error_code,error"
 */
export function tableToCsv(t: SweepTable): string {
  const head = ['index', 'digest', 'status', ...t.parameters.map((p) => p.name), ...t.outputs.map((o) => o.name), 'error_code', 'error'];
  const lines = [head.map(csvCell).join(',')];
  for (const r of t.rows) {
    lines.push([r.index, r.digest, r.status, ...r.values, ...r.outputs, r.error?.code ?? '', r.error?.message ?? ''].map(csvCell).join(','));
  }
  return `${lines.join('\n')}\n`;
}

/**
 * Writes the table as MessagePack at `path`, and as CSV beside it when `csvPath` is given.
 * Both atomic (temporary file and rename).
 */
export function writeTable(t: SweepTable, path: string, csvPath?: string): void {
  writeFileAtomic(path, encodeTable(t));
  if (csvPath) writeFileAtomic(csvPath, tableToCsv(t));
}

/**
 * Merges tables of one sweep (shards, or runs on several machines) by case: a case present in
 * several tables appears once. Rows are keyed by case index and must agree on the digest.
 * @throws SkeinError E_TABLE_MERGE when the tables come from different sweeps.
 * @example mergeTables([shard0, shard1]).rows.length
 */
export function mergeTables(tables: SweepTable[]): SweepTable {
  if (tables.length === 0) throw new SkeinError('E_TABLE_MERGE', 'no tables to merge');
  const first = tables[0];
  const sig = (t: SweepTable) => JSON.stringify([t.parameters, t.outputs, t.totalCases, t.seed, t.combine]);
  const byIndex = new Map<number, SweepRow>();
  for (const t of tables) {
    if (sig(t) !== sig(first)) throw new SkeinError('E_TABLE_MERGE', `tables of different sweeps cannot be merged ("${first.title}" and "${t.title}": parameters, outputs, seed or case count differ)`);
    for (const r of t.rows) {
      const old = byIndex.get(r.index);
      if (old && old.digest !== r.digest) {
        throw new SkeinError('E_TABLE_MERGE', `case ${r.index} has digest ${old.digest.slice(0, 12)} in one table and ${r.digest.slice(0, 12)} in another: not the same sweep`);
      }
      if (!old || (old.status === 'failed' && r.status === 'ok')) byIndex.set(r.index, r);
    }
  }
  const rows = [...byIndex.values()].sort((a, b) => a.index - b.index);
  return {
    ...first,
    engine: { name: 'skein', version: ENGINE_VERSION },
    created: new Date().toISOString(),
    rows,
    summary: summariseRows(first.parameters, first.outputs, rows),
    complete: rows.length === first.totalCases,
  };
}
