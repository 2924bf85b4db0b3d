import { describe, expect, it } from 'vitest';
import { InputError } from '@skein/core';
import { defaultTraceNames, plotTraces } from '../index.ts';
import { decimate } from '../svg.ts';
import { makeResults, POINTS } from './fixtures.ts';
import { byClass, byTag, labelTexts, panels, parseSvg, pathPoints, tickY } from './svgQuery.ts';

describe('plotTraces', () => {
  const results = makeResults();

  it('draws every non-ledger trace by default, one series each, with a legend entry each', () => {
    const doc = parseSvg(plotTraces(results));
    const names = defaultTraceNames(results);
    expect(names).toHaveLength(2 + POINTS.length);
    const series = byClass(doc, 'g', 'skein-series').map((g) => g.getAttribute('aria-description'));
    expect(series.sort()).toEqual([...names].sort());
    expect(byClass(doc, 'g', 'skein-legend-item')).toHaveLength(names.length);
  });

  it('puts traces of different units in separate panels with quantity and unit on the axes', () => {
    const doc = parseSvg(plotTraces(results, { traces: ['src.v', 'src.i'] }));
    const ps = panels(doc);
    expect(ps).toHaveLength(2);
    expect(labelTexts(ps[0], 'y-axis label')).toEqual(['voltage [kV]']);
    expect(labelTexts(ps[1], 'y-axis label')).toEqual(['current [A]']);
    expect(labelTexts(ps[0], 'x-axis label')).toEqual(['time [ns]']);
    expect(byClass(doc, 'g', 'skein-series')).toHaveLength(2);
  });

  it('labels ticks with SI prefixes and units', () => {
    const doc = parseSvg(plotTraces(results, { traces: ['src.v'] }));
    const x = labelTexts(doc, 'x-axis tick label');
    const y = labelTexts(doc, 'y-axis tick label');
    expect(x).toContain('100 ns');
    expect(x.every((t) => / ns$/.test(t))).toBe(true);
    expect(y).toEqual(expect.arrayContaining(['-1 kV', '0 kV', '1 kV']));
  });

  it('draws the sine crest at the height of the 1 kV tick', () => {
    // src.v = 1 kV sin(2 pi 10 MHz t) sampled every 1 ns: sample 25 is the crest, exactly 1 kV.
    // Tolerance 0.05 px: Plot writes coordinates with a few decimals; the scale is linear.
    const doc = parseSvg(plotTraces(results, { traces: ['src.v'] }));
    const path = byTag(byClass(doc, 'g', 'skein-series')[0], 'path')[0];
    const topY = Math.min(...pathPoints(path.getAttribute('d')!).map((p) => p[1]));
    const bottomY = Math.max(...pathPoints(path.getAttribute('d')!).map((p) => p[1]));
    const panel = panels(doc)[0];
    expect(Math.abs(topY - tickY(panel, 'y-axis tick label', '1 kV'))).toBeLessThan(0.05);
    expect(Math.abs(bottomY - tickY(panel, 'y-axis tick label', '-1 kV'))).toBeLessThan(0.05);
  });

  it('rejects a trace name the results do not hold, naming the option path', () => {
    let err: unknown;
    try { plotTraces(results, { traces: ['src.v', 'nope.v'] }); } catch (e) { err = e; }
    expect(err).toBeInstanceOf(InputError);
    expect((err as InputError).code).toBe('E_REPORT_OPTION');
    expect((err as InputError).path).toEqual(['traces', 1]);
    expect((err as InputError).message).toMatch(/traces\[1\]: must name a trace of the results .*got "nope.v"/);
  });

  it('rejects an empty time window', () => {
    expect(() => plotTraces(results, { timeRangeS: [2e-7, 1e-7] })).toThrow(/timeRangeS: must be \[start, end\]/);
  });
});

describe('decimate', () => {
  it('keeps a one-sample spike that a plain stride would drop', () => {
    const n = 100_000;
    const t = Float64Array.from({ length: n }, (_, i) => i);
    const v = new Float64Array(n);
    v[54_321] = 7;
    v[12_345] = -3;
    const d = decimate(t, v, 1000);
    expect(d.t.length).toBeLessThanOrEqual(1000);
    expect(Math.max(...d.v)).toBe(7);
    expect(Math.min(...d.v)).toBe(-3);
    expect(d.t[d.v.indexOf(7)]).toBe(54_321);
    for (let i = 1; i < d.t.length; i++) expect(d.t[i]).toBeGreaterThan(d.t[i - 1]);
  });
});
