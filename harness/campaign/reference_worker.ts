/**
 * Worker script of the pooled reference solver: compiles the cases it is sent from their
 * derivations (no mathjs; cases made in code are loaded by reference), keeps them, and runs the
 * in-process reference solver on the tasks it is sent, posting back the outcome with its arrays
 * transferred.
 *
 * @module
 */
/// <reference lib="deno.worker" />
import { compileDerivation, loadCase } from "../../cases/mod.ts";
import type { CompiledCase } from "../../cases/types.ts";
import { createReferenceSolver } from "../solvers/mod.ts";
import type { SolveOptions } from "../../reference-solver/mod.ts";
import type { WorkerReply, WorkerRequest } from "./reference_pool.ts";
import { measureOutcome } from "./measure.ts";

const cases = new Map<string, Promise<CompiledCase>>();
let solver: ReturnType<typeof createReferenceSolver> | undefined;

function caseFor(ref: WorkerRequest["case"]): Promise<CompiledCase> {
  const key = ref.key ?? JSON.stringify(ref);
  let found = cases.get(key);
  if (!found) {
    found = ref.built
      ? Promise.resolve(
        compileDerivation(ref.built.file, ref.built.derivation, {
          origin: ref.origin,
          parameters: ref.parameters,
        }),
      )
      : loadCase(ref.origin === "library" ? ref.id : ref.origin, { parameters: ref.parameters });
    cases.set(key, found);
  }
  return found;
}

self.onmessage = async (event: MessageEvent<WorkerRequest | { setup: SolveOptions }>) => {
  const message = event.data;
  if ("setup" in message) {
    solver = createReferenceSolver({ solveOptions: message.setup });
    return;
  }
  let reply: WorkerReply;
  try {
    const kase = await caseFor(message.case);
    solver ??= createReferenceSolver();
    const outcome = await solver.solve({ ...message.task, case: kase });
    reply = { id: message.id, outcome };
    // measured here, off the campaign's main thread, before the arrays are transferred away
    if (message.measure) {
      reply.record = measureOutcome(
        kase,
        message.measure.solver,
        outcome,
        message.measure.tolerance,
      );
    }
  } catch (error) {
    reply = { id: message.id, error: error instanceof Error ? error.message : String(error) };
  }
  const transfer: ArrayBuffer[] = [];
  if (reply.outcome) {
    for (
      const a of [reply.outcome.x, reply.outcome.y, reply.outcome.weights, reply.outcome.values]
    ) {
      if (a.buffer instanceof ArrayBuffer) transfer.push(a.buffer);
    }
  }
  self.postMessage(reply, { transfer: [...new Set(transfer)] });
};
