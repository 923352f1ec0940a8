/**
 * The reference solver on stretched and periodic grids against SciPy's sparse direct solve of an
 * independent assembly (`scipy_stretched.py`, written from the module documentation of
 * `reference-solver/discretize_stretched.ts` alone): the same discrete system, so the two
 * solutions agree to the multigrid's stopping tolerance times the condition number.
 *
 * The problems have variable coefficients with first-order terms, a source and boundary data not
 * taken from any exact solution (corner values disagree), Robin weights that vary along a side,
 * and grids from a tanh family (both ends), a geometric progression and a periodic axis.
 */
import assert from "node:assert/strict";
import { fileURLToPath } from "node:url";
import {
  type BoundaryCondition,
  type Problem,
  robinCondition,
  type Side,
  solve,
} from "../../reference-solver/mod.ts";
import { findScipyPython, runWithInput } from "../../testing/mod.ts";
import {
  boundaryJson,
  geometric,
  largestDifference,
  stretchRatio,
  tanhBetaFor,
  tanhBoth,
} from "./_stretched.ts";

const SCRIPT = fileURLToPath(new URL("./scipy_stretched.py", import.meta.url));
const python = await findScipyPython();
const SKIPPED = python === undefined ? " (skipped: Debian python3-scipy not installed)" : "";
// the multigrid stops at a relative residual of 1e-13; these systems' condition numbers (about
// 1e4 with the stretching) leave the two solutions equal to ~1e-9 relative (common practice)
const TOLERANCE = 1e-8;

type Kind = "dirichlet" | "neumann" | "robin" | "periodic";

function problem(x: Float64Array, y: Float64Array, kinds: Record<Side, Kind>): Problem {
  const nx = x.length - 1, ny = y.length - 1;
  const node = (fn: (px: number, py: number) => number) => {
    const out = new Float64Array((nx + 1) * (ny + 1));
    for (let j = 0; j <= ny; j++) {
      for (let i = 0; i <= nx; i++) out[j * (nx + 1) + i] = fn(x[i], y[j]);
    }
    return out;
  };
  // coefficients and source periodic in x with period 1 (cos 2πx, sin 2πx): the images agree
  const s = (px: number) => Math.sin(2 * Math.PI * px),
    c = (px: number) => Math.cos(2 * Math.PI * px);
  const data: Record<Side, (t: number) => number> = {
    west: (t) => 1 + 0.5 * Math.sin(2 * t),
    east: (t) => 0.7 - t * t,
    south: (t) => c(t) - 0.3,
    north: (t) => 0.2 * s(t),
  };
  const boundary = {} as Record<Side, BoundaryCondition>;
  for (const side of ["west", "east", "south", "north"] as const) {
    const along = side === "west" || side === "east" ? y : x;
    const values = along.map(data[side]);
    const kind = kinds[side];
    boundary[side] = kind === "periodic"
      ? { kind }
      : kind === "robin"
      ? robinCondition(along.map((t) => 1 + 0.5 * t), along.map((t) => 0.6 + 0.3 * t * t), values)
      : { kind, values };
  }
  return {
    domain: { x0: 0, x1: 1, y0: 0, y1: 1 },
    nx,
    ny,
    coordinates: { x, y },
    a: node((px, py) => 1 + 0.3 * s(px) * py),
    b: node((px) => 0.8 * c(px)),
    c: node((_px, py) => 1.2 + 0.4 * py),
    d: node((px, py) => -0.5 * py + 0.2 * s(px)),
    e: node((px, py) => -0.5 - 0.3 * c(px) * py),
    f: node((px, py) => s(px) * Math.cos(2 * py) + py - 0.5),
    boundary,
  };
}

async function scipySolve(p: Problem): Promise<Float64Array> {
  const arr = (v: Float64Array) => Array.from(v);
  const input = JSON.stringify({
    x: arr(p.coordinates!.x),
    y: arr(p.coordinates!.y),
    a: arr(p.a),
    b: arr(p.b),
    c: arr(p.c),
    d: arr(p.d),
    e: arr(p.e),
    f: arr(p.f),
    boundary: boundaryJson(p.boundary),
  });
  const out = await runWithInput([python!, SCRIPT], input);
  if (!out.success) throw new Error(`scipy_stretched.py failed (exit ${out.code}): ${out.stderr}`);
  return Float64Array.from(JSON.parse(out.stdout).solution);
}

const BETA = tanhBetaFor(10);
const CASES: [string, () => Problem][] = [
  [
    "tanh (ratio 10) × geometric (ratio 10), Dirichlet west and south, Robin east (varying weights), Neumann north",
    () =>
      problem(tanhBoth(40, BETA), geometric(28, 10), {
        west: "dirichlet",
        south: "dirichlet",
        east: "robin",
        north: "neumann",
      }),
  ],
  [
    "geometric × tanh, no Dirichlet side: Neumann west and north, Robin east and south",
    () =>
      problem(geometric(36, 6), tanhBoth(30, BETA), {
        west: "neumann",
        south: "robin",
        east: "robin",
        north: "neumann",
      }),
  ],
  [
    // a geometric x-family: the two spacings at the seam differ (5 to 1), so the seam matters
    "periodic west–east on a geometric family, Dirichlet south, Robin north",
    () =>
      problem(geometric(32, 5), tanhBoth(24, BETA), {
        west: "periodic",
        east: "periodic",
        south: "dirichlet",
        north: "robin",
      }),
  ],
];

Deno.test({
  name:
    `solve() on stretched and periodic grids equals SciPy's solve of the independently assembled system${SKIPPED}`,
  ignore: python === undefined,
  fn: async (t) => {
    for (const [name, make] of CASES) {
      await t.step(name, async () => {
        const p = make();
        assert.ok(stretchRatio(p.coordinates!.x) > 3 || stretchRatio(p.coordinates!.y) > 3);
        const mine = solve(p, { stop: { tolerance: 1e-13, maxCycles: 100 } });
        assert.ok(mine.converged, `not converged: ${mine.reason}`);
        const theirs = await scipySolve(p);
        const { diff, scale } = largestDifference(mine.solution, theirs);
        assert.ok(diff <= TOLERANCE * scale, `max difference ${diff} (scale ${scale})`);
      });
    }
  },
});
