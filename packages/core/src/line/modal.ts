/**
 * Modal decomposition of a lossless multiconductor line.
 *
 * With C = S S^T (Cholesky) the symmetric matrix S^T L S = U diag(lambda) U^T is diagonalised.
 * Then V = T_V V_m, I = T_I I_m with T_V = S^-T U and T_I = S U = T_V^-T diagonalise the line:
 * modal inductance diag(lambda), modal capacitance 1, so mode m travels at v_m = 1/sqrt(lambda_m)
 * with modal impedance Z_m = sqrt(lambda_m) (in scaled units; each mode is then rescaled, below). The characteristic impedance matrix is
 * Zc = T_V diag(Z_m) T_I^-1. This is the symmetric form of the decoupling given in C. R. Paul,
 * Analysis of Multiconductor Transmission Lines, 2nd ed., Wiley 2008, ch. 7 (from memory). It holds
 * for inhomogeneous media, where the modes travel at different speeds.
 */
import { CholeskyDecomposition, EigenvalueDecomposition, Matrix, inverse } from 'ml-matrix';

/** Modal data of one line; matrices are n x n row-major. */
export interface ModalLine {
  n: number;
  /** Modal velocities [m/s], fastest first. */
  velocities: Float64Array;
  /** Modal impedances [ohm]. */
  Zm: Float64Array;
  /** V = Tv Vm. */
  Tv: Float64Array;
  TvInv: Float64Array;
  /** I = Ti Im. */
  Ti: Float64Array;
  TiInv: Float64Array;
  /** Characteristic impedance and admittance matrices [ohm], [S]. */
  Zc: Float64Array;
  Yc: Float64Array;
}

// Symmetrised: L and C are symmetric to rounding (checked at resolution); the factorisations want it exact.
function toMatrix(a: Float64Array, n: number): Matrix {
  const m = new Matrix(n, n);
  for (let i = 0; i < n; i++) for (let j = 0; j < n; j++) m.set(i, j, 0.5 * (a[i * n + j] + a[j * n + i]));
  return m;
}

function toFlat(m: Matrix): Float64Array {
  const n = m.rows;
  const out = new Float64Array(n * m.columns);
  for (let i = 0; i < n; i++) for (let j = 0; j < m.columns; j++) out[i * m.columns + j] = m.get(i, j);
  return out;
}

/**
 * Decomposes a lossless line into its modes.
 * @param L inductance per metre [H/m], n x n row-major, symmetric positive definite.
 * @param C capacitance per metre [F/m], same shape.
 * @returns modal velocities, impedances, transforms and Zc / Yc.
 * @example decomposeLine(Float64Array.of(250e-9), Float64Array.of(100e-12)).Zm[0] // 50
 */
export function decomposeLine(L: Float64Array, C: Float64Array): ModalLine {
  const n = Math.round(Math.sqrt(L.length));
  if (n === 1) {
    // One conductor: the closed form, with transforms exactly 1 so that the one-conductor fast
    // path and the general kernel do the same arithmetic.
    const z = Math.sqrt(L[0] / C[0]);
    const one = Float64Array.of(1);
    return {
      n, velocities: Float64Array.of(1 / Math.sqrt(L[0] * C[0])), Zm: Float64Array.of(z),
      Tv: one, TvInv: one.slice(), Ti: one.slice(), TiInv: one.slice(), Zc: Float64Array.of(z), Yc: Float64Array.of(1 / z),
    };
  }
  const S = new CholeskyDecomposition(toMatrix(C, n)).lowerTriangularMatrix;
  const M = S.transpose().mmul(toMatrix(L, n)).mmul(S);
  // Symmetrise against rounding so the symmetric eigensolver applies.
  const Ms = M.add(M.transpose()).mul(0.5);
  const eig = new EigenvalueDecomposition(Ms, { assumeSymmetric: true });
  const lambda = eig.realEigenvalues;
  const U0 = eig.eigenvectorMatrix;
  const order = lambda.map((_, i) => i).sort((a, b) => lambda[a] - lambda[b]);
  const U = new Matrix(n, n);
  const lam = new Float64Array(n);
  order.forEach((src, dst) => {
    lam[dst] = lambda[src];
    for (let i = 0; i < n; i++) U.set(i, dst, U0.get(i, src));
  });
  for (let m = 0; m < n; m++) {
    if (!(lam[m] > 0)) throw new Error(`bug: modal eigenvalue ${lam[m]} is not positive for positive definite L and C`);
  }
  const Sinv = inverse(S);
  // Scale each mode so that its largest conductor voltage is +1: V_m' = d V_m, I_m' = I_m / d
  // keeps T_V^T T_I = 1 and makes the modal impedance d^2 sqrt(lambda) an impedance in ohms
  // (for one conductor, T_V = T_I = 1 and Z_m = sqrt(L / C)).
  const Tv0 = Sinv.transpose().mmul(U);
  const d = new Float64Array(n);
  for (let m = 0; m < n; m++) {
    let best = 0;
    for (let i = 0; i < n; i++) if (Math.abs(Tv0.get(i, m)) > Math.abs(best)) best = Tv0.get(i, m);
    d[m] = best;
  }
  const Dinv = Matrix.diag(Array.from(d, (x) => 1 / x));
  const Dm = Matrix.diag(Array.from(d));
  const Tv = Tv0.mmul(Dinv);
  const TvInv = Dm.mmul(U.transpose().mmul(S.transpose()));
  const Ti = S.mmul(U).mmul(Dm);
  const TiInv = Dinv.mmul(U.transpose().mmul(Sinv));
  const Zm = lam.map((x, m) => d[m] * d[m] * Math.sqrt(x));
  const velocities = lam.map((x) => 1 / Math.sqrt(x));
  const Dz = Matrix.diag(Array.from(Zm));
  const Dy = Matrix.diag(Array.from(Zm, (z) => 1 / z));
  const Zc = Tv.mmul(Dz).mmul(TiInv);
  const Yc = Ti.mmul(Dy).mmul(TvInv);
  return {
    n,
    velocities,
    Zm,
    Tv: toFlat(Tv),
    TvInv: toFlat(TvInv),
    Ti: toFlat(Ti),
    TiInv: toFlat(TiInv),
    Zc: toFlat(Zc.add(Zc.transpose()).mul(0.5)),
    Yc: toFlat(Yc.add(Yc.transpose()).mul(0.5)),
  };
}
