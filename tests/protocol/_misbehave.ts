/**
 * The misbehaving test solver (testdata/protocol/solvers/misbehave.py, run by Debian's python3) as
 * a solver-file entry, for the fault, session and memory-limit tests.
 *
 * @module
 */
import type { ExternalSolverSpec } from "../../harness/solvers/mod.ts";

/** The folder the spec's relative paths start from (pass as `solverFileDir`). */
export const MISBEHAVE_DIR = new URL("../../testdata/protocol/", import.meta.url).pathname;

/**
 * A solver-file entry running misbehave.py with `args` (its mode and argument); once mode,
 * numbers, vertex, central, 20 s limit unless `extra` says otherwise.
 */
export function misbehaveSpec(
  args: string[],
  extra: Partial<ExternalSolverSpec> = {},
): ExternalSolverSpec {
  return {
    name: "misbehave",
    command: ["/usr/bin/python3", "solvers/misbehave.py", ...args],
    mode: "once",
    encoding: "numbers",
    layout: "vertex",
    scheme: "central",
    timeLimitSeconds: 20,
    skipCases: [],
    maxReplyMiB: 1024,
    ...extra,
  };
}
