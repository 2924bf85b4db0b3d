// The skein command, end to end through main(): each command's output and files.
import { existsSync, mkdtempSync, readFileSync, copyFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';
import { main, DEMO_SCENARIO } from '@skein/cli';
import { readResults } from '@skein/core';

function capture(): { io: { out: (s: string) => void; err: (s: string) => void }; out: string[]; err: string[] } {
  const out: string[] = [];
  const err: string[] = [];
  return { io: { out: (s) => out.push(s), err: (s) => err.push(s) }, out, err };
}

const EXAMPLES = fileURLToPath(new URL('../../packages/cli/examples/', import.meta.url));

describe('skein command', () => {
  it('runs the demo and writes results, plots and a report', async () => {
    const dir = mkdtempSync(join(tmpdir(), 'skein-cli-'));
    const c = capture();
    expect(await main(['demo', '--out', dir, '--quiet'], c.io)).toBe(0);
    const text = c.out.join('\n');
    expect(text).toContain('Energy ledger at the end');
    expect(text).toContain('Caution:');
    for (const f of ['demo.results.msgpack', 'demo.results.report.html', 'demo.results.traces.svg', 'demo.results.space-time.svg']) {
      expect(existsSync(join(dir, f))).toBe(true);
    }
    const r = readResults(join(dir, 'demo.results.msgpack'));
    expect(r.doc.traces.names).toContain('vReceiver.v');
    const html = readFileSync(join(dir, 'demo.results.report.html'), 'utf8');
    expect(html).toContain('IEC 62305');
  });

  it('checks a frequency-dependent multiconductor line and reports its modal transformation', async () => {
    const c = capture();
    expect(await main(['check', join(EXAMPLES, 'overheadSpanFd.yaml')], c.io)).toBe(0);
    const text = c.out.join('\n');
    expect(text).toMatch(/frequency-dependent: fitted delays/);
    // The neglected coupling at 100 kHz over 41.7 kHz .. 25 MHz: 0.93 % measured (below the 1 % warning).
    const m = /constant modal transformation at 100 kHz: neglected coupling up to ([0-9.]+) %/.exec(text);
    expect(m).not.toBeNull();
    expect(Number(m![1])).toBeGreaterThan(0.5);
    expect(Number(m![1])).toBeLessThan(1);
    expect(text).not.toMatch(/Warnings:/);
  }, 120_000);

  it('checks, inspects and exports', async () => {
    const dir = mkdtempSync(join(tmpdir(), 'skein-cli-'));
    const scenario = join(dir, 'harness.yaml');
    copyFileSync(DEMO_SCENARIO, scenario);
    let c = capture();
    expect(await main(['check', scenario], c.io)).toBe(0);
    expect(c.out.join('\n')).toMatch(/trunk: ecu -> splice/);
    c = capture();
    expect(await main(['check', scenario, '--json'], c.io)).toBe(0);
    const j = JSON.parse(c.out.join('\n'));
    // Homogeneous image-method trunk: both modes at c (common practice: L C = mu0 eps0 I).
    expect(Math.abs(j.lines[0].velocitiesMps[0] / 299792458 - 1)).toBeLessThan(1e-6);
    c = capture();
    expect(await main(['run', scenario, '--quiet'], c.io)).toBe(0);
    const res = join(dir, 'harness.results.msgpack');
    c = capture();
    expect(await main(['inspect', res], c.io)).toBe(0);
    expect(c.out.join('\n')).toContain('vDriver.v');
    const csv = join(dir, 'h.csv');
    c = capture();
    expect(await main(['export', res, '--csv', '--out', csv], c.io)).toBe(0);
    const lines = readFileSync(csv, 'utf8').trim().split('\n');
    expect(lines[0].startsWith('time [s],vDriver.v [V]')).toBe(true);
    expect(lines.length).toBe(readResults(res).doc.time.count + 1);
  });

  it('prints line parameters and writes a Touchstone file', async () => {
    const dir = mkdtempSync(join(tmpdir(), 'skein-cli-'));
    const scenario = join(dir, 'feeder.yaml');
    copyFileSync(join(EXAMPLES, 'overheadFeeder.yaml'), scenario);
    let c = capture();
    expect(await main(['params', scenario, '--at', '50Hz', '--json'], c.io)).toBe(0);
    const p = JSON.parse(c.out.join('\n'));
    // Carson: the earth-return resistance at 50 Hz is close to omega mu0 / 8 = 4.93e-5 ohm/m on the
    // mutual term (J. R. Carson, Bell Syst. Tech. J. 5, 1926; REFERENCES.md), within 5 % here
    // because of the next terms of Carson's series at these heights.
    const r12 = p[0].atFrequencies[0].R[1];
    expect(Math.abs(r12 / 4.9348e-5 - 1)).toBeLessThan(0.05);
    c = capture();
    const ts = join(dir, 'feeder.s2p');
    expect(await main(['spectrum', scenario, '--from', '1kHz', '--to', '1MHz', '--points', '4', '--log', '--port', 'substation.p:50ohm', '--port', 'farm.p:50ohm', '--touchstone', ts], c.io)).toBe(0);
    const t = readFileSync(ts, 'utf8').split('\n').filter((l) => !l.startsWith('!'));
    expect(t[0]).toBe('# Hz S RI R 50');
    expect(t.filter((l) => /^\d/.test(l)).length).toBe(4);
    expect(existsSync(join(dir, 'feeder.spectrum.msgpack'))).toBe(true);
  });

  it('gives a time response from the spectrum by the numerical Laplace transform, as traces', async () => {
    // Bewley lattice (L. V. Bewley, Trans. AIEE 50, 1931, from memory; REFERENCES.md): 25 ohm
    // source, 50 ohm line of 1 us, 100 ohm load: load voltage 0.88888889 on 1-3 us, 0.79012346 on
    // 3-5 us, 0.80109739 on 5-7 us, once the 100 ns edge has settled.
    const dir = mkdtempSync(join(tmpdir(), 'skein-cli-'));
    const scenario = join(dir, 'lattice.yaml');
    writeFileSync(scenario, `skein: 1
time: { end: 7us }
lines:
  tl: { from: S, to: L, length: 200m, impedance: 50ohm, velocity: 2e8m/s }
junctions:
  S:
    nodes: { s: [tl] }
    parts:
      gen: { source: step, between: [s, ref], amplitude: 1, rise: 100ns, edge: smooth, resistance: 25ohm }
  L:
    nodes: { l: [tl] }
    parts:
      RL: { load: resistor, between: [l, ref], resistance: 100ohm }
`);
    const c = capture();
    expect(await main(['spectrum', scenario, '--until', '7us', '--every', '1us', '--inversion', 'laplace', '--out', 'v(L.l)', '--quiet'], c.io)).toBe(0);
    expect(c.out.join('\n')).toContain('numerical Laplace transform: sigma');
    const r = readResults(join(dir, 'lattice.spectrum.msgpack'));
    expect(r.doc.traces.names).toEqual(['v(L.l)']);
    expect(r.time.length).toBe(8);
    const v = r.trace('v(L.l)');
    // Measured 1e-11, 3.1e-9, 3.8e-9 off the published 8 digits (their rounding, 5e-9); 2e-8.
    expect(Math.abs(v[2] - 0.88888889)).toBeLessThan(2e-8);
    expect(Math.abs(v[4] - 0.79012346)).toBeLessThan(2e-8);
    expect(Math.abs(v[6] - 0.80109739)).toBeLessThan(2e-8);
    expect((r.doc.outputs as { timeResponse: { kind: string } }).timeResponse.kind).toBe('laplace');
    // The file holds traces like a run's (no sweep), so the trace plot reads it.
    expect(r.doc.spectral).toBeUndefined();
    expect(await main(['plot', join(dir, 'lattice.spectrum.msgpack'), '--out', dir], capture().io)).toBe(0);
    expect(existsSync(join(dir, 'lattice.spectrum.traces.svg'))).toBe(true);
    // Bad flags: a clear error and exit code 2.
    const e = capture();
    expect(await main(['spectrum', scenario, '--until', '7us', '--every', '1us', '--inversion', 'z'], e.io)).toBe(2);
    expect(e.err.join('\n')).toContain('--inversion');
    expect(await main(['spectrum', scenario, '--until', '7us', '--aliasing', '1e-8'], e.io)).toBe(2);
  });

  it('refuses unknown commands and bad usage with exit code 2', async () => {
    const c = capture();
    expect(await main(['fly'], c.io)).toBe(2);
    expect(await main(['run'], c.io)).toBe(2);
    expect(await main(['run', 'x.yaml', '--threads', 'zero'], c.io)).toBe(2);
  });
});
