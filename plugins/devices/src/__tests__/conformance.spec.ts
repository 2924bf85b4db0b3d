import { describe, expect, it } from 'vitest';
import { checkPluginConformance, formatConformanceFailures } from '@skein/core';

// Parameters as the factories receive them (SI numbers): a 1 V-scale varistor and spark gap so that
// the suite's drive (sin, +-1 V, in the allocation check) crosses their knees and exercises every branch of the step hooks.
const params = {
  varistor: { referenceVoltage: 1, referenceCurrent: 1e-3, exponent: 20 },
  'spark-gap': { sparkoverVoltage: 0.5, arcVoltage: 0.3, holdingCurrent: 0.5, arcCorner: 0.01, timeLag: 3e-10 },
  'controlled-switch': { control: 'voltage', threshold: 0.8, hysteresis: 0.5, transitionTime: 2e-10 },
  'ramped-switch': { closeAt: 1e-7, rampTime: 5e-8, preInsertionResistance: 100, insertionTime: 1e-7, openAt: 5e-7 },
  'tvs-clamp': { breakdownVoltage: 0.6, clampVoltage: 1.2, peakPulseCurrent: 1, slopeVoltage: 0.02 },
  filament: { ratedVoltage: 1, heatCapacity: 1e-9 },
};

describe('checkPluginConformance', () => {
  it('passes every check for @skein/plugin-devices, loaded by its package name in a worker', async () => {
    const report = await checkPluginConformance('@skein/plugin-devices', { parentUrl: import.meta.url, params });
    expect(report.plugins).toEqual(['load:diode', 'load:tvs-clamp', 'load:varistor', 'load:spark-gap', 'load:controlled-switch', 'load:ramped-switch', 'load:filament']);
    expect(report.ok, formatConformanceFailures(report)).toBe(true);
    for (const name of ['no-step-allocation', 'no-shared-state', 'finish-after-failure', 'param-schema']) {
      expect(report.checks.filter((c) => c.name === name)).toHaveLength(report.plugins.length);
    }
  }, 180_000);
});
