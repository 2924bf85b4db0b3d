import { compileScenario, resolveScenarioData, type Plan } from '@skein/core';
import { describe, expect, it } from 'vitest';
import { junctionStep } from '../../../packages/core/src/kernel/junctionStep.ts';
import { junctionStepScalar } from '../../../packages/core/src/kernel/junctionStepScalar.ts';
import { benchRegistry, buildKernelNet, drawNetwork, SOURCE_OHM, SOURCE_V, toScenarioData, type KernelNet } from '../generate.ts';
import { resetNet, slotRowsFor, stepNet } from '../tsRun.ts';

// The engine shares one copy of identical junction matrices (compile.ts, shareJunctionMatrices);
// the generator keeps one block per junction, so B, K and A are compared junction by junction.
const KEYS = ['jPort', 'jX', 'jN', 'jEx', 'pIn', 'pInMask', 'pK', 'pF', 'pOut', 'pOutMask', 'pNode', 'pY2',
  'exRow', 'exSlot', 'exCoef'] as const;

/** Junction j's B, K and A blocks (consecutive in both layouts) from a layout. */
function junctionBlock(l: { jPort: Int32Array; jX: Int32Array; jN: Int32Array; jB: Int32Array; mat: Float64Array }, j: number): Float64Array {
  const M = l.jPort[j + 1] - l.jPort[j];
  const R = l.jX[j + 1] - l.jX[j];
  return l.mat.subarray(l.jB[j], l.jB[j] + R * M + R * R + M * l.jN[j]);
}

function firstDifference(a: ArrayLike<number>, b: ArrayLike<number>): number {
  if (a.length !== b.length) return -2;
  for (let i = 0; i < a.length; i++) if (!Object.is(a[i], b[i])) return i;
  return -1;
}

/** The engine's own junction phase on its plan (as step.ts runs it: sources into slots, then kernels). */
function stepPlan(plan: Plan, nSteps: number): void {
  const p = plan;
  for (let n = 0; n < nSteps; n++) {
    for (const w of p.waveforms) p.slot[w.slot] = w.instance.value(n * p.dtS);
    for (let j = 0; j < p.nJunctions; j++) {
      if (p.jScalar[j] === 1) {
        junctionStepScalar(j, j + 1, n, p.jPort, p.jX, p.jK, p.jEx, p.pIn, p.pInMask, p.pK, p.pF, p.pOut, p.pOutMask,
          p.pNode, p.pY2, p.exRow, p.exSlot, p.exCoef, p.slot, p.mat, p.wave, p.rhs, p.inc, p.x);
      } else {
        junctionStep(j, j + 1, n, p.jPort, p.jX, p.jN, p.jB, p.jK, p.jA, p.jEx, p.pIn, p.pInMask, p.pK, p.pF,
          p.pOut, p.pOutMask, p.exRow, p.exSlot, p.exCoef, p.slot, p.mat, p.wave, p.rhs, p.inc, p.x);
      }
    }
  }
}

describe('buildKernelNet', () => {
  for (const conductors of [1, 4] as const) {
    for (const topology of ['tree', 'mesh'] as const) {
      it(`lays out a ${topology} of ${conductors}-conductor lines exactly as the engine's compile step does, and steps to the same state`, async () => {
        // Same network through two routes: the generator's arrays, and the scenario it writes
        // resolved and compiled by core. Same operations in the same order, so equality is exact.
        const spec = drawNetwork({ nJunctions: 40, topology, conductors, numbering: 'bfs', seed: 7, delayMax: 40, loadShare: 0.3, sourceShare: 0.1 });
        const net = buildKernelNet(spec);
        const registry = benchRegistry();
        const plan = await compileScenario(resolveScenarioData(toScenarioData(spec, 300), { registry, file: 'generated.json' }), { registry });
        expect(plan.nJunctions).toBe(40);
        expect(plan.jScalar.every((s) => s === (conductors === 1 ? 1 : 0))).toBe(true);
        for (const k of KEYS) expect(`${k}: ${firstDifference(net[k], plan[k])}`).toBe(`${k}: -1`);
        for (let j = 0; j < 40; j++) {
          expect(`junction ${j}: ${firstDifference(junctionBlock(net, j), junctionBlock(plan, j))}`).toBe(`junction ${j}: -1`);
          expect(plan.jK[j] - plan.jB[j]).toBe(net.jK[j] - net.jB[j]);
          expect(plan.jA[j] - plan.jB[j]).toBe(net.jA[j] - net.jB[j]);
        }
        expect(net.wave.length).toBe(plan.wave.length);
        stepPlan(plan, 300);
        stepNet(net, conductors === 1 ? 0 : 1, 300, 1, slotRowsFor(net, 1));
        expect(Math.max(...plan.x.map(Math.abs))).toBeGreaterThan(0.01);
        expect(firstDifference(net.wave, plan.wave)).toBe(-1);
        expect(firstDifference(net.x, plan.x)).toBe(-1);
      });
    }
  }

  for (const conductors of [1, 4] as const) {
    it(`settles a ${conductors}-conductor tree to the DC voltage Millman's theorem gives`, () => {
      // At DC a lossless line is a plain connection of each conductor, so every first-conductor
      // node of the tree sits at V = sum(Vs / Rs) / (sum 1/Rs + sum 1/R_load) (Millman's theorem:
      // J. Millman, Proc. IRE 28 (1940) 413, from memory), the other conductors at 0 (no source).
      // Loads on 60 % of the junctions damp the reflections; after 20000 steps (> 100 round trips
      // of the longest path) the remaining transient is below 1e-9 relative.
      const spec = drawNetwork({ nJunctions: 12, topology: 'tree', conductors, numbering: 'bfs', seed: 3, delayMin: 5, delayMax: 12, loadShare: 0.6, sourceShare: 0.2 });
      const net: KernelNet = buildKernelNet(spec);
      let gSum = 0;
      let iSum = 0;
      for (let j = 0; j < 12; j++) {
        if (spec.loadOhm[j] > 0) gSum += 1 / spec.loadOhm[j];
        if (spec.source[j]) { gSum += 1 / SOURCE_OHM; iSum += SOURCE_V / SOURCE_OHM; }
      }
      const v = iSum / gSum;
      resetNet(net);
      stepNet(net, conductors === 1 ? 0 : 1, 20000, 1, slotRowsFor(net, 1));
      for (let j = 0; j < 12; j++) {
        expect(Math.abs(net.x[net.jX[j]] - v)).toBeLessThan(1e-9 * v);
        for (let k = 1; k < conductors; k++) expect(Math.abs(net.x[net.jX[j] + k])).toBeLessThan(1e-9 * v);
      }
    });
  }
});

describe('drawNetwork', () => {
  it('numbers a mesh breadth-first so that the two ends of a line sit much closer than with random numbering', () => {
    const gap = (numbering: 'bfs' | 'random'): number => {
      const s = drawNetwork({ nJunctions: 10000, topology: 'mesh', conductors: 1, numbering, seed: 5 });
      let sum = 0;
      for (let l = 0; l < s.lineFrom.length; l++) sum += s.lineTo[l] - s.lineFrom[l];
      return sum / s.lineFrom.length;
    };
    // A 100 x 100 grid: BFS fronts are diagonals of at most ~200 junctions; random labels average N / 3.
    expect(gap('bfs')).toBeLessThan(200);
    expect(gap('random')).toBeGreaterThan(2500);
  });

  it('rejects fewer than two junctions with a message naming the value', () => {
    expect(() => drawNetwork({ nJunctions: 1, topology: 'tree', conductors: 1, numbering: 'bfs' })).toThrow(/nJunctions must be at least 2, got 1/);
  });
});
