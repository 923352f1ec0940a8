/**
 * The discretization: one row per grid node, boundary nodes included.
 *
 * Interior nodes: second-order central differences on the 5-point stencil,
 *
 *   a·(u_W − 2u + u_E)/hx² + b·(u_E − u_W)/(2hx) + c·(u_S − 2u + u_N)/hy² + d·(u_N − u_S)/(2hy) + e·u = f.
 *
 * With `upwind`, b·u_x and d·u_y become first-order one-sided differences taken on the side that
 * keeps the neighbour coefficients of the sign of the diffusion coefficient (the classical upwind
 * direction; for a > 0: forward b·(u_E − u)/hx when b > 0, backward b·(u − u_W)/hx when b < 0).
 *
 * Dirichlet sides: every node on the side is an identity row u = g. A Robin side with β = 0 is
 * treated the same way with u = g/α.
 *
 * Neumann and Robin sides (α·u + β·∂u/∂n = g, n the outward normal, Neumann: α = 0, β = 1): the
 * interior stencil is applied at the boundary node, and the ghost value outside the domain comes
 * from the central difference of the condition, e.g. on the west side
 * −(u_1 − u_ghost)/(2hx) = (g − α·u_0)/β, so u_ghost = u_1 + 2hx·(g − α·u_0)/β (and alike on the
 * other sides). The ghost's stencil coefficient K (central or upwind, whichever the scheme gives)
 * is then folded in: the opposite neighbour gains K, the centre gains −K·2h·α/β, and the right-hand
 * side gains −K·2h·g/β. Both formulas are exact for quadratics, so a quadratic solution is
 * reproduced to round-off with every boundary kind.
 *
 * Corners: if either side meeting at a corner is Dirichlet(-like), the corner is a Dirichlet node;
 * when both are, the west or east side's value is used (consistent data makes them agree). If both
 * sides are Neumann/Robin, ghosts are eliminated in both directions, each with its own side's value
 * at the corner (the `values` arrays include the corners).
 *
 * Mixed term (`m`, non-conservative form): m·u_xy by the central four-corner difference
 *
 *   m·(u_NE − u_SE − u_NW + u_SW)/(4·hx·hy),
 *
 * that is corner coefficients NE = SW = m/(4hx·hy) and NW = SE = −m/(4hx·hy) (with
 * u_NE = u(i+1, j+1) and so on). Truncation error (m/6)(hx²·u_xxxy + hy²·u_xyyy): second order,
 * exact for polynomials of degree 3 (in particular for u = x·y). The level then carries the four
 * corner arrays (a nine-point stencil); without `m`, or with m ≡ 0, the level stays five-point.
 * On a Neumann/Robin side the corner ghosts are eliminated like the edge ghost, each by the side's
 * condition at the boundary node beside it, e.g. on the west side
 * u(−1, j±1) = u(1, j±1) + (2hx/β)·(g[j±1] − α·u(0, j±1)): the ghost's coefficient K moves to the
 * mirrored corner (NW → NE, SW → SE), the boundary neighbour (0, j±1) gains −K·2hx·α/β (through
 * N or S) and the right-hand side gains −K·2hx·g[j±1]/β; alike on the east (NE → NW, SE → SW),
 * south (SW → NW, SE → NE, through W or E, data g[i±1]) and north (NW → SW, NE → SE) sides. This
 * is exact for quadratics like the rest. At a corner where two Neumann/Robin sides meet, the ghost
 * outside both sides has no condition that defines it; such a corner must have m = 0
 * (`validateProblem` refuses otherwise). A problem with a conductivity is discretized by
 * `discretize_conservative.ts` instead (the conservative form).
 *
 * @module
 */
import type { Problem, Side, ValuedCondition } from "./problem.ts";
import { levelLayout, type LevelOperator } from "./level.ts";
import { isDirichletLike, isSingular } from "./validate.ts";
import { discretizeConservative } from "./discretize_conservative.ts";

/** The operator of a level and the right-hand side of its own problem (padded layout). */
export interface Discretization {
  /** Stencil arrays of every node. */
  op: LevelOperator;
  /** Right-hand side of every row (Dirichlet rows: the boundary value). */
  rhs: Float64Array;
}

function allZero(v: Float64Array): boolean {
  for (let k = 0; k < v.length; k++) if (v[k] !== 0) return false;
  return true;
}

function dirichletValue(bc: ValuedCondition, k: number): number {
  return bc.kind === "robin" ? bc.values[k] / bc.alpha[k] : bc.values[k];
}

const NO_WEIGHT = new Float64Array(0);

/** α and β per node of a ghost side (Neumann: α = 0, β = 1 everywhere, `uniform` true). */
function ghostData(
  bc: ValuedCondition,
): { alpha: Float64Array; beta: Float64Array; uniform: boolean } {
  return bc.kind === "robin"
    ? { alpha: bc.alpha, beta: bc.beta, uniform: false }
    : { alpha: NO_WEIGHT, beta: NO_WEIGHT, uniform: true };
}

/** α at position k of a ghost side. */
const alphaAt = (g: ReturnType<typeof ghostData>, k: number) => g.uniform ? 0 : g.alpha[k];
/** β at position k of a ghost side. */
const betaAt = (g: ReturnType<typeof ghostData>, k: number) => g.uniform ? 1 : g.beta[k];

/**
 * Builds the stencil arrays and right-hand side of a (validated) problem, per the module doc; a
 * problem with a conductivity goes to `discretizeConservative`.
 *
 * @param problem The problem, already checked by `validateProblem`.
 * @param upwind First-order upwinding of b·u_x and d·u_y (default false).
 * @returns The level operator and right-hand side on the padded layout.
 *
 * @example
 * ```ts
 * import { discretize } from "./discretize.ts";
 * const nx = 2, ny = 2, n = 9, one = new Float64Array(n).fill(1), zero = new Float64Array(n);
 * const bc = { kind: "dirichlet" as const, values: new Float64Array(3) };
 * const { op } = discretize({
 *   domain: { x0: 0, x1: 1, y0: 0, y1: 1 }, nx, ny, a: one, b: zero, c: one, d: zero, e: zero,
 *   f: zero, boundary: { west: bc, east: bc, south: bc, north: bc },
 * });
 * if (op.C[op.index(1, 1)] !== -16) throw new Error("centre of the 5-point Laplacian at h = 1/2");
 * ```
 */
export function discretize(problem: Problem, upwind = false): Discretization {
  if (problem.conductivity !== undefined) return discretizeConservative(problem, upwind);
  const { nx, ny, domain, boundary } = problem;
  const hx = (domain.x1 - domain.x0) / nx;
  const hy = (domain.y1 - domain.y0) / ny;
  const layout = levelLayout(nx, ny);
  const { stride, length } = layout;
  // Without first-order terms and with every side Dirichlet-like, W = E and S = N at every node:
  // the arrays are then shared (E === W, N === S), which saves memory and lets the kernels take a
  // symmetric fast path.
  const symmetric = allZero(problem.b) && allZero(problem.d) &&
    [boundary.west, boundary.east, boundary.south, boundary.north].every(isDirichletLike);
  const W = new Float64Array(length), S = new Float64Array(length);
  const E = symmetric ? W : new Float64Array(length), N = symmetric ? S : new Float64Array(length);
  const C = new Float64Array(length), invC = new Float64Array(length).fill(1);
  const rhs = new Float64Array(length);
  const dirichlet: number[] = [];
  // Periodic sides never reach here (`solve` sends them to `stretched_solve.ts`).
  const { west, east, south, north } = boundary as Record<Side, ValuedCondition>;
  const dW = isDirichletLike(west), dE = isDirichletLike(east);
  const dS = isDirichletLike(south), dN = isDirichletLike(north);
  const gW = ghostData(west), gE = ghostData(east), gS = ghostData(south), gN = ghostData(north);
  const ihx2 = 1 / (hx * hx), ihy2 = 1 / (hy * hy), i2hx = 1 / (2 * hx), i2hy = 1 / (2 * hy);
  const { a, b, c, d, e, f } = problem;
  // The general stencil of one node (boundary rows, upwinding), per the module doc.
  const node = (i: number, j: number): void => {
    const q = j * (nx + 1) + i;
    const k = (j + 1) * stride + i + 1;
    const onW = i === 0 && dW, onE = i === nx && dE, onS = j === 0 && dS, onN = j === ny && dN;
    if (onW || onE || onS || onN) {
      C[k] = 1;
      rhs[k] = onW
        ? dirichletValue(west, j)
        : onE
        ? dirichletValue(east, j)
        : onS
        ? dirichletValue(south, i)
        : dirichletValue(north, i);
      dirichlet.push(k);
      return;
    }
    const aq = a[q], bq = b[q], cq = c[q], dq = d[q];
    let w: number, ea: number, s: number, n: number, cen: number;
    if (upwind) {
      w = aq * ihx2, ea = aq * ihx2, cen = -2 * aq * ihx2;
      const bx = bq / hx;
      if (bq * aq > 0) (ea += bx, cen -= bx);
      else (w -= bx, cen += bx);
      s = cq * ihy2, n = cq * ihy2, cen -= 2 * cq * ihy2;
      const dy = dq / hy;
      if (dq * cq > 0) (n += dy, cen -= dy);
      else (s -= dy, cen += dy);
    } else {
      w = aq * ihx2 - bq * i2hx;
      ea = aq * ihx2 + bq * i2hx;
      s = cq * ihy2 - dq * i2hy;
      n = cq * ihy2 + dq * i2hy;
      cen = -2 * aq * ihx2 - 2 * cq * ihy2;
    }
    cen += e[q];
    let r = f[q];
    // Ghost elimination: u_ghost = u_opposite + (2h/β)·(g − α·u), coefficient K folded in.
    if (i === 0) {
      const g = 2 * hx / betaAt(gW, j);
      ea += w, cen -= w * g * alphaAt(gW, j), r -= w * g * west.values[j], w = 0;
    } else if (i === nx) {
      const g = 2 * hx / betaAt(gE, j);
      w += ea, cen -= ea * g * alphaAt(gE, j), r -= ea * g * east.values[j], ea = 0;
    }
    if (j === 0) {
      const g = 2 * hy / betaAt(gS, i);
      n += s, cen -= s * g * alphaAt(gS, i), r -= s * g * south.values[i], s = 0;
    } else if (j === ny) {
      const g = 2 * hy / betaAt(gN, i);
      s += n, cen -= n * g * alphaAt(gN, i), r -= n * g * north.values[i], n = 0;
    }
    W[k] = w, E[k] = ea, S[k] = s, N[k] = n, C[k] = cen, invC[k] = 1 / cen;
    rhs[k] = r;
  };
  for (let j = 0; j <= ny; j++) {
    if (upwind || j === 0 || j === ny) {
      for (let i = 0; i <= nx; i++) node(i, j);
      continue;
    }
    // Interior of a row: central differences only, no boundary cases.
    node(0, j);
    const k0 = (j + 1) * stride + 1, q0 = j * (nx + 1);
    for (let i = 1; i < nx; i++) {
      const q = q0 + i, k = k0 + i;
      const ax = a[q] * ihx2, bx = b[q] * i2hx, cy = c[q] * ihy2, dy = d[q] * i2hy;
      const cen = e[q] - 2 * (ax + cy);
      W[k] = ax - bx, E[k] = ax + bx, S[k] = cy - dy, N[k] = cy + dy;
      C[k] = cen, invC[k] = 1 / cen, rhs[k] = f[q];
    }
    node(nx, j);
  }
  const base = {
    ...layout,
    hx,
    hy,
    W,
    E,
    S,
    N,
    C,
    invC,
    dirichlet: Int32Array.from(dirichlet),
    singular: isSingular(problem),
  };
  if (problem.m === undefined || allZero(problem.m)) return { op: base, rhs };
  return { op: { ...base, ...mixedCorners(problem, base, rhs) }, rhs };
}

/**
 * The corner arrays of m·u_xy with the ghost elimination of the module doc; W, E, S, N and rhs of
 * the boundary rows gain the folded terms in place.
 */
function mixedCorners(
  problem: Problem,
  op: LevelOperator,
  rhs: Float64Array,
): { SW: Float64Array; SE: Float64Array; NW: Float64Array; NE: Float64Array } {
  const { nx, ny, boundary } = problem;
  const { stride: s, length, hx, hy, W, E, S, N } = op;
  const m = problem.m!;
  const SW = new Float64Array(length), SE = new Float64Array(length);
  const NW = new Float64Array(length), NE = new Float64Array(length);
  const isDir = new Uint8Array(length);
  for (const k of op.dirichlet) isDir[k] = 1;
  const kappa = 1 / (4 * hx * hy);
  for (let j = 0; j <= ny; j++) {
    for (let i = 0; i <= nx; i++) {
      const k = (j + 1) * s + i + 1, q = j * (nx + 1) + i;
      if (isDir[k] || m[q] === 0) continue;
      const v = m[q] * kappa;
      NE[k] = v, SW[k] = v, NW[k] = -v, SE[k] = -v;
    }
  }
  // Folding of the corner ghosts, side by side (module doc). Each fold moves a coefficient K of a
  // ghost to its mirror image and adds −K·2h·α/β to the boundary neighbour the condition is taken
  // at, and −K·2h·g/β to the right-hand side.
  const fold = (
    k: number,
    K: number,
    mirror: Float64Array,
    mk: number,
    neighbour: Float64Array,
    side: "west" | "east" | "south" | "north",
    at: number,
    h2: number,
  ) => {
    const bc = boundary[side];
    const alpha = bc.kind === "robin" ? bc.alpha[at] : 0,
      beta = bc.kind === "robin" ? bc.beta[at] : 1;
    mirror[mk] += K;
    neighbour[k] -= K * h2 * alpha / beta;
    rhs[k] -= K * h2 * (bc as ValuedCondition).values[at] / beta;
  };
  if (!isDirichletLike(boundary.west)) {
    for (let j = 0; j <= ny; j++) {
      const k = (j + 1) * s + 1;
      if (isDir[k]) continue;
      if (NW[k] !== 0) fold(k, NW[k], NE, k, N, "west", j + 1, 2 * hx), NW[k] = 0;
      if (SW[k] !== 0) fold(k, SW[k], SE, k, S, "west", j - 1, 2 * hx), SW[k] = 0;
    }
  }
  if (!isDirichletLike(boundary.east)) {
    for (let j = 0; j <= ny; j++) {
      const k = (j + 1) * s + nx + 1;
      if (isDir[k]) continue;
      if (NE[k] !== 0) fold(k, NE[k], NW, k, N, "east", j + 1, 2 * hx), NE[k] = 0;
      if (SE[k] !== 0) fold(k, SE[k], SW, k, S, "east", j - 1, 2 * hx), SE[k] = 0;
    }
  }
  if (!isDirichletLike(boundary.south)) {
    for (let i = 0; i <= nx; i++) {
      const k = s + i + 1;
      if (isDir[k]) continue;
      if (SW[k] !== 0) fold(k, SW[k], NW, k, W, "south", i - 1, 2 * hy), SW[k] = 0;
      if (SE[k] !== 0) fold(k, SE[k], NE, k, E, "south", i + 1, 2 * hy), SE[k] = 0;
    }
  }
  if (!isDirichletLike(boundary.north)) {
    for (let i = 0; i <= nx; i++) {
      const k = (ny + 1) * s + i + 1;
      if (isDir[k]) continue;
      if (NW[k] !== 0) fold(k, NW[k], SW, k, W, "north", i - 1, 2 * hy), NW[k] = 0;
      if (NE[k] !== 0) fold(k, NE[k], SE, k, E, "north", i + 1, 2 * hy), NE[k] = 0;
    }
  }
  return { SW, SE, NW, NE };
}
