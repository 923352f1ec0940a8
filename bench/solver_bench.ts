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
 *   extra allocations at that n;
 * - the plain C V-cycle of `vcycle.c` in three rounds alternating with ours (best of each), and
 *   the ratio `vCycleRatioToC`;
 * - FMG's work units both timed (FMG seconds over one fine sweep's) and counted from the kernels'
 *   flops (`workUnits`, reference-solver/work_units.ts);
 * - after the last n, the true peak of `gridproof solve --case smooth-baseline --n <largest>`
 *   through the harness (`harness_peak.ts`, GNU time), per node in total and above the n = 64
 *   run's fixed cost.
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
  workUnits,
} from "../reference-solver/mod.ts";
import { benchProblem } from "./bench_problem.ts";
import { compileYardstick, type Yardstick } from "./c_yardstick.ts";
import { freshProcessRun } from "./fresh_process.ts";
import { peakResidentBytes, procText } from "./_proc.ts";
import { harnessPeak } from "./harness_peak.ts";

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
  /** Peak resident size of the bench process so far (VmHWM); null where it cannot be read. */
  peakRssMiB: number | null;
  /** Seconds of one V(2,1) cycle of the plain C `vcycle.c` (gcc -O3), null without gcc. */
  cSecondsPerCycle: number | null;
  /** secondsPerCycle / cSecondsPerCycle, measured side by side in this run. */
  vCycleRatioToC: number | null;
  /** The goal for that ratio: 1.3 below n = 1024, 1.0 from there on. */
  vCycleGoalToC: number;
  /** Largest relative difference of the first five residual norms, reference against C. */
  cResidualAgreement: number | null;
  /** ‖u_fmg − u_converged‖∞ / ‖u_converged − u_exact‖∞ (algebraic over discretization error). */
  fmgAlgebraicRatio: number;
  /** Seconds of one FMG pass over the seconds of one red–black sweep on the finest grid. */
  fmgWorkUnits: number;
  /** Work units of one FMG pass counted from the kernels' flops (`workUnits`, one WU = one sweep). */
  fmgCountedWorkUnits: number;
  /** Work units of one V(2,1) cycle, counted likewise. */
  vCycleCountedWorkUnits: number;
  /** One fine red–black sweep: the work unit. */
  sweepSeconds: number;
  /** A fresh process: its first solve, its second, and its peak resident memory (see fresh_process.ts). */
  freshFirstSolveSeconds: number | null;
  freshSecondSolveSeconds: number | null;
  /** (VmHWM after the first solve − VmHWM after sampling) / nodes; null when it cannot be read. */
  solvePeakBytesPerNode: number | null;
  /** (VmHWM after sampling − VmHWM before) / nodes: the caller's problem arrays. */
  problemBytesPerNode: number | null;
  /** Why the fresh-process measures are missing, when they are. */
  freshNote?: string;
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

/** Peak resident size of this process so far in MiB (VmHWM), or null where it cannot be read. */
function peakRssMiB(): number | null {
  const bytes = peakResidentBytes();
  return bytes === null ? null : bytes / 2 ** 20;
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

/** Cycles timed per measurement: enough to fill about 0.1 s of C at every n. */
function cycleReps(unknowns: number): number {
  return Math.max(5, Math.ceil(4e6 / unknowns));
}

function measure(n: number, repeat: number, c: Yardstick): Row {
  const { problem, exact } = benchProblem(n);
  const unknowns = (n + 1) * (n + 1);
  const full = best(repeat, exact, () => solve(problem));
  // Peak memory of the process so far: the sampled problem plus full solves at this n (and
  // everything at smaller n, which is less).
  const peak = peakRssMiB();
  const fmgRun = solve(problem, { cycle: { type: "fmg" }, stop: { maxCycles: 1 } });
  const converged = solve(problem, { stop: { tolerance: 1e-13, maxCycles: 60 } }).solution;
  const fmg = {
    maxError: maxError(fmgRun.solution, exact),
    algebraic: maxError(fmgRun.solution, converged) / maxError(converged, exact),
  };
  const fmgSolve = best(repeat, exact, () => solve(problem, { cycle: { type: "fmg" } }));
  // Triad and cycle measured alternately, best of 5 each, so both see the same machine load.
  // Built for FMG (coarse levels keep their own rhs); the V-cycle timed on it is the same.
  const h = buildHierarchy(problem, resolveOptions({ cycle: { type: "fmg" } }));
  const params = { pre: 2, post: 1, fmgCycle: "V" as const, fmgCyclesPerLevel: 1 };
  let triad = Infinity, cycleSeconds = Infinity, fmgSeconds = Infinity, sweep = Infinity;
  const L0 = h.levels[0];
  const reps = cycleReps(unknowns);
  // Three rounds, each our cycles then the C cycles, best of all: both sides see the same load.
  const rounds = 3, perRound = Math.ceil(reps / rounds);
  const canC = c.ok && Number.isInteger(Math.log2(n)) && n >= 8;
  let cRun: { secondsPerCycle: number; residuals: number[] } | null = null;
  for (let rep = 0; rep < perRound * rounds; rep++) {
    if (canC && c.ok && rep % perRound === perRound - 1) {
      const run = c.run(n, perRound);
      if (cRun === null || run.secondsPerCycle < cRun.secondsPerCycle) cRun = run;
    }
    if (rep < 5) triad = Math.min(triad, triadSeconds(unknowns));
    let t0 = performance.now();
    cycle(h, 0, 1, params);
    cycleSeconds = Math.min(cycleSeconds, (performance.now() - t0) / 1000);
    t0 = performance.now();
    L0.smoother!.smooth(L0.u, L0.f, 1);
    sweep = Math.min(sweep, (performance.now() - t0) / 1000);
    if (rep >= 5) continue;
    t0 = performance.now();
    fullMultigrid(h, params);
    fmgSeconds = Math.min(fmgSeconds, (performance.now() - t0) / 1000);
  }
  let agreement = null;
  if (cRun !== null) {
    const ours = solve(problem, { stop: { maxCycles: 5, tolerance: 1e-300 } }).residualHistory;
    agreement = 0;
    for (let k = 0; k < cRun.residuals.length; k++) {
      agreement = Math.max(agreement, Math.abs(ours[k] - cRun.residuals[k]) / cRun.residuals[k]);
    }
  }
  const fresh = freshProcessRun(n);
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
    cSecondsPerCycle: cRun?.secondsPerCycle ?? null,
    vCycleRatioToC: cRun === null ? null : cycleSeconds / cRun.secondsPerCycle,
    vCycleGoalToC: n < 1024 ? 1.3 : 1.0,
    cResidualAgreement: agreement,
    fmgAlgebraicRatio: fmg.algebraic,
    fmgWorkUnits: fmgSeconds / sweep,
    fmgCountedWorkUnits: workUnits(h, "fmg", params),
    vCycleCountedWorkUnits: workUnits(h, "V", params),
    sweepSeconds: sweep,
    freshFirstSolveSeconds: fresh.ok ? fresh.firstSolveSeconds : null,
    freshSecondSolveSeconds: fresh.ok ? fresh.secondSolveSeconds : null,
    solvePeakBytesPerNode: fresh.ok ? fresh.solveBytesPerNode : null,
    problemBytesPerNode: fresh.ok ? fresh.problemBytesPerNode : null,
    ...(fresh.ok ? {} : { freshNote: fresh.reason }),
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

/**
 * The true peak through the harness at the largest n (`harness_peak.ts`): per node in total, and
 * above the same command's peak at n = 64 (the fixed cost of the process).
 */
function harnessRow(n: number, json: boolean): void {
  const what = `solve --case smooth-baseline --n ${n}`;
  const big = harnessPeak(n), small = harnessPeak(64);
  if (!big.ok || !small.ok) {
    const note = !big.ok ? big.reason : !small.ok ? small.reason : "";
    if (json) console.log(JSON.stringify({ harnessPeak: what, note }));
    else console.log(`harness peak: n/a (${note})`);
    return;
  }
  const nodes = (n + 1) ** 2, smallNodes = 65 ** 2;
  const row = {
    harnessPeak: what,
    peakMiB: big.peakBytes / 2 ** 20,
    peakBytesPerNode: big.peakBytes / nodes,
    aboveFixedBytesPerNode: (big.peakBytes - small.peakBytes) / (nodes - smallNodes),
    fixedMiB: small.peakBytes / 2 ** 20,
    goalBytesPerNode: 100,
  };
  if (json) return console.log(JSON.stringify(row));
  console.log(
    `harness peak (VmHWM by GNU time), ${what}: ${row.peakMiB.toFixed(0)} MiB = ` +
      `${row.peakBytesPerNode.toFixed(0)} B/node in total, ` +
      `${row.aboveFixedBytesPerNode.toFixed(0)} B/node above the n = 64 run's ` +
      `${row.fixedMiB.toFixed(0)} MiB (goal 100)`,
  );
}

const fix = (v: number | null, d: number) => (v === null ? "n/a" : v.toFixed(d));

function main(): void {
  const { json, ns, repeat } = parseArgs(Deno.args);
  const c = compileYardstick();
  const head = [
    "n",
    "s/cycle",
    "C s/cycle",
    "ratio to C (goal)",
    "cycle/triad",
    "factor",
    "cycles",
    "solve s",
    "setup s",
    "fmg+V solve s",
    "fmg err ratio",
    "fmg alg/disc (goal 0.5)",
    "fmg WU timed/counted (goal 10)",
    "1st/2nd solve, fresh",
    "solve B/node (goal 100)",
    "problem B/node",
    "peak MiB",
  ];
  if (!json) {
    console.log(`load average: ${procText("/proc/loadavg")?.trim() ?? "n/a"}`);
    console.log(c.ok ? "C yardstick: bench/vcycle.c, gcc -O3" : `C yardstick: none (${c.reason})`);
    console.log(head.join(" | "));
  }
  try {
    for (const n of ns) {
      const r = measure(n, repeat, c);
      if (json) {
        console.log(JSON.stringify(r));
        continue;
      }
      const fresh = r.freshFirstSolveSeconds === null
        ? `n/a (${r.freshNote})`
        : `${r.freshFirstSolveSeconds.toFixed(3)}/${r.freshSecondSolveSeconds!.toFixed(3)}`;
      console.log([
        r.n,
        r.secondsPerCycle.toExponential(3),
        r.cSecondsPerCycle === null ? "n/a" : r.cSecondsPerCycle.toExponential(3),
        `${fix(r.vCycleRatioToC, 2)} (${r.vCycleGoalToC})`,
        r.cyclePerTriad.toFixed(1),
        r.convergenceFactor.toFixed(3),
        r.cycles,
        r.solveSeconds.toFixed(3),
        r.setupSeconds.toFixed(3),
        `${r.fmgSolveSeconds.toFixed(3)} (${r.fmgSolveCycles})`,
        r.fmgErrorRatio.toFixed(3),
        r.fmgAlgebraicRatio.toFixed(3),
        `${r.fmgWorkUnits.toFixed(1)}/${r.fmgCountedWorkUnits.toFixed(2)}`,
        fresh,
        fix(r.solvePeakBytesPerNode, 0),
        fix(r.problemBytesPerNode, 0),
        fix(r.peakRssMiB, 0),
      ].join(" | "));
    }
    harnessRow(ns[ns.length - 1], json);
  } finally {
    if (c.ok) c.dispose();
  }
}

if (import.meta.main) main();
