/**
 * Vector fitting: rational approximation of a sampled frequency response,
 *
 *   f(s) ~ sum_k r_k / (s - p_k) + d + s e,   s = j omega,
 *
 * with real and complex-conjugate poles, after B. Gustavsen and A. Semlyen, "Rational
 * approximation of frequency domain responses by vector fitting", IEEE Trans. Power Delivery
 * 14(3), 1999, pp. 1052-1061, and the relaxed pole identification of B. Gustavsen, "Improving the
 * pole relocating properties of vector fitting", IEEE Trans. Power Delivery 21(3), 2006 (from
 * memory).
 *
 * Each iteration solves, in the least-squares sense and in real arithmetic (real and imaginary
 * parts stacked as rows), for the residues c of (sigma f) and c~ of sigma with the current poles a:
 *
 *   sum c_k phi_k(s) + d + s e - f(s) (sum c~_k phi_k(s) + d~) = 0     (relaxed, plus one row
 *                                                                      fixing the scale of sigma)
 *   sum c_k phi_k(s) + d + s e - f(s)  sum c~_k phi_k(s)       = f(s)  (classic, d~ = 1)
 *
 * where phi_k = 1/(s - a) for a real pole and, for a complex pair a, a*,
 * phi_k = 1/(s - a) + 1/(s - a*), phi_k+1 = j/(s - a) - j/(s - a*), so the residue of the pair is
 * c_k + j c_k+1 (real unknowns only). The zeros of sigma are the new poles: the eigenvalues of
 * A - b c~^T / d~ with A block diagonal ([a] for a real pole, [[a', a''], [-a'', a']] for a pair)
 * and b = 1 or (2, 0). Unstable poles are flipped into the left half-plane. With the last poles the
 * residues of f follow from one more linear least-squares solve. Columns are scaled to unit norm
 * before each solve (common practice, it only improves the conditioning).
 *
 * Passivity (see `enforceAdmittancePassivity`, `enforceBoundedMagnitude`) is checked on a dense
 * grid that extends one decade beyond the fitted band on each side, includes omega = 0, infinity,
 * and the imaginary parts of the poles, where a lightly damped pole would peak.
 */
import { EigenvalueDecomposition, Matrix, QrDecomposition } from 'ml-matrix';
import { badInput } from '../errors.ts';

/** A rational function sum r_k/(s - p_k) + d + s e. Complex poles come in pairs (p, p*) at consecutive indices, the one with Im p > 0 first. */
export interface RationalFunction {
  /** Real parts of the poles [1/s]; all < 0. */
  polesRe: Float64Array;
  /** Imaginary parts of the poles [rad/s]. */
  polesIm: Float64Array;
  /** Real parts of the residues [unit of f / s]. */
  residuesRe: Float64Array;
  /** Imaginary parts of the residues. */
  residuesIm: Float64Array;
  /** Constant term (the value at infinity when e = 0). */
  d: number;
  /** Coefficient of s [unit of f * s]. */
  e: number;
}

/** A rational fit with its error on the samples it was fitted to. */
export interface RationalFit extends RationalFunction {
  /** sqrt(mean(|f_fit - f|^2 / |f|^2)) over the samples. */
  rmsRelativeError: number;
  /** sqrt(mean(|f_fit - f|^2)) over the samples. */
  rmsError: number;
  /** max |f_fit - f| / |f| over the samples. */
  maxRelativeError: number;
  /** Number of pole-relocation iterations run. */
  iterations: number;
}

/** Options of vectorFit. */
export interface VectorFitOptions {
  /** Number of poles (a complex pair counts two). */
  nPoles: number;
  /** Pole-relocation iterations; default 10. */
  iterations?: number;
  /** Relaxed (Gustavsen 2006, default) or classic (1999) sigma normalisation. */
  relaxed?: boolean;
  /** 'none' (strictly proper, d = e = 0), 'constant' (d, default) or 'linear' (d and s e). */
  asymptote?: 'none' | 'constant' | 'linear';
  /** Starting poles: 'complex' (pairs -w/100 +- j w, the paper's choice, default) or 'real' (-w, log spaced). */
  startPoles?: 'complex' | 'real';
  /** Weight per sample (default 1: absolute error); 1/|f| gives a relative fit. */
  weights?: Float64Array;
}

interface PoleSet { re: number[]; im: number[] } // one entry per real pole or per pair (im > 0)

/**
 * Evaluates a rational function at s = j omega.
 * @param fn the function
 * @param omega angular frequency [rad/s]
 * @returns [re, im]
 * @example evaluateRational({ polesRe: Float64Array.of(-1), polesIm: Float64Array.of(0), residuesRe: Float64Array.of(1), residuesIm: Float64Array.of(0), d: 0, e: 0 }, 0) // [1, 0]
 */
export function evaluateRational(fn: RationalFunction, omega: number): [number, number] {
  let re = fn.d;
  let im = fn.e * omega;
  for (let k = 0; k < fn.polesRe.length; k++) {
    // r / (j w - p) = r (-(pr) - j (w - pi)) / (pr^2 + (w - pi)^2)
    const ar = -fn.polesRe[k];
    const ai = omega - fn.polesIm[k];
    const den = ar * ar + ai * ai;
    const rr = fn.residuesRe[k];
    const ri = fn.residuesIm[k];
    re += (rr * ar + ri * ai) / den;
    im += (ri * ar - rr * ai) / den;
  }
  return [re, im];
}

function startingPoles(nPoles: number, wMin: number, wMax: number, kind: 'complex' | 'real'): PoleSet {
  const ps: PoleSet = { re: [], im: [] };
  const lo = Math.log10(Math.max(wMin, wMax * 1e-12));
  const hi = Math.log10(wMax);
  if (kind === 'real') {
    for (let k = 0; k < nPoles; k++) {
      const w = 10 ** (nPoles === 1 ? (lo + hi) / 2 : lo + ((hi - lo) * k) / (nPoles - 1));
      ps.re.push(-w);
      ps.im.push(0);
    }
    return ps;
  }
  const nPairs = Math.floor(nPoles / 2);
  for (let k = 0; k < nPairs; k++) {
    const w = 10 ** (nPairs === 1 ? (lo + hi) / 2 : lo + ((hi - lo) * k) / (nPairs - 1));
    ps.re.push(-w / 100);
    ps.im.push(w);
  }
  if (nPoles % 2 === 1) {
    ps.re.push(-(10 ** ((lo + hi) / 2)));
    ps.im.push(0);
  }
  return ps;
}

/** Fills the basis columns phi for one frequency into (bre, bim) starting at col. */
function basisAt(ps: PoleSet, w: number, bre: Float64Array, bim: Float64Array): void {
  let c = 0;
  for (let k = 0; k < ps.re.length; k++) {
    const a = ps.re[k];
    const b = ps.im[k];
    if (b === 0) {
      const den = a * a + w * w;
      bre[c] = -a / den;
      bim[c] = -w / den;
      c += 1;
    } else {
      // 1/(jw - a - jb) and 1/(jw - a + jb)
      const d1 = a * a + (w - b) * (w - b);
      const d2 = a * a + (w + b) * (w + b);
      const p1r = -a / d1, p1i = -(w - b) / d1;
      const p2r = -a / d2, p2i = -(w + b) / d2;
      bre[c] = p1r + p2r;
      bim[c] = p1i + p2i;
      // j p1 - j p2 = j (p1 - p2)
      bre[c + 1] = -(p1i - p2i);
      bim[c + 1] = p1r - p2r;
      c += 2;
    }
  }
}

function lsSolve(A: Matrix, b: Matrix): Float64Array {
  const nc = A.columns;
  const scale = new Float64Array(nc);
  for (let j = 0; j < nc; j++) {
    let s = 0;
    for (let i = 0; i < A.rows; i++) s += A.get(i, j) ** 2;
    scale[j] = s > 0 ? 1 / Math.sqrt(s) : 1;
    for (let i = 0; i < A.rows; i++) A.set(i, j, A.get(i, j) * scale[j]);
  }
  const x = new QrDecomposition(A).solve(b);
  const out = new Float64Array(nc);
  for (let j = 0; j < nc; j++) out[j] = x.get(j, 0) * scale[j];
  return out;
}

function checkInput(omegas: Float64Array, fRe: Float64Array, fIm: Float64Array, o: VectorFitOptions): void {
  const ns = omegas.length;
  if (fRe.length !== ns || fIm.length !== ns) throw badInput(['vectorFit', 'f'], 'must have one value per frequency', `${fRe.length} and ${fIm.length} values for ${ns} frequencies`);
  if (!Number.isInteger(o.nPoles) || o.nPoles < 1) throw badInput(['vectorFit', 'nPoles'], 'must be a positive integer', o.nPoles);
  const nUnknown = 2 * o.nPoles + 2;
  if (2 * ns < nUnknown) throw badInput(['vectorFit', 'omegas'], `must have at least ${Math.ceil(nUnknown / 2)} samples for ${o.nPoles} poles`, ns);
  for (let i = 0; i < ns; i++) {
    if (!(omegas[i] >= 0) || !Number.isFinite(omegas[i])) throw badInput(['vectorFit', 'omegas', i], 'must be a finite angular frequency >= 0 rad/s', omegas[i]);
    if (!Number.isFinite(fRe[i]) || !Number.isFinite(fIm[i])) throw badInput(['vectorFit', 'f', i], 'must be finite', `${fRe[i]} + j${fIm[i]}`);
  }
  if (o.weights && o.weights.length !== ns) throw badInput(['vectorFit', 'weights'], 'must have one weight per frequency', o.weights.length);
}

/**
 * Fits f(j omega) sampled at omegas by a rational function with nPoles stable poles (vector
 * fitting, Gustavsen and Semlyen 1999).
 * @param omegas angular frequencies [rad/s], >= 0
 * @param fRe real parts of the samples
 * @param fIm imaginary parts of the samples
 * @param options number of poles, iterations (10), relaxed (true), asymptote ('constant'), startPoles ('complex'), weights (1)
 * @returns the fit with its rms and max errors on the samples
 * @throws InputError (E_INPUT) on mismatched lengths, non-finite samples, or too few samples for the poles
 * @example vectorFit(w, re, im, { nPoles: 8 }).rmsRelativeError // e.g. 1e-12 for a function with 8 poles
 */
export function vectorFit(omegas: Float64Array, fRe: Float64Array, fIm: Float64Array, options: VectorFitOptions): RationalFit {
  checkInput(omegas, fRe, fIm, options);
  const ns = omegas.length;
  const N = options.nPoles;
  const iters = options.iterations ?? 10;
  const relaxed = options.relaxed ?? true;
  const asym = options.asymptote ?? 'constant';
  const nD = asym === 'none' ? 0 : 1;
  const nE = asym === 'linear' ? 1 : 0;
  const wts = options.weights ?? new Float64Array(ns).fill(1);
  let wMin = Infinity, wMax = 0;
  for (let i = 0; i < ns; i++) {
    if (omegas[i] > 0) wMin = Math.min(wMin, omegas[i]);
    wMax = Math.max(wMax, omegas[i]);
  }
  if (!(wMax > 0)) throw badInput(['vectorFit', 'omegas'], 'must contain a positive frequency', 'all zero');
  let ps = startingPoles(N, wMin, wMax, options.startPoles ?? 'complex');
  const bre = new Float64Array(N);
  const bim = new Float64Array(N);

  for (let it = 0; it < iters; it++) {
    const nSig = N + (relaxed ? 1 : 0);
    const nc = N + nD + nE + nSig;
    const rows = 2 * ns + (relaxed ? 1 : 0);
    const A = new Matrix(rows, nc);
    const b = new Matrix(rows, 1);
    let fnorm = 0;
    const sigRow = new Float64Array(nSig);
    for (let i = 0; i < ns; i++) {
      const w = omegas[i];
      const g = wts[i];
      const fr = fRe[i], fi = fIm[i];
      fnorm += g * g * (fr * fr + fi * fi);
      basisAt(ps, w, bre, bim);
      const rr = 2 * i, ri = 2 * i + 1;
      for (let k = 0; k < N; k++) {
        A.set(rr, k, g * bre[k]);
        A.set(ri, k, g * bim[k]);
        // -f phi
        const pr = fr * bre[k] - fi * bim[k];
        const pi = fr * bim[k] + fi * bre[k];
        A.set(rr, N + nD + nE + k, -g * pr);
        A.set(ri, N + nD + nE + k, -g * pi);
        sigRow[k] += bre[k];
      }
      if (nD) A.set(rr, N, g);
      if (nE) A.set(ri, N + nD, g * w);
      if (relaxed) {
        A.set(rr, nc - 1, -g * fr);
        A.set(ri, nc - 1, -g * fi);
        sigRow[N] += 1;
      } else {
        b.set(rr, 0, g * fr);
        b.set(ri, 0, g * fi);
      }
    }
    if (relaxed) {
      const scale = Math.sqrt(fnorm) / ns;
      for (let k = 0; k < nSig; k++) A.set(2 * ns, N + nD + nE + k, scale * sigRow[k]);
      b.set(2 * ns, 0, scale * ns);
    }
    const x = lsSolve(A, b);
    const cs = x.subarray(N + nD + nE, N + nD + nE + N);
    let dt = relaxed ? x[nc - 1] : 1;
    if (Math.abs(dt) < 1e-8) dt = dt < 0 ? -1e-8 : 1e-8; // Gustavsen 2006: keep sigma's scale away from 0
    // Zeros of sigma: eig(A - b c~^T / d~).
    const M = new Matrix(N, N);
    const bv = new Float64Array(N);
    let c = 0;
    for (let k = 0; k < ps.re.length; k++) {
      if (ps.im[k] === 0) {
        M.set(c, c, ps.re[k]);
        bv[c] = 1;
        c += 1;
      } else {
        M.set(c, c, ps.re[k]);
        M.set(c + 1, c + 1, ps.re[k]);
        M.set(c, c + 1, ps.im[k]);
        M.set(c + 1, c, -ps.im[k]);
        bv[c] = 2;
        c += 2;
      }
    }
    for (let r = 0; r < N; r++) for (let q = 0; q < N; q++) M.set(r, q, M.get(r, q) - (bv[r] * cs[q]) / dt);
    const eig = new EigenvalueDecomposition(M, { assumeSymmetric: false });
    const er = eig.realEigenvalues;
    const ei = eig.imaginaryEigenvalues;
    const next: PoleSet = { re: [], im: [] };
    for (let k = 0; k < N; k++) {
      if (ei[k] < 0) continue;
      // Stability: flip unstable poles into the left half-plane (Gustavsen and Semlyen 1999, sec. 3).
      const re = er[k] > 0 ? -er[k] : er[k] === 0 ? -1e-12 * wMax : er[k];
      next.re.push(re);
      next.im.push(ei[k] > 0 ? ei[k] : 0);
    }
    ps = next;
  }
  return identifyResidues(omegas, fRe, fIm, ps, nD, nE, wts, iters);
}

function identifyResidues(omegas: Float64Array, fRe: Float64Array, fIm: Float64Array, ps: PoleSet, nD: number, nE: number, wts: Float64Array, iters: number): RationalFit {
  const ns = omegas.length;
  let N = 0;
  for (let k = 0; k < ps.re.length; k++) N += ps.im[k] === 0 ? 1 : 2;
  const bre = new Float64Array(N);
  const bim = new Float64Array(N);
  const nc = N + nD + nE;
  const A = new Matrix(2 * ns, nc);
  const b = new Matrix(2 * ns, 1);
  for (let i = 0; i < ns; i++) {
    const g = wts[i];
    basisAt(ps, omegas[i], bre, bim);
    for (let k = 0; k < N; k++) {
      A.set(2 * i, k, g * bre[k]);
      A.set(2 * i + 1, k, g * bim[k]);
    }
    if (nD) A.set(2 * i, N, g);
    if (nE) A.set(2 * i + 1, N + nD, g * omegas[i]);
    b.set(2 * i, 0, g * fRe[i]);
    b.set(2 * i + 1, 0, g * fIm[i]);
  }
  const x = lsSolve(A, b);
  const fit: RationalFunction = {
    polesRe: new Float64Array(N), polesIm: new Float64Array(N),
    residuesRe: new Float64Array(N), residuesIm: new Float64Array(N),
    d: nD ? x[N] : 0, e: nE ? x[N + nD] : 0,
  };
  let c = 0;
  for (let k = 0; k < ps.re.length; k++) {
    if (ps.im[k] === 0) {
      fit.polesRe[c] = ps.re[k];
      fit.residuesRe[c] = x[c];
      c += 1;
    } else {
      fit.polesRe[c] = ps.re[k]; fit.polesIm[c] = ps.im[k];
      fit.residuesRe[c] = x[c]; fit.residuesIm[c] = x[c + 1];
      fit.polesRe[c + 1] = ps.re[k]; fit.polesIm[c + 1] = -ps.im[k];
      fit.residuesRe[c + 1] = x[c]; fit.residuesIm[c + 1] = -x[c + 1];
      c += 2;
    }
  }
  return { ...fit, ...fitErrors(fit, omegas, fRe, fIm), iterations: iters };
}

/**
 * Errors of a rational function against samples.
 * @param fn the function
 * @param omegas angular frequencies [rad/s]
 * @param fRe real parts of the samples
 * @param fIm imaginary parts of the samples
 * @returns rms relative, rms absolute and max relative error
 * @example fitErrors(fit, w, re, im).rmsRelativeError // 3e-5
 */
export function fitErrors(fn: RationalFunction, omegas: Float64Array, fRe: Float64Array, fIm: Float64Array): { rmsRelativeError: number; rmsError: number; maxRelativeError: number } {
  let sRel = 0, sAbs = 0, mRel = 0;
  for (let i = 0; i < omegas.length; i++) {
    const [re, im] = evaluateRational(fn, omegas[i]);
    const e2 = (re - fRe[i]) ** 2 + (im - fIm[i]) ** 2;
    const m2 = fRe[i] ** 2 + fIm[i] ** 2;
    sAbs += e2;
    const rel = m2 > 0 ? e2 / m2 : e2;
    sRel += rel;
    mRel = Math.max(mRel, Math.sqrt(rel));
  }
  const n = Math.max(1, omegas.length);
  return { rmsRelativeError: Math.sqrt(sRel / n), rmsError: Math.sqrt(sAbs / n), maxRelativeError: mRel };
}

/**
 * The dense check grid: 0, logarithmic from wMin/10 to wMax*10 (pointsPerDecade), and the
 * imaginary parts of the poles.
 * @param fn the function whose poles are added
 * @param wMin lowest fitted angular frequency [rad/s]
 * @param wMax highest fitted angular frequency [rad/s]
 * @param pointsPerDecade default 200
 * @returns sorted angular frequencies [rad/s]
 * @example passivityGrid(fit, 2 * Math.PI * 1e3, 2 * Math.PI * 1e9).length // about 2200
 */
export function passivityGrid(fn: RationalFunction, wMin: number, wMax: number, pointsPerDecade = 200): Float64Array {
  const lo = Math.log10(Math.max(wMin, 1e-300) / 10);
  const hi = Math.log10(wMax * 10);
  const n = Math.max(2, Math.ceil((hi - lo) * pointsPerDecade) + 1);
  const out: number[] = [0];
  for (let i = 0; i < n; i++) out.push(10 ** (lo + ((hi - lo) * i) / (n - 1)));
  for (let k = 0; k < fn.polesIm.length; k++) if (fn.polesIm[k] > 0) out.push(fn.polesIm[k]);
  return Float64Array.from(out).sort();
}

/** Result of a passivity check and enforcement. */
export interface PassivityResult {
  /** The function after enforcement (a copy; the input is not changed). */
  fit: RationalFunction;
  /** Worst value before enforcement: min Re Y (admittance) or max |H| (transfer function). */
  worstBefore: number;
  /** Worst value after enforcement. */
  worstAfter: number;
  /** Whether the function had to be changed. */
  changed: boolean;
}

function copyFn(fn: RationalFunction): RationalFunction {
  return {
    polesRe: fn.polesRe.slice(), polesIm: fn.polesIm.slice(),
    residuesRe: fn.residuesRe.slice(), residuesIm: fn.residuesIm.slice(), d: fn.d, e: fn.e,
  };
}

/**
 * Passivity of a scalar admittance: Re Y(j omega) >= 0 at every frequency. Checked on
 * `passivityGrid` (and at infinity, Re Y = d). If violated, a constant conductance equal to the
 * worst violation (times 1 + margin) is added to d, which lifts Re Y uniformly at every frequency
 * and changes nothing else. This is the simplest perturbation of the published family (the
 * residue perturbation of B. Gustavsen and A. Semlyen, "Enforcing passivity for admittance
 * matrices approximated by rational functions", IEEE Trans. Power Systems 16(1), 2001, from
 * memory, perturbs residues instead and keeps the high-frequency value); for the characteristic
 * admittance of a line the violations of a good fit are a tiny fraction of Re Y and the shift is
 * negligible (it is reported).
 * @param fn fitted admittance [S]
 * @param wMin lowest fitted angular frequency [rad/s]
 * @param wMax highest fitted angular frequency [rad/s]
 * @param margin relative margin on the added conductance, default 1e-3
 * @returns the (possibly) corrected function and min Re Y before/after [S]
 * @example enforceAdmittancePassivity(ycFit, 2 * Math.PI, 2 * Math.PI * 1e9).worstAfter >= 0 // true
 */
export function enforceAdmittancePassivity(fn: RationalFunction, wMin: number, wMax: number, margin = 1e-3): PassivityResult {
  const grid = passivityGrid(fn, wMin, wMax);
  const minRe = (g: RationalFunction): number => {
    let m = g.d;
    for (let i = 0; i < grid.length; i++) m = Math.min(m, evaluateRational(g, grid[i])[0]);
    return m;
  };
  const before = minRe(fn);
  const out = copyFn(fn);
  if (before >= 0) return { fit: out, worstBefore: before, worstAfter: before, changed: false };
  out.d += -before * (1 + margin);
  return { fit: out, worstBefore: before, worstAfter: minRe(out), changed: true };
}

/**
 * Passivity of a propagation function: |H(j omega)| <= 1 at every frequency (a line section
 * cannot amplify a wave). Checked on `passivityGrid` and at infinity (|d|); if the maximum
 * exceeds 1, all residues and d are scaled by 1/max (1 + margin), common practice for the
 * propagation function of the universal line model.
 * @param fn fitted propagation function (dimensionless)
 * @param wMin lowest fitted angular frequency [rad/s]
 * @param wMax highest fitted angular frequency [rad/s]
 * @param margin relative margin, default 1e-9 (keeps max |H| <= 1 after rounding, changes nothing measurable)
 * @returns the (possibly) scaled function and max |H| before/after
 * @example enforceBoundedMagnitude(hFit, 2 * Math.PI, 2 * Math.PI * 1e9).worstAfter <= 1 // true
 */
export function enforceBoundedMagnitude(fn: RationalFunction, wMin: number, wMax: number, margin = 1e-9): PassivityResult {
  const grid = passivityGrid(fn, wMin, wMax);
  const maxAbs = (g: RationalFunction): number => {
    let m = Math.abs(g.d);
    for (let i = 0; i < grid.length; i++) {
      const [re, im] = evaluateRational(g, grid[i]);
      m = Math.max(m, Math.hypot(re, im));
    }
    return m;
  };
  const before = maxAbs(fn);
  const out = copyFn(fn);
  if (before <= 1) return { fit: out, worstBefore: before, worstAfter: before, changed: false };
  const k = 1 / (before * (1 + margin));
  for (let i = 0; i < out.residuesRe.length; i++) {
    out.residuesRe[i] *= k;
    out.residuesIm[i] *= k;
  }
  out.d *= k;
  out.e *= k;
  return { fit: out, worstBefore: before, worstAfter: maxAbs(out), changed: true };
}
