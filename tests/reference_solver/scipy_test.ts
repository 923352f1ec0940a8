/**
 * The multigrid solution against an independent library (docs/check-values.md, "Independent
 * libraries"): `scipy_reference.py` assembles the same discrete system from the raw problem arrays,
 * following only the written discretization contract (no code shared with the solver), and solves
 * it with SciPy's sparse direct solver (`scipy.sparse.linalg.spsolve`, SuperLU, from Debian's
 * python3-scipy). Both are solutions of one linear system, so they must agree to round-off.
 */
import assert from "node:assert/strict";
import {
  assembleMatrix,
  type BoundaryCondition,
  type Problem,
  residualNorm,
  solve,
} from "../../reference-solver/mod.ts";
import { robinCondition } from "../../reference-solver/mod.ts";
import { findScipyPython } from "../../testing/mod.ts";
import { errorNorms, manufacturedProblem, MIXED, nodeX, nodeY, sample } from "./_build.ts";
import { QUADRATIC, VARIABLE } from "./_manufactured.ts";
import { scipySolve } from "./_scipy.ts";

const python = await findScipyPython();
const SKIPPED = python === undefined ? " (skipped: Debian python3-scipy not installed)" : "";
if (python === undefined) {
  console.warn(
    "WARNING: SciPy comparison tests skipped: Debian python3-scipy not installed " +
      "(apt-get install python3-scipy)",
  );
}

const DOMAIN = { x0: -0.3, x1: 1.1, y0: 0.2, y1: 1.0 };
// round-off: the multigrid stops at a relative residual of 1e-13; the system's condition number is
// about 1e3–1e4, which leaves the solutions equal to ~1e-10 relative; 1e-9 is the bound
const TOLERANCE = 1e-9;

type Along = (side: "west" | "east" | "south" | "north", fn: (s: number) => number) => Float64Array;

/**
 * Variable coefficients, a source that is not built from any exact solution, and boundary data
 * whose corner values disagree between sides, so the corner rules of the contract matter.
 */
function caseProblem(
  nx: number,
  ny: number,
  boundary: (along: Along) => Record<"west" | "east" | "south" | "north", BoundaryCondition>,
): Problem {
  const grid = { domain: DOMAIN, nx, ny };
  const along: Along = (side, fn) => {
    const vertical = side === "west" || side === "east";
    const n = vertical ? ny : nx;
    const values = new Float64Array(n + 1);
    for (let k = 0; k <= n; k++) {
      values[k] = fn(vertical ? nodeY(DOMAIN, ny, k) : nodeX(DOMAIN, nx, k));
    }
    return values;
  };
  return {
    domain: DOMAIN,
    nx,
    ny,
    a: sample(VARIABLE.a, grid),
    b: sample(VARIABLE.b, grid),
    c: sample(VARIABLE.c, grid),
    d: sample(VARIABLE.d, grid),
    e: sample(VARIABLE.e, grid),
    f: sample((x, y) => Math.sin(3 * x) * Math.cos(2 * y) + x * y - 0.5, grid),
    boundary: boundary(along),
  };
}

const MIXED_SIDES = (along: Along) => ({
  west: { kind: "dirichlet" as const, values: along("west", (y) => 1 + 0.5 * Math.sin(2 * y)) },
  south: { kind: "dirichlet" as const, values: along("south", (x) => Math.cos(x) - 0.3) },
  east: robinCondition(1.3, 0.4, along("east", (y) => 0.7 - y * y)),
  north: { kind: "neumann" as const, values: along("north", (x) => 0.2 * Math.sin(5 * x)) },
});

const DERIVATIVE_SIDES = (along: Along) => ({
  west: { kind: "neumann" as const, values: along("west", (y) => 0.3 * y - 0.1) },
  south: robinCondition(0.9, 1.6, along("south", (x) => Math.exp(-x))),
  east: robinCondition(2.0, 0.5, along("east", (y) => Math.cos(3 * y))),
  north: { kind: "neumann" as const, values: along("north", (x) => x * x - 0.4) },
});

const ROBIN_WEST_NORTH = (along: Along) => ({
  west: robinCondition(1.1, 0.8, along("west", (y) => y - 0.2)),
  south: { kind: "dirichlet" as const, values: along("south", (x) => 0.5 * x) },
  east: { kind: "neumann" as const, values: along("east", (y) => Math.sin(4 * y)) },
  // weights that vary along the side (α from 0.6 to 1.5 over x, β from 1.4 down to about 1)
  north: robinCondition(
    along("north", (x) => 0.6 + 0.4 * (x + 0.3) * (x + 0.3)),
    along("north", (x) => 1.4 - 0.3 * Math.sin(x + 0.3)),
    along("north", (x) => 1 - x),
  ),
});

const CASES: [string, Problem][] = [
  [
    "40×24, Dirichlet west and south (corner values disagree), Robin east, Neumann north",
    caseProblem(40, 24, MIXED_SIDES),
  ],
  [
    "40×24, no Dirichlet side: Neumann west and north, Robin east and south",
    caseProblem(40, 24, DERIVATIVE_SIDES),
  ],
  [
    "36×27 (odd ny: semi-coarsening in x), Dirichlet, Robin and Neumann sides",
    caseProblem(36, 27, MIXED_SIDES),
  ],
  [
    "32×20, Robin west and north (weights varying along north), Dirichlet south, Neumann east",
    caseProblem(32, 20, ROBIN_WEST_NORTH),
  ],
];

/** ‖ |A|·|u| ‖₂ of a CSR matrix: the size of the terms whose sum is the residual. */
function absoluteScale(
  m: { n: number; rowPtr: Int32Array; col: Int32Array; val: Float64Array },
  u: Float64Array,
): number {
  let sum = 0;
  for (let i = 0; i < m.n; i++) {
    let row = 0;
    for (let k = m.rowPtr[i]; k < m.rowPtr[i + 1]; k++) row += Math.abs(m.val[k] * u[m.col[k]]);
    sum += row * row;
  }
  return Math.sqrt(sum);
}

function relativeDifference(u: Float64Array, v: Float64Array): number {
  let diff = 0;
  let scale = 0;
  for (let k = 0; k < u.length; k++) {
    diff = Math.max(diff, Math.abs(u[k] - v[k]));
    scale = Math.max(scale, Math.abs(v[k]));
  }
  return diff / scale;
}

Deno.test({
  name: `solve() equals SciPy's sparse direct solve of the independently assembled system with ` +
    `variable coefficients and mixed sides${SKIPPED}`,
  ignore: python === undefined,
  async fn(t) {
    for (const [label, problem] of CASES) {
      for (const upwind of [false, true]) {
        await t.step(`${label}, ${upwind ? "upwind" : "central"} scheme`, async () => {
          const reference = await scipySolve(python!, problem, { upwind });
          const result = solve(problem, {
            scheme: { upwind },
            stop: { tolerance: 1e-13, maxCycles: 100 },
            // 41 × 25 = 1025 nodes would fit the default direct solve; force real multigrid
            coarse: { maxDirectUnknowns: 24 },
          });
          assert.ok(result.description.levels.length >= 3, "expected a multigrid hierarchy");
          assert.notEqual(result.reason, "diverged");
          // the solver's own assembly (assembleMatrix / residualNorm) is satisfied by SciPy's
          // solution to round-off: ‖A·u − rhs‖ against the scale ‖|A|·|u|‖ (ε ≈ 2.2e-16)
          const scale = absoluteScale(assembleMatrix(problem, { upwind }), reference.solution);
          const res = residualNorm(problem, reference.solution, { upwind });
          assert.ok(
            res <= 1e-13 * scale,
            `residual of SciPy's solution in the solver's assembly: ${res} (scale ${scale})`,
          );
          const rel = relativeDifference(result.solution, reference.solution);
          assert.ok(
            rel <= TOLERANCE,
            `max |u_multigrid − u_scipy| / max |u_scipy| = ${
              rel.toExponential(3)
            } > ${TOLERANCE} ` +
              `(multigrid ${result.reason} after ${result.cycles} cycles; SciPy ${reference.scipy})`,
          );
        });
      }
    }
  },
});

Deno.test({
  name:
    `the SciPy reference assembly reproduces a quadratic exactly, so it is a sound yardstick${SKIPPED}`,
  ignore: python === undefined,
  async fn() {
    // derived: the contract's central differences and ghost formulas are exact for quadratics
    const grid = { domain: DOMAIN, nx: 40, ny: 24, sides: MIXED };
    const reference = await scipySolve(python!, manufacturedProblem(QUADRATIC, VARIABLE, grid));
    const err = errorNorms(reference.solution, QUADRATIC, grid).max;
    assert.ok(err < 1e-11, `SciPy reference misses the quadratic by ${err}`);
  },
});
