/**
 * `space-time`: voltage along a path of lines at evenly spaced points, at every recorded step,
 * for space-time maps (position on one axis, time on the other: travelling waves and their
 * reflections show as lines). Structured output, read by the report package:
 *   { kind: 'space-time', positionsM, timesS, values (float64 little-endian bytes, [time, position]),
 *     unit: 'V', boundaries: [{ positionM, label }] }
 * Positions are cumulative along the path, each line from its `from` end to its `to` end.
 */
import { defineProbe, float64ToBytes, type PointHandle } from '@skein/core';

/** Largest number of values a map keeps (points x samples); beyond it samples are skipped evenly. */
export const SPACE_TIME_MAX_VALUES = 2e7;

export const spaceTimeProbe = defineProbe({
  type: 'space-time',
  summary: 'Voltage along a path of lines at evenly spaced points, for a space-time map',
  params: {
    path: { kind: 'string', summary: 'line ids joined by commas, in path order, e.g. "trunk,branchA"' },
    conductor: { kind: 'string', optional: true, summary: 'conductor to map on lines that have it (default: each line\'s first conductor)' },
    points: { kind: 'integer', default: 60, min: 2, max: 2000, summary: 'number of points along the whole path' },
  },
  create(p, ctx) {
    const lines = p.path.split(',').map((s) => s.trim()).filter((s) => s !== '');
    const lengths: number[] = [];
    const conductorIndex: number[] = [];
    for (const id of lines) {
      const names = ctx.conductorsOf(id, 'path');
      conductorIndex.push(p.conductor !== undefined && names.includes(p.conductor) ? names.indexOf(p.conductor) : 0);
      lengths.push(ctx.lineLength(id, 'path'));
    }
    const total = lengths.reduce((a, b) => a + b, 0);
    const n = p.points;
    const positionsM = new Float64Array(n);
    const handles: PointHandle[] = [];
    const kOf = new Int32Array(n);
    for (let i = 0; i < n; i++) {
      const s = (i / (n - 1)) * total;
      positionsM[i] = s;
      let acc = 0;
      let l = 0;
      while (l < lines.length - 1 && s > acc + lengths[l]) acc += lengths[l++];
      handles.push(ctx.linePoint(lines[l], Math.min(lengths[l], Math.max(0, s - acc)), 'path'));
      kOf[i] = conductorIndex[l];
    }
    const boundaries: Array<{ positionM: number; label: string }> = [];
    let acc = 0;
    for (let l = 0; l < lines.length - 1; l++) {
      acc += lengths[l];
      boundaries.push({ positionM: acc, label: `${lines[l]} | ${lines[l + 1]}` });
    }
    const maxSamples = Math.floor(ctx.endS / ctx.dtS) + 2;
    const every = Math.max(1, Math.ceil((maxSamples * n) / SPACE_TIME_MAX_VALUES));
    const rows = Math.ceil(maxSamples / every) + 1;
    const values = new Float64Array(rows * n);
    const times = new Float64Array(rows);
    const counter = new Int32Array(2); // [calls, rows written]
    return {
      sample(state) {
        const c = counter[0]++;
        if (c % every !== 0 || counter[1] >= rows) return;
        const r = counter[1]++;
        times[r] = state.tS;
        const off = r * n;
        for (let i = 0; i < n; i++) values[off + i] = state.pointVoltage(handles[i], kOf[i]);
      },
      finish() {
        const m = counter[1];
        return {
          kind: 'space-time',
          positionsM: Array.from(positionsM),
          timesS: Array.from(times.subarray(0, m)),
          values: float64ToBytes(values.slice(0, m * n)),
          unit: 'V',
          boundaries,
          path: lines,
        };
      },
    };
  },
});
