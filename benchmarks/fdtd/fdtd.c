/*
 * C twin of skein's FDTD segment kernel (packages/core/src/kernel/fdtdStep.ts): the same loops,
 * the same flat row-major layout, the same update order. Built by fdtdBench.ts with
 * gcc -O3 -march=native.
 *
 * Usage: fdtd IN OUT STEPS REPS
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

static double *slurp(FILE *f, size_t count) {
  double *p = malloc(count * sizeof(double));
  if (!p || fread(p, sizeof(double), count, f) != count) { fprintf(stderr, "fdtd: short input\n"); exit(2); }
  return p;
}

int main(int argc, char **argv) {
  if (argc != 5) { fprintf(stderr, "usage: fdtd IN OUT STEPS REPS\n"); return 2; }
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
    for (long s = 0; s < steps; s++) updated += fdtd_step(n, cells, Av, Bv, Ai, Bi, gm, V, I, iEnd, hEnd, tmp);
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
