/**
 * Checks of the two optional operator forms of a {@link Problem}: the mixed coefficient `m` and the
 * conductivity of the conservative form. Called by `validateProblem` after the node arrays and the
 * boundary conditions have been checked.
 *
 * Checks, in order:
 * - `m` (ignored when a conductivity is given): a Float64Array of (nx+1)(ny+1) finite values;
 *   ellipticity 4ac − m² > 0 at every node; m = 0 at every corner where two Neumann/Robin sides
 *   meet (the ghost node outside both sides has no defining condition, see `discretize.ts`).
 * - `conductivity`: k11 (x-edges, nx·(ny+1) values) and k22 (y-edges, (nx+1)·ny values) present,
 *   k12 optional on either, all finite; k11 > 0 at every x-edge midpoint and k22 > 0 at every
 *   y-edge midpoint; where k12 is given, k11·k22 − k12² > 0. An edge midpoint carries only two of
 *   the three entries of K, so the missing diagonal entry is estimated there by the mean of its
 *   samples on the nearest edges of the other family: at the x-edge midpoint (i + ½, j), k22 is
 *   the mean of the y-edge values at (i, j ± ½) and (i + 1, j ± ½) that exist (four, or two on a
 *   boundary row); at the y-edge midpoint (i, j + ½), k11 is the mean of the x-edge values at
 *   (i ± ½, j) and (i ± ½, j + 1) that exist. For smooth K this is K's own value to O(h²); across a
 *   jump it is a sanity check, not a proof.
 *
 * @module
 */
import type { BoundaryCondition, Problem } from "./problem.ts";

// The same rule as `isDirichletLike` in validate.ts, repeated here so the two modules do not
// import each other.
function fixesU(bc: BoundaryCondition): boolean {
  return bc.kind === "dirichlet" || (bc.kind === "robin" && bc.beta.every((v) => v === 0));
}

function node(problem: Problem, i: number, j: number): string {
  const { x0, x1, y0, y1 } = problem.domain;
  const x = x0 + (i * (x1 - x0)) / problem.nx, y = y0 + (j * (y1 - y0)) / problem.ny;
  return `node (${i}, ${j}) at (x, y) = (${x}, ${y})`;
}

function xEdge(problem: Problem, i: number, j: number): string {
  const { x0, x1, y0, y1 } = problem.domain;
  const x = x0 + ((i + 0.5) * (x1 - x0)) / problem.nx, y = y0 + (j * (y1 - y0)) / problem.ny;
  return `the x-edge midpoint (i + ½, j) = (${i + 0.5}, ${j}) at (x, y) = (${x}, ${y})`;
}

function yEdge(problem: Problem, i: number, j: number): string {
  const { x0, x1, y0, y1 } = problem.domain;
  const x = x0 + (i * (x1 - x0)) / problem.nx, y = y0 + ((j + 0.5) * (y1 - y0)) / problem.ny;
  return `the y-edge midpoint (i, j + ½) = (${i}, ${j + 0.5}) at (x, y) = (${x}, ${y})`;
}

function checkArray(
  path: string,
  arr: unknown,
  count: number,
  what: string,
  at: (k: number) => string,
): Float64Array {
  if (!(arr instanceof Float64Array) || arr.length !== count) {
    const got = arr instanceof Float64Array ? `length ${arr.length}` : typeof arr;
    throw new RangeError(`Invalid ${path}: expected a Float64Array of ${what}, got ${got}`);
  }
  for (let k = 0; k < count; k++) {
    if (!Number.isFinite(arr[k])) {
      throw new RangeError(
        `Invalid ${path} at ${at(k)}: value ${
          arr[k]
        } is not finite; check the expression and its sampling there`,
      );
    }
  }
  return arr;
}

function checkMixed(problem: Problem, m: Float64Array): void {
  const { nx, ny, a, c, boundary } = problem;
  const count = (nx + 1) * (ny + 1);
  for (let k = 0; k < count; k++) {
    const disc = 4 * a[k] * c[k] - m[k] * m[k];
    if (!(disc > 0)) {
      const i = k % (nx + 1), j = (k - i) / (nx + 1);
      throw new RangeError(
        `Problem is not elliptic at ${node(problem, i, j)}: a = ${a[k]}, m = ${m[k]}, c = ${
          c[k]
        }, 4ac − m² = ${disc} must be > 0; make |m| smaller than 2·√(a·c) there`,
      );
    }
  }
  const corners = [
    [0, 0, "west", "south"],
    [nx, 0, "east", "south"],
    [0, ny, "west", "north"],
    [nx, ny, "east", "north"],
  ] as const;
  for (const [i, j, s1, s2] of corners) {
    const k = j * (nx + 1) + i;
    if (m[k] === 0 || fixesU(boundary[s1]) || fixesU(boundary[s2])) continue;
    throw new RangeError(
      `Cannot discretize m·u_xy at the corner ${node(problem, i, j)}: the ${s1} and ${s2} sides ` +
        `are both Neumann/Robin, so the ghost node outside both sides has no condition that ` +
        `defines it; m = ${m[k]} there must be 0 — make m vanish at that corner, make one of ` +
        `those sides Dirichlet, or use the conservative form (problem.conductivity)`,
    );
  }
}

function checkConductivity(problem: Problem): void {
  const { nx, ny } = problem;
  const K = problem.conductivity!;
  if (typeof K !== "object" || K === null || typeof K.alongX !== "object" || K.alongX === null) {
    throw new RangeError(
      "Invalid problem.conductivity: expected { alongX: { k11, k12? }, alongY: { k12?, k22 } }",
    );
  }
  if (typeof K.alongY !== "object" || K.alongY === null) {
    throw new RangeError(
      "Invalid problem.conductivity.alongY: missing; give { k22, k12? } at the y-edge midpoints",
    );
  }
  const nX = nx * (ny + 1), nY = (nx + 1) * ny;
  const atX = (k: number) => xEdge(problem, k % nx, Math.floor(k / nx));
  const atY = (k: number) => yEdge(problem, k % (nx + 1), Math.floor(k / (nx + 1)));
  const whatX = `nx·(ny+1) = ${nX} values (x-edge midpoints, index j·nx + i)`;
  const whatY = `(nx+1)·ny = ${nY} values (y-edge midpoints, index j·(nx+1) + i)`;
  const base = "problem.conductivity";
  const k11 = checkArray(`${base}.alongX.k11`, K.alongX.k11, nX, whatX, atX);
  const k22 = checkArray(`${base}.alongY.k22`, K.alongY.k22, nY, whatY, atY);
  const k12x = K.alongX.k12 === undefined
    ? undefined
    : checkArray(`${base}.alongX.k12`, K.alongX.k12, nX, whatX, atX);
  const k12y = K.alongY.k12 === undefined
    ? undefined
    : checkArray(`${base}.alongY.k12`, K.alongY.k12, nY, whatY, atY);
  for (let k = 0; k < nX; k++) {
    if (!(k11[k] > 0)) {
      throw new RangeError(
        `Invalid ${base}.alongX.k11 at ${atX(k)}: value ${
          k11[k]
        } must be > 0 (K positive definite); check the conductivity there`,
      );
    }
  }
  for (let k = 0; k < nY; k++) {
    if (!(k22[k] > 0)) {
      throw new RangeError(
        `Invalid ${base}.alongY.k22 at ${atY(k)}: value ${
          k22[k]
        } must be > 0 (K positive definite); check the conductivity there`,
      );
    }
  }
  if (k12x !== undefined) {
    for (let j = 0; j <= ny; j++) {
      for (let i = 0; i < nx; i++) {
        // k22 at the x-edge midpoint: mean of the y-edges at both ends, below and above.
        let s = 0, n = 0;
        for (const jj of [j - 1, j]) {
          if (jj < 0 || jj >= ny) continue;
          s += k22[jj * (nx + 1) + i] + k22[jj * (nx + 1) + i + 1], n += 2;
        }
        const q = j * nx + i, kk22 = s / n, det = k11[q] * kk22 - k12x[q] * k12x[q];
        if (!(det > 0)) {
          throw new RangeError(
            `Problem.conductivity is not positive definite at ${xEdge(problem, i, j)}: k11 = ${
              k11[q]
            }, k12 = ${k12x[q]}, k22 ≈ ${kk22} (mean of the neighbouring y-edge values), ` +
              `k11·k22 − k12² = ${det} must be > 0; make |k12| smaller than √(k11·k22) there`,
          );
        }
      }
    }
  }
  if (k12y !== undefined) {
    for (let j = 0; j < ny; j++) {
      for (let i = 0; i <= nx; i++) {
        let s = 0, n = 0;
        for (const ii of [i - 1, i]) {
          if (ii < 0 || ii >= nx) continue;
          s += k11[j * nx + ii] + k11[(j + 1) * nx + ii], n += 2;
        }
        const q = j * (nx + 1) + i, kk11 = s / n, det = kk11 * k22[q] - k12y[q] * k12y[q];
        if (!(det > 0)) {
          throw new RangeError(
            `Problem.conductivity is not positive definite at ${
              yEdge(problem, i, j)
            }: k11 ≈ ${kk11} ` +
              `(mean of the neighbouring x-edge values), k12 = ${k12y[q]}, k22 = ${k22[q]}, ` +
              `k11·k22 − k12² = ${det} must be > 0; make |k12| smaller than √(k11·k22) there`,
          );
        }
      }
    }
  }
}

/**
 * Validates `m` and `conductivity` of a problem whose node arrays and boundary conditions are
 * already known to be well formed (see the module doc).
 *
 * @param problem The problem.
 * @throws {RangeError} Naming the field, the node or edge midpoint and its (x, y), the value, and
 * the fix.
 *
 * @example
 * ```ts
 * import { validateForms } from "./validate_forms.ts";
 * const n = 2, N = 9, one = new Float64Array(N).fill(1), zero = new Float64Array(N);
 * const bc = { kind: "dirichlet" as const, values: new Float64Array(3) };
 * const p = {
 *   domain: { x0: 0, x1: 1, y0: 0, y1: 1 }, nx: n, ny: n, a: one, b: zero, c: one, d: zero,
 *   e: zero, f: zero, boundary: { west: bc, east: bc, south: bc, north: bc },
 *   m: new Float64Array(N).fill(3),
 * };
 * try {
 *   validateForms(p);
 *   throw new Error("4ac − m² = −5 was accepted");
 * } catch (e) {
 *   if (!(e instanceof RangeError)) throw e;
 * }
 * ```
 */
export function validateForms(problem: Problem): void {
  if (problem.conductivity !== undefined) {
    checkConductivity(problem);
    return;
  }
  if (problem.m === undefined) return;
  const { nx, ny } = problem;
  const count = (nx + 1) * (ny + 1);
  const m = checkArray(
    "problem.m",
    problem.m,
    count,
    `(nx+1)(ny+1) = ${count} values for a ${nx}×${ny} grid`,
    (k) => node(problem, k % (nx + 1), Math.floor(k / (nx + 1))),
  );
  checkMixed(problem, m);
}
