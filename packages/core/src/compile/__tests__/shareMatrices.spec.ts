import { describe, expect, it } from 'vitest';
import { compileScenario, defineLoad, resolveScenarioText } from '../../index.ts';
import { testRegistry } from '../../__tests__/fixtures.ts';

// A switch whose conductance changes while stepping: its junction's K is re-factored in place.
const stepSwitch = defineLoad({
  type: 'test-step-switch',
  summary: 'conductance 1 mS before 5 ns, 1 S after',
  params: {},
  create: () => ({ kind: 'linear', conductanceS: 1e-3, conductanceAt: (t: number) => (t < 5e-9 ? 1e-3 : 1) }),
});

function chain(n: number): string {
  const pair = 'conductors: [a, b], inductance: [[0.9uH/m, 0.2uH/m], [0.2uH/m, 0.9uH/m]], capacitance: [[12pF/m, -2pF/m], [-2pF/m, 12pF/m]]';
  const lines = Array.from({ length: n - 1 }, (_, i) => `  l${i}: { from: J${i}, to: J${i + 1}, length: 1m, ${pair} }`);
  const junctions = Array.from({ length: n }, (_, i) => {
    const on = (c: string) => [i > 0 ? `l${i - 1}.${c}` : '', i < n - 1 ? `l${i}.${c}` : ''].filter(Boolean).join(', ');
    const parts: string[] = [];
    if (i === 0) parts.push('g: { source: test-step, between: [a, ref], resistance: 50ohm }');
    if (i === 0 || i === n - 1) parts.push(`ra${i}: { load: test-resistor, between: [a, ref], resistance: 100ohm }`, `rb${i}: { load: test-resistor, between: [b, ref], resistance: 100ohm }`);
    if (i === 6) parts.push('s: { load: test-step-switch, between: [a, b] }');
    return `  J${i}:\n    nodes: { a: [${on('a')}], b: [${on('b')}] }${parts.length ? `\n    parts: { ${parts.join(', ')} }` : ''}`;
  });
  return `skein: 1\ntime: { end: 10ns, step: 0.1ns }\nlines:\n${lines.join('\n')}\njunctions:\n${junctions.join('\n')}\n`;
}

describe('compileScenario', () => {
  it('stores identical junction matrices once and keeps a private copy where a switch re-factors K', async () => {
    const registry = testRegistry();
    registry.register(stepSwitch, 'shareMatrices.spec.ts');
    const plan = await compileScenario(resolveScenarioText(chain(12), { registry, file: 'chain.yaml' }), { registry });
    // Twelve junctions: two end types, one switch junction and nine identical middles -> 4 blocks.
    const blocks = new Set(Array.from(plan.jB));
    expect(blocks.size).toBe(4);
    const middle = (j: number) => plan.jB[j];
    expect(middle(3)).toBe(middle(8));
    expect([...plan.jB].filter((b) => b === plan.jB[6]).length).toBe(1);
    // Block sizes: ends R = 2 nodes, M = 2 ports; middles M = 4: 2*2+4+2*2 and 2*4+4+4*2 doubles.
    expect(plan.mat.length).toBe(2 * (4 + 4 + 4) + 2 * (8 + 4 + 8));
  });
});
