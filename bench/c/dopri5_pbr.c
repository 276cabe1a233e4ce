/*
 * C reference for bench/run.ts section (e): one packed-bed solve of the two-reaction gas-phase case
 * with Ergun pressure drop (A + B <=> C, C -> D, inert I; the case of bench/pbr-solve.ts), integrated
 * by the Dormand-Prince 5(4) pair (Dormand & Prince 1980) with the step control of Hairer, Norsett &
 * Wanner's DOPRI5 (Solving ODEs I, sec. II.4-II.5; PI control beta = 0.04, safety 0.9, factor
 * limits 1/5..10, weighted RMS error norm sk = atol_i + rtol max(|y_i|, |y1_i|), HINIT starting
 * step), i.e. the same method, norm and control as src/numerics/dopri5.ts.
 *
 *   dF_j/dW = sum_i nu_ij r_i,  r1 = k1 (C_A C_B - C_C / K1),  r2 = k2 C_C
 *   C_j = C_T0 (F_j / F_T) p,   dp/dW = -alpha / (2 p) (F_T / F_T0)
 *
 * Build: gcc -O2 -o dopri5_pbr dopri5_pbr.c -lm      Run: ./dopri5_pbr [repeats]   (prints JSON)
 */
#include <math.h>
#include <stdio.h>
#include <stdlib.h>
#include <time.h>

#define NS 5
#define N 6
static const double R_GAS = 8.314462618;
static double k1 = 1e-5, K1 = 0.05, k2 = 5e-4, alpha = 0.012, cT0, FT0;
static long nrhs;

static void rhs(double w, const double *y, double *out) {
  (void)w;
  double FT = 0;
  for (int j = 0; j < NS; j++) FT += y[j];
  double p = y[NS];
  double f = cT0 * p / FT;
  double CA = f * y[0], CB = f * y[1], CC = f * y[2];
  double r1 = k1 * (CA * CB - CC / K1);
  double r2 = k2 * CC;
  out[0] = -r1;
  out[1] = -r1;
  out[2] = r1 - r2;
  out[3] = r2;
  out[4] = 0;
  double pp = p > 1e-12 ? p : 1e-12;
  out[NS] = -alpha / (2 * pp) * (FT / FT0);
  nrhs++;
}

static const double C2 = 0.2, C3 = 0.3, C4 = 0.8, C5 = 8.0 / 9.0;
static const double A21 = 0.2, A31 = 3.0 / 40, A32 = 9.0 / 40, A41 = 44.0 / 45, A42 = -56.0 / 15, A43 = 32.0 / 9;
static const double A51 = 19372.0 / 6561, A52 = -25360.0 / 2187, A53 = 64448.0 / 6561, A54 = -212.0 / 729;
static const double A61 = 9017.0 / 3168, A62 = -355.0 / 33, A63 = 46732.0 / 5247, A64 = 49.0 / 176, A65 = -5103.0 / 18656;
static const double A71 = 35.0 / 384, A73 = 500.0 / 1113, A74 = 125.0 / 192, A75 = -2187.0 / 6784, A76 = 11.0 / 84;
static const double E1 = 71.0 / 57600, E3 = -71.0 / 16695, E4 = 71.0 / 1920, E5 = -17253.0 / 339200, E6 = 22.0 / 525, E7 = -1.0 / 40;

/* Integrate from 0 to x1; returns the number of accepted steps. */
static int dopri5(double x1, double *y, double rtol, const double *atol) {
  double k1v[N], k2v[N], k3v[N], k4v[N], k5v[N], k6v[N], k7v[N], y1[N], ysti[N];
  double t = 0, facold = 1e-4;
  int steps = 0, reject = 0;
  rhs(t, y, k1v);
  /* HINIT */
  double dnf = 0, dny = 0;
  for (int i = 0; i < N; i++) {
    double sk = atol[i] + rtol * fabs(y[i]);
    dnf += (k1v[i] / sk) * (k1v[i] / sk);
    dny += (y[i] / sk) * (y[i] / sk);
  }
  double h = (dnf <= 1e-10 || dny <= 1e-10) ? 1e-6 : sqrt(dny / dnf) * 0.01;
  for (int i = 0; i < N; i++) y1[i] = y[i] + h * k1v[i];
  rhs(t + h, y1, k2v);
  double der2 = 0;
  for (int i = 0; i < N; i++) {
    double sk = atol[i] + rtol * fabs(y[i]);
    der2 += ((k2v[i] - k1v[i]) / sk) * ((k2v[i] - k1v[i]) / sk);
  }
  der2 = sqrt(der2) / h;
  double der12 = fmax(fabs(der2), sqrt(dnf));
  double h1 = der12 <= 1e-15 ? fmax(1e-6, h * 1e-3) : pow(0.01 / der12, 0.2);
  h = fmin(100 * h, h1);
  const double expo1 = 0.2 - 0.04 * 0.75;
  for (;;) {
    int last = 0;
    if (t + 1.01 * h - x1 >= 0) { h = x1 - t; last = 1; }
    for (int i = 0; i < N; i++) y1[i] = y[i] + h * A21 * k1v[i];
    rhs(t + C2 * h, y1, k2v);
    for (int i = 0; i < N; i++) y1[i] = y[i] + h * (A31 * k1v[i] + A32 * k2v[i]);
    rhs(t + C3 * h, y1, k3v);
    for (int i = 0; i < N; i++) y1[i] = y[i] + h * (A41 * k1v[i] + A42 * k2v[i] + A43 * k3v[i]);
    rhs(t + C4 * h, y1, k4v);
    for (int i = 0; i < N; i++) y1[i] = y[i] + h * (A51 * k1v[i] + A52 * k2v[i] + A53 * k3v[i] + A54 * k4v[i]);
    rhs(t + C5 * h, y1, k5v);
    for (int i = 0; i < N; i++) ysti[i] = y[i] + h * (A61 * k1v[i] + A62 * k2v[i] + A63 * k3v[i] + A64 * k4v[i] + A65 * k5v[i]);
    double tph = last ? x1 : t + h;
    rhs(tph, ysti, k6v);
    for (int i = 0; i < N; i++) y1[i] = y[i] + h * (A71 * k1v[i] + A73 * k3v[i] + A74 * k4v[i] + A75 * k5v[i] + A76 * k6v[i]);
    rhs(tph, y1, k7v);
    double err = 0;
    for (int i = 0; i < N; i++) {
      double e = h * (E1 * k1v[i] + E3 * k3v[i] + E4 * k4v[i] + E5 * k5v[i] + E6 * k6v[i] + E7 * k7v[i]);
      double sk = atol[i] + rtol * fmax(fabs(y[i]), fabs(y1[i]));
      err += (e / sk) * (e / sk);
    }
    err = sqrt(err / N);
    double fac11 = pow(err, expo1);
    double fac = fac11 / pow(facold, 0.04);
    fac = fmax(0.1, fmin(5.0, fac / 0.9));
    double hnew = h / fac;
    if (err <= 1) {
      facold = fmax(err, 1e-4);
      steps++;
      for (int i = 0; i < N; i++) { y[i] = y1[i]; k1v[i] = k7v[i]; }
      t = tph;
      if (reject) hnew = fmin(fabs(hnew), fabs(h));
      reject = 0;
      if (last) return steps;
      h = hnew;
    } else {
      h = h / fmin(5.0, fac11 / 0.9);
      reject = 1;
    }
  }
}

static double now(void) {
  struct timespec ts;
  clock_gettime(CLOCK_MONOTONIC, &ts);
  return ts.tv_sec + 1e-9 * ts.tv_nsec;
}
static double cpu(void) {
  struct timespec ts;
  clock_gettime(CLOCK_PROCESS_CPUTIME_ID, &ts);
  return ts.tv_sec + 1e-9 * ts.tv_nsec;
}

int main(int argc, char **argv) {
  int repeats = argc > 1 ? atoi(argv[1]) : 20000;
  const double T = 500, P = 5e5, W = 50, feed[NS] = {1, 1.2, 0, 0, 0.8};
  cT0 = P / (R_GAS * T);
  FT0 = 0;
  for (int j = 0; j < NS; j++) FT0 += feed[j];
  double atol[N], y[N];
  for (int j = 0; j < NS; j++) atol[j] = 1e-10 * FT0;
  atol[NS] = 1e-10;
  int steps = 0;
  volatile double sink = 0;
  double best = 1e30, bestCpu = 1e30;
  for (int b = 0; b < 5; b++) {
    double t0 = now(), c0 = cpu();
    for (int r = 0; r < repeats; r++) {
      for (int j = 0; j < NS; j++) y[j] = feed[j];
      y[NS] = 1;
      nrhs = 0;
      steps = dopri5(W, y, 1e-8, atol);
      sink += y[0];
    }
    double dt = (now() - t0) / repeats, dc = (cpu() - c0) / repeats;
    if (dt < best) best = dt;
    if (dc < bestCpu) bestCpu = dc;
  }
  printf("{\"secondsPerSolve\": %.9g, \"cpuSecondsPerSolve\": %.9g, \"steps\": %d, \"rhsEvaluations\": %ld, \"outlet\": [", best, bestCpu, steps, nrhs);
  for (int i = 0; i < N; i++) printf("%s%.12g", i ? ", " : "", y[i]);
  printf("]}\n");
  return sink == 12345.678 ? 1 : 0;
}
