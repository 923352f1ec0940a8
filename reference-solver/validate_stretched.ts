/**
 * Checks of the parts of a {@link Problem} that only stretched and periodic grids have: the node
 * coordinates, periodic pairs and the agreement of the data at the periodic images, and the
 * combinations the stretched discretization does not support. Called by `validateProblem` after
 * the node arrays and the valued boundary conditions have been checked.
 *
 * Checks, in order:
 * - `coordinates`: x (nx + 1 values) and y (ny + 1 values) Float64Arrays, finite, strictly
 *   increasing, first and last equal to the domain's edges (to 1e-12 of the domain's length).
 * - periodic sides come in pairs: west with east, south with north.
 * - with west+east periodic, node i = nx is the image of i = 0: a, b, c, d, e, f (and m) agree
 *   there at every j, the south and north values agree at their first and last entries, and a
 *   conductivity's y-edge values agree at i = 0 and i = nx (alike for south+north).
 * - not supported on the stretched path (coordinates or a periodic side): a mixed term m ≠ 0 and
 *   an off-diagonal conductivity k12 ≠ 0 (refused with a RangeError naming them).
 *
 * @module
 */
import { type Problem, SIDES } from "./problem.ts";

/** Whether a problem takes the stretched path: node coordinates or a periodic side. */
export function isStretched(problem: Problem): boolean {
  return problem.coordinates !== undefined ||
    SIDES.some((s) => problem.boundary[s].kind === "periodic");
}

function agree(u: number, v: number): boolean {
  return u === v || Math.abs(u - v) <= 1e-12 * Math.max(1, Math.abs(u), Math.abs(v));
}

function checkAxis(problem: Problem, axis: "x" | "y"): void {
  const n = axis === "x" ? problem.nx : problem.ny;
  const lo = axis === "x" ? problem.domain.x0 : problem.domain.y0;
  const hi = axis === "x" ? problem.domain.x1 : problem.domain.y1;
  const v = problem.coordinates![axis];
  const path = `problem.coordinates.${axis}`;
  if (!(v instanceof Float64Array) || v.length !== n + 1) {
    const got = v instanceof Float64Array ? `length ${v.length}` : typeof v;
    throw new RangeError(
      `Invalid ${path}: expected a Float64Array of n${axis} + 1 = ${
        n + 1
      } node coordinates, got ${got}`,
    );
  }
  for (let k = 0; k <= n; k++) {
    if (!Number.isFinite(v[k])) {
      throw new RangeError(`Invalid ${path}[${k}]: value ${v[k]} is not finite`);
    }
    if (k > 0 && !(v[k] > v[k - 1])) {
      throw new RangeError(
        `Invalid ${path}[${k}]: coordinates must increase strictly, got ${v[k - 1]} then ${
          v[k]
        }; check the mapping (it must be monotone)`,
      );
    }
  }
  const tol = 1e-12 * (hi - lo);
  if (Math.abs(v[0] - lo) > tol || Math.abs(v[n] - hi) > tol) {
    throw new RangeError(
      `Invalid ${path}: the first and last coordinates must be the domain's edges ${lo} and ${hi}, got ${
        v[0]
      } and ${v[n]}; map the parameter range onto the domain exactly`,
    );
  }
}

/**
 * Validates coordinates, periodic pairs and image agreement, and refuses unsupported
 * combinations (see the module doc).
 *
 * @throws {RangeError} Naming the field, side or node, the values, and how to fix it.
 */
export function validatePeriodic(problem: Problem): void {
  const { nx, ny, boundary } = problem;
  if (problem.coordinates !== undefined) {
    if (typeof problem.coordinates !== "object" || problem.coordinates === null) {
      throw new RangeError("Invalid problem.coordinates: expected { x, y } Float64Arrays");
    }
    checkAxis(problem, "x");
    checkAxis(problem, "y");
  }
  const pairs = [["west", "east"], ["south", "north"]] as const;
  for (const [s0, s1] of pairs) {
    const p0 = boundary[s0].kind === "periodic", p1 = boundary[s1].kind === "periodic";
    if (p0 !== p1) {
      const lone = p0 ? s0 : s1, other = p0 ? s1 : s0;
      throw new RangeError(
        `Invalid problem.boundary.${lone}: a periodic side needs its opposite side periodic too, but ${other} is ${
          boundary[other].kind
        }; make ${other} periodic as well, or give ${lone} another kind`,
      );
    }
  }
  const px = boundary.west.kind === "periodic", py = boundary.south.kind === "periodic";
  const arrays: [string, Float64Array][] = (["a", "b", "c", "d", "e", "f"] as const).map((
    n,
  ) => [n, problem[n]]);
  if (problem.m !== undefined) arrays.push(["m", problem.m]);
  const mismatch = (
    what: string,
    i0: number,
    j0: number,
    i1: number,
    j1: number,
    u: number,
    v: number,
  ) =>
    new RangeError(
      `Invalid ${what}: node (${i1}, ${j1}) is the periodic image of node (${i0}, ${j0}) and must carry the same value, got ${v} there and ${u} at (${i0}, ${j0}); sample periodic data`,
    );
  if (px) {
    for (const [name, v] of arrays) {
      for (let j = 0; j <= ny; j++) {
        const q = j * (nx + 1);
        if (!agree(v[q], v[q + nx])) {
          throw mismatch(`problem.${name}`, 0, j, nx, j, v[q], v[q + nx]);
        }
      }
    }
    for (const side of ["south", "north"] as const) {
      const bc = boundary[side];
      if (bc.kind !== "periodic" && !agree(bc.values[0], bc.values[nx])) {
        const j = side === "south" ? 0 : ny;
        throw mismatch(`problem.boundary.${side}.values`, 0, j, nx, j, bc.values[0], bc.values[nx]);
      }
    }
    const k22 = problem.conductivity?.alongY.k22;
    for (let j = 0; k22 !== undefined && j < ny; j++) {
      const q = j * (nx + 1);
      if (!agree(k22[q], k22[q + nx])) {
        throw mismatch(
          `problem.conductivity.alongY.k22 (y-edge j + ½)`,
          0,
          j,
          nx,
          j,
          k22[q],
          k22[q + nx],
        );
      }
    }
  }
  if (py) {
    for (const [name, v] of arrays) {
      for (let i = 0; i <= nx; i++) {
        if (!agree(v[i], v[ny * (nx + 1) + i])) {
          throw mismatch(`problem.${name}`, i, 0, i, ny, v[i], v[ny * (nx + 1) + i]);
        }
      }
    }
    for (const side of ["west", "east"] as const) {
      const bc = boundary[side];
      if (bc.kind !== "periodic" && !agree(bc.values[0], bc.values[ny])) {
        const i = side === "west" ? 0 : nx;
        throw mismatch(`problem.boundary.${side}.values`, i, 0, i, ny, bc.values[0], bc.values[ny]);
      }
    }
    const k11 = problem.conductivity?.alongX.k11;
    for (let i = 0; k11 !== undefined && i < nx; i++) {
      if (!agree(k11[i], k11[ny * nx + i])) {
        throw mismatch(
          `problem.conductivity.alongX.k11 (x-edge i + ½)`,
          i,
          0,
          i,
          ny,
          k11[i],
          k11[ny * nx + i],
        );
      }
    }
  }
  if (!isStretched(problem)) return;
  const what = problem.coordinates !== undefined
    ? "a stretched grid (coordinates)"
    : "a periodic side";
  const nonzero = (v: Float64Array | undefined) => v !== undefined && v.some((x) => x !== 0);
  if (problem.conductivity === undefined && nonzero(problem.m)) {
    throw new RangeError(
      `Unsupported problem: a mixed term m ≠ 0 on ${what}; the stretched discretization has no u_xy term yet. Use a uniform grid with non-periodic sides, or drop m`,
    );
  }
  const K = problem.conductivity;
  if (K !== undefined && (nonzero(K.alongX.k12) || nonzero(K.alongY.k12))) {
    throw new RangeError(
      `Unsupported problem: an off-diagonal conductivity k12 ≠ 0 on ${what}; the stretched flux form has no cross-flux term yet. Use a uniform grid with non-periodic sides, or a diagonal K`,
    );
  }
}
