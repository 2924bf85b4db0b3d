/** @skein/cli: the `skein` command as a function, for embedding and tests. */
export { main, buildRegistry, defaultResultsPath, DEMO_SCENARIO } from './main.ts';
export { STANDARD_PLUGINS, STANDARD_PLUGINS_BASE } from './standardPlugins.ts';
export { SAFETY_CAUTION, formatRunSummary, formatCheck, formatInspect } from './summary.ts';
export { toCsv } from './export.ts';
export { createProgress, type Progress } from './progress.ts';
