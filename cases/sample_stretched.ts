/**
 * Sampling a compiled case onto a stretched vertex grid: the coefficients, the source and the
 * exact solution at the mapped nodes (x[i], y[j]), the boundary data at the nodes of each side,
 * K at the physical edge midpoints ((x[i] + x[i+1])/2, y[j]) and (x[i], (y[j] + y[j+1])/2). The
 * problem carries the node coordinates (`Problem.coordinates`), so the reference solver takes its
 * non-uniform path. Point by point on the calling thread (the fused row sampler assumes equal
 * steps).
 *
 * @module
 */
import type { BoundaryCondition, Problem, Side } from "../reference-solver/mod.ts";
import type { Grid } from "../grid/mod.ts";
import { checkGridSize, checkSampled, FIELDS, type SamplerSpec } from "./sample.ts";
import type { PointFn } from "./types.ts";

/** Values of fn at (xs[i], ys[j]), x fastest. */
export function onLattice(fn: PointFn, xs: Float64Array, ys: Float64Array): Float64Array {
  const out = new Float64Array(xs.length * ys.length);
  for (let j = 0, k = 0; j < ys.length; j++) {
    for (let i = 0; i < xs.length; i++, k++) out[k] = fn(xs[i], ys[j]);
  }
  return out;
}

/** The midpoints of neighbouring lines. */
export function midpoints(lines: Float64Array): Float64Array {
  const out = new Float64Array(lines.length - 1);
  for (let i = 0; i < out.length; i++) out[i] = (lines[i] + lines[i + 1]) / 2;
  return out;
}

/** One side's values of fn at its nodes, by increasing coordinate. */
function alongSide(fn: PointFn, side: Side, grid: Grid): Float64Array {
  const { x, y } = grid.lines;
  const vertical = side === "west" || side === "east";
  const fixed = side === "west"
    ? grid.box.x0
    : side === "east"
    ? grid.box.x1
    : side === "south"
    ? grid.box.y0
    : grid.box.y1;
  const along = vertical ? y : x;
  return Float64Array.from(along, (s) => vertical ? fn(fixed, s) : fn(s, fixed));
}

/**
 * Samples a case onto the vertex grid `grid` (its lines are the node coordinates) and checks it
 * like the uniform sampler.
 *
 * @param spec what sampling needs from the case
 * @param grid a vertex grid over the case's domain
 * @returns the problem, with `coordinates`
 * @throws {RangeError} for a bad grid size, non-finite values or a non-elliptic operator
 */
export function sampleStretched(spec: SamplerSpec, grid: Grid): Problem {
  const { x, y } = grid.lines;
  const nx = x.length - 1, ny = y.length - 1;
  checkGridSize(nx, ny);
  const [a, b, c, d, e, f] = FIELDS.map((field) => onLattice(spec.pointFunctions[field], x, y));
  const boundary = {} as Record<Side, BoundaryCondition>;
  for (const side of ["west", "east", "south", "north"] as const) {
    const bc = spec.boundary[side];
    const values = alongSide(bc.data, side, grid);
    boundary[side] = bc.kind === "robin"
      ? {
        kind: "robin",
        alpha: alongSide(bc.alpha!, side, grid),
        beta: alongSide(bc.beta!, side, grid),
        values,
      }
      : { kind: bc.kind, values } as BoundaryCondition;
  }
  const problem: Problem = {
    domain: { ...spec.domain },
    nx,
    ny,
    a,
    b,
    c,
    d,
    e,
    f,
    boundary,
    coordinates: { x: Float64Array.from(x), y: Float64Array.from(y) },
  };
  if (spec.mixed) problem.m = onLattice(spec.mixed, x, y);
  const k = spec.conductivity;
  if (k) {
    const mx = midpoints(x), my = midpoints(y);
    problem.conductivity = {
      alongX: {
        k11: onLattice(k.faceX.k11, mx, y),
        ...(k.tensor ? { k12: onLattice(k.faceX.k12, mx, y) } : {}),
      },
      alongY: {
        k22: onLattice(k.faceY.k22, x, my),
        ...(k.tensor ? { k12: onLattice(k.faceY.k12, x, my) } : {}),
      },
    };
  }
  checkSampled(spec, problem);
  return problem;
}
