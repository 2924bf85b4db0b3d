/**
 * @skein/core: the network model, validation, the time-domain solver, the plugin API and the
 * results format. It names no concrete waveform, device or probe: those are plugins.
 */
export {
  SkeinError, InputError, NumericalError, PluginError, badInput, formatPath,
  type DocPath, type SourceLocation,
} from './errors.ts';
export { parseQuantity, formatQuantity, quantityName, unitExample, type UnitSymbol } from './units.ts';
export {
  defineSource, defineLoad, defineProbe, HOOK_NAMES,
  type ParamSpec, type ParamSchema, type ParamValues, type SetupContext, type WaveformInstance, type SourcePlugin,
  type LinearLoadInstance, type ShortLoadInstance, type NonlinearLoadInstance, type LoadInstance, type LoadPlugin,
  type ProbeSetupContext, type ProbeState, type ProbeInstance, type ProbePlugin, type StructuredOutput, type LedgerView,
  type NodeHandle, type PortHandle, type PointHandle, type PartHandle, type TraceHandle, type AnyPlugin,
} from './plugins/api.ts';
export { PluginRegistry, loadPluginModules, resolvePluginSpecifier, isPlugin } from './plugins/registry.ts';
export { parseLocatedDocument, plainDocument, type LocatedDocument } from './scenario/document.ts';
export {
  resolveScenarioText, resolveScenarioData, resolveScenarioDocument, digestOf, isPositiveDefinite,
  SCENARIO_FORMAT_VERSION, REFERENCE_NODE,
  type ResolveOptions, type SectionResolver, type SectionMatrices,
} from './scenario/resolve.ts';
export type { ResolvedScenario, ResolvedLine, ResolvedJunction, ResolvedPart, ResolvedPort, ResolvedProbe, ResolvedTime, ResolvedProfile, ResolvedStretch, ResolvedTaper } from './model.ts';
export { decomposeLine, type ModalLine } from './line/modal.ts';
export { compileScenario, type Plan, type DelayInfo, type CompileOptions } from './compile/compile.ts';
export { widenRings } from './compile/rings.ts';
export { runScenario, runPlan, deriveLines, summariseNetwork, type RunOptions, type RunResult, type TracePeak, type LineDerived, type NetworkSummary } from './run/run.ts';
export {
  resultsDocument, encodeResults, decodeResults, readResults, writeResults, writeFileAtomic, float64ToBytes, bytesToFloat64,
  RESULTS_FORMAT, RESULTS_VERSION, ENGINE_VERSION, type ResultsDocument, type LoadedResults,
} from './results/format.ts';
export { scenarioSchema } from './scenario/schema.ts';
export {
  checkPluginConformance, assertPluginConformance, conformanceFailed, formatConformanceFailures,
  createFakeSetupContext, createFakeProbeRig, FAKE_CONDUCTORS, FAKE_TRACE_CAPACITY,
  type ConformanceOptions, type ConformanceCheck, type ConformanceReport, type FakeProbeRig,
} from './conformance/index.ts';
export { NEWTON_MAX_ITERATIONS } from './run/newton.ts';
export { runPartitioned, decidePartition, type ScenarioSource, type PartitionedOptions, type PartitionDecision } from './parallel/runPartitioned.ts';
export { partitionNetwork, breadthFirstOrder, junctionCost, type Partition, type PartitionOptions } from './parallel/partition.ts';
export { junctionStep } from './kernel/junctionStep.ts';
export { junctionStepScalar } from './kernel/junctionStepScalar.ts';
export { junctionStepBlocked } from './kernel/junctionStepBlocked.ts';
export { junctionStepScalarBlocked } from './kernel/junctionStepScalarBlocked.ts';
export { junctionStepOneNodeBlocked } from './kernel/junctionStepOneNodeBlocked.ts';
export { junctionStepOneNodeUnrolled } from './kernel/junctionStepOneNodeUnrolled.ts';
export { junctionStepFourNodeBlocked } from './kernel/junctionStepFourNodeBlocked.ts';
export { fdtdStep } from './kernel/fdtdStep.ts';
export { fdtdStep1 } from './kernel/fdtdStep1.ts';
export { fdtdStep2 } from './kernel/fdtdStep2.ts';
export { fdtdStep3 } from './kernel/fdtdStep3.ts';
export { fdtdStep4 } from './kernel/fdtdStep4.ts';
export { fdtdStepVarying } from './kernel/fdtdStepVarying.ts';
export {
  vectorFit, evaluateRational, fitErrors, passivityGrid, enforceAdmittancePassivity, enforceBoundedMagnitude,
  type RationalFunction, type RationalFit, type VectorFitOptions, type PassivityResult,
} from './line/vectorFitting.ts';
export { fitFdLine, lineFunctions, simulateFdLine, prepareFdLine, type FdLineModel, type FdLineFitOptions, type FdLineSimulation, type FdLineResult } from './line/fdLine.ts';
export { fitFdMultiLine, constantModalTransform, modeSection, modalCoupling, couplingOverBand, defaultModalFrequency, type FdMultiModel, type FdMultiFitOptions, type ModalTransform, type ModalCoupling } from './line/fdModal.ts';
