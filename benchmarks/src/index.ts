/**
 * @skein/benchmarks: stepping-kernel throughput on large generated networks, against a C twin of
 * the same kernels and the machine's measured memory bandwidth. `pnpm bench` runs run.ts.
 */
export {
  drawNetwork, buildKernelNet, generateKernelNet, toScenarioData, benchRegistry, benchDcSource, benchResistorLoad, createRandom,
  SOURCE_OHM, SOURCE_V,
  type GenerateOptions, type NetworkSpec, type KernelNet, type Topology, type Numbering,
} from './generate.ts';
export { buildCTwin, runCTwin, writeCase, cStream, gccVersion, ARRAY_ORDER, C_SOURCE, C_FLAGS, type KernelRun, type Bandwidth } from './cTwin.ts';
export { runTs, stepNet, resetNet, slotRowsFor } from './tsRun.ts';
export { usefulBytesPerStep, tsStream, compareArrays, maxAbs, type Deviation } from './metrics.ts';
export { runBenchmark, formatTable, TOLERANCE, FLOOR_OF_MAX, type BenchCase, type BenchOptions, type BenchResults, type CaseResult, type VariantResult } from './run.ts';
