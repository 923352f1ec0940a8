/**
 * Grid families and problem builders of the stretched-grid tests and bench: a tanh clustering
 * toward both ends, a geometric progression, and an alternating-spacing family (cells h and 2h in
 * turn: not a smooth map, so the truncation error is first order).
 *
 * @module
 */
import {
  type BoundaryCondition,
  type Problem,
  robinCondition,
  type Side,
} from "../../reference-solver/mod.ts";

/** Tanh clustering toward both ends of [0, 1]: x(s) = ½(1 + tanh(β(2s − 1))/tanh β). */
export function tanhBoth(n: number, beta: number): Float64Array {
  const x = Float64Array.from(
    { length: n + 1 },
    (_, i) => 0.5 * (1 + Math.tanh(beta * (2 * i / n - 1)) / Math.tanh(beta)),
  );
  x[0] = 0, x[n] = 1;
  return x;
}

/** Geometric progression on [0, 1] whose last cell is `ratio` times the first. */
export function geometric(n: number, ratio: number): Float64Array {
  const q = Math.pow(ratio, 1 / (n - 1));
  const x = new Float64Array(n + 1);
  for (let i = 1; i <= n; i++) x[i] = x[i - 1] + Math.pow(q, i - 1);
  for (let i = 0; i <= n; i++) x[i] /= x[n];
  return x;
}

/** Cells of length h and 2h in turn on [0, 1] (n even). */
export function alternating(n: number): Float64Array {
  const h = 2 / (3 * n);
  const x = new Float64Array(n + 1);
  for (let i = 1; i <= n; i++) x[i] = x[i - 1] + (i % 2 === 1 ? h : 2 * h);
  x[n] = 1;
  return x;
}

/** Largest over smallest cell. */
export function stretchRatio(x: Float64Array): number {
  let lo = Infinity, hi = 0;
  for (let i = 1; i < x.length; i++) {
    lo = Math.min(lo, x[i] - x[i - 1]), hi = Math.max(hi, x[i] - x[i - 1]);
  }
  return hi / lo;
}

/** The β of {@link tanhBoth} whose ratio is `ratio` in the fine limit (bisection at n = 4096). */
export function tanhBetaFor(ratio: number): number {
  let lo = 0.01, hi = 10;
  for (let it = 0; it < 80; it++) {
    const mid = (lo + hi) / 2;
    if (stretchRatio(tanhBoth(4096, mid)) > ratio) hi = mid;
    else lo = mid;
  }
  return (lo + hi) / 2;
}

/** A manufactured field: value, gradient, and the operator's source. */
export interface Field {
  u: (x: number, y: number) => number;
  ux: (x: number, y: number) => number;
  uy: (x: number, y: number) => number;
  /** a·u_xx + c·u_yy + b·u_x + d·u_y + e·u with the coefficients of {@link build}. */
  f: (x: number, y: number) => number;
}

/** Per-side condition kind for {@link build}. */
export type Kinds = Record<Side, "dirichlet" | "neumann" | "robin" | "periodic">;

/**
 * The problem a·u_xx + c·u_yy + b·u_x + d·u_y + e·u = f on [0, 1]² with constant coefficients,
 * the given node coordinates, and boundary data of the field (Robin α = 1, β = 1).
 */
export function build(
  field: Field,
  x: Float64Array,
  y: Float64Array,
  kinds: Kinds,
  k: { a: number; b: number; c: number; d: number; e: number },
): Problem {
  const nx = x.length - 1, ny = y.length - 1, count = (nx + 1) * (ny + 1);
  const fill = (v: number) => new Float64Array(count).fill(v);
  const f = new Float64Array(count);
  for (let j = 0; j <= ny; j++) {
    for (let i = 0; i <= nx; i++) f[j * (nx + 1) + i] = field.f(x[i], y[j]);
  }
  const side = (s: Side): BoundaryCondition => {
    const kind = kinds[s];
    if (kind === "periodic") return { kind };
    const vertical = s === "west" || s === "east";
    const pts = vertical ? y : x;
    const values = Float64Array.from(pts, (t) => {
      const px = vertical ? (s === "west" ? 0 : 1) : t, py = vertical ? t : (s === "south" ? 0 : 1);
      const dn = s === "west"
        ? -field.ux(px, py)
        : s === "east"
        ? field.ux(px, py)
        : s === "south"
        ? -field.uy(px, py)
        : field.uy(px, py);
      return kind === "dirichlet"
        ? field.u(px, py)
        : kind === "neumann"
        ? dn
        : field.u(px, py) + dn;
    });
    return kind === "robin" ? robinCondition(1, 1, values) : { kind, values };
  };
  return {
    domain: { x0: 0, x1: 1, y0: 0, y1: 1 },
    nx,
    ny,
    a: fill(k.a),
    b: fill(k.b),
    c: fill(k.c),
    d: fill(k.d),
    e: fill(k.e),
    f,
    boundary: {
      west: side("west"),
      east: side("east"),
      south: side("south"),
      north: side("north"),
    },
    coordinates: { x, y },
  };
}

/** The field sampled at the nodes. */
export function sampleAt(field: Field, x: Float64Array, y: Float64Array): Float64Array {
  const nx = x.length - 1, out = new Float64Array((nx + 1) * y.length);
  for (let j = 0; j < y.length; j++) {
    for (let i = 0; i <= nx; i++) out[j * (nx + 1) + i] = field.u(x[i], y[j]);
  }
  return out;
}

/** The boundary of a problem as the SciPy scripts read it (JSON: arrays as lists). */
export function boundaryJson(boundary: Record<Side, BoundaryCondition>): Record<string, unknown> {
  const arr = (v: Float64Array) => Array.from(v);
  return Object.fromEntries(
    Object.entries(boundary).map(([side, bc]) => [
      side,
      bc.kind === "periodic"
        ? { kind: "periodic" }
        : bc.kind === "robin"
        ? { kind: "robin", alpha: arr(bc.alpha), beta: arr(bc.beta), values: arr(bc.values) }
        : { kind: bc.kind, values: arr(bc.values) },
    ]),
  );
}

/** Largest difference between two solutions, and the larger magnitude of the second. */
export function largestDifference(
  mine: ArrayLike<number>,
  theirs: ArrayLike<number>,
): { diff: number; scale: number } {
  let diff = 0, scale = 0;
  for (let k = 0; k < theirs.length; k++) {
    diff = Math.max(diff, Math.abs(mine[k] - theirs[k]));
    scale = Math.max(scale, Math.abs(theirs[k]));
  }
  return { diff, scale };
}
