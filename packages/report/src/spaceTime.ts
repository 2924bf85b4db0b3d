/**
 * The space-time map: voltage along a path through the network, position across, time down,
 * colour for voltage (cividis, symmetric about 0 V). A travelling wave v(x, t) = f(t - x/c) shows
 * as a band of slope dt/dx = 1/c; reflections show as bands of the opposite slope, as in a
 * Bewley lattice diagram (L. V. Bewley, "Traveling Waves on Transmission Systems", 1933).
 *
 * Two sources are accepted, in this order:
 * 1. A structured probe output `doc.outputs[id]` with `kind: "space-time"`:
 *    `{ kind: "space-time", positionsM: number[] (nx, strictly increasing),
 *       timesS?: number[] | bin float64 (nt; default: the run's time axis, then nt = time.count),
 *       values: bin float64 little-endian, row-major [time, position] (nt * nx values)
 *               | number[][] (values[timeIndex][positionIndex]),
 *       unit?: "V" (default), label?: text, boundaries?: [{ positionM, label }] }`.
 * 2. Line-point probes: a probe whose structured output is `{ line: "<lineId>", positionM: number }`
 *    (optionally `kind: "line-point"`) and which recorded a trace in volts. The map is built along
 *    a path of lines (`options.path`, each line traversed from the junction it shares with the
 *    previous line); positions are the distance along the path, and the voltage between probes is
 *    interpolated linearly. Default path: every line carrying such probes when they form a chain
 *    in the order the network lists them, otherwise the line carrying the most probes.
 */
import * as Plot from '@observablehq/plot';
import { bytesToFloat64, type LoadedResults } from '@skein/core';
import { cividis } from './colormap.ts';
import { axisLabel, axisTickFormat } from './engineering.ts';
import { badDocument, badOption, composeSvg, escapeXml, networkOf, quantityOf, renderLegend, renderPanel } from './svg.ts';

/** Options of plotSpaceTime and spaceTimeData. */
export interface SpaceTimeOptions {
  /** Id of a structured "space-time" output to plot. Default: the first one, else line-point probes. */
  output?: string;
  /** Line ids, in order along the path (line-point source only). */
  path?: string[];
  /** Conductor whose voltage to use when a point probe recorded several (matched against the trace name's end). */
  conductor?: string;
  title?: string;
  /** Width [px]. Default 760. */
  widthPx?: number;
  /** Height of the map [px]. Default 420. */
  heightPx?: number;
  /** Time window [s]. Default: the whole record. */
  timeRangeS?: [number, number];
}

/** A voltage map on a regular-in-index grid: values[it * nx + ix] at (positionsM[ix], timesS[it]). */
export interface SpaceTimeMap {
  positionsM: Float64Array;
  timesS: Float64Array;
  values: Float64Array;
  unit: string;
  /** Where the data came from ("outputs.sweep" or "line-point probes on feeder, branch"). */
  source: string;
  /** Junctions (or other marks) along the path: position [m] and label. */
  boundaries: Array<{ positionM: number; label: string }>;
}

interface PointOutput { line: string; positionM: number }

function isSpaceTimeOutput(x: unknown): x is Record<string, unknown> {
  return x !== null && typeof x === 'object' && (x as { kind?: unknown }).kind === 'space-time';
}

function isPointOutput(x: unknown): x is PointOutput {
  if (x === null || typeof x !== 'object') return false;
  const o = x as Record<string, unknown>;
  return typeof o.line === 'string' && typeof o.positionM === 'number' && (o.kind === undefined || o.kind === 'line-point');
}

function numberList(v: unknown, path: Array<string | number>): Float64Array {
  if (v instanceof Uint8Array) return bytesToFloat64(v);
  if (Array.isArray(v) && v.every((x) => typeof x === 'number')) return Float64Array.from(v as number[]);
  throw badDocument(path, 'must be a list of numbers or float64 bytes', v);
}

/**
 * Whether the results hold anything plotSpaceTime can map (a space-time output, even a malformed
 * one, or line-point probes at two or more positions with voltage traces).
 * @example hasSpaceTime(results) // true
 */
export function hasSpaceTime(results: LoadedResults): boolean {
  // A space-time output counts even when malformed, so that plotting it reports the fault.
  if (Object.values((results.doc.outputs ?? {}) as Record<string, unknown>).some(isSpaceTimeOutput)) return true;
  try {
    fromPoints(results, {});
    return true;
  } catch {
    return false;
  }
}

/**
 * Extracts the space-time voltage map from results (see the file header for the accepted shapes).
 * @throws InputError E_REPORT_RESULTS when an output is malformed or there is nothing to map;
 *   E_REPORT_OPTION when `output` or `path` names something absent.
 * @example spaceTimeData(results).positionsM.length // 41
 */
export function spaceTimeData(results: LoadedResults, options: SpaceTimeOptions = {}): SpaceTimeMap {
  const outputs = (results.doc.outputs ?? {}) as Record<string, unknown>;
  const stIds = Object.keys(outputs).filter((k) => isSpaceTimeOutput(outputs[k]));
  if (options.output !== undefined) {
    if (!isSpaceTimeOutput(outputs[options.output])) {
      throw badOption(['output'], `must name a structured output of kind "space-time" (${stIds.join(', ') || 'none in these results'})`, options.output);
    }
    return fromOutput(results, options.output);
  }
  if (stIds.length > 0 && options.path === undefined) return fromOutput(results, stIds[0]);
  return fromPoints(results, options);
}

function fromOutput(results: LoadedResults, id: string): SpaceTimeMap {
  const o = (results.doc.outputs as Record<string, Record<string, unknown>>)[id];
  const base = ['outputs', id];
  const positionsM = numberList(o.positionsM, [...base, 'positionsM']);
  const nx = positionsM.length;
  if (nx < 2) throw badDocument([...base, 'positionsM'], 'must hold at least 2 positions', o.positionsM);
  for (let i = 1; i < nx; i++) {
    if (!(positionsM[i] > positionsM[i - 1])) throw badDocument([...base, 'positionsM', i], `must be greater than the position before (${positionsM[i - 1]} m)`, positionsM[i]);
  }
  let values: Float64Array;
  let nt: number;
  if (o.values instanceof Uint8Array) {
    values = bytesToFloat64(o.values);
    if (values.length % nx !== 0) throw badDocument([...base, 'values'], `must hold (times x ${nx} positions) float64 values`, `${values.length} values`);
    nt = values.length / nx;
  } else if (Array.isArray(o.values)) {
    nt = o.values.length;
    values = new Float64Array(nt * nx);
    o.values.forEach((row: unknown, it: number) => {
      if (!Array.isArray(row) || row.length !== nx) throw badDocument([...base, 'values', it], `must be a row of ${nx} numbers (one per position)`, row);
      row.forEach((v: unknown, ix: number) => {
        if (typeof v !== 'number') throw badDocument([...base, 'values', it, ix], 'must be a number', v);
        values[it * nx + ix] = v;
      });
    });
  } else {
    throw badDocument([...base, 'values'], 'must be float64 bytes or a list of rows (values[time][position])', o.values);
  }
  let timesS: Float64Array;
  if (o.timesS !== undefined && o.timesS !== null) {
    timesS = numberList(o.timesS, [...base, 'timesS']);
    if (timesS.length !== nt) throw badDocument([...base, 'timesS'], `must hold one time per row of values (${nt})`, `${timesS.length} times`);
  } else {
    if (nt !== results.time.length) throw badDocument([...base, 'timesS'], `must be given when values has ${nt} rows and the run has ${results.time.length} samples`, o.timesS);
    timesS = Float64Array.from(results.time);
  }
  if (nt < 2) throw badDocument([...base, 'values'], 'must hold at least 2 time rows', nt);
  const boundaries: SpaceTimeMap['boundaries'] = [];
  if (Array.isArray(o.boundaries)) {
    o.boundaries.forEach((b: unknown, i: number) => {
      const bb = b as { positionM?: unknown; label?: unknown };
      if (typeof bb?.positionM !== 'number') throw badDocument([...base, 'boundaries', i, 'positionM'], 'must be a position in metres', bb?.positionM);
      boundaries.push({ positionM: bb.positionM, label: typeof bb.label === 'string' ? bb.label : '' });
    });
  }
  const unit = typeof o.unit === 'string' ? o.unit : 'V';
  return { positionsM, timesS, values, unit, source: `outputs.${id}`, boundaries };
}

function fromPoints(results: LoadedResults, options: SpaceTimeOptions): SpaceTimeMap {
  const outputs = (results.doc.outputs ?? {}) as Record<string, unknown>;
  const { names, units, probes } = results.doc.traces;
  const points: Array<{ id: string; line: string; positionM: number; trace: string }> = [];
  for (const [id, out] of Object.entries(outputs)) {
    if (!isPointOutput(out)) continue;
    const candidates = names.filter((n, i) => probes[i] === id && units[i] === 'V');
    const trace = options.conductor !== undefined ? candidates.find((n) => n.endsWith(`.${options.conductor}`)) : candidates[0];
    if (trace !== undefined) points.push({ id, line: out.line, positionM: out.positionM, trace });
  }
  const net = networkOf(results);
  const lineById = new Map(net.lines.map((l) => [l.id, l]));
  let path = options.path;
  if (path !== undefined) {
    path.forEach((id, i) => {
      if (!lineById.has(id)) throw badOption(['path', i], `must name a line of the network (${[...lineById.keys()].join(', ') || 'none'})`, id);
    });
  } else {
    const withPoints = net.lines.filter((l) => points.some((p) => p.line === l.id)).map((l) => l.id);
    const chained = withPoints.every((id, i) => {
      if (i === 0) return true;
      const a = lineById.get(withPoints[i - 1])!;
      const b = lineById.get(id)!;
      return a.to === b.from || a.to === b.to || a.from === b.from || a.from === b.to;
    });
    if (chained) path = withPoints;
    else {
      const count = (id: string): number => points.filter((p) => p.line === id).length;
      path = [withPoints.reduce((best, id) => (count(id) > count(best) ? id : best), withPoints[0])];
    }
  }
  if (path.length === 0) {
    throw badDocument(['outputs'], 'must hold a "space-time" output or line-point probes ({ line, positionM }) with voltage traces to draw a space-time map', Object.keys(outputs));
  }
  // Orientation: a line runs forward when its "to" junction is where the next line starts (or the
  // previous line ended at its "from").
  const samples: Array<{ x: number; trace: string }> = [];
  const boundaries: SpaceTimeMap['boundaries'] = [];
  let offset = 0;
  let prevEnd: string | undefined;
  path.forEach((id, i) => {
    const l = lineById.get(id)!;
    let forward = true;
    if (prevEnd !== undefined) {
      if (l.from === prevEnd) forward = true;
      else if (l.to === prevEnd) forward = false;
      else throw badOption(['path', i], `must continue from junction ${prevEnd}, where line ${path![i - 1]} ends; line ${id} runs ${l.from} -> ${l.to}`, id);
    } else if (i + 1 < path!.length) {
      const next = lineById.get(path![i + 1])!;
      forward = l.to === next.from || l.to === next.to;
    }
    const start = forward ? l.from : l.to;
    if (i === 0) boundaries.push({ positionM: 0, label: start });
    for (const p of points.filter((q) => q.line === id)) samples.push({ x: offset + (forward ? p.positionM : l.lengthM - p.positionM), trace: p.trace });
    offset += l.lengthM;
    prevEnd = forward ? l.to : l.from;
    boundaries.push({ positionM: offset, label: prevEnd });
  });
  samples.sort((a, b) => a.x - b.x);
  const unique = samples.filter((s, i) => i === 0 || s.x > samples[i - 1].x);
  if (unique.length < 2) {
    throw badDocument(['outputs'], `must hold line-point probes at 2 or more distinct positions along ${path.join(', ')} to draw a space-time map`, `${unique.length} position(s)`);
  }
  const nt = results.time.length;
  const nx = unique.length;
  const values = new Float64Array(nt * nx);
  unique.forEach((s, ix) => {
    const v = results.trace(s.trace);
    for (let it = 0; it < nt; it++) values[it * nx + ix] = v[it];
  });
  return {
    positionsM: Float64Array.from(unique, (s) => s.x),
    timesS: Float64Array.from(results.time),
    values,
    unit: 'V',
    source: `line-point probes on ${path.join(', ')}`,
    boundaries,
  };
}

/**
 * Resamples a map onto a w x h pixel grid, row 0 at the earliest time. Across positions the
 * voltage is interpolated linearly at each pixel centre. Along time: when the window holds no
 * more samples than rows, linear interpolation at the row's centre time; when it holds more, each
 * pixel keeps the sample of largest magnitude within its row's time bin (sign kept), so that a
 * short transient in a long record still shows instead of falling between two rows.
 * Times and positions must increase.
 */
export function resampleMap(map: SpaceTimeMap, w: number, h: number, timeRangeS?: [number, number]): { grid: Float64Array; x: [number, number]; t: [number, number] } {
  const P = map.positionsM;
  const T = map.timesS;
  const V = map.values;
  const nx = P.length;
  const x0 = P[0];
  const x1 = P[nx - 1];
  const [t0, t1] = timeRangeS ?? [T[0], T[T.length - 1]];
  const grid = new Float64Array(w * h);
  const ix = new Int32Array(w);
  const fx = new Float64Array(w);
  for (let c = 0, j = 0; c < w; c++) {
    const x = x0 + ((c + 0.5) / w) * (x1 - x0);
    while (j < nx - 2 && P[j + 1] < x) j++;
    ix[c] = j;
    fx[c] = Math.min(1, Math.max(0, (x - P[j]) / (P[j + 1] - P[j])));
  }
  const at = (k: number, c: number): number => (1 - fx[c]) * V[k * nx + ix[c]] + fx[c] * V[k * nx + ix[c] + 1];
  let first = 0;
  while (first < T.length && T[first] < t0) first++;
  let last = T.length - 1;
  while (last > 0 && T[last] > t1) last--;
  if (last - first + 1 > h) {
    for (let r = 0, k = first; r < h; r++) {
      const tb = t0 + ((r + 1) / h) * (t1 - t0);
      const kStart = k;
      for (let c = 0; c < w; c++) grid[r * w + c] = at(Math.min(kStart, last), c);
      for (; k <= last && (T[k] < tb || r === h - 1); k++) {
        for (let c = 0; c < w; c++) {
          const v = at(k, c);
          if (Math.abs(v) > Math.abs(grid[r * w + c])) grid[r * w + c] = v;
        }
      }
    }
    return { grid, x: [x0, x1], t: [t0, t1] };
  }
  for (let r = 0, k = 0; r < h; r++) {
    const t = t0 + ((r + 0.5) / h) * (t1 - t0);
    while (k < T.length - 2 && T[k + 1] < t) k++;
    const ft = Math.min(1, Math.max(0, (t - T[k]) / (T[k + 1] - T[k])));
    for (let c = 0; c < w; c++) grid[r * w + c] = (1 - ft) * at(k, c) + ft * at(k + 1, c);
  }
  return { grid, x: [x0, x1], t: [t0, t1] };
}

/**
 * Plots the space-time voltage map as SVG: position [m] across, time down, cividis colour
 * symmetric about zero (grey = 0 V), a colour bar with SI-prefixed ticks, and the junctions along
 * the path as labelled vertical rules. The raster is an embedded PNG (data: URI), nothing fetched.
 * @param results decoded results
 * @param options see SpaceTimeOptions
 * @returns standalone SVG text
 * @throws InputError as spaceTimeData
 * @example plotSpaceTime(results, { path: ['feeder', 'branch'] }) // '<svg xmlns=...'
 */
export function plotSpaceTime(results: LoadedResults, options: SpaceTimeOptions = {}): string {
  const map = spaceTimeData(results, options);
  const widthPx = options.widthPx ?? 760;
  const heightPx = options.heightPx ?? 420;
  const margin = { left: 80, right: 24, top: 30, bottom: 44 };
  const w = Math.max(8, Math.round(widthPx - margin.left - margin.right));
  const h = Math.max(8, Math.round(heightPx - margin.top - margin.bottom));
  if (options.timeRangeS && !(options.timeRangeS[1] > options.timeRangeS[0])) {
    throw badOption(['timeRangeS'], 'must be [start, end] with end > start, in seconds', options.timeRangeS);
  }
  const { grid, x, t } = resampleMap(map, w, h, options.timeRangeS);
  let m = 0;
  for (let i = 0; i < map.values.length; i++) if (Number.isFinite(map.values[i])) m = Math.max(m, Math.abs(map.values[i]));
  if (m === 0) m = 1;
  const vDomain: [number, number] = [-m, m];
  const colour = { type: 'linear' as const, domain: vDomain, interpolate: cividis, clamp: true };
  const rules = map.boundaries.filter((b) => b.positionM >= x[0] && b.positionM <= x[1]);
  const panel = renderPanel({
    width: widthPx,
    height: heightPx,
    marginLeft: margin.left,
    marginRight: margin.right,
    marginTop: margin.top,
    marginBottom: margin.bottom,
    style: { fontSize: '11px', fontFamily: 'system-ui, sans-serif' },
    x: { domain: x, label: axisLabel('position along path', x, 'm'), tickFormat: axisTickFormat(x, 'm'), labelArrow: 'none', labelAnchor: 'center', ticks: 8 },
    y: { domain: t, reverse: true, label: axisLabel('time', t, 's'), tickFormat: axisTickFormat(t, 's'), labelArrow: 'none', labelAnchor: 'center', ticks: 8 },
    color: colour,
    marks: [
      Plot.raster(Array.from(grid), { width: w, height: h, x1: x[0], x2: x[1], y1: t[0], y2: t[1], fill: (d: number) => d, imageRendering: 'pixelated', className: 'skein-space-time' } as Plot.RasterOptions),
      Plot.ruleX(rules.map((b) => b.positionM), { stroke: '#ffffff', strokeOpacity: 0.7, strokeDasharray: '4 3' }),
      Plot.text(rules, { x: 'positionM', y: t[0], text: 'label', dy: -8, frameAnchor: 'bottom', fill: '#1a1a1a', fontSize: 10, lineAnchor: 'bottom' } as Plot.TextOptions),
    ],
  } as Plot.PlotOptions);
  const legendLabel = axisLabel(quantityOf(map.unit), vDomain, map.unit);
  const legend = renderLegend({
    color: { ...colour, label: legendLabel },
    width: Math.min(420, widthPx - 100),
    marginLeft: 12,
    tickFormat: axisTickFormat(vDomain, map.unit),
    ticks: 5,
    style: { fontSize: '11px', fontFamily: 'system-ui, sans-serif' },
  } as unknown as Plot.LegendOptions);
  const legendSvg = legend.replace('<svg ', `<svg x="${margin.left - 12}" `);
  const title = options.title ?? `Space-time map of ${quantityOf(map.unit)}: ${results.doc.scenario.title}`;
  const note = `<text x="${widthPx - 12}" y="19" text-anchor="end" font-family="system-ui, sans-serif" font-size="10" fill="#555">${escapeXml(map.source)}</text>`;
  return composeSvg({ title, kind: 'space-time', widthPx, panels: [{ svg: note + legendSvg, heightPx: 56 }, { svg: panel, heightPx }] });
}
