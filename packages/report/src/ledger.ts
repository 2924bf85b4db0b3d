/**
 * The energy ledger over time (delivered, absorbed, stored, residual, from an energy-ledger probe's
 * traces "<probeId>.delivered" etc. in joules), and the ledger table data for the report (totals
 * from `doc.summary.ledger`, per-part values from the probe's structured output
 * `{ delivered: { partId: J }, absorbed: {...}, stored: {...} }`).
 */
import * as Plot from '@observablehq/plot';
import type { LoadedResults } from '@skein/core';
import { axisLabel, axisTickFormat } from './engineering.ts';
import { badDocument, badOption, composeSvg, decimate, extent, ledgerProbeIds, renderPanel, seriesStyle, type LegendItem } from './svg.ts';

/** The ledger's columns, in the order they are plotted. */
export const LEDGER_TERMS = ['delivered', 'absorbed', 'stored', 'residual'] as const;

/** Options of plotLedger. */
export interface LedgerPlotOptions {
  /** Id of the energy-ledger probe. Default: the first one in doc.network.probes. */
  probe?: string;
  title?: string;
  /** Width [px]. Default 760. */
  widthPx?: number;
  /** Height [px]. Default 300. */
  heightPx?: number;
}

/**
 * Whether the results hold an energy-ledger probe with its traces.
 * @example hasLedger(results) // true
 */
export function hasLedger(results: LoadedResults): boolean {
  const names = results.doc.traces.names;
  return ledgerProbeIds(results).some((id) => LEDGER_TERMS.some((t) => names.includes(`${id}.${t}`)));
}

/**
 * Plots the energy ledger over time as SVG: one line per term present (delivered, absorbed,
 * stored, residual), energy axis with SI prefixes ("mJ", "kJ"), time axis as for traces.
 * @throws InputError E_REPORT_OPTION when `probe` is not an energy-ledger probe; E_REPORT_RESULTS
 *   when the results have no energy-ledger traces.
 * @example plotLedger(results) // '<svg xmlns=...'
 */
export function plotLedger(results: LoadedResults, options: LedgerPlotOptions = {}): string {
  const ids = ledgerProbeIds(results);
  const names = results.doc.traces.names;
  let id = options.probe;
  if (id !== undefined && !ids.includes(id)) throw badOption(['probe'], `must name an energy-ledger probe (${ids.join(', ') || 'none in these results'})`, id);
  id ??= ids.find((p) => LEDGER_TERMS.some((t) => names.includes(`${p}.${t}`)));
  if (id === undefined) throw badDocument(['network', 'probes'], 'must include a probe of type "energy-ledger" with its traces to plot the ledger', ids);
  const terms = LEDGER_TERMS.filter((t) => names.includes(`${id}.${t}`));
  if (terms.length === 0) throw badDocument(['traces', 'names'], `must include ${LEDGER_TERMS.map((t) => `${id}.${t}`).join(', ')}`, names);
  const widthPx = options.widthPx ?? 760;
  const heightPx = options.heightPx ?? 300;
  const time = results.time;
  const tDomain: [number, number] = [time[0] ?? 0, time.length > 1 ? time[time.length - 1] : 1];
  const values: number[] = [];
  const legend: LegendItem[] = [];
  const marks: Plot.Markish[] = [];
  terms.forEach((term, k) => {
    const d = decimate(time, results.trace(`${id}.${term}`), 2400);
    for (const v of d.v) values.push(v);
    const { colour, dash } = seriesStyle(k);
    legend.push({ label: `${term} (${id}.${term})`, colour, dash });
    marks.push(Plot.line(d.t.map((t, i) => [t, d.v[i]] as [number, number]), {
      x: '0', y: '1', stroke: colour, strokeWidth: 1.8, strokeDasharray: dash === 'none' ? undefined : dash, className: 'skein-series', ariaDescription: `${id}.${term}`,
    } as Plot.LineOptions));
  });
  const e = extent(values);
  const pad = 0.05 * (e[1] - e[0]);
  const yDom: [number, number] = [Math.min(0, e[0] - pad), e[1] + pad];
  marks.unshift(Plot.ruleY([0], { stroke: '#9a9a9a', strokeWidth: 0.8 }));
  const panel = renderPanel({
    width: widthPx, height: heightPx, marginLeft: 72, marginRight: 24, marginBottom: 44, grid: true,
    style: { fontSize: '11px', fontFamily: 'system-ui, sans-serif' },
    x: { domain: tDomain, label: axisLabel('time', tDomain, 's'), tickFormat: axisTickFormat(tDomain, 's'), labelArrow: 'none', labelAnchor: 'center', ticks: 8 },
    y: { domain: yDom, label: axisLabel('energy', yDom, 'J'), tickFormat: axisTickFormat(yDom, 'J'), labelArrow: 'none', labelAnchor: 'center', ticks: 6 },
    marks,
  } as Plot.PlotOptions);
  const title = options.title ?? `Energy ledger: ${results.doc.scenario.title}`;
  return composeSvg({ title, kind: 'ledger', widthPx, panels: [{ svg: panel, heightPx }], legend });
}

/** One row of the ledger table: term, item (part or line id, or "total") and energy [J]. */
export interface LedgerRow { term: string; item: string; energyJ: number }

/**
 * The ledger table: per-item energies from the ledger probe's structured output, then the totals
 * from doc.summary.ledger (delivered, absorbed, stored, residual).
 * @example ledgerRows(results)[0] // { term: 'delivered', item: 'surge', energyJ: 12.5 }
 */
export function ledgerRows(results: LoadedResults): LedgerRow[] {
  const rows: LedgerRow[] = [];
  const outputs = (results.doc.outputs ?? {}) as Record<string, unknown>;
  for (const id of ledgerProbeIds(results)) {
    const o = outputs[id] as Record<string, unknown> | undefined;
    if (!o || typeof o !== 'object') continue;
    for (const term of ['delivered', 'absorbed', 'stored'] as const) {
      const m = o[term];
      if (!m || typeof m !== 'object') continue;
      for (const [item, v] of Object.entries(m as Record<string, unknown>)) if (typeof v === 'number') rows.push({ term, item, energyJ: v });
    }
  }
  const tot = results.doc.summary?.ledger as { deliveredJ?: number; absorbedJ?: number; storedJ?: number; residualJ?: number } | null | undefined;
  if (tot && typeof tot === 'object') {
    const add = (term: string, v: number | undefined): void => { if (typeof v === 'number') rows.push({ term, item: 'total', energyJ: v }); };
    add('delivered', tot.deliveredJ); add('absorbed', tot.absorbedJ); add('stored', tot.storedJ); add('residual', tot.residualJ);
  }
  return rows;
}
