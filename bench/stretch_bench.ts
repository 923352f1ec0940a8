/**
 * Convergence factor of the reference solver on stretched grids at a stretching ratio of 10
 * (largest over smallest cell): tanh clustering at both ends and a geometric progression, both
 * axes, Dirichlet and all-Neumann (singular, mean-zero) Laplace problems, n = 32 … 256. Prints a
 * table, or with `--json` one JSON array. Goal (issue 14): factor ≤ 0.2 and flat under refinement.
 *
 * Run: `deno run -A bench/stretch_bench.ts [--json]` (npm script `bench:stretch`).
 *
 * @module
 */
import { solve } from "../reference-solver/mod.ts";
import {
  build,
  type Field,
  geometric,
  type Kinds,
  stretchRatio,
  tanhBetaFor,
  tanhBoth,
} from "../tests/reference_solver/_stretched.ts";

const pi = Math.PI;
const FIELD: Field = {
  u: (x, y) => Math.cos(pi * x) * Math.cos(pi * y),
  ux: (x, y) => -pi * Math.sin(pi * x) * Math.cos(pi * y),
  uy: (x, y) => -pi * Math.cos(pi * x) * Math.sin(pi * y),
  f: (x, y) => -2 * pi * pi * Math.cos(pi * x) * Math.cos(pi * y),
};
const beta = tanhBetaFor(10);
const families: Record<string, (n: number) => Float64Array> = {
  "tanh both ends": (n) => tanhBoth(n, beta),
  "geometric": (n) => geometric(n, 10),
};
const sides: Record<string, Kinds> = {
  dirichlet: { west: "dirichlet", east: "dirichlet", south: "dirichlet", north: "dirichlet" },
  "all-neumann": { west: "neumann", east: "neumann", south: "neumann", north: "neumann" },
};
const rows = [];
for (const [family, map] of Object.entries(families)) {
  for (const [bc, kinds] of Object.entries(sides)) {
    for (const n of [32, 64, 128, 256]) {
      const x = map(n);
      const p = build(FIELD, x, x, kinds, { a: 1, b: 0, c: 1, d: 0, e: 0 });
      const r = solve(p, {
        stop: { tolerance: 1e-10, maxCycles: 50 },
        singular: bc === "all-neumann" ? "mean-zero" : "refuse",
      });
      rows.push({
        family,
        boundary: bc,
        n,
        ratio: Number(stretchRatio(x).toFixed(2)),
        cycles: r.cycles,
        averageFactor: Number(r.averageFactor.toFixed(4)),
        asymptoticFactor: Number(r.asymptoticFactor.toFixed(4)),
        smoother: String(r.description.smoother.name),
        seconds: Number(r.seconds.toFixed(3)),
      });
    }
  }
}
if (Deno.args.includes("--json")) console.log(JSON.stringify(rows, null, 2));
else {
  console.log(
    "family          boundary     n    ratio  cycles  avg     asym    smoother          s",
  );
  for (const r of rows) {
    console.log(
      `${r.family.padEnd(15)} ${r.boundary.padEnd(12)} ${String(r.n).padStart(3)}  ${
        r.ratio.toFixed(2).padStart(5)
      }  ${String(r.cycles).padStart(6)}  ${r.averageFactor.toFixed(3)}   ${
        r.asymptoticFactor.toFixed(3)
      }   ${r.smoother.padEnd(16)}  ${r.seconds.toFixed(2)}`,
    );
  }
}
