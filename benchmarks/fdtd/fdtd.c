/*
 * C twin of skein's FDTD segment kernels: fdtd_step is the general loop
 * (packages/core/src/kernel/fdtdStep.ts), fdtd_step1 .. fdtd_step4 the unrolled fast paths for
 * one to four conductors (kernel/fdtdStep1.ts .. fdtdStep4.ts, generated from the same template):
 * the same loops, the same flat row-major layout, the same update order. Built by fdtdBench.ts
 * with gcc -O3 -march=native.
 *
 * Usage: fdtd IN OUT STEPS REPS [general|unrolled]
 *   general (default): the general loop for every n; unrolled: fdtd_stepN for n = 1..4 (the
 *   kernel core picks for that n), the general loop otherwise.
 *   IN: float64 little-endian: n, cells, then Av, Bv, Ai, Bi, gm (n*n each), V ((cells+1)*n),
 *       I (cells*n), iEnd (2n).
 *   Runs STEPS steps from the input state REPS times (state reset outside the timer), prints the
 *   best time in seconds and the checksum, writes V, I, hEnd of the last repetition to OUT.
 */
#include <stdio.h>
#include <stdlib.h>
#include <string.h>
#include <time.h>

static long fdtd_step(int n, int cells, const double *Av, const double *Bv, const double *Ai,
                      const double *Bi, const double *gm, double *V, double *I, const double *iEnd,
                      double *hEnd, double *tmp) {
  for (int k = 0; k < cells; k++) {
    const int o = k * n;
    for (int a = 0; a < n; a++) {
      double acc = 0;
      for (int b = 0; b < n; b++) acc += Ai[a * n + b] * I[o + b] - Bi[a * n + b] * (V[o + n + b] - V[o + b]);
      tmp[a] = acc;
    }
    for (int a = 0; a < n; a++) I[o + a] = tmp[a];
  }
  for (int k = 1; k < cells; k++) {
    const int o = k * n;
    for (int a = 0; a < n; a++) {
      double acc = 0;
      for (int b = 0; b < n; b++) acc += Av[a * n + b] * V[o + b] - Bv[a * n + b] * (I[o + b] - I[o - n + b]);
      tmp[a] = acc;
    }
    for (int a = 0; a < n; a++) V[o + a] = tmp[a];
  }
  const int oN = cells * n;
  const int oI = (cells - 1) * n;
  for (int a = 0; a < n; a++) {
    double s0 = 0, sN = 0;
    for (int b = 0; b < n; b++) {
      s0 += gm[a * n + b] * V[b];
      sN += gm[a * n + b] * V[oN + b];
    }
    hEnd[a] = -(s0 + iEnd[a] - 2 * I[a]);
    hEnd[n + a] = -(sN + iEnd[n + a] + 2 * I[oI + a]);
  }
  return cells;
}

static long fdtd_step1(int cells, const double *Av, const double *Bv, const double *Ai,
                       const double *Bi, const double *gm, double *V, double *I, const double *iEnd,
                       double *hEnd) {
  const double ai00 = Ai[0];
  const double bi00 = Bi[0];
  const double av00 = Av[0];
  const double bv00 = Bv[0];
  // Cell 0: I_{1/2} from the end node V_0 (not updated here) and V_1.
  double v0 = V[0];
  double w0 = V[1];
  double d0 = w0 - v0;
  double i0 = I[0];
  double p0 = ai00 * i0 - bi00 * d0;
  I[0] = p0;
  v0 = w0;
  int o = 1;
  for (; o + 1 < cells; o += 2) {
    w0 = V[o + 1];
    const double w1 = V[o + 2];
    const double q0 = ai00 * I[o] - bi00 * (w0 - v0);
    const double q1 = ai00 * I[o + 1] - bi00 * (w1 - w0);
    I[o] = q0;
    I[o + 1] = q1;
    V[o] = av00 * v0 - bv00 * (q0 - p0);
    V[o + 1] = av00 * w0 - bv00 * (q1 - q0);
    v0 = w1;
    p0 = q1;
  }
  for (; o < cells; o++) {
    w0 = V[o + 1];
    d0 = w0 - v0;
    i0 = I[o];
    const double q0 = ai00 * i0 - bi00 * d0;
    I[o] = q0;
    d0 = q0 - p0;
    V[o] = av00 * v0 - bv00 * d0;
    v0 = w0;
    p0 = q0;
  }
  const int oN = cells * 1;
  const int oI = (cells - 1) * 1;
  for (int a = 0; a < 1; a++) {
    double s0 = 0, sN = 0;
    for (int b = 0; b < 1; b++) {
      s0 += gm[a * 1 + b] * V[b];
      sN += gm[a * 1 + b] * V[oN + b];
    }
    hEnd[a] = -(s0 + iEnd[a] - 2 * I[a]);
    hEnd[1 + a] = -(sN + iEnd[1 + a] + 2 * I[oI + a]);
  }
  return cells;
}

static long fdtd_step2(int cells, const double *Av, const double *Bv, const double *Ai,
                       const double *Bi, const double *gm, double *V, double *I, const double *iEnd,
                       double *hEnd) {
  const double ai00 = Ai[0], ai01 = Ai[1], ai10 = Ai[2], ai11 = Ai[3];
  const double bi00 = Bi[0], bi01 = Bi[1], bi10 = Bi[2], bi11 = Bi[3];
  const double av00 = Av[0], av01 = Av[1], av10 = Av[2], av11 = Av[3];
  const double bv00 = Bv[0], bv01 = Bv[1], bv10 = Bv[2], bv11 = Bv[3];
  // Cell 0: I_{1/2} from the end node V_0 (not updated here) and V_1.
  double v0 = V[0], v1 = V[1];
  double w0 = V[2], w1 = V[3];
  double d0 = w0 - v0, d1 = w1 - v1;
  double i0 = I[0], i1 = I[1];
  double p0 = ai00 * i0 - bi00 * d0 + (ai01 * i1 - bi01 * d1);
  double p1 = ai10 * i0 - bi10 * d0 + (ai11 * i1 - bi11 * d1);
  I[0] = p0; I[1] = p1;
  v0 = w0; v1 = w1;
  const int oEnd = cells * 2;
  for (int o = 2; o < oEnd; o += 2) {
    // Current of cell k from V_k, V_{k+1} at n-1 (v, w) ...
    w0 = V[o + 2]; w1 = V[o + 3];
    d0 = w0 - v0; d1 = w1 - v1;
    i0 = I[o]; i1 = I[o + 1];
    const double q0 = ai00 * i0 - bi00 * d0 + (ai01 * i1 - bi01 * d1);
    const double q1 = ai10 * i0 - bi10 * d0 + (ai11 * i1 - bi11 * d1);
    I[o] = q0; I[o + 1] = q1;
    // ... then node k from the new currents of cells k-1 (p) and k (q).
    d0 = q0 - p0; d1 = q1 - p1;
    V[o] = av00 * v0 - bv00 * d0 + (av01 * v1 - bv01 * d1);
    V[o + 1] = av10 * v0 - bv10 * d0 + (av11 * v1 - bv11 * d1);
    v0 = w0; v1 = w1;
    p0 = q0; p1 = q1;
  }
  const int oN = cells * 2;
  const int oI = (cells - 1) * 2;
  for (int a = 0; a < 2; a++) {
    double s0 = 0, sN = 0;
    for (int b = 0; b < 2; b++) {
      s0 += gm[a * 2 + b] * V[b];
      sN += gm[a * 2 + b] * V[oN + b];
    }
    hEnd[a] = -(s0 + iEnd[a] - 2 * I[a]);
    hEnd[2 + a] = -(sN + iEnd[2 + a] + 2 * I[oI + a]);
  }
  return cells;
}

static long fdtd_step3(int cells, const double *Av, const double *Bv, const double *Ai,
                       const double *Bi, const double *gm, double *V, double *I, const double *iEnd,
                       double *hEnd) {
  const double ai00 = Ai[0], ai01 = Ai[1], ai02 = Ai[2], ai10 = Ai[3], ai11 = Ai[4], ai12 = Ai[5], ai20 = Ai[6], ai21 = Ai[7], ai22 = Ai[8];
  const double bi00 = Bi[0], bi01 = Bi[1], bi02 = Bi[2], bi10 = Bi[3], bi11 = Bi[4], bi12 = Bi[5], bi20 = Bi[6], bi21 = Bi[7], bi22 = Bi[8];
  const double av00 = Av[0], av01 = Av[1], av02 = Av[2], av10 = Av[3], av11 = Av[4], av12 = Av[5], av20 = Av[6], av21 = Av[7], av22 = Av[8];
  const double bv00 = Bv[0], bv01 = Bv[1], bv02 = Bv[2], bv10 = Bv[3], bv11 = Bv[4], bv12 = Bv[5], bv20 = Bv[6], bv21 = Bv[7], bv22 = Bv[8];
  // Cell 0: I_{1/2} from the end node V_0 (not updated here) and V_1.
  double v0 = V[0], v1 = V[1], v2 = V[2];
  double w0 = V[3], w1 = V[4], w2 = V[5];
  double d0 = w0 - v0, d1 = w1 - v1, d2 = w2 - v2;
  double i0 = I[0], i1 = I[1], i2 = I[2];
  double p0 = ai00 * i0 - bi00 * d0 + (ai01 * i1 - bi01 * d1) + (ai02 * i2 - bi02 * d2);
  double p1 = ai10 * i0 - bi10 * d0 + (ai11 * i1 - bi11 * d1) + (ai12 * i2 - bi12 * d2);
  double p2 = ai20 * i0 - bi20 * d0 + (ai21 * i1 - bi21 * d1) + (ai22 * i2 - bi22 * d2);
  I[0] = p0; I[1] = p1; I[2] = p2;
  v0 = w0; v1 = w1; v2 = w2;
  const int oEnd = cells * 3;
  for (int o = 3; o < oEnd; o += 3) {
    // Current of cell k from V_k, V_{k+1} at n-1 (v, w) ...
    w0 = V[o + 3]; w1 = V[o + 4]; w2 = V[o + 5];
    d0 = w0 - v0; d1 = w1 - v1; d2 = w2 - v2;
    i0 = I[o]; i1 = I[o + 1]; i2 = I[o + 2];
    const double q0 = ai00 * i0 - bi00 * d0 + (ai01 * i1 - bi01 * d1) + (ai02 * i2 - bi02 * d2);
    const double q1 = ai10 * i0 - bi10 * d0 + (ai11 * i1 - bi11 * d1) + (ai12 * i2 - bi12 * d2);
    const double q2 = ai20 * i0 - bi20 * d0 + (ai21 * i1 - bi21 * d1) + (ai22 * i2 - bi22 * d2);
    I[o] = q0; I[o + 1] = q1; I[o + 2] = q2;
    // ... then node k from the new currents of cells k-1 (p) and k (q).
    d0 = q0 - p0; d1 = q1 - p1; d2 = q2 - p2;
    V[o] = av00 * v0 - bv00 * d0 + (av01 * v1 - bv01 * d1) + (av02 * v2 - bv02 * d2);
    V[o + 1] = av10 * v0 - bv10 * d0 + (av11 * v1 - bv11 * d1) + (av12 * v2 - bv12 * d2);
    V[o + 2] = av20 * v0 - bv20 * d0 + (av21 * v1 - bv21 * d1) + (av22 * v2 - bv22 * d2);
    v0 = w0; v1 = w1; v2 = w2;
    p0 = q0; p1 = q1; p2 = q2;
  }
  const int oN = cells * 3;
  const int oI = (cells - 1) * 3;
  for (int a = 0; a < 3; a++) {
    double s0 = 0, sN = 0;
    for (int b = 0; b < 3; b++) {
      s0 += gm[a * 3 + b] * V[b];
      sN += gm[a * 3 + b] * V[oN + b];
    }
    hEnd[a] = -(s0 + iEnd[a] - 2 * I[a]);
    hEnd[3 + a] = -(sN + iEnd[3 + a] + 2 * I[oI + a]);
  }
  return cells;
}

static long fdtd_step4(int cells, const double *Av, const double *Bv, const double *Ai,
                       const double *Bi, const double *gm, double *V, double *I, const double *iEnd,
                       double *hEnd) {
  const int oEnd = cells * 4;
  {
    const double ai00 = Ai[0], ai01 = Ai[1], ai02 = Ai[2], ai03 = Ai[3], ai10 = Ai[4], ai11 = Ai[5], ai12 = Ai[6], ai13 = Ai[7], ai20 = Ai[8], ai21 = Ai[9], ai22 = Ai[10], ai23 = Ai[11], ai30 = Ai[12], ai31 = Ai[13], ai32 = Ai[14], ai33 = Ai[15];
    const double bi00 = Bi[0], bi01 = Bi[1], bi02 = Bi[2], bi03 = Bi[3], bi10 = Bi[4], bi11 = Bi[5], bi12 = Bi[6], bi13 = Bi[7], bi20 = Bi[8], bi21 = Bi[9], bi22 = Bi[10], bi23 = Bi[11], bi30 = Bi[12], bi31 = Bi[13], bi32 = Bi[14], bi33 = Bi[15];
    // Currents of cells 0..N-1 from V_k, V_{k+1} at n-1.
    for (int o = 0; o < oEnd; o += 4) {
      const double d0 = V[o + 4] - V[o], d1 = V[o + 5] - V[o + 1], d2 = V[o + 6] - V[o + 2], d3 = V[o + 7] - V[o + 3];
      const double i0 = I[o], i1 = I[o + 1], i2 = I[o + 2], i3 = I[o + 3];
      I[o] = ai00 * i0 - bi00 * d0 + (ai01 * i1 - bi01 * d1) + (ai02 * i2 - bi02 * d2) + (ai03 * i3 - bi03 * d3);
      I[o + 1] = ai10 * i0 - bi10 * d0 + (ai11 * i1 - bi11 * d1) + (ai12 * i2 - bi12 * d2) + (ai13 * i3 - bi13 * d3);
      I[o + 2] = ai20 * i0 - bi20 * d0 + (ai21 * i1 - bi21 * d1) + (ai22 * i2 - bi22 * d2) + (ai23 * i3 - bi23 * d3);
      I[o + 3] = ai30 * i0 - bi30 * d0 + (ai31 * i1 - bi31 * d1) + (ai32 * i2 - bi32 * d2) + (ai33 * i3 - bi33 * d3);
    }
  }
  {
    const double av00 = Av[0], av01 = Av[1], av02 = Av[2], av03 = Av[3], av10 = Av[4], av11 = Av[5], av12 = Av[6], av13 = Av[7], av20 = Av[8], av21 = Av[9], av22 = Av[10], av23 = Av[11], av30 = Av[12], av31 = Av[13], av32 = Av[14], av33 = Av[15];
    const double bv00 = Bv[0], bv01 = Bv[1], bv02 = Bv[2], bv03 = Bv[3], bv10 = Bv[4], bv11 = Bv[5], bv12 = Bv[6], bv13 = Bv[7], bv20 = Bv[8], bv21 = Bv[9], bv22 = Bv[10], bv23 = Bv[11], bv30 = Bv[12], bv31 = Bv[13], bv32 = Bv[14], bv33 = Bv[15];
    // Interior voltages of nodes 1..N-1 from the new currents.
    for (int o = 4; o < oEnd; o += 4) {
      const double d0 = I[o] - I[o - 4], d1 = I[o + 1] - I[o - 3], d2 = I[o + 2] - I[o - 2], d3 = I[o + 3] - I[o - 1];
      const double v0 = V[o], v1 = V[o + 1], v2 = V[o + 2], v3 = V[o + 3];
      V[o] = av00 * v0 - bv00 * d0 + (av01 * v1 - bv01 * d1) + (av02 * v2 - bv02 * d2) + (av03 * v3 - bv03 * d3);
      V[o + 1] = av10 * v0 - bv10 * d0 + (av11 * v1 - bv11 * d1) + (av12 * v2 - bv12 * d2) + (av13 * v3 - bv13 * d3);
      V[o + 2] = av20 * v0 - bv20 * d0 + (av21 * v1 - bv21 * d1) + (av22 * v2 - bv22 * d2) + (av23 * v3 - bv23 * d3);
      V[o + 3] = av30 * v0 - bv30 * d0 + (av31 * v1 - bv31 * d1) + (av32 * v2 - bv32 * d2) + (av33 * v3 - bv33 * d3);
    }
  }
  const int oN = cells * 4;
  const int oI = (cells - 1) * 4;
  for (int a = 0; a < 4; a++) {
    double s0 = 0, sN = 0;
    for (int b = 0; b < 4; b++) {
      s0 += gm[a * 4 + b] * V[b];
      sN += gm[a * 4 + b] * V[oN + b];
    }
    hEnd[a] = -(s0 + iEnd[a] - 2 * I[a]);
    hEnd[4 + a] = -(sN + iEnd[4 + a] + 2 * I[oI + a]);
  }
  return cells;
}

static double *slurp(FILE *f, size_t count) {
  double *p = malloc(count * sizeof(double));
  if (!p || fread(p, sizeof(double), count, f) != count) { fprintf(stderr, "fdtd: short input\n"); exit(2); }
  return p;
}

int main(int argc, char **argv) {
  if (argc != 5 && argc != 6) { fprintf(stderr, "usage: fdtd IN OUT STEPS REPS [general|unrolled]\n"); return 2; }
  const int unrolled = argc == 6 && strcmp(argv[5], "unrolled") == 0;
  if (argc == 6 && !unrolled && strcmp(argv[5], "general") != 0) { fprintf(stderr, "fdtd: kernel must be general or unrolled\n"); return 2; }
  FILE *f = fopen(argv[1], "rb");
  if (!f) { perror(argv[1]); return 2; }
  double head[2];
  if (fread(head, sizeof(double), 2, f) != 2) { fprintf(stderr, "fdtd: short input\n"); return 2; }
  const int n = (int)head[0], cells = (int)head[1];
  const long steps = atol(argv[3]);
  const int reps = atoi(argv[4]);
  const size_t nn = (size_t)n * n, nv = (size_t)(cells + 1) * n, ni = (size_t)cells * n;
  double *Av = slurp(f, nn), *Bv = slurp(f, nn), *Ai = slurp(f, nn), *Bi = slurp(f, nn), *gm = slurp(f, nn);
  double *V0 = slurp(f, nv), *I0 = slurp(f, ni), *iEnd = slurp(f, 2 * n);
  fclose(f);
  double *V = malloc(nv * sizeof(double)), *I = malloc(ni * sizeof(double));
  double *hEnd = calloc(2 * n, sizeof(double)), *tmp = calloc(n, sizeof(double));
  double best = 1e300;
  long updated = 0;
  for (int r = 0; r < reps; r++) {
    memcpy(V, V0, nv * sizeof(double));
    memcpy(I, I0, ni * sizeof(double));
    struct timespec t0, t1;
    clock_gettime(CLOCK_MONOTONIC, &t0);
    updated = 0;
    const int kind = unrolled && n >= 1 && n <= 4 ? n : 0;
    for (long s = 0; s < steps; s++) {
      switch (kind) {
        case 1: updated += fdtd_step1(cells, Av, Bv, Ai, Bi, gm, V, I, iEnd, hEnd); break;
        case 2: updated += fdtd_step2(cells, Av, Bv, Ai, Bi, gm, V, I, iEnd, hEnd); break;
        case 3: updated += fdtd_step3(cells, Av, Bv, Ai, Bi, gm, V, I, iEnd, hEnd); break;
        case 4: updated += fdtd_step4(cells, Av, Bv, Ai, Bi, gm, V, I, iEnd, hEnd); break;
        default: updated += fdtd_step(n, cells, Av, Bv, Ai, Bi, gm, V, I, iEnd, hEnd, tmp);
      }
    }
    clock_gettime(CLOCK_MONOTONIC, &t1);
    const double dt = (double)(t1.tv_sec - t0.tv_sec) + 1e-9 * (double)(t1.tv_nsec - t0.tv_nsec);
    if (dt < best) best = dt;
  }
  double sum = 0;
  for (size_t i = 0; i < nv; i++) sum += V[i];
  for (size_t i = 0; i < ni; i++) sum += I[i];
  for (int i = 0; i < 2 * n; i++) sum += hEnd[i];
  printf("%.9e %.17g %ld\n", best, sum, updated);
  FILE *o = fopen(argv[2], "wb");
  if (!o) { perror(argv[2]); return 2; }
  fwrite(V, sizeof(double), nv, o);
  fwrite(I, sizeof(double), ni, o);
  fwrite(hEnd, sizeof(double), 2 * n, o);
  fclose(o);
  return 0;
}
