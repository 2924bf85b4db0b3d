import { Matrix, inverse } from 'ml-matrix';
import { describe, expect, it } from 'vitest';
import { createFdtdLine, fdtdKernelFor, type FdtdKernel, type FdtdLine } from '../../compile/fdtd.ts';
import type { ResolvedLine } from '../../model.ts';
import { fdtdStep } from '../fdtdStep.ts';
import { fdtdStep1 } from '../fdtdStep1.ts';
import { fdtdStep2 } from '../fdtdStep2.ts';
import { fdtdStep3 } from '../fdtdStep3.ts';
import { fdtdStep4 } from '../fdtdStep4.ts';

// The unrolled kernels form every sum in the order of the general loop fdtdStep, so their results
// are the same numbers: compared with === (which equates -0 and +0, the one difference allowed:
// fdtdStep starts its sums from +0). The kernels take whole state arrays of a fixed node-major
// layout (stride n per node, no stride or offset arguments), so the stride cases of STYLE.md do
// not apply; an offset is tested by handing the kernels subarray views inside larger buffers whose
// other slots hold NaN (a stray read would spread NaN into the state, a stray write would overwrite
// a guard). The smallest segment is one cell (resolve asks for at least 2; n = 0 cannot occur:
// a line has at least one conductor).

/** Seeded PRNG (mulberry32, common practice) in [0, 1). */
function prng(seed: number): () => number {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

const GUARD = 5;

/** A lossy coupled segment of n conductors (SPD C, L = C^-1 / v^2), state random, inside NaN-guarded buffers. */
function segment(n: number, cells: number, seed: number): { f: FdtdLine; bufV: Float64Array; bufI: Float64Array } {
  const v = 2e8;
  const C = new Matrix(n, n);
  const mut = [100e-12, -20e-12, -8e-12, -3e-12, -1e-12];
  for (let i = 0; i < n; i++) for (let j = 0; j < n; j++) C.set(i, j, mut[Math.abs(i - j)]);
  const L = inverse(C).mul(1 / (v * v));
  const R = new Float64Array(n * n);
  const G = new Float64Array(n * n);
  for (let i = 0; i < n; i++) {
    R[i * n + i] = 0.05 * (1 + i);
    G[i * n + i] = 1e-6;
    if (i > 0) { R[i * n + i - 1] = 0.01; R[(i - 1) * n + i] = 0.01; }
  }
  const line = {
    id: 't', index: 0, from: 0, to: 1, lengthM: 100, conductors: Array.from({ length: n }, (_, i) => `c${i}`),
    L: Float64Array.from(L.to1DArray()), C: Float64Array.from(C.to1DArray()), R, G, path: ['lines', 't'], origin: 'test',
  } as ResolvedLine;
  const f = createFdtdLine(line, cells, (0.9 * 100) / cells / v, 0);
  const rnd = prng(seed);
  const bufV = new Float64Array(f.V.length + 2 * GUARD).fill(NaN);
  const bufI = new Float64Array(f.I.length + 2 * GUARD).fill(NaN);
  f.V = bufV.subarray(GUARD, GUARD + f.V.length);
  f.I = bufI.subarray(GUARD, GUARD + f.I.length);
  for (let i = 0; i < f.V.length; i++) f.V[i] = 2 * rnd() - 1;
  for (let i = 0; i < f.I.length; i++) f.I[i] = (2 * rnd() - 1) / 50;
  for (let i = 0; i < f.iEnd.length; i++) f.iEnd[i] = (2 * rnd() - 1) / 50;
  return { f, bufV, bufI };
}

function run(k: FdtdKernel, f: FdtdLine, steps: number): number {
  let updated = 0;
  for (let s = 0; s < steps; s++) updated += k(f.n, f.cells, f.Av, f.Bv, f.Ai, f.Bi, f.gm, f.V, f.I, f.iEnd, f.hEnd, f.tmp);
  return updated;
}

function firstDifference(a: Float64Array, b: Float64Array): number {
  if (a.length !== b.length) return 0;
  // NaN equals NaN here only so that the guards of the two buffers compare; the state is checked finite apart.
  for (let i = 0; i < a.length; i++) if (!(a[i] === b[i] || (Number.isNaN(a[i]) && Number.isNaN(b[i])))) return i;
  return -1;
}

const FAST: Array<[number, FdtdKernel]> = [[1, fdtdStep1], [2, fdtdStep2], [3, fdtdStep3], [4, fdtdStep4]];

describe('fdtdKernelFor', () => {
  it('picks the unrolled kernel for one to four conductors and the general loop beyond', () => {
    for (const [n, k] of FAST) expect(fdtdKernelFor(n)).toBe(k);
    expect(fdtdKernelFor(5)).toBe(fdtdStep);
    expect(fdtdKernelFor(12)).toBe(fdtdStep);
  });

  it('is the kernel createFdtdLine stores on the segment', () => {
    for (const n of [1, 3, 4, 5]) expect(segment(n, 8, 1).f.step).toBe(fdtdKernelFor(n));
  });
});

for (const [n, fast] of FAST) {
  describe(`fdtdStep${n}`, () => {
    it('gives the same numbers as the general loop fdtdStep, for 1 to 64 cells over 200 steps', () => {
      for (const cells of [1, 2, 3, 64]) {
        const ref = segment(n, cells, 11 * n + cells);
        const got = segment(n, cells, 11 * n + cells);
        const vEnds = [...ref.f.V.subarray(0, n), ...ref.f.V.subarray(cells * n)];
        expect(run(fdtdStep, ref.f, 200)).toBe(200 * cells);
        expect(run(fast, got.f, 200)).toBe(200 * cells);
        const where = `n = ${n}, cells = ${cells}`;
        expect(firstDifference(got.bufV, ref.bufV), `${where}: V`).toBe(-1);
        expect(firstDifference(got.bufI, ref.bufI), `${where}: I`).toBe(-1);
        expect(firstDifference(got.f.hEnd, ref.f.hEnd), `${where}: hEnd`).toBe(-1);
        // Guards untouched, end-node voltages never written, state finite and moved.
        for (const buf of [got.bufV, got.bufI]) {
          for (let i = 0; i < GUARD; i++) {
            expect(buf[i]).toBeNaN();
            expect(buf[buf.length - 1 - i]).toBeNaN();
          }
        }
        expect([...got.f.V.subarray(0, n), ...got.f.V.subarray(cells * n)]).toEqual(vEnds);
        for (const x of [...got.f.V, ...got.f.I, ...got.f.hEnd]) expect(Number.isFinite(x)).toBe(true);
        const start = segment(n, cells, 11 * n + cells).f;
        if (cells > 1) expect(firstDifference(got.f.V, start.V), where).toBeGreaterThanOrEqual(0);
        expect(firstDifference(got.f.I, start.I), where).toBeGreaterThanOrEqual(0);
      }
    });
  });
}
