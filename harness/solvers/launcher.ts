/**
 * Launch templates: a solver file may wrap a solver's command in a launcher such as
 * `mpirun -np {ranks}` or `srun -n {ranks}`, with the rank count fixed or growing with the grid.
 * The protocol does not change: the launcher starts the ranks and rank 0 speaks it.
 *
 * Placeholders, replaced in every argument of the launcher's command:
 *
 * | placeholder | value                                                             |
 * | ----------- | ----------------------------------------------------------------- |
 * | `{ranks}`   | the rank count of this solve                                      |
 * | `{nx}`      | intervals (or cells) along x                                      |
 * | `{ny}`      | intervals (or cells) along y                                      |
 * | `{job}`     | a name for the solve: `gridproof-<solver>-<case>-<nx>x<ny>`       |
 * | `{minutes}` | the solve's time limit in whole minutes, rounded up               |
 *
 * @module
 */
import type { LauncherSpec } from "./types.ts";

/** Every placeholder a launcher's command may hold. */
export const PLACEHOLDERS = ["ranks", "nx", "ny", "job", "minutes"] as const;

/** The placeholders that depend on the grid (not allowed in session mode: one process serves every grid). */
const GRID_PLACEHOLDERS = ["nx", "ny", "job", "minutes"];

/** What a launch depends on. */
export interface LaunchContext {
  solver: string;
  caseId: string;
  layout: "vertex" | "cell" | "points";
  nx: number;
  ny: number;
  /** A rank count that overrides the launcher's rule (the rank-count check asks for 1 and N). */
  ranks?: number;
  limitSeconds: number;
}

/** The unknowns of a grid: nodes for vertex and own-points solvers, cells for cell solvers. */
export function gridUnknowns(layout: "vertex" | "cell" | "points", nx: number, ny: number): number {
  return layout === "cell" ? nx * ny : (nx + 1) * (ny + 1);
}

/**
 * The rank count of a solve on an nx × ny grid: the launcher's fixed count, or one rank per
 * `unknownsPerRank` unknowns (rounded up), at least 1 and at most `most`.
 *
 * @example
 * ```ts
 * import { ranksFor } from "./launcher.ts";
 * console.assert(ranksFor({ command: [], ranks: 4 }, "vertex", 8, 8) === 4);
 * console.assert(ranksFor({ command: [], ranks: { unknownsPerRank: 1000, most: 8 } }, "vertex", 63, 63) === 5);
 * ```
 */
export function ranksFor(
  launcher: LauncherSpec,
  layout: "vertex" | "cell" | "points",
  nx: number,
  ny: number,
): number {
  if (typeof launcher.ranks === "number") return launcher.ranks;
  const wanted = Math.ceil(gridUnknowns(layout, nx, ny) / launcher.ranks.unknownsPerRank);
  return Math.max(1, Math.min(launcher.ranks.most ?? Infinity, wanted));
}

/** `{name}` → its value in one argument; unknown names are left as they are (refused at load). */
function fill(arg: string, values: Record<string, string>): string {
  return arg.replace(/\{([a-z]+)\}/g, (whole, name: string) => values[name] ?? whole);
}

/**
 * The launcher's command for one solve with its placeholders filled, to be put before the
 * solver's own command; empty when the solver has no launcher.
 *
 * @example
 * ```ts
 * import { launchPrefix } from "./launcher.ts";
 * const argv = launchPrefix({ command: ["mpirun", "-np", "{ranks}"], ranks: 3 }, {
 *   solver: "s", caseId: "c", layout: "vertex", nx: 16, ny: 16, limitSeconds: 90,
 * });
 * console.assert(argv.join(" ") === "mpirun -np 3");
 * ```
 */
export function launchPrefix(launcher: LauncherSpec | undefined, ctx: LaunchContext): string[] {
  if (!launcher) return [];
  const values: Record<string, string> = {
    ranks: String(ctx.ranks ?? ranksFor(launcher, ctx.layout, ctx.nx, ctx.ny)),
    nx: String(ctx.nx),
    ny: String(ctx.ny),
    job: `gridproof-${ctx.solver}-${ctx.caseId}-${ctx.nx}x${ctx.ny}`,
    minutes: String(Math.max(1, Math.ceil(ctx.limitSeconds / 60))),
  };
  return launcher.command.map((arg) => fill(arg, values));
}

/**
 * What is wrong with a launcher as written in a solver file (beyond its schema), as
 * `field: problem; fix` texts, empty when nothing is.
 *
 * @param launcher the launcher
 * @param mode the solver's process mode
 * @param field the launcher's path in the file, e.g. `solvers[2].launcher`
 */
export function launcherProblems(
  launcher: LauncherSpec,
  mode: "once" | "session",
  field: string,
): string[] {
  const problems: string[] = [];
  launcher.command.forEach((arg, k) => {
    for (const [, name] of arg.matchAll(/\{([^}]*)\}/g)) {
      if (!(PLACEHOLDERS as readonly string[]).includes(name)) {
        problems.push(
          `${field}.command[${k}]: unknown placeholder {${name}}; the placeholders are ${
            PLACEHOLDERS.map((p) => `{${p}}`).join(", ")
          }`,
        );
      } else if (mode === "session" && GRID_PLACEHOLDERS.includes(name)) {
        problems.push(
          `${field}.command[${k}]: {${name}} depends on the grid, but a session serves every ` +
            `grid from one process; use mode "once", or remove {${name}}`,
        );
      }
    }
  });
  if (mode === "session" && typeof launcher.ranks !== "number") {
    problems.push(
      `${field}.ranks: a session starts its ranks once, for every grid, so the rank count must ` +
        `be a fixed number; use mode "once" for ranks that grow with the grid`,
    );
  }
  return problems;
}
