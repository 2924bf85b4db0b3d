import { Matrix, inverse } from 'ml-matrix';
import { describe, expect, it } from 'vitest';
import { createFdtdLine } from '../../compile/fdtd.ts';
import type { ResolvedLine } from '../../model.ts';
import { fdtdStep } from '../fdtdStep.ts';
import { fdtdStepVarying } from '../fdtdStepVarying.ts';

// fdtdStepVarying forms every sum in the order of the general uniform loop fdtdStep, so given the
// same matrix in every cell and node it must give fdtdStep's numbers exactly (=== per value, which
// equates -0 and +0). Node 0's and node N's slots of Av, Bv are never read: they hold NaN here, and
// so do guards around the state (its layout is fixed node-major, stride n, so STYLE.md's stride
// cases do not apply; the offset case is a subarray view). Cells differing from each other are
// the business of the physics suites (test/varying-lines).

const GUARD = 3;

function uniformSegment(n: number, cells: number) {
  const v = 2e8;
  const C = new Matrix(n, n);
  const mut = [100e-12, -20e-12, -8e-12];
  for (let i = 0; i < n; i++) for (let j = 0; j < n; j++) C.set(i, j, mut[Math.abs(i - j)]);
  const L = inverse(C).mul(1 / (v * v));
  const R = new Float64Array(n * n);
  const G = new Float64Array(n * n);
  for (let i = 0; i < n; i++) { R[i * n + i] = 0.05 * (i + 1); G[i * n + i] = 2e-6; }
  const line = {
    id: 't', index: 0, from: 0, to: 1, lengthM: 30, conductors: Array.from({ length: n }, (_, i) => `c${i}`),
    L: Float64Array.from(L.to1DArray()), C: Float64Array.from(C.to1DArray()), R, G, path: ['lines', 't'], origin: 'test',
  } as ResolvedLine;
  return createFdtdLine(line, cells, (0.95 * 30) / cells / v, 0);
}

/** Repeats an n x n matrix `count` times; the slots listed in `nan` hold NaN. */
function repeat(m: Float64Array, count: number, nan: number[] = []): Float64Array {
  const out = new Float64Array(count * m.length);
  for (let k = 0; k < count; k++) out.set(nan.includes(k) ? new Float64Array(m.length).fill(NaN) : m, k * m.length);
  return out;
}

function guarded(src: Float64Array, seed: number): { buf: Float64Array; view: Float64Array } {
  const buf = new Float64Array(src.length + 2 * GUARD).fill(NaN);
  const view = buf.subarray(GUARD, GUARD + src.length);
  for (let i = 0; i < view.length; i++) view[i] = Math.sin(1.7 * i + seed) * (seed === 1 ? 1 : 0.02);
  return { buf, view };
}

describe('fdtdStepVarying', () => {
  it('gives the numbers of fdtdStep when every cell and node has the same matrices, without reading the end nodes\' slots', () => {
    for (const n of [1, 2, 3]) {
      for (const cells of [1, 2, 17]) {
        const f = uniformSegment(n, cells);
        const nn = n * n;
        const ref = { V: guarded(f.V, 1), I: guarded(f.I, 2), hEnd: new Float64Array(2 * n), tmp: new Float64Array(n) };
        const got = { V: guarded(f.V, 1), I: guarded(f.I, 2), hEnd: new Float64Array(2 * n), tmp: new Float64Array(n) };
        const iEnd = Float64Array.from({ length: 2 * n }, (_, i) => 0.01 * (i + 1));
        const Av = repeat(f.Av, cells + 1, [0, cells]);
        const Bv = repeat(f.Bv, cells + 1, [0, cells]);
        const Ai = repeat(f.Ai, cells);
        const Bi = repeat(f.Bi, cells);
        const gm = f.gm; // both ends, as createFdtdLine stores them
        expect(gm.length).toBe(2 * nn);
        for (let s = 0; s < 150; s++) {
          expect(fdtdStep(n, cells, f.Av, f.Bv, f.Ai, f.Bi, f.gm, ref.V.view, ref.I.view, iEnd, ref.hEnd, ref.tmp)).toBe(cells);
          expect(fdtdStepVarying(n, cells, Av, Bv, Ai, Bi, gm, got.V.view, got.I.view, iEnd, got.hEnd, got.tmp)).toBe(cells);
        }
        const where = `n = ${n}, cells = ${cells}`;
        for (const [a, b, name] of [[got.V.view, ref.V.view, 'V'], [got.I.view, ref.I.view, 'I'], [got.hEnd, ref.hEnd, 'hEnd']] as const) {
          for (let i = 0; i < a.length; i++) {
            expect(Number.isFinite(a[i]), `${where}: ${name}[${i}] finite`).toBe(true);
            expect(a[i] === b[i], `${where}: ${name}[${i}] ${a[i]} vs ${b[i]}`).toBe(true);
          }
        }
        for (const buf of [got.V.buf, got.I.buf]) for (let i = 0; i < GUARD; i++) { expect(buf[i]).toBeNaN(); expect(buf[buf.length - 1 - i]).toBeNaN(); }
        // The state moved (the comparison is not between two untouched arrays).
        expect(got.I.view[0]).not.toBe(guarded(f.I, 2).view[0]);
      }
    }
  });

  it('uses end N\'s own history matrix', () => {
    // gm of end N differing from end 0's changes h_N only (one cell: h_N = -(gm_N V_N + i_N + 2 I)).
    const f = uniformSegment(1, 1);
    const V = Float64Array.of(1, 2);
    const I = Float64Array.of(0);
    const hEnd = new Float64Array(2);
    fdtdStepVarying(1, 1, Float64Array.of(NaN, NaN), Float64Array.of(NaN, NaN), f.Ai, f.Bi, Float64Array.of(3, 5), V, I, Float64Array.of(0, 0), hEnd, new Float64Array(1));
    const i = f.Ai[0] * 0 - f.Bi[0] * (2 - 1);
    expect(I[0]).toBe(i);
    expect(hEnd[0]).toBe(-(3 * 1 + 0 - 2 * i));
    expect(hEnd[1]).toBe(-(5 * 2 + 0 + 2 * i));
  });
});
