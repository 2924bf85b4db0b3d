import type { SetupContext, SourcePlugin, WaveformInstance } from '@skein/core';

/** A setup context for tests: collects warnings. */
export function testContext(warnings: string[] = []): SetupContext {
  return { dtS: 1e-9, endS: 1e-3, id: 'test', warn: (m) => warnings.push(m) };
}

/** Creates a source with its schema defaults under the given parameters. */
export function makeSource(plugin: SourcePlugin, given: Record<string, unknown>): WaveformInstance {
  const p: Record<string, unknown> = {};
  for (const [k, spec] of Object.entries(plugin.params)) if ('default' in spec && spec.default !== undefined) p[k] = spec.default;
  return plugin.create({ ...p, ...given } as never, testContext()) as WaveformInstance;
}

/** Asserts |got - expected| <= tol * |expected| with a message naming the quantity. */
export function within(name: string, got: number, expected: number, tol: number): void {
  const rel = Math.abs(got - expected) / Math.abs(expected);
  if (!(rel <= tol)) throw new Error(`${name}: got ${got}, expected ${expected} +- ${tol * 100} %, off by ${(rel * 100).toFixed(3)} %`);
}
