/**
 * Numerical 2D electrostatic solver for round wires with their own dielectric insulation, in a
 * bundle over a perfect ground plane or in free space.
 *
 * Method: Fourier-series (multipole) expansion of surface charge with point matching, after
 * J. C. Clements, C. R. Paul, A. T. Adams, "Computation of the capacitance matrix for systems of
 * dielectric-coated cylindrical conductors", IEEE Trans. EMC 17(4), 238-248, 1975 (from memory),
 * also described in C. R. Paul, Analysis of Multiconductor Transmission Lines, 2nd ed., ch. 5.
 *
 * - Every conductor surface r = a carries the total (free + bound) charge
 *   sigma(theta) = s0 + sum_k (c_k cos k theta + s_k sin k theta), k = 1..N.
 * - Every insulation surface r = b carries a bound charge with the same kind of expansion; with the
 *   bound charges in place all fields are computed in free space (eps0), and the ground plane by
 *   images (negated charge mirrored in y = 0).
 * - Conditions at 2N+1 equally spaced points on each circle: conductor potential = V_i; at each
 *   insulation surface continuity of normal D: er E_n(b-) = E_n(b+).
 * - The free charge on conductor i is er_i times its total charge (D = er eps0 E at the metal).
 *   C_ij = free charge on i with V_j = 1, others 0. In free space one wire is the reference, the
 *   free charges sum to zero and a constant potential is an extra unknown.
 * - L = mu0 eps0 C0^-1 with C0 the capacitance with every insulation removed (er = 1).
 * The error falls geometrically with N (the expansion of a smooth periodic charge).
 */
import { LuDecomposition, Matrix } from 'ml-matrix';
import { EPS0, MU0 } from './constants.ts';
import { invertSymmetric } from './closedForms.ts';

/** One wire of the bundle. */
export interface BundleWire {
  /** Horizontal position of the axis [m]. */
  x: number;
  /** Height of the axis above the ground plane (or vertical position in free space) [m]. */
  y: number;
  /** Conductor radius [m]. */
  radius: number;
  /** Insulation, if any: thickness [m] and relative permittivity [-]. */
  insulation?: { thickness: number; relPermittivity: number };
}

/** Solver input. */
export interface BundleInput {
  /** The wires. */
  wires: BundleWire[];
  /** 'perfect' ground plane at y = 0, or 'none' (free space; then referenceIndex is required). */
  ground: 'perfect' | 'none';
  /** For ground 'none': the wire that is the reference conductor. */
  referenceIndex?: number;
  /** Number of harmonics N per circle (2N+1 unknowns per circle), default 12. */
  harmonics?: number;
}

/** Solver result: n x n row-major matrices over the signal conductors (the reference removed). */
export interface BundleResult {
  /** Number of signal conductors. */
  n: number;
  /** Capacitance with the insulation [F/m]. */
  C: Float64Array;
  /** Capacitance with every insulation replaced by vacuum [F/m]. */
  C0: Float64Array;
  /** Inductance mu0 eps0 C0^-1 [H/m] (perfect conductors, currents on the surface). */
  L: Float64Array;
  /** Number of unknowns of the linear system solved. */
  unknowns: number;
}

interface Circle {
  cx: number;
  cy: number;
  R: number;
  wire: number;
  interface: boolean;
  er: number;
}

/**
 * Adds the potential (out[0]) and gradient (out[1], out[2]) at point (px, py) of mode m of a circle
 * with unit surface charge amplitude, eps0 = 1. `inside` selects the interior solution.
 * Mode indices: 0 uniform, 1..N cos k theta, N+1..2N sin k theta.
 */
function modeField(c: Circle, cy: number, m: number, N: number, px: number, py: number, inside: boolean, sign: number, sinSign: number, out: Float64Array): void {
  const zr = px - c.cx;
  const zi = py - cy;
  const R = c.R;
  if (m === 0) {
    if (inside) {
      out[0] = -R * Math.log(R) * sign;
      out[1] = 0;
      out[2] = 0;
      return;
    }
    const r2 = zr * zr + zi * zi;
    out[0] = -R * 0.5 * Math.log(r2) * sign;
    // F' = -R / z ; grad = conj(F')
    const fr = (-R * zr) / r2;
    const fi = (R * zi) / r2;
    out[1] = fr * sign;
    out[2] = -fi * sign;
    return;
  }
  const isSin = m > N;
  const k = isSin ? m - N : m;
  const s = isSin ? sign * sinSign : sign;
  let wr: number;
  let wi: number;
  if (inside) {
    wr = zr / R;
    wi = zi / R;
  } else {
    const d = zr * zr + zi * zi;
    wr = (R * zr) / d;
    wi = (-R * zi) / d;
  }
  // w^(k-1), w^k, w^(k+1)
  let pr = 1;
  let pi = 0;
  for (let i = 1; i < k; i++) {
    const t = pr * wr - pi * wi;
    pi = pr * wi + pi * wr;
    pr = t;
  }
  const kr = pr * wr - pi * wi;
  const ki = pr * wi + pi * wr;
  let Fr: number;
  let Fi: number;
  let Dr: number;
  let Di: number;
  if (inside) {
    Fr = (R / (2 * k)) * kr;
    Fi = (R / (2 * k)) * ki;
    Dr = 0.5 * pr;
    Di = 0.5 * pi;
  } else {
    Fr = (R / (2 * k)) * kr;
    Fi = (R / (2 * k)) * ki;
    const k1r = kr * wr - ki * wi;
    const k1i = kr * wi + ki * wr;
    Dr = -0.5 * k1r;
    Di = -0.5 * k1i;
  }
  if (isSin) {
    // outside: F = i * (...) ; inside: F = -i * (...)
    const f = inside ? -1 : 1;
    const tFr = -f * Fi;
    Fi = f * Fr;
    Fr = tFr;
    const tDr = -f * Di;
    Di = f * Dr;
    Dr = tDr;
  }
  out[0] = Fr * s;
  out[1] = Dr * s;
  out[2] = -Di * s;
}

/**
 * Solves the 2D electrostatic problem of insulated round wires (multipole point matching).
 *
 * @param input wires [m], ground, optional reference wire and harmonics N (default 12)
 * @returns C (with insulation), C0 (without), L = mu0 eps0 C0^-1, all n x n row-major
 * @throws Error when the linear system is singular (overlapping or degenerate geometry; validate first)
 * @example
 * solveInsulatedBundle({ wires: [{ x: 0, y: 10, radius: 5e-3 }], ground: 'perfect' }).C[0]
 * // 6.70752e-12 F/m (= 2 pi eps0 / acosh(h/r))
 */
export function solveInsulatedBundle(input: BundleInput): BundleResult {
  const N = input.harmonics ?? 12;
  const C = capacitance(input, N, true);
  const hasInsulation = input.wires.some((w) => w.insulation !== undefined && w.insulation.thickness > 0);
  const C0 = hasInsulation ? capacitance(input, N, false).C : C.C;
  const n = C.n;
  // Point matching leaves a tiny asymmetry (of the order of the discretisation error): symmetrise.
  const Cs = symmetrise(C.C, n);
  const C0s = hasInsulation ? symmetrise(C0, n) : Cs;
  const L = symmetrise(invertSymmetric(C0s, n).map((v) => v * MU0 * EPS0), n);
  return { n, C: Cs, C0: C0s, L, unknowns: C.unknowns };
}

function symmetrise(a: Float64Array, n: number): Float64Array {
  const out = new Float64Array(n * n);
  for (let i = 0; i < n; i++) for (let j = 0; j < n; j++) out[i * n + j] = 0.5 * (a[i * n + j] + a[j * n + i]);
  return out;
}

function capacitance(input: BundleInput, N: number, withInsulation: boolean): { n: number; C: Float64Array; unknowns: number } {
  const free = input.ground === 'none';
  const ref = free ? (input.referenceIndex ?? -1) : -1;
  if (free && (ref < 0 || ref >= input.wires.length)) throw new Error('bug: free-space bundle needs a valid referenceIndex');
  const circles: Circle[] = [];
  input.wires.forEach((w, i) => {
    const ins = withInsulation && w.insulation !== undefined && w.insulation.thickness > 0 ? w.insulation : undefined;
    circles.push({ cx: w.x, cy: w.y, R: w.radius, wire: i, interface: false, er: ins ? ins.relPermittivity : 1 });
    if (ins) circles.push({ cx: w.x, cy: w.y, R: w.radius + ins.thickness, wire: i, interface: true, er: ins.relPermittivity });
  });
  const M = 2 * N + 1;
  const nc = circles.length;
  const size = nc * M + (free ? 1 : 0);
  const A = new Matrix(size, size);
  const out = new Float64Array(3);
  const images = input.ground === 'perfect';
  for (let ci = 0; ci < nc; ci++) {
    const c = circles[ci];
    for (let p = 0; p < M; p++) {
      const th = (2 * Math.PI * p) / M;
      const ct = Math.cos(th);
      const st = Math.sin(th);
      const px = c.cx + c.R * ct;
      const py = c.cy + c.R * st;
      const row = ci * M + p;
      for (let sj = 0; sj < nc; sj++) {
        const s = circles[sj];
        const sameWire = s.wire === c.wire;
        // inside: the field point lies within the source circle (own wire, source radius larger)
        const inside = sameWire && s.R > c.R;
        for (let m = 0; m < M; m++) {
          const col = sj * M + m;
          modeField(s, s.cy, m, N, px, py, inside, 1, 1, out);
          let phi = out[0];
          let gx = out[1];
          let gy = out[2];
          if (images) {
            modeField(s, -s.cy, m, N, px, py, false, -1, -1, out);
            phi += out[0];
            gx += out[1];
            gy += out[2];
          }
          if (!c.interface) {
            A.set(row, col, phi);
          } else if (sj === ci) {
            // own interface sheet: (er E-) - (E+) of its own field plus (er - 1) E_n of its image
            let self: number;
            if (m === 0) self = -1;
            else if (m <= N) self = (-(c.er + 1) / 2) * Math.cos(m * th);
            else self = (-(c.er + 1) / 2) * Math.sin((m - N) * th);
            let img = 0;
            if (images) {
              modeField(s, -s.cy, m, N, px, py, false, -1, -1, out);
              img = -(out[1] * ct + out[2] * st);
            }
            A.set(row, col, self + (c.er - 1) * img);
          } else {
            const en = -(gx * ct + gy * st);
            A.set(row, col, (c.er - 1) * en);
          }
        }
      }
      if (free && !c.interface) A.set(row, size - 1, 1);
    }
  }
  if (free) {
    // sum of free charges = 0 : sum_i er_i * 2 pi a_i * s0_i
    for (let ci = 0; ci < nc; ci++) {
      const c = circles[ci];
      if (!c.interface) A.set(size - 1, ci * M, c.er * c.R);
    }
  }
  const signal = input.wires.map((_, i) => i).filter((i) => i !== ref);
  const n = signal.length;
  const B = new Matrix(size, n);
  for (let ci = 0; ci < nc; ci++) {
    const c = circles[ci];
    if (c.interface) continue;
    const col = signal.indexOf(c.wire);
    if (col < 0) continue;
    for (let p = 0; p < M; p++) B.set(ci * M + p, col, 1);
  }
  const lu = new LuDecomposition(A);
  if (lu.isSingular()) throw new Error('bug: singular bundle system (geometry should have been validated)');
  const X = lu.solve(B);
  const Cm = new Float64Array(n * n);
  for (let ci = 0; ci < nc; ci++) {
    const c = circles[ci];
    if (c.interface) continue;
    const i = signal.indexOf(c.wire);
    if (i < 0) continue;
    for (let j = 0; j < n; j++) Cm[i * n + j] = EPS0 * 2 * Math.PI * c.R * c.er * X.get(ci * M, j);
  }
  return { n, C: Cm, unknowns: size };
}
