import { describe, expect, it } from 'vitest';
import { resolveScenarioData } from '../../index.ts';
import { testRegistry } from '../../__tests__/fixtures.ts';
import { isPortable, packScenario, unpackScenario } from '../transfer.ts';

describe('scenario transfer to workers', () => {
  const data = {
    skein: 1, time: { end: '10ns', step: '0.1ns' },
    lines: {
      a: { from: 'A', to: 'B', length: '1m', conductors: ['p', 'q'], inductance: [['0.5uH/m', '0.1uH/m'], ['0.1uH/m', '0.5uH/m']], capacitance: [['60pF/m', '-10pF/m'], ['-10pF/m', '60pF/m']] },
      b: { from: 'B', to: 'C', length: '2m', impedance: 75, velocity: '0.66c', resistance: '0.1ohm/m' },
    },
    junctions: {
      A: { nodes: { p: ['a.p'], q: ['a.q'] }, parts: { s: { source: 'test-step', between: ['p', 'ref'], drive: 'current' } } },
      B: { nodes: { p: ['a.p', 'b'], q: ['a.q'] }, parts: { r: { load: 'test-resistor', between: ['p', 'q'], resistance: 100 } } },
      C: { nodes: { n: ['b'] }, parts: { c: { load: 'test-capacitor', between: ['n', 'ref'], capacitance: '1nF' } } },
    },
  };

  it('unpacks to the same scenario: same digest, typed arrays as typed arrays, Infinity kept', () => {
    const sc = resolveScenarioData(data, { registry: testRegistry() });
    expect(isPortable(sc)).toBe(true);
    const back = unpackScenario(packScenario(sc), 'x.yaml');
    expect(back.digest).toBe(sc.digest);
    expect(back.lines[0].L).toBeInstanceOf(Float64Array);
    expect(Array.from(back.lines[0].C)).toEqual(Array.from(sc.lines[0].C));
    // A current source has an infinite internal resistance.
    expect(back.junctions[0].parts[0].resistanceOhm).toBe(Infinity);
    const { locate: _a, ...plainBack } = back;
    const { locate: _b, ...plainSc } = sc;
    expect(plainBack).toEqual(plainSc);
    expect(back.locate(['lines'])).toEqual({ file: 'x.yaml' });
  });

  it('does not share memory between the unpacked copies', () => {
    const sc = resolveScenarioData(data, { registry: testRegistry() });
    const bytes = packScenario(sc);
    const one = unpackScenario(bytes, undefined);
    const two = unpackScenario(bytes, undefined);
    one.lines[0].L[0] = 42;
    expect(two.lines[0].L[0]).toBe(sc.lines[0].L[0]);
  });

  it('refuses to carry values MessagePack would change (functions, -0)', () => {
    const sc = resolveScenarioData(data, { registry: testRegistry() });
    sc.junctions[1].parts[0].params = { resistance: 100, shape: () => 1 };
    expect(isPortable(sc)).toBe(false);
    sc.junctions[1].parts[0].params = { resistance: -0 };
    expect(isPortable(sc)).toBe(false);
  });
});
