import { describe, expect, it } from 'vitest';
import { checkPluginConformance, formatConformanceFailures } from '@skein/core';

// Parameters where the synthesised ones would not do (constraints between parameters, or to
// exercise the more demanding hooks), as the factories receive them (SI numbers).
const params = { 'series-rlc': { resistance: 10, inductance: 1e-6, capacitance: 1e-9 }, 'parallel-rlc': { resistance: 100, inductance: 1e-6, capacitance: 1e-9 }, 'timed-switch': { closeAt: 1e-6, openAt: 3e-6 } };

describe('checkPluginConformance', () => {
  it('passes every check for @skein/plugin-loads, loaded by its package name in a worker', async () => {
    const report = await checkPluginConformance('@skein/plugin-loads', { parentUrl: import.meta.url, params });
    expect(report.plugins).toEqual(['load:resistor', 'load:capacitor', 'load:inductor', 'load:series-rlc', 'load:parallel-rlc', 'load:short', 'load:open', 'load:timed-switch']);
    expect(report.ok, formatConformanceFailures(report)).toBe(true);
    // Each plugin got the allocation, shared-state and finish checks (not only the shape checks).
    for (const name of ['no-step-allocation', 'no-shared-state', 'finish-after-failure', 'param-schema']) {
      expect(report.checks.filter((c) => c.name === name)).toHaveLength(report.plugins.length);
    }
  });
});
