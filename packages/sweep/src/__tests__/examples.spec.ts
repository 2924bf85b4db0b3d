import { describe, expect, it } from 'vitest';
import { fileURLToPath } from 'node:url';
import { loadSweepFile, runSweep } from '../index.ts';
import { standardRegistry } from './fixtures.ts';

const example = (name: string) => fileURLToPath(new URL(`../../examples/${name}`, import.meta.url));

describe('loadSweepFile', () => {
  it('runs the termination scan example with the analytic first plateau on the 200 m cable', async () => {
    const registry = await standardRegistry();
    const out = await runSweep(loadSweepFile(example('terminationScan.yaml')), { registry, workers: 0 });
    expect(out.counts).toMatchObject({ cases: 27, computed: 27, failed: 0 });
    for (const r of out.table.rows) {
      // Energy ledger closes to rounding (core's ledger check uses 1e-12 relative).
      expect(Math.abs(r.outputs[4])).toBeLessThan(1e-12);
      if (r.values[0] !== '200m') continue;
      // 1 us one-way delay, so 2.5 us lies on the first plateau 2 RL/(RL + Z0) * Z0/(Rs + Z0)
      // (classic reflection coefficient, Bewley 1931, from memory); exact lattice, 1e-9 relative.
      const rl = r.values[1] as number;
      const expected = ((2 * rl) / (rl + 50)) * (50 / 75);
      expect(Math.abs(r.outputs[0] / expected - 1)).toBeLessThan(1e-9);
    }
  });

  it('runs the tolerance example with draws whose sample mean lies within 3 sigma/sqrt(n) of the mean', async () => {
    const registry = await standardRegistry();
    const out = await runSweep(loadSweepFile(example('toleranceDraws.yaml')), { registry, workers: 0 });
    expect(out.counts.cases).toBe(200);
    expect(out.counts.failed).toBe(0);
    // Normal draw, mean 25 ohm, std 2.5 ohm: the sample mean has standard deviation 2.5/sqrt(200)
    // (central limit theorem); uniform on [190, 210] m: mean 200, std 20/sqrt(12).
    const s = out.table.summary;
    expect(Math.abs(s.source.mean - 25)).toBeLessThan((3 * 2.5) / Math.sqrt(200));
    expect(Math.abs(s.cableLength.mean - 200)).toBeLessThan((3 * 20) / Math.sqrt(12 * 200));
    expect(s.cableLength.min).toBeGreaterThanOrEqual(190);
    expect(s.cableLength.max).toBeLessThan(210);
    expect(s.peak.n).toBe(200);
    expect(s.peak.p5).toBeLessThan(s.peak.p50);
    expect(s.peak.p50).toBeLessThan(s.peak.p95);
  });
});
