/**
 * Checks a {@link Problem} once at the door, so the kernels can trust it.
 *
 * @module
 */
import { formOf } from "../problem/mod.ts";
import { type BoundaryCondition, type Problem, type Side, SIDES } from "./problem.ts";
import { validateForms } from "./validate_forms.ts";
import { validatePeriodic } from "./validate_stretched.ts";

const COEFFICIENTS = ["a", "b", "c", "d", "e", "f"] as const;

/** Whether a side's condition fixes u itself (Dirichlet, or Robin with β = 0: u = g/α). */
export function isDirichletLike(bc: BoundaryCondition): boolean {
  return bc.kind === "dirichlet" || (bc.kind === "robin" && bc.beta.every((v) => v === 0));
}

/**
 * Whether the problem is singular: no side fixes u or weighs it (only Neumann and periodic sides,
 * Robin with α = 0 counting as Neumann) and e ≡ 0, so constants solve the homogeneous problem.
 */
export function isSingular(problem: Problem): boolean {
  for (const side of SIDES) {
    const bc = problem.boundary[side];
    if (bc.kind === "dirichlet") return false;
    if (bc.kind === "robin" && bc.alpha.some((v) => v !== 0)) return false;
  }
  const e = problem.e;
  for (let k = 0; k < e.length; k++) if (e[k] !== 0) return false;
  return true;
}

/** The node (i, j) of position k along a side. */
function sideNode(problem: Problem, side: Side, k: number): [number, number] {
  return side === "west"
    ? [0, k]
    : side === "east"
    ? [problem.nx, k]
    : side === "south"
    ? [k, 0]
    : [k, problem.ny];
}

/** α and β of a Robin side: arrays of the side's length, finite, not both 0, β ≡ 0 or β ≠ 0. */
function validateRobin(
  problem: Problem,
  side: Side,
  bc: Extract<BoundaryCondition, { kind: "robin" }>,
  len: number,
): void {
  const path = `problem.boundary.${side}`;
  for (const name of ["alpha", "beta"] as const) {
    const w = bc[name];
    if (!(w instanceof Float64Array) || w.length !== len) {
      throw new RangeError(
        `Invalid ${path}.${name}: expected a Float64Array of ${len} values (one per node along the side, like values), got ${
          w instanceof Float64Array ? `length ${w.length}` : typeof w
        }; build constant weights with robinCondition(alpha, beta, values)`,
      );
    }
  }
  let zeros = 0;
  for (let k = 0; k < len; k++) {
    const [i, j] = sideNode(problem, side, k);
    if (!Number.isFinite(bc.alpha[k]) || !Number.isFinite(bc.beta[k])) {
      throw new RangeError(
        `Invalid ${path} at ${
          where(problem, i, j)
        }: Robin alpha and beta must be finite, got alpha = ${bc.alpha[k]}, beta = ${bc.beta[k]}`,
      );
    }
    if (bc.alpha[k] === 0 && bc.beta[k] === 0) {
      throw new RangeError(
        `Invalid ${path} at ${
          where(problem, i, j)
        }: Robin condition with alpha = 0 and beta = 0 says nothing about u; give alpha or beta a non-zero value`,
      );
    }
    if (bc.beta[k] === 0) zeros++;
  }
  if (zeros !== 0 && zeros !== len) {
    const k = bc.beta.findIndex((v) => v === 0);
    const [i, j] = sideNode(problem, side, k);
    throw new RangeError(
      `Invalid ${path}.beta: 0 at ${zeros} of ${len} nodes (first ${
        where(problem, i, j)
      }) and non-zero elsewhere; a side either fixes u (beta = 0 everywhere) or gives a flux condition (beta ≠ 0 everywhere): split the condition or keep beta away from 0`,
    );
  }
}

function where(problem: Problem, i: number, j: number): string {
  const { x0, x1, y0, y1 } = problem.domain;
  const x = x0 + (i * (x1 - x0)) / problem.nx;
  const y = y0 + (j * (y1 - y0)) / problem.ny;
  return `node (${i}, ${j}) at (x, y) = (${x}, ${y})`;
}

/**
 * Validates a problem: the layout (vertex only) and a stated form (agreeing with the
 * conductivity), grid counts, domain, array types and lengths, finite values, ellipticity
 * (a·c > 0 at every node, unless a conductivity replaces a and c), boundary conditions, the mixed
 * coefficient m and the conductivity (see `validate_forms.ts`: 4ac − m² > 0, K positive
 * definite, m = 0 at corners between two Neumann/Robin sides), and singularity.
 *
 * @param problem The problem to check.
 * @param options `singular`: "refuse" (default) throws for a singular problem; "mean-zero" accepts it.
 * @returns Whether the problem is singular (only possible with `singular: "mean-zero"`).
 * @throws {RangeError} Naming what is wrong, where (field, node and coordinates, or side), the
 * value, and how to fix it.
 *
 * @example
 * ```ts
 * import { validateProblem } from "./validate.ts";
 * try {
 *   validateProblem({ nx: 1 } as never);
 * } catch (e) {
 *   if (!(e instanceof RangeError)) throw e;
 * }
 * ```
 */
export function validateProblem(
  problem: Problem,
  options: { singular?: "refuse" | "mean-zero" } = {},
): boolean {
  const { nx, ny, domain } = problem;
  if (problem.layout !== undefined && problem.layout !== "vertex") {
    throw new RangeError(
      `Invalid problem.layout: the reference solver is vertex-centred and solves the "vertex" ` +
        `layout only, got ${JSON.stringify(problem.layout)}; sample the problem at the nodes ` +
        `(layout "vertex") or use a cell-centred solver`,
    );
  }
  formOf(problem);
  for (const [name, n] of [["nx", nx], ["ny", ny]] as const) {
    if (!Number.isInteger(n) || n < 2) {
      throw new RangeError(
        `Invalid problem.${name}: the grid needs at least 2 intervals in each direction, got ${n}; use an integer ≥ 2`,
      );
    }
  }
  if (
    domain === undefined || ![domain.x0, domain.x1, domain.y0, domain.y1].every(Number.isFinite) ||
    !(domain.x1 > domain.x0) || !(domain.y1 > domain.y0)
  ) {
    throw new RangeError(
      `Invalid problem.domain: need finite x0 < x1 and y0 < y1, got ${JSON.stringify(domain)}`,
    );
  }
  const count = (nx + 1) * (ny + 1);
  for (const name of COEFFICIENTS) {
    const arr = problem[name];
    if (!(arr instanceof Float64Array) || arr.length !== count) {
      const got = arr instanceof Float64Array ? `length ${arr.length}` : typeof arr;
      throw new RangeError(
        `Invalid problem.${name}: expected a Float64Array of (nx+1)(ny+1) = ${count} values for a ${nx}×${ny} grid, got ${got}`,
      );
    }
    for (let k = 0; k < count; k++) {
      if (!Number.isFinite(arr[k])) {
        const i = k % (nx + 1), j = (k - i) / (nx + 1);
        throw new RangeError(
          `Invalid problem.${name} at ${where(problem, i, j)}: value ${
            arr[k]
          } is not finite; check the expression and its sampling there`,
        );
      }
    }
  }
  const { a, c } = problem;
  // With a conductivity, a and c are not used (the conservative form replaces them).
  for (let k = 0; k < count && problem.conductivity === undefined; k++) {
    if (!(a[k] * c[k] > 0)) {
      const i = k % (nx + 1), j = (k - i) / (nx + 1);
      throw new RangeError(
        `Problem is not elliptic at ${where(problem, i, j)}: a = ${a[k]}, c = ${c[k]}, a·c = ${
          a[k] * c[k]
        } must be > 0; give a and c the same strict sign everywhere`,
      );
    }
  }
  if (problem.boundary === undefined) {
    throw new RangeError("Invalid problem.boundary: missing; give a condition for each side");
  }
  for (const side of SIDES) {
    const bc = problem.boundary[side];
    const path = `problem.boundary.${side}`;
    if (bc === undefined || !["dirichlet", "neumann", "robin", "periodic"].includes(bc.kind)) {
      throw new RangeError(
        `Invalid ${path}: kind must be one of dirichlet, neumann, robin, periodic, got ${
          JSON.stringify(bc?.kind)
        }`,
      );
    }
    if (bc.kind === "periodic") continue; // checked in pairs by validatePeriodic
    const len = side === "west" || side === "east" ? ny + 1 : nx + 1;
    if (!(bc.values instanceof Float64Array) || bc.values.length !== len) {
      const got = bc.values instanceof Float64Array ? `length ${bc.values.length}` : "no array";
      throw new RangeError(
        `Invalid ${path}.values: expected a Float64Array of ${len} values (one per node along the side, corners included), got ${got}`,
      );
    }
    for (let k = 0; k < len; k++) {
      if (!Number.isFinite(bc.values[k])) {
        const [i, j] = side === "west"
          ? [0, k]
          : side === "east"
          ? [nx, k]
          : side === "south"
          ? [k, 0]
          : [k, ny];
        throw new RangeError(
          `Invalid ${path}.values[${k}] at ${where(problem, i, j)}: value ${
            bc.values[k]
          } is not finite; check the boundary expression there`,
        );
      }
    }
    if (bc.kind === "robin") validateRobin(problem, side, bc, len);
  }
  validatePeriodic(problem);
  validateForms(problem);
  const singular = isSingular(problem);
  if (singular && (options.singular ?? "refuse") === "refuse") {
    throw new RangeError(
      "Problem is singular: every side is Neumann, periodic or Robin with alpha = 0, and e ≡ 0, so any constant can be added to a solution; " +
        'make one side Dirichlet or Robin with alpha ≠ 0, or pass the option singular: "mean-zero"',
    );
  }
  return singular;
}
