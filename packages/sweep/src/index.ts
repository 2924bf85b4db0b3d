/**
 * @skein/sweep: running many cases of a scenario (tolerances, fault positions, cable lengths,
 * terminations) on a local worker-thread pool, in shards for batch schedulers, or through a
 * Redis queue (BullMQ) across machines. Every case is keyed by the digest of its resolved
 * scenario, so a repeated case is computed once and an interrupted sweep resumes.
 */
export {
  loadSweep, loadSweepFile, sweepFromData, SWEEP_FORMAT_VERSION, SWEEP_UNITS, OUTPUT_KINDS,
  type SweepSpec, type ParameterSpec, type OutputSpec, type ListValues, type RangeValues, type DrawValues, type LoadSweepOptions,
} from './spec.ts';
export { expandCases, caseMaker, parameterValues, caseCount, type SweepCase } from './expand.ts';
export { parseValuePath } from './paths.ts';
export { createRandom, streamSeed, type Random } from './prng.ts';
export { summarise, percentile, type Summary } from './stats.ts';
export { outputValue } from './outputs.ts';
export { runCase, encodeCaseRecord, decodeCaseRecord, type CaseTask, type CaseRecord } from './caseRun.ts';
export { createCasePool, type CasePool, type CasePoolOptions } from './pool.ts';
export { runSweep, type RunSweepOptions, type SweepOutcome, type SweepProgress, type CaseExecutor } from './sweep.ts';
export {
  encodeTable, decodeTable, readTable, writeTable, tableToCsv, mergeTables, summariseRows, TABLE_FORMAT, TABLE_VERSION,
  type SweepTable, type SweepRow,
} from './table.ts';
export { createQueueExecutor, serveQueue, resultsHashOf, DEFAULT_QUEUE_NAME, type QueueTarget, type QueueExecutorOptions, type ServeQueueOptions, type QueueConsumer } from './queue.ts';
export { sweepCommand, parseShard, formatSweepSummary, defaultTablePath, SWEEP_USAGE, type SweepIo, type SweepCommandOptions, type RegistryBuilder } from './command.ts';
export { createSweepProgress, formatProgress, type SweepProgressBar } from './progress.ts';
