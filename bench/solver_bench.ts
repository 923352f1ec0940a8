/**
 * Speed benchmark of the reference multigrid solver (issue 2, "Speed"), run by `npm run bench`.
 *
 * For each n (default 256, 512, 1024, 2048; choose with `--n 256,512`) on the problem of
 * `bench_problem.ts` it measures, in one run and side by side:
 * - a Float64Array triad pass a[i] = b[i] + s·c[i] over arrays of (n+1)² doubles, the
 *   memory-bandwidth yardstick, and one V(2,1) red–black full-weighting cycle alone
 *   (`secondsPerCycle`, on a hierarchy built beforehand), measured alternately, best of 5 each;
 * - a full solve from zero to relative residual 1e-10 with the defaults (V(2,1), red–black,
 *   full weighting), sampling excluded: solve seconds (setup included), setup seconds, cycles,
 *   stop reason, average convergence factor, and seconds per iteration ((solve − setup)/cycles:
 *   a cycle plus the residual norm of the stopping test);
 * - the same solve started by one FMG pass (`cycle.type: "fmg"`): `fmgSolveSeconds`;
 * - one FMG pass with one V(2,1) per level: its seconds alone (`fmgSeconds`, timed like the cycle,
 *   alternating with the triad), and the ratio of the max-norm error of a `solve` stopped after
 *   that pass to the error of the fully converged solution (`fmgErrorRatio`);
 * - peak resident memory of the process right after the full solves at this n (VmHWM from
 *   /proc/self/status on Linux): the sampled problem plus the solver, before the benchmark's own
 *   extra allocations at that n.
 * Timed runs are repeated (best of `--repeat`, default 2) because the machine is shared.
 * Prints a table, or with `--json` one JSON object per line.
 *
 * @module
 */
import {
  buildHierarchy,
  cycle,
  fullMultigrid,
  resolveOptions,
  solve,
  type SolveResult,
} from "../reference-solver/mod.ts";
import { benchProblem } from "./bench_problem.ts";

interface Row {
  n: number;
  unknowns: number;
  triadSeconds: number;
  solveSeconds: number;
  setupSeconds: number;
  cycles: number;
  stopReason: string;
  convergenceFactor: number;
  secondsPerCycle: number;
  iterationSeconds: number;
  fmgSolveSeconds: number;
  fmgSolveCycles: number;
  fmgSeconds: number;
  fmgErrorRatio: number;
  discretizationError: number;
  cyclePerTriad: number;
  fmgPerTriad: number;
  solvePerTriad: number;
  peakRssMiB: number;
}

let triadArrays: Float64Array[] = [];

/** Seconds of one triad pass a[i] = b[i] + s·c[i] over `size` doubles (best of 3). */
function triadSeconds(size: number): number {
  if (triadArrays[0]?.length !== size) {
    triadArrays = [
      new Float64Array(size),
      new Float64Array(size).fill(1.5),
      new Float64Array(size).fill(0.25),
    ];
  }
  const [a, b, c] = triadArrays;
  let best = Infinity;
  for (let rep = 0; rep < 3; rep++) {
    const s = 1 + rep * 1e-3;
    const t0 = performance.now();
    for (let i = 0; i < size; i++) a[i] = b[i] + s * c[i];
    best = Math.min(best, (performance.now() - t0) / 1000);
  }
  if (!(a[size - 1] > 0)) throw new Error("triad result lost");
  return best;
}

function peakRssMiB(): number {
  try {
    const status = Deno.readTextFileSync("/proc/self/status");
    const m = /VmHWM:\s+(\d+)\s+kB/.exec(status);
    if (m) return Number(m[1]) / 1024;
  } catch {
    // not Linux: fall back to the current resident size
  }
  return Deno.memoryUsage().rss / 2 ** 20;
}

/** Max-norm difference of two arrays. */
function maxError(u: Float64Array, exact: Float64Array): number {
  let e = 0;
  for (let k = 0; k < u.length; k++) e = Math.max(e, Math.abs(u[k] - exact[k]));
  return e;
}

interface Summary {
  seconds: number;
  setupSeconds: number;
  cycles: number;
  reason: string;
  averageFactor: number;
  maxError: number;
}

/** Best (smallest solve − setup) of `runs` solves, keeping only numbers (the solutions are dropped). */
function best(runs: number, exact: Float64Array, f: () => SolveResult): Summary {
  let out: Summary | undefined;
  for (let r = 0; r < runs; r++) {
    const res = f();
    const s: Summary = {
      seconds: res.seconds,
      setupSeconds: res.setupSeconds,
      cycles: res.cycles,
      reason: res.reason,
      averageFactor: res.averageFactor,
      maxError: maxError(res.solution, exact),
    };
    if (out === undefined || s.seconds - s.setupSeconds < out.seconds - out.setupSeconds) out = s;
  }
  return out!;
}

function measure(n: number, repeat: number): Row {
  const { problem, exact } = benchProblem(n);
  const unknowns = (n + 1) * (n + 1);
  const full = best(repeat, exact, () => solve(problem));
  // Peak memory of the process so far: the sampled problem plus full solves at this n (and
  // everything at smaller n, which is less).
  const peak = peakRssMiB();
  const fmg = best(
    repeat,
    exact,
    () => solve(problem, { cycle: { type: "fmg" }, stop: { maxCycles: 1 } }),
  );
  const fmgSolve = best(repeat, exact, () => solve(problem, { cycle: { type: "fmg" } }));
  // Triad and cycle measured alternately, best of 5 each, so both see the same machine load.
  const h = buildHierarchy(problem, resolveOptions());
  const params = { pre: 2, post: 1, fmgCycle: "V" as const, fmgCyclesPerLevel: 1 };
  let triad = Infinity, cycleSeconds = Infinity, fmgSeconds = Infinity;
  for (let rep = 0; rep < 5; rep++) {
    triad = Math.min(triad, triadSeconds(unknowns));
    let t0 = performance.now();
    cycle(h, 0, 1, params);
    cycleSeconds = Math.min(cycleSeconds, (performance.now() - t0) / 1000);
    t0 = performance.now();
    fullMultigrid(h, params);
    fmgSeconds = Math.min(fmgSeconds, (performance.now() - t0) / 1000);
  }
  return {
    n,
    unknowns,
    triadSeconds: triad,
    solveSeconds: full.seconds,
    setupSeconds: full.setupSeconds,
    cycles: full.cycles,
    stopReason: full.reason,
    convergenceFactor: full.averageFactor,
    secondsPerCycle: cycleSeconds,
    iterationSeconds: (full.seconds - full.setupSeconds) / full.cycles,
    fmgSolveSeconds: fmgSolve.seconds,
    fmgSolveCycles: fmgSolve.cycles,
    fmgSeconds,
    fmgErrorRatio: fmg.maxError / full.maxError,
    discretizationError: full.maxError,
    cyclePerTriad: cycleSeconds / triad,
    fmgPerTriad: fmgSeconds / triad,
    solvePerTriad: full.seconds / triad,
    peakRssMiB: peak,
  };
}

function parseArgs(args: string[]): { json: boolean; ns: number[]; repeat: number } {
  let json = false, ns = [256, 512, 1024, 2048], repeat = 2;
  for (let k = 0; k < args.length; k++) {
    const a = args[k];
    if (a === "--json") json = true;
    else if (a === "--n") ns = (args[++k] ?? "").split(",").map(Number);
    else if (a === "--repeat") repeat = Number(args[++k]);
    else {
      console.error(`solver_bench: unknown argument ${a}; use --json, --n 256,512, --repeat 2`);
      Deno.exit(2);
    }
  }
  if (!ns.every((n) => Number.isInteger(n) && n >= 2) || !(repeat >= 1)) {
    console.error(
      "solver_bench: --n takes integers ≥ 2 separated by commas; --repeat an integer ≥ 1",
    );
    Deno.exit(2);
  }
  return { json, ns, repeat };
}

function main(): void {
  const { json, ns, repeat } = parseArgs(Deno.args);
  const head = [
    "n",
    "unknowns",
    "triad s",
    "s/cycle",
    "cycle/triad",
    "factor",
    "cycles",
    "stop",
    "solve s",
    "setup s",
    "fmg+V solve s",
    "fmg s",
    "fmg/triad",
    "fmg err ratio",
    "peak MiB",
  ];
  if (!json) console.log(head.join(" | "));
  for (const n of ns) {
    const r = measure(n, repeat);
    if (json) {
      console.log(JSON.stringify(r));
      continue;
    }
    console.log([
      r.n,
      r.unknowns,
      r.triadSeconds.toExponential(2),
      r.secondsPerCycle.toExponential(3),
      r.cyclePerTriad.toFixed(1),
      r.convergenceFactor.toFixed(3),
      r.cycles,
      r.stopReason,
      r.solveSeconds.toFixed(3),
      r.setupSeconds.toFixed(3),
      `${r.fmgSolveSeconds.toFixed(3)} (${r.fmgSolveCycles})`,
      r.fmgSeconds.toFixed(3),
      r.fmgPerTriad.toFixed(1),
      r.fmgErrorRatio.toFixed(3),
      r.peakRssMiB.toFixed(0),
    ].join(" | "));
  }
}

if (import.meta.main) main();
