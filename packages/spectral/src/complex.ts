/**
 * A small dense complex matrix module: what the frequency-domain solver needs and nothing more.
 * A matrix is n x n (or n x m) row-major in two Float64Arrays, real and imaginary parts.
 *
 * Methods: LU factorisation with partial pivoting (Golub & Van Loan, Matrix Computations, 4th ed.,
 * sec. 3.4); eigen-decomposition by Givens reduction to Hessenberg form and the shifted QR
 * algorithm with Wilkinson shifts (same book, sec. 7.4-7.5), eigenvectors by back-substitution on
 * the Schur form with the small-pivot guard of LAPACK's ztrevc (from memory).
 */
import { eigenNoConvergence, singularMatrix, spectralBug } from './errors.ts';

/** A dense complex matrix, rows x cols, row-major. */
export interface CMatrix {
  rows: number;
  cols: number;
  re: Float64Array;
  im: Float64Array;
}

/**
 * A zero matrix.
 * @param rows number of rows; @param cols number of columns (default rows).
 * @example cZeros(2).re // Float64Array [0, 0, 0, 0]
 */
export function cZeros(rows: number, cols = rows): CMatrix {
  return { rows, cols, re: new Float64Array(rows * cols), im: new Float64Array(rows * cols) };
}

/**
 * A complex matrix from real and imaginary row-major arrays (copied); im defaults to zero.
 * @example cFrom(1, 1, [2], [3]) // 2 + 3j
 */
export function cFrom(rows: number, cols: number, re: ArrayLike<number>, im?: ArrayLike<number>): CMatrix {
  const m = cZeros(rows, cols);
  for (let i = 0; i < rows * cols; i++) {
    m.re[i] = re[i];
    m.im[i] = im ? im[i] : 0;
  }
  return m;
}

/** The identity of size n. @example cIdentity(2).re // [1, 0, 0, 1] */
export function cIdentity(n: number): CMatrix {
  const m = cZeros(n);
  for (let i = 0; i < n; i++) m.re[i * n + i] = 1;
  return m;
}

/**
 * Product a b.
 * @throws SkeinError E_BUG when the shapes do not match.
 * @example cMul(cIdentity(2), x) // equals x
 */
export function cMul(a: CMatrix, b: CMatrix): CMatrix {
  if (a.cols !== b.rows) throw spectralBug(`cMul of ${a.rows}x${a.cols} by ${b.rows}x${b.cols}`);
  const out = cZeros(a.rows, b.cols);
  for (let i = 0; i < a.rows; i++) {
    for (let k = 0; k < a.cols; k++) {
      const ar = a.re[i * a.cols + k];
      const ai = a.im[i * a.cols + k];
      if (ar === 0 && ai === 0) continue;
      for (let j = 0; j < b.cols; j++) {
        const br = b.re[k * b.cols + j];
        const bi = b.im[k * b.cols + j];
        out.re[i * b.cols + j] += ar * br - ai * bi;
        out.im[i * b.cols + j] += ar * bi + ai * br;
      }
    }
  }
  return out;
}

/** LU factors of a square complex matrix with row pivoting: P a = L U, packed in one matrix. */
export interface CLu {
  n: number;
  lu: CMatrix;
  /** piv[i]: the original row now at row i. */
  piv: Int32Array;
}

/**
 * LU factorisation with partial pivoting (Golub & Van Loan 4th ed., alg. 3.4.1).
 * @param a square matrix (not modified).
 * @throws SkeinError E_SINGULAR (details.row) when a pivot is exactly zero.
 * @example cLuSolve(cLu(a), b) // x with a x = b
 */
export function cLu(a: CMatrix): CLu {
  const n = a.rows;
  const lu = cFrom(n, n, a.re, a.im);
  const piv = new Int32Array(n);
  for (let i = 0; i < n; i++) piv[i] = i;
  const { re, im } = lu;
  for (let k = 0; k < n; k++) {
    let p = k;
    let best = -1;
    for (let i = k; i < n; i++) {
      const m = Math.abs(re[i * n + k]) + Math.abs(im[i * n + k]);
      if (m > best) { best = m; p = i; }
    }
    if (best === 0) throw singularMatrix(k);
    if (p !== k) {
      for (let j = 0; j < n; j++) {
        let t = re[k * n + j]; re[k * n + j] = re[p * n + j]; re[p * n + j] = t;
        t = im[k * n + j]; im[k * n + j] = im[p * n + j]; im[p * n + j] = t;
      }
      const t = piv[k]; piv[k] = piv[p]; piv[p] = t;
    }
    const pr = re[k * n + k];
    const pi = im[k * n + k];
    const d = pr * pr + pi * pi;
    for (let i = k + 1; i < n; i++) {
      const xr = re[i * n + k];
      const xi = im[i * n + k];
      if (xr === 0 && xi === 0) continue;
      const lr = (xr * pr + xi * pi) / d;
      const li = (xi * pr - xr * pi) / d;
      re[i * n + k] = lr;
      im[i * n + k] = li;
      for (let j = k + 1; j < n; j++) {
        const ur = re[k * n + j];
        const ui = im[k * n + j];
        re[i * n + j] -= lr * ur - li * ui;
        im[i * n + j] -= lr * ui + li * ur;
      }
    }
  }
  return { n, lu, piv };
}

/**
 * Solves a x = b for the columns of b with the factors of cLu.
 * @param f factors; @param b n x m right-hand sides (not modified).
 * @returns x, n x m.
 */
export function cLuSolve(f: CLu, b: CMatrix): CMatrix {
  const { n, piv } = f;
  const { re, im } = f.lu;
  const m = b.cols;
  const x = cZeros(n, m);
  for (let i = 0; i < n; i++) {
    for (let j = 0; j < m; j++) {
      x.re[i * m + j] = b.re[piv[i] * m + j];
      x.im[i * m + j] = b.im[piv[i] * m + j];
    }
  }
  for (let j = 0; j < m; j++) {
    for (let i = 0; i < n; i++) {
      let sr = x.re[i * m + j];
      let si = x.im[i * m + j];
      for (let k = 0; k < i; k++) {
        const lr = re[i * n + k];
        const li = im[i * n + k];
        const yr = x.re[k * m + j];
        const yi = x.im[k * m + j];
        sr -= lr * yr - li * yi;
        si -= lr * yi + li * yr;
      }
      x.re[i * m + j] = sr;
      x.im[i * m + j] = si;
    }
    for (let i = n - 1; i >= 0; i--) {
      let sr = x.re[i * m + j];
      let si = x.im[i * m + j];
      for (let k = i + 1; k < n; k++) {
        const ur = re[i * n + k];
        const ui = im[i * n + k];
        const yr = x.re[k * m + j];
        const yi = x.im[k * m + j];
        sr -= ur * yr - ui * yi;
        si -= ur * yi + ui * yr;
      }
      const pr = re[i * n + i];
      const pi = im[i * n + i];
      const d = pr * pr + pi * pi;
      x.re[i * m + j] = (sr * pr + si * pi) / d;
      x.im[i * m + j] = (si * pr - sr * pi) / d;
    }
  }
  return x;
}

/**
 * Inverse of a square matrix.
 * @throws SkeinError E_SINGULAR when singular.
 * @example cInverse(cFrom(1, 1, [0], [2])) // -0.5j
 */
export function cInverse(a: CMatrix): CMatrix {
  return cLuSolve(cLu(a), cIdentity(a.rows));
}

/** Eigen-decomposition a = V diag(lambda) V^-1. */
export interface CEigen {
  /** Eigenvalues, real and imaginary parts. */
  valuesRe: Float64Array;
  valuesIm: Float64Array;
  /** Eigenvectors as columns, each of unit 2-norm. */
  vectors: CMatrix;
}

const EPS = 2.220446049250313e-16;

/** Givens rotation [c s; -conj(s) c] that maps (x, y) to (r, 0); written into g = [c, sRe, sIm]. */
function givens(xr: number, xi: number, yr: number, yi: number, g: Float64Array): void {
  const ax = Math.hypot(xr, xi);
  const norm = Math.hypot(ax, Math.hypot(yr, yi));
  if (norm === 0) { g[0] = 1; g[1] = 0; g[2] = 0; return; }
  if (ax === 0) { g[0] = 0; g[1] = 1; g[2] = 0; return; }
  g[0] = ax / norm;
  // s = (x / |x|) conj(y) / norm
  const ur = xr / ax;
  const ui = xi / ax;
  g[1] = (ur * yr + ui * yi) / norm;
  g[2] = (ui * yr - ur * yi) / norm;
}

/** Rows k, k+1 of h (columns c0..n-1) <- G [row k; row k+1]. */
function rotRows(h: CMatrix, k: number, c0: number, g: Float64Array): void {
  const n = h.cols;
  const [c, sr, si] = g;
  for (let j = c0; j < n; j++) {
    const ar = h.re[k * n + j], ai = h.im[k * n + j];
    const br = h.re[(k + 1) * n + j], bi = h.im[(k + 1) * n + j];
    h.re[k * n + j] = c * ar + sr * br - si * bi;
    h.im[k * n + j] = c * ai + sr * bi + si * br;
    // -conj(s) a + c b
    h.re[(k + 1) * n + j] = -(sr * ar + si * ai) + c * br;
    h.im[(k + 1) * n + j] = -(sr * ai - si * ar) + c * bi;
  }
}

/** Columns k, k+1 of h (rows 0..r1-1) <- [col k, col k+1] G^H. */
function rotCols(h: CMatrix, k: number, r1: number, g: Float64Array): void {
  const n = h.cols;
  const [c, sr, si] = g;
  for (let i = 0; i < r1; i++) {
    const ar = h.re[i * n + k], ai = h.im[i * n + k];
    const br = h.re[i * n + k + 1], bi = h.im[i * n + k + 1];
    // col k: c a + conj(s) b ; col k+1: -s a + c b
    h.re[i * n + k] = c * ar + sr * br + si * bi;
    h.im[i * n + k] = c * ai + sr * bi - si * br;
    h.re[i * n + k + 1] = -(sr * ar - si * ai) + c * br;
    h.im[i * n + k + 1] = -(sr * ai + si * ar) + c * bi;
  }
}

/**
 * Eigenvalues and eigenvectors of a general complex square matrix (Hessenberg reduction by Givens
 * rotations, shifted QR with Wilkinson shifts and deflation, back-substitution on the Schur form).
 * Meant for the small matrices of a line cross-section (n up to a few tens).
 * @param a square matrix (not modified).
 * @throws SkeinError E_EIGEN_NO_CONVERGENCE when QR does not converge in 60 n iterations per eigenvalue.
 * @example cEigen(cFrom(2, 2, [2, 1, 1, 2])).valuesRe // [3, 1] in some order
 */
export function cEigen(a: CMatrix): CEigen {
  const n = a.rows;
  const h = cFrom(n, n, a.re, a.im);
  const q = cIdentity(n);
  const g = new Float64Array(3);
  // Hessenberg form: zero h[i][j] for i > j + 1 with rotations on rows/cols (i-1, i).
  for (let j = 0; j < n - 2; j++) {
    for (let i = n - 1; i > j + 1; i--) {
      const yr = h.re[i * n + j], yi = h.im[i * n + j];
      if (yr === 0 && yi === 0) continue;
      givens(h.re[(i - 1) * n + j], h.im[(i - 1) * n + j], yr, yi, g);
      rotRows(h, i - 1, 0, g);
      rotCols(h, i - 1, n, g);
      rotCols(q, i - 1, n, g);
      h.re[i * n + j] = 0;
      h.im[i * n + j] = 0;
    }
  }
  let norm = 0;
  for (let i = 0; i < n * n; i++) norm = Math.max(norm, Math.hypot(h.re[i], h.im[i]));
  const rots = new Float64Array(3 * Math.max(1, n));
  let hi = n - 1;
  let iter = 0;
  let total = 0;
  while (hi > 0) {
    let l = hi;
    for (; l > 0; l--) {
      const s = Math.hypot(h.re[(l - 1) * n + l - 1], h.im[(l - 1) * n + l - 1]) + Math.hypot(h.re[l * n + l], h.im[l * n + l]);
      if (Math.hypot(h.re[l * n + l - 1], h.im[l * n + l - 1]) <= EPS * (s === 0 ? norm : s)) {
        h.re[l * n + l - 1] = 0;
        h.im[l * n + l - 1] = 0;
        break;
      }
    }
    if (l === hi) { hi--; iter = 0; continue; }
    iter++;
    total++;
    if (total > 60 * n * n) throw eigenNoConvergence(n);
    // Wilkinson shift: the eigenvalue of the trailing 2x2 nearer to its last diagonal entry.
    const ar = h.re[(hi - 1) * n + hi - 1], ai = h.im[(hi - 1) * n + hi - 1];
    const br = h.re[(hi - 1) * n + hi], bi = h.im[(hi - 1) * n + hi];
    const cr = h.re[hi * n + hi - 1], ci = h.im[hi * n + hi - 1];
    const dr = h.re[hi * n + hi], di = h.im[hi * n + hi];
    let mr: number;
    let mi: number;
    if (iter % 11 === 10) {
      // Exceptional shift against cycling.
      mr = dr + Math.hypot(cr, ci);
      mi = di;
    } else {
      const hr = (ar - dr) / 2, hiIm = (ai - di) / 2;
      const tr = hr * hr - hiIm * hiIm + (br * cr - bi * ci);
      const ti = 2 * hr * hiIm + (br * ci + bi * cr);
      const [sr, si] = csqrt(tr, ti);
      // mu = d + h -/+ sqrt(h^2 + b c), sign so that |h +- sqrt| is largest: mu = d - bc / (h + sign sqrt)
      let er = hr + sr, ei = hiIm + si;
      if (hr * sr + hiIm * si < 0) { er = hr - sr; ei = hiIm - si; }
      const bcr = br * cr - bi * ci, bci = br * ci + bi * cr;
      const den = er * er + ei * ei;
      if (den === 0) { mr = dr; mi = di; } else {
        mr = dr - (bcr * er + bci * ei) / den;
        mi = di - (bci * er - bcr * ei) / den;
      }
    }
    for (let k = l; k <= hi; k++) { h.re[k * n + k] -= mr; h.im[k * n + k] -= mi; }
    for (let k = l; k < hi; k++) {
      givens(h.re[k * n + k], h.im[k * n + k], h.re[(k + 1) * n + k], h.im[(k + 1) * n + k], g);
      rots.set(g, 3 * k);
      rotRows(h, k, k, g);
      h.re[(k + 1) * n + k] = 0;
      h.im[(k + 1) * n + k] = 0;
    }
    for (let k = l; k < hi; k++) {
      const gk = rots.subarray(3 * k, 3 * k + 3);
      rotCols(h, k, Math.min(k + 2, hi + 1), gk);
      rotCols(q, k, n, gk);
    }
    for (let k = l; k <= hi; k++) { h.re[k * n + k] += mr; h.im[k * n + k] += mi; }
  }
  const valuesRe = new Float64Array(n);
  const valuesIm = new Float64Array(n);
  for (let i = 0; i < n; i++) { valuesRe[i] = h.re[i * n + i]; valuesIm[i] = h.im[i * n + i]; }
  // Eigenvectors of the triangular Schur form, then back to the original basis.
  const x = cZeros(n);
  for (let k = 0; k < n; k++) {
    x.re[k * n + k] = 1;
    const lr = valuesRe[k], li = valuesIm[k];
    const smin = Math.max(EPS * Math.hypot(lr, li), EPS * norm, 1e-300);
    for (let j = k - 1; j >= 0; j--) {
      let sr = 0, si = 0;
      for (let m = j + 1; m <= k; m++) {
        const hr = h.re[j * n + m], hiv = h.im[j * n + m];
        const vr = x.re[m * n + k], vi = x.im[m * n + k];
        sr += hr * vr - hiv * vi;
        si += hr * vi + hiv * vr;
      }
      let dr = h.re[j * n + j] - lr, di = h.im[j * n + j] - li;
      if (Math.hypot(dr, di) < smin) { dr = smin; di = 0; }
      const d = dr * dr + di * di;
      x.re[j * n + k] = -(sr * dr + si * di) / d;
      x.im[j * n + k] = -(si * dr - sr * di) / d;
    }
  }
  const vectors = cMul(q, x);
  for (let k = 0; k < n; k++) {
    let s = 0;
    for (let i = 0; i < n; i++) s += vectors.re[i * n + k] ** 2 + vectors.im[i * n + k] ** 2;
    s = Math.sqrt(s);
    for (let i = 0; i < n; i++) { vectors.re[i * n + k] /= s; vectors.im[i * n + k] /= s; }
  }
  return { valuesRe, valuesIm, vectors };
}

/** Principal square root of x + j y as [re, im] (re >= 0). @example csqrt(-4, 0) // [0, 2] */
export function csqrt(x: number, y: number): [number, number] {
  if (x === 0 && y === 0) return [0, 0];
  const r = Math.hypot(x, y);
  if (x >= 0) {
    const t = Math.sqrt((r + x) / 2);
    return [t, y / (2 * t)];
  }
  const t = Math.sqrt((r - x) / 2);
  return [Math.abs(y) / (2 * t), y >= 0 ? t : -t];
}
