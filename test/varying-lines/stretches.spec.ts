// Lines made of consecutive uniform stretches, stepped by one FDTD segment
// (packages/core/src/compile/fdtdProfile.ts): reflection and transmission at a change of impedance,
// and a lossy three-stretch line against the frequency-domain solution of the same line written
// as three uniform lines in series.
import { describe, expect, it } from 'vitest';
import { resolveScenarioText, runPartitioned } from '@skein/core';
import { timeResponse } from '@skein/spectral';
import { expectClose, worstRelativeToPeak } from '../support/compare.ts';
import { runText, standardRegistry } from '../support/run.ts';

const TWO_STRETCHES = `
skein: 1
time: { end: 60ns, step: 0.5ns }
lines:
  feed:
    from: A
    to: B
    stretches:
      - { length: 2m, impedance: 50ohm, velocity: 2e8m/s }
      - { length: 3m, impedance: 75ohm, velocity: 2e8m/s }
    fdtd: { cells: 50 }
junctions:
  A:
    nodes: { a: [feed] }
    parts: { gen: { source: step, between: [a, ref], amplitude: 1, rise: 2ns, edge: smooth, resistance: 50ohm } }
  B:
    nodes: { b: [feed] }
    parts: { R: { load: resistor, between: [b, ref], resistance: 75ohm } }
probes:
  near: { probe: node-voltage, node: A.a }
  far: { probe: node-voltage, node: B.b }
  joint: { probe: line-point, line: feed, position: 2m }
  ledger: { probe: energy-ledger }
`;

describe('a line of two stretches', () => {
  it('reflects a step with (Z2 - Z1) / (Z2 + Z1) and transmits 2 Z2 / (Z1 + Z2) at the times of flight', async () => {
    // Bewley lattice / common transmission-line theory (L. V. Bewley, Trans. AIEE 50, 1931, from
    // memory): a 1 V step behind 50 ohm into 2 m of 50 ohm then 3 m of 75 ohm (v = 2e8 m/s, delays
    // 10 ns and 15 ns), ended in 75 ohm. The incident 0.5 V meets the change at 10 ns: reflection
    // (75 - 50) / 125 = 0.2 back to the source (seen there from 20 ns: 0.5 (1 + 0.2) = 0.6),
    // transmission 2 x 75 / 125 = 1.2 on to the matched load (from 25 ns: 0.6). The source and the
    // load are matched, so nothing else returns. Cells of 0.1 m (20 + 30, shared by delay) and a
    // step of one cell delay (0.5 ns), where the leapfrog carries a wave on each uniform stretch
    // without dispersion; the edge takes 2 ns (smooth), so the plateaus are read 3 ns after each
    // arrival. Tolerance 1e-9: at this step the scheme is exact on uniform stretches, and the
    // junction node of two stretches is exact in the DC limit the plateaus are (measured ~1e-15).
    const r = await runText(TWO_STRETCHES, 'twoStretches.yaml');
    const g = (75 - 50) / (75 + 50);
    const t = (2 * 75) / (75 + 50);
    expectClose('reflection coefficient', g, 0.2, { rel: 1e-12 });
    // Before the reflection returns (edge over by 2 ns, reflection back from 20 ns).
    for (const ts of [3e-9, 10e-9, 19.5e-9]) expectClose(`near end at ${ts * 1e9} ns`, r.at('near.v', ts), 0.5, { rel: 1e-9 });
    for (const ts of [23e-9, 40e-9, 60e-9]) expectClose(`near end at ${ts * 1e9} ns`, r.at('near.v', ts), 0.5 * (1 + g), { rel: 1e-9 });
    // The joint at 2 m from 10 ns, the load from 25 ns, nothing before.
    expect(Math.abs(r.at('joint.v.w', 9.5e-9))).toBeLessThan(1e-12);
    expectClose('joint at 13 ns', r.at('joint.v.w', 13e-9), 0.5 * t, { rel: 1e-9 });
    expect(Math.abs(r.at('far.v', 24.5e-9))).toBeLessThan(1e-12);
    for (const ts of [28e-9, 45e-9, 60e-9]) expectClose(`far end at ${ts * 1e9} ns`, r.at('far.v', ts), 0.5 * t, { rel: 1e-9 });
    // Energy ledger (lossless line): delivered = absorbed + stored.
    const l = r.ledger!;
    expect(l.lostJ).toBe(0);
    expect(Math.abs(l.residualJ) / l.deliveredJ).toBeLessThan(1e-6);
    // Asked for two threads, the run stays on one (its FDTD segment joins its only junctions and
    // one thread steps it whole) and gives
    // the same samples, bit for bit.
    const registry = await standardRegistry();
    const p = await runPartitioned({ text: TWO_STRETCHES, file: 'twoStretches.yaml' }, { registry, threads: 2 });
    expect(p.partition.used).toBe(1);
    expect(p.warnings.some((w) => w.startsWith('ran on 1 thread of 2 asked'))).toBe(true);
    expect(p.traceNames).toEqual(r.traceNames);
    expect(p.traces.data.length).toBe(r.traces.data.length);
    for (let i = 0; i < r.traces.data.length; i++) if (!Object.is(p.traces.data[i], r.traces.data[i])) expect.fail(`sample ${i}: ${p.traces.data[i]} vs ${r.traces.data[i]}`);
  });
});

describe('a lossy line of three stretches', () => {
  it('gives the step response of the same three uniform lines in series, solved in the frequency domain, within 1 % of the peak', async () => {
    // The reference: the frequency-domain solution (exact line solutions at each frequency,
    // packages/spectral, transformed to time) of three uniform lossy lines joined end to end,
    // which is what the stretches are. 1 V step (smooth 5 ns edge) behind 50 ohm, into 20 m of
    // 50 ohm with 0.5 ohm/m, 10 m of 90 ohm with 1 ohm/m and 20 uS/m, 15 m of 65 ohm at 0.7c with
    // 0.2 ohm/m, ended in 200 ohm (reflections at every change and at the load, losses of about
    // 0.3 Np in all). Within 1 % of each trace's peak at every sample, as for lossy uniform lines.
    // 1700 cells of about 0.13 ns at a step of 0.125 ns: the worst difference (at the far end, on
    // the arriving edge, where the leapfrog's dispersion acts) was measured 1.18 % with 850 cells
    // and 0.41 % with 1700 (second order, less the edge's share), the final values agree to 1e-6.
    const stretches: Array<Record<string, string>> = [
      { length: '20m', impedance: '50ohm', velocity: '2e8m/s', resistance: '0.5ohm/m' },
      { length: '10m', impedance: '90ohm', velocity: '2e8m/s', resistance: '1ohm/m', conductance: '20uS/m' },
      { length: '15m', impedance: '65ohm', velocity: '0.7c', resistance: '0.2ohm/m' },
    ];
    const ends = `
junctions:
  A:
    nodes: { a: [s1] }
    parts: { gen: { source: step, between: [a, ref], amplitude: 1, rise: 5ns, edge: smooth, resistance: 50ohm } }
  B:
    nodes: { b: [s3] }
    parts: { R: { load: resistor, between: [b, ref], resistance: 200ohm } }
probes:
  near: { probe: node-voltage, node: A.a }
  far: { probe: node-voltage, node: B.b }
  ledger: { probe: energy-ledger }
`;
    const flow = (s: Record<string, string>): string => `{ ${Object.entries(s).map(([k, v]) => `${k}: ${v}`).join(', ')} }`;
    const fdtd = `
skein: 1
time: { end: 1.2us, step: 0.125ns, record: 2 }
lines:
  s1:
    from: A
    to: B
    stretches:
${stretches.map((s) => `      - ${flow(s)}`).join('\n')}
    fdtd: { cells: 1700 }
${ends.replace('[s3]', '[s1]')}`;
    const chain = `
skein: 1
time: { end: 1.2us, step: 0.25ns }
lines:
${stretches.map((s, i) => `  s${i + 1}: { from: ${i === 0 ? 'A' : `J${i}`}, to: ${i === 2 ? 'B' : `J${i + 1}`}, ${flow(s).slice(2, -2)} }`).join('\n')}
${ends.replace('junctions:\n', 'junctions:\n  J1: { nodes: { j: [s1, s2] } }\n  J2: { nodes: { j: [s2, s3] } }\n')}`;
    const r = await runText(fdtd, 'threeStretches.yaml');
    const registry = await standardRegistry();
    const ref = await timeResponse(resolveScenarioText(chain, { registry, file: 'chain.yaml' }), registry, {
      outputs: [{ kind: 'voltage', node: 'A.a' }, { kind: 'voltage', node: 'B.b' }], timesS: Array.from(r.times()),
    });
    const worst = (['near.v', 'far.v'] as const).map((trace, k) => worstRelativeToPeak(r.series(trace), ref.series[k].values));
    expect(worst[1].peak).toBeGreaterThan(0.5);
    expect(Math.max(...worst.map((w) => w.worst)), `worst differences ${worst.map((w) => w.worst.toExponential(2)).join(', ')}`).toBeLessThan(0.01);
    // The ledger closes with the losses in R and G.
    const l = r.ledger!;
    expect(l.lostJ).toBeGreaterThan(0.05 * l.deliveredJ);
    expect(Math.abs(l.residualJ) / l.deliveredJ).toBeLessThan(1e-3);
  }, 120_000);
});
