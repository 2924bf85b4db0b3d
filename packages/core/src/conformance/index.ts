/**
 * The plugin conformance suite (exported from @skein/core).
 */
export { checkPluginConformance, assertPluginConformance, type ConformanceOptions } from './conformance.ts';
export { conformanceFailed, formatConformanceFailures, type ConformanceCheck, type ConformanceReport } from './report.ts';
export { createFakeSetupContext, createFakeProbeRig, FAKE_CONDUCTORS, FAKE_TRACE_CAPACITY, type FakeProbeRig } from './fakes.ts';
