import { describe, expect, it } from 'vitest';
import { checkPluginConformance, formatConformanceFailures } from '@skein/core';

// Parameters where the synthesised ones would not do (constraints between parameters, or to
// exercise the more demanding hooks), as the factories receive them (SI numbers).
const params = { 'line-end-current': { line: 'feeder', end: 'to' }, 'line-point': { line: 'feeder', position: 50, quantity: 'power' } };

describe('checkPluginConformance', () => {
  it('passes every check for @skein/plugin-probes, loaded by its package name in a worker', async () => {
    const report = await checkPluginConformance('@skein/plugin-probes', { parentUrl: import.meta.url, params });
    expect(report.plugins).toEqual(['probe:node-voltage', 'probe:voltage-between', 'probe:line-end-current', 'probe:line-point', 'probe:part', 'probe:energy-ledger', 'probe:space-time']);
    expect(report.ok, formatConformanceFailures(report)).toBe(true);
    // Each plugin got the allocation, shared-state and finish checks (not only the shape checks).
    for (const name of ['no-step-allocation', 'no-shared-state', 'finish-after-failure', 'param-schema']) {
      expect(report.checks.filter((c) => c.name === name)).toHaveLength(report.plugins.length);
    }
  });
});
