/**
 * Manufactured problems for the two newer operator forms: the conservative form
 * ∇·(K∇u) + b·u_x + d·u_y + e·u = f with a tensor K sampled at the edge midpoints, and the
 * non-conservative form with a mixed term m·u_xy. Sources and boundary data are written out by
 * hand from the product rule:
 *
 *   ∇·(K∇u) = ∂x(k11·u_x + k12·u_y) + ∂y(k12·u_x + k22·u_y)
 *           = k11_x·u_x + k11·u_xx + k12_x·u_y + 2·k12·u_xy + k12_y·u_x + k22_y·u_y + k22·u_yy,
 *
 * and the conormal flux on a side, (K∇u)·n with n outward: west −(k11·u_x + k12·u_y), east
 * k11·u_x + k12·u_y, south −(k12·u_x + k22·u_y), north k12·u_x + k22·u_y (K at the boundary node).
 *
 * @module
 */
import {
  type BoundaryCondition,
  type Domain,
  type Problem,
  robinCondition,
  type Side,
} from "../../reference-solver/mod.ts";
import { nodeX, nodeY, sample, type SideSpecs } from "./_build.ts";
import { type Fn, sampleConductivity } from "./_conductivity.ts";

/** A solution with the derivatives the two forms need (u_xy included). */
export interface FieldXY {
  name: string;
  u: Fn;
  ux: Fn;
  uy: Fn;
  uxx: Fn;
  uyy: Fn;
  uxy: Fn;
}

/** K with the first derivatives the source needs (∂x k11, ∂x k12, ∂y k12, ∂y k22). */
export interface Tensor {
  name: string;
  k11: Fn;
  k12: Fn;
  k22: Fn;
  k11x: Fn;
  k12x: Fn;
  k12y: Fn;
  k22y: Fn;
}

/** First-order and zeroth-order coefficients (b, d, e). */
export interface LowerOrder {
  b: Fn;
  d: Fn;
  e: Fn;
}

/** b = d = e = 0. */
export const NO_LOWER: LowerOrder = { b: () => 0, d: () => 0, e: () => 0 };

const zero: Fn = () => 0;

/** A constant tensor (derivatives zero). */
export function constantTensor(k11: number, k12: number, k22: number): Tensor {
  return {
    name: `K = [[${k11}, ${k12}], [${k12}, ${k22}]]`,
    k11: () => k11,
    k12: () => k12,
    k22: () => k22,
    k11x: zero,
    k12x: zero,
    k12y: zero,
    k22y: zero,
  };
}

/** ∇·(K∇u) + b·u_x + d·u_y + e·u at (x, y), by the product rule of the module doc. */
export function conservativeSource(K: Tensor, u: FieldXY, lower: LowerOrder): Fn {
  return (x, y) =>
    K.k11x(x, y) * u.ux(x, y) + K.k11(x, y) * u.uxx(x, y) + K.k12x(x, y) * u.uy(x, y) +
    2 * K.k12(x, y) * u.uxy(x, y) + K.k12y(x, y) * u.ux(x, y) + K.k22y(x, y) * u.uy(x, y) +
    K.k22(x, y) * u.uyy(x, y) + lower.b(x, y) * u.ux(x, y) + lower.d(x, y) * u.uy(x, y) +
    lower.e(x, y) * u.u(x, y);
}

function sideValues(
  side: Side,
  grid: { domain: Domain; nx: number; ny: number },
  value: (x: number, y: number) => number,
): Float64Array {
  const { domain, nx, ny } = grid;
  const n = side === "west" || side === "east" ? ny : nx;
  const out = new Float64Array(n + 1);
  for (let k = 0; k <= n; k++) {
    const x = side === "west" ? domain.x0 : side === "east" ? domain.x1 : nodeX(domain, nx, k);
    const y = side === "south" ? domain.y0 : side === "north" ? domain.y1 : nodeY(domain, ny, k);
    out[k] = value(x, y);
  }
  return out;
}

function condition(
  spec: SideSpecs[Side],
  values: (derivative: boolean) => Float64Array,
  u: Float64Array,
): BoundaryCondition {
  if (spec.kind === "dirichlet") return { kind: "dirichlet", values: u };
  const dn = values(true);
  if (spec.kind === "neumann") return { kind: "neumann", values: dn };
  const g = dn.map((v, k) => spec.alpha * u[k] + spec.beta * v);
  return robinCondition(spec.alpha, spec.beta, g);
}

/**
 * The conservative problem whose solution is `u`: K sampled at the edge midpoints (with the
 * interface rule of `_conductivity.ts` when `interfaces`), f from `source` (default the product
 * rule) at the nodes, boundary data from u and the conormal flux.
 */
export function conservativeProblem(spec: {
  grid: { domain: Domain; nx: number; ny: number };
  K: Tensor;
  u: FieldXY;
  sides: SideSpecs;
  lower?: LowerOrder;
  source?: Fn;
  interfaces?: boolean;
  /** Drop k12 from the sampled conductivity (for a diagonal K). Default: k12 kept. */
  diagonal?: boolean;
}): Problem {
  const { grid, K, u, sides } = spec;
  const lower = spec.lower ?? NO_LOWER;
  const conductivity = sampleConductivity(
    spec.diagonal ? { k11: K.k11, k22: K.k22 } : { k11: K.k11, k12: K.k12, k22: K.k22 },
    grid,
    spec.interfaces ?? false,
  );
  const flux = (side: Side) => (x: number, y: number) => {
    const fx = K.k11(x, y) * u.ux(x, y) + K.k12(x, y) * u.uy(x, y);
    const fy = K.k12(x, y) * u.ux(x, y) + K.k22(x, y) * u.uy(x, y);
    return side === "west" ? -fx : side === "east" ? fx : side === "south" ? -fy : fy;
  };
  const boundary = Object.fromEntries(
    (["west", "east", "south", "north"] as const).map((side) => [
      side,
      condition(
        sides[side],
        () => sideValues(side, grid, flux(side)),
        sideValues(side, grid, u.u),
      ),
    ]),
  ) as Record<Side, BoundaryCondition>;
  const zeros = new Float64Array((grid.nx + 1) * (grid.ny + 1));
  return {
    domain: grid.domain,
    nx: grid.nx,
    ny: grid.ny,
    a: zeros,
    b: sample(lower.b, grid),
    c: zeros,
    d: sample(lower.d, grid),
    e: sample(lower.e, grid),
    f: sample(spec.source ?? conservativeSource(K, u, lower), grid),
    boundary,
    conductivity,
  };
}

/**
 * The non-conservative problem a·u_xx + m·u_xy + c·u_yy + b·u_x + d·u_y + e·u = f whose solution
 * is `u`, with boundary data from u and its outward normal derivative.
 */
export function mixedProblem(spec: {
  grid: { domain: Domain; nx: number; ny: number };
  coef: { a: Fn; m: Fn; c: Fn } & LowerOrder;
  u: FieldXY;
  sides: SideSpecs;
}): Problem {
  const { grid, coef, u, sides } = spec;
  const normal = (side: Side) => (x: number, y: number) =>
    side === "west"
      ? -u.ux(x, y)
      : side === "east"
      ? u.ux(x, y)
      : side === "south"
      ? -u.uy(x, y)
      : u.uy(x, y);
  const boundary = Object.fromEntries(
    (["west", "east", "south", "north"] as const).map((side) => [
      side,
      condition(
        sides[side],
        () => sideValues(side, grid, normal(side)),
        sideValues(side, grid, u.u),
      ),
    ]),
  ) as Record<Side, BoundaryCondition>;
  return {
    domain: grid.domain,
    nx: grid.nx,
    ny: grid.ny,
    a: sample(coef.a, grid),
    b: sample(coef.b, grid),
    c: sample(coef.c, grid),
    d: sample(coef.d, grid),
    e: sample(coef.e, grid),
    m: sample(coef.m, grid),
    f: sample(
      (x, y) =>
        coef.a(x, y) * u.uxx(x, y) + coef.m(x, y) * u.uxy(x, y) + coef.c(x, y) * u.uyy(x, y) +
        coef.b(x, y) * u.ux(x, y) + coef.d(x, y) * u.uy(x, y) + coef.e(x, y) * u.u(x, y),
      grid,
    ),
    boundary,
  };
}

/** Max-norm error of a solution against u at the nodes. */
export function maxError(
  solution: Float64Array,
  u: Fn,
  grid: { domain: Domain; nx: number; ny: number },
): number {
  const exact = sample(u, grid);
  let e = 0;
  for (let k = 0; k < exact.length; k++) e = Math.max(e, Math.abs(solution[k] - exact[k]));
  return e;
}
