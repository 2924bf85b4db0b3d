import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { buildCTwin, cStream, gccVersion, runCTwin, writeCase } from '../cTwin.ts';
import { generateKernelNet } from '../generate.ts';
import { compareArrays, maxAbs } from '../metrics.ts';
import { runTs } from '../tsRun.ts';

const dir = mkdtempSync(join(tmpdir(), 'skein-ctwin-test-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

function twin(): string {
  if (!gccVersion()) {
    throw new Error('gcc is not on PATH: the C twin of the stepping kernels cannot be built. Install a C compiler (Debian: apt-get install build-essential); CI installs it in .ci/run.');
  }
  return buildCTwin();
}

describe('runCTwin', () => {
  for (const conductors of [1, 4] as const) {
    for (const [nB, fast, name] of [[1, false, 'reference'], [5, false, 'blocked'], [5, true, 'fast blocked']] as const) {
      it(`matches the TypeScript ${name} kernel to 1e-12 on a ${conductors}-conductor mesh`, () => {
        // Same loops, same order; gcc may fuse a*b+c (FMA), which changes the last bit of a term.
        // Errors stay at rounding size over 400 steps of a passive network, so 1e-12 relative
        // (floor 1e-3 max|value| for near-zero elements) leaves ample room and still catches any
        // indexing or ordering slip (those give O(1) differences).
        const bin = twin();
        const net = generateKernelNet({ nJunctions: 400, topology: 'mesh', conductors, numbering: 'random', seed: 11, delayMax: 30 }, 5);
        const kind = conductors === 1 ? 0 : 1;
        const ts = runTs(net, kind, 400, nB, 20, fast);
        const path = join(dir, `case${conductors}.bin`);
        writeCase(path, net, kind);
        const c = runCTwin(bin, path, net, 400, nB, 20, fast, 2);
        expect(maxAbs(ts.x)).toBeGreaterThan(0.01);
        const dw = compareArrays(c.wave, ts.wave, 1e-3 * maxAbs(ts.wave));
        const dx = compareArrays(c.x, ts.x, 1e-3 * maxAbs(ts.x));
        expect(dw.relative).toBeLessThanOrEqual(1e-12);
        expect(dx.relative).toBeLessThanOrEqual(1e-12);
        expect(c.checksum).toBeCloseTo(ts.checksum, 9);
        expect(c.seconds).toBeGreaterThan(0);
      });
    }
  }

  it('reports a large deviation when the C twin steps a slightly different network', () => {
    // Guards the comparison itself: one port's line-end admittance 2/Z flipped in sign must show.
    const bin = twin();
    const net = generateKernelNet({ nJunctions: 200, topology: 'tree', conductors: 1, numbering: 'bfs', seed: 2, delayMax: 30 });
    const ts = runTs(net, 0, 300, 1, 0);
    const path = join(dir, 'wrong.bin');
    net.pY2[0] *= -1;
    writeCase(path, net, 0);
    const c = runCTwin(bin, path, net, 300, 1, 0);
    expect(compareArrays(c.wave, ts.wave, 1e-3 * maxAbs(ts.wave)).relative).toBeGreaterThan(1e-6);
  });
});

describe('cStream', () => {
  it('measures a positive copy and triad bandwidth', () => {
    const bw = cStream(twin(), 1 << 20, 2);
    // Any machine that runs this moves between 0.1 and 1000 GB/s (common practice for DRAM and caches).
    expect(bw.copyBytesPerS).toBeGreaterThan(1e8);
    expect(bw.triadBytesPerS).toBeLessThan(1e12);
  });
});
