/**
 * A results file for a frequency-domain run: the standard header and network summary, no time
 * traces, and the spectral section under `spectral` (see packages/core/README.md).
 */
import { ENGINE_VERSION, RESULTS_FORMAT, RESULTS_VERSION, summariseNetwork, type ResolvedScenario, type ResultsDocument } from '@skein/core';

/** Builds the results document of a spectrum run. */
export function spectralResultsDocument(sc: ResolvedScenario, spectral: unknown, created = new Date()): ResultsDocument {
  return {
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
}
