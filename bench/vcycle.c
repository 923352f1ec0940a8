/*
 * A plain C V-cycle: the yardstick `solver_bench.ts` times the reference solver against (issue 16,
 * item 3). Compiled by the bench with `gcc -O3` when gcc is present; never part of the project's
 * build or tests.
 *
 * The discrete problem is the bench's (`bench_problem.ts`), sampled here from the same formulas:
 * unit square, Dirichlet sides (u = 0), a = 1 + 0.5 sin(2πx) sin(2πy), c = 1 + 0.25 cos(πxy),
 * e = −(1 + xy), f = a·u_xx + c·u_yy + e·u for u = sin(πx) sin(πy) exp(xy), five-point central
 * differences a(u_W − 2u + u_E)/h² + c(u_S − 2u + u_N)/h² + e·u = f. Coarse levels take the
 * coefficients injected from the fine samples and are rediscretized; the coarsest level (the first
 * with at most 81 nodes, as the reference solver's default) is solved by dense LU of its interior
 * unknowns. The cycle is V(2,1): red–black Gauss–Seidel (red, i + j even, first; a full red pass
 * then a full black pass), the residual into its own array, full weighting, bilinear interpolation
 * added to the iterate — the textbook steps one after the other, nothing fused.
 *
 * Usage: vcycle N REPS. Runs 5 cycles from u = 0 printing their residual norms ‖f − Au‖₂ (the
 * bench compares them with the reference solver's history: same discrete problem, same cycle),
 * then REPS more cycles timed one by one. Prints one JSON object on stdout.
 */
#include <math.h>
#include <stdio.h>
#include <stdlib.h>
#include <time.h>

typedef struct {
  int n;
  double h2inv;
  double *a, *c, *e, *invd; /* coefficients at the nodes, 1 / diagonal */
  double *u, *f, *r;
  double *lu; /* coarsest: dense LU of the interior unknowns, row-major */
  int *piv;
} Level;

static const double PI = 3.14159265358979323846;

static double now(void) {
  struct timespec t;
  clock_gettime(CLOCK_MONOTONIC, &t);
  return t.tv_sec + 1e-9 * t.tv_nsec;
}

static double diag(const Level *L, int k) {
  return -2 * (L->a[k] + L->c[k]) * L->h2inv + L->e[k];
}

/* Stencil row k applied to u (interior node). */
static double apply(const Level *L, const double *u, int k) {
  int s = L->n + 1;
  return L->h2inv * (L->a[k] * (u[k - 1] + u[k + 1]) + L->c[k] * (u[k - s] + u[k + s])) +
         diag(L, k) * u[k];
}

static void sweep_colour(Level *L, int colour) {
  int n = L->n, s = n + 1;
  for (int j = 1; j < n; j++) {
    int i0 = 1 + ((j + 1 + colour) & 1);
    for (int i = i0; i < n; i += 2) {
      int k = j * s + i;
      double off = L->h2inv * (L->a[k] * (L->u[k - 1] + L->u[k + 1]) +
                               L->c[k] * (L->u[k - s] + L->u[k + s]));
      L->u[k] = (L->f[k] - off) * L->invd[k];
    }
  }
}

static void smooth(Level *L, int sweeps) {
  for (int t = 0; t < sweeps; t++) {
    sweep_colour(L, 0);
    sweep_colour(L, 1);
  }
}

static void residual(Level *L) {
  int n = L->n, s = n + 1;
  for (int j = 1; j < n; j++)
    for (int i = 1; i < n; i++) {
      int k = j * s + i;
      L->r[k] = L->f[k] - apply(L, L->u, k);
    }
}

static double residual_norm(Level *L) {
  int n = L->n, s = n + 1;
  double sum = 0;
  for (int j = 1; j < n; j++)
    for (int i = 1; i < n; i++) {
      int k = j * s + i;
      double t = L->f[k] - apply(L, L->u, k);
      sum += t * t;
    }
  return sqrt(sum);
}

static void restrict_fw(const Level *F, Level *C) {
  int fs = F->n + 1, cs = C->n + 1;
  const double *r = F->r;
  for (int J = 1; J < C->n; J++)
    for (int I = 1; I < C->n; I++) {
      int k = 2 * J * fs + 2 * I;
      C->f[J * cs + I] = 0.0625 * (4 * r[k] + 2 * (r[k - 1] + r[k + 1] + r[k - fs] + r[k + fs]) +
                                   r[k - fs - 1] + r[k - fs + 1] + r[k + fs - 1] + r[k + fs + 1]);
    }
}

static void interpolate_add(const Level *C, Level *F) {
  int fs = F->n + 1, cs = C->n + 1;
  const double *c = C->u;
  double *u = F->u;
  for (int j = 1; j < F->n; j++) {
    int J = j / 2, odd = j & 1;
    for (int i = 1; i < F->n; i++) {
      int I = i / 2, k = j * fs + i, q = J * cs + I;
      double v;
      if (!odd && !(i & 1)) v = c[q];
      else if (!odd) v = 0.5 * (c[q] + c[q + 1]);
      else if (!(i & 1)) v = 0.5 * (c[q] + c[q + cs]);
      else v = 0.25 * (c[q] + c[q + 1] + c[q + cs] + c[q + cs + 1]);
      u[k] += v;
    }
  }
}

static void factor_coarsest(Level *L) {
  int n = L->n, m = (n - 1) * (n - 1), s = n + 1;
  L->lu = calloc((size_t)m * m, sizeof(double));
  L->piv = malloc(m * sizeof(int));
  for (int j = 1; j < n; j++)
    for (int i = 1; i < n; i++) {
      int row = (j - 1) * (n - 1) + (i - 1), k = j * s + i;
      L->lu[row * m + row] = diag(L, k);
      if (i > 1) L->lu[row * m + row - 1] = L->a[k] * L->h2inv;
      if (i < n - 1) L->lu[row * m + row + 1] = L->a[k] * L->h2inv;
      if (j > 1) L->lu[row * m + row - (n - 1)] = L->c[k] * L->h2inv;
      if (j < n - 1) L->lu[row * m + row + (n - 1)] = L->c[k] * L->h2inv;
    }
  double *A = L->lu;
  for (int p = 0; p < m; p++) {
    int best = p;
    for (int q = p + 1; q < m; q++)
      if (fabs(A[q * m + p]) > fabs(A[best * m + p])) best = q;
    L->piv[p] = best;
    if (best != p)
      for (int t = 0; t < m; t++) {
        double x = A[p * m + t];
        A[p * m + t] = A[best * m + t];
        A[best * m + t] = x;
      }
    for (int q = p + 1; q < m; q++) {
      double l = A[q * m + p] /= A[p * m + p];
      for (int t = p + 1; t < m; t++) A[q * m + t] -= l * A[p * m + t];
    }
  }
}

static void solve_coarsest(Level *L) {
  int n = L->n, m = (n - 1) * (n - 1), s = n + 1;
  double x[m];
  for (int j = 1; j < n; j++)
    for (int i = 1; i < n; i++) x[(j - 1) * (n - 1) + (i - 1)] = L->f[j * s + i];
  for (int p = 0; p < m; p++) {
    int b = L->piv[p];
    double t = x[p];
    x[p] = x[b];
    x[b] = t;
    for (int q = p + 1; q < m; q++) x[q] -= L->lu[q * m + p] * x[p];
  }
  for (int p = m - 1; p >= 0; p--) {
    double t = x[p];
    for (int q = p + 1; q < m; q++) t -= L->lu[p * m + q] * x[q];
    x[p] = t / L->lu[p * m + p];
  }
  for (int j = 1; j < n; j++)
    for (int i = 1; i < n; i++) L->u[j * s + i] = x[(j - 1) * (n - 1) + (i - 1)];
}

static void vcycle(Level *levels, int l, int last) {
  Level *L = &levels[l];
  if (l == last) {
    solve_coarsest(L);
    return;
  }
  Level *C = &levels[l + 1];
  smooth(L, 2);
  residual(L);
  restrict_fw(L, C);
  int cn = (C->n + 1) * (C->n + 1);
  for (int k = 0; k < cn; k++) C->u[k] = 0;
  vcycle(levels, l + 1, last);
  interpolate_add(C, L);
  smooth(L, 1);
}

int main(int argc, char **argv) {
  if (argc != 3) {
    fprintf(stderr, "usage: vcycle N REPS (N a power of two >= 8)\n");
    return 2;
  }
  int n = atoi(argv[1]), reps = atoi(argv[2]);
  if (n < 8 || (n & (n - 1)) != 0 || reps < 1) {
    fprintf(stderr, "vcycle: N must be a power of two >= 8 and REPS >= 1\n");
    return 2;
  }
  Level levels[32];
  int count = 0;
  for (int m = n;; m /= 2) {
    Level *L = &levels[count++];
    size_t N = (size_t)(m + 1) * (m + 1);
    L->n = m;
    L->h2inv = (double)m * m;
    L->a = malloc(N * sizeof(double));
    L->c = malloc(N * sizeof(double));
    L->e = malloc(N * sizeof(double));
    L->invd = malloc(N * sizeof(double));
    L->u = calloc(N, sizeof(double));
    L->f = calloc(N, sizeof(double));
    L->r = calloc(N, sizeof(double));
    if ((m + 1) * (m + 1) <= 81 || m % 2 != 0 || m < 4) break;
  }
  int last = count - 1;
  /* Sample on the finest grid; coarse levels inject. */
  for (int l = 0; l < count; l++) {
    Level *L = &levels[l];
    int m = L->n, step = n / m;
    for (int j = 0; j <= m; j++)
      for (int i = 0; i <= m; i++) {
        double x = (double)(i * step) / n, y = (double)(j * step) / n;
        int k = j * (m + 1) + i;
        L->a[k] = 1 + 0.5 * sin(2 * PI * x) * sin(2 * PI * y);
        L->c[k] = 1 + 0.25 * cos(PI * x * y);
        L->e[k] = -(1 + x * y);
        L->invd[k] = 1 / diag(L, k);
        if (l == 0 && i > 0 && i < m && j > 0 && j < m) {
          double E = exp(x * y), sx = sin(PI * x), sy = sin(PI * y), cx = cos(PI * x),
                 cy = cos(PI * y);
          double uxx = E * sy * (-PI * PI * sx + 2 * PI * y * cx + y * y * sx);
          double uyy = E * sx * (-PI * PI * sy + 2 * PI * x * cy + x * x * sy);
          L->f[k] = L->a[k] * uxx + L->c[k] * uyy + L->e[k] * sx * sy * E;
        }
      }
  }
  factor_coarsest(&levels[last]);
  printf("{\"n\":%d,\"levels\":%d,\"residuals\":[%.17g", n, count, residual_norm(&levels[0]));
  for (int t = 0; t < 5; t++) {
    vcycle(levels, 0, last);
    printf(",%.17g", residual_norm(&levels[0]));
  }
  double best = 1e300;
  for (int t = 0; t < reps; t++) {
    double t0 = now();
    vcycle(levels, 0, last);
    double dt = now() - t0;
    if (dt < best) best = dt;
  }
  printf("],\"secondsPerCycle\":%.6e,\"check\":%.17g}\n", best, levels[0].u[(n / 2) * (n + 1) + n / 2]);
  return 0;
}
