/**
 * Jumping-coefficient benchmark of the reference solver (issue 13), run by `npm run bench:jump`.
 *
 * For each n (default 64, 128, 256, 512; choose with `--n 128,256`) it measures, in one run and
 * side by side:
 * - the 5-point Poisson operator u_xx + u_yy with the defaults (rediscretized coarse operators,
 *   five-point levels): seconds per V(2,1) cycle, the yardstick;
 * - ∇·(k∇u) with k = 1 | 10⁴ and k = 1 | 10⁶ across x = ½, and a checkerboard of 1 | 10⁴ meeting
 *   at (½, ½), with the defaults for a conductivity (Galerkin coarse operators, operator-dependent
 *   interpolation, nine-point coarse levels): the asymptotic V(2,1) convergence factor (from a
 *   random error on the homogeneous problem, `tests/reference_solver/_factor.ts`), the setup
 *   seconds, and the seconds per V(2,1) cycle with its ratio to the Poisson cycle; for the
 *   checkerboard also the F-cycle factor.
 * Cycle times are the best of 5, Poisson and jump cycles measured alternately so both see the same
 * machine load. Prints a table, or with `--json` one JSON object per line.
 *
 * @module
 */
import {
  buildHierarchy,
  cycle,
  type Problem,
  resolveOptions,
  type SolveOptions,
} from "../reference-solver/mod.ts";
import { type JumpPattern, jumpProblem } from "../tests/reference_solver/_conductivity.ts";
import { homogeneousProblem, measureFactor } from "../tests/reference_solver/_factor.ts";

interface Row {
  n: number;
  problem: string;
  factor: number;
  fCycleFactor?: number;
  setupSeconds: number;
  secondsPerCycle: number;
  poissonSecondsPerCycle: number;
  cycleRatio: number;
}

const PARAMS = { pre: 2, post: 1, fmgCycle: "V" as const, fmgCyclesPerLevel: 1 };

function setup(problem: Problem, options: SolveOptions = {}) {
  const t0 = performance.now();
  const h = buildHierarchy(problem, resolveOptions(options));
  const seconds = (performance.now() - t0) / 1000;
  // a random start, so the cycles do real work
  const L = h.levels[0];
  for (let k = 0; k < L.u.length; k++) L.u[k] = Math.sin(12.9898 * k) * 0.5;
  for (const k of L.op.dirichlet) L.u[k] = 0;
  return { h, seconds };
}

function timeCycle(h: ReturnType<typeof setup>["h"]): number {
  const t0 = performance.now();
  cycle(h, 0, 1, PARAMS);
  return (performance.now() - t0) / 1000;
}

const CASES: { label: string; ratio: number; pattern: JumpPattern }[] = [
  { label: "k = 1 | 1e4 across x = 1/2", ratio: 1e4, pattern: "half" },
  { label: "k = 1 | 1e6 across x = 1/2", ratio: 1e6, pattern: "half" },
  { label: "checkerboard 1 | 1e4", ratio: 1e4, pattern: "checkerboard" },
];

function measure(n: number): Row[] {
  const poisson = setup(homogeneousProblem(n));
  const rows: Row[] = [];
  for (const c of CASES) {
    const problem = jumpProblem(n, c.ratio, c.pattern);
    const run = { rounds: 2, cycles: 30, tail: 10 };
    const factor = measureFactor(problem, {}, run).factor;
    const fCycleFactor = c.pattern === "checkerboard"
      ? measureFactor(problem, { cycle: { type: "F" } }, run).factor
      : undefined;
    const jump = setup(problem);
    let tp = Infinity, tj = Infinity;
    for (let rep = 0; rep < 5; rep++) {
      tp = Math.min(tp, timeCycle(poisson.h));
      tj = Math.min(tj, timeCycle(jump.h));
    }
    rows.push({
      n,
      problem: c.label,
      factor,
      ...(fCycleFactor === undefined ? {} : { fCycleFactor }),
      setupSeconds: jump.seconds,
      secondsPerCycle: tj,
      poissonSecondsPerCycle: tp,
      cycleRatio: tj / tp,
    });
  }
  return rows;
}

function parseArgs(args: string[]): { json: boolean; ns: number[] } {
  let json = false, ns = [64, 128, 256, 512];
  for (let k = 0; k < args.length; k++) {
    const a = args[k];
    if (a === "--json") json = true;
    else if (a === "--n") ns = (args[++k] ?? "").split(",").map(Number);
    else {
      console.error(`jump_bench: unknown argument ${a}; use --json or --n 128,256`);
      Deno.exit(2);
    }
  }
  if (!ns.every((n) => Number.isInteger(n) && n >= 16 && n % 16 === 0)) {
    console.error("jump_bench: --n takes multiples of 16 separated by commas, e.g. --n 128,256");
    Deno.exit(2);
  }
  return { json, ns };
}

function main(): void {
  const { json, ns } = parseArgs(Deno.args);
  const head = [
    "n",
    "problem",
    "V factor",
    "F factor",
    "setup s",
    "s/cycle",
    "Poisson s/cycle",
    "cycle/Poisson",
  ];
  if (!json) console.log(head.join(" | "));
  measure(32); // warm-up: compile the kernels before anything is timed
  for (const n of ns) {
    for (const r of measure(n)) {
      if (json) {
        console.log(JSON.stringify(r));
        continue;
      }
      console.log([
        r.n,
        r.problem,
        r.factor.toFixed(3),
        r.fCycleFactor === undefined ? "" : r.fCycleFactor.toFixed(3),
        r.setupSeconds.toFixed(3),
        r.secondsPerCycle.toExponential(3),
        r.poissonSecondsPerCycle.toExponential(3),
        r.cycleRatio.toFixed(2),
      ].join(" | "));
    }
  }
}

if (import.meta.main) main();
