import { describe, expect, it } from 'vitest';
import { defineLoad, resolveScenarioText, runScenario, type RunResult } from '../../index.ts';
import { testRegistry } from '../../__tests__/fixtures.ts';

// A Shockley diode with a logarithmic voltage limit, written against the public API.
const IS = 1e-12;
const VT = 0.025852;
const diode = defineLoad({
  type: 'test-diode',
  summary: 'ideal Shockley diode',
  params: {},
  create: () => {
    const vcrit = VT * Math.log(VT / (Math.SQRT2 * IS));
    return {
      kind: 'nonlinear',
      evaluate(v: number, _t: number, out: Float64Array) {
        const e = Math.exp(Math.min(v, 2) / VT);
        out[0] = IS * (e - 1);
        out[1] = (IS * e) / VT + 1e-12;
      },
      // Logarithmic limiting of the junction voltage above its critical voltage, the classic
      // damping of exponential junctions in circuit simulation: beyond vcrit, move by
      // VT ln(1 + dv / VT) instead of dv.
      limit(vNew: number, vOld: number) {
        if (vNew > vcrit && Math.abs(vNew - vOld) > 2 * VT) {
          if (vOld > 0) {
            const arg = 1 + (vNew - vOld) / VT;
            return arg > 0 ? vOld + VT * Math.log(arg) : vcrit;
          }
          return VT * Math.log(vNew / VT);
        }
        return vNew;
      },
    };
  },
});

const linearAsNonlinear = defineLoad({
  type: 'test-nl-resistor',
  summary: 'a resistor through the nonlinear interface',
  params: { resistance: { unit: 'ohm', summary: 'R' } },
  create: (p) => ({
    kind: 'nonlinear',
    evaluate(v: number, _t: number, out: Float64Array) {
      out[0] = v / p.resistance;
      out[1] = 1 / p.resistance;
    },
  }),
});

function scenario(load: string): string {
  return `
skein: 1
time: { end: 40ns, step: 0.5ns }
lines:
  tl: { from: S, to: L, length: 2m, impedance: 50ohm, velocity: 2e8m/s }
junctions:
  S:
    nodes: { s: [tl] }
    parts: { gen: { source: test-step, between: [s, ref], amplitude: 5, resistance: 50ohm } }
  L:
    nodes: { l: [tl] }
    parts: { D: ${load} }
probes:
  vl: { probe: test-node, node: L.l }
  vs: { probe: test-node, node: S.s }
  led: { probe: test-ledger }
`;
}

async function run(load: string): Promise<RunResult> {
  const registry = testRegistry().register(diode).register(linearAsNonlinear);
  return runScenario(resolveScenarioText(scenario(load), { registry }), { registry });
}

function trace(r: RunResult, name: string): Float64Array {
  const i = r.traceNames.indexOf(name);
  return r.traces.data.subarray(i * r.nSamples, (i + 1) * r.nSamples);
}

describe('phaseNonlinear', () => {
  it('clamps at the diode voltage of the Bergeron construction', async () => {
    // Method of characteristics (graphical Bergeron construction; L. Bergeron, Water Hammer in
    // Hydraulics and Wave Surges in Electricity, 1961, from memory): the arriving wave of 2.5 V on a
    // 50 ohm line meets the diode where 2 * 2.5 - v = 50 i(v). Solved here by bisection.
    const r = await run('{ load: test-diode, between: [l, ref] }');
    let lo = 0;
    let hi = 5;
    for (let k = 0; k < 200; k++) {
      const m = 0.5 * (lo + hi);
      if (5 - m - 50 * IS * (Math.exp(m / VT) - 1) > 0) lo = m;
      else hi = m;
    }
    const vd = 0.5 * (lo + hi);
    const vl = trace(r, 'vl.v');
    // Newton converges to 1e-9 (1 + |v|) V; the plateau is exact up to that.
    expect(Math.abs(vl[Math.round(15e-9 / 0.5e-9)] - vd)).toBeLessThan(1e-8);
    // The reflected wave reaches the source after the round trip: vs = 2.5 + (vd - 2.5).
    const vs = trace(r, 'vs.v');
    expect(Math.abs(vs[Math.round(25e-9 / 0.5e-9)] - vd)).toBeLessThan(1e-8);
    expect(vd).toBeGreaterThan(0.5);
    expect(vd).toBeLessThan(0.8);
  });

  it('gives a resistor through the nonlinear interface the same result as a linear one', async () => {
    const a = await run('{ load: test-nl-resistor, between: [l, ref], resistance: 100ohm }');
    const b = await run('{ load: test-resistor, between: [l, ref], resistance: 100ohm }');
    const va = trace(a, 'vl.v');
    const vb = trace(b, 'vl.v');
    for (let i = 0; i < va.length; i++) expect(Math.abs(va[i] - vb[i])).toBeLessThan(1e-12);
    // Bewley: 2.5 V into 100 ohm on 50 ohm gives 2.5 (1 + 1/3) = 3.3333 V on the first plateau.
    expect(Math.abs(va[Math.round(15e-9 / 0.5e-9)] - 10 / 3)).toBeLessThan(1e-12);
  });

  it('closes the energy ledger with a diode to the Newton tolerance', async () => {
    const r = await run('{ load: test-diode, between: [l, ref] }');
    const d = trace(r, 'led.delivered');
    const a = trace(r, 'led.absorbed');
    const s = trace(r, 'led.stored');
    const total = d[d.length - 1];
    for (let i = 0; i < d.length; i++) expect(Math.abs(d[i] - a[i] - s[i])).toBeLessThan(1e-7 * total);
  });
});
