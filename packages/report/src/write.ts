/**
 * Writing plots and reports to disk, atomically (core's writeFileAtomic: temporary file, flush,
 * rename), so a crash never leaves a half-written SVG or HTML under its final name.
 */
import { mkdirSync } from 'node:fs';
import { basename, join } from 'node:path';
import { readResults, writeFileAtomic, type LoadedResults } from '@skein/core';
import { badDocument } from './svg.ts';
import { makePlots, renderReport, type ReportOptions } from './report.ts';

/** Options of writePlots: the same plot options as a report (false leaves a plot out). */
export type WritePlotsOptions = Omit<ReportOptions, 'title' | 'resultsFile'>;

/** One SVG file writePlots wrote. */
export interface WrittenPlot {
  kind: 'traces' | 'space-time' | 'ledger' | 'spectrum';
  path: string;
}

function load(results: string | LoadedResults): { r: LoadedResults; stem: string; file?: string } {
  if (typeof results === 'string') return { r: readResults(results), stem: basename(results).replace(/\.[^.]*$/, '') || 'results', file: results };
  return { r: results, stem: 'results' };
}

/**
 * Reads a results file and writes every plot it allows as SVG into `outDir` (created if
 * missing): `<stem>.traces.svg`, `<stem>.space-time.svg`, `<stem>.ledger.svg`,
 * `<stem>.spectrum.svg`, where stem is the results file name without its extension.
 * @param resultsPath path of a .msgpack results file (or already decoded results; stem "results")
 * @param outDir directory for the SVG files
 * @param options plot options; false leaves a plot out
 * @returns the files written, in the order above
 * @throws SkeinError E_RESULTS when the file is not a results file; InputError E_REPORT_RESULTS
 *   when it holds nothing to plot; E_REPORT_OPTION for bad options
 * @example writePlots('out/run.msgpack', 'out/plots') // [{ kind: 'traces', path: 'out/plots/run.traces.svg' }, ...]
 */
export function writePlots(resultsPath: string | LoadedResults, outDir: string, options: WritePlotsOptions = {}): WrittenPlot[] {
  const { r, stem } = load(resultsPath);
  const plots = makePlots(r, options);
  const entries: Array<[WrittenPlot['kind'], string | { absent: string }]> = [
    ['traces', plots.traces], ['space-time', plots.spaceTime], ['ledger', plots.ledger], ['spectrum', plots.spectrum],
  ];
  const svgs = entries.filter((e): e is [WrittenPlot['kind'], string] => typeof e[1] === 'string');
  if (svgs.length === 0) {
    throw badDocument([], 'must hold probe traces, a space-time map, an energy ledger or spectra to plot', entries.map(([k, p]) => `${k}: ${(p as { absent: string }).absent}`).join('; '));
  }
  mkdirSync(outDir, { recursive: true });
  return svgs.map(([kind, svg]) => {
    const path = join(outDir, `${stem}.${kind}.svg`);
    writeFileAtomic(path, `<?xml version="1.0" encoding="UTF-8"?>\n${svg}\n`);
    return { kind, path };
  });
}

/**
 * Reads a results file and writes its self-contained HTML report to `outPath` (parent directory
 * created if missing).
 * @param resultsPath path of a .msgpack results file (or already decoded results)
 * @param outPath the .html file to write
 * @param options report options
 * @returns outPath
 * @throws as readResults and renderReport
 * @example writeReport('out/run.msgpack', 'out/run.html') // "out/run.html"
 */
export function writeReport(resultsPath: string | LoadedResults, outPath: string, options: ReportOptions = {}): string {
  const { r, file } = load(resultsPath);
  const html = renderReport(r, { resultsFile: file !== undefined ? basename(file) : undefined, ...options });
  mkdirSync(join(outPath, '..'), { recursive: true });
  writeFileAtomic(outPath, html);
  return outPath;
}
