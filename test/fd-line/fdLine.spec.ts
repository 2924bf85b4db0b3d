// Invariance: the frequency-dependent line model (vector-fitted Yc and H', recursive convolution,
// packages/core/src/line/fdLine.ts) against the frequency-domain solution of the same line
// transformed to time (packages/spectral timeResponse: exact line solution per frequency from the
// same @skein/lines section, Fourier series with the wrap-around controlled). Two independent
// methods; the issue asks agreement within 1 % of the peak at every sample.
//
// Line: 50 m of the REFERENCES.md coax (a = 0.405 mm, b = 1.475 mm, er = 2.25, tan d = 2e-4,
// copper inner conductor with skin effect, perfect shield), one-way delay 250 ns; source 10 ohm,
// load 200 ohm (both mismatched against 51.7 ohm, so several reflections fall in the 2 us window),
// a trapezoid of our own (2 ns delay, 4 ns edges, 20 ns top).
import { describe, expect, it } from 'vitest';
import { resolveScenarioText } from '@skein/core';
import { timeResponse } from '@skein/spectral';
import { computeSection } from '../../packages/lines/src/index.ts';
import { simulateFdLine } from '../../packages/core/src/line/fdLine.ts';
import { standardRegistry } from '../support/run.ts';

const LENGTH_M = 50;
const DT = 0.05e-9;
const STEPS = 40000;
const EVERY = 20; // the spectral reference at every 20th sample (1 ns), to keep its cost down

function scenario(dielectric: string): string {
  return `skein: 1
time: { end: 2us }
lines:
  cable:
    from: A
    to: B
    length: ${LENGTH_M}m
    section: { kind: coax, innerRadius: 0.405mm, shieldInnerRadius: 1.475mm, dielectric: ${dielectric} }
junctions:
  A:
    nodes: { a: [cable] }
    parts: { gen: { source: trapezoid, between: [a, ref], amplitude: 1, delay: 2ns, rise: 4ns, width: 20ns, fall: 4ns, resistance: 10ohm } }
  B:
    nodes: { b: [cable] }
    parts: { R: { load: resistor, between: [b, ref], resistance: 200ohm } }
`;
}

/** The same trapezoid as the scenario's (plugins/waveforms trapezoid). */
function trapezoid(t: number): number {
  const t0 = 2e-9, t1 = 6e-9, t2 = 26e-9, t3 = 30e-9;
  if (t <= t0 || t >= t3) return 0;
  if (t < t1) return (t - t0) / 4e-9;
  if (t <= t2) return 1;
  return (t3 - t) / 4e-9;
}

async function compare(dielectricYaml: string, dielectric: Record<string, unknown>): Promise<number[]> {
  const section = computeSection({ kind: 'coax', innerRadius: 0.405e-3, shieldInnerRadius: 1.475e-3, dielectric });
  const r = simulateFdLine({
    section, lengthM: LENGTH_M, dtS: DT, steps: STEPS, source: { v: trapezoid, resistanceOhm: 10 }, loadR: 200,
    fit: { fMinHz: 1e3, fMaxHz: 1e9 },
  });
  const registry = await standardRegistry();
  const sc = resolveScenarioText(scenario(dielectricYaml), { registry, file: 'fd-line.yaml' });
  const times = Array.from({ length: STEPS / EVERY }, (_, i) => i * EVERY * DT);
  const ref = await timeResponse(sc, registry, { outputs: [{ kind: 'voltage', node: 'A.a' }, { kind: 'voltage', node: 'B.b' }], timesS: times });
  const out: number[] = [];
  for (const [k, td] of [[0, r.vNear], [1, r.vFar]] as const) {
    const fd = ref.series[k].values;
    let peak = 0, worst = 0, at = 0;
    for (let i = 0; i < fd.length; i++) {
      peak = Math.max(peak, Math.abs(fd[i]));
      const d = Math.abs(td[i * EVERY] - fd[i]);
      if (d > worst) { worst = d; at = times[i]; }
    }
    // The two set-ups differ: the far end sees the pulse after the delay, not before.
    expect(peak).toBeGreaterThan(0.5);
    expect(worst / peak, `${k === 0 ? 'near' : 'far'} end: worst ${worst} V at ${at} s of peak ${peak} V`).toBeLessThan(0.01);
    out.push(worst / peak);
  }
  // Nothing arrives at the far end before the delay (causality of the model).
  expect(Math.abs(r.vFar[Math.floor(240e-9 / DT)])).toBeLessThan(1e-6);
  return out;
}

describe('simulateFdLine', () => {
  it('agrees with the spectral solution within 1 % of the peak on a coax with a causal dielectric', async () => {
    // Measured: 0.43 % (near end, at the corner of the source pulse) and 0.018 % (far end).
    await compare('{ relPermittivity: 2.25, lossTangent: 2e-4, model: djordjevic-sarkar }', { relPermittivity: 2.25, lossTangent: 2e-4, model: 'djordjevic-sarkar' });
  }, 180_000);

  it('agrees with the spectral solution within 1 % of the peak on the coax with a constant loss tangent', async () => {
    // Measured: 0.43 % (near end) and 0.45 % (far end: the non-causal constant loss tangent puts a
    // small precursor in the spectral reference that the causal fit cannot follow).
    await compare('{ relPermittivity: 2.25, lossTangent: 2e-4 }', { relPermittivity: 2.25, lossTangent: 2e-4 });
  }, 180_000);
});
