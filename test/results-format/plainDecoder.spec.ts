// The results file is plain MessagePack (the open standard: msgpack.org spec, "bin" and "map"
// formats). Written with msgpackr, it must be read back exactly by an independent decoder,
// @msgpack/msgpack, with no extension types involved.
import { mkdtempSync, readFileSync, readdirSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { decode } from '@msgpack/msgpack';
import { describe, expect, it } from 'vitest';
import { readResults, writeResults } from '@skein/core';
import { BEWLEY } from '../bewley/bewley.spec.ts';
import { runText } from '../support/run.ts';

describe('results file', () => {
  it('is read back bit for bit by a plain MessagePack decoder', async () => {
    const r = await runText(BEWLEY, 'bewley.yaml');
    const dir = mkdtempSync(join(tmpdir(), 'skein-res-'));
    const path = join(dir, 'bewley.results.msgpack');
    writeResults(path, r, 'bewley.yaml');
    expect(readdirSync(dir)).toEqual(['bewley.results.msgpack']);
    const doc = decode(readFileSync(path), { useBigInt64: false }) as Record<string, any>;
    expect(doc.format).toBe('skein-results');
    expect(doc.traces.dtype).toBe('float64');
    expect(doc.traces.byteOrder).toBe('little');
    const [nT, nS] = doc.traces.shape as [number, number];
    expect(nT).toBe(r.traceNames.length);
    const bytes = doc.traces.data as Uint8Array;
    expect(bytes).toBeInstanceOf(Uint8Array);
    const dv = new DataView(bytes.buffer, bytes.byteOffset, bytes.byteLength);
    for (let t = 0; t < nT; t++) {
      for (let i = 0; i < nS; i++) {
        const got = dv.getFloat64((t * nS + i) * 8, true);
        if (!Object.is(got, r.traces.get(t, i))) expect.fail(`trace ${t} sample ${i}: ${got} vs ${r.traces.get(t, i)}`);
      }
    }
    expect(doc.scenario.digest).toBe(r.digest);
    // And skein's own reader agrees.
    const back = readResults(path);
    expect(Array.from(back.trace('vl.v'))).toEqual(Array.from(r.series('vl.v')));
  });

  it('is deterministic: the same scenario gives the same bytes apart from the creation time', async () => {
    const a = await runText(BEWLEY, 'bewley.yaml');
    const b = await runText(BEWLEY, 'bewley.yaml');
    const dir = mkdtempSync(join(tmpdir(), 'skein-det-'));
    writeResults(join(dir, 'a.msgpack'), a, 'x.yaml');
    writeResults(join(dir, 'b.msgpack'), b, 'x.yaml');
    const da = decode(readFileSync(join(dir, 'a.msgpack'))) as Record<string, any>;
    const db = decode(readFileSync(join(dir, 'b.msgpack'))) as Record<string, any>;
    for (const d of [da, db]) { d.created = ''; d.summary.timing = {}; }
    expect(da).toEqual(db);
    expect(Buffer.compare(Buffer.from(da.traces.data), Buffer.from(db.traces.data))).toBe(0);
  });
});
