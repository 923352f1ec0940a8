/**
 * The mixed term and the conservative form against an independent library (docs/check-values.md,
 * "Independent libraries"): `scipy_forms.py` assembles the discrete systems from the raw problem
 * arrays following only the formulas written in `reference-solver/discretize.ts` (mixed term) and
 * `reference-solver/discretize_conservative.ts` (flux form), by a different route (rows as sums of
 * coefficient × value terms, ghosts replaced by the affine expressions of the conditions), and
 * solves them with SciPy's sparse direct solver (`spsolve`, SuperLU, Debian's python3-scipy). The
 * multigrid solution of the same system must agree to round-off, and SciPy's solution must satisfy
 * the solver's own assembly (`assembleMatrix` / `residualNorm`) to round-off.
 */
import assert from "node:assert/strict";
import { fileURLToPath } from "node:url";
import {
  assembleMatrix,
  type BoundaryCondition,
  type Problem,
  residualNorm,
  type Side,
  solve,
} from "../../reference-solver/mod.ts";
import { robinCondition } from "../../reference-solver/mod.ts";
import { findScipyPython, runWithInput } from "../../testing/mod.ts";
import { nodeX, nodeY, sample } from "./_build.ts";
import { sampleConductivity } from "./_conductivity.ts";

const python = await findScipyPython();
const SKIPPED = python === undefined ? " (skipped: Debian python3-scipy not installed)" : "";
const SCRIPT = fileURLToPath(new URL("./scipy_forms.py", import.meta.url));

// round-off: both solutions satisfy the same system to round-off; what separates them is about ε
// times the condition number. That is at most 1.9e6 here (2-norm of the jump case, computed with
// numpy when this test was written); a jump of 1000 instead of 100 gives 1.9e7, and the two
// solutions then differ by 1.1e-9 however far the multigrid runs. 1e-9 is the bound.
const TOLERANCE = 1e-9;

async function scipySolve(problem: Problem, upwind: boolean): Promise<Float64Array> {
  const arr = (v: Float64Array | undefined) => (v === undefined ? undefined : Array.from(v));
  const K = problem.conductivity;
  const input = JSON.stringify({
    domain: problem.domain,
    nx: problem.nx,
    ny: problem.ny,
    a: arr(problem.a),
    b: arr(problem.b),
    c: arr(problem.c),
    d: arr(problem.d),
    e: arr(problem.e),
    f: arr(problem.f),
    m: arr(problem.m),
    conductivity: K === undefined ? undefined : {
      alongX: { k11: arr(K.alongX.k11), k12: arr(K.alongX.k12) },
      alongY: { k12: arr(K.alongY.k12), k22: arr(K.alongY.k22) },
    },
    boundary: Object.fromEntries(
      Object.entries(problem.boundary).map((
        [side, bc],
      ) => [
        side,
        bc.kind === "robin"
          ? { ...bc, alpha: arr(bc.alpha), beta: arr(bc.beta), values: arr(bc.values) }
          : bc.kind === "periodic"
          ? { ...bc }
          : { ...bc, values: arr(bc.values) },
      ]),
    ),
    upwind,
  });
  const out = await runWithInput([python!, SCRIPT], input);
  if (!out.success) throw new Error(`scipy_forms.py failed (exit ${out.code}): ${out.stderr}`);
  return Float64Array.from(JSON.parse(out.stdout).solution);
}

const DOMAIN = { x0: -0.3, x1: 1.1, y0: 0.2, y1: 1.0 };

/** A Robin weight: one number, or a function of the coordinate along the side (varying). */
type Weight = number | ((s: number) => number);
type Kind = "dirichlet" | "neumann" | { alpha: Weight; beta: Weight };

/** Boundary data that is not taken from any exact solution (corner values disagree on purpose). */
function sides(nx: number, ny: number, kinds: Record<Side, Kind>): Record<Side, BoundaryCondition> {
  const data: Record<Side, (s: number) => number> = {
    west: (y) => 1 + 0.5 * Math.sin(2 * y),
    east: (y) => 0.7 - y * y,
    south: (x) => Math.cos(x) - 0.3,
    north: (x) => 0.2 * Math.sin(5 * x),
  };
  const out = {} as Record<Side, BoundaryCondition>;
  for (const side of ["west", "east", "south", "north"] as const) {
    const vertical = side === "west" || side === "east";
    const n = vertical ? ny : nx;
    const at = (k: number) => vertical ? nodeY(DOMAIN, ny, k) : nodeX(DOMAIN, nx, k);
    const along = (fn: (s: number) => number) =>
      Float64Array.from({ length: n + 1 }, (_, k) => fn(at(k)));
    const values = along(data[side]);
    const kind = kinds[side];
    const weight = (w: Weight) => typeof w === "number" ? w : along(w);
    out[side] = kind === "dirichlet" || kind === "neumann"
      ? { kind, values }
      : robinCondition(weight(kind.alpha), weight(kind.beta), values);
  }
  return out;
}

function lower(grid: { domain: typeof DOMAIN; nx: number; ny: number }) {
  return {
    b: sample((x, y) => 0.7 * Math.cos(x - y), grid),
    d: sample((_x, y) => -0.5 + 0.4 * Math.sin(y), grid),
    e: sample((x, y) => -(0.5 + 0.2 * x * x + 0.1 * y), grid),
    f: sample((x, y) => Math.sin(3 * x) * Math.cos(2 * y) + x * y - 0.5, grid),
  };
}

function mixedCase(nx: number, ny: number, kinds: Record<Side, Kind>): Problem {
  const grid = { domain: DOMAIN, nx, ny };
  return {
    domain: DOMAIN,
    nx,
    ny,
    a: sample((x, y) => 1 + 0.3 * Math.sin(x + 2 * y), grid),
    c: sample((x, y) => 1.4 + 0.25 * Math.cos(x * y), grid),
    m: sample((x, y) => 0.9 * Math.sin(2 * x + y) + 0.3, grid),
    ...lower(grid),
    boundary: sides(nx, ny, kinds),
  };
}

function conservativeCase(
  nx: number,
  ny: number,
  kinds: Record<Side, Kind>,
  K: "tensor" | "jump",
): Problem {
  const grid = { domain: DOMAIN, nx, ny };
  const zeros = new Float64Array((nx + 1) * (ny + 1));
  const conductivity = K === "tensor"
    ? sampleConductivity({
      k11: (x, y) => 2 + Math.sin(x + y),
      k12: (x, y) => 0.6 * Math.cos(2 * x - y),
      k22: (x, y) => 1.5 + 0.5 * x * y,
    }, grid)
    : sampleConductivity(
      {
        // a jump of 100 across the grid lines x = 0.4 (column 20 of 40) and y = 0.6 (row 12 of 24)
        k11: (x, y) => ((x > 0.4) !== (y > 0.6) ? 100 : 1),
        k12: (x, y) => ((x > 0.4) !== (y > 0.6) ? 30 : 0.2),
        k22: (x, y) => ((x > 0.4) !== (y > 0.6) ? 50 : 1),
      },
      grid,
      true,
    );
  return {
    domain: DOMAIN,
    nx,
    ny,
    a: zeros,
    c: zeros,
    ...lower(grid),
    boundary: sides(nx, ny, kinds),
    conductivity,
  };
}

const D = "dirichlet" as const, N = "neumann" as const;
const CASES: [string, Problem][] = [
  [
    "mixed term, 40×24, Neumann west, Robin east, Dirichlet south and north",
    mixedCase(40, 24, { west: N, east: { alpha: 1.3, beta: 0.4 }, south: D, north: D }),
  ],
  [
    "mixed term, 36×27 (semi-coarsening), Robin south, Neumann north, Dirichlet west and east",
    mixedCase(36, 27, { west: D, east: D, south: { alpha: 0.9, beta: 1.6 }, north: N }),
  ],
  [
    "conservative, variable tensor K, 40×24, Dirichlet west and south, Robin east, Neumann north",
    conservativeCase(
      40,
      24,
      { west: D, south: D, east: { alpha: 1.3, beta: 0.4 }, north: N },
      "tensor",
    ),
  ],
  [
    "conservative, variable tensor K, 40×24, no Dirichlet side (Neumann/Robin corners)",
    conservativeCase(
      40,
      24,
      { west: N, north: N, south: { alpha: 0.9, beta: 1.6 }, east: { alpha: 2, beta: 0.5 } },
      "tensor",
    ),
  ],
  [
    "conservative, variable tensor K, 40×24, Robin weights varying along east and south",
    conservativeCase(
      40,
      24,
      {
        west: D,
        north: N,
        south: { alpha: (x) => 1 + x * x, beta: (x) => 0.5 + 0.25 * Math.cos(3 * x) },
        east: { alpha: (y) => 2 - y, beta: 0.5 },
      },
      "tensor",
    ),
  ],
  [
    "mixed term, 40×24, Robin weights varying along east, Neumann west",
    mixedCase(40, 24, {
      west: N,
      east: { alpha: (y) => 0.5 + y, beta: (y) => 0.3 + 0.2 * y * y },
      south: D,
      north: D,
    }),
  ],
  [
    "conservative, tensor K jumping by 100 across two grid lines, 40×24, Dirichlet sides",
    conservativeCase(40, 24, { west: D, east: D, south: D, north: D }, "jump"),
  ],
  [
    "conservative, variable tensor K, 36×27, one Neumann side (west), Dirichlet elsewhere",
    conservativeCase(36, 27, { west: N, east: D, south: D, north: D }, "tensor"),
  ],
];

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

Deno.test({
  name: `solve() equals SciPy's direct solve of the independently assembled mixed-term and ` +
    `conservative systems to 1e-9${SKIPPED}`,
  ignore: python === undefined,
  async fn(t) {
    for (const [label, problem] of CASES) {
      for (const upwind of [false, true]) {
        await t.step(`${label}, ${upwind ? "upwind" : "central"}`, async () => {
          const reference = await scipySolve(problem, upwind);
          const result = solve(problem, {
            scheme: { upwind },
            // below the condition number × round-off of the jump case, the floor stops it
            stop: { tolerance: 1e-15, maxCycles: 200 },
            coarse: { maxDirectUnknowns: 24 },
          });
          assert.ok(result.description.levels.length >= 3, "expected a multigrid hierarchy");
          assert.notEqual(result.reason, "diverged");
          const scale = absoluteScale(assembleMatrix(problem, { upwind }), reference);
          const res = residualNorm(problem, reference, { upwind });
          assert.ok(
            res <= 1e-13 * scale,
            `residual of SciPy's solution in the solver's assembly: ${res} (scale ${scale})`,
          );
          let diff = 0, size = 0;
          for (let k = 0; k < reference.length; k++) {
            diff = Math.max(diff, Math.abs(result.solution[k] - reference[k]));
            size = Math.max(size, Math.abs(reference[k]));
          }
          assert.ok(
            diff / size <= TOLERANCE,
            `max |u_multigrid − u_scipy| / max |u_scipy| = ${(diff / size).toExponential(3)} ` +
              `(multigrid ${result.reason} after ${result.cycles} cycles, ` +
              `${result.description.coarseOperator} coarse operators)`,
          );
        });
      }
    }
  },
});
