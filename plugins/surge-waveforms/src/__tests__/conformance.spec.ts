import { describe, expect, it } from 'vitest';
import { checkPluginConformance, formatConformanceFailures } from '@skein/core';

describe('checkPluginConformance', () => {
  it('passes every check for @skein/plugin-surge-waveforms, loaded by its package name in a worker', async () => {
    const report = await checkPluginConformance('@skein/plugin-surge-waveforms', { parentUrl: import.meta.url });
    expect(report.plugins).toEqual(['source:combination-wave', 'source:lightning-current', 'source:esd-contact']);
    expect(report.ok, formatConformanceFailures(report)).toBe(true);
    for (const name of ['no-step-allocation', 'no-shared-state', 'finish-after-failure', 'param-schema']) {
      expect(report.checks.filter((c) => c.name === name)).toHaveLength(report.plugins.length);
    }
  });
});
