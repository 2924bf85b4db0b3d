import { describe, expect, it } from 'vitest';
import { loadPluginModules, PluginRegistry, resolveScenarioText, runScenario } from '@skein/core';

// End to end through the engine (core's Newton junction solve): a 1.2/50 us surge behind 2 ohm
// on a short line into a varistor, a diode and a gas tube at the far end.
const SCENARIO = `
skein: 1
title: devices end to end
time: { end: 100us }
lines:
  l1: { from: a, to: b, length: 15m, impedance: 100ohm, velocity: 1c }
junctions:
  a:
    nodes: { p: [l1] }
    parts:
      surge: { source: combination-wave, between: [p, ref], peak: 4000, resistance: 2ohm }
  b:
    nodes: { p: [l1] }
    parts:
      MOV: { load: varistor, between: [p, ref], referenceVoltage: 470, exponent: 30, ratedEnergy: 0.1mJ }
      GDT: { load: spark-gap, between: [p, ref], sparkoverVoltage: 600, timeLag: 20ns }
      D1: { load: diode, between: [ref, p], seriesResistance: 0.05 }
probes:
  ledger: { probe: energy-ledger }
`;

describe('varistorLoad', () => {
  it('reports the same absorbed energy as the engine ledger, and the engine lists its rating warning', async () => {
    const registry = await loadPluginModules(new PluginRegistry(), ['@skein/plugin-surge-waveforms', '@skein/plugin-loads', '@skein/plugin-probes', '@skein/plugin-devices'], import.meta.url);
    const r = await runScenario(resolveScenarioText(SCENARIO, { registry, file: 'engine.yaml' }), { registry });
    const ledger = r.outputs.ledger as { absorbed: Record<string, number>; totals: { relativeResidual: number } };
    const key = (id: string): Record<string, unknown> => (r.outputs[`part:${id}`] ?? r.outputs[id]) as Record<string, unknown>;
    const mov = key('MOV');
    // Both sum the step-centred product over the same accepted steps, in a different order of
    // operations: 1e-9 relative.
    for (const id of ['MOV', 'GDT', 'D1']) {
      const e = key(id).energyJ as number;
      expect(Math.abs(e - ledger.absorbed[id]), `${id}: device ${e} J, ledger ${ledger.absorbed[id]} J`).toBeLessThanOrEqual(1e-9 * Math.abs(ledger.absorbed[id]) + 1e-24);
    }
    expect(Math.abs(ledger.totals.relativeResidual)).toBeLessThan(1e-9);
    expect(mov.ratingsExceeded).toEqual(['energy']);
    expect(r.warnings.some((w) => w.includes('rating exceeded: MOV (varistor) energy'))).toBe(true);
    // The surge rises past 600 V (the varistor alone would clamp near 750 V), so the gas tube fires
    // within the first microsecond and takes the current; the varistor then carries almost nothing.
    const gdt = key('GDT');
    expect(gdt.breakdowns).toBeGreaterThanOrEqual(1);
    expect(gdt.firstBreakdownTimeS as number).toBeLessThan(1e-6);
    expect(gdt.energyJ as number).toBeGreaterThan(1000 * (mov.energyJ as number));
  }, 60_000);
});
