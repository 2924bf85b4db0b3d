// The FDTD benchmarks' own checks: the C twin computes what core's TS kernel computes, and the
// lumped-ladder baseline converges to the exact line solution at its order.
import { rmSync } from 'node:fs';
import { afterAll, describe, expect, it } from 'vitest';
import { fdtdStep } from '../../../packages/core/src/kernel/fdtdStep.ts';
import { buildCTwin, buildSegment, checksum, deviation, runC, runCase, runTs } from '../fdtdBench.ts';
import { LINE, buildLadder, reference, runLadder, type LineCase } from '../ladderBench.ts';

describe('fdtdStep C twin', () => {
  let twin: { dir: string; exe: string } | undefined;
  afterAll(() => { if (twin) rmSync(twin.dir, { recursive: true, force: true }); });

  it('matches the TypeScript kernels to 1e-12 on 1- to 4-conductor segments, general loop and unrolled', () => {
    // Fails with "gcc not found" when the C compiler is missing. The tolerance: both run the same
    // operations in the same order; gcc -O3 -march=native may fuse multiply-adds (FMA), which
    // changes each result by at most an ulp (2.2e-16 relative), and the stable, lossy scheme
    // does not amplify such differences over 300 steps; 1e-12 leaves a wide margin (measured ~1e-15).
    twin = buildCTwin();
    for (const n of [1, 2, 3, 4]) {
      for (const kind of ['general', 'unrolled'] as const) {
        const f = buildSegment(n, 64, 7);
        const c = runC(twin.exe, twin.dir, f, 300, 1, kind);
        const updated = runTs(f, 300, kind === 'general' ? fdtdStep : f.step);
        expect(updated).toBe(c.updated);
        expect(deviation(f, c), `n = ${n}, ${kind}`).toBeLessThan(1e-12);
        expect(Math.abs(checksum(f) - c.checksum)).toBeLessThan(1e-9 * Math.max(1, Math.abs(c.checksum)));
        // The state moved away from its start (a test that the kernel really stepped).
        expect(deviation(f, buildSegment(n, 64, 7))).toBeGreaterThan(1e-3);
      }
    }
  });

  it('times core\'s kernel and both C twins in one quick case', () => {
    twin ??= buildCTwin();
    const r = runCase({ n: 4, cells: 200, steps: 50 }, twin.exe, twin.dir, 1);
    expect(r.deviation).toBeLessThan(1e-12);
    expect(r.deviationGeneral).toBeLessThan(1e-12);
    for (const x of [r.tsCellStepsPerS, r.cCellStepsPerS, r.tsGeneralCellStepsPerS, r.cGeneralCellStepsPerS]) expect(x).toBeGreaterThan(0);
  });
});

describe('buildLadder', () => {
  it('converges to the exact line solution at second order: the error falls by 4 when sections double', async () => {
    // The pi section's chain matrix matches the exact line's to O((gamma dz)^2): the ladder's
    // propagation per section obeys cosh(gamma_N dz) = 1 + Z Y dz^2 / 2 against the exact
    // cosh(gamma dz) = 1 + (gamma dz)^2 / 2 + (gamma dz)^4 / 24 (C. R. Paul, Analysis of
    // Multiconductor Transmission Lines, 2nd ed., the lumped-circuit approximate models, from
    // memory), and the trapezoidal companions are second order in dt (H. W. Dommel, IEEE Trans.
    // PAS-88(4), 1969). With dt = dz / v both errors scale as dz^2, so halving dz divides the
    // error by 4 once the pulse is resolved. A Gaussian source (infinitely smooth) is used: an edge
    // with a jump in some derivative converges more slowly in the max norm (dispersed ripples).
    // Tolerance 3.7 .. 4.3: measured 4.21, 4.00, 4.00 at these counts; the first still carries
    // the next-order term.
    const l: LineCase = { ...LINE, lengthM: 200, endS: 4e-6, riseS: 100e-9, waveform: 'gaussian' };
    const n0 = 64;
    const ref = await reference(l, l.lengthM / n0 / 2e8);
    let peak = 0;
    for (const x of ref.values) peak = Math.max(peak, Math.abs(x));
    // Matched line: the far end sees the incident half of the EMF times e^{-alpha l}, alpha ~ R / (2 Z0)
    // + G Z0 / 2 = 5.0e-4 Np/m, so about 0.5 e^{-0.1} = 0.45 (Heaviside's low-loss approximation).
    expect(peak).toBeGreaterThan(0.4);
    expect(peak).toBeLessThan(0.5);
    const errs: number[] = [];
    for (const n of [n0, 2 * n0, 4 * n0, 8 * n0]) {
      const y = runLadder(l, buildLadder(l, n));
      const s = n / n0;
      let worst = 0;
      for (let i = 0; i < ref.values.length; i++) worst = Math.max(worst, Math.abs(y.values[i * s] - ref.values[i]));
      errs.push(worst / peak);
    }
    for (let k = 1; k < errs.length; k++) {
      const factor = errs[k - 1] / errs[k];
      expect(factor, `errors ${errs.map((e) => e.toExponential(2)).join(', ')}`).toBeGreaterThan(3.7);
      expect(factor).toBeLessThan(4.3);
    }
    expect(errs[errs.length - 1]).toBeLessThan(1e-3);
  }, 120_000);
});
