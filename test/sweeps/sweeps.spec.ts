// The example sweeps, run through the sweep package on worker threads.
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';
import { loadSweepFile, runSweep } from '@skein/sweep';
import { standardRegistry } from '../support/run.ts';

const EXAMPLES = fileURLToPath(new URL('../../packages/cli/examples/', import.meta.url));

describe('example sweeps', () => {
  it('show the received rise time of a subsea cable growing in proportion to its capacitance', async () => {
    // Kelvin's law of squares (W. Thomson, Proc. Roy. Soc. 7, 1855): on an RC-dominated cable the
    // signal's rise time scales as R C l^2, so doubling C doubles t90 - t10 and halves the highest
    // clean pulse rate. 2 % allows for the source's 1 us rise and the receiver's 1 Mohm.
    const registry = await standardRegistry();
    const out = await runSweep(loadSweepFile(`${EXAMPLES}subseaTelemetrySweep.yaml`), { registry, workers: 2 });
    expect(out.counts.failed).toBe(0);
    const rise = out.table.rows.map((r) => r.outputs[1] - r.outputs[0]);
    expect(rise.length).toBe(4);
    for (let i = 1; i < rise.length; i++) expect(Math.abs(rise[i] / rise[i - 1] / 2 - 1)).toBeLessThan(0.02);
  }, 120_000);

  it('show the appliance protector taking less energy as the cable to the arrester grows', async () => {
    const registry = await standardRegistry();
    const out = await runSweep(loadSweepFile(`${EXAMPLES}serviceEntranceSweep.yaml`), { registry, workers: 2 });
    expect(out.counts.failed).toBe(0);
    const prot = out.table.rows.map((r) => r.outputs[0]);
    const arr = out.table.rows.map((r) => r.outputs[1]);
    for (let i = 1; i < prot.length; i++) {
      expect(prot[i]).toBeLessThan(prot[i - 1]);
      expect(arr[i]).toBeGreaterThan(arr[i - 1]);
    }
    // Above its 40 J rating for short cables, below it for long ones.
    expect(prot[0]).toBeGreaterThan(40);
    expect(prot[prot.length - 1]).toBeLessThan(40);
  }, 120_000);
});
