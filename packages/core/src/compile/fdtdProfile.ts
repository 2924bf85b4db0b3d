/**
 * FDTD segments for lines whose parameters vary along their length (ResolvedLine.profile). The
 * leapfrog of compile/fdtd.ts on a grid of N cells of their own lengths dz_k, each with its own
 * per-unit-length L_k, R_k (series, at the cell) and C_k, G_k. Written in lumped form: cell k
 * carries L_k dz_k and R_k dz_k, node k the shunt elements of the half cells beside it,
 *   Cn_k = (C_{k-1} dz_{k-1} + C_k dz_k) / 2,  Gn_k likewise (one half cell at the two ends),
 * and the telegrapher's equations become, losses averaged over the two time levels (second order):
 *   (L_k dz_k / dt + R_k dz_k / 2) I_{k+1/2}^{n-1/2} = (L_k dz_k / dt - R_k dz_k / 2) I^{n-3/2} - (V_{k+1} - V_k)^{n-1}
 *   (Cn_k / dt + Gn_k / 2) V_k^n = (Cn_k / dt - Gn_k / 2) V_k^{n-1} - (I_{k+1/2} - I_{k-1/2})^{n-1/2}
 * (C. R. Paul, Analysis of Multiconductor Transmission Lines, 2nd ed., Wiley 2008, the FDTD
 * chapter, where the same lumped view handles non-uniform lines, from memory). With equal cells
 * this is compile/fdtd.ts's scheme. The end nodes are Norton branches as there, with
 * g = 2 Cn / dt + Gn and gm = 2 Cn / dt - Gn of each end's half cell.
 *
 * Cells: stretches share the line's N cells in proportion to their delays (length over the fastest
 * mode's speed), at least one each, so that the cells' delays are about equal and every stretch
 * boundary falls on a node; a taper gets N equal cells with L, C at each cell's centre. Stable
 * when dt <= dz_k / v_k in every cell (the Courant condition with the fastest cell, checked at
 * compile).
 */
import { Matrix, inverse } from 'ml-matrix';
import type { DocPath } from '../errors.ts';
import { fdtdStepVarying } from '../kernel/fdtdStepVarying.ts';
import { decomposeLine } from '../line/modal.ts';
import type { ResolvedLine } from '../model.ts';
import type { FdtdLine } from './fdtd.ts';

/** The cells of a varying line: lengths, per-unit-length matrices per cell, speeds. */
export interface CellProfile {
  n: number;
  cells: number;
  /** Cell lengths [m] and node positions from the from end [m] (N + 1). */
  dzM: Float64Array;
  zNodeM: Float64Array;
  /** Per-unit-length L [H/m], C [F/m], R [ohm/m], G [S/m] of each cell, n x n row-major at k n^2. */
  L: Float64Array;
  C: Float64Array;
  R: Float64Array;
  G: Float64Array;
  /** Fastest mode's speed in each cell [m/s]. */
  vMaxMps: Float64Array;
  /** The fastest cell: its delay dz / v [s], index, and where its parameters were given. */
  minDelayS: number;
  minCell: number;
  minWhere: DocPath;
}

/**
 * Shares `cells` among parts of the given delays: one each, the rest in proportion to the
 * delays by the largest remainder, so the counts sum to `cells` exactly.
 * @example shareCells([1, 3], 10) // [3, 7]
 */
export function shareCells(delays: ArrayLike<number>, cells: number): Int32Array {
  const m = delays.length;
  const out = new Int32Array(m).fill(1);
  let total = 0;
  for (let i = 0; i < m; i++) total += delays[i];
  const rest = cells - m;
  const frac: Array<[number, number]> = [];
  let given = 0;
  for (let i = 0; i < m; i++) {
    const share = (rest * delays[i]) / total;
    const whole = Math.floor(share);
    out[i] += whole;
    given += whole;
    frac.push([share - whole, i]);
  }
  frac.sort((a, b) => b[0] - a[0] || a[1] - b[1]);
  for (let j = 0; j < rest - given; j++) out[frac[j][1]] += 1;
  return out;
}

/**
 * The cells of a line with a profile.
 * @param cells N (at least one per stretch, checked at resolve).
 * @throws Error "bug:" when the line has no profile.
 * @example profileCells(line, 200).minDelayS // the Courant limit on dt [s]
 */
export function profileCells(l: ResolvedLine, cells: number): CellProfile {
  const prof = l.profile;
  if (!prof) throw new Error(`bug: line ${l.id} has no profile`);
  const n = l.conductors.length;
  const nn = n * n;
  const dzM = new Float64Array(cells);
  const L = new Float64Array(cells * nn);
  const C = new Float64Array(cells * nn);
  const R = new Float64Array(cells * nn);
  const G = new Float64Array(cells * nn);
  const vMaxMps = new Float64Array(cells);
  const where: DocPath[] = [];
  if (prof.kind === 'stretches') {
    const st = prof.stretches;
    const vmax = st.map((s) => (n === 1 ? 1 / Math.sqrt(s.L[0] * s.C[0]) : decomposeLine(s.L, s.C).velocities[0]));
    const counts = shareCells(st.map((s, i) => s.lengthM / vmax[i]), cells);
    let k = 0;
    st.forEach((s, i) => {
      for (let j = 0; j < counts[i]; j++, k++) {
        dzM[k] = s.lengthM / counts[i];
        L.set(s.L, k * nn);
        C.set(s.C, k * nn);
        R.set(s.R, k * nn);
        G.set(s.G, k * nn);
        vMaxMps[k] = vmax[i];
        where.push(s.path);
      }
    });
  } else {
    const t = prof.taper;
    const dz = l.lengthM / cells;
    for (let k = 0; k < cells; k++) {
      const x = (k + 0.5) / cells;
      const z = t.shape === 'exponential' ? t.fromOhm * Math.pow(t.toOhm / t.fromOhm, x) : t.fromOhm + (t.toOhm - t.fromOhm) * x;
      dzM[k] = dz;
      L[k] = z / t.velocityMps;
      C[k] = 1 / (z * t.velocityMps);
      R[k] = l.R[0];
      G[k] = l.G[0];
      vMaxMps[k] = t.velocityMps;
      where.push([...l.path, 'taper']);
    }
  }
  const zNodeM = new Float64Array(cells + 1);
  for (let k = 0; k < cells; k++) zNodeM[k + 1] = zNodeM[k] + dzM[k];
  zNodeM[cells] = l.lengthM;
  let minDelayS = Infinity;
  let minCell = 0;
  for (let k = 0; k < cells; k++) {
    const d = dzM[k] / vMaxMps[k];
    if (d < minDelayS) { minDelayS = d; minCell = k; }
  }
  return { n, cells, dzM, zNodeM, L, C, R, G, vMaxMps, minDelayS, minCell, minWhere: where[minCell] };
}

function block(a: Float64Array, off: number, n: number, scale: number): Matrix {
  const m = new Matrix(n, n);
  for (let i = 0; i < n; i++) for (let j = 0; j < n; j++) m.set(i, j, a[off + i * n + j] * scale);
  return m;
}

function put(out: Float64Array, off: number, m: Matrix): void {
  const n = m.rows;
  for (let i = 0; i < n; i++) for (let j = 0; j < n; j++) out[off + i * n + j] = m.get(i, j);
}

/**
 * Builds the FDTD segment of a line with a profile for time step dt [s]: per-cell and per-node
 * update matrices, lumped L, R per cell and C, G per node (for the ledger), the varying kernel.
 * @example createFdtdProfileLine(line, profileCells(line, 200), 1e-11, 0).step === fdtdStepVarying // true
 */
export function createFdtdProfileLine(l: ResolvedLine, p: CellProfile, dtS: number, slotBase: number): FdtdLine {
  const { n, cells } = p;
  const nn = n * n;
  const Ai = new Float64Array(cells * nn);
  const Bi = new Float64Array(cells * nn);
  const Av = new Float64Array((cells + 1) * nn);
  const Bv = new Float64Array((cells + 1) * nn);
  const Lc = new Float64Array(cells * nn);
  const Rc = new Float64Array(cells * nn);
  const Cn = new Float64Array((cells + 1) * nn);
  const Gn = new Float64Array((cells + 1) * nn);
  for (let k = 0; k < cells; k++) {
    const dz = p.dzM[k];
    for (let i = 0; i < nn; i++) {
      Lc[k * nn + i] = p.L[k * nn + i] * dz;
      Rc[k * nn + i] = p.R[k * nn + i] * dz;
      Cn[k * nn + i] += 0.5 * p.C[k * nn + i] * dz;
      Cn[(k + 1) * nn + i] += 0.5 * p.C[k * nn + i] * dz;
      Gn[k * nn + i] += 0.5 * p.G[k * nn + i] * dz;
      Gn[(k + 1) * nn + i] += 0.5 * p.G[k * nn + i] * dz;
    }
    const lp = block(Lc, k * nn, n, 1 / dtS).add(block(Rc, k * nn, n, 0.5));
    const lm = block(Lc, k * nn, n, 1 / dtS).sub(block(Rc, k * nn, n, 0.5));
    const lpi = inverse(lp);
    put(Ai, k * nn, lpi.mmul(lm));
    put(Bi, k * nn, lpi);
  }
  for (let k = 1; k < cells; k++) {
    const cp = block(Cn, k * nn, n, 1 / dtS).add(block(Gn, k * nn, n, 0.5));
    const cm = block(Cn, k * nn, n, 1 / dtS).sub(block(Gn, k * nn, n, 0.5));
    const cpi = inverse(cp);
    put(Av, k * nn, cpi.mmul(cm));
    put(Bv, k * nn, cpi);
  }
  const g = new Float64Array(2 * nn);
  const gm = new Float64Array(2 * nn);
  for (let e = 0; e < 2; e++) {
    const o = e === 0 ? 0 : cells * nn;
    for (let i = 0; i < nn; i++) {
      g[e * nn + i] = (2 * Cn[o + i]) / dtS + Gn[o + i];
      gm[e * nn + i] = (2 * Cn[o + i]) / dtS - Gn[o + i];
    }
  }
  return {
    line: l.index, n, cells, dzM: l.lengthM / cells,
    Av, Bv, Ai, Bi, g, gm,
    V: new Float64Array((cells + 1) * n),
    I: new Float64Array(cells * n),
    iEnd: new Float64Array(2 * n),
    hEnd: new Float64Array(2 * n),
    slotBase,
    xEnd: new Int32Array(2 * n).fill(-1),
    R: l.R, L: l.L, G: l.G, C: l.C,
    tmp: new Float64Array(n),
    lostJ: 0,
    step: fdtdStepVarying,
    lumped: { Lc, Rc, Cn, Gn },
    zNodeM: p.zNodeM,
  };
}
