import { describe, expect, it } from 'vitest';
import { spawn } from 'node:child_process';
import { existsSync, mkdtempSync, readdirSync, statSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { loadPluginModules, PluginRegistry } from '@skein/core';
import { STANDARD_PLUGINS } from '@skein/cli';
import { loadSweepFile, readTable, runSweep, sweepCommand } from '../index.ts';
import { BEWLEY_YAML, standardRegistry } from './fixtures.ts';

const buildRegistry = async () => loadPluginModules(new PluginRegistry(), STANDARD_PLUGINS, import.meta.resolve('@skein/cli'));

function capture() {
  const out: string[] = [];
  const err: string[] = [];
  return { io: { out: (s: string) => out.push(s), err: (s: string) => err.push(s) }, out, err };
}

function workspace(sweep: string, scenario = BEWLEY_YAML): string {
  const dir = mkdtempSync(join(tmpdir(), 'skein-sweep-cli-'));
  writeFileSync(join(dir, 'bewley.yaml'), scenario);
  writeFileSync(join(dir, 'scan.yaml'), sweep);
  return dir;
}

const SCAN = `sweep: 1
title: load scan
scenario: bewley.yaml
parameters:
  RL: { path: junctions.L.parts.RL.resistance, range: { from: 10ohm, to: 1kohm, count: 7, scale: log, unit: ohm } }
outputs:
  plateau: { value-at: vl.v, time: 2us }
`;

const sink = { write: () => true, isTTY: false };

describe('sweepCommand', () => {
  it('exits 2 with a located error for a bad sweep file and writes nothing', async () => {
    const dir = workspace(SCAN.replace('count: 7', 'count: -3'));
    const c = capture();
    const code = await sweepCommand([join(dir, 'scan.yaml'), '--workers', '1'], c.io, { buildRegistry, progressStream: sink });
    expect(code).toBe(2);
    expect(c.err.join('')).toMatch(/parameters\.RL\.range\.count: must be a whole number of at least 1, got -3 \(.*scan\.yaml, line 5, column \d+\)/);
    expect(existsSync(join(dir, 'scan.table.msgpack'))).toBe(false);
  });

  it('runs shards whose merged table equals the whole sweep', async () => {
    const dir = workspace(SCAN);
    const file = join(dir, 'scan.yaml');
    const run = async (args: string[]) => {
      const c = capture();
      const code = await sweepCommand(args, c.io, { buildRegistry, progressStream: sink });
      expect(code, c.err.join('\n')).toBe(0);
      return c;
    };
    await run([file, '--workers', '1', '--out', join(dir, 'all.msgpack')]);
    await run([file, '--workers', '1', '--shard', '0/2', '--out', join(dir, 's0.msgpack')]);
    await run([file, '--workers', '1', '--shard', '1/2', '--out', join(dir, 's1.msgpack')]);
    const s0 = readTable(join(dir, 's0.msgpack'));
    expect(s0.rows.map((r) => r.index)).toEqual([0, 2, 4, 6]);
    expect(s0.complete).toBe(false);
    const merged = await run(['merge', join(dir, 's1.msgpack'), join(dir, 's0.msgpack'), '--out', join(dir, 'm.msgpack'), '--csv', join(dir, 'm.csv')]);
    expect(merged.out.join('\n')).toContain('cases 7 of 7');
    const all = readTable(join(dir, 'all.msgpack'));
    const m = readTable(join(dir, 'm.msgpack'));
    expect(m.complete).toBe(true);
    expect(m.rows.map((r) => [r.index, r.digest, r.outputs])).toEqual(all.rows.map((r) => [r.index, r.digest, r.outputs]));
    expect(m.summary).toEqual(all.summary);
  });

  it('resumes an interrupted sweep without computing any finished case again', async () => {
    // 40 cases of 4000 steps each, long enough to kill the process in the middle.
    const dir = workspace(
      SCAN.replace('count: 7', 'count: 40'),
      BEWLEY_YAML.replace('time: { end: 4us, step: 0.05us }', 'time: { end: 20us, step: 0.005us }'),
    );
    const file = join(dir, 'scan.yaml');
    const cache = join(dir, 'scan.table.cache');
    const main = fileURLToPath(new URL('../main.ts', import.meta.url));
    const child = spawn(process.execPath, ['--import', 'tsx', main, file, '--workers', '1', '--quiet'], {
      cwd: fileURLToPath(new URL('../..', import.meta.url)),
      stdio: ['ignore', 'ignore', 'pipe'],
    });
    let stderr = '';
    child.stderr.on('data', (d) => (stderr += String(d)));
    const exited = new Promise<void>((r) => child.on('exit', () => r()));
    const deadline = Date.now() + 90_000;
    const count = () => (existsSync(cache) ? readdirSync(cache).filter((f) => f.endsWith('.case.msgpack')).length : 0);
    while (count() < 4) {
      if (Date.now() > deadline || child.exitCode !== null) {
        child.kill('SIGKILL');
        throw new Error(`the sweep did not get going (cache files: ${count()}); stderr: ${stderr}`);
      }
      await new Promise((r) => setTimeout(r, 20));
    }
    child.kill('SIGKILL');
    await exited;
    const before = new Map(readdirSync(cache).filter((f) => f.endsWith('.case.msgpack')).map((f) => [f, statSync(join(cache, f)).mtimeMs]));
    expect(before.size).toBeGreaterThanOrEqual(4);
    expect(before.size).toBeLessThan(40);

    const out = await runSweep(loadSweepFile(file), { registry: await standardRegistry(), workers: 1, cacheDir: cache });
    expect(out.counts.cached).toBe(before.size);
    expect(out.counts.computed).toBe(40 - before.size);
    for (const [f, mtime] of before) expect(statSync(join(cache, f)).mtimeMs).toBe(mtime);
    expect(readdirSync(cache).filter((f) => f.endsWith('.case.msgpack'))).toHaveLength(40);
    expect(out.table.rows.every((r) => r.status === 'ok')).toBe(true);
  });
});
