/**
 * A results file for a frequency-domain run: the standard header and network summary, the spectral
 * section under `spectral` (see packages/core/README.md), and for a time response from the spectrum
 * (`skein spectrum --until`) its samples as traces on an evenly spaced time axis from 0, with the
 * method's parameters under `outputs.timeResponse`.
 */
import { ENGINE_VERSION, RESULTS_FORMAT, RESULTS_VERSION, float64ToBytes, summariseNetwork, type ResolvedScenario, type ResultsDocument } from '@skein/core';
import type { TimeResponse } from '@skein/spectral';

/**
 * Builds the results document of a spectrum run; with `time` that of a time response from the
 * spectrum (pass `spectral` undefined then: the file holds traces, like a run's, and no sweep).
 */
export function spectralResultsDocument(sc: ResolvedScenario, spectral: unknown, created = new Date(), time?: TimeResponse): ResultsDocument {
  const doc: ResultsDocument = {
    format: RESULTS_FORMAT,
    version: RESULTS_VERSION,
    engine: { name: 'skein', version: ENGINE_VERSION },
    created: created.toISOString(),
    scenario: { title: sc.title, digest: sc.digest, file: sc.file ?? null },
    units: { time: 's', frequency: 'Hz', voltage: 'V', current: 'A' },
    time: { stepS: 0, recordEvery: 1, sampleIntervalS: 0, count: 0, steps: 0 },
    traces: { names: [], units: [], probes: [], dtype: 'float64', byteOrder: 'little', shape: [0, 0], data: new Uint8Array(0) },
    outputs: {},
    summary: { peaks: [], ledger: null, warnings: [], timing: {} },
    derived: { lines: [], delays: [] },
    network: summariseNetwork(sc),
    spectral,
  };
  if (time) {
    const n = time.timesS.length;
    const data = new Float64Array(time.series.length * n);
    time.series.forEach((s, k) => data.set(s.values, k * n));
    const dt = n > 1 ? time.timesS[1] - time.timesS[0] : 0;
    doc.time = { stepS: dt, recordEvery: 1, sampleIntervalS: dt, count: n, steps: Math.max(0, n - 1) };
    doc.traces = {
      names: time.series.map((s) => s.name), units: time.series.map((s) => s.unit), probes: time.series.map(() => 'spectrum'),
      dtype: 'float64', byteOrder: 'little', shape: [time.series.length, n], data: float64ToBytes(data),
    };
    doc.outputs = { timeResponse: { ...time.method } };
  }
  return doc;
}
