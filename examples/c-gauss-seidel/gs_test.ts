import assert from "node:assert/strict";
import { buildCExample, findScipyPython } from "../../testing/mod.ts";
import {
  buildRequest,
  decodeValues,
  exactValues,
  maxDifference,
  maxRelativeDifference,
  MIXES,
  QUADRATIC,
  runExample,
  SMOOTH,
} from "../test_requests.ts";

const HERE = new URL(".", import.meta.url);
const BINARY = new URL("gridproof-gs", HERE).pathname;
const PYTHON = await findScipyPython();
const NOT_BUILT = await buildCExample();
const SKIP = PYTHON === undefined
  ? " — SKIPPED: no python3 with NumPy and SciPy (install python3-scipy)"
  : "";
const SKIP_C = NOT_BUILT ? ` — SKIPPED: ${NOT_BUILT}` : "";

/** The binary is built once per test run (`make -C examples/c-gauss-seidel`, as `.ci/run` does). */
async function build(): Promise<void> {
  assert.equal(await buildCExample(), undefined);
}

async function solve(req: Record<string, unknown>) {
  const run = await runExample([BINARY], HERE, JSON.stringify(req));
  assert.equal(run.code, 0, run.stderr);
  assert.equal(run.replies.length, 1, `stdout: ${run.stdout}`);
  return run.replies[0];
}

Deno.test({
  name:
    `c-gauss-seidel reproduces a quadratic exact solution to round-off with every boundary kind${SKIP_C}`,
  ignore: NOT_BUILT !== undefined,
}, async (t) => {
  // Source: derived — central differences and the ghost-node formulas are exact for quadratics.
  await build();
  for (const [mix, sides] of Object.entries(MIXES)) {
    for (const encoding of ["numbers", "base64"] as const) {
      await t.step(`${mix}, ${encoding}`, async () => {
        const reply = await solve(buildRequest(QUADRATIC, sides, { nx: 8, ny: 6 }, { encoding }));
        assert.equal(reply.type, "solution", JSON.stringify(reply));
        assert.equal(reply.converged, true);
        const err = maxDifference(
          decodeValues(reply.values),
          exactValues(QUADRATIC, "vertex", 8, 6),
        );
        assert.ok(err < 1e-9, `max error ${err}`);
      });
    }
  }
});

Deno.test({
  name: `c-gauss-seidel equals the python-scipy example's sparse direct solution${SKIP}${SKIP_C}`,
  ignore: PYTHON === undefined || NOT_BUILT !== undefined,
  fn: async (t) => {
    // Source: independent library — SciPy's spsolve (SuperLU) of the same scheme, assembled in
    // NumPy by examples/python-scipy; both tolerances far below the 1e-9 relative asked.
    await build();
    const scipyDir = new URL("../python-scipy/", HERE);
    for (const scheme of ["central", "upwind"] as const) {
      for (const [mix, sides] of Object.entries(MIXES)) {
        await t.step(`${scheme}, ${mix}`, async () => {
          const req = buildRequest(SMOOTH, sides, { nx: 12, ny: 10 }, { scheme });
          const c = await solve(req);
          const py = await runExample([PYTHON!, "-B", "solver.py"], scipyDir, JSON.stringify(req));
          assert.equal(py.code, 0, py.stderr);
          const rel = maxRelativeDifference(
            decodeValues(c.values),
            decodeValues(py.replies[0].values),
          );
          assert.ok(rel < 1e-9, `max relative difference ${rel}`);
        });
      }
    }
  },
});

Deno.test({
  name: `c-gauss-seidel answers hello, requests and goodbye in session mode${SKIP_C}`,
  ignore: NOT_BUILT !== undefined,
}, async () => {
  await build();
  const hello = { protocol: "gridproof-protocol/1", type: "hello" };
  const goodbye = { protocol: "gridproof-protocol/1", type: "goodbye" };
  const r1 = buildRequest(QUADRATIC, MIXES["all dirichlet"], { nx: 4, ny: 4 }, { id: "one" });
  const r2 = buildRequest(QUADRATIC, MIXES["all dirichlet"], { nx: 200, ny: 4 }, { id: "big" });
  const input = [hello, r1, r2, goodbye].map((m) => JSON.stringify(m)).join("\n") + "\n";
  const run = await runExample([BINARY], HERE, input);
  assert.equal(run.code, 0, run.stderr);
  assert.deepEqual(run.replies.map((r) => r.type), ["ready", "solution", "not-applicable"]);
  assert.deepEqual(
    (run.replies[0].supports as { largestGrid: unknown }).largestGrid,
    { nx: 128, ny: 128 },
  );
});

Deno.test({
  name: `c-gauss-seidel answers a broken request with an error naming the field${SKIP_C}`,
  ignore: NOT_BUILT !== undefined,
}, async () => {
  await build();
  const req = buildRequest(QUADRATIC, MIXES["all dirichlet"], { nx: 4, ny: 4 });
  (req.coefficients as Record<string, unknown>).c = [1, 2, 3];
  const reply = await solve(req);
  assert.equal(reply.type, "error");
  assert.match(String(reply.reason), /coefficients\.c: has 3 values, expected 25/);
});
