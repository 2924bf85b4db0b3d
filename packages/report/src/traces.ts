/**
 * Probe waveforms over time: one panel per unit (V, A, ...), sharing the time axis, every trace a
 * line in skein's palette, ticks on engineering scales.
 */
import * as Plot from '@observablehq/plot';
import type { LoadedResults } from '@skein/core';
import { axisLabel, axisTickFormat } from './engineering.ts';
import { badOption, composeSvg, decimate, extent, ledgerProbeIds, quantityOf, renderPanel, seriesStyle, type LegendItem, type Panel } from './svg.ts';

/** Options of plotTraces. */
export interface TracePlotOptions {
  /** Trace names ("<probeId>.<trace>") to plot, in order. Default: every trace except energy-ledger traces. */
  traces?: string[];
  /** Plot title. Default: "Probe waveforms: <scenario title>". */
  title?: string;
  /** Width [px]. Default 760. */
  widthPx?: number;
  /** Height of each unit's panel [px]. Default 260. */
  panelHeightPx?: number;
  /** Time window [s]. Default: the whole run. */
  timeRangeS?: [number, number];
  /** Points kept per trace after min/max decimation. Default 2400. */
  maxPoints?: number;
}

/** The traces plotTraces shows by default: all but the energy-ledger probes' traces. */
export function defaultTraceNames(results: LoadedResults): string[] {
  const ledger = new Set(ledgerProbeIds(results));
  const { names, probes } = results.doc.traces;
  return names.filter((_, i) => !ledger.has(probes[i]));
}

/**
 * Plots probe waveforms as SVG: one panel per unit, shared time axis with SI-prefixed ticks
 * ("20 ns"), y axes labelled with quantity and prefixed unit ("voltage [kV]"), a legend naming
 * each trace. Each series is a `<g aria-label="series <name>">` in the SVG.
 * @param results a decoded results file (core's readResults / decodeResults)
 * @param options see TracePlotOptions
 * @returns standalone SVG text
 * @throws InputError E_REPORT_OPTION when a trace name is unknown or the selection is empty
 * @example plotTraces(readResults('run.msgpack'), { traces: ['vload.v'] }) // '<svg xmlns=...'
 */
export function plotTraces(results: LoadedResults, options: TracePlotOptions = {}): string {
  const all = results.doc.traces.names;
  const names = options.traces ?? defaultTraceNames(results);
  names.forEach((n, i) => {
    if (!all.includes(n)) throw badOption(['traces', i], `must name a trace of the results (${all.join(', ') || 'none'})`, n);
  });
  if (names.length === 0) throw badOption(['traces'], 'must select at least one trace; the results have none to plot', names);
  const widthPx = options.widthPx ?? 760;
  const panelH = options.panelHeightPx ?? 260;
  const maxPoints = options.maxPoints ?? 2400;
  const time = results.time;
  const [t0, t1] = options.timeRangeS ?? [time[0] ?? 0, time[time.length - 1] ?? 1];
  if (!(t1 > t0)) throw badOption(['timeRangeS'], 'must be [start, end] with end > start, in seconds', options.timeRangeS);
  const tDomain: [number, number] = [t0, t1];

  const units: string[] = [];
  const byUnit = new Map<string, Array<{ name: string; k: number }>>();
  names.forEach((name, k) => {
    const unit = results.doc.traces.units[all.indexOf(name)] ?? '';
    if (!byUnit.has(unit)) { byUnit.set(unit, []); units.push(unit); }
    byUnit.get(unit)!.push({ name, k });
  });

  const legend: LegendItem[] = names.map((name, k) => ({ label: name, ...styleOf(k) }));
  const panels: Panel[] = units.map((unit) => {
    const series = byUnit.get(unit)!;
    const marks: Plot.Markish[] = [];
    const values: number[] = [];
    for (const s of series) {
      const v = results.trace(s.name);
      const i0 = lowerIndex(time, t0);
      const i1 = upperIndex(time, t1);
      const d = decimate(time.subarray(i0, i1), v.subarray(i0, i1), maxPoints);
      for (const x of d.v) values.push(x);
      const { colour, dash } = styleOf(s.k);
      marks.push(Plot.line(d.t.map((t, i) => [t, d.v[i]] as [number, number]), {
        x: '0', y: '1', stroke: colour, strokeWidth: 1.6, strokeDasharray: dash === 'none' ? undefined : dash, className: 'skein-series', ariaDescription: s.name,
      } as Plot.LineOptions));
    }
    const yDomain = extent(values);
    const pad = 0.05 * (yDomain[1] - yDomain[0]);
    const yDom: [number, number] = [yDomain[0] - pad, yDomain[1] + pad];
    if (yDom[0] < 0 && yDom[1] > 0) marks.unshift(Plot.ruleY([0], { stroke: '#9a9a9a', strokeWidth: 0.8 }));
    return {
      heightPx: panelH,
      svg: renderPanel({
        width: widthPx,
        height: panelH,
        marginLeft: 72,
        marginRight: 24,
        marginBottom: 44,
        grid: true,
        style: { fontSize: '11px', fontFamily: 'system-ui, sans-serif' },
        x: { domain: tDomain, label: axisLabel('time', tDomain, 's'), tickFormat: axisTickFormat(tDomain, 's'), labelArrow: 'none', labelAnchor: 'center', ticks: 8 },
        y: { domain: yDom, label: axisLabel(quantityOf(unit), yDom, unit), tickFormat: axisTickFormat(yDom, unit), labelArrow: 'none', labelAnchor: 'center', ticks: 6 },
        marks,
      } as Plot.PlotOptions),
    };
  });
  const title = options.title ?? `Probe waveforms: ${results.doc.scenario.title}`;
  return composeSvg({ title, kind: 'traces', widthPx, panels, legend });
}

function styleOf(k: number): { colour: string; dash: string } {
  return seriesStyle(k);
}

function lowerIndex(t: Float64Array, x: number): number {
  let i = 0;
  while (i < t.length - 1 && t[i + 1] <= x) i++;
  return i;
}

function upperIndex(t: Float64Array, x: number): number {
  let i = t.length;
  while (i > 1 && t[i - 2] >= x) i--;
  return i;
}
