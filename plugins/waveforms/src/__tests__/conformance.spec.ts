import { describe, expect, it } from 'vitest';
import { checkPluginConformance, formatConformanceFailures } from '@skein/core';

// Parameters where the synthesised ones would not do (constraints between parameters, or to
// exercise the more demanding hooks), as the factories receive them (SI numbers).
const params = { 'double-exponential': { tau1: 1e-9, tau2: 1e-7 } };

describe('checkPluginConformance', () => {
  it('passes every check for @skein/plugin-waveforms, loaded by its package name in a worker', async () => {
    const report = await checkPluginConformance('@skein/plugin-waveforms', { parentUrl: import.meta.url, params });
    expect(report.plugins).toEqual(['source:step', 'source:ramp', 'source:trapezoid', 'source:gaussian', 'source:sine', 'source:double-exponential', 'source:table']);
    expect(report.ok, formatConformanceFailures(report)).toBe(true);
    // Each plugin got the allocation, shared-state and finish checks (not only the shape checks).
    for (const name of ['no-step-allocation', 'no-shared-state', 'finish-after-failure', 'param-schema']) {
      expect(report.checks.filter((c) => c.name === name)).toHaveLength(report.plugins.length);
    }
  });
});
