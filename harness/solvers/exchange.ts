/**
 * What every backend that speaks the protocol to a program shares, whether the program runs as a
 * local child process (`external.ts`) or as a scheduler job (`batch/`): deciding whether a task
 * applies, preparing the request, and judging the reply into a {@link SolveOutcome}.
 *
 * @module
 */
import {
  type Capabilities,
  type MessageBytes,
  type ParsedMessage,
  protocolVersion,
  readReply,
  type ReplyExpectation,
  solveRequestBytes,
} from "../protocol/mod.ts";
import { SIDES } from "../../reference-solver/mod.ts";
import { emptyOutcome, solutionOutcome } from "./outcome.ts";
import { casePoints, type LayoutPoints } from "./geometry.ts";
import { expressionTexts, sampleCase, version1Refusal } from "./sample.ts";
import type { ExternalSolverSpec, SolveOutcome, SolveTask } from "./types.ts";

/** A request ready to send, with what its reply must match. */
export interface Prepared {
  task: SolveTask;
  /** The request line; its arrays are encoded while it is written. */
  request: MessageBytes;
  expect: ReplyExpectation;
  limitSeconds: number;
  /**
   * The points of the request's grid, made on first call and kept: called once the request is
   * sent, so they are ready while the solver works (at a million nodes they take milliseconds
   * the harness would otherwise spend after the reply).
   */
  points: () => LayoutPoints;
}

/** The layout requests are sampled on: a solver on its own points gets the vertex layout. */
export function requestLayout(spec: Pick<ExternalSolverSpec, "layout">): "vertex" | "cell" {
  return spec.layout === "cell" ? "cell" : "vertex";
}

/** Why a task is outside a session's declared support, or undefined. */
function unsupported(
  task: SolveTask,
  spec: ExternalSolverSpec,
  caps: Capabilities,
): string | undefined {
  if (caps.boundaryKinds) {
    for (const side of SIDES) {
      const kind = task.case.boundary[side].kind;
      if (!(caps.boundaryKinds as string[]).includes(kind)) {
        return `the solver declares boundary kinds ${
          caps.boundaryKinds.join(", ")
        }; the case has ${kind} on ${side}`;
      }
    }
  }
  if (caps.forms && !caps.forms.includes(task.case.form)) {
    return `the solver declares operator forms ${caps.forms.join(", ")}; the case is ` +
      `${task.case.form}`;
  }
  if (caps.layouts && !caps.layouts.includes(spec.layout)) {
    return `the solver declares layouts ${
      caps.layouts.join(", ")
    }; the solver file says ${spec.layout}`;
  }
  if (caps.encodings && !caps.encodings.includes(spec.encoding)) {
    return `the solver declares encodings ${
      caps.encodings.join(", ")
    }; the solver file says ${spec.encoding}`;
  }
  if (caps.largestGrid && (task.nx > caps.largestGrid.nx || task.ny > caps.largestGrid.ny)) {
    return `the grid ${task.nx}×${task.ny} is larger than the solver's largest grid ` +
      `${caps.largestGrid.nx}×${caps.largestGrid.ny}`;
  }
  return undefined;
}

/**
 * A not-applicable outcome when the task is outside what the solver handles (its skipCases, its
 * scheme, what a session declared), else undefined.
 */
export function applicability(
  spec: ExternalSolverSpec,
  task: SolveTask,
  caps: Capabilities | undefined,
): SolveOutcome | undefined {
  const grid = { layout: spec.layout, nx: task.nx, ny: task.ny };
  if (spec.skipCases.includes(task.case.id)) {
    return emptyOutcome(
      "not-applicable",
      `case ${task.case.id} is in the solver file's skipCases`,
      grid,
    );
  }
  // no request: version 1 cannot carry the case
  const oldProtocol = (spec.protocol ?? 1) === 1 ? version1Refusal(task.case) : undefined;
  if (oldProtocol) return emptyOutcome("not-applicable", oldProtocol, grid);
  if (task.scheme !== spec.scheme && !(caps?.schemes?.includes(task.scheme))) {
    return emptyOutcome(
      "not-applicable",
      `the solver implements the ${spec.scheme} scheme; this solve asks for ${task.scheme}`,
      grid,
    );
  }
  if (caps) {
    const why = unsupported(task, spec, caps);
    if (why) return emptyOutcome("not-applicable", why, grid);
  }
  return undefined;
}

/** Builds the request, or an outcome when the task does not apply or cannot be sampled. */
export function prepareRequest(
  spec: ExternalSolverSpec,
  task: SolveTask,
  id: string,
  caps: Capabilities | undefined,
): Prepared | SolveOutcome {
  const grid = { layout: spec.layout, nx: task.nx, ny: task.ny };
  const refusal = applicability(spec, task, caps);
  if (refusal) return refusal;
  const layout = requestLayout(spec);
  const limitSeconds = task.timeLimitSeconds ?? spec.timeLimitSeconds;
  const protocol = protocolVersion(spec.protocol ?? 1);
  let request: MessageBytes;
  try {
    const sampled = sampleCase(task.case, task.nx, task.ny, layout);
    request = solveRequestBytes(sampled, {
      id,
      caseId: task.case.id,
      caseTitle: task.case.title,
      expressions: expressionTexts(task.case.formulas),
      scheme: task.scheme,
      tolerance: task.tolerance,
      timeLimitSeconds: limitSeconds,
      encoding: spec.encoding,
      // the solver file decides when it says; else what the session declared (once: no)
      constants: spec.constantArrays ?? caps?.constantArrays === true,
      protocol,
    });
  } catch (error) {
    return emptyOutcome(
      "failed",
      `could not sample the case for the request: ${(error as Error).message}`,
      grid,
    );
  }
  let points: LayoutPoints | undefined;
  return {
    task,
    request,
    limitSeconds,
    expect: { id, layout, nx: task.nx, ny: task.ny, domain: task.case.domain, protocol },
    points: () => points ??= casePoints(task.case, layout, task.nx, task.ny),
  };
}

/** Turns a reply (its text, or its message parsed as it arrived) into an outcome. */
export function judgeReply(
  spec: ExternalSolverSpec,
  text: string | ParsedMessage,
  p: Prepared,
  extra: { seconds: number; stderrTail?: string; description?: Record<string, unknown> },
  description: Record<string, unknown>,
): SolveOutcome {
  const grid = { layout: spec.layout, nx: p.task.nx, ny: p.task.ny };
  const check = readReply(text, p.expect);
  if (!check.ok) return emptyOutcome("failed", check.reason, grid, extra);
  const reply = check.reply;
  if (reply.type === "not-applicable") {
    return emptyOutcome("not-applicable", `the solver says: ${reply.reason}`, grid, extra);
  }
  if (reply.type === "error") {
    return emptyOutcome("failed", `the solver reported an error: ${reply.reason}`, grid, extra);
  }
  if (reply.type !== "solution") throw new TypeError(`unhandled reply type ${reply.type}`);
  return solutionOutcome(reply, { ...p.expect }, { ...extra, description }, p.points);
}

/** Last line of defence: a bug in a backend becomes a failed outcome, not an exception. */
export async function guard(
  work: () => Promise<SolveOutcome>,
  task: SolveTask,
  spec: Pick<ExternalSolverSpec, "layout">,
): Promise<SolveOutcome> {
  try {
    return await work();
  } catch (error) {
    return emptyOutcome(
      "failed",
      `gridproof could not run the solver: ${(error as Error).message}`,
      { layout: spec.layout, nx: task.nx, ny: task.ny },
    );
  }
}
