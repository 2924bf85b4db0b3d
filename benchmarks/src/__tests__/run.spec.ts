import { spawnSync } from 'node:child_process';
import { mkdtempSync, readFileSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';
import { describe, expect, it } from 'vitest';
import type { BenchResults } from '../run.ts';

describe('runBenchmark', () => {
  it('runs the quick sweep from the command line with TypeScript and C outputs agreeing', () => {
    const dir = mkdtempSync(join(tmpdir(), 'skein-bench-test-'));
    try {
      const out = join(dir, 'quick.json');
      const root = resolve(import.meta.dirname, '..', '..', '..');
      const r = spawnSync('npx', ['tsx', 'benchmarks/src/run.ts', '--quick', '--out', out], { cwd: root, encoding: 'utf8' });
      expect(r.stderr).not.toMatch(/gcc not found/);
      expect(r.status).toBe(0);
      expect(r.stdout).toMatch(/TS\/C/);
      const res = JSON.parse(readFileSync(out, 'utf8')) as BenchResults;
      expect(res.failures).toEqual([]);
      expect(res.cases.length).toBe(8);
      for (const c of res.cases) {
        // The comparison tolerance of the benchmark (see run.ts TOLERANCE).
        expect(c.cDeviation).toBeLessThanOrEqual(1e-12);
        expect(c.blockedBitIdentical).toBe(true);
        expect(c.ratio).toBeGreaterThan(0);
        expect(c.ts.checksum).not.toBe(0);
      }
    } finally {
      rmSync(dir, { recursive: true, force: true });
    }
  });

  it('refuses an unknown option, naming it and the accepted ones', () => {
    const root = resolve(import.meta.dirname, '..', '..', '..');
    const r = spawnSync('npx', ['tsx', 'benchmarks/src/run.ts', '--fast'], { cwd: root, encoding: 'utf8' });
    expect(r.status).toBe(2);
    expect(r.stderr).toMatch(/unknown option --fast; accepted: --quick, --out FILE/);
  });
});
