/*
 * gridproof example solver in C: lexicographic Gauss-Seidel on the vertex-centred 5-point system
 * (the reference solver's scheme), speaking gridproof-protocol/1 on stdin/stdout with cJSON.
 *
 * Usage: gridproof-gs [--omega W] [--largest N]
 *   --omega W    relaxation factor, 0 < W < 2 (default 1: plain Gauss-Seidel)
 *   --largest N  refuse (not applicable) grids with nx or ny above N (default 128)
 *
 * Mode: a first line holding a hello message starts a session (one message per line until goodbye
 * or end of input); anything else is one request read to the end of stdin (once mode).
 * stdout carries protocol messages only; logs go to stderr.
 */
#include <cjson/cJSON.h>
#include <math.h>
#include <stdint.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>
#include <time.h>

#define PROTOCOL "gridproof-protocol/1"
#define NAME "c-gauss-seidel"
#define VERSION "1.0.0"

static double omega = 1.0;
static int largest = 128;

static double now_seconds(void) {
  struct timespec ts;
  clock_gettime(CLOCK_MONOTONIC, &ts);
  return (double)ts.tv_sec + 1e-9 * (double)ts.tv_nsec;
}

/* ---------- base64 (RFC 4648) of little-endian float64 arrays ---------- */

static const char B64[] = "ABCDEFGHIJKLMNOPQRSTUVWXYZabcdefghijklmnopqrstuvwxyz0123456789+/";

static int b64_value(char ch) {
  const char *p = ch ? strchr(B64, ch) : NULL;
  return p ? (int)(p - B64) : -1;
}

/* Decodes base64 text into bytes; returns the byte count or -1 on bad input. */
static long b64_decode(const char *text, unsigned char **out) {
  size_t len = strlen(text);
  if (len % 4 != 0) return -1;
  unsigned char *buf = malloc(len / 4 * 3 + 1);
  if (!buf) return -1;
  long n = 0;
  for (size_t k = 0; k < len; k += 4) {
    int v[4];
    for (int q = 0; q < 4; q++) {
      v[q] = text[k + q] == '=' ? 0 : b64_value(text[k + q]);
      if (v[q] < 0) { free(buf); return -1; }
    }
    uint32_t triple = (uint32_t)v[0] << 18 | (uint32_t)v[1] << 12 | (uint32_t)v[2] << 6 | (uint32_t)v[3];
    buf[n++] = (unsigned char)(triple >> 16);
    if (text[k + 2] != '=') buf[n++] = (unsigned char)(triple >> 8);
    if (text[k + 3] != '=') buf[n++] = (unsigned char)triple;
  }
  *out = buf;
  return n;
}

static char *b64_encode(const unsigned char *bytes, size_t len) {
  char *out = malloc((len + 2) / 3 * 4 + 1);
  if (!out) return NULL;
  size_t n = 0;
  for (size_t k = 0; k < len; k += 3) {
    uint32_t triple = (uint32_t)bytes[k] << 16;
    if (k + 1 < len) triple |= (uint32_t)bytes[k + 1] << 8;
    if (k + 2 < len) triple |= bytes[k + 2];
    out[n++] = B64[triple >> 18 & 63];
    out[n++] = B64[triple >> 12 & 63];
    out[n++] = k + 1 < len ? B64[triple >> 6 & 63] : '=';
    out[n++] = k + 2 < len ? B64[triple & 63] : '=';
  }
  out[n] = '\0';
  return out;
}

/* little-endian float64 from 8 bytes, independent of the host's byte order */
static double le_double(const unsigned char *p) {
  uint64_t bits = 0;
  for (int q = 7; q >= 0; q--) bits = bits << 8 | p[q];
  double v;
  memcpy(&v, &bits, 8);
  return v;
}

/* Reads an array field (numbers or {"base64": ...}) of exactly `length` finite values into a new
 * buffer. On failure writes a reason into `why` and returns NULL. */
static double *read_array(const cJSON *item, const char *field, long length, char *why, size_t whylen) {
  double *out = malloc(sizeof(double) * (size_t)(length > 0 ? length : 1));
  if (!out) { snprintf(why, whylen, "%s: out of memory", field); return NULL; }
  if (cJSON_IsArray(item)) {
    long n = cJSON_GetArraySize(item);
    if (n != length) {
      snprintf(why, whylen, "%s: has %ld values, expected %ld", field, n, length);
      free(out);
      return NULL;
    }
    long k = 0;
    const cJSON *v;
    cJSON_ArrayForEach(v, item) {
      if (!cJSON_IsNumber(v)) {
        snprintf(why, whylen, "%s[%ld]: is not a number", field, k);
        free(out);
        return NULL;
      }
      out[k++] = v->valuedouble;
    }
  } else {
    const cJSON *b = cJSON_GetObjectItemCaseSensitive(item, "base64");
    unsigned char *bytes = NULL;
    long n = cJSON_IsString(b) ? b64_decode(b->valuestring, &bytes) : -1;
    if (n < 0) {
      snprintf(why, whylen, "%s: must be an array of numbers or an object with valid base64", field);
      free(out);
      return NULL;
    }
    if (n != 8 * length) {
      snprintf(why, whylen, "%s: base64 holds %ld bytes, expected %ld values (%ld bytes)", field, n,
               length, 8 * length);
      free(bytes);
      free(out);
      return NULL;
    }
    for (long k = 0; k < length; k++) out[k] = le_double(bytes + 8 * k);
    free(bytes);
  }
  for (long k = 0; k < length; k++) {
    if (!isfinite(out[k])) {
      snprintf(why, whylen, "%s[%ld]: is not finite", field, k);
      free(out);
      return NULL;
    }
  }
  return out;
}

static cJSON *write_array(const double *v, long n, int base64) {
  if (!base64) return cJSON_CreateDoubleArray(v, (int)n);
  unsigned char *bytes = malloc((size_t)n * 8 + 1);
  for (long k = 0; k < n; k++) {
    uint64_t bits;
    memcpy(&bits, &v[k], 8);
    for (int q = 0; q < 8; q++) bytes[8 * k + q] = (unsigned char)(bits >> (8 * q));
  }
  char *text = b64_encode(bytes, (size_t)n * 8);
  free(bytes);
  cJSON *obj = cJSON_CreateObject();
  cJSON_AddStringToObject(obj, "base64", text);
  free(text);
  return obj;
}

/* ---------- messages ---------- */

static cJSON *message(const char *type, const char *id) {
  cJSON *m = cJSON_CreateObject();
  cJSON_AddStringToObject(m, "protocol", PROTOCOL);
  cJSON_AddStringToObject(m, "type", type);
  if (id) cJSON_AddStringToObject(m, "id", id);
  return m;
}

static cJSON *reason_message(const char *type, const char *id, const char *reason) {
  cJSON *m = message(type, id);
  cJSON_AddStringToObject(m, "reason", reason);
  return m;
}

static cJSON *ready_message(void) {
  cJSON *m = message("ready", NULL);
  cJSON *solver = cJSON_AddObjectToObject(m, "solver");
  cJSON_AddStringToObject(solver, "name", NAME);
  cJSON_AddStringToObject(solver, "version", VERSION);
  cJSON *s = cJSON_AddObjectToObject(m, "supports");
  const char *kinds[] = {"dirichlet", "neumann", "robin"};
  cJSON_AddItemToObject(s, "boundaryKinds", cJSON_CreateStringArray(kinds, 3));
  const char *schemes[] = {"central", "upwind"};
  cJSON_AddItemToObject(s, "schemes", cJSON_CreateStringArray(schemes, 2));
  const char *layouts[] = {"vertex"};
  cJSON_AddItemToObject(s, "layouts", cJSON_CreateStringArray(layouts, 1));
  const char *encodings[] = {"numbers", "base64"};
  cJSON_AddItemToObject(s, "encodings", cJSON_CreateStringArray(encodings, 2));
  cJSON *g = cJSON_AddObjectToObject(s, "largestGrid");
  cJSON_AddNumberToObject(g, "nx", largest);
  cJSON_AddNumberToObject(g, "ny", largest);
  return m;
}

/* ---------- the problem and its 5-point system ---------- */

enum { WEST, EAST, SOUTH, NORTH };
static const char *SIDE_NAMES[] = {"west", "east", "south", "north"};

typedef struct {
  int kind; /* 0 dirichlet, 1 neumann, 2 robin */
  double alpha, beta;
  double *values;
} Side;

typedef struct {
  int nx, ny;
  double x0, x1, y0, y1;
  double *coef[6]; /* a, b, c, d, e, f */
  Side side[4];
} Problem;

static void free_problem(Problem *p) {
  for (int k = 0; k < 6; k++) free(p->coef[k]);
  for (int s = 0; s < 4; s++) free(p->side[s].values);
}

static int dirichlet_like(const Side *s) { return s->kind == 0 || (s->kind == 2 && s->beta == 0); }

/* Reads a vertex-layout request; returns 0 or writes a reason and returns -1. */
static int read_problem(const cJSON *req, Problem *p, char *why, size_t whylen) {
  memset(p, 0, sizeof *p);
  const cJSON *grid = cJSON_GetObjectItemCaseSensitive(req, "grid");
  const cJSON *nx = cJSON_GetObjectItemCaseSensitive(grid, "nx");
  const cJSON *ny = cJSON_GetObjectItemCaseSensitive(grid, "ny");
  if (!cJSON_IsNumber(nx) || !cJSON_IsNumber(ny) || nx->valueint < 2 || ny->valueint < 2) {
    snprintf(why, whylen, "grid.nx, grid.ny: must be integers >= 2");
    return -1;
  }
  p->nx = nx->valueint;
  p->ny = ny->valueint;
  const cJSON *dom = cJSON_GetObjectItemCaseSensitive(req, "domain");
  const char *dn[] = {"x0", "x1", "y0", "y1"};
  double *dv[] = {&p->x0, &p->x1, &p->y0, &p->y1};
  for (int k = 0; k < 4; k++) {
    const cJSON *v = cJSON_GetObjectItemCaseSensitive(dom, dn[k]);
    if (!cJSON_IsNumber(v)) { snprintf(why, whylen, "domain.%s: must be a number", dn[k]); return -1; }
    *dv[k] = v->valuedouble;
  }
  long points = (long)(p->nx + 1) * (p->ny + 1);
  const cJSON *coef = cJSON_GetObjectItemCaseSensitive(req, "coefficients");
  const char *cn[] = {"a", "b", "c", "d", "e"};
  char field[64];
  for (int k = 0; k < 5; k++) {
    snprintf(field, sizeof field, "coefficients.%s", cn[k]);
    p->coef[k] = read_array(cJSON_GetObjectItemCaseSensitive(coef, cn[k]), field, points, why, whylen);
    if (!p->coef[k]) return -1;
  }
  p->coef[5] = read_array(cJSON_GetObjectItemCaseSensitive(req, "source"), "source", points, why, whylen);
  if (!p->coef[5]) return -1;
  const cJSON *bnd = cJSON_GetObjectItemCaseSensitive(req, "boundary");
  for (int s = 0; s < 4; s++) {
    const cJSON *side = cJSON_GetObjectItemCaseSensitive(bnd, SIDE_NAMES[s]);
    const cJSON *kind = cJSON_GetObjectItemCaseSensitive(side, "kind");
    const char *k = cJSON_IsString(kind) ? kind->valuestring : "";
    Side *sd = &p->side[s];
    if (strcmp(k, "dirichlet") == 0) sd->kind = 0;
    else if (strcmp(k, "neumann") == 0) sd->kind = 1, sd->alpha = 0, sd->beta = 1;
    else if (strcmp(k, "robin") == 0) {
      const cJSON *al = cJSON_GetObjectItemCaseSensitive(side, "alpha");
      const cJSON *be = cJSON_GetObjectItemCaseSensitive(side, "beta");
      if (!cJSON_IsNumber(al) || !cJSON_IsNumber(be)) {
        snprintf(why, whylen, "boundary.%s: robin needs numbers alpha and beta", SIDE_NAMES[s]);
        return -1;
      }
      sd->kind = 2, sd->alpha = al->valuedouble, sd->beta = be->valuedouble;
    } else {
      snprintf(why, whylen, "boundary.%s.kind: must be dirichlet, neumann or robin", SIDE_NAMES[s]);
      return -1;
    }
    long count = (s == WEST || s == EAST) ? p->ny + 1 : p->nx + 1;
    snprintf(field, sizeof field, "boundary.%s.values", SIDE_NAMES[s]);
    sd->values = read_array(cJSON_GetObjectItemCaseSensitive(side, "values"), field, count, why, whylen);
    if (!sd->values) return -1;
  }
  return 0;
}

typedef struct {
  int nx, ny;
  double *cc, *cw, *ce, *cs, *cn, *rhs;
  unsigned char *dir;
} Stencil;

/* The reference scheme: central (or upwind) 5-point rows, Neumann/Robin ghosts folded in,
 * Dirichlet identity rows with west, then east, then south, then north winning at corners. */
static void assemble(const Problem *p, int upwind, Stencil *s) {
  int nx = p->nx, ny = p->ny, w = nx + 1;
  long n = (long)(nx + 1) * (ny + 1);
  double hx = (p->x1 - p->x0) / nx, hy = (p->y1 - p->y0) / ny;
  s->nx = nx, s->ny = ny;
  s->cc = calloc(n, sizeof(double)), s->cw = calloc(n, sizeof(double));
  s->ce = calloc(n, sizeof(double)), s->cs = calloc(n, sizeof(double));
  s->cn = calloc(n, sizeof(double)), s->rhs = calloc(n, sizeof(double));
  s->dir = calloc(n, 1);
  const double *a = p->coef[0], *b = p->coef[1], *c = p->coef[2], *d = p->coef[3], *e = p->coef[4];
  for (long k = 0; k < n; k++) {
    s->cw[k] = s->ce[k] = a[k] / (hx * hx);
    s->cs[k] = s->cn[k] = c[k] / (hy * hy);
    s->cc[k] = -2 * a[k] / (hx * hx) - 2 * c[k] / (hy * hy) + e[k];
    s->rhs[k] = p->coef[5][k];
    if (!upwind) {
      s->cw[k] -= b[k] / (2 * hx), s->ce[k] += b[k] / (2 * hx);
      s->cs[k] -= d[k] / (2 * hy), s->cn[k] += d[k] / (2 * hy);
    } else {
      if (b[k] * a[k] > 0) s->ce[k] += b[k] / hx, s->cc[k] -= b[k] / hx;
      else s->cw[k] -= b[k] / hx, s->cc[k] += b[k] / hx;
      if (d[k] * c[k] > 0) s->cn[k] += d[k] / hy, s->cc[k] -= d[k] / hy;
      else s->cs[k] -= d[k] / hy, s->cc[k] += d[k] / hy;
    }
  }
  /* ghost = mirror + 2h (g - alpha u)/beta, folded into the boundary row */
  struct { int side; long first, step, count; double *ghost, *mirror, h; } folds[4] = {
      {WEST, 0, w, ny + 1, s->cw, s->ce, hx},
      {EAST, nx, w, ny + 1, s->ce, s->cw, hx},
      {SOUTH, 0, 1, nx + 1, s->cs, s->cn, hy},
      {NORTH, (long)ny * w, 1, nx + 1, s->cn, s->cs, hy},
  };
  for (int f = 0; f < 4; f++) {
    const Side *sd = &p->side[folds[f].side];
    if (dirichlet_like(sd)) continue;
    for (long t = 0; t < folds[f].count; t++) {
      long k = folds[f].first + t * folds[f].step;
      double g = folds[f].ghost[k], h2 = 2 * folds[f].h / sd->beta;
      folds[f].mirror[k] += g;
      s->cc[k] -= g * h2 * sd->alpha;
      s->rhs[k] -= g * h2 * sd->values[t];
      folds[f].ghost[k] = 0;
    }
  }
  /* Dirichlet rows in the order north, south, east, west so that west wins at shared corners */
  int order[4] = {NORTH, SOUTH, EAST, WEST};
  for (int q = 0; q < 4; q++) {
    int sideIndex = order[q];
    const Side *sd = &p->side[sideIndex];
    if (!dirichlet_like(sd)) continue;
    long first = sideIndex == WEST ? 0 : sideIndex == EAST ? nx : sideIndex == SOUTH ? 0 : (long)ny * w;
    long step = (sideIndex == WEST || sideIndex == EAST) ? w : 1;
    long count = (sideIndex == WEST || sideIndex == EAST) ? ny + 1 : nx + 1;
    double scale = sd->kind == 2 ? 1 / sd->alpha : 1;
    for (long t = 0; t < count; t++) {
      long k = first + t * step;
      s->dir[k] = 1;
      s->cc[k] = 1;
      s->cw[k] = s->ce[k] = s->cs[k] = s->cn[k] = 0;
      s->rhs[k] = sd->values[t] * scale;
    }
  }
}

static void free_stencil(Stencil *s) {
  free(s->cc), free(s->cw), free(s->ce), free(s->cs), free(s->cn), free(s->rhs), free(s->dir);
}

static double residual_norm(const Stencil *s, const double *u) {
  int nx = s->nx, ny = s->ny, w = nx + 1;
  double sum = 0;
  for (int j = 0; j <= ny; j++)
    for (int i = 0; i <= nx; i++) {
      long k = (long)j * w + i;
      double au = s->cc[k] * u[k];
      if (i > 0) au += s->cw[k] * u[k - 1];
      if (i < nx) au += s->ce[k] * u[k + 1];
      if (j > 0) au += s->cs[k] * u[k - w];
      if (j < ny) au += s->cn[k] * u[k + w];
      double r = s->rhs[k] - au;
      sum += r * r;
    }
  return sqrt(sum);
}

/* ---------- one solve ---------- */

static cJSON *solve(const cJSON *req, const char *id) {
  char why[512];
  const cJSON *grid = cJSON_GetObjectItemCaseSensitive(req, "grid");
  const cJSON *layout = cJSON_GetObjectItemCaseSensitive(grid, "layout");
  if (!cJSON_IsString(layout) || strcmp(layout->valuestring, "vertex") != 0)
    return reason_message("not-applicable", id, "only the vertex layout is supported");
  const cJSON *scheme = cJSON_GetObjectItemCaseSensitive(req, "scheme");
  int upwind = cJSON_IsString(scheme) && strcmp(scheme->valuestring, "upwind") == 0;
  if (cJSON_IsString(scheme) && !upwind && strcmp(scheme->valuestring, "central") != 0)
    return reason_message("not-applicable", id, "unknown scheme");
  const cJSON *nx = cJSON_GetObjectItemCaseSensitive(grid, "nx");
  const cJSON *ny = cJSON_GetObjectItemCaseSensitive(grid, "ny");
  if (cJSON_IsNumber(nx) && cJSON_IsNumber(ny) && (nx->valueint > largest || ny->valueint > largest)) {
    snprintf(why, sizeof why, "grid %dx%d is above this solver's largest grid %dx%d (plain Gauss-Seidel "
             "needs O(n^2) sweeps)", nx->valueint, ny->valueint, largest, largest);
    return reason_message("not-applicable", id, why);
  }
  Problem p;
  if (read_problem(req, &p, why, sizeof why) != 0) {
    free_problem(&p);
    return reason_message("error", id, why);
  }
  long n = (long)(p.nx + 1) * (p.ny + 1);
  int singular = 1;
  for (int s = 0; s < 4; s++)
    if (p.side[s].kind == 0 || (p.side[s].kind == 2 && p.side[s].alpha != 0)) singular = 0;
  for (long k = 0; singular && k < n; k++)
    if (p.coef[4][k] != 0) singular = 0;
  if (singular) {
    free_problem(&p);
    return reason_message("not-applicable", id,
                          "only Neumann sides and e = 0: the solution is fixed only up to a constant");
  }
  const cJSON *tol = cJSON_GetObjectItemCaseSensitive(req, "tolerance");
  const cJSON *lim = cJSON_GetObjectItemCaseSensitive(req, "timeLimitSeconds");
  double tolerance = cJSON_IsNumber(tol) && tol->valuedouble > 0 ? tol->valuedouble : 1e-10;
  double limit = cJSON_IsNumber(lim) && lim->valuedouble > 0 ? lim->valuedouble : 300;

  double start = now_seconds();
  Stencil s;
  assemble(&p, upwind, &s);
  double *u = calloc(n, sizeof(double));
  for (long k = 0; k < n; k++)
    if (s.dir[k]) u[k] = s.rhs[k];
  long cap = 1024, len = 0;
  double *history = malloc(sizeof(double) * cap);
  double r0 = residual_norm(&s, u), best = r0;
  history[len++] = r0;
  const char *reason = "converged";
  int converged = r0 == 0, w = p.nx + 1;
  long sweep = 0, best_sweep = 0, patience = 1000 + 20L * (p.nx + p.ny);
  while (!converged) {
    sweep++;
    for (int j = 0; j <= p.ny; j++)
      for (int i = 0; i <= p.nx; i++) {
        long k = (long)j * w + i;
        if (s.dir[k]) continue;
        double sum = s.rhs[k];
        if (i > 0) sum -= s.cw[k] * u[k - 1];
        if (i < p.nx) sum -= s.ce[k] * u[k + 1];
        if (j > 0) sum -= s.cs[k] * u[k - w];
        if (j < p.ny) sum -= s.cn[k] * u[k + w];
        u[k] += omega * (sum / s.cc[k] - u[k]);
      }
    double r = residual_norm(&s, u);
    if (len == cap) history = realloc(history, sizeof(double) * (cap *= 2));
    history[len++] = r;
    if (r <= tolerance * r0) { converged = 1; break; }
    if (!(r <= 1e3 * r0)) { reason = "diverged"; break; }
    if (r < best) best = r, best_sweep = sweep;
    else if (sweep - best_sweep > patience) { reason = "stagnated"; break; }
    if (now_seconds() - start > 0.9 * limit) { reason = "time-limit"; break; }
  }
  double seconds = now_seconds() - start;
  fprintf(stderr, "%s: %s %dx%d %s after %ld sweeps in %.3f s\n", NAME, id ? id : "", p.nx, p.ny,
          reason, sweep, seconds);
  const cJSON *enc = cJSON_GetObjectItemCaseSensitive(req, "encoding");
  int base64 = cJSON_IsString(enc) && strcmp(enc->valuestring, "base64") == 0;
  cJSON *m = message("solution", id);
  cJSON_AddItemToObject(m, "values", write_array(u, n, base64));
  cJSON_AddItemToObject(m, "residualHistory", write_array(history, len, base64));
  cJSON_AddNumberToObject(m, "iterations", (double)sweep);
  cJSON_AddBoolToObject(m, "converged", converged);
  cJSON_AddNumberToObject(m, "seconds", seconds);
  cJSON *solver = cJSON_AddObjectToObject(m, "solver");
  cJSON_AddStringToObject(solver, "name", NAME);
  cJSON_AddStringToObject(solver, "version", VERSION);
  snprintf(why, sizeof why, "lexicographic Gauss-Seidel (omega %g), %s scheme, stopped: %s", omega,
           upwind ? "upwind" : "central", converged ? "converged" : reason);
  cJSON_AddStringToObject(m, "notes", why);
  free(u), free(history);
  free_stencil(&s);
  free_problem(&p);
  return m;
}

/* Answers one parsed message; returns NULL for goodbye. */
static cJSON *answer(const cJSON *req) {
  if (!cJSON_IsObject(req)) return reason_message("error", NULL, "the message is not a JSON object");
  const cJSON *idItem = cJSON_GetObjectItemCaseSensitive(req, "id");
  const char *id = cJSON_IsString(idItem) ? idItem->valuestring : NULL;
  const cJSON *proto = cJSON_GetObjectItemCaseSensitive(req, "protocol");
  if (!cJSON_IsString(proto) || strcmp(proto->valuestring, PROTOCOL) != 0) {
    char why[256];
    snprintf(why, sizeof why, "this solver speaks '%s' only; the message says '%s'", PROTOCOL,
             cJSON_IsString(proto) ? proto->valuestring : "(none)");
    return reason_message("error", id, why);
  }
  const cJSON *type = cJSON_GetObjectItemCaseSensitive(req, "type");
  const char *t = cJSON_IsString(type) ? type->valuestring : "";
  if (strcmp(t, "hello") == 0) return ready_message();
  if (strcmp(t, "goodbye") == 0) return NULL;
  if (strcmp(t, "solve") == 0) return solve(req, id ? id : "");
  return reason_message("error", id, "unknown message type; expected hello, solve or goodbye");
}

static void send(cJSON *reply) {
  char *text = cJSON_PrintUnformatted(reply);
  fputs(text, stdout);
  fputc('\n', stdout);
  fflush(stdout);
  free(text);
  cJSON_Delete(reply);
}

static cJSON *answer_text(const char *text, int *goodbye) {
  cJSON *req = cJSON_Parse(text);
  if (!req) return reason_message("error", NULL, "the request is not valid JSON");
  cJSON *reply = answer(req);
  cJSON_Delete(req);
  if (!reply) *goodbye = 1;
  return reply;
}

int main(int argc, char **argv) {
  for (int k = 1; k < argc; k++) {
    if (strcmp(argv[k], "--omega") == 0 && k + 1 < argc) {
      omega = atof(argv[++k]);
      if (!(omega > 0 && omega < 2)) { fprintf(stderr, NAME ": --omega must be in (0, 2)\n"); return 2; }
    } else if (strcmp(argv[k], "--largest") == 0 && k + 1 < argc) {
      largest = atoi(argv[++k]);
      if (largest < 2) { fprintf(stderr, NAME ": --largest must be an integer >= 2\n"); return 2; }
    } else {
      fprintf(stderr, NAME ": unknown option '%s'; use --omega W or --largest N\n", argv[k]);
      return 2;
    }
  }
  char *line = NULL;
  size_t cap = 0;
  ssize_t got = getline(&line, &cap, stdin);
  if (got < 0) { free(line); return 0; }
  cJSON *head = cJSON_Parse(line);
  const cJSON *type = cJSON_GetObjectItemCaseSensitive(head, "type");
  int session = cJSON_IsString(type) && strcmp(type->valuestring, "hello") == 0;
  cJSON_Delete(head);
  int goodbye = 0;
  if (!session) {
    /* once mode: the request is all of stdin */
    size_t len = (size_t)got, size = len + 65536;
    char *all = malloc(size);
    memcpy(all, line, len);
    size_t r;
    while ((r = fread(all + len, 1, size - len - 1, stdin)) > 0) {
      len += r;
      if (size - len < 2) all = realloc(all, size *= 2);
    }
    all[len] = '\0';
    cJSON *reply = answer_text(all, &goodbye);
    if (reply) send(reply);
    free(all);
    free(line);
    return 0;
  }
  do {
    if (strspn(line, " \t\r\n") == strlen(line)) continue;
    cJSON *reply = answer_text(line, &goodbye);
    if (goodbye) break;
    send(reply);
  } while (getline(&line, &cap, stdin) >= 0);
  free(line);
  return 0;
}
