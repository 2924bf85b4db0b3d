// Bad inputs: each malformed scenario must give a located error (file, line, path, rule, value),
// exit code 2, and leave no results file. The expected lines are those of the offending value in
// the text below (counted from 1).
import { existsSync, mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { main } from '@skein/cli';
import { InputError, resolveScenarioText } from '@skein/core';
import { standardRegistry } from '../support/run.ts';

const GOOD = `skein: 1
time: { end: 100ns }
lines:
  feeder:
    from: A
    to: B
    length: 10m
    impedance: 50ohm
    velocity: 2e8m/s
junctions:
  A:
    nodes: { a: [feeder] }
    parts:
      gen: { source: step, between: [a, ref], amplitude: 1, resistance: 50ohm }
  B:
    nodes: { b: [feeder] }
    parts:
      R1: { load: resistor, between: [b, ref], resistance: 50ohm }
probes:
  vb: { probe: node-voltage, node: B.b }
`;

interface Case { name: string; edit: (s: string) => string; code: string; path: string; line?: number }

const CASES: Case[] = [
  { name: 'a negative length', edit: (s) => s.replace('length: 10m', 'length: -2m'), code: 'E_RANGE', path: 'lines.feeder.length', line: 7 },
  { name: 'a length without a unit it can read', edit: (s) => s.replace('length: 10m', 'length: 10 parsecs'), code: 'E_QUANTITY', path: 'lines.feeder.length', line: 7 },
  { name: 'an unknown junction', edit: (s) => s.replace('to: B', 'to: Q'), code: 'E_UNKNOWN_JUNCTION', path: 'lines.feeder.to', line: 6 },
  { name: 'an unknown conductor', edit: (s) => s.replace('a: [feeder]', 'a: [feeder.x]'), code: 'E_UNKNOWN_CONDUCTOR', path: 'junctions.A.nodes.a[0]', line: 12 },
  { name: 'a part wired to a node that does not exist', edit: (s) => s.replace('between: [b, ref]', 'between: [c, ref]'), code: 'E_UNKNOWN_NODE', path: 'junctions.B.parts.R1.between[1]'.replace('[1]', '[0]'), line: 18 },
  { name: 'a node wired to nothing', edit: (s) => s.replace('nodes: { b: [feeder] }', 'nodes: { b: [feeder], lonely: [] }'), code: 'E_WIRED_TO_NOTHING', path: 'junctions.B.nodes.lonely', line: 16 },
  { name: 'a conductor left unwired', edit: (s) => s.replace('nodes: { b: [feeder] }', 'nodes: { b: [] }').replace('between: [b, ref], resistance: 50ohm }\nprobes', 'between: [b, ref], resistance: 50ohm }\nprobes'), code: 'E_PORT_UNWIRED', path: 'junctions.B.nodes', line: 16 },
  { name: 'an unknown load type', edit: (s) => s.replace('load: resistor', 'load: flux-capacitor'), code: 'E_UNKNOWN_TYPE', path: 'junctions.B.parts.R1.load', line: 18 },
  { name: 'a missing plugin parameter', edit: (s) => s.replace(', resistance: 50ohm }\nprobes', ' }\nprobes'), code: 'E_MISSING', path: 'junctions.B.parts.R1.resistance', line: 18 },
  { name: 'an unknown key', edit: (s) => s.replace('    velocity: 2e8m/s', '    velocity: 2e8m/s\n    colour: red'), code: 'E_UNKNOWN_KEY', path: 'lines.feeder.colour', line: 10 },
  { name: 'a velocity faster than light', edit: (s) => s.replace('velocity: 2e8m/s', 'velocity: 1.2c'), code: 'E_RANGE', path: 'lines.feeder.velocity', line: 9 },
  { name: 'a wrong format version', edit: (s) => s.replace('skein: 1', 'skein: 7'), code: 'E_FORMAT_VERSION', path: 'skein', line: 1 },
  { name: 'a missing end time', edit: (s) => s.replace('time: { end: 100ns }', 'time: { record: 1 }'), code: 'E_MISSING', path: 'time.end', line: 2 },
  { name: 'a YAML syntax error', edit: (s) => s.replace('    length: 10m', '    length: [10m'), code: 'E_SYNTAX', path: '(document root)' },
  { name: 'a non-symmetric inductance matrix', edit: (s) => s.replace(`    impedance: 50ohm\n    velocity: 2e8m/s`, `    conductors: [p, q]\n    inductance: [[1uH/m, 0.2uH/m], [0.3uH/m, 1uH/m]]\n    capacitance: [[10pF/m, -1pF/m], [-1pF/m, 10pF/m]]`), code: 'E_NOT_SYMMETRIC', path: 'lines.feeder.inductance[1][0]', line: 9 },
  { name: 'a capacitance matrix that is not positive definite', edit: (s) => s.replace(`    impedance: 50ohm\n    velocity: 2e8m/s`, `    conductors: [p, q]\n    inductance: [[1uH/m, 0.2uH/m], [0.2uH/m, 1uH/m]]\n    capacitance: [[10pF/m, -12pF/m], [-12pF/m, 10pF/m]]`), code: 'E_NOT_POSITIVE_DEFINITE', path: 'lines.feeder.capacitance', line: 10 },
  { name: 'an FDTD segment too fine for the time step', edit: (s) => s.replace('    velocity: 2e8m/s', '    velocity: 2e8m/s\n    resistance: 0.1ohm/m\n    fdtd: { cells: 1000 }').replace('time: { end: 100ns }', 'time: { end: 100ns, step: 1ns }'), code: 'E_STEP_TOO_LONG', path: 'time.step', line: 2 },
  { name: 'a probe on a node that does not exist', edit: (s) => s.replace('node: B.b', 'node: B.zz'), code: 'E_PROBE_PLACE', path: 'probes.vb.node' },
  { name: 'a time step longer than the line delay', edit: (s) => s.replace('time: { end: 100ns }', 'time: { end: 100ns, step: 80ns }'), code: 'E_STEP_TOO_LONG', path: 'time.step' },
  { name: 'a modal frequency on a line that is not a multiconductor frequency-dependent one', edit: (s) => s.replace('    velocity: 2e8m/s', '    velocity: 2e8m/s\n    modalFrequency: 1MHz'), code: 'E_FD_MODAL_FREQUENCY', path: 'lines.feeder.modalFrequency', line: 10 },
  { name: 'the reserved node name', edit: (s) => s.replace('nodes: { b: [feeder] }', 'nodes: { ref: [feeder] }'), code: 'E_RESERVED', path: 'junctions.B.nodes.ref', line: 16 },
];

describe('bad inputs', () => {
  it('accepts the unedited scenario (so each case below fails for its own reason)', async () => {
    const registry = await standardRegistry();
    expect(() => resolveScenarioText(GOOD, { registry, file: 'good.yaml' })).not.toThrow();
  });

  it.each(CASES)('refuses $name with a located error, exit 2 and no results file', async (c) => {
    const text = c.edit(GOOD);
    expect(text).not.toBe(GOOD);
    const dir = mkdtempSync(join(tmpdir(), 'skein-bad-'));
    const file = join(dir, 'bad.yaml');
    const out = join(dir, 'bad.results.msgpack');
    writeFileSync(file, text);
    const errors: string[] = [];
    const code = await main(['run', file, '--out', out, '--quiet'], { out: () => {}, err: (s) => errors.push(s) });
    expect(code).toBe(2);
    expect(existsSync(out)).toBe(false);
    expect(errors.join('\n')).toContain(file);
    // The same input through the API: the error's code and fields.
    const registry = await standardRegistry();
    let err: unknown;
    try {
      const { compileScenario, runPlan } = await import('@skein/core');
      const sc = resolveScenarioText(text, { registry, file });
      const plan = await compileScenario(sc, { registry });
      await runPlan(plan, { registry });
    } catch (e) {
      err = e;
    }
    expect(err).toBeInstanceOf(InputError);
    const ie = err as InputError;
    expect(ie.code).toBe(c.code);
    expect(ie.message).toContain(c.path === '(document root)' ? '' : c.path);
    expect(ie.location.file).toBe(file);
    if (c.line !== undefined) expect(ie.location.line).toBe(c.line);
    expect(errors.join('\n')).toContain(ie.message);
  });
});
