import { describe, expect, it } from 'vitest';
import { createHash } from 'node:crypto';
import { digestOf, resolveScenarioData } from '../../index.ts';
import { testRegistry } from '../../__tests__/fixtures.ts';

/** A two-conductor line between two junctions; `tweak` edits the data before resolving. */
function pair(tweak: (d: any) => void = () => {}) {
  const d: any = {
    skein: 1, time: { end: '10ns', step: '0.1ns' },
    lines: { a: { from: 'A', to: 'B', length: '1m', conductors: ['p', 'q'], inductance: [['0.5uH/m', '0.1uH/m'], ['0.1uH/m', '0.5uH/m']], capacitance: [['60pF/m', '-10pF/m'], ['-10pF/m', '60pF/m']] } },
    junctions: {
      A: { nodes: { p: ['a.p'], q: ['a.q'] }, parts: { s: { source: 'test-step', between: ['p', 'ref'], resistance: '50ohm' } } },
      B: { nodes: { p: ['a.p'], q: ['a.q'] }, parts: { r: { load: 'test-resistor', between: ['p', 'q'], resistance: 100 } } },
    },
  };
  tweak(d);
  return resolveScenarioData(d, { registry: testRegistry() });
}

describe('scenario digest', () => {
  it('is a SHA-256 hex digest that ignores where values came from and how they were written', () => {
    const a = pair();
    expect(a.digest).toMatch(/^[0-9a-f]{64}$/);
    // "100" and "100ohm", "1m" and 1 resolve to the same numbers, so to the same digest.
    expect(pair((d) => { d.junctions.B.parts.r.resistance = '100ohm'; d.lines.a.length = 1; }).digest).toBe(a.digest);
    // The file name and document paths are left out.
    expect(digestOf({ ...a, file: 'elsewhere.yaml', digest: undefined })).toBe(digestOf({ ...a, digest: undefined }));
  });

  it('changes with any value that changes the computation, matrix entries included', () => {
    const a = pair();
    const changed = [
      pair((d) => { d.junctions.B.parts.r.resistance = 101; }),
      pair((d) => { d.lines.a.capacitance = [['60pF/m', '-11pF/m'], ['-11pF/m', '60pF/m']]; }),
      pair((d) => { d.time.end = '11ns'; }),
      pair((d) => { d.junctions.A.parts.s.between = ['q', 'ref']; }),
    ];
    const digests = new Set([a.digest, ...changed.map((c) => c.digest)]);
    expect(digests.size).toBe(changed.length + 1);
  });

  it('hashes typed arrays by type, length and bytes, and a plain value by its canonical text', () => {
    // Independent check of the documented form with node's SHA-256 (FIPS 180-4): for the value
    // { x: 1, m: Float64Array [0.5, 2] }, the text stream is {"x":1;"m":<Float64Array:2>} and the
    // byte stream the array's little-endian IEEE 754 bytes; the digest hashes both hashes.
    const m = Float64Array.of(0.5, 2);
    const text = createHash('sha256').update('{"x":1;"m":<Float64Array:2>}').digest();
    const bytes = createHash('sha256').update(new Uint8Array(m.buffer)).digest();
    const expected = createHash('sha256').update(text).update(bytes).digest('hex');
    expect(digestOf({ x: 1, m, path: ['ignored'] })).toBe(expected);
    // A plain list and a typed array of the same numbers are different values.
    expect(digestOf({ x: 1, m: [0.5, 2] })).not.toBe(expected);
    expect(digestOf({ x: 1, m: Float32Array.of(0.5, 2) })).not.toBe(expected);
  });
});
