/**
 * Problems for the reference solver's own tests, sampled from closed-form functions.
 *
 * @module
 */
import {
  type BoundaryCondition,
  type Domain,
  type Problem,
  robinCondition,
  type Side,
} from "./problem.ts";

/** A scalar function of (x, y). */
export type Fn = (x: number, y: number) => number;

/** An exact solution with its first and second derivatives. */
export interface Exact {
  u: Fn;
  ux: Fn;
  uy: Fn;
  uxx: Fn;
  uyy: Fn;
}

/** Coefficient functions of the operator. */
export interface Coefficients {
  a: Fn;
  b: Fn;
  c: Fn;
  d: Fn;
  e: Fn;
}

/** How each side is given: Dirichlet, Neumann, or Robin with (α, β). */
export type SideSpec = "dirichlet" | "neumann" | { alpha: number; beta: number };

const zero: Fn = () => 0;

/** Coefficients with only a = c = 1 (the Laplacian). */
export const LAPLACE: Coefficients = {
  a: () => 1,
  b: zero,
  c: () => 1,
  d: zero,
  e: zero,
};

/** Smooth variable coefficients, all five non-zero (a·c > 0 on any domain). */
export const VARIABLE: Coefficients = {
  a: (x, y) => 1 + 0.3 * Math.sin(x + 2 * y),
  b: (x, y) => 0.7 * Math.cos(x - y),
  c: (x, y) => 1.4 + 0.25 * Math.cos(x * y),
  d: (_x, y) => -0.5 + 0.4 * Math.sin(y),
  e: (x, y) => -(0.5 + 0.2 * x * x + 0.1 * y),
};

/**
 * Samples a problem whose exact solution is `exact`: f = L u and boundary data from u and its
 * derivatives (∂u/∂n with the outward normal).
 */
export function manufactured(
  coef: Coefficients,
  exact: Exact,
  grid: { nx: number; ny: number; domain?: Domain },
  sides: Record<Side, SideSpec>,
): Problem {
  const { nx, ny } = grid;
  const domain = grid.domain ?? { x0: 0, x1: 1, y0: 0, y1: 1 };
  const hx = (domain.x1 - domain.x0) / nx, hy = (domain.y1 - domain.y0) / ny;
  const N = (nx + 1) * (ny + 1);
  const arr = () => new Float64Array(N);
  const a = arr(), b = arr(), c = arr(), d = arr(), e = arr(), f = arr();
  for (let j = 0; j <= ny; j++) {
    for (let i = 0; i <= nx; i++) {
      const x = domain.x0 + i * hx, y = domain.y0 + j * hy, q = j * (nx + 1) + i;
      a[q] = coef.a(x, y), b[q] = coef.b(x, y), c[q] = coef.c(x, y), d[q] = coef.d(x, y);
      e[q] = coef.e(x, y);
      f[q] = a[q] * exact.uxx(x, y) + b[q] * exact.ux(x, y) + c[q] * exact.uyy(x, y) +
        d[q] * exact.uy(x, y) + e[q] * exact.u(x, y);
    }
  }
  const side = (s: Side): BoundaryCondition => {
    const spec = sides[s];
    const n = s === "west" || s === "east" ? ny : nx;
    const values = new Float64Array(n + 1);
    for (let k = 0; k <= n; k++) {
      const x = s === "west" ? domain.x0 : s === "east" ? domain.x1 : domain.x0 + k * hx;
      const y = s === "south" ? domain.y0 : s === "north" ? domain.y1 : domain.y0 + k * hy;
      const dn = s === "west"
        ? -exact.ux(x, y)
        : s === "east"
        ? exact.ux(x, y)
        : s === "south"
        ? -exact.uy(x, y)
        : exact.uy(x, y);
      values[k] = spec === "dirichlet"
        ? exact.u(x, y)
        : spec === "neumann"
        ? dn
        : spec.alpha * exact.u(x, y) + spec.beta * dn;
    }
    if (spec === "dirichlet") return { kind: "dirichlet", values };
    if (spec === "neumann") return { kind: "neumann", values };
    return robinCondition(spec.alpha, spec.beta, values);
  };
  return {
    domain,
    nx,
    ny,
    a,
    b,
    c,
    d,
    e,
    f,
    boundary: {
      west: side("west"),
      east: side("east"),
      south: side("south"),
      north: side("north"),
    },
  };
}

/** All four sides Dirichlet. */
export const ALL_DIRICHLET: Record<Side, SideSpec> = {
  west: "dirichlet",
  east: "dirichlet",
  south: "dirichlet",
  north: "dirichlet",
};

/** A smooth non-polynomial solution, sin(πx)·cos(πy/2)·exp(x·y/2) + 0.3·x. */
export const SMOOTH: Exact = (() => {
  const P = Math.PI;
  const g = (x: number, y: number) => Math.exp(0.5 * x * y);
  return {
    u: (x, y) => Math.sin(P * x) * Math.cos(P * y / 2) * g(x, y) + 0.3 * x,
    ux: (x, y) =>
      Math.cos(P * y / 2) * g(x, y) * (P * Math.cos(P * x) + 0.5 * y * Math.sin(P * x)) + 0.3,
    uy: (x, y) =>
      Math.sin(P * x) * g(x, y) * (-(P / 2) * Math.sin(P * y / 2) + 0.5 * x * Math.cos(P * y / 2)),
    uxx: (x, y) =>
      Math.cos(P * y / 2) * g(x, y) *
      (-P * P * Math.sin(P * x) + P * y * Math.cos(P * x) + 0.25 * y * y * Math.sin(P * x)),
    uyy: (x, y) =>
      Math.sin(P * x) * g(x, y) *
      (-(P * P / 4) * Math.cos(P * y / 2) - (P / 2) * x * Math.sin(P * y / 2) +
        0.25 * x * x * Math.cos(P * y / 2)),
  };
})();
