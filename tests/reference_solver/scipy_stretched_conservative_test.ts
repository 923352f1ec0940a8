/**
 * The reference solver's conservative (flux) form on stretched and periodic grids against SciPy's
 * sparse direct solve of an independent assembly (`scipy_stretched_conservative.py`, written from
 * the conservative paragraph of the module documentation of `reference-solver/
 * discretize_stretched.ts` alone): the same discrete system, so the two solutions agree to the
 * multigrid's stopping tolerance times the condition number.
 *
 * K varies in x and y and is sampled at the physical edge midpoints; the first-order terms, the
 * reaction, the source and the boundary data are not taken from any exact solution; one Robin side
 * has weights that vary along it; the grids are a tanh family (both ends), a geometric progression
 * and a periodic axis whose seam joins a small and a large cell.
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

const SCRIPT = fileURLToPath(new URL("./scipy_stretched_conservative.py", import.meta.url));
const python = await findScipyPython();
const SKIPPED = python === undefined ? " (skipped: Debian python3-scipy not installed)" : "";
// the multigrid stops at a relative residual of 1e-13; with the stretching and K varying by a
// factor of ~3 the condition numbers leave the solutions equal to ~1e-9 relative (common practice)
const TOLERANCE = 1e-8;

type Kind = "dirichlet" | "neumann" | "robin" | "periodic";

/** Periodic in x with period 1, so the seam's images agree. */
const s = (px: number) => Math.sin(2 * Math.PI * px);
const c = (px: number) => Math.cos(2 * Math.PI * px);
const k11 = (px: number, py: number) => 1.5 + 0.6 * s(px) * py;
const k22 = (px: number, py: number) => 0.8 + 0.5 * py * py + 0.2 * c(px);

function problem(x: Float64Array, y: Float64Array, kinds: Record<Side, Kind>): Problem {
  const nx = x.length - 1, ny = y.length - 1;
  const lattice = (
    xs: ArrayLike<number>,
    ys: ArrayLike<number>,
    fn: (a: number, b: number) => number,
  ) => {
    const out = new Float64Array(xs.length * ys.length);
    for (let j = 0, k = 0; j < ys.length; j++) {
      for (let i = 0; i < xs.length; i++, k++) out[k] = fn(xs[i], ys[j]);
    }
    return out;
  };
  const mid = (v: Float64Array) => v.slice(1).map((t, i) => (t + v[i]) / 2);
  const data: Record<Side, (t: number) => number> = {
    west: (t) => 0.4 + 0.5 * Math.sin(2 * t),
    east: (t) => -0.3 + t * t,
    south: (t) => c(t) - 0.2,
    north: (t) => 0.5 * s(t) + 0.1,
  };
  const boundary = {} as Record<Side, BoundaryCondition>;
  for (const side of ["west", "east", "south", "north"] as const) {
    const along = side === "west" || side === "east" ? y : x;
    const values = along.map(data[side]);
    const kind = kinds[side];
    boundary[side] = kind === "periodic"
      ? { kind }
      : kind === "robin"
      ? robinCondition(along.map((t) => 0.8 + 0.4 * t), along.map((t) => 0.5 + 0.5 * t * t), values)
      : { kind, values };
  }
  return {
    domain: { x0: 0, x1: 1, y0: 0, y1: 1 },
    nx,
    ny,
    coordinates: { x, y },
    a: lattice(x, y, k11),
    b: lattice(x, y, (px) => 0.7 * c(px)),
    c: lattice(x, y, k22),
    d: lattice(x, y, (px, py) => -0.4 * py + 0.3 * s(px)),
    e: lattice(x, y, (px, py) => -0.6 - 0.3 * c(px) * py),
    f: lattice(x, y, (px, py) => s(px) * Math.cos(3 * py) + py - 0.4),
    conductivity: {
      alongX: { k11: lattice(mid(x), y, k11) },
      alongY: { k22: lattice(x, mid(y), k22) },
    },
    boundary,
  };
}

async function scipySolve(p: Problem): Promise<Float64Array> {
  const arr = (v: Float64Array) => Array.from(v);
  const input = JSON.stringify({
    x: arr(p.coordinates!.x),
    y: arr(p.coordinates!.y),
    k11x: arr(p.conductivity!.alongX.k11),
    k22y: arr(p.conductivity!.alongY.k22),
    b: arr(p.b),
    d: arr(p.d),
    e: arr(p.e),
    f: arr(p.f),
    boundary: boundaryJson(p.boundary),
  });
  const out = await runWithInput([python!, SCRIPT], input);
  if (!out.success) {
    throw new Error(`scipy_stretched_conservative.py failed (exit ${out.code}): ${out.stderr}`);
  }
  return Float64Array.from(JSON.parse(out.stdout).solution);
}

const BETA = tanhBetaFor(10);
const CASES: [string, () => Problem][] = [
  [
    "tanh (ratio 10) × geometric (ratio 8): Dirichlet west, Robin east (varying weights), Neumann south and north",
    () =>
      problem(tanhBoth(36, BETA), geometric(26, 8), {
        west: "dirichlet",
        east: "robin",
        south: "neumann",
        north: "neumann",
      }),
  ],
  [
    "geometric × tanh, no Dirichlet side (the reaction keeps it regular): Neumann and Robin",
    () =>
      problem(geometric(30, 6), tanhBoth(28, BETA), {
        west: "neumann",
        east: "robin",
        south: "robin",
        north: "neumann",
      }),
  ],
  [
    // a geometric x-family: the seam joins the largest and the smallest cell (5 to 1)
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
    `solve() of the conservative form on stretched and periodic grids equals SciPy's solve of the independently assembled flux-form system${SKIPPED}`,
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
