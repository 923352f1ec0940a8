/**
 * `gridproof solve --case ID|FILE --n N …`: one solve of one case with the bundled reference
 * solver; prints the max and L2 errors against the exact solution, the residual history, the
 * convergence factor and the time (or one JSON object with `--json`).
 *
 * @module
 */
import type { Command } from "commander";
import { type CompiledCase, loadCase } from "../../cases/mod.ts";
import {
  CYCLE_NAMES,
  type CycleName,
  SMOOTHER_NAMES,
  type SmootherName,
  solve,
  type SolveOptions,
  type SolveResult,
} from "../../reference-solver/mod.ts";
import { errorNorms, vertexWeights } from "../analysis/mod.ts";
import { InputError } from "./errors.ts";
import type { SetExitCode } from "./exit.ts";

/** The flags of `gridproof solve` as commander parses them (all text). */
export interface SolveFlags {
  case?: string;
  n?: string;
  cycle?: string;
  smoother?: string;
  pre?: string;
  post?: string;
  tol?: string;
  maxCycles?: string;
  upwind?: boolean;
  json?: boolean;
  param?: string[];
}

/** What `gridproof solve --json` prints. */
export interface SolveReport {
  case: string;
  origin: string;
  n: number;
  nx: number;
  ny: number;
  scheme: "central" | "upwind";
  parameters: Record<string, number>;
  errorMax: number;
  errorL2: number;
  errorL1: number;
  cycles: number;
  residualHistory: number[];
  /** Asymptotic convergence factor (geometric mean of the last per-cycle factors). */
  convergenceFactor: number;
  averageFactor: number;
  converged: boolean;
  reason: string;
  /** Wall time of the solve. */
  seconds: number;
  /** Wall time spent sampling the case onto the grid. */
  sampleSeconds: number;
  solver: Record<string, unknown>;
}

function closest(name: string, valid: readonly string[]): string | undefined {
  const norm = (s: string) => s.toLowerCase().replaceAll("_", "-");
  return valid.find((v) => norm(v) === norm(name));
}

function bad(flag: string, message: string): InputError {
  return new InputError(message, { where: flag });
}

function integerFlag(flag: string, text: string | undefined, min: number): number | undefined {
  if (text === undefined) return undefined;
  if (!/^\d+$/.test(text.trim()) || Number(text) < min) {
    throw bad(flag, `must be a whole number of at least ${min}, found "${text}"`);
  }
  return Number(text);
}

/**
 * Parses `--param name=value` flags.
 *
 * @throws {InputError} for a flag without `=` or a value that is not a finite number
 */
export function parseParameterFlags(flags: readonly string[] = []): Record<string, number> {
  const out: Record<string, number> = {};
  for (const flag of flags) {
    const match = /^([A-Za-z_][A-Za-z0-9_]*)=(.+)$/.exec(flag.trim());
    const value = match ? Number(match[2]) : NaN;
    if (!match || !Number.isFinite(value)) {
      throw bad("--param", `expected name=number, e.g. --param width=0.1, found "${flag}"`);
    }
    out[match[1]] = value;
  }
  return out;
}

/**
 * Turns the flags into solver options (the case's solver advice fills what the flags leave out).
 *
 * @throws {InputError} naming the flag, the value and the valid values
 */
export function solveOptionsFromFlags(flags: SolveFlags, c: CompiledCase): SolveOptions {
  const cycleText = flags.cycle ?? c.solver?.cycle;
  let cycle: CycleName | undefined;
  if (cycleText !== undefined) {
    cycle = closest(cycleText, CYCLE_NAMES) as CycleName | undefined;
    if (!cycle) {
      throw bad("--cycle", `unknown cycle "${cycleText}"; valid: ${CYCLE_NAMES.join(", ")}`);
    }
  }
  const smootherText = flags.smoother ?? c.solver?.smoother;
  let smoother: SmootherName | undefined;
  if (smootherText !== undefined) {
    smoother = closest(smootherText, SMOOTHER_NAMES) as SmootherName | undefined;
    if (!smoother) {
      throw bad(
        "--smoother",
        `unknown smoother "${smootherText}"; valid: ${SMOOTHER_NAMES.join(", ")}`,
      );
    }
  }
  const pre = integerFlag("--pre", flags.pre, 0);
  const post = integerFlag("--post", flags.post, 0);
  const maxCycles = integerFlag("--max-cycles", flags.maxCycles, 1) ?? c.solver?.maxCycles;
  let tolerance: number | undefined;
  if (flags.tol !== undefined) {
    tolerance = Number(flags.tol);
    if (!Number.isFinite(tolerance) || tolerance <= 0 || tolerance >= 1) {
      throw bad("--tol", `must be a number between 0 and 1, e.g. 1e-10, found "${flags.tol}"`);
    }
  }
  const options: SolveOptions = { scheme: { upwind: flags.upwind === true } };
  options.cycle = {
    ...(cycle ? { type: cycle } : {}),
    ...(pre !== undefined ? { pre } : {}),
    ...(post !== undefined ? { post } : {}),
  };
  if (smoother) options.smoother = { name: smoother };
  options.stop = {
    ...(tolerance !== undefined ? { tolerance } : {}),
    ...(maxCycles !== undefined ? { maxCycles } : {}),
  };
  return options;
}

/**
 * Solves a case once and measures its errors.
 *
 * @throws {InputError} for bad flags; {@link RangeError} for a case that cannot be sampled
 */
export async function runSolve(flags: SolveFlags): Promise<SolveReport> {
  if (!flags.case) {
    throw bad("--case", "is required: give a built-in case id (see `gridproof cases`) or a file");
  }
  const c = await loadCase(flags.case, { parameters: parseParameterFlags(flags.param ?? []) });
  const n = integerFlag("--n", flags.n, 2) ?? c.grids[c.grids.length - 1];
  const options = solveOptionsFromFlags(flags, c);
  const { nx, ny } = c.gridFor(n);
  // Memory (issue 16): the exact solution is sampled after the solve, so it does not sit beside
  // the solver's hierarchy at the peak.
  const t0 = performance.now();
  const problem = await c.sampleAsync(nx, ny);
  let sampleSeconds = (performance.now() - t0) / 1000;
  const result: SolveResult = solve(problem, options);
  const t1 = performance.now();
  const exact = c.sampleExact(nx, ny);
  sampleSeconds += (performance.now() - t1) / 1000;
  const hx = (c.domain.x1 - c.domain.x0) / nx;
  const hy = (c.domain.y1 - c.domain.y0) / ny;
  const norms = errorNorms(result.solution, exact, vertexWeights(nx, ny, hx, hy));
  return {
    case: c.id,
    origin: c.origin,
    n,
    nx,
    ny,
    scheme: options.scheme?.upwind ? "upwind" : "central",
    parameters: { ...c.parameters },
    errorMax: norms.max,
    errorL2: norms.l2,
    errorL1: norms.l1,
    cycles: result.cycles,
    residualHistory: [...result.residualHistory],
    convergenceFactor: result.asymptoticFactor,
    averageFactor: result.averageFactor,
    converged: result.converged,
    reason: result.reason,
    seconds: result.seconds,
    sampleSeconds,
    solver: { ...result.description },
  };
}

/** The text form of a solve report. */
export function solveText(r: SolveReport): string {
  const e = (v: number) => v.toExponential(3);
  const history = r.residualHistory.map((v, k) => `  ${String(k).padStart(3)}  ${e(v)}`);
  return [
    `case ${r.case} on ${r.nx}×${r.ny} intervals, ${r.scheme} scheme${
      Object.keys(r.parameters).length
        ? `, ${Object.entries(r.parameters).map(([k, v]) => `${k} = ${v}`).join(", ")}`
        : ""
    }`,
    `error max ${e(r.errorMax)}   L2 ${e(r.errorL2)}   L1 ${e(r.errorL1)}`,
    `${r.converged ? "converged" : "NOT converged"} (${r.reason}) after ${r.cycles} cycles; ` +
    `convergence factor ${r.convergenceFactor.toFixed(4)} (average ${r.averageFactor.toFixed(4)})`,
    `time: solve ${r.seconds.toFixed(3)} s, sampling ${r.sampleSeconds.toFixed(3)} s`,
    "residual history (cycle, ‖r‖₂):",
    ...history,
  ].join("\n");
}

/**
 * Registers `solve`.
 *
 * @param program The root command.
 * @param setExitCode Raises the exit code (1 when the solve does not converge).
 */
export function registerSolveCommand(program: Command, setExitCode: SetExitCode): void {
  program
    .command("solve")
    .description("solve one case once with the reference solver and report errors and convergence")
    .option("--case <id|file>", "a built-in case id (see `gridproof cases`) or a case file (.json)")
    .option(
      "--n <N>",
      "intervals along x (ny follows the case's intervalRatio); default: finest suggested grid",
    )
    .option("--cycle <name>", `cycle: ${CYCLE_NAMES.join(", ")} (any letter case); default V`)
    .option(
      "--smoother <name>",
      `smoother: ${
        SMOOTHER_NAMES.join(", ")
      } (any letter case, _ or -); default: the case's advice, else red-black`,
    )
    .option("--pre <K>", "pre-smoothing sweeps (default 2)")
    .option("--post <K>", "post-smoothing sweeps (default 1)")
    .option("--tol <T>", "relative residual tolerance (default 1e-10)")
    .option("--max-cycles <K>", "cycle limit (default 100)")
    .option("--upwind", "first-order upwinding of b·u_x and d·u_y (formal order 1)")
    .option(
      "--param <name=value>",
      "override a case parameter (repeatable), e.g. --param width=0.1",
      (v: string, acc: string[] | undefined) => [...(acc ?? []), v],
    )
    .option("--json", "print one JSON object")
    .action(async (flags: SolveFlags) => {
      const report = await runSolve(flags);
      console.log(flags.json ? JSON.stringify(report, null, 2) : solveText(report));
      if (!report.converged) setExitCode(1);
    });
}
