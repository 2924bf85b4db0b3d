/*
 * C twin of skein's junction stepping kernels, for the benchmark baseline.
 *
 * The seven loops below are line-for-line translations of
 *   packages/core/src/kernel/junctionStepScalar.ts         (one conductor)
 *   packages/core/src/kernel/junctionStep.ts               (general, any conductors)
 *   packages/core/src/kernel/junctionStepScalarBlocked.ts  (one conductor, nB steps per visit)
 *   packages/core/src/kernel/junctionStepBlocked.ts        (general, nB steps per visit)
 *   packages/core/src/kernel/junctionStepOneNodeBlocked.ts  (one conductor, one node, locals)
 *   packages/core/src/kernel/junctionStepFourNodeBlocked.ts (four nodes, locals, unrolled)
 *   packages/core/src/kernel/junctionStepOneNodeUnrolled.ts (one node, ports unrolled for 1..4)
 * over the same flat arrays, read from a file the TypeScript side writes (benchmarks/src/cTwin.ts
 * documents the format). Same operations in the same order; gcc may contract a*b+c into a fused
 * multiply-add (-ffp-contract=fast is GCC's default), so results agree to rounding, not bit for bit.
 *
 * Usage:
 *   kernel run IN OUT STEPS NB WARM FAST REPS
 *                         run the network in IN: WARM warm-up steps, then REPS times: state zeroed,
 *                         STEPS timed steps (the shortest time is reported)
 *                         with NB steps per junction visit (1: reference loop), FAST = 1 for the
 *                         unrolled one-node / four-node fast path (nB steps per visit, nB >= 1); write seconds,
 *                         checksum, final wave and x to OUT
 *   kernel stream N REPS  copy and triad over N doubles, print bytes/s as JSON
 */
#include <stdint.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>
#include <time.h>

typedef int32_t i32;

/* The empty asm with a memory clobber keeps gcc from moving the kernel's loads and stores (to
   malloc'ed arrays it can prove private) across the clock reads. */
static double now_s(void) {
  struct timespec t;
  __asm__ volatile("" ::: "memory");
  clock_gettime(CLOCK_MONOTONIC, &t);
  __asm__ volatile("" ::: "memory");
  return (double)t.tv_sec + 1e-9 * (double)t.tv_nsec;
}

static int junction_step_scalar(int j0, int j1, int n,
    const i32 *jPort, const i32 *jX, const i32 *jK, const i32 *jEx,
    const i32 *pIn, const i32 *pInMask, const i32 *pK, const double *pF, const i32 *pOut, const i32 *pOutMask,
    const i32 *pNode, const double *pY2,
    const i32 *exRow, const i32 *exSlot, const double *exCoef, const double *slot,
    const double *mat, double *wave, double *rhs, double *inc, double *x) {
  for (int j = j0; j < j1; j++) {
    const int p0 = jPort[j];
    const int p1 = jPort[j + 1];
    const int x0 = jX[j];
    const int R = jX[j + 1] - x0;
    for (int r = 0; r < R; r++) rhs[r] = 0;
    for (int q = p0; q < p1; q++) {
      const int mask = pInMask[q];
      const int base = pIn[q];
      const int i1 = n - pK[q];
      const double f = pF[q];
      const double w = (1 - f) * wave[base + (i1 & mask)] + f * wave[base + ((i1 - 1) & mask)];
      inc[q] = w;
      rhs[pNode[q]] += pY2[q] * w;
    }
    for (int e = jEx[j]; e < jEx[j + 1]; e++) rhs[exRow[e]] += exCoef[e] * slot[exSlot[e]];
    int k = jK[j];
    for (int r = 0; r < R; r++) {
      double acc = 0;
      for (int c = 0; c < R; c++) acc += mat[k + c] * rhs[c];
      x[x0 + r] = acc;
      k += R;
    }
    for (int q = p0; q < p1; q++) wave[pOut[q] + (n & pOutMask[q])] = x[x0 + pNode[q]] - inc[q];
  }
  return j1 - j0;
}

static int junction_step(int j0, int j1, int n,
    const i32 *jPort, const i32 *jX, const i32 *jN, const i32 *jB, const i32 *jK, const i32 *jA, const i32 *jEx,
    const i32 *pIn, const i32 *pInMask, const i32 *pK, const double *pF, const i32 *pOut, const i32 *pOutMask,
    const i32 *exRow, const i32 *exSlot, const double *exCoef, const double *slot,
    const double *mat, double *wave, double *rhs, double *inc, double *x) {
  for (int j = j0; j < j1; j++) {
    const int p0 = jPort[j];
    const int M = jPort[j + 1] - p0;
    const int x0 = jX[j];
    const int R = jX[j + 1] - x0;
    const int N = jN[j];
    for (int p = 0; p < M; p++) {
      const int q = p0 + p;
      const int mask = pInMask[q];
      const int base = pIn[q];
      const int i1 = n - pK[q];
      const double f = pF[q];
      inc[q] = (1 - f) * wave[base + (i1 & mask)] + f * wave[base + ((i1 - 1) & mask)];
    }
    int b = jB[j];
    for (int r = 0; r < R; r++) {
      double acc = 0;
      for (int p = 0; p < M; p++) acc += mat[b + p] * inc[p0 + p];
      rhs[r] = acc;
      b += M;
    }
    for (int e = jEx[j]; e < jEx[j + 1]; e++) rhs[exRow[e]] += exCoef[e] * slot[exSlot[e]];
    int k = jK[j];
    for (int r = 0; r < R; r++) {
      double acc = 0;
      for (int c = 0; c < R; c++) acc += mat[k + c] * rhs[c];
      x[x0 + r] = acc;
      k += R;
    }
    int a = jA[j];
    for (int p = 0; p < M; p++) {
      const int q = p0 + p;
      double acc = 0;
      for (int i = 0; i < N; i++) acc += mat[a + i] * x[x0 + i];
      a += N;
      wave[pOut[q] + (n & pOutMask[q])] = acc - inc[q];
    }
  }
  return j1 - j0;
}

static int junction_step_scalar_blocked(int j0, int j1, int n0, int nB,
    const i32 *jPort, const i32 *jX, const i32 *jK, const i32 *jEx,
    const i32 *pIn, const i32 *pInMask, const i32 *pK, const double *pF, const i32 *pOut, const i32 *pOutMask,
    const i32 *pNode, const double *pY2,
    const i32 *exRow, const i32 *exSlot, const double *exCoef, const double *slot, int slotStride, int slotOff,
    const double *mat, double *wave, double *rhs, double *inc, double *x, int xStride, int xOff) {
  const int n1 = n0 + nB;
  for (int j = j0; j < j1; j++) {
    const int p0 = jPort[j];
    const int p1 = jPort[j + 1];
    const int xj = jX[j];
    const int R = jX[j + 1] - xj;
    const int e0 = jEx[j];
    const int e1 = jEx[j + 1];
    const int k0 = jK[j];
    int sRow = slotOff;
    int xRow = xOff + xj;
    for (int n = n0; n < n1; n++) {
      for (int r = 0; r < R; r++) rhs[r] = 0;
      for (int q = p0; q < p1; q++) {
        const int mask = pInMask[q];
        const int base = pIn[q];
        const int i1 = n - pK[q];
        const double f = pF[q];
        const double w = (1 - f) * wave[base + (i1 & mask)] + f * wave[base + ((i1 - 1) & mask)];
        inc[q] = w;
        rhs[pNode[q]] += pY2[q] * w;
      }
      for (int e = e0; e < e1; e++) rhs[exRow[e]] += exCoef[e] * slot[sRow + exSlot[e]];
      int k = k0;
      for (int r = 0; r < R; r++) {
        double acc = 0;
        for (int c = 0; c < R; c++) acc += mat[k + c] * rhs[c];
        x[xRow + r] = acc;
        k += R;
      }
      for (int q = p0; q < p1; q++) wave[pOut[q] + (n & pOutMask[q])] = x[xRow + pNode[q]] - inc[q];
      sRow += slotStride;
      xRow += xStride;
    }
  }
  return (j1 - j0) * nB;
}

static int junction_step_blocked(int j0, int j1, int n0, int nB,
    const i32 *jPort, const i32 *jX, const i32 *jN, const i32 *jB, const i32 *jK, const i32 *jA, const i32 *jEx,
    const i32 *pIn, const i32 *pInMask, const i32 *pK, const double *pF, const i32 *pOut, const i32 *pOutMask,
    const i32 *exRow, const i32 *exSlot, const double *exCoef, const double *slot, int slotStride, int slotOff,
    const double *mat, double *wave, double *rhs, double *inc, double *x, int xStride, int xOff) {
  const int n1 = n0 + nB;
  for (int j = j0; j < j1; j++) {
    const int p0 = jPort[j];
    const int M = jPort[j + 1] - p0;
    const int xj = jX[j];
    const int R = jX[j + 1] - xj;
    const int N = jN[j];
    const int e0 = jEx[j];
    const int e1 = jEx[j + 1];
    int sRow = slotOff;
    int xRow = xOff + xj;
    for (int n = n0; n < n1; n++) {
      for (int p = 0; p < M; p++) {
        const int q = p0 + p;
        const int mask = pInMask[q];
        const int base = pIn[q];
        const int i1 = n - pK[q];
        const double f = pF[q];
        inc[q] = (1 - f) * wave[base + (i1 & mask)] + f * wave[base + ((i1 - 1) & mask)];
      }
      int b = jB[j];
      for (int r = 0; r < R; r++) {
        double acc = 0;
        for (int p = 0; p < M; p++) acc += mat[b + p] * inc[p0 + p];
        rhs[r] = acc;
        b += M;
      }
      for (int e = e0; e < e1; e++) rhs[exRow[e]] += exCoef[e] * slot[sRow + exSlot[e]];
      int k = jK[j];
      for (int r = 0; r < R; r++) {
        double acc = 0;
        for (int c = 0; c < R; c++) acc += mat[k + c] * rhs[c];
        x[xRow + r] = acc;
        k += R;
      }
      int a = jA[j];
      for (int p = 0; p < M; p++) {
        const int q = p0 + p;
        double acc = 0;
        for (int i = 0; i < N; i++) acc += mat[a + i] * x[xRow + i];
        a += N;
        wave[pOut[q] + (n & pOutMask[q])] = acc - inc[q];
      }
      sRow += slotStride;
      xRow += xStride;
    }
  }
  return (j1 - j0) * nB;
}

/* junctionStepOneNodeBlocked.ts: one node, no constraint row (R = 1). Kept as the twin of that
   file; the benchmark's fast path for one conductor is the unrolled loop below. */
__attribute__((unused))
static int junction_step_one_node_blocked(int j0, int j1, int n0, int nB,
    const i32 *jPort, const i32 *jX, const i32 *jK, const i32 *jEx,
    const i32 *pIn, const i32 *pInMask, const i32 *pK, const double *pF, const i32 *pOut, const i32 *pOutMask,
    const double *pY2,
    const i32 *exRow, const i32 *exSlot, const double *exCoef, const double *slot, int slotStride, int slotOff,
    const double *mat, double *wave, double *inc, double *x, int xStride, int xOff) {
  (void)exRow;
  const int n1 = n0 + nB;
  for (int j = j0; j < j1; j++) {
    const int p0 = jPort[j];
    const int p1 = jPort[j + 1];
    const int e0 = jEx[j];
    const int e1 = jEx[j + 1];
    const double K00 = mat[jK[j]];
    int sRow = slotOff;
    int xi = xOff + jX[j];
    for (int n = n0; n < n1; n++) {
      double r = 0;
      for (int q = p0; q < p1; q++) {
        const int mask = pInMask[q];
        const int base = pIn[q];
        const int i1 = n - pK[q];
        const double f = pF[q];
        const double w = (1 - f) * wave[base + (i1 & mask)] + f * wave[base + ((i1 - 1) & mask)];
        inc[q] = w;
        r += pY2[q] * w;
      }
      for (int e = e0; e < e1; e++) r += exCoef[e] * slot[sRow + exSlot[e]];
      const double xn = 0 + K00 * r;
      x[xi] = xn;
      for (int q = p0; q < p1; q++) wave[pOut[q] + (n & pOutMask[q])] = xn - inc[q];
      sRow += slotStride;
      xi += xStride;
    }
  }
  return (j1 - j0) * nB;
}

/* junctionStepFourNodeBlocked.ts: four nodes, no constraint row (R = N = 4). */
static int junction_step_four_node_blocked(int j0, int j1, int n0, int nB,
    const i32 *jPort, const i32 *jX, const i32 *jB, const i32 *jK, const i32 *jA, const i32 *jEx,
    const i32 *pIn, const i32 *pInMask, const i32 *pK, const double *pF, const i32 *pOut, const i32 *pOutMask,
    const i32 *exRow, const i32 *exSlot, const double *exCoef, const double *slot, int slotStride, int slotOff,
    const double *mat, double *wave, double *inc, double *x, int xStride, int xOff) {
  const int n1 = n0 + nB;
  for (int j = j0; j < j1; j++) {
    const int p0 = jPort[j];
    const int M = jPort[j + 1] - p0;
    const int e0 = jEx[j];
    const int e1 = jEx[j + 1];
    const int b0 = jB[j], b1 = b0 + M, b2 = b1 + M, b3 = b2 + M;
    const int a0 = jA[j];
    const int k = jK[j];
    const double K00 = mat[k], K01 = mat[k + 1], K02 = mat[k + 2], K03 = mat[k + 3];
    const double K10 = mat[k + 4], K11 = mat[k + 5], K12 = mat[k + 6], K13 = mat[k + 7];
    const double K20 = mat[k + 8], K21 = mat[k + 9], K22 = mat[k + 10], K23 = mat[k + 11];
    const double K30 = mat[k + 12], K31 = mat[k + 13], K32 = mat[k + 14], K33 = mat[k + 15];
    int sRow = slotOff;
    int xi = xOff + jX[j];
    for (int n = n0; n < n1; n++) {
      double r0 = 0, r1 = 0, r2 = 0, r3 = 0;
      for (int p = 0; p < M; p++) {
        const int q = p0 + p;
        const int mask = pInMask[q];
        const int base = pIn[q];
        const int i1 = n - pK[q];
        const double f = pF[q];
        const double w = (1 - f) * wave[base + (i1 & mask)] + f * wave[base + ((i1 - 1) & mask)];
        inc[q] = w;
        r0 += mat[b0 + p] * w;
        r1 += mat[b1 + p] * w;
        r2 += mat[b2 + p] * w;
        r3 += mat[b3 + p] * w;
      }
      for (int e = e0; e < e1; e++) {
        const double v = exCoef[e] * slot[sRow + exSlot[e]];
        const int row = exRow[e];
        if (row == 0) r0 += v;
        else if (row == 1) r1 += v;
        else if (row == 2) r2 += v;
        else r3 += v;
      }
      const double x0 = 0 + K00 * r0 + K01 * r1 + K02 * r2 + K03 * r3;
      const double x1 = 0 + K10 * r0 + K11 * r1 + K12 * r2 + K13 * r3;
      const double x2 = 0 + K20 * r0 + K21 * r1 + K22 * r2 + K23 * r3;
      const double x3 = 0 + K30 * r0 + K31 * r1 + K32 * r2 + K33 * r3;
      x[xi] = x0;
      x[xi + 1] = x1;
      x[xi + 2] = x2;
      x[xi + 3] = x3;
      int a = a0;
      for (int p = 0; p < M; p++) {
        const int q = p0 + p;
        const double u = 0 + mat[a] * x0 + mat[a + 1] * x1 + mat[a + 2] * x2 + mat[a + 3] * x3;
        a += 4;
        wave[pOut[q] + (n & pOutMask[q])] = u - inc[q];
      }
      sRow += slotStride;
      xi += xStride;
    }
  }
  return (j1 - j0) * nB;
}

/* junctionStepOneNodeUnrolled.ts: one node, port loop unrolled for 1..4 line ends. */
static int junction_step_one_node_unrolled(int j0, int j1, int n0, int nB,
    const i32 *jPort, const i32 *jX, const i32 *jK, const i32 *jEx,
    const i32 *pIn, const i32 *pInMask, const i32 *pK, const double *pF, const i32 *pOut, const i32 *pOutMask,
    const double *pY2,
    const i32 *exRow, const i32 *exSlot, const double *exCoef, const double *slot, int slotStride, int slotOff,
    const double *mat, double *wave, double *inc, double *x, int xStride, int xOff) {
  (void)exRow;
  const int n1 = n0 + nB;
  for (int j = j0; j < j1; j++) {
    const int p0 = jPort[j];
    const int p1 = jPort[j + 1];
    const int M = p1 - p0;
    const int e0 = jEx[j];
    const int e1 = jEx[j + 1];
    const double K00 = mat[jK[j]];
    if (M == 1) {
      const int bi0 = pIn[p0 + 0], mi0 = pInMask[p0 + 0], k0 = pK[p0 + 0], bo0 = pOut[p0 + 0], mo0 = pOutMask[p0 + 0];
      const double f0 = pF[p0 + 0], g0 = 1 - f0, y0 = pY2[p0 + 0];
      int sRow = slotOff;
      int xi = xOff + jX[j];
      double w0 = 0;
      for (int n = n0; n < n1; n++) {
        const int i0 = n - k0;
        w0 = g0 * wave[bi0 + (i0 & mi0)] + f0 * wave[bi0 + ((i0 - 1) & mi0)];
        double r = 0;
        r += y0 * w0;
        for (int e = e0; e < e1; e++) r += exCoef[e] * slot[sRow + exSlot[e]];
        const double xn = 0 + K00 * r;
        x[xi] = xn;
        wave[bo0 + (n & mo0)] = xn - w0;
        sRow += slotStride;
        xi += xStride;
      }
      if (n1 > n0) {
        inc[p0 + 0] = w0;
      }
    } else if (M == 2) {
      const int bi0 = pIn[p0 + 0], mi0 = pInMask[p0 + 0], k0 = pK[p0 + 0], bo0 = pOut[p0 + 0], mo0 = pOutMask[p0 + 0];
      const double f0 = pF[p0 + 0], g0 = 1 - f0, y0 = pY2[p0 + 0];
      const int bi1 = pIn[p0 + 1], mi1 = pInMask[p0 + 1], k1 = pK[p0 + 1], bo1 = pOut[p0 + 1], mo1 = pOutMask[p0 + 1];
      const double f1 = pF[p0 + 1], g1 = 1 - f1, y1 = pY2[p0 + 1];
      int sRow = slotOff;
      int xi = xOff + jX[j];
      double w0 = 0, w1 = 0;
      for (int n = n0; n < n1; n++) {
        const int i0 = n - k0;
        w0 = g0 * wave[bi0 + (i0 & mi0)] + f0 * wave[bi0 + ((i0 - 1) & mi0)];
        const int i1 = n - k1;
        w1 = g1 * wave[bi1 + (i1 & mi1)] + f1 * wave[bi1 + ((i1 - 1) & mi1)];
        double r = 0;
        r += y0 * w0;
        r += y1 * w1;
        for (int e = e0; e < e1; e++) r += exCoef[e] * slot[sRow + exSlot[e]];
        const double xn = 0 + K00 * r;
        x[xi] = xn;
        wave[bo0 + (n & mo0)] = xn - w0;
        wave[bo1 + (n & mo1)] = xn - w1;
        sRow += slotStride;
        xi += xStride;
      }
      if (n1 > n0) {
        inc[p0 + 0] = w0;
        inc[p0 + 1] = w1;
      }
    } else if (M == 3) {
      const int bi0 = pIn[p0 + 0], mi0 = pInMask[p0 + 0], k0 = pK[p0 + 0], bo0 = pOut[p0 + 0], mo0 = pOutMask[p0 + 0];
      const double f0 = pF[p0 + 0], g0 = 1 - f0, y0 = pY2[p0 + 0];
      const int bi1 = pIn[p0 + 1], mi1 = pInMask[p0 + 1], k1 = pK[p0 + 1], bo1 = pOut[p0 + 1], mo1 = pOutMask[p0 + 1];
      const double f1 = pF[p0 + 1], g1 = 1 - f1, y1 = pY2[p0 + 1];
      const int bi2 = pIn[p0 + 2], mi2 = pInMask[p0 + 2], k2 = pK[p0 + 2], bo2 = pOut[p0 + 2], mo2 = pOutMask[p0 + 2];
      const double f2 = pF[p0 + 2], g2 = 1 - f2, y2 = pY2[p0 + 2];
      int sRow = slotOff;
      int xi = xOff + jX[j];
      double w0 = 0, w1 = 0, w2 = 0;
      for (int n = n0; n < n1; n++) {
        const int i0 = n - k0;
        w0 = g0 * wave[bi0 + (i0 & mi0)] + f0 * wave[bi0 + ((i0 - 1) & mi0)];
        const int i1 = n - k1;
        w1 = g1 * wave[bi1 + (i1 & mi1)] + f1 * wave[bi1 + ((i1 - 1) & mi1)];
        const int i2 = n - k2;
        w2 = g2 * wave[bi2 + (i2 & mi2)] + f2 * wave[bi2 + ((i2 - 1) & mi2)];
        double r = 0;
        r += y0 * w0;
        r += y1 * w1;
        r += y2 * w2;
        for (int e = e0; e < e1; e++) r += exCoef[e] * slot[sRow + exSlot[e]];
        const double xn = 0 + K00 * r;
        x[xi] = xn;
        wave[bo0 + (n & mo0)] = xn - w0;
        wave[bo1 + (n & mo1)] = xn - w1;
        wave[bo2 + (n & mo2)] = xn - w2;
        sRow += slotStride;
        xi += xStride;
      }
      if (n1 > n0) {
        inc[p0 + 0] = w0;
        inc[p0 + 1] = w1;
        inc[p0 + 2] = w2;
      }
    } else if (M == 4) {
      const int bi0 = pIn[p0 + 0], mi0 = pInMask[p0 + 0], k0 = pK[p0 + 0], bo0 = pOut[p0 + 0], mo0 = pOutMask[p0 + 0];
      const double f0 = pF[p0 + 0], g0 = 1 - f0, y0 = pY2[p0 + 0];
      const int bi1 = pIn[p0 + 1], mi1 = pInMask[p0 + 1], k1 = pK[p0 + 1], bo1 = pOut[p0 + 1], mo1 = pOutMask[p0 + 1];
      const double f1 = pF[p0 + 1], g1 = 1 - f1, y1 = pY2[p0 + 1];
      const int bi2 = pIn[p0 + 2], mi2 = pInMask[p0 + 2], k2 = pK[p0 + 2], bo2 = pOut[p0 + 2], mo2 = pOutMask[p0 + 2];
      const double f2 = pF[p0 + 2], g2 = 1 - f2, y2 = pY2[p0 + 2];
      const int bi3 = pIn[p0 + 3], mi3 = pInMask[p0 + 3], k3 = pK[p0 + 3], bo3 = pOut[p0 + 3], mo3 = pOutMask[p0 + 3];
      const double f3 = pF[p0 + 3], g3 = 1 - f3, y3 = pY2[p0 + 3];
      int sRow = slotOff;
      int xi = xOff + jX[j];
      double w0 = 0, w1 = 0, w2 = 0, w3 = 0;
      for (int n = n0; n < n1; n++) {
        const int i0 = n - k0;
        w0 = g0 * wave[bi0 + (i0 & mi0)] + f0 * wave[bi0 + ((i0 - 1) & mi0)];
        const int i1 = n - k1;
        w1 = g1 * wave[bi1 + (i1 & mi1)] + f1 * wave[bi1 + ((i1 - 1) & mi1)];
        const int i2 = n - k2;
        w2 = g2 * wave[bi2 + (i2 & mi2)] + f2 * wave[bi2 + ((i2 - 1) & mi2)];
        const int i3 = n - k3;
        w3 = g3 * wave[bi3 + (i3 & mi3)] + f3 * wave[bi3 + ((i3 - 1) & mi3)];
        double r = 0;
        r += y0 * w0;
        r += y1 * w1;
        r += y2 * w2;
        r += y3 * w3;
        for (int e = e0; e < e1; e++) r += exCoef[e] * slot[sRow + exSlot[e]];
        const double xn = 0 + K00 * r;
        x[xi] = xn;
        wave[bo0 + (n & mo0)] = xn - w0;
        wave[bo1 + (n & mo1)] = xn - w1;
        wave[bo2 + (n & mo2)] = xn - w2;
        wave[bo3 + (n & mo3)] = xn - w3;
        sRow += slotStride;
        xi += xStride;
      }
      if (n1 > n0) {
        inc[p0 + 0] = w0;
        inc[p0 + 1] = w1;
        inc[p0 + 2] = w2;
        inc[p0 + 3] = w3;
      }
    } else {
      int sRow = slotOff;
      int xi = xOff + jX[j];
      for (int n = n0; n < n1; n++) {
        double r = 0;
        for (int q = p0; q < p1; q++) {
          const int mask = pInMask[q];
          const int base = pIn[q];
          const int i1 = n - pK[q];
          const double f = pF[q];
          const double w = (1 - f) * wave[base + (i1 & mask)] + f * wave[base + ((i1 - 1) & mask)];
          inc[q] = w;
          r += pY2[q] * w;
        }
        for (int e = e0; e < e1; e++) r += exCoef[e] * slot[sRow + exSlot[e]];
        const double xn = 0 + K00 * r;
        x[xi] = xn;
        for (int q = p0; q < p1; q++) wave[pOut[q] + (n & pOutMask[q])] = xn - inc[q];
        sRow += slotStride;
        xi += xStride;
      }
    }

  }
  return (j1 - j0) * nB;
}

/* ---- file input ---- */

enum { A_jPort, A_jX, A_jN, A_jB, A_jK, A_jA, A_jEx, A_pIn, A_pInMask, A_pK, A_pF, A_pOut, A_pOutMask, A_pNode, A_pY2,
       A_exRow, A_exSlot, A_exCoef, A_slot, A_mat, A_wave, A_rhs, A_inc, A_x, A_COUNT };
/* 1: float64, 0: int32, in the order above (benchmarks/src/cTwin.ts ARRAY_ORDER). */
static const int IS_F64[A_COUNT] = {0,0,0,0,0,0,0, 0,0,0,1,0,0,0,1, 0,0,1,1,1,1,1,1,1};

static void die(const char *what) {
  fprintf(stderr, "kernel: %s\n", what);
  exit(2);
}

static void read_exact(FILE *f, void *dst, size_t bytes) {
  if (bytes > 0 && fread(dst, 1, bytes, f) != bytes) die("input file is shorter than its header says");
}

static void write_exact(FILE *f, const void *src, size_t bytes) {
  if (bytes > 0 && fwrite(src, 1, bytes, f) != bytes) die("cannot write the output file");
}

static int run_case(const char *in, const char *out, int nSteps, int nB, int nWarm, int fast, int reps) {
  FILE *f = fopen(in, "rb");
  if (!f) die("cannot open the input file");
  i32 head[8];
  read_exact(f, head, sizeof head);
  if (head[0] != 0x424e4b53) die("input file does not start with the benchmark magic");
  const int kind = head[1];     /* 0 scalar, 1 general */
  const int nJ = head[2];
  i32 len[A_COUNT];
  read_exact(f, len, sizeof len);
  void *arr[A_COUNT];
  for (int a = 0; a < A_COUNT; a++) {
    size_t bytes = (size_t)len[a] * (IS_F64[a] ? 8 : 4);
    arr[a] = malloc(bytes > 0 ? bytes : 8);
    if (!arr[a]) die("out of memory");
    read_exact(f, arr[a], bytes);
  }
  fclose(f);
  const i32 *jPort = arr[A_jPort], *jX = arr[A_jX], *jN = arr[A_jN], *jB = arr[A_jB], *jK = arr[A_jK], *jA = arr[A_jA], *jEx = arr[A_jEx];
  const i32 *pIn = arr[A_pIn], *pInMask = arr[A_pInMask], *pK = arr[A_pK], *pOut = arr[A_pOut], *pOutMask = arr[A_pOutMask], *pNode = arr[A_pNode];
  const double *pF = arr[A_pF], *pY2 = arr[A_pY2], *exCoef = arr[A_exCoef], *mat = arr[A_mat];
  const i32 *exRow = arr[A_exRow], *exSlot = arr[A_exSlot];
  double *slot = arr[A_slot], *wave = arr[A_wave], *rhs = arr[A_rhs], *inc = arr[A_inc], *x = arr[A_x];
  /* Source values per step of a block: the slot row repeated nB times (sources are constant here). */
  const int nSlot = len[A_slot];
  double *slotRows = malloc((size_t)(nSlot > 0 ? nSlot : 1) * (size_t)nB * 8);
  for (int r = 0; r < nB; r++) memcpy(slotRows + (size_t)r * nSlot, slot, (size_t)nSlot * 8);

  double seconds = 1e300;
  for (int pass = 0; pass <= reps; pass++) {
    const int steps = pass == 0 ? nWarm : nSteps;
    memset(wave, 0, (size_t)len[A_wave] * 8);
    memset(inc, 0, (size_t)len[A_inc] * 8);
    memset(x, 0, (size_t)len[A_x] * 8);
    const double t0 = now_s();
    if (fast) {
      for (int n0 = 0; n0 < steps; n0 += nB) {
        const int b = steps - n0 < nB ? steps - n0 : nB;
        if (kind == 0) junction_step_one_node_unrolled(0, nJ, n0, b, jPort, jX, jK, jEx, pIn, pInMask, pK, pF, pOut, pOutMask, pY2, exRow, exSlot, exCoef, slotRows, nSlot, 0, mat, wave, inc, x, 0, 0);
        else junction_step_four_node_blocked(0, nJ, n0, b, jPort, jX, jB, jK, jA, jEx, pIn, pInMask, pK, pF, pOut, pOutMask, exRow, exSlot, exCoef, slotRows, nSlot, 0, mat, wave, inc, x, 0, 0);
      }
    } else if (nB <= 1) {
      for (int n = 0; n < steps; n++) {
        if (kind == 0) junction_step_scalar(0, nJ, n, jPort, jX, jK, jEx, pIn, pInMask, pK, pF, pOut, pOutMask, pNode, pY2, exRow, exSlot, exCoef, slot, mat, wave, rhs, inc, x);
        else junction_step(0, nJ, n, jPort, jX, jN, jB, jK, jA, jEx, pIn, pInMask, pK, pF, pOut, pOutMask, exRow, exSlot, exCoef, slot, mat, wave, rhs, inc, x);
      }
    } else {
      for (int n0 = 0; n0 < steps; n0 += nB) {
        const int b = steps - n0 < nB ? steps - n0 : nB;
        if (kind == 0) junction_step_scalar_blocked(0, nJ, n0, b, jPort, jX, jK, jEx, pIn, pInMask, pK, pF, pOut, pOutMask, pNode, pY2, exRow, exSlot, exCoef, slotRows, nSlot, 0, mat, wave, rhs, inc, x, 0, 0);
        else junction_step_blocked(0, nJ, n0, b, jPort, jX, jN, jB, jK, jA, jEx, pIn, pInMask, pK, pF, pOut, pOutMask, exRow, exSlot, exCoef, slotRows, nSlot, 0, mat, wave, rhs, inc, x, 0, 0);
      }
    }
    const double dt = now_s() - t0;
    if (pass > 0 && dt < seconds) seconds = dt;
  }
  double checksum = 0;
  for (int i = 0; i < len[A_x]; i++) checksum += x[i];
  FILE *o = fopen(out, "wb");
  if (!o) die("cannot open the output file");
  double headOut[2] = { seconds, checksum };
  write_exact(o, headOut, sizeof headOut);
  write_exact(o, wave, (size_t)len[A_wave] * 8);
  write_exact(o, x, (size_t)len[A_x] * 8);
  if (fclose(o) != 0) die("cannot close the output file");
  return 0;
}

/* ---- memory bandwidth probe (copy and triad over arrays much larger than the caches) ---- */

static int stream(long n, int reps) {
  double *a = malloc((size_t)n * 8), *b = malloc((size_t)n * 8), *c = malloc((size_t)n * 8);
  if (!a || !b || !c) die("out of memory");
  for (long i = 0; i < n; i++) { a[i] = 1.0; b[i] = 2.0; c[i] = 0.5; }
  double bestCopy = 1e30, bestTriad = 1e30;
  const double s = 3.0;
  for (int r = 0; r < reps; r++) {
    double t0 = now_s();
    for (long i = 0; i < n; i++) c[i] = a[i];
    double t1 = now_s();
    for (long i = 0; i < n; i++) a[i] = b[i] + s * c[i];
    double t2 = now_s();
    if (t1 - t0 < bestCopy) bestCopy = t1 - t0;
    if (t2 - t1 < bestTriad) bestTriad = t2 - t1;
  }
  double check = 0;
  for (long i = 0; i < n; i += 4096) check += a[i];
  /* Bytes counted as the loop's own reads and writes: copy 16 per element, triad 24. */
  printf("{\"copyBytesPerS\":%.6e,\"triadBytesPerS\":%.6e,\"check\":%.17g}\n", 16.0 * n / bestCopy, 24.0 * n / bestTriad, check);
  return 0;
}

int main(int argc, char **argv) {
  if (argc == 9 && strcmp(argv[1], "run") == 0) return run_case(argv[2], argv[3], atoi(argv[4]), atoi(argv[5]), atoi(argv[6]), atoi(argv[7]), atoi(argv[8]));
  if (argc == 4 && strcmp(argv[1], "stream") == 0) return stream(atol(argv[2]), atoi(argv[3]));
  fprintf(stderr, "usage: kernel run IN OUT STEPS NB WARM FAST REPS | kernel stream N REPS\n");
  return 2;
}
