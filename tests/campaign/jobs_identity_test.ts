/**
 * The output of a campaign does not depend on `--jobs` (issue 16, item 2): `check` with one job
 * (the reference solver in process, one session of the external solver) and with two (the
 * reference in a pool of workers, two sessions of the external solver, isolation variants solved
 * two at a time) writes the same result.json apart from what measures time. Exact identity: every
 * other value, to the last bit, and every text.
 */
import assert from "node:assert/strict";
import { runGridproof } from "../../testing/mod.ts";

const SOLVERS = new URL("../../examples/solvers.json", import.meta.url).pathname;

/** Keys whose values are clock readings or fitted from them. */
const TIMING = new Set([
  "createdAt",
  "seconds",
  "solverSeconds",
  "startupSeconds",
  "timeExponent",
]);

/** The result without its timings; the solver's own log keeps its words, not its times. */
function withoutTimings(value: unknown, key = ""): unknown {
  if (key === "stderrTail" && typeof value === "string") {
    return value.replace(/\d+(\.\d+)? s\b/g, "<time> s");
  }
  if (Array.isArray(value)) return value.map((v) => withoutTimings(v));
  if (value !== null && typeof value === "object") {
    return Object.fromEntries(
      Object.entries(value).filter(([k]) => !TIMING.has(k)).map((
        [k, v],
      ) => [k, withoutTimings(v, k)]),
    );
  }
  return value;
}

Deno.test("check writes the same result with --jobs 1 and --jobs 2, timings apart", async () => {
  const results = [];
  for (const jobs of ["1", "2"]) {
    const dir = await Deno.makeTempDir();
    const run = await runGridproof([
      "check",
      // mixed-boundaries fails for the defective solver, so isolation variants run too
      ...["--cases", "smooth-baseline,mixed-boundaries", "--grids", "8,16,32"],
      ...["--solvers", SOLVERS, "--solver", "reference,deno-sor-defective"],
      ...["--jobs", jobs, "--out", dir, "--no-progress"],
    ]);
    assert.equal(run.code, 1, run.stdout + run.stderr);
    const result = JSON.parse(await Deno.readTextFile(`${dir}/result.json`));
    await Deno.remove(dir, { recursive: true });
    assert.equal(result.configuration.jobs, Number(jobs));
    result.configuration.jobs = "either";
    results.push(result);
  }
  const [one, two] = results;
  assert.ok(
    one.studies.some((s: { isolation?: unknown }) => s.isolation),
    "isolation variants ran",
  );
  assert.ok(one.solves.length >= 12);
  assert.deepStrictEqual(withoutTimings(two), withoutTimings(one));
});
