import { describe, expect, it } from 'vitest';
import { loadSweep, expandCases, createCasePool, runCase, type CaseRecord } from '../index.ts';
import { resolveScenarioData } from '@skein/core';
import { BEWLEY_YAML, standardRegistry } from './fixtures.ts';

describe('createCasePool', () => {
  it('runs cases on two worker threads with the same numbers as the calling thread', async () => {
    const registry = await standardRegistry();
    const spec = loadSweep(`sweep: 1
scenario: bewley.yaml
parameters:
  RL: { path: junctions.L.parts.RL.resistance, range: { from: 10, to: 1000, count: 8, scale: log, unit: ohm } }
outputs:
  peak: { peak: vl.v }
  energy: { energy: led, part: RL }
`, { readText: () => BEWLEY_YAML });
    const tasks = expandCases(spec).map((c) => ({
      key: String(c.index), digest: resolveScenarioData(c.scenario, { registry }).digest, scenario: c.scenario, outputs: spec.outputs, keepResults: true,
    }));
    const pool = createCasePool({ modules: registry.modules, workers: 2 });
    try {
      await pool.warm();
      const viaPool = await Promise.all(tasks.map((t) => pool.run(t)));
      const here: CaseRecord[] = [];
      for (const t of tasks) here.push(await runCase(registry, t));
      // The set-ups differ: two worker threads did the work, the reference ran on the main thread.
      expect(new Set(viaPool.map((r) => r.thread)).size).toBe(2);
      expect(viaPool.every((r) => r.thread !== 0)).toBe(true);
      expect(here.every((r) => r.thread === 0)).toBe(true);
      // Same arithmetic in the same order: bit for bit.
      viaPool.forEach((r, k) => {
        expect(r.ok).toBe(true);
        r.outputs.forEach((x, j) => expect(Object.is(x, here[k].outputs[j])).toBe(true));
        // The results document came back as MessagePack bytes.
        expect(r.results).toBeInstanceOf(Uint8Array);
        expect(r.results!.byteLength).toBeGreaterThan(1000);
      });
    } finally {
      await pool.close();
    }
  });
});
