/**
 * Samples a manufactured solution onto the reference solver's vertex grid: coefficients, the source
 * f = L u and per-side boundary data from the exact solution (outward normal derivatives by hand:
 * west −u_x, east +u_x, south −u_y, north +u_y).
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
import { type Coefficients, type Field, sourceOf } from "./_manufactured.ts";

/** What kind of condition to put on a side; its data comes from the exact solution. */
export type SideSpec =
  | { kind: "dirichlet" }
  | { kind: "neumann" }
  | { kind: "robin"; alpha: number; beta: number };

/** Boundary kinds for the four sides. */
export type SideSpecs = Record<Side, SideSpec>;

/** Grid and boundary layout of a manufactured problem. */
export interface GridSpec {
  domain: Domain;
  nx: number;
  ny: number;
  sides: SideSpecs;
}

/** The four sides Dirichlet. */
export const ALL_DIRICHLET: SideSpecs = {
  west: { kind: "dirichlet" },
  east: { kind: "dirichlet" },
  south: { kind: "dirichlet" },
  north: { kind: "dirichlet" },
};

/** The four sides Neumann (needs e ≠ 0 for a unique solution). */
export const ALL_NEUMANN: SideSpecs = {
  west: { kind: "neumann" },
  east: { kind: "neumann" },
  south: { kind: "neumann" },
  north: { kind: "neumann" },
};

/** The four sides Robin with different α, β > 0 on each side. */
export const ALL_ROBIN: SideSpecs = {
  west: { kind: "robin", alpha: 1.5, beta: 0.7 },
  east: { kind: "robin", alpha: 0.8, beta: 1.3 },
  south: { kind: "robin", alpha: 2.0, beta: 0.5 },
  north: { kind: "robin", alpha: 1.0, beta: 1.0 },
};

/**
 * Three kinds at once: Dirichlet west, Neumann east and north, Robin south, so Dirichlet meets a
 * derivative side at two corners and Neumann meets Robin at one, Neumann meets Neumann at one.
 */
export const MIXED: SideSpecs = {
  west: { kind: "dirichlet" },
  east: { kind: "neumann" },
  south: { kind: "robin", alpha: 1.2, beta: 0.6 },
  north: { kind: "neumann" },
};

/** x coordinate of grid column i. */
export function nodeX(domain: Domain, nx: number, i: number): number {
  return domain.x0 + i * (domain.x1 - domain.x0) / nx;
}

/** y coordinate of row j. */
export function nodeY(domain: Domain, ny: number, j: number): number {
  return domain.y0 + j * (domain.y1 - domain.y0) / ny;
}

/** Samples a point function at every node (x fastest). */
export function sample(
  fn: (x: number, y: number) => number,
  grid: { domain: Domain; nx: number; ny: number },
): Float64Array {
  const { domain, nx, ny } = grid;
  const out = new Float64Array((nx + 1) * (ny + 1));
  for (let j = 0; j <= ny; j++) {
    const y = nodeY(domain, ny, j);
    for (let i = 0; i <= nx; i++) out[j * (nx + 1) + i] = fn(nodeX(domain, nx, i), y);
  }
  return out;
}

function sideData(field: Field, side: Side, spec: SideSpec, grid: GridSpec): BoundaryCondition {
  const { domain, nx, ny } = grid;
  const along = side === "west" || side === "east" ? ny + 1 : nx + 1;
  const values = new Float64Array(along);
  for (let k = 0; k < along; k++) {
    const x = side === "west" ? domain.x0 : side === "east" ? domain.x1 : nodeX(domain, nx, k);
    const y = side === "south" ? domain.y0 : side === "north" ? domain.y1 : nodeY(domain, ny, k);
    // outward normal derivative: −u_x on west, +u_x on east, −u_y on south, +u_y on north
    const dn = side === "west"
      ? -field.ux(x, y)
      : side === "east"
      ? field.ux(x, y)
      : side === "south"
      ? -field.uy(x, y)
      : field.uy(x, y);
    if (spec.kind === "dirichlet") values[k] = field.u(x, y);
    else if (spec.kind === "neumann") values[k] = dn;
    else values[k] = spec.alpha * field.u(x, y) + spec.beta * dn;
  }
  if (spec.kind === "robin") return robinCondition(spec.alpha, spec.beta, values);
  return { kind: spec.kind, values };
}

/** The discrete problem whose exact solution (up to discretization error) is `field`. */
export function manufacturedProblem(field: Field, k: Coefficients, grid: GridSpec): Problem {
  return {
    domain: grid.domain,
    nx: grid.nx,
    ny: grid.ny,
    a: sample(k.a, grid),
    b: sample(k.b, grid),
    c: sample(k.c, grid),
    d: sample(k.d, grid),
    e: sample(k.e, grid),
    f: sample(sourceOf(field, k), grid),
    boundary: {
      west: sideData(field, "west", grid.sides.west, grid),
      east: sideData(field, "east", grid.sides.east, grid),
      south: sideData(field, "south", grid.sides.south, grid),
      north: sideData(field, "north", grid.sides.north, grid),
    },
  };
}

/** Max-norm and area-weighted (trapezoid) L2-norm of the error of `u` against `field`. */
export function errorNorms(
  u: Float64Array,
  field: Field,
  grid: { domain: Domain; nx: number; ny: number },
): { max: number; l2: number } {
  const { domain, nx, ny } = grid;
  let max = 0;
  let sum = 0;
  let area = 0;
  for (let j = 0; j <= ny; j++) {
    const wy = j === 0 || j === ny ? 0.5 : 1;
    const y = nodeY(domain, ny, j);
    for (let i = 0; i <= nx; i++) {
      const wx = i === 0 || i === nx ? 0.5 : 1;
      const err = Math.abs(u[j * (nx + 1) + i] - field.u(nodeX(domain, nx, i), y));
      if (err > max) max = err;
      sum += wx * wy * err * err;
      area += wx * wy;
    }
  }
  return { max, l2: Math.sqrt(sum / area) };
}

/** Largest |value| of a field over the grid nodes (the scale of relative errors). */
export function maxAbs(field: Field, grid: { domain: Domain; nx: number; ny: number }): number {
  return sample(field.u, grid).reduce((m, v) => Math.max(m, Math.abs(v)), 0);
}
