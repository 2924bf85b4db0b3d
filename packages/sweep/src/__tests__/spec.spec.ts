import { describe, expect, it } from 'vitest';
import { InputError } from '@skein/core';
import { caseCount, expandCases, loadSweep, parameterValues, parseValuePath } from '../index.ts';
import { BEWLEY_YAML } from './fixtures.ts';

const read = () => BEWLEY_YAML;

function sweepText(body: string): string {
  return `sweep: 1\nscenario: bewley.yaml\n${body}`;
}

describe('loadSweep', () => {
  it('reads parameters, ranges and outputs of a sweep file', () => {
    const spec = loadSweep(sweepText(`parameters:
  RL: { path: junctions.L.parts.RL.resistance, values: [10ohm, 50ohm] }
  len: { path: lines.tl.length, range: { from: 100m, to: 300m, count: 3, unit: m } }
outputs:
  p: { peak: vl.v }
  e: { energy: led, part: RL }
`), { file: 'scan.yaml', readText: read });
    expect(spec.parameters.map((p) => p.name)).toEqual(['RL', 'len']);
    expect(spec.parameters[0].path).toEqual(['junctions', 'L', 'parts', 'RL', 'resistance']);
    expect(spec.outputs).toEqual([
      { name: 'p', kind: 'peak', trace: 'vl.v' },
      { name: 'e', kind: 'energy', probe: 'led', part: 'RL', of: 'absorbed' },
    ]);
  });

  it('locates a path that does not exist in the base scenario by file, line and path', () => {
    const text = sweepText(`parameters:
  RL: { path: junctions.L.parts.R9.resistance, values: [10] }
outputs:
  p: { peak: vl.v }
`);
    let err: InputError | undefined;
    try {
      loadSweep(text, { file: 'scan.yaml', readText: read });
    } catch (e) {
      err = e as InputError;
    }
    expect(err).toBeInstanceOf(InputError);
    expect(err!.code).toBe('E_PATH');
    expect(err!.path).toEqual(['parameters', 'RL', 'path']);
    expect(err!.location).toMatchObject({ file: 'scan.yaml', line: 4 });
    expect(err!.message).toContain('junctions.L.parts has no key "R9"; keys there: RL');
  });

  it('refuses zipped parameters of different lengths', () => {
    const text = sweepText(`combine: zip
parameters:
  a: { path: lines.tl.length, values: [1, 2, 3] }
  b: { path: junctions.L.parts.RL.resistance, values: [1, 2] }
outputs:
  p: { peak: vl.v }
`);
    expect(() => loadSweep(text, { readText: read })).toThrow(expect.objectContaining({ code: 'E_ZIP_LENGTH', path: ['parameters', 'b'] }));
  });

  it('refuses an output on a probe the scenario does not have, naming the probes it has', () => {
    const text = sweepText(`parameters:
  a: { path: lines.tl.length, values: [1] }
outputs:
  p: { peak: vx.v }
`);
    expect(() => loadSweep(text, { readText: read })).toThrow(/outputs\.p\.peak: must name a probe of the base scenario; probes: vl, led/);
  });

  it('asks for a unit when a range is written with one but none is given', () => {
    const text = sweepText(`parameters:
  a: { path: lines.tl.length, range: { from: 100m, to: 200m, count: 2 } }
outputs:
  p: { peak: vl.v }
`);
    expect(() => loadSweep(text, { readText: read })).toThrow(expect.objectContaining({ code: 'E_QUANTITY', path: ['parameters', 'a', 'range', 'from'] }));
  });
});

describe('parseValuePath', () => {
  it('splits keys and list indices', () => {
    expect(parseValuePath('lines.trunk.inductance[0][1]')).toEqual(['lines', 'trunk', 'inductance', 0, 1]);
    expect(parseValuePath('lines..x')).toBeUndefined();
  });
});

describe('parameterValues', () => {
  it('spaces a linear range evenly and a logarithmic range by equal ratios', () => {
    // Closed forms: linear from + (to - from) k/(n-1); log from (to/from)^(k/(n-1)). Tolerance
    // 1e-12 relative: a few roundings of double arithmetic.
    const lin = parameterValues({ name: 'a', path: [], values: { kind: 'range', from: 1, to: 2, count: 5, scale: 'linear', unit: '1' } }, 1) as number[];
    [1, 1.25, 1.5, 1.75, 2].forEach((x, k) => expect(lin[k]).toBeCloseTo(x, 12));
    const log = parameterValues({ name: 'a', path: [], values: { kind: 'range', from: 10, to: 1e4, count: 4, scale: 'log', unit: 'ohm' } }, 1) as number[];
    [10, 100, 1000, 1e4].forEach((x, k) => expect(Math.abs(log[k] / x - 1)).toBeLessThan(1e-12));
  });
});

describe('expandCases', () => {
  const text = sweepText(`parameters:
  a: { path: lines.tl.length, values: [100m, 200m] }
  b: { path: junctions.L.parts.RL.resistance, values: [10, 20, 30] }
outputs:
  p: { peak: vl.v }
`);

  it('makes every combination of a grid with the last parameter varying fastest', () => {
    const spec = loadSweep(text, { readText: read });
    const cases = expandCases(spec);
    expect(caseCount(spec)).toBe(6);
    expect(cases.map((c) => c.values)).toEqual([['100m', 10], ['100m', 20], ['100m', 30], ['200m', 10], ['200m', 20], ['200m', 30]]);
    const sc = cases[4].scenario as { lines: { tl: { length: unknown } }; junctions: { L: { parts: { RL: { resistance: unknown } } } } };
    expect(sc.lines.tl.length).toBe('200m');
    expect(sc.junctions.L.parts.RL.resistance).toBe(20);
    // The base is copied, not shared.
    expect((cases[0].scenario as typeof sc).lines.tl.length).toBe('100m');
  });

  it('pairs the i-th values when zipped', () => {
    const spec = loadSweep(sweepText(`combine: zip
parameters:
  a: { path: lines.tl.length, values: [100m, 200m, 300m] }
  b: { path: junctions.L.parts.RL.resistance, values: [10, 20, 30] }
outputs:
  p: { peak: vl.v }
`), { readText: read });
    expect(expandCases(spec).map((c) => c.values)).toEqual([['100m', 10], ['200m', 20], ['300m', 30]]);
  });

  it('keeps every N-th case in a shard, and the shards together make the whole sweep', () => {
    const spec = loadSweep(text, { readText: read });
    const s0 = expandCases(spec, { index: 0, count: 4 }).map((c) => c.index);
    const s1 = expandCases(spec, { index: 1, count: 4 }).map((c) => c.index);
    const s2 = expandCases(spec, { index: 2, count: 4 }).map((c) => c.index);
    const s3 = expandCases(spec, { index: 3, count: 4 }).map((c) => c.index);
    expect(s0).toEqual([0, 4]);
    expect([...s0, ...s1, ...s2, ...s3].sort()).toEqual([0, 1, 2, 3, 4, 5]);
  });
});
