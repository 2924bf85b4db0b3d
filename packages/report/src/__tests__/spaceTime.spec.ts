import { describe, expect, it } from 'vitest';
import { InputError, decodeResults, encodeResults } from '@skein/core';
import { cividisRgb, hasSpaceTime, plotSpaceTime, resampleMap, spaceTimeData } from '../index.ts';
import { C_MPS, makeResults, POINTS, pulse, PULSE_V } from './fixtures.ts';
import { byClass, byTag, decodePng, labelTexts, panels, parseSvg } from './svgQuery.ts';

describe('spaceTimeData', () => {
  it('builds the map from line-point probes along the chained path, a reversed line counted backwards', () => {
    const map = spaceTimeData(makeResults());
    const expected = POINTS.map((p) => p.pathM).sort((a, b) => a - b);
    expect(Array.from(map.positionsM)).toEqual(expected);
    expect(map.source).toBe('line-point probes on feeder, branch');
    expect(map.boundaries).toEqual([{ positionM: 0, label: 'J1' }, { positionM: 25, label: 'J2' }, { positionM: 40, label: 'J3' }]);
    // Each column must be the travelling pulse f(t - x/c) at that column's path position
    // (d'Alembert); same arithmetic as the fixture, so equality is exact.
    const nx = map.positionsM.length;
    for (const it of [0, 40, 120, 250]) {
      for (let ix = 0; ix < nx; ix++) expect(map.values[it * nx + ix]).toBe(pulse(map.timesS[it] - map.positionsM[ix] / C_MPS));
    }
  });

  it('prefers a structured space-time output when there is one', () => {
    const map = spaceTimeData(makeResults({ spaceTimeOutput: true }));
    expect(map.source).toBe('outputs.sweep');
    expect(map.positionsM.length).toBe(41);
    expect(map.timesS.length).toBe(400);
  });

  it('follows an explicit path of one line from its own from-end', () => {
    const map = spaceTimeData(makeResults(), { path: ['branch'] });
    // branch runs J3 -> J2; alone it starts at J3, so the probe 3 m from J2 sits at 12 m.
    expect(Array.from(map.positionsM)).toEqual([0, 3, 6, 9, 12]);
    expect(map.boundaries[0].label).toBe('J3');
  });

  it('rejects a path that does not continue where the previous line ends', () => {
    const r = makeResults();
    expect(() => spaceTimeData(r, { path: ['feeder', 'nowhere'] })).toThrow(/path\[1\]: must name a line of the network/);
    let err: unknown;
    try { spaceTimeData(r, { path: ['branch', 'feeder', 'branch'] }); } catch (e) { err = e; }
    expect((err as InputError).code).toBe('E_REPORT_OPTION');
    expect((err as InputError).path).toEqual(['path', 2]);
  });

  it('names the field of a malformed space-time output', () => {
    const r = makeResults();
    r.doc.outputs.bad = { kind: 'space-time', positionsM: [0, 1, 2], values: [[0, 1, 2], [0, 1]], timesS: [0, 1e-9] };
    let err: unknown;
    try { spaceTimeData(r, { output: 'bad' }); } catch (e) { err = e; }
    expect((err as InputError).code).toBe('E_REPORT_RESULTS');
    expect((err as InputError).path).toEqual(['outputs', 'bad', 'values', 1]);
    expect((err as InputError).message).toMatch(/must be a row of 3 numbers/);
    r.doc.outputs.bad2 = { kind: 'space-time', positionsM: [0, 2, 1], values: [] };
    expect(() => spaceTimeData(r, { output: 'bad2' })).toThrow(/outputs\.bad2\.positionsM\[2\]: must be greater than the position before/);
  });

  it('says what is missing when nothing can be mapped', () => {
    const r = makeResults();
    for (const k of Object.keys(r.doc.outputs)) delete r.doc.outputs[k];
    expect(hasSpaceTime(r)).toBe(false);
    expect(() => spaceTimeData(r)).toThrow(/must hold a "space-time" output or line-point probes/);
  });
});

describe('resampleMap', () => {
  it('reproduces the travelling pulse within the bilinear interpolation bound', () => {
    // Grid 1 m x 1 ns, pulse sigma 6 ns at c = 2e8 m/s (1 m = 5 ns). Linear interpolation error
    // is at most h^2/8 max|f''| per direction; max|f''| = V/sigma^2 = 2.8e19 V/s^2, so 3.5 V in
    // time and 87 V in position: 100 V (10 % of the 1 kV peak) covers both.
    const map = spaceTimeData(makeResults({ spaceTimeOutput: true }));
    const w = 200;
    const h = 400; // one row per sample or more: the interpolating path
    const { grid, x, t } = resampleMap(map, w, h);
    let worst = 0;
    for (let r = 0; r < h; r++) {
      for (let c = 0; c < w; c++) {
        const xm = x[0] + ((c + 0.5) / w) * (x[1] - x[0]);
        const ts = t[0] + ((r + 0.5) / h) * (t[1] - t[0]);
        worst = Math.max(worst, Math.abs(grid[r * w + c] - pulse(ts - xm / C_MPS)));
      }
    }
    expect(worst).toBeLessThan(100);
    expect(worst).toBeGreaterThan(0);
  });
});

describe('resampleMap', () => {
  it('keeps a one-sample spike when the record has more samples than rows', () => {
    const nt = 10_000;
    const map = {
      positionsM: Float64Array.from([0, 1]),
      timesS: Float64Array.from({ length: nt }, (_, i) => i * 1e-9),
      values: new Float64Array(2 * nt),
      unit: 'V', source: 'test', boundaries: [],
    };
    map.values[2 * 7_777] = -500; // at x = 0, t = 7.777 us
    map.values[2 * 7_777 + 1] = -500;
    const { grid } = resampleMap(map, 4, 100);
    const row = Math.floor((7_777 / (nt - 1)) * 100);
    expect(Array.from(grid.subarray(row * 4, row * 4 + 4))).toEqual([-500, -500, -500, -500]);
    let others = 0;
    for (let i = 0; i < grid.length; i++) if (Math.floor(i / 4) !== row) others = Math.max(others, Math.abs(grid[i]));
    expect(others).toBe(0);
  });
});

describe('plotSpaceTime', () => {
  const results = makeResults({ spaceTimeOutput: true });

  it('labels position and time axes and the colour bar with prefixed units', () => {
    const doc = parseSvg(plotSpaceTime(results));
    const panel = panels(doc).find((p) => byClass(p, 'g', 'skein-space-time').length === 1)!;
    expect(labelTexts(panel, 'x-axis label')).toEqual(['position along path [m]']);
    expect(labelTexts(panel, 'y-axis label')).toEqual(['time [ns]']);
    expect(labelTexts(panel, 'x-axis tick label')).toEqual(expect.arrayContaining(['0 m', '20 m', '40 m']));
    expect(labelTexts(panel, 'y-axis tick label')).toEqual(expect.arrayContaining(['0 ns', '200 ns']));
    const texts = byTag(doc, 'text').map((e) => e.textContent);
    expect(texts).toEqual(expect.arrayContaining(['voltage [kV]', '-1 kV', '0 kV', '1 kV', 'J1', 'J2', 'J3']));
  });

  it('colours each pixel with cividis over a domain symmetric about 0 V, earliest time on top', () => {
    const doc = parseSvg(plotSpaceTime(results, { widthPx: 400, heightPx: 300 }));
    const image = byTag(byClass(doc, 'g', 'skein-space-time')[0], 'image')[0];
    const href = image.getAttribute('xlink:href') ?? image.getAttribute('href')!;
    expect(href.startsWith('data:image/png;base64,')).toBe(true);
    const png = decodePng(new Uint8Array(Buffer.from(href.slice('data:image/png;base64,'.length), 'base64')));
    const map = spaceTimeData(results);
    const { grid } = resampleMap(map, png.width, png.height);
    const m = PULSE_V; // max |v| of the fixture: the pulse crest is sampled exactly at t0, x = 0
    let worst = 0;
    for (let i = 0; i < png.width * png.height; i++) {
      const want = cividisRgb((grid[i] + m) / (2 * m));
      for (let k = 0; k < 3; k++) worst = Math.max(worst, Math.abs(png.rgba[4 * i + k] - want[k]));
    }
    // 1 level: d3's linear colour scale and our mapping round the same value independently.
    expect(worst).toBeLessThanOrEqual(1);
    // Orientation: the pulse crest (t = 40 ns at x = 0) lies in the top-left part of the image.
    const row = Math.floor((40e-9 / 399e-9) * png.height);
    const yellow = cividisRgb(1);
    const px = Array.from(png.rgba.subarray(4 * row * png.width, 4 * row * png.width + 3));
    expect(px.every((v, k) => Math.abs(v - yellow[k]) < 25)).toBe(true);
  });
});

describe('hasSpaceTime', () => {
  it('is true for probe-built and output-built maps', () => {
    expect(hasSpaceTime(makeResults())).toBe(true);
    expect(hasSpaceTime(decodeResults(encodeResults(makeResults({ spaceTimeOutput: true }).doc)))).toBe(true);
  });
});
