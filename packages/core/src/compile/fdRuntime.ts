/**
 * Run-time state of frequency-dependent lines (line/fdLine.ts for the single-mode model and its
 * sources, line/fdModal.ts for multiconductor lines under a constant transformation): per line the
 * transformation, per mode the prepared fit, the recursive-convolution states of Yc and H' at both
 * ends and the rings of the outgoing waves f = i + yc * v, and per line the phase-domain end values
 * of the current step.
 *
 * Each end is a Norton equivalent in phase quantities: with the modal ends
 * im = g_m vm + h_m (h_m = j_m - b_m, the Yc history less the incident wave filtered by H') and
 * v = Tv vm, i = Ti im, Ti = Tv^-T,
 *
 *   i = G v + Ti h,   G = Ti diag(g_m) Ti^T (symmetric),
 *
 * so a junction stamps G between the end's conductors and takes Ti h as history currents.
 */
import type { LineSection } from '@skein/lines';
import { prepareFdLine, type FdLineModel, type Prepared } from '../line/fdLine.ts';
import { fitFdMultiLine, type FdMultiFitOptions, type FdMultiModel, type ModalCoupling } from '../line/fdModal.ts';

/** One mode of a frequency-dependent line in a run. */
export interface FdModeRuntime {
  model: FdLineModel;
  p: Prepared;
  nYcS: number;
  nHS: number;
  ycState: Float64Array;
  hState: Float64Array;
  /** Rings of f of the from end (at 0) and the to end (at rOff). */
  ring: Float64Array;
  rOff: number;
  /** [u_from, u_to, vm_from, vm_to] of the previous step. */
  prev: Float64Array;
  /** b and j of both ends at this step. */
  b: Float64Array;
  j: Float64Array;
}

/** One frequency-dependent line in a run. */
export interface FdRuntime {
  line: number;
  /** Conductors (= modes). */
  n: number;
  model: FdMultiModel;
  modes: FdModeRuntime[];
  /** Transformation, n x n row-major: v = Tv vm, vm = TvInv v, i = Ti im. */
  Tv: Float64Array;
  TvInv: Float64Array;
  Ti: Float64Array;
  /** Norton conductance of an end in phase quantities, n x n row-major [S]. */
  G: Float64Array;
  /** Modal history h = j - b of the current step, end e mode m at e n + m. */
  h: Float64Array;
  /** Phase end currents (into the line) of this step and the previous one, and the previous end voltages; end e conductor a at e n + a. */
  iEnd: Float64Array;
  iPrev: Float64Array;
  vPrev: Float64Array;
  /** Slot of the history current of end e conductor a: slotBase + e n + a. */
  slotBase: number;
  /** Global x index of end e conductor a at e n + a. */
  xEnd: Int32Array;
  /** Energy that flowed into the line at both ends so far [J] (stored in it or lost in it). */
  absorbedJ: number;
  /** The constant transformation's neglected coupling over the band the run resolves (n > 1). */
  runCoupling: ModalCoupling | undefined;
}

/** Fits a line's section (done before the time step is chosen: the fitted delays bound it). */
export function fitLine(section: LineSection, lengthM: number, options: FdMultiFitOptions = {}): FdMultiModel {
  return fitFdMultiLine(section, lengthM, options);
}

/** The shortest fitted delay of a line's modes [s]. */
export function shortestFdDelay(model: FdMultiModel): number {
  let d = Infinity;
  for (const m of model.modes) d = Math.min(d, m.tauS);
  return d;
}

/** Prepares the run-time state of a fitted line for time step dt [s]; its 2 n slots start at slotBase. */
export function createFdRuntime(line: number, model: FdMultiModel, dtS: number, slotBase: number, runCoupling?: ModalCoupling): FdRuntime {
  const n = model.n;
  const { Tv, TvInv, Ti } = model.transform;
  const modes = model.modes.map((m): FdModeRuntime => {
    const p = prepareFdLine(m, dtS);
    const nYcS = p.ycN + 2 * p.ycNc;
    const nHS = p.hN + 2 * p.hNc;
    return {
      model: m, p, nYcS, nHS,
      ycState: new Float64Array(2 * nYcS),
      hState: new Float64Array(2 * nHS),
      ring: new Float64Array(2 * (p.mask + 1)),
      rOff: p.mask + 1,
      prev: new Float64Array(4),
      b: new Float64Array(2),
      j: new Float64Array(2),
    };
  });
  const G = new Float64Array(n * n);
  for (let a = 0; a < n; a++) for (let c = 0; c < n; c++) {
    let s = 0;
    for (let m = 0; m < n; m++) s += Ti[a * n + m] * modes[m].p.g * Ti[c * n + m];
    G[a * n + c] = s;
  }
  return {
    line, n, model, modes, Tv, TvInv, Ti, G,
    h: new Float64Array(2 * n),
    iEnd: new Float64Array(2 * n),
    iPrev: new Float64Array(2 * n),
    vPrev: new Float64Array(2 * n),
    slotBase,
    xEnd: new Int32Array(2 * n).fill(-1),
    absorbedJ: 0,
    runCoupling,
  };
}
