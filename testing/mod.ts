/**
 * Small test helpers shared by the project's tests (JSR's `@std/assert` is unreachable here, so
 * tests use `node:assert/strict` plus these).
 *
 * @module
 */
import assert from "node:assert/strict";

/**
 * Asserts |actual − expected| ≤ max(abs, rel·|expected|).
 *
 * @example
 * ```ts
 * import { assertClose } from "./mod.ts";
 * assertClose(0.1 + 0.2, 0.3, { rel: 1e-12 });
 * ```
 */
export function assertClose(
  actual: number,
  expected: number,
  tolerance: { rel?: number; abs?: number } = { rel: 1e-12 },
  message?: string,
): void {
  const rel = tolerance.rel ?? 0;
  const abs = tolerance.abs ?? 0;
  const bound = Math.max(abs, rel * Math.abs(expected));
  const diff = Math.abs(actual - expected);
  if (!(diff <= bound)) {
    assert.fail(
      `${message ? message + ": " : ""}expected ${expected} ± ${bound}, got ${actual} ` +
        `(difference ${diff})`,
    );
  }
}

/**
 * Finds Debian's python3 with SciPy, or returns undefined (tests then say plainly they skipped).
 * Only `/usr/bin/python3` is probed: it is the interpreter the example solver files name, so a
 * test never finds SciPy under one interpreter and runs the example under another.
 */
export async function findScipyPython(): Promise<string | undefined> {
  for (const candidate of ["/usr/bin/python3"]) {
    try {
      const out = await new Deno.Command(candidate, {
        args: ["-c", "import scipy, numpy; print(scipy.__version__)"],
        stdout: "piped",
        stderr: "null",
      }).output();
      if (out.success) return candidate;
    } catch {
      // not installed at this path: try the next candidate
    }
  }
  return undefined;
}

export { mulberry32, normalDeviates } from "./random.ts";
export { buildCExample } from "./c_example.ts";
export { CLI_PERMISSIONS, type CliRun, runGridproof } from "./cli.ts";
export { type InputRun, runWithInput } from "./run_with_input.ts";
