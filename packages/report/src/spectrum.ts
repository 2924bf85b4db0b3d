/**
 * Spectra of a frequency-domain run (`doc.spectral`): magnitude in dB and phase in degrees over
 * frequency, log frequency axis when the band spans more than a decade.
 *
 * Accepted shape: `doc.spectral = { frequenciesHz: number[] (increasing, > 0 for a log axis),
 * series: [{ name, unit, re: number[], im: number[] }] }` with re/im one value per frequency.
 * Magnitude: 20 log10(|X| / 1 unit) [dB re 1 unit] (power-root quantity convention, IEC 60027-3).
 */
import * as Plot from '@observablehq/plot';
import type { LoadedResults } from '@skein/core';
import { axisLabel, axisTickFormat, formatTickOwnPrefix } from './engineering.ts';
import { badDocument, badOption, composeSvg, extent, renderPanel, seriesStyle, type LegendItem, type Panel } from './svg.ts';

/** One complex spectrum. */
export interface SpectralSeries { name: string; unit: string; re: number[]; im: number[] }

/** The spectral part of a results document. */
export interface SpectralResults { frequenciesHz: number[]; series: SpectralSeries[] }

/** Options of plotSpectrum. */
export interface SpectrumPlotOptions {
  /** Series names to plot. Default: all. */
  series?: string[];
  title?: string;
  /** Width [px]. Default 760. */
  widthPx?: number;
  /** Height of each of the two panels [px]. Default 240. */
  panelHeightPx?: number;
}

/**
 * Reads and checks doc.spectral; undefined when the results have none.
 * @throws InputError E_REPORT_RESULTS naming the path of a malformed field
 */
export function spectralOf(results: LoadedResults): SpectralResults | undefined {
  const s = results.doc.spectral as Record<string, unknown> | undefined | null;
  if (s === undefined || s === null) return undefined;
  const f = s.frequenciesHz;
  if (!Array.isArray(f) || f.length < 2 || !f.every((x) => typeof x === 'number' && Number.isFinite(x))) {
    throw badDocument(['spectral', 'frequenciesHz'], 'must be a list of at least 2 finite frequencies in Hz', f);
  }
  for (let i = 1; i < f.length; i++) if (!(f[i] > f[i - 1])) throw badDocument(['spectral', 'frequenciesHz', i], `must be greater than the frequency before (${f[i - 1]} Hz)`, f[i]);
  if (!Array.isArray(s.series)) throw badDocument(['spectral', 'series'], 'must be a list of { name, unit, re, im }', s.series);
  const series = (s.series as unknown[]).map((x, i) => {
    const o = x as Record<string, unknown>;
    if (!o || typeof o.name !== 'string') throw badDocument(['spectral', 'series', i, 'name'], 'must be text', o?.name);
    for (const k of ['re', 'im'] as const) {
      const a = o[k];
      if (!Array.isArray(a) || a.length !== f.length || !a.every((v) => typeof v === 'number')) {
        throw badDocument(['spectral', 'series', i, k], `must be a list of ${f.length} numbers (one per frequency)`, Array.isArray(a) ? `${a.length} values` : a);
      }
    }
    return { name: o.name, unit: typeof o.unit === 'string' ? o.unit : '', re: o.re as number[], im: o.im as number[] };
  });
  return { frequenciesHz: f as number[], series };
}

/**
 * Plots magnitude [dB] and phase [deg] of each spectral series as SVG (two panels sharing a
 * frequency axis with SI-prefixed ticks: "1 kHz", "10 MHz").
 * @throws InputError E_REPORT_RESULTS when doc.spectral is absent or malformed; E_REPORT_OPTION
 *   when a series name is unknown
 * @example plotSpectrum(results) // '<svg xmlns=...'
 */
export function plotSpectrum(results: LoadedResults, options: SpectrumPlotOptions = {}): string {
  const sp = spectralOf(results);
  if (!sp) throw badDocument(['spectral'], 'must hold frequency-domain results ({ frequenciesHz, series }) to plot spectra', undefined);
  const all = sp.series.map((s) => s.name);
  const chosen = options.series ?? all;
  chosen.forEach((n, i) => { if (!all.includes(n)) throw badOption(['series', i], `must name a spectral series (${all.join(', ')})`, n); });
  const series = chosen.map((n) => sp.series.find((s) => s.name === n)!);
  const widthPx = options.widthPx ?? 760;
  const panelH = options.panelHeightPx ?? 240;
  const f = sp.frequenciesHz;
  const fDomain: [number, number] = [f[0], f[f.length - 1]];
  const log = f[0] > 0 && f[f.length - 1] / f[0] > 10;
  const decades: number[] = [];
  if (log) for (let e = Math.ceil(Math.log10(f[0])); e <= Math.floor(Math.log10(f[f.length - 1])); e++) decades.push(10 ** e);
  const xAxis = log
    ? { type: 'log', domain: fDomain, ticks: decades, tickFormat: (v: number) => formatTickOwnPrefix(v, 'Hz'), label: 'frequency [Hz]' }
    : { domain: fDomain, tickFormat: axisTickFormat(fDomain, 'Hz'), label: axisLabel('frequency', fDomain, 'Hz'), ticks: 8 };
  const units = [...new Set(series.map((s) => s.unit))];
  // A ratio (unit '' or '1') is plain dB; a quantity is dB relative to one of its unit.
  const ref = units.length === 1 ? (units[0] === '' || units[0] === '1' ? 'dB' : `dB re 1 ${units[0]}`) : 'dB re 1 unit';
  const mags: number[] = [];
  const magMarks: Plot.Markish[] = [];
  const phaseMarks: Plot.Markish[] = [Plot.ruleY([0], { stroke: '#9a9a9a', strokeWidth: 0.8 })];
  const legend: LegendItem[] = [];
  series.forEach((s, k) => {
    const { colour, dash } = seriesStyle(k);
    legend.push({ label: units.length === 1 ? s.name : `${s.name} (${s.unit === '' || s.unit === '1' ? 'ratio' : s.unit})`, colour, dash });
    // |X| = 0 has no level in dB; such points are left out (NaN breaks the line there).
    const mag = f.map((_, i) => { const a = Math.hypot(s.re[i], s.im[i]); return a > 0 ? 20 * Math.log10(a) : NaN; });
    const ph = f.map((_, i) => (Math.atan2(s.im[i], s.re[i]) * 180) / Math.PI);
    for (const m of mag) mags.push(m);
    const common = { x: '0', y: '1', stroke: colour, strokeWidth: 1.6, strokeDasharray: dash === 'none' ? undefined : dash, className: 'skein-series' };
    magMarks.push(Plot.line(f.map((x, i) => [x, mag[i]]), { ...common, ariaDescription: `${s.name} magnitude` } as Plot.LineOptions));
    phaseMarks.push(Plot.line(f.map((x, i) => [x, ph[i]]), { ...common, ariaDescription: `${s.name} phase` } as Plot.LineOptions));
  });
  const md = extent(mags);
  const base = {
    width: widthPx, height: panelH, marginLeft: 72, marginRight: 24, marginBottom: 44, grid: true,
    style: { fontSize: '11px', fontFamily: 'system-ui, sans-serif' },
    x: { ...xAxis, labelArrow: 'none', labelAnchor: 'center' },
  };
  const panels: Panel[] = [
    { heightPx: panelH, svg: renderPanel({ ...base, y: { domain: [md[0] - 3, md[1] + 3], label: `magnitude [${ref}]`, tickFormat: (v: number) => `${v} dB`, labelArrow: 'none', labelAnchor: 'center', ticks: 6 }, marks: magMarks } as Plot.PlotOptions) },
    { heightPx: panelH, svg: renderPanel({ ...base, y: { domain: [-180, 180], label: 'phase [deg]', ticks: [-180, -90, 0, 90, 180], tickFormat: (v: number) => `${v} deg`, labelArrow: 'none', labelAnchor: 'center' }, marks: phaseMarks } as Plot.PlotOptions) },
  ];
  const title = options.title ?? `Spectra: ${results.doc.scenario.title}`;
  return composeSvg({ title, kind: 'spectrum', widthPx, panels, legend });
}
