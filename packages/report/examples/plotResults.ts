/**
 * Example: plots and a report from a results file, through the public API.
 *
 *   npx tsx packages/report/examples/plotResults.ts out/run.msgpack out/plots
 *
 * writes out/plots/run.traces.svg (and .space-time / .ledger / .spectrum when the results allow
 * them) and out/plots/run.report.html, and prints each path.
 */
import { basename, join } from 'node:path';
import { pathToFileURL } from 'node:url';
import { writePlots, writeReport } from '../src/index.ts';

/** Writes every plot and the report of `resultsPath` into `outDir`; returns the paths written. */
export function plotResults(resultsPath: string, outDir: string): string[] {
  const svgs = writePlots(resultsPath, outDir).map((w) => w.path);
  const html = writeReport(resultsPath, join(outDir, `${basename(resultsPath).replace(/\.[^.]*$/, '')}.report.html`));
  return [...svgs, html];
}

if (import.meta.url === pathToFileURL(process.argv[1] ?? '').href) {
  const [resultsPath, outDir = '.'] = process.argv.slice(2);
  if (!resultsPath) {
    process.stderr.write('usage: plotResults.ts RESULTS.msgpack [OUT_DIR]\n');
    process.exit(2);
  }
  for (const p of plotResults(resultsPath, outDir)) process.stdout.write(`${p}\n`);
}
