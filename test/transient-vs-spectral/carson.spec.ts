// Invariance: transient vs spectral for an overhead wire with earth return. One aluminium wire
// 10 m above earth of 100 ohm*m, its series impedance from Carson's integral (J. R. Carson, Bell
// Syst. Tech. J. 5, 1926; packages/lines), stepped by the frequency-dependent travelling-wave
// model; the reference is the frequency-domain solution transformed to time. Within 1 % of the
// peak at every sample.
import { describe, expect, it } from 'vitest';
import { resolveScenarioText } from '@skein/core';
import { timeResponse } from '@skein/spectral';
import { worstRelativeToPeak } from '../support/compare.ts';
import { runText, standardRegistry } from '../support/run.ts';

const NET = `
skein: 1
time: { end: 40us, step: 10ns }
lines:
  span:
    from: pole1
    to: pole2
    length: 2km
    model: frequency-dependent
    section: { kind: wires, ground: { resistivityOhmM: 100 }, wires: [{ name: phase, x: 0m, y: 10m, radius: 6mm, material: aluminium }] }
junctions:
  pole1:
    nodes: { p: [span] }
    parts: { surge: { source: double-exponential, between: [p, ref], amplitude: 10, tau1: 0.3us, tau2: 8us, resistance: 400ohm } }
  pole2:
    nodes: { p: [span] }
    parts: { R: { load: resistor, between: [p, ref], resistance: 300ohm } }
probes:
  v1: { probe: node-voltage, node: pole1.p }
  v2: { probe: node-voltage, node: pole2.p }
`;

describe('transient vs spectral, overhead wire with earth return', () => {
  it('agree within 1 % of the peak at every sample', async () => {
    const r = await runText(NET, 'carson.yaml');
    const registry = await standardRegistry();
    const sc = resolveScenarioText(NET, { registry, file: 'carson.yaml' });
    const ref = await timeResponse(sc, registry, { outputs: [{ kind: 'voltage', node: 'pole1.p' }, { kind: 'voltage', node: 'pole2.p' }], timesS: Array.from(r.times()) });
    const worst: number[] = [];
    (['v1.v', 'v2.v'] as const).forEach((trace, k) => {
      worst.push(worstRelativeToPeak(r.series(trace), ref.series[k].values).worst);
    });
    expect(Math.max(...worst), `worst differences ${worst.map((x) => x.toExponential(2)).join(', ')}`).toBeLessThan(0.01);
  }, 180_000);
});
