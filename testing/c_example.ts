/**
 * Builds the C example solver (examples/c-gauss-seidel) once per test process, as `.ci/run` does.
 * Tests that need it skip, naming the reason, when it cannot be built (no gcc, make or
 * libcjson-dev on the machine).
 *
 * @module
 */

let built: Promise<string | undefined> | undefined;

/**
 * Builds examples/c-gauss-seidel with `make -s`.
 *
 * @returns undefined when the binary is built, else why it could not be (for a test's name).
 *
 * @example
 * ```ts ignore
 * const why = await buildCExample();
 * Deno.test({ name: `… ${why ? `(skipped: ${why})` : ""}`, ignore: why !== undefined, fn });
 * ```
 */
export function buildCExample(): Promise<string | undefined> {
  built ??= (async () => {
    const dir = new URL("../examples/c-gauss-seidel/", import.meta.url).pathname;
    try {
      const out = await new Deno.Command("make", {
        args: ["-s", "-C", dir],
        stdout: "piped",
        stderr: "piped",
      }).output();
      if (out.success) return undefined;
      const tail = new TextDecoder().decode(out.stderr).trim().split("\n").slice(-1)[0] ?? "";
      return `the C example does not build here (needs gcc, make and libcjson-dev): ${tail}`;
    } catch {
      return "the C example cannot be built here: make is not installed (needs gcc, make and " +
        "libcjson-dev)";
    }
  })();
  return built;
}
