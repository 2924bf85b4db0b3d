import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { spawn, spawnSync, type ChildProcess } from 'node:child_process';
import { createServer } from 'node:net';
import { Redis } from 'ioredis';
import { Queue } from 'bullmq';
import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { createQueueExecutor, loadSweep, readTable, resultsHashOf, runSweep, serveQueue, sweepCommand } from '../index.ts';
import { BEWLEY_YAML, standardRegistry } from './fixtures.ts';

// A real redis-server on a free loopback port, started here and stopped at the end. CI installs
// the Debian package redis-server; without it this test fails (it does not skip).
let server: ChildProcess | undefined;
let url = '';

async function freePort(): Promise<number> {
  return new Promise((resolve, reject) => {
    const s = createServer();
    s.once('error', reject);
    s.listen(0, '127.0.0.1', () => {
      const port = (s.address() as { port: number }).port;
      s.close(() => resolve(port));
    });
  });
}

beforeAll(async () => {
  const probe = spawnSync('redis-server', ['--version'], { encoding: 'utf8' });
  if (probe.error) {
    throw new Error(`redis-server is not installed (${(probe.error as NodeJS.ErrnoException).code}): the queue test needs a real Redis; install the Debian package: apt-get install -y redis-server`);
  }
  const port = await freePort();
  server = spawn('redis-server', ['--port', String(port), '--bind', '127.0.0.1', '--save', '', '--appendonly', 'no'], { stdio: ['ignore', 'pipe', 'pipe'] });
  let log = '';
  await new Promise<void>((resolve, reject) => {
    const timer = setTimeout(() => reject(new Error(`redis-server did not start within 10 s: ${log}`)), 10_000);
    const onData = (d: Buffer) => {
      log += String(d);
      if (log.includes('Ready to accept connections')) {
        clearTimeout(timer);
        resolve();
      }
    };
    server!.stdout!.on('data', onData);
    server!.stderr!.on('data', onData);
    server!.once('exit', (code) => reject(new Error(`redis-server exited with ${code}: ${log}`)));
  });
  url = `redis://127.0.0.1:${port}`;
}, 20_000);

afterAll(async () => {
  if (server && server.exitCode === null) {
    const gone = new Promise((r) => server!.once('exit', r));
    server.kill('SIGTERM');
    await gone;
  }
});

const SWEEP = `sweep: 1
title: queued load scan
scenario: bewley.yaml
parameters:
  RL: { path: junctions.L.parts.RL.resistance, values: [10, 50, 100, 100ohm, 470, -1] }
outputs:
  plateau: { value-at: vl.v, time: 2us }
  energy: { energy: led, part: RL }
`;

describe('createQueueExecutor', () => {
  it('runs a sweep through a real Redis queue with the same results as local workers, and a repeated sweep adds no result twice', async () => {
    const registry = await standardRegistry();
    const spec = loadSweep(SWEEP, { readText: () => BEWLEY_YAML });
    const local = await runSweep(spec, { registry, workers: 1 });

    const consumer = serveQueue({ url, name: 'q-test', registry, workers: 1 });
    try {
      const first = await createQueueExecutor({ url, name: 'q-test', pollMs: 50 });
      const viaQueue = await runSweep(spec, { registry, executor: first });
      await first.close();
      // 6 values: "100" and "100ohm" are one case by digest, "-1" fails before it is queued.
      expect(viaQueue.counts).toMatchObject({ cases: 6, computed: 4, duplicates: 1, failed: 1 });
      viaQueue.table.rows.forEach((r, k) => {
        expect(r.digest).toBe(local.table.rows[k].digest);
        r.outputs.forEach((x, j) => expect(Object.is(x, local.table.rows[k].outputs[j])).toBe(true));
      });

      // The same sweep again (a retried producer): every record is found under its key, no job
      // runs again, and the results hash holds exactly one entry per distinct case.
      const second = await createQueueExecutor({ url, name: 'q-test', pollMs: 50 });
      const again = await runSweep(spec, { registry, executor: second });
      await second.close();
      expect(again.table.rows.map((r) => r.outputs)).toEqual(viaQueue.table.rows.map((r) => r.outputs));
      const redis = new Redis(url);
      try {
        expect(await redis.hlen(resultsHashOf('q-test'))).toBe(4);
      } finally {
        redis.disconnect();
      }
    } finally {
      await consumer.close();
    }
    const { processed } = await consumer.stopped;
    expect(processed).toBe(4);
  });
});

describe('sweepCommand', () => {
  it('runs a producer (--queue) and a consumer (--worker-of) that stops when idle', async () => {
    const registry = await standardRegistry();
    const dir = mkdtempSync(join(tmpdir(), 'skein-sweep-q-'));
    writeFileSync(join(dir, 'bewley.yaml'), BEWLEY_YAML);
    writeFileSync(join(dir, 'scan.yaml'), SWEEP);
    const msgs: string[] = [];
    const io = { out: (s: string) => msgs.push(s), err: (s: string) => msgs.push(s) };
    const opts = { buildRegistry: async () => registry, progressStream: { write: () => true } };
    const producer = sweepCommand([join(dir, 'scan.yaml'), '--queue', url, '--queue-name', 'q-cli', '--no-cache'], io, opts);
    // The consumer starts once the producer has queued work, so that its idle clock (3 s without
    // a case) cannot run out before the first case however slow the machine is.
    const q = new Queue('q-cli', { connection: { host: '127.0.0.1', port: Number(new URL(url).port) } });
    const deadline = Date.now() + 30_000;
    while ((await q.count()) === 0) {
      if (Date.now() > deadline) throw new Error(`the producer queued nothing in 30 s: ${msgs.join('\n')}`);
      await new Promise((r) => setTimeout(r, 50));
    }
    await q.close();
    const consumer = sweepCommand(['--worker-of', url, '--queue-name', 'q-cli', '--workers', '1', '--idle-exit', '3'], io, opts);
    expect(await producer, msgs.join('\n')).toBe(0);
    expect(await consumer, msgs.join('\n')).toBe(0);
    expect(msgs.join('\n')).toContain('consumer stopped after 4 cases');
    const t = readTable(join(dir, 'scan.table.msgpack'));
    expect(t.rows.map((r) => r.status)).toEqual(['ok', 'ok', 'ok', 'ok', 'ok', 'failed']);
  });
});
