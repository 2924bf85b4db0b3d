/**
 * Dense inversion by Gauss-Jordan elimination with partial pivoting, in place and without
 * allocation, for re-factoring a junction during stepping (a switch changed state). ml-matrix
 * inverts at compile time; this loop exists because the step phase must not allocate. Tested
 * against ml-matrix's inverse.
 */

/**
 * Inverts the n x n row-major matrix held in a[off .. off + n*n) into out[outOff ..].
 * @param work scratch of at least 2 n^2 values.
 * @returns the smallest pivot magnitude relative to the largest entry (0 when singular).
 */
export function invertInPlace(n: number, a: Float64Array, off: number, out: Float64Array, outOff: number, work: Float64Array): number {
  const w = 2 * n;
  let maxAbs = 0;
  for (let i = 0; i < n; i++) {
    for (let j = 0; j < n; j++) {
      const v = a[off + i * n + j];
      work[i * w + j] = v;
      work[i * w + n + j] = i === j ? 1 : 0;
      if (Math.abs(v) > maxAbs) maxAbs = Math.abs(v);
    }
  }
  if (maxAbs === 0) return 0;
  let minPivot = Infinity;
  for (let c = 0; c < n; c++) {
    let piv = c;
    let best = Math.abs(work[c * w + c]);
    for (let r = c + 1; r < n; r++) {
      const v = Math.abs(work[r * w + c]);
      if (v > best) { best = v; piv = r; }
    }
    if (best / maxAbs < minPivot) minPivot = best / maxAbs;
    if (best === 0) return 0;
    if (piv !== c) {
      for (let j = 0; j < w; j++) {
        const t = work[c * w + j];
        work[c * w + j] = work[piv * w + j];
        work[piv * w + j] = t;
      }
    }
    const inv = 1 / work[c * w + c];
    for (let j = 0; j < w; j++) work[c * w + j] *= inv;
    for (let r = 0; r < n; r++) {
      if (r === c) continue;
      const fct = work[r * w + c];
      if (fct === 0) continue;
      for (let j = 0; j < w; j++) work[r * w + j] -= fct * work[c * w + j];
    }
  }
  for (let i = 0; i < n; i++) for (let j = 0; j < n; j++) out[outOff + i * n + j] = work[i * w + n + j];
  return minPivot;
}

/**
 * Solves the n x n system a x = b in place by Gaussian elimination with partial pivoting: `a`
 * (row-major at offset 0) is destroyed and `b` receives x. No allocation.
 * @returns the smallest pivot magnitude relative to the largest entry (0 when singular).
 */
export function solveInPlace(n: number, a: Float64Array, b: Float64Array): number {
  let maxAbs = 0;
  for (let i = 0; i < n * n; i++) if (Math.abs(a[i]) > maxAbs) maxAbs = Math.abs(a[i]);
  if (maxAbs === 0) return 0;
  let minPivot = Infinity;
  for (let c = 0; c < n; c++) {
    let piv = c;
    let best = Math.abs(a[c * n + c]);
    for (let r = c + 1; r < n; r++) {
      const v = Math.abs(a[r * n + c]);
      if (v > best) { best = v; piv = r; }
    }
    if (best === 0) return 0;
    if (best / maxAbs < minPivot) minPivot = best / maxAbs;
    if (piv !== c) {
      for (let k = 0; k < n; k++) {
        const t = a[c * n + k];
        a[c * n + k] = a[piv * n + k];
        a[piv * n + k] = t;
      }
      const t = b[c];
      b[c] = b[piv];
      b[piv] = t;
    }
    const inv = 1 / a[c * n + c];
    for (let r = c + 1; r < n; r++) {
      const f = a[r * n + c] * inv;
      if (f === 0) continue;
      for (let k = c; k < n; k++) a[r * n + k] -= f * a[c * n + k];
      b[r] -= f * b[c];
    }
  }
  for (let r = n - 1; r >= 0; r--) {
    let acc = b[r];
    for (let k = r + 1; k < n; k++) acc -= a[r * n + k] * b[k];
    b[r] = acc / a[r * n + r];
  }
  return minPivot;
}
