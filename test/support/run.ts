/**
 * Runs scenario text through the engine with the standard plugins, as `skein run` does.
 */
import { loadPluginModules, PluginRegistry, resolveScenarioText, runScenario, type RunResult } from '@skein/core';
import { STANDARD_PLUGINS, STANDARD_PLUGINS_BASE } from '@skein/cli';

let cached: Promise<PluginRegistry> | undefined;

/** The standard plugin registry (loaded once per test file). */
export function standardRegistry(): Promise<PluginRegistry> {
  cached ??= loadPluginModules(new PluginRegistry(), STANDARD_PLUGINS, STANDARD_PLUGINS_BASE);
  return cached;
}

/** A run result with lookups by trace name and time. */
export interface Run extends RunResult {
  /** Sample of a trace at time t [s] (nearest recorded sample). */
  at(trace: string, tS: number): number;
  /** All samples of a trace. */
  series(trace: string): Float64Array;
  /** Recorded sample times [s]. */
  times(): Float64Array;
}

/** Resolves and runs scenario text. */
export async function runText(text: string, file = 'inline.yaml'): Promise<Run> {
  const registry = await standardRegistry();
  const r = await runScenario(resolveScenarioText(text, { registry, file }), { registry });
  const dt = r.dtS * r.recordEvery;
  const series = (name: string): Float64Array => {
    const i = r.traceNames.indexOf(name);
    if (i < 0) throw new Error(`no trace ${name}; traces: ${r.traceNames.join(', ')}`);
    return r.traces.data.subarray(i * r.nSamples, (i + 1) * r.nSamples);
  };
  return Object.assign(r, {
    at: (trace: string, t: number) => series(trace)[Math.round(t / dt)],
    series,
    times: () => Float64Array.from({ length: r.nSamples }, (_, i) => i * dt),
  });
}
