import { describe, expect, it } from 'vitest';
import { mkdtempSync, readdirSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { decodeTable, loadSweep, readTable, runSweep } from '../index.ts';
import { readFileSync } from 'node:fs';
import { BEWLEY_YAML, standardRegistry } from './fixtures.ts';

const read = () => BEWLEY_YAML;
const RS = 25;
const Z0 = 50;
const LOADS = [10, 50, 100, 330, 1000];

// First plateau at the load, 1 us < t < 3 us: the source launches V Z0/(Rs + Z0) and the load
// end doubles it by its transmission coefficient 1 + Gamma = 2 RL/(RL + Z0) (classic reflection
// coefficient; L. V. Bewley, Traveling waves on transmission systems, 1931, from memory).
const plateau = (rl: number) => ((2 * rl) / (rl + Z0)) * (Z0 / (RS + Z0));

const SWEEP = `sweep: 1
title: load scan
scenario: bewley.yaml
parameters:
  RL: { path: junctions.L.parts.RL.resistance, values: [${LOADS.join(', ')}, -5ohm] }
outputs:
  plateau: { value-at: vl.v, time: 2us }
  peak: { peak: vl.v }
  arrival: { arrival: vl.v, threshold: 0.01 }
  energy: { energy: led, part: RL }
  residual: { output: led, path: totals.relativeResidual }
`;

describe('runSweep', () => {
  it('gives the analytic first plateau of the Bewley lattice for every load, and records the bad load as failed', async () => {
    const registry = await standardRegistry();
    const spec = loadSweep(SWEEP, { file: 'scan.yaml', readText: read });
    const out = await runSweep(spec, { registry, workers: 1 });
    expect(out.counts).toMatchObject({ cases: 6, computed: 5, failed: 1 });
    const rows = out.table.rows;
    LOADS.forEach((rl, k) => {
      expect(rows[k].status).toBe('ok');
      // Tolerance 1e-9 relative: the line delay is a whole number of steps (1 us = 20 x 0.05 us),
      // so the lattice is exact and only rounding in the junction algebra remains (about 1e-15).
      expect(Math.abs(rows[k].outputs[0] / plateau(rl) - 1)).toBeLessThan(1e-9);
      // The wave reaches the load after the one-way delay, 200 m / 2e8 m/s = 1 us. The step's
      // edge falls within one time step, so the crossing lies within one step (0.05 us) of 1 us.
      expect(Math.abs(rows[k].outputs[2] - 1e-6)).toBeLessThanOrEqual(0.05e-6);
      expect(rows[k].outputs[3]).toBeGreaterThan(0);
      // The ledger closes: relative residual at rounding level (core's own ledger check, 1e-12).
      expect(Math.abs(rows[k].outputs[4])).toBeLessThan(1e-12);
    });
    const bad = rows[5];
    expect(bad.status).toBe('failed');
    expect(bad.values).toEqual(['-5ohm']);
    expect(bad.error?.code).toBe('E_RANGE');
    expect(bad.error?.message).toMatch(/resistance/);
    expect(bad.outputs.every((x) => Number.isNaN(x))).toBe(true);
    // The statistics cover the ok cases only.
    expect(out.table.summary.plateau.n).toBe(5);
    expect(out.table.summary.plateau.max).toBeCloseTo(plateau(1000), 9);
  });

  it('gives identical results on 2 workers and on 1 worker', async () => {
    const registry = await standardRegistry();
    const spec = loadSweep(SWEEP.replace('[10, 50', '[12, 15, 20, 25, 30, 40, 10, 50'), { readText: read });
    const one = await runSweep(spec, { registry, workers: 1 });
    const two = await runSweep(spec, { registry, workers: 2 });
    const inThread = await runSweep(spec, { registry, workers: 0 });
    // The set-ups differ (2 threads vs 1 vs none) but the arithmetic order per case is fixed:
    // every output must agree bit for bit (NaN with NaN).
    expect(two.table.rows.length).toBe(12);
    for (const other of [two, inThread]) {
      other.table.rows.forEach((r, k) => {
        expect(r.digest).toBe(one.table.rows[k].digest);
        expect(r.status).toBe(one.table.rows[k].status);
        r.outputs.forEach((x, j) => expect(Object.is(x, one.table.rows[k].outputs[j])).toBe(true));
      });
    }
  });

  it('computes a case whose resolved scenario repeats only once', async () => {
    const registry = await standardRegistry();
    // 50ohm, 50 and "50 ohm" resolve to the same scenario, so to the same digest.
    const spec = loadSweep(SWEEP.replace(/values: \[[^\]]*\]/, 'values: [50ohm, 50, "50 ohm", 100]'), { readText: read });
    const out = await runSweep(spec, { registry, workers: 1 });
    expect(out.counts).toMatchObject({ cases: 4, computed: 2, duplicates: 2, failed: 0 });
    expect(out.table.rows[1].digest).toBe(out.table.rows[0].digest);
    expect(out.table.rows[2].outputs).toEqual(out.table.rows[0].outputs);
    expect(out.table.rows.map((r) => r.index)).toEqual([0, 1, 2, 3]);
  });

  it('takes finished cases from the cache and writes the table, CSV and per-case results files', async () => {
    const registry = await standardRegistry();
    const dir = mkdtempSync(join(tmpdir(), 'skein-sweep-'));
    const spec = loadSweep(SWEEP, { readText: read });
    const opts = { registry, workers: 1, cacheDir: join(dir, 'cache'), resultsDir: join(dir, 'runs'), tablePath: join(dir, 't.msgpack'), csvPath: join(dir, 't.csv') };
    const first = await runSweep(spec, opts);
    expect(first.counts.computed).toBe(5);
    const again = await runSweep(spec, opts);
    expect(again.counts).toMatchObject({ computed: 0, cached: 5, failed: 1 });
    expect(again.table.rows.map((r) => r.outputs)).toEqual(first.table.rows.map((r) => r.outputs));
    expect(readdirSync(join(dir, 'runs')).sort()).toEqual([0, 1, 2, 3, 4].map((i) => `case-${i}.results.msgpack`));
    const table = readTable(join(dir, 't.msgpack'));
    expect(table.complete).toBe(true);
    expect(decodeTable(readFileSync(join(dir, 't.msgpack'))).rows[2].outputs[0]).toBe(first.table.rows[2].outputs[0]);
    const csv = readFileSync(join(dir, 't.csv'), 'utf8').trim().split('\n');
    expect(csv[0]).toBe('index,digest,status,RL,plateau,peak,arrival,energy,residual,error_code,error');
    expect(csv).toHaveLength(7);
    expect(csv[6]).toMatch(/^5,[0-9a-f]{64},failed,-5ohm,,,,,,E_RANGE,/);
    expect(Number(csv[3].split(',')[4])).toBe(first.table.rows[2].outputs[0]);
  });

  it('stops dispatching when its signal aborts, keeps the finished cases, and a second run computes only the rest', async () => {
    const registry = await standardRegistry();
    const dir = mkdtempSync(join(tmpdir(), 'skein-sweep-abort-'));
    const spec = loadSweep(SWEEP, { readText: read });
    const controller = new AbortController();
    const first = await runSweep(spec, {
      registry, workers: 0, cacheDir: join(dir, 'cache'),
      onProgress: (p) => {
        if (p.computed >= 2) controller.abort();
      },
      signal: controller.signal,
    });
    expect(first.interrupted).toBe(true);
    expect(first.table.complete).toBe(false);
    const done = first.counts.computed;
    expect(done).toBeGreaterThanOrEqual(2);
    expect(done).toBeLessThan(5);
    const second = await runSweep(spec, { registry, workers: 0, cacheDir: join(dir, 'cache') });
    expect(second.counts).toMatchObject({ cached: done, computed: 5 - done });
    expect(second.table.complete).toBe(true);
  });

  it('records a case whose output does not exist as failed with E_OUTPUT, and caches that failure', async () => {
    const registry = await standardRegistry();
    const dir = mkdtempSync(join(tmpdir(), 'skein-sweep-out-'));
    const spec = loadSweep(`sweep: 1
scenario: bewley.yaml
parameters:
  RL: { path: junctions.L.parts.RL.resistance, values: [50, 100] }
outputs:
  missing: { output: led, path: totals.nothing }
`, { readText: read });
    const out = await runSweep(spec, { registry, workers: 0, cacheDir: join(dir, 'c') });
    expect(out.table.rows.map((r) => r.error?.code)).toEqual(['E_OUTPUT', 'E_OUTPUT']);
    expect(out.table.rows[0].error?.message).toContain('output missing: probe led output at totals.nothing is not a number');
    const again = await runSweep(spec, { registry, workers: 0, cacheDir: join(dir, 'c') });
    expect(again.counts).toMatchObject({ cached: 2, computed: 0, failed: 2 });
  });

  it('locates an error of an inline base scenario in the sweep file', async () => {
    const registry = await standardRegistry();
    const text = `sweep: 1
scenario:
  skein: 1
  time: { end: 1us }
  lines:
    tl: { from: S, to: L, length: -2m, impedance: 50ohm, velocity: 2e8m/s }
  junctions:
    S: { nodes: { s: [tl] }, parts: { g: { source: step, between: [s, ref], amplitude: 1, resistance: 50ohm } } }
    L: { nodes: { l: [tl] }, parts: { r: { load: resistor, between: [l, ref], resistance: 50ohm } } }
  probes:
    v: { probe: node-voltage, node: L.l }
parameters:
  R: { path: junctions.L.parts.r.resistance, values: [10] }
outputs:
  p: { peak: v.v }
`;
    const spec = loadSweep(text, { file: 'inline.yaml' });
    await expect(runSweep(spec, { registry, workers: 0 })).rejects.toMatchObject({
      path: ['scenario', 'lines', 'tl', 'length'],
      location: { file: 'inline.yaml', line: 6 },
    });
  });
});
