/**
 * Accuracy for cost on a 1 km lossy line: skein's FDTD segment (through the real engine:
 * resolveScenarioText + runScenario) against the lumped-ladder approach (the line cut into N pi
 * sections of series R-L and shunt G-C, modified nodal analysis with trapezoidal companions, one
 * banded (tridiagonal) LU factored before the first step), both checked against the exact
 * frequency-domain solution of @skein/spectral (timeResponse). For each method the coarsest
 * discretisation whose far-end step response is within 1 % of the reference's final value at every
 * reference sample is found, then that run is timed (best of 3); the ratio ladder / skein is reported.
 *
 * Run: `npx tsx benchmarks/fdtd/ladderBench.ts [--quick] [--out FILE]`.
 */
import { writeFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { loadPluginModules, PluginRegistry, resolveScenarioText, runScenario } from '@skein/core';
// Not yet dependencies of @skein/benchmarks: imported by path (see README, "Integration").
import { STANDARD_PLUGINS, STANDARD_PLUGINS_BASE } from '../../packages/cli/src/index.ts';
import { timeResponse } from '../../packages/spectral/src/index.ts';

/** The line and its terminations (constant per-unit-length parameters; a small coax-like cable). */
export interface LineCase {
  lengthM: number;
  /** Per-unit-length R [ohm/m], L [H/m], G [S/m], C [F/m]. */
  R: number;
  L: number;
  G: number;
  C: number;
  /** Source EMF step [V], its linear rise [s], source and load resistances [ohm]. */
  amplitudeV: number;
  riseS: number;
  sourceOhm: number;
  loadOhm: number;
  /** End of the run [s]. */
  endS: number;
  /**
   * Source waveform: 'step' (default) a step with a raised-cosine edge of duration riseS; 'gaussian'
   * a Gaussian pulse of standard deviation riseS centred at 5 riseS (infinitely smooth, used by the
   * convergence test so that the ladder shows its asymptotic order).
   */
  waveform?: 'step' | 'gaussian';
}

/** The benchmark's line: Z0 = 50 ohm, v = 2e8 m/s, 0.5 Np of series loss at high frequency. */
export const LINE: LineCase = {
  lengthM: 1000, R: 0.05, L: 250e-9, G: 1e-6, C: 100e-12,
  amplitudeV: 1, riseS: 100e-9, sourceOhm: 50, loadOhm: 50, endS: 50e-6,
};

/** Speed of the lossless line 1 / sqrt(L C) [m/s]. */
export function speed(l: LineCase): number {
  return 1 / Math.sqrt(l.L * l.C);
}

/**
 * The source EMF at t [s] (for waveform 'gaussian' the Gaussian pulse): a raised-cosine edge to the amplitude over the rise (the `step`
 * plugin's `edge: smooth`, 0.5 (1 - cos(pi t / rise))). Smooth so that both methods converge at
 * their order; a linear ramp's kinks leave dispersive ripples that shrink more slowly.
 */
export function emf(l: LineCase, tS: number): number {
  if (l.waveform === 'gaussian') {
    const d = tS - 5 * l.riseS;
    return l.amplitudeV * Math.exp(-(d * d) / (2 * l.riseS * l.riseS));
  }
  if (tS <= 0) return 0;
  return tS >= l.riseS ? l.amplitudeV : 0.5 * l.amplitudeV * (1 - Math.cos((Math.PI * tS) / l.riseS));
}

/** A sampled response: y[i] at time i dt [s]. */
export interface Sampled {
  dtS: number;
  values: Float64Array;
}

/** Precomputed ladder: its tridiagonal LU and the companion coefficients (all before the first step). */
export interface Ladder {
  sections: number;
  dtS: number;
  steps: number;
  /** LU of the nodal matrix: sub-diagonal multipliers and inverse pivots, N + 1 nodes. */
  mult: Float64Array;
  invPivot: Float64Array;
  offDiag: number;
  /** Series branch: i' = gs (dv' + dv) + a i; shunt capacitor companion conductance per node. */
  gs: number;
  a: number;
  gc: Float64Array;
  /** State: node voltages, series currents (N), capacitor currents (N + 1), right-hand side. */
  v: Float64Array;
  iL: Float64Array;
  iC: Float64Array;
  rhs: Float64Array;
}

/**
 * Builds the lumped ladder of N pi sections: series R dz + L dz between nodes k-1 and k, shunt
 * G dz and C dz at interior nodes and half of them at the two ends; source EMF behind its
 * resistance at node 0 (Norton), load resistance at node N. Trapezoidal companions (Dommel's
 * method): series R-L branch i^{n+1} = gs (u^{n+1} + u^n) + (2L/dt - R) gs i^n, gs = 1/(R + 2L/dt);
 * capacitor i^{n+1} = (2C/dt)(v^{n+1} - v^n) - i^n. The nodal matrix is constant and tridiagonal:
 * factored once here (Thomas algorithm = banded LU without pivoting; the matrix is symmetric and
 * diagonally dominant, so no pivoting is needed).
 * @param sections N >= 1.
 * @param dtS time step [s]; default the section's delay dz / v.
 */
export function buildLadder(l: LineCase, sections: number, dtS?: number): Ladder {
  const N = sections;
  const dz = l.lengthM / N;
  const dt = dtS ?? dz / speed(l);
  const Rs = l.R * dz;
  const Ls = l.L * dz;
  const gs = 1 / (Rs + (2 * Ls) / dt);
  const a = gs * ((2 * Ls) / dt - Rs);
  const gc = new Float64Array(N + 1);
  const gG = new Float64Array(N + 1);
  for (let j = 0; j <= N; j++) {
    const w = j === 0 || j === N ? 0.5 : 1;
    gc[j] = (2 * l.C * dz * w) / dt;
    gG[j] = l.G * dz * w;
  }
  const diag = new Float64Array(N + 1);
  for (let j = 0; j <= N; j++) diag[j] = gG[j] + gc[j] + gs * ((j > 0 ? 1 : 0) + (j < N ? 1 : 0));
  diag[0] += 1 / l.sourceOhm;
  diag[N] += 1 / l.loadOhm;
  // LU of the symmetric tridiagonal matrix with off-diagonal -gs.
  const mult = new Float64Array(N + 1);
  const invPivot = new Float64Array(N + 1);
  let piv = diag[0];
  invPivot[0] = 1 / piv;
  for (let j = 1; j <= N; j++) {
    mult[j] = -gs / piv;
    piv = diag[j] - mult[j] * -gs;
    invPivot[j] = 1 / piv;
  }
  return {
    sections: N, dtS: dt, steps: Math.max(1, Math.round(l.endS / dt)),
    mult, invPivot, offDiag: -gs, gs, a, gc,
    v: new Float64Array(N + 1), iL: new Float64Array(N), iC: new Float64Array(N + 1), rhs: new Float64Array(N + 1),
  };
}

/**
 * Steps the ladder from rest to the end of the run; no allocation inside the loop.
 * @returns the far-end (node N) voltage at every step, from t = 0.
 */
export function runLadder(l: LineCase, d: Ladder): Sampled {
  const N = d.sections;
  const { mult, invPivot, offDiag, gs, a, gc, v, iL, iC, rhs } = d;
  v.fill(0); iL.fill(0); iC.fill(0);
  const out = new Float64Array(d.steps + 1);
  const gSrc = 1 / l.sourceOhm;
  for (let n = 1; n <= d.steps; n++) {
    // Forward pass: right-hand side from the histories (series J_k = gs u_k^n + a i_k^n with
    // u_k = v_k - v_{k+1}, leaving node k and entering k + 1; capacitor gc v_j^n + iC_j^n), fused
    // with the forward elimination of the LU.
    let jIn = 0;
    let prev = 0;
    for (let j = 0; j <= N; j++) {
      let r = gc[j] * v[j] + iC[j] + jIn;
      if (j < N) {
        const J = gs * (v[j] - v[j + 1]) + a * iL[j];
        r -= J;
        jIn = J;
      }
      if (j === 0) r += emf(l, n * d.dtS) * gSrc;
      else r -= mult[j] * prev;
      rhs[j] = r;
      prev = r;
    }
    // Backward pass: back substitution fused with the companions' current updates, which need the
    // old voltages (v) and the new (x).
    let xNext = 0;
    let vOldNext = 0;
    for (let j = N; j >= 0; j--) {
      const x = j === N ? rhs[N] * invPivot[N] : (rhs[j] - offDiag * xNext) * invPivot[j];
      if (j < N) iL[j] = gs * (x - xNext + v[j] - vOldNext) + a * iL[j];
      iC[j] = gc[j] * (x - v[j]) - iC[j];
      vOldNext = v[j];
      v[j] = x;
      xNext = x;
    }
    out[n] = v[N];
  }
  return { dtS: d.dtS, values: out };
}

/** Scenario text of the same line for skein with an FDTD segment of `cells` cells, step = cell delay. */
export function scenarioText(l: LineCase, cells: number): string {
  const dt = l.lengthM / cells / speed(l);
  const gen = l.waveform === 'gaussian'
    ? `source: gaussian, between: [a, ref], amplitude: ${l.amplitudeV}, width: ${l.riseS}, centre: ${5 * l.riseS}`
    : `source: step, between: [a, ref], amplitude: ${l.amplitudeV}, rise: ${l.riseS}, edge: smooth`;
  return `
skein: 1
time: { end: ${l.endS}, step: ${dt} }
lines:
  cable: { from: A, to: B, length: ${l.lengthM}m, inductance: ${l.L}H/m, capacitance: ${l.C}F/m, resistance: ${l.R}ohm/m, conductance: ${l.G}S/m, fdtd: { cells: ${cells} } }
junctions:
  A:
    nodes: { a: [cable] }
    parts: { gen: { ${gen}, resistance: ${l.sourceOhm}ohm } }
  B:
    nodes: { b: [cable] }
    parts: { RL: { load: resistor, between: [b, ref], resistance: ${l.loadOhm}ohm } }
probes:
  far: { probe: node-voltage, node: B.b }
`;
}

let registryP: Promise<PluginRegistry> | undefined;

/** The standard plugin registry, as `skein run` loads it (once). */
export function registry(): Promise<PluginRegistry> {
  registryP ??= loadPluginModules(new PluginRegistry(), STANDARD_PLUGINS, STANDARD_PLUGINS_BASE);
  return registryP;
}

/** Runs skein on the line with `cells` FDTD cells; returns the far-end voltage per recorded sample. */
export async function runSkein(l: LineCase, cells: number): Promise<Sampled> {
  const reg = await registry();
  const r = await runScenario(resolveScenarioText(scenarioText(l, cells), { registry: reg, file: `line-${cells}.yaml` }), { registry: reg });
  const i = r.traceNames.indexOf('far.v');
  if (i < 0) throw new Error(`no trace far.v; traces: ${r.traceNames.join(', ')}`);
  return { dtS: r.dtS * r.recordEvery, values: r.traces.data.slice(i * r.nSamples, (i + 1) * r.nSamples) };
}

/** The exact reference: far-end voltage from the spectrum at times i dtS, i = 0..end / dtS. */
export async function reference(l: LineCase, dtS: number): Promise<Sampled> {
  const reg = await registry();
  // The scenario's FDTD setting plays no part in the spectral solution (exact line blocks).
  const sc = resolveScenarioText(scenarioText(l, 100), { registry: reg, file: 'reference.yaml' });
  const n = Math.round(l.endS / dtS);
  const timesS = Array.from({ length: n + 1 }, (_, i) => i * dtS);
  const t = await timeResponse(sc, reg, { outputs: [{ kind: 'voltage', node: 'B.b' }], timesS });
  return { dtS, values: t.series[0].values };
}

/** Linear interpolation of a sampled response at t [s] (clamped to its last sample). */
export function sampleAt(s: Sampled, tS: number): number {
  const x = tS / s.dtS;
  const i = Math.floor(x);
  if (i >= s.values.length - 1) return s.values[s.values.length - 1];
  const f = x - i;
  return s.values[i] * (1 - f) + s.values[i + 1] * f;
}

/**
 * Largest |y(t) - ref(t)| over the reference's samples, relative to the reference's final value
 * (its last sample); y is interpolated linearly between its own samples.
 */
export function relativeError(y: Sampled, ref: Sampled): number {
  const fin = Math.abs(ref.values[ref.values.length - 1]);
  let worst = 0;
  for (let i = 0; i < ref.values.length; i++) worst = Math.max(worst, Math.abs(sampleAt(y, i * ref.dtS) - ref.values[i]));
  return worst / fin;
}

/**
 * The coarsest discretisation that passes: doubling from `start` until the error is within
 * `tol`, then bisection between the last failing and the first passing count to 3 %.
 * Assumes the error falls with the count (true of both methods here, beyond the first few counts).
 */
export async function coarsest(err: (n: number) => Promise<number>, tol: number, start: number, max: number): Promise<{ n: number; error: number; tried: Array<[number, number]> }> {
  const tried: Array<[number, number]> = [];
  const e = async (n: number): Promise<number> => { const x = await err(n); tried.push([n, x]); return x; };
  let hi = start;
  let eHi = await e(hi);
  let lo = 0;
  while (!(eHi <= tol)) {
    if (hi >= max) throw new Error(`no discretisation up to ${max} reaches ${tol}; last error ${eHi}`);
    lo = hi;
    hi = Math.min(max, hi * 2);
    eHi = await e(hi);
  }
  while (lo > 0 && hi - lo > Math.max(1, 0.03 * lo)) {
    const mid = Math.round((lo + hi) / 2);
    const em = await e(mid);
    if (em <= tol) { hi = mid; eHi = em; } else lo = mid;
  }
  return { n: hi, error: eHi, tried };
}

/** Best wall time of `reps` calls [s]. */
export async function bestOf(reps: number, f: () => unknown): Promise<number> {
  let best = Infinity;
  for (let r = 0; r < reps; r++) {
    const t0 = process.hrtime.bigint();
    await f();
    best = Math.min(best, Number(process.hrtime.bigint() - t0) * 1e-9);
  }
  return best;
}

/** Figures of the accuracy-for-cost comparison. */
export interface LadderBenchResult {
  tolerance: number;
  referenceDtS: number;
  /** The reference's final value (last sample) [V]. */
  referenceFinalV: number;
  ladder: { sections: number; dtS: number; stepFactor: number; steps: number; error: number; timeS: number; tried: Array<[number, number]> };
  skein: { cells: number; dtS: number; steps: number; error: number; timeS: number; tried: Array<[number, number]> };
  /** Ladder time over skein time. */
  ratio: number;
}

/**
 * Runs the comparison. Quick mode: a 0.2 km line (end 10 us) and one timed run each.
 */
export async function main(argv: string[]): Promise<LadderBenchResult> {
  const quick = argv.includes('--quick');
  const l: LineCase = quick ? { ...LINE, lengthM: 200, endS: 10e-6 } : LINE;
  const tol = 0.01;
  const refDt = 5e-9;
  const ref = await reference(l, refDt);
  const reps = quick ? 1 : 3;
  // The ladder's trapezoidal rule is stable at any step, so its step is searched too: for each
  // step of f section delays (f = 0.5, 1, 2), the coarsest passing section count; the cheapest
  // (sections x steps) wins. Measured: f = 4 and more cost more (the trapezoidal rule's phase
  // lag adds to the ladder's dispersion), and f = 0.5 and 1 cost about the same.
  let lad: { n: number; error: number; tried: Array<[number, number]>; factor: number } | undefined;
  const factors = quick ? [1, 2] : [1, 0.5, 2];
  for (const f of factors) {
    const dtOf = (n: number): number => (f * l.lengthM) / n / speed(l);
    const start = lad ? Math.max(16, 2 ** Math.floor(Math.log2(lad.n / 2))) : 16;
    const c = await coarsest(async (n) => relativeError(runLadder(l, buildLadder(l, n, dtOf(n))), ref), tol, start, 1 << 17);
    const cost = (n: number, g: number): number => n * (l.endS / ((g * l.lengthM) / n / speed(l)));
    process.stderr.write(`ladder, step ${f} section delays: ${c.tried.map(([n, e]) => `${n}:${e.toExponential(2)}`).join(' ')}\n`);
    if (!lad || cost(c.n, f) < cost(lad.n, lad.factor)) lad = { ...c, factor: f };
  }
  if (!lad) throw new Error('no ladder case');
  const ladDt = (lad.factor * l.lengthM) / lad.n / speed(l);
  const sk = await coarsest(async (n) => relativeError(await runSkein(l, n), ref), tol, 4, 1 << 15);
  process.stderr.write(`skein: ${sk.tried.map(([n, e]) => `${n}:${e.toExponential(2)}`).join(' ')}\n`);
  const ladT = await bestOf(reps, () => runLadder(l, buildLadder(l, lad.n, ladDt)));
  const skT = await bestOf(reps, () => runSkein(l, sk.n));
  const ld = buildLadder(l, lad.n, ladDt);
  const sdt = l.lengthM / sk.n / speed(l);
  const res: LadderBenchResult = {
    tolerance: tol, referenceDtS: refDt, referenceFinalV: ref.values[ref.values.length - 1],
    ladder: { sections: lad.n, dtS: ld.dtS, stepFactor: lad.factor, steps: ld.steps, error: lad.error, timeS: ladT, tried: lad.tried },
    skein: { cells: sk.n, dtS: sdt, steps: Math.round(l.endS / sdt), error: sk.error, timeS: skT, tried: sk.tried },
    ratio: ladT / skT,
  };
  console.log(`line ${l.lengthM} m, R ${l.R} ohm/m, L ${l.L} H/m, G ${l.G} S/m, C ${l.C} F/m; step rise ${l.riseS} s, ${l.sourceOhm} / ${l.loadOhm} ohm; tolerance ${tol * 100} % of the final value ${res.referenceFinalV.toFixed(4)} V`);
  console.log(`ladder: ${res.ladder.sections} sections, ${res.ladder.steps} steps (dt = ${res.ladder.stepFactor} section delays), error ${(res.ladder.error * 100).toFixed(3)} %, ${(res.ladder.timeS * 1e3).toFixed(2)} ms`);
  console.log(`skein:  ${res.skein.cells} cells, ${res.skein.steps} steps, error ${(res.skein.error * 100).toFixed(3)} %, ${(res.skein.timeS * 1e3).toFixed(2)} ms`);
  console.log(`ratio ladder / skein: ${res.ratio.toFixed(1)}`);
  const oi = argv.indexOf('--out');
  if (oi >= 0) writeFileSync(argv[oi + 1], JSON.stringify(res, null, 2));
  return res;
}

if (process.argv[1] && fileURLToPath(import.meta.url) === process.argv[1]) await main(process.argv.slice(2));
