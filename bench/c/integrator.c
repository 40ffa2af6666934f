/*
 * The same 1-D return-mapping update as src/core/path/integrate.ts (createPathStepper), in plain C,
 * for bench/integrator.mjs: Voce isotropic law split with one Armstrong-Frederick backstress,
 * constant E, exponential backstress update, Newton on the consistency condition safeguarded by a
 * bracket. Compiled at run time with `gcc -O2`; no binary is kept in the repository.
 * Usage: integrator N  -> prints "increments <N> seconds <t> checksum <sum of stresses>"
 */
#include <math.h>
#include <stdio.h>
#include <stdlib.h>
#include <time.h>

static const double E = 207000.0, S0 = 250.0, Q = 200.0, B = 15.0, C = 20000.0, G = 200.0;
static const double TOL = 1e-11;

static double law_stress(double p) { return S0 + Q * -expm1(-B * p); }
static double law_slope(double p) { return Q * B * exp(-B * p); }
static double size(double p) { return law_stress(p) - (C / G) * -expm1(-G * p); }
static double slope(double p) { return law_slope(p) - C * exp(-G * p); }

typedef struct { double eps, sig, ep, p, X; } State;

static void step(State *st, double e1) {
  const double p = st->p, ep = st->ep, X = st->X;
  const double trial = E * (e1 - ep);
  const double xi = trial - X;
  const double R0 = size(p);
  const double f = fabs(xi) - R0;
  const double scale = R0 + fabs(X) + 1.0;
  st->eps = e1;
  if (f <= TOL * scale) { st->sig = trial; return; }
  const double s = xi > 0 ? 1.0 : -1.0;
  const double EG = exp(-G * p); /* exp(-G(p+dp)) = EG*exp(-G dp), as in the Node code */
  const double de = e1 - ep;
  const double sat = s * C / G;
  double g = 0, dg = 0;
#define EVALG(dp) do { \
    const double pe_ = p + (dp); const double el_ = de - s * (dp); const double ex_ = exp(-G * (dp)); \
    const double sx_ = sat + (X - sat) * ex_; const double dsx_ = -G * (X - sat) * ex_; \
    const double e_ = EG * ex_; const double rk_ = (C / G) * (1 - e_); const double drk_ = C * e_; \
    g = s * (E * el_ - sx_) - (law_stress(pe_) - rk_); dg = -E - s * dsx_ - (law_slope(pe_) - drk_); } while (0)
  double lo = 0, hi = f / E;
  EVALG(hi);
  int expand = 0;
  while (g > 0) { lo = hi; hi *= 2; if (++expand > 60) { fprintf(stderr, "no bracket\n"); exit(3); } EVALG(hi); }
  const double hk = C - G * s * X;
  double dp = f / (E + fmax(0.0, slope(p + 1e-12)) + fmax(0.0, hk));
  if (dp < lo) dp = lo;
  if (dp > hi) dp = hi;
  if (!(dp > lo && dp < hi)) dp = 0.5 * (lo + hi);
  for (int it = 0; it < 100; it++) {
    EVALG(dp);
    if (fabs(g) <= TOL * scale) break;
    if (g > 0) lo = dp; else hi = dp;
    if (hi - lo <= 4e-16 * hi) break;
    double next = dp - g / dg;
    if (!(next > lo && next < hi)) next = 0.5 * (lo + hi);
    dp = next;
  }
  st->X = sat + (X - sat) * exp(-G * dp);
  st->ep = ep + s * dp;
  st->p = p + dp;
  st->sig = E * (e1 - st->ep);
}

/* Triangular strain cycle between -A and +A, increment H: the same wave as the Node bench. */
static double wave(long i) {
  const double A = 0.02, H = 1e-4;
  const long quarter = (long)(A / H + 0.5);
  const long k = i % (4 * quarter);
  if (k < quarter) return k * H;
  if (k < 3 * quarter) return (2 * quarter - k) * H;
  return (k - 4 * quarter) * H;
}

int main(int argc, char **argv) {
  const long n = argc > 1 ? atol(argv[1]) : 3000000;
  State st = {0, 0, 0, 0, 0};
  for (long i = 1; i <= 200000; i++) step(&st, wave(i)); /* warm-up, same as Node */
  State run = {0, 0, 0, 0, 0};
  struct timespec t0, t1;
  double sum = 0;
  clock_gettime(CLOCK_MONOTONIC, &t0);
  for (long i = 1; i <= n; i++) { step(&run, wave(i)); sum += run.sig; }
  clock_gettime(CLOCK_MONOTONIC, &t1);
  const double secs = (t1.tv_sec - t0.tv_sec) + 1e-9 * (t1.tv_nsec - t0.tv_nsec);
  printf("increments %ld seconds %.6f checksum %.9e\n", n, secs, sum);
  return 0;
}
