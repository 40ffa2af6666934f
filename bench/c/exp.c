/* Side measurement for bench/integrator.mjs: cost of exp + expm1 alone in C (glibc), N calls each. */
#include <math.h>
#include <stdio.h>
#include <stdlib.h>
#include <time.h>
int main(int argc, char **argv) {
  const long n = argc > 1 ? atol(argv[1]) : 20000000;
  struct timespec a, b;
  double s = 0;
  clock_gettime(CLOCK_MONOTONIC, &a);
  for (long i = 0; i < n; i++) s += exp(-1e-8 * (double)i) + expm1(-2e-8 * (double)i);
  clock_gettime(CLOCK_MONOTONIC, &b);
  printf("seconds %.6f checksum %.9e\n", (b.tv_sec - a.tv_sec) + 1e-9 * (b.tv_nsec - a.tv_nsec), s);
  return 0;
}
