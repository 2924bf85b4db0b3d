/**
 * The HTML report: one self-contained file (CSS and SVG inline, raster images as data: URIs, no
 * script, no external fetch) with the scenario summary, derived line data, plots, peaks, ledger
 * table, warnings and the safety caution.
 */
import { formatQuantity, InputError, type LineDerived, type LoadedResults, type TracePeak } from '@skein/core';
import { hasLedger, ledgerRows, plotLedger, type LedgerPlotOptions } from './ledger.ts';
import { hasSpaceTime, plotSpaceTime, type SpaceTimeOptions } from './spaceTime.ts';
import { plotSpectrum, spectralOf, type SpectrumPlotOptions } from './spectrum.ts';
import { escapeXml, networkOf } from './svg.ts';
import { defaultTraceNames, plotTraces, type TracePlotOptions } from './traces.ts';

/** Speed of light in vacuum [m/s] (exact, SI Brochure, 9th edition). */
const C0_MPS = 299_792_458;

/** The safety caution printed in every report's footer (DESIGN.md, "Safety"). */
export const SAFETY_CAUTION =
  'Results are engineering estimates from a model, not measurements. Surges, lightning and high voltage can kill. ' +
  'Protection design follows the applicable standards (for example IEC 62305 for lightning protection and IEC 61643 ' +
  'for surge protective devices) and local codes, and work on live or high-voltage systems is for qualified, licensed people only.';

/** Options of renderReport: which plots, and their options (false leaves a plot out). */
export interface ReportOptions {
  /** Report title. Default: "skein report: <scenario title>". */
  title?: string;
  /** Results file name shown in the header. */
  resultsFile?: string;
  traces?: TracePlotOptions | false;
  spaceTime?: SpaceTimeOptions | false;
  ledger?: LedgerPlotOptions | false;
  spectrum?: SpectrumPlotOptions | false;
}

/** The plots of a results document, each SVG text or the reason it is absent. */
export interface ReportPlots {
  traces: string | { absent: string };
  spaceTime: string | { absent: string };
  ledger: string | { absent: string };
  spectrum: string | { absent: string };
}

/** How makePlots treats a malformed results field: raise it, or show it as the plot's absence note. */
export type MalformedPolicy = 'throw' | 'note';

/**
 * Makes every plot the results allow (the ones set to false are left out with a note).
 * @param malformed 'throw' (default; what writePlots uses) raises the InputError of a malformed
 *   results field; 'note' (what renderReport uses) turns it into the plot's absence note, so one bad
 *   structured output does not cost the whole report
 * @throws InputError E_REPORT_OPTION when an option names something absent; E_REPORT_RESULTS for a
 *   malformed results field unless malformed is 'note'
 */
export function makePlots(results: LoadedResults, options: Omit<ReportOptions, 'title' | 'resultsFile'> = {}, malformed: MalformedPolicy = 'throw'): ReportPlots {
  const off = { absent: 'left out by the options' };
  const guard = (what: string, f: () => string | { absent: string }): string | { absent: string } => {
    try {
      return f();
    } catch (e) {
      if (malformed === 'note' && e instanceof InputError && e.code === 'E_REPORT_RESULTS') return { absent: `the ${what} data in the results is malformed: ${e.message}` };
      throw e;
    }
  };
  return {
    traces: options.traces === false ? off
      : (options.traces?.traces ?? defaultTraceNames(results)).length > 0 ? plotTraces(results, options.traces || {})
      : { absent: 'the results hold no probe traces' },
    spaceTime: options.spaceTime === false ? off
      : guard('space-time', () => (options.spaceTime && (options.spaceTime.output || options.spaceTime.path)) || hasSpaceTime(results)
        ? plotSpaceTime(results, options.spaceTime || {})
        : { absent: 'the results hold no space-time output and no line-point probes at two or more positions' }),
    ledger: options.ledger === false ? off
      : hasLedger(results) || options.ledger?.probe ? plotLedger(results, options.ledger || {})
      : { absent: 'the scenario has no energy-ledger probe' },
    spectrum: options.spectrum === false ? off
      : guard('spectral', () => spectralOf(results) ? plotSpectrum(results, options.spectrum || {}) : { absent: 'the results hold no frequency-domain part' }),
  };
}

const CSS = `
:root { color-scheme: light; }
body { font-family: system-ui, -apple-system, "Segoe UI", sans-serif; color: #1a1a1a; background: #f6f6f4; margin: 0; }
main { max-width: 980px; margin: 0 auto; padding: 24px 28px 8px; background: #fff; }
h1 { font-size: 22px; margin: 0 0 4px; }
h2 { font-size: 17px; margin: 28px 0 8px; border-bottom: 1px solid #ddd; padding-bottom: 4px; }
h3 { font-size: 14px; margin: 16px 0 6px; }
.meta { color: #555; font-size: 13px; margin: 0 0 12px; }
table { border-collapse: collapse; font-size: 12.5px; margin: 6px 0 12px; }
th, td { border: 1px solid #d6d6d6; padding: 3px 8px; text-align: left; vertical-align: top; }
th { background: #f0f0ec; font-weight: 600; }
td.num { text-align: right; font-variant-numeric: tabular-nums; white-space: nowrap; }
table.zc td { text-align: right; font-variant-numeric: tabular-nums; }
figure { margin: 12px 0 20px; }
figure svg { max-width: 100%; height: auto; display: block; }
figcaption { font-size: 12px; color: #555; margin-top: 4px; }
.absent { color: #666; font-style: italic; font-size: 13px; }
ul.warnings li { margin: 2px 0; font-size: 13px; }
footer { max-width: 980px; margin: 0 auto 24px; padding: 14px 28px; background: #fff4e5; border-top: 3px solid #e07b00; font-size: 13px; }
footer strong { display: block; margin-bottom: 4px; }
@media print { body { background: #fff; } main, footer { max-width: none; } }
`;

function q(value: number, unit: string): string {
  return escapeXml(formatQuantity(value, unit));
}

function velocityText(v: number): string {
  return `${(v / 1e6).toPrecision(4)} m/us (${(v / C0_MPS).toFixed(3)} c)`;
}

function zcTable(l: LineDerived): string {
  const n = l.conductors.length;
  if (!Array.isArray(l.zcOhm) || l.zcOhm.length !== n * n) return '<span class="absent">not recorded</span>';
  const head = `<tr><th></th>${l.conductors.map((c) => `<th>${escapeXml(c)}</th>`).join('')}</tr>`;
  const rows = l.conductors.map((c, i) => `<tr><th>${escapeXml(c)}</th>${l.conductors.map((_, j) => `<td>${l.zcOhm[i * n + j].toFixed(2)}</td>`).join('')}</tr>`);
  return `<table class="zc">${head}${rows.join('')}</table>`;
}

function figure(id: string, caption: string, plot: string | { absent: string }): string {
  if (typeof plot !== 'string') return `<p class="absent" id="${id}">Not shown: ${escapeXml(plot.absent)}.</p>`;
  return `<figure id="${id}">${plot}<figcaption>${escapeXml(caption)}</figcaption></figure>`;
}

/**
 * Renders the report as one self-contained HTML document (UTF-8 text): summary, lines (length,
 * modal velocities and delays, modal impedances, Zc matrix), junctions, probes, plots, peaks,
 * ledger table, warnings, and the safety caution in the footer.
 * @param results decoded results
 * @param options which plots and their options
 * @returns HTML text
 * @throws InputError E_REPORT_OPTION for a bad option (a malformed results field becomes the plot's note)
 * @example renderReport(readResults('run.msgpack')).startsWith('<!DOCTYPE html>') // true
 */
export function renderReport(results: LoadedResults, options: ReportOptions = {}): string {
  const doc = results.doc;
  const net = networkOf(results);
  const lines = (doc.derived?.lines ?? []) as LineDerived[];
  const plots = makePlots(results, options, 'note');
  const title = options.title ?? `skein report: ${doc.scenario.title}`;
  const endS = results.time.length > 0 ? results.time[results.time.length - 1] : 0;
  const out: string[] = [];
  out.push('<!DOCTYPE html>', '<html lang="en"><head><meta charset="utf-8">',
    `<meta name="viewport" content="width=device-width, initial-scale=1"><meta name="generator" content="skein ${escapeXml(doc.engine?.version ?? '')}">`,
    `<title>${escapeXml(title)}</title><style>${CSS}</style></head><body><main>`);
  out.push(`<h1>${escapeXml(title)}</h1>`);
  out.push(`<p class="meta">Scenario <strong>${escapeXml(doc.scenario.title)}</strong>${doc.scenario.file ? ` from ${escapeXml(doc.scenario.file)}` : ''}` +
    `${options.resultsFile ? `, results ${escapeXml(options.resultsFile)}` : ''}. Run ${escapeXml(doc.created)} by ${escapeXml(doc.engine.name)} ${escapeXml(doc.engine.version)}. ` +
    `Scenario digest <code>${escapeXml(doc.scenario.digest.slice(0, 16))}</code>.</p>`);

  out.push('<h2 id="summary">Scenario summary</h2><table>',
    `<tr><th>time step</th><td class="num">${q(doc.time.stepS, 's')}</td></tr>`,
    `<tr><th>steps</th><td class="num">${doc.time.steps}</td></tr>`,
    `<tr><th>recorded samples</th><td class="num">${doc.time.count} every ${q(doc.time.sampleIntervalS, 's')}</td></tr>`,
    `<tr><th>end of record</th><td class="num">${q(endS, 's')}</td></tr>`,
    `<tr><th>lines / junctions / probes</th><td class="num">${net.lines.length} / ${net.junctions.length} / ${net.probes.length}</td></tr>`,
    '</table>');

  out.push('<h2 id="lines">Lines</h2>');
  if (lines.length === 0) out.push('<p class="absent">The results list no lines.</p>');
  for (const l of lines) {
    const topo = net.lines.find((x) => x.id === l.id);
    out.push(`<h3>${escapeXml(l.id)}${topo ? ` (${escapeXml(topo.from)} to ${escapeXml(topo.to)})` : ''}</h3>`);
    out.push('<table><tr><th>length</th><th>conductors</th><th>mode</th><th>velocity</th><th>delay</th><th>modal impedance</th></tr>');
    l.velocitiesMps.forEach((v, m) => {
      out.push('<tr>' + (m === 0 ? `<td class="num" rowspan="${l.velocitiesMps.length}">${q(l.lengthM, 'm')}</td><td rowspan="${l.velocitiesMps.length}">${escapeXml(l.conductors.join(', '))}</td>` : '') +
        `<td class="num">${m + 1}</td><td class="num">${escapeXml(velocityText(v))}</td><td class="num">${q(l.delaysS[m], 's')}</td><td class="num">${q(l.modalImpedancesOhm[m], 'ohm')}</td></tr>`);
    });
    out.push('</table>');
    out.push(`<p class="meta">Characteristic impedance matrix Zc [ohm]${l.origin ? `; parameters: ${escapeXml(l.origin)}` : ''}</p>${zcTable(l)}`);
  }

  out.push('<h2 id="junctions">Junctions</h2>');
  if (net.junctions.length === 0) out.push('<p class="absent">The results list no junctions.</p>');
  else {
    out.push('<table><tr><th>junction</th><th>nodes</th><th>parts (role, type, between)</th></tr>');
    for (const j of net.junctions) {
      const parts = j.parts.map((p) => `${escapeXml(p.id)} (${escapeXml(p.role)}, ${escapeXml(p.type)}, ${escapeXml(p.between[0])} to ${escapeXml(p.between[1])})`).join('<br>');
      out.push(`<tr><td>${escapeXml(j.id)}</td><td>${escapeXml(j.nodes.join(', '))}</td><td>${parts || '<span class="absent">none</span>'}</td></tr>`);
    }
    out.push('</table>');
  }
  if (net.probes.length > 0) {
    // Grouped by type: a scan can place dozens of point probes, one row each would bury the rest.
    const types = [...new Set(net.probes.map((p) => p.type))];
    out.push('<h3>Probes</h3><table id="probes"><tr><th>type</th><th>probes</th></tr>');
    for (const t of types) out.push(`<tr><td>${escapeXml(t)}</td><td>${escapeXml(net.probes.filter((p) => p.type === t).map((p) => p.id).join(', '))}</td></tr>`);
    out.push('</table>');
  }

  out.push('<h2 id="plots">Plots</h2>');
  out.push(figure('plot-traces', 'Probe waveforms, one panel per unit.', plots.traces));
  out.push(figure('plot-space-time', 'Voltage along the path over time (cividis colour map, grey = 0 V). Bands falling to the right are waves travelling forward, bands of the opposite slope are reflections.', plots.spaceTime));
  out.push(figure('plot-ledger', 'Energy ledger over time: delivered by sources, absorbed by loads and line losses, stored in the lines; the residual is what does not balance.', plots.ledger));
  out.push(figure('plot-spectrum', 'Magnitude and phase of the frequency-domain results.', plots.spectrum));

  const peaks = (doc.summary?.peaks ?? []) as TracePeak[];
  out.push('<h2 id="peaks">Peaks</h2>');
  if (peaks.length === 0) out.push('<p class="absent">No peaks recorded.</p>');
  else {
    out.push('<table><tr><th>trace</th><th>max</th><th>min</th><th>largest magnitude at</th></tr>');
    for (const p of peaks) out.push(`<tr><td>${escapeXml(p.trace)}</td><td class="num">${q(p.max, p.unit)}</td><td class="num">${q(p.min, p.unit)}</td><td class="num">${q(p.atS, 's')}</td></tr>`);
    out.push('</table>');
  }

  const rows = ledgerRows(results);
  out.push('<h2 id="ledger">Energy ledger</h2>');
  if (rows.length === 0) out.push('<p class="absent">The scenario has no energy-ledger probe.</p>');
  else {
    out.push('<table id="ledger-table"><tr><th>term</th><th>item</th><th>energy</th></tr>');
    for (const r of rows) out.push(`<tr><td>${escapeXml(r.term)}</td><td>${r.item === 'total' ? '<strong>total</strong>' : escapeXml(r.item)}</td><td class="num">${q(r.energyJ, 'J')}</td></tr>`);
    out.push('</table>');
  }

  const warnings = doc.summary?.warnings ?? [];
  out.push('<h2 id="warnings">Warnings</h2>');
  out.push(warnings.length === 0 ? '<p class="absent">None.</p>' : `<ul class="warnings">${warnings.map((w) => `<li>${escapeXml(w)}</li>`).join('')}</ul>`);
  out.push('</main>');
  out.push(`<footer id="safety"><strong>Safety caution</strong>${escapeXml(SAFETY_CAUTION)}</footer>`);
  out.push('</body></html>');
  return out.join('\n');
}
