/**
 * Results documents built by hand for the tests, from classic analytic signals (invented
 * scenario, demo data only):
 * - a sine 1 kV at 10 MHz and an exponential decay 20 A exp(-t / 80 ns);
 * - a Gaussian pulse travelling on a lossless 40 m path (feeder 25 m + branch 15 m) at
 *   c = 2e8 m/s, v(x, t) = f(t - x/c) (d'Alembert's solution of the wave equation), sampled by
 *   line-point probes and, in the second document, as a structured space-time output;
 * - an energy ledger E(t) delivered = E0 (1 - exp(-t/tau)), absorbed 0.7 of it, stored 0.3 of it;
 * - a first-order low-pass spectrum H(f) = 1 / (1 + j f / fc).
 */
import { decodeResults, encodeResults, float64ToBytes, type LoadedResults, type ResultsDocument } from '@skein/core';

export const DT_S = 1e-9;
export const N_SAMPLES = 400;
export const C_MPS = 2e8;
export const FEEDER_M = 25;
export const BRANCH_M = 15;
export const PULSE_V = 1000;
export const PULSE_T0_S = 40e-9;
export const PULSE_SIGMA_S = 6e-9;
export const E0_J = 0.05;
export const TAU_S = 60e-9;
export const FC_HZ = 1e6;

/** The travelling pulse f(t) [V]. */
export function pulse(tS: number): number {
  return PULSE_V * Math.exp(-0.5 * ((tS - PULSE_T0_S) / PULSE_SIGMA_S) ** 2);
}

/** Point-probe positions: distance along the path [m], and (line, position on that line). */
export const POINTS: Array<{ id: string; line: string; positionM: number; pathM: number }> = [
  ...[0, 5, 10, 15, 20, 25].map((x, i) => ({ id: `pf${i}`, line: 'feeder', positionM: x, pathM: x })),
  // The branch runs J3 -> J2 in the network (from its far end), so its positions count backwards.
  ...[3, 6, 9, 12, 15].map((x, i) => ({ id: `pb${i}`, line: 'branch', positionM: BRANCH_M - x, pathM: FEEDER_M + x })),
];

interface Options { spaceTimeOutput?: boolean; spectral?: boolean; ledger?: boolean }

/** Builds, encodes and decodes a results document (so the tests see exactly what a file holds). */
export function makeResults(options: Options = {}): LoadedResults {
  const { spaceTimeOutput = false, spectral = true, ledger = true } = options;
  const names: string[] = [];
  const units: string[] = [];
  const probes: string[] = [];
  const rows: Float64Array[] = [];
  const time = Float64Array.from({ length: N_SAMPLES }, (_, i) => i * DT_S);
  const add = (probe: string, trace: string, unit: string, f: (t: number) => number): void => {
    names.push(`${probe}.${trace}`); units.push(unit); probes.push(probe); rows.push(time.map(f));
  };
  add('src', 'v', 'V', (t) => 1000 * Math.sin(2 * Math.PI * 10e6 * t));
  add('src', 'i', 'A', (t) => 20 * Math.exp(-t / 80e-9));
  const outputs: Record<string, unknown> = {};
  for (const p of POINTS) {
    add(p.id, 'v', 'V', (t) => pulse(t - p.pathM / C_MPS));
    outputs[p.id] = { kind: 'line-point', line: p.line, positionM: p.positionM };
  }
  if (ledger) {
    const d = (t: number): number => E0_J * (1 - Math.exp(-t / TAU_S));
    add('energy', 'delivered', 'J', d);
    add('energy', 'absorbed', 'J', (t) => 0.7 * d(t));
    add('energy', 'stored', 'J', (t) => 0.3 * d(t));
    add('energy', 'residual', 'J', () => 0);
    const dEnd = d(time[N_SAMPLES - 1]);
    outputs.energy = { delivered: { surge: dEnd }, absorbed: { load: 0.7 * dEnd }, stored: { feeder: 0.2 * dEnd, branch: 0.1 * dEnd } };
  }
  if (spaceTimeOutput) {
    const positionsM = Array.from({ length: 41 }, (_, i) => i);
    const values = new Float64Array(N_SAMPLES * 41);
    for (let it = 0; it < N_SAMPLES; it++) for (let ix = 0; ix < 41; ix++) values[it * 41 + ix] = pulse(time[it] - positionsM[ix] / C_MPS);
    outputs.sweep = { kind: 'space-time', positionsM, values: float64ToBytes(values), unit: 'V', boundaries: [{ positionM: 0, label: 'J1' }, { positionM: 25, label: 'J2' }, { positionM: 40, label: 'J3' }] };
  }
  const data = new Float64Array(names.length * N_SAMPLES);
  rows.forEach((r, i) => data.set(r, i * N_SAMPLES));
  const doc: ResultsDocument = {
    format: 'skein-results',
    version: 1,
    engine: { name: 'skein', version: '0.1.0' },
    created: '2026-01-01T00:00:00.000Z',
    scenario: { title: 'Test harness: pulse on a two-line feeder', digest: 'ab'.repeat(32), file: 'feeder.yaml' },
    units: { time: 's', voltage: 'V', current: 'A', energy: 'J', length: 'm' },
    time: { stepS: DT_S, recordEvery: 1, sampleIntervalS: DT_S, count: N_SAMPLES, steps: N_SAMPLES - 1 },
    traces: { names, units, probes, dtype: 'float64', byteOrder: 'little', shape: [names.length, N_SAMPLES], data: float64ToBytes(data) },
    outputs,
    summary: {
      peaks: [{ trace: 'src.v', unit: 'V', max: 1000, min: -1000, atS: 25e-9 }],
      ledger: ledger ? { deliveredJ: E0_J, absorbedJ: 0.7 * E0_J, storedJ: 0.3 * E0_J, residualJ: 0 } : null,
      warnings: ['branch: test warning <b>escaped</b>'],
      timing: {},
    },
    derived: {
      lines: [
        { id: 'feeder', conductors: ['a', 'b'], lengthM: FEEDER_M, velocitiesMps: [2e8, 1.9e8], delaysS: [FEEDER_M / 2e8, FEEDER_M / 1.9e8], modalImpedancesOhm: [50, 120], zcOhm: [80, 20, 20, 80], origin: 'given matrices' },
        { id: 'branch', conductors: ['a'], lengthM: BRANCH_M, velocitiesMps: [2e8], delaysS: [BRANCH_M / 2e8], modalImpedancesOhm: [50], zcOhm: [50], origin: 'given matrices' },
      ],
      delays: [],
    },
    network: {
      lines: [
        { id: 'feeder', from: 'J1', to: 'J2', lengthM: FEEDER_M, conductors: ['a', 'b'] },
        { id: 'branch', from: 'J3', to: 'J2', lengthM: BRANCH_M, conductors: ['a'] },
      ],
      junctions: [
        { id: 'J1', nodes: ['a', 'b'], parts: [{ id: 'surge', role: 'source', type: 'double-exponential', between: ['a', 'ref'] }] },
        { id: 'J2', nodes: ['a', 'b'], parts: [] },
        { id: 'J3', nodes: ['a'], parts: [{ id: 'load', role: 'load', type: 'resistor', between: ['a', 'ref'] }] },
      ],
      probes: [
        { id: 'src', type: 'node-voltage' },
        ...POINTS.map((p) => ({ id: p.id, type: 'line-point' })),
        ...(ledger ? [{ id: 'energy', type: 'energy-ledger' }] : []),
      ],
    },
  };
  if (spectral) {
    const frequenciesHz = Array.from({ length: 61 }, (_, i) => 10 ** (4 + i / 15)); // 10 kHz .. 100 MHz
    const re = frequenciesHz.map((f) => 1 / (1 + (f / FC_HZ) ** 2));
    const im = frequenciesHz.map((f) => -(f / FC_HZ) / (1 + (f / FC_HZ) ** 2));
    doc.spectral = { frequenciesHz, series: [{ name: 'H(load/src)', unit: '1', re, im }, { name: 'Zin', unit: 'ohm', re: frequenciesHz.map(() => 50), im: frequenciesHz.map((f) => 50 * f / 1e7) }] };
  }
  return decodeResults(encodeResults(doc));
}
