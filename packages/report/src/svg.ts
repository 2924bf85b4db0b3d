/**
 * Shared plumbing of the plots: rendering one Observable Plot panel headless, stacking panels
 * under a title with a legend into one standalone SVG, decimating long traces, and the helpers
 * that read a results document.
 */
import * as Plot from '@observablehq/plot';
import { badInput, type LoadedResults, type NetworkSummary } from '@skein/core';
import { createPlotDocument } from './dom.ts';
import { TRACE_DASHES, TRACE_PALETTE } from './colormap.ts';

/** Escapes text for XML content and attribute values. */
export function escapeXml(s: string): string {
  return s.replace(/[<>&"']/g, (c) => ({ '<': '&lt;', '>': '&gt;', '&': '&amp;', '"': '&quot;', "'": '&apos;' })[c]!);
}

/** Renders one Plot panel into SVG text (Plot's own <svg> element, serialised). */
export function renderPanel(options: Plot.PlotOptions): string {
  const el = Plot.plot({ ...options, document: createPlotDocument() }) as unknown as { outerHTML: string; tagName: string };
  if (el.tagName.toLowerCase() !== 'svg') throw new Error(`bug: Plot returned <${el.tagName}>, expected <svg> (no Plot legends inside panels)`);
  return el.outerHTML;
}

/** Renders a Plot legend (colour ramp) into SVG text. */
export function renderLegend(options: Plot.LegendOptions): string {
  const el = Plot.legend({ ...options, document: createPlotDocument() } as Plot.LegendOptions) as unknown as { outerHTML: string; tagName: string };
  if (el.tagName.toLowerCase() !== 'svg') throw new Error(`bug: Plot legend is <${el.tagName}>, expected <svg>`);
  return el.outerHTML;
}

/** One legend entry: a line swatch and the series name. */
export interface LegendItem { label: string; colour: string; dash: string }

/** Colour and dash of series k. */
export function seriesStyle(k: number): { colour: string; dash: string } {
  return { colour: TRACE_PALETTE[k % TRACE_PALETTE.length], dash: TRACE_DASHES[Math.floor(k / TRACE_PALETTE.length) % TRACE_DASHES.length] };
}

/** A panel to stack: its SVG text and height [px]. */
export interface Panel { svg: string; heightPx: number }

/**
 * Stacks panels under a title, with an optional legend of line swatches, into one standalone SVG
 * (root carries the SVG and XLink namespaces, so it parses as XML on its own).
 */
export function composeSvg(args: { title: string; kind: string; widthPx: number; panels: Panel[]; legend?: LegendItem[] }): string {
  const { title, kind, widthPx, panels, legend = [] } = args;
  const titleH = 28;
  const perRow = Math.max(1, Math.floor((widthPx - 40) / 220));
  const legendRows = Math.ceil(legend.length / perRow);
  const legendH = legendRows > 0 ? legendRows * 18 + 8 : 0;
  let y = titleH + legendH;
  const parts: string[] = [];
  parts.push(`<title>${escapeXml(title)}</title>`);
  parts.push(`<rect width="${widthPx}" height="100%" fill="#ffffff"/>`);
  parts.push(`<text class="skein-title" x="12" y="19" font-family="system-ui, sans-serif" font-size="14" font-weight="600" fill="#1a1a1a">${escapeXml(title)}</text>`);
  legend.forEach((item, k) => {
    const lx = 40 + (k % perRow) * 220;
    const ly = titleH + Math.floor(k / perRow) * 18 + 10;
    parts.push(
      `<g class="skein-legend-item" data-series="${escapeXml(item.label)}" transform="translate(${lx},${ly})">` +
        `<line x1="0" x2="22" y1="0" y2="0" stroke="${item.colour}" stroke-width="2.5"${item.dash === 'none' ? '' : ` stroke-dasharray="${item.dash}"`}/>` +
        `<text x="28" y="4" font-family="system-ui, sans-serif" font-size="11" fill="#1a1a1a">${escapeXml(item.label)}</text></g>`,
    );
  });
  for (const p of panels) {
    parts.push(`<g class="skein-panel" transform="translate(0,${y})">${p.svg}</g>`);
    y += p.heightPx;
  }
  return (
    `<svg xmlns="http://www.w3.org/2000/svg" xmlns:xlink="http://www.w3.org/1999/xlink" class="skein-plot" data-kind="${escapeXml(kind)}"` +
    ` width="${widthPx}" height="${y}" viewBox="0 0 ${widthPx} ${y}" role="img" aria-label="${escapeXml(title)}">` +
    parts.join('') +
    '</svg>'
  );
}

/**
 * Min/max decimation: at most about `maxPoints` points, keeping each bucket's extreme samples in
 * time order so that peaks survive (a plain stride would drop a short spike).
 */
export function decimate(t: ArrayLike<number>, v: ArrayLike<number>, maxPoints: number): { t: number[]; v: number[] } {
  const n = Math.min(t.length, v.length);
  if (n <= maxPoints) return { t: Array.from({ length: n }, (_, i) => t[i]), v: Array.from({ length: n }, (_, i) => v[i]) };
  const buckets = Math.max(1, Math.floor(maxPoints / 2));
  const outT: number[] = [];
  const outV: number[] = [];
  for (let b = 0; b < buckets; b++) {
    const i0 = Math.floor((b * n) / buckets);
    const i1 = Math.floor(((b + 1) * n) / buckets);
    let iMin = i0;
    let iMax = i0;
    for (let i = i0 + 1; i < i1; i++) {
      if (v[i] < v[iMin]) iMin = i;
      if (v[i] > v[iMax]) iMax = i;
    }
    const a = Math.min(iMin, iMax);
    const c = Math.max(iMin, iMax);
    outT.push(t[a]); outV.push(v[a]);
    if (c !== a) { outT.push(t[c]); outV.push(v[c]); }
  }
  return { t: outT, v: outV };
}

/** Quantity name for an axis from its unit. */
export function quantityOf(unit: string): string {
  return ({ V: 'voltage', A: 'current', J: 'energy', W: 'power', s: 'time', m: 'position', Hz: 'frequency', ohm: 'impedance' } as Record<string, string>)[unit] ?? 'value';
}

/** The network summary stored in a results document (empty lists when absent). */
export function networkOf(results: LoadedResults): NetworkSummary {
  const n = results.doc.network as Partial<NetworkSummary> | null | undefined;
  return { lines: n?.lines ?? [], junctions: n?.junctions ?? [], probes: n?.probes ?? [] };
}

/** Probe type name of the energy ledger probe. */
export const LEDGER_PROBE_TYPE = 'energy-ledger';

/** Ids of the energy-ledger probes of a results document. */
export function ledgerProbeIds(results: LoadedResults): string[] {
  return networkOf(results).probes.filter((p) => p.type === LEDGER_PROBE_TYPE).map((p) => p.id);
}

/** [min, max] of finite values (both 0 when there are none; widened when equal). */
export function extent(values: Iterable<number>): [number, number] {
  let lo = Infinity;
  let hi = -Infinity;
  for (const v of values) {
    if (!Number.isFinite(v)) continue;
    if (v < lo) lo = v;
    if (v > hi) hi = v;
  }
  if (lo === Infinity) return [0, 1];
  if (lo === hi) {
    const d = lo === 0 ? 1 : Math.abs(lo) * 0.1;
    return [lo - d, hi + d];
  }
  return [lo, hi];
}

/** Error for a bad plot option: names the option path, the rule and the value. */
export function badOption(path: Array<string | number>, rule: string, value: unknown): Error {
  return badInput(path, rule, value, 'E_REPORT_OPTION');
}

/** Error for a results document that lacks what a plot needs. */
export function badDocument(path: Array<string | number>, rule: string, value: unknown): Error {
  return badInput(path, rule, value, 'E_REPORT_RESULTS');
}
