// Bad inputs of lines whose parameters vary along them (stretches, taper): each gives a located
// error (file, line, path, rule, value) with its stable code; through the CLI, exit code 2 and no
// results file. The expected lines are those of the offending value in the text below.
import { existsSync, mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { main } from '@skein/cli';
import { InputError, compileScenario, resolveScenarioText } from '@skein/core';
import { compileNetwork } from '@skein/spectral';
import { standardRegistry } from '../support/run.ts';

const GOOD = `skein: 1
time: { end: 100ns }
lines:
  feeder:
    from: A
    to: B
    stretches:
      - { length: 2m, impedance: 50ohm, velocity: 2e8m/s }
      - { length: 3m, impedance: 75ohm, velocity: 2e8m/s, resistance: 0.1ohm/m }
    fdtd: { cells: 50 }
junctions:
  A:
    nodes: { a: [feeder] }
    parts:
      gen: { source: step, between: [a, ref], amplitude: 1, resistance: 50ohm }
  B:
    nodes: { b: [feeder] }
    parts:
      R1: { load: resistor, between: [b, ref], resistance: 75ohm }
probes:
  vb: { probe: node-voltage, node: B.b }
`;

const STRETCHES = `    stretches:
      - { length: 2m, impedance: 50ohm, velocity: 2e8m/s }
      - { length: 3m, impedance: 75ohm, velocity: 2e8m/s, resistance: 0.1ohm/m }
`;
const TAPER = `    length: 5m
    taper: { impedance: [50ohm, 75ohm], velocity: 2e8m/s }
`;
const taper = (s: string): string => s.replace(STRETCHES, TAPER);

interface Case { name: string; edit: (s: string) => string; code: string; path: string; line?: number; says?: string }

const CASES: Case[] = [
  { name: 'a stretch without a length', edit: (s) => s.replace('{ length: 2m, impedance', '{ impedance'), code: 'E_MISSING', path: 'lines.feeder.stretches[0].length', line: 8 },
  { name: 'a stretch with two forms of parameters', edit: (s) => s.replace('velocity: 2e8m/s, resistance', 'velocity: 2e8m/s, inductance: 0.4uH/m, resistance'), code: 'E_LINE_FORM', path: 'lines.feeder.stretches[1]', line: 9 },
  { name: 'a stretch with the wrong number of conductors', edit: (s) => s.replace('{ length: 3m, impedance: 75ohm, velocity: 2e8m/s, resistance: 0.1ohm/m }', '{ length: 3m, inductance: [[0.4uH/m, 0.1uH/m], [0.1uH/m, 0.4uH/m]], capacitance: [[60pF/m, -5pF/m], [-5pF/m, 60pF/m]] }'), code: 'E_MATRIX', path: 'lines.feeder.stretches[1].inductance', line: 9 },
  { name: 'an empty list of stretches', edit: (s) => s.replace(STRETCHES, '    stretches: []\n'), code: 'E_TYPE', path: 'lines.feeder.stretches', line: 7 },
  { name: 'stretches beside a uniform line\'s impedance', edit: (s) => s.replace('    fdtd: { cells: 50 }', '    impedance: 50ohm\n    fdtd: { cells: 50 }'), code: 'E_LINE_FORM', path: 'lines.feeder.impedance', line: 10 },
  { name: 'a resistance for the whole line beside stretches', edit: (s) => s.replace('    fdtd: { cells: 50 }', '    resistance: 1ohm/m\n    fdtd: { cells: 50 }'), code: 'E_LINE_FORM', path: 'lines.feeder.resistance', line: 10 },
  { name: 'a length that is not the stretches\' sum', edit: (s) => s.replace('    stretches:', '    length: 6m\n    stretches:'), code: 'E_LENGTH_MISMATCH', path: 'lines.feeder.length', line: 7, says: 'sum of the stretches' },
  { name: 'fewer cells than stretches', edit: (s) => s.replace('fdtd: { cells: 50 }', 'fdtd: { cells: 1 }'), code: 'E_RANGE', path: 'lines.feeder.fdtd.cells', line: 10, says: 'at least one per stretch' },
  { name: 'a time step longer than the fastest cell\'s delay', edit: (s) => s.replace('time: { end: 100ns }', 'time: { end: 100ns, step: 0.5ns }').replace('impedance: 75ohm, velocity: 2e8m/s', 'impedance: 75ohm, velocity: 0.9c'), code: 'E_STEP_TOO_LONG', path: 'time.step', line: 2, says: 'FDTD cell' },
  { name: 'both stretches and a taper', edit: (s) => s.replace('    fdtd: { cells: 50 }', '    taper: { impedance: [50ohm, 75ohm], velocity: 2e8m/s }\n    fdtd: { cells: 50 }'), code: 'E_LINE_FORM', path: 'lines.feeder', line: 5 },
  { name: 'a taper on two conductors', edit: (s) => taper(s).replace('    length: 5m', '    conductors: [p, q]\n    length: 5m'), code: 'E_TAPER_MULTICONDUCTOR', path: 'lines.feeder.conductors', line: 7 },
  { name: 'a taper with one impedance', edit: (s) => taper(s).replace('impedance: [50ohm, 75ohm]', 'impedance: 50ohm'), code: 'E_TYPE', path: 'lines.feeder.taper.impedance', line: 8 },
  { name: 'a taper of an unknown shape', edit: (s) => taper(s).replace('velocity: 2e8m/s }', 'velocity: 2e8m/s, shape: parabolic }'), code: 'E_ENUM', path: 'lines.feeder.taper.shape', line: 8, says: 'exponential, linear' },
  { name: 'a taper to a negative impedance', edit: (s) => taper(s).replace('[50ohm, 75ohm]', '[50ohm, -75ohm]'), code: 'E_RANGE', path: 'lines.feeder.taper.impedance[1]', line: 8 },
  { name: 'a taper without a length', edit: (s) => taper(s).replace('    length: 5m\n', ''), code: 'E_MISSING', path: 'lines.feeder.length' },
];

async function inputError(text: string, file: string): Promise<InputError> {
  const registry = await standardRegistry();
  try {
    await compileScenario(resolveScenarioText(text, { registry, file }), { registry });
  } catch (e) {
    expect(e).toBeInstanceOf(InputError);
    return e as InputError;
  }
  throw new Error('no error');
}

describe('bad inputs of varying lines', () => {
  it('accepts the unedited scenarios, with stretches and with a taper (so each case fails for its own reason)', async () => {
    const registry = await standardRegistry();
    for (const t of [GOOD, taper(GOOD)]) await expect(compileScenario(resolveScenarioText(t, { registry, file: 'good.yaml' }), { registry })).resolves.toBeDefined();
  });

  it.each(CASES)('refuses $name with a located error', async (c) => {
    const text = c.edit(GOOD);
    expect(text).not.toBe(GOOD);
    const e = await inputError(text, 'bad.yaml');
    expect(e.code, e.message).toBe(c.code);
    expect(e.message).toContain(c.path);
    expect(e.location.file).toBe('bad.yaml');
    if (c.line !== undefined) expect(e.location.line, e.message).toBe(c.line);
    if (c.says) expect(e.message).toContain(c.says);
  });

  it('exits with code 2 and writes no results file from the command line', async () => {
    const dir = mkdtempSync(join(tmpdir(), 'skein-bad-varying-'));
    const file = join(dir, 'bad.yaml');
    const out = join(dir, 'bad.results.msgpack');
    writeFileSync(file, CASES[0].edit(GOOD));
    const errors: string[] = [];
    const code = await main(['run', file, '--out', out, '--quiet'], { out: () => {}, err: (s) => errors.push(s) });
    expect(code).toBe(2);
    expect(existsSync(out)).toBe(false);
    expect(errors.join('\n')).toContain('lines.feeder.stretches[0].length');
  });

  it('refuses a varying line in the frequency-domain solver, naming it', async () => {
    const registry = await standardRegistry();
    for (const [t, key] of [[GOOD, 'stretches'], [taper(GOOD), 'taper']] as const) {
      let err: unknown;
      try {
        await compileNetwork(resolveScenarioText(t, { registry, file: 'spectral.yaml' }), registry);
      } catch (e) {
        err = e;
      }
      expect(err).toBeInstanceOf(InputError);
      expect((err as InputError).code).toBe('E_SPECTRAL_VARYING');
      expect((err as InputError).message).toContain(`lines.feeder.${key}`);
    }
  });
});
