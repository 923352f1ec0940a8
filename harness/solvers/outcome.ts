/**
 * Builders of {@link SolveOutcome} records shared by the backends.
 *
 * @module
 */
import type { DecodedSolution } from "../protocol/mod.ts";
import type { Domain } from "../../reference-solver/mod.ts";
import { freePoints, gridPoints, type LayoutPoints } from "./geometry.ts";
import type { SolveOutcome } from "./types.ts";

/** An outcome without values: failed or not applicable. */
export function emptyOutcome(
  status: "failed" | "not-applicable",
  reason: string,
  grid: { layout: "vertex" | "cell" | "points"; nx: number; ny: number },
  extra: { seconds?: number; stderrTail?: string; description?: Record<string, unknown> } = {},
): SolveOutcome {
  const outcome: SolveOutcome = {
    status,
    reason,
    layout: grid.layout,
    nx: grid.nx,
    ny: grid.ny,
    x: new Float64Array(0),
    y: new Float64Array(0),
    weights: new Float64Array(0),
    values: new Float64Array(0),
    residualHistory: [],
    iterations: null,
    converged: null,
    solverSeconds: null,
    seconds: extra.seconds ?? 0,
  };
  if (extra.stderrTail !== undefined) outcome.stderrTail = extra.stderrTail;
  if (extra.description !== undefined) outcome.description = extra.description;
  return outcome;
}

/**
 * An ok outcome from a decoded solution reply on a vertex or cell grid or on its own points.
 * `gridPointsOf` gives the points of the grid (default: computed here); a caller that made them
 * while the solver worked passes them in.
 */
export function solutionOutcome(
  reply: DecodedSolution,
  grid: { layout: "vertex" | "cell"; nx: number; ny: number; domain: Domain },
  extra: { seconds: number; stderrTail?: string; description?: Record<string, unknown> },
  gridPointsOf: () => LayoutPoints = () => gridPoints(grid.layout, grid.domain, grid.nx, grid.ny),
): SolveOutcome {
  const points = reply.points
    ? freePoints(grid.domain, reply.points.x, reply.points.y, reply.points.weights)
    : gridPointsOf();
  const description: Record<string, unknown> = { ...extra.description };
  if (reply.solver) description.solver = reply.solver;
  if (reply.notes !== undefined) description.notes = reply.notes;
  const outcome: SolveOutcome = {
    status: "ok",
    layout: reply.points ? "points" : grid.layout,
    nx: grid.nx,
    ny: grid.ny,
    x: points.x,
    y: points.y,
    weights: points.weights,
    boundaryBand: points.boundaryBand,
    values: reply.values,
    residualHistory: reply.residualHistory ?? [],
    iterations: reply.iterations ?? null,
    converged: reply.converged ?? null,
    solverSeconds: reply.seconds ?? null,
    seconds: extra.seconds,
    description,
  };
  if (extra.stderrTail !== undefined) outcome.stderrTail = extra.stderrTail;
  return outcome;
}

/** The end of a stderr text for a one-line reason (the full tail is kept separately). */
export function stderrGist(tail: string, max = 600): string {
  const trimmed = tail.trimEnd();
  if (trimmed === "") return "; stderr was empty";
  const end = trimmed.length > max ? "…" + trimmed.slice(-max) : trimmed;
  return `; stderr ends with: ${end}`;
}
