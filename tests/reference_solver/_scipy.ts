/**
 * Runs `scipy_reference.py` (an independent Python assembly of the discrete system, solved by
 * SciPy's sparse direct solver) on a problem and returns its solution.
 *
 * @module
 */
import { fileURLToPath } from "node:url";
import type { Problem } from "../../reference-solver/mod.ts";
import { runWithInput } from "../../testing/mod.ts";

const SCRIPT = fileURLToPath(new URL("./scipy_reference.py", import.meta.url));

/** Solves `problem` with SciPy's spsolve through the independent Python assembly. */
export async function scipySolve(
  python: string,
  problem: Problem,
  options: { upwind?: boolean } = {},
): Promise<{ solution: Float64Array; scipy: string }> {
  const boundary = Object.fromEntries(
    Object.entries(problem.boundary).map(([side, bc]) => [
      side,
      bc.kind === "robin"
        ? {
          kind: bc.kind,
          alpha: Array.from(bc.alpha),
          beta: Array.from(bc.beta),
          values: Array.from(bc.values),
        }
        : bc.kind === "periodic"
        ? { kind: bc.kind }
        : { kind: bc.kind, values: Array.from(bc.values) },
    ]),
  );
  const input = JSON.stringify({
    domain: problem.domain,
    nx: problem.nx,
    ny: problem.ny,
    a: Array.from(problem.a),
    b: Array.from(problem.b),
    c: Array.from(problem.c),
    d: Array.from(problem.d),
    e: Array.from(problem.e),
    f: Array.from(problem.f),
    boundary,
    upwind: options.upwind ?? false,
  });
  const out = await runWithInput([python, SCRIPT], input);
  if (!out.success) {
    throw new Error(
      `scipy_reference.py failed (exit ${out.code}): ${out.stderr}`,
    );
  }
  const reply = JSON.parse(out.stdout);
  return { solution: Float64Array.from(reply.solution), scipy: reply.scipy };
}
