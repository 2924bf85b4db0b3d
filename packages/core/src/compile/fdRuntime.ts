/**
 * Run-time state of frequency-dependent lines (line/fdLine.ts for the model and its sources):
 * per line the prepared fit, the recursive-convolution states of Yc and H' at both ends, the rings
 * of the outgoing waves f = i + yc * v, and the end values of the current step.
 */
import type { LineSection } from '@skein/lines';
import { fitFdLine, prepareFdLine, type FdLineModel, type Prepared } from '../line/fdLine.ts';

/** One frequency-dependent line in a run. */
export interface FdRuntime {
  line: number;
  model: FdLineModel;
  p: Prepared;
  nYcS: number;
  nHS: number;
  ycState: Float64Array;
  hState: Float64Array;
  /** Rings of f of the from end (at 0) and the to end (at rOff). */
  ring: Float64Array;
  rOff: number;
  /** [u_from, u_to, v_from, v_to] of the previous step. */
  prev: Float64Array;
  /** b and j of both ends at this step, end currents i (into the line) and their previous values. */
  b: Float64Array;
  j: Float64Array;
  iEnd: Float64Array;
  iPrev: Float64Array;
  slotBase: number;
  xEnd: Int32Array;
  /** Energy that flowed into the line at both ends so far [J] (stored in it or lost in it). */
  absorbedJ: number;
}

/** Fits a line's section (done before the time step is chosen: the fitted delay bounds it). */
export function fitLine(section: LineSection, lengthM: number): FdLineModel {
  return fitFdLine(section, lengthM);
}

/** Prepares the run-time state of a fitted line for time step dt [s]. */
export function createFdRuntime(line: number, model: FdLineModel, dtS: number, slotBase: number): FdRuntime {
  const p = prepareFdLine(model, dtS);
  const nYcS = p.ycN + 2 * p.ycNc;
  const nHS = p.hN + 2 * p.hNc;
  return {
    line, model, p, nYcS, nHS,
    ycState: new Float64Array(2 * nYcS),
    hState: new Float64Array(2 * nHS),
    ring: new Float64Array(2 * (p.mask + 1)),
    rOff: p.mask + 1,
    prev: new Float64Array(4),
    b: new Float64Array(2),
    j: new Float64Array(2),
    iEnd: new Float64Array(2),
    iPrev: new Float64Array(2),
    slotBase,
    xEnd: new Int32Array(2).fill(-1),
    absorbedJ: 0,
  };
}
