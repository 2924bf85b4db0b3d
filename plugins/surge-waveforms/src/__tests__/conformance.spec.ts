import { describe, expect, it } from 'vitest';
// The suite is core's; this relative import becomes `from '@skein/core'` once core's index.ts exports it.
import { checkPluginConformance, formatConformanceFailures } from '../../../../packages/core/src/conformance/index.ts';

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
