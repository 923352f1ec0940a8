import assert from "node:assert/strict";
import { InputError } from "../errors/mod.ts";
import { runGridproof } from "../testing/mod.ts";
import type { CaseFile } from "./case_file.ts";
import { buildCase } from "./engine.ts";
import { loadCase } from "./load.ts";
import { testCase } from "./_test_case.ts";

// p is no node of any grid n = 2^k up to 1024, so no point of the check lattices either: the
// band |x − p| < 1e-4 below lies between all of them (domain_check_test.ts checks this)
const p = 0.3337;

/** The problems buildCase() reports for a case file, or [] when it builds. */
async function problemsOf(fields: Partial<CaseFile>, origin = "my.json"): Promise<string[]> {
  try {
    await buildCase(testCase(fields), { origin });
    return [];
  } catch (error) {
    if (error instanceof InputError) return error.problems;
    throw error;
  }
}

const coefficients = (c: Partial<CaseFile["coefficients"]>): CaseFile["coefficients"] => ({
  a: "1",
  b: "0",
  c: "1",
  d: "0",
  e: "0",
  ...c,
});

Deno.test("buildCase() refuses a coefficient that is negative only between the nodes of every grid (issue 12, item 13)", async () => {
  // before, every grid's nodes showed a > 0 and the case was solved as if elliptic
  const problems = await problemsOf({ coefficients: coefficients({ a: `(x - ${p})^2 - 1e-8` }) });
  assert.equal(problems.length, 1, problems.join("\n"));
  assert.match(
    problems[0],
    /^my\.json: coefficients\.a: a = -1e-8 at \(x, y\) = \(0\.3337, [\d.e-]+\), between the points of the 129×129 check grid \(found by local refinement\); the operator must be elliptic \(a·c > 0\) on the whole closed domain: make a positive on the whole domain, including between grid nodes$/,
  );
});

Deno.test("buildCase() refuses c negative in a small disc between the nodes, naming c", async () => {
  const problems = await problemsOf({
    coefficients: coefficients({ c: `(x - ${p})^2 + (y - 0.6663)^2 - 1e-8` }),
  });
  assert.equal(problems.length, 1, problems.join("\n"));
  assert.match(problems[0], /coefficients\.c: c = -1e-8 at \(x, y\) = \(0\.3337, 0\.6663\)/);
});

Deno.test("buildCase() refuses a reaction term singular between the nodes, naming e and not the derived f", async () => {
  const problems = await problemsOf({ coefficients: coefficients({ e: "1/(x - 0.123456)" }) });
  assert.equal(problems.length, 1, problems.join("\n"));
  assert.match(
    problems[0],
    /coefficients\.e: e grows without bound near \(x, y\) = \(0\.123456, [\d.e-]+\), between the points of the 129×129 check grid \(found by local refinement\): \|e\| reaches [\d.e+]+ there and keeps growing closer in \(a singularity\); make e finite on the whole closed domain, including between grid nodes/,
  );
});

Deno.test("buildCase() refuses an exact solution singular between the nodes, naming exact only", async () => {
  const problems = await problemsOf({ exact: `1/((x - ${p})^2 + (y - 0.6663)^2)` });
  assert.equal(problems.length, 1, problems.join("\n"));
  assert.match(
    problems[0],
    /^my\.json: exact: u grows without bound near \(x, y\) = \(0\.3337, 0\.6663\)/,
  );
});

Deno.test("buildCase() names derived boundary data that are not finite on a side", async () => {
  // u = √x·y is finite, but u_x = y/(2√x) and u_xx are infinite on the west side x = 0: the
  // source term f is named under exact, and the Neumann data ∂u/∂n = −u_x under boundary.west
  const sides: CaseFile["boundary"] = {
    west: { kind: "neumann" },
    east: { kind: "dirichlet" },
    south: { kind: "dirichlet" },
    north: { kind: "dirichlet" },
  };
  const problems = await problemsOf({ exact: "sqrt(x) * y", boundary: sides });
  assert.equal(problems.length, 2, problems.join("\n"));
  assert.match(
    problems[0],
    /^my\.json: exact: the derived source term f = .*: f = (NaN|-?Infinity) at \(x, y\) = \(0, /,
  );
  assert.match(
    problems[1],
    /^my\.json: boundary\.west: the derived boundary data g = ∂u\/∂n: g = (NaN|-?Infinity) at \(x, y\) = \(0, [\d.]+\) on the west side; make the exact solution's first derivatives finite on the side, or make the side dirichlet$/,
  );
});

Deno.test("buildCase() passes positive coefficients that come near zero, and a and c both negative", async (t) => {
  const good: [string, Partial<CaseFile["coefficients"]>][] = [
    ["(x - 0.3)^2 + 1e-6", { a: "(x - 0.3)^2 + 1e-6" }],
    ["1e-8 above zero between the nodes", { a: `(x - ${p})^2 + 1e-8` }],
    ["a, c < 0 everywhere (a·c > 0)", { a: "-1 - x", c: "-2" }],
  ];
  for (const [name, c] of good) {
    await t.step(name, async () => {
      assert.deepEqual(await problemsOf({ coefficients: coefficients(c) }), []);
    });
  }
  await t.step(
    "the library's near-degenerate case (a = 0.001 + x², 1e-3 of its largest)",
    async () => {
      const c = await loadCase("near-degenerate");
      assert.equal(c.coefficients.a(0, 0.5), 0.001);
    },
  );
});

Deno.test("buildCase() refuses a coefficient that only touches zero, and says it vanishes", async () => {
  const problems = await problemsOf({ coefficients: coefficients({ a: `(x - ${p})^2` }) });
  assert.match(
    problems.join("\n"),
    /coefficients\.a: a = [\d.e-]+ at \(x, y\) = \(0\.3337, .*: below 1e-12 of its largest value 0\.444, it vanishes there to round-off; the operator must be elliptic/,
  );
});

Deno.test("buildCase() keeps the sign a and c have at the centre and refuses c where it turns", async () => {
  // a = −1 − x < 0; c = −2 + 3x is −0.5 at the centre and positive for x > 2/3
  const problems = await problemsOf({ coefficients: coefficients({ a: "-1 - x", c: "-2 + 3*x" }) });
  assert.equal(problems.length, 1, problems.join("\n"));
  assert.match(
    problems[0],
    /coefficients\.c: c = 1 at \(x, y\) = \(1, 0\), a point of the 129×129 check grid; .*c and a are negative at the centre of the domain, so make c negative on the whole domain/,
  );
});

Deno.test("buildCase() names the parameters in effect when a coefficient fails with them", async () => {
  // a = k − x is positive on [0, 1] for the default k = 2, negative for x > 0.5 with k = 0.5
  const file = testCase({ coefficients: coefficients({ a: "k - x" }), parameters: { k: 2 } });
  await buildCase(file, { origin: "my.json" });
  await assert.rejects(
    buildCase(file, { origin: "my.json", parameters: { k: 0.5 } }),
    (e: unknown) => {
      assert.ok(e instanceof InputError);
      assert.match(
        e.problems.join("\n"),
        /coefficients\.a: a = -0\.5 at \(x, y\) = \(1, 0\), a point of the 129×129 check grid \(with the parameters k = 0\.5\)/,
      );
      return true;
    },
  );
});

Deno.test("gridproof cases check exits 2 for a coefficient negative between the nodes, with the place", async () => {
  const dir = await Deno.makeTempDir();
  const path = `${dir}/between.json`;
  const file = testCase({
    id: "between-nodes",
    coefficients: coefficients({ a: `(x - ${p})^2 - 1e-8` }),
  });
  await Deno.writeTextFile(path, JSON.stringify(file, null, 2));
  const run = await runGridproof(["cases", "check", path]);
  await Deno.remove(dir, { recursive: true });
  assert.equal(run.code, 2, run.stderr);
  assert.match(
    run.stderr,
    /between\.json:\d+:\d+: coefficients\.a: a = -1e-8 at \(x, y\) = \(0\.3337, /,
  );
  assert.doesNotMatch(run.stderr, /\n\s+at .*\.ts:\d+/, "no stack trace");
});
