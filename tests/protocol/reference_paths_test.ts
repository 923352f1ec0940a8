/**
 * The reference solver in process and as a protocol program (reference-solver/protocol_main.ts)
 * must give the same discrete solution: the DESIGN tests the two paths against each other.
 */
import assert from "node:assert/strict";
import {
  createExternalSolver,
  createReferenceSolver,
  type ExternalSolverSpec,
  type SolveOutcome,
} from "../../harness/solvers/mod.ts";
import { testCase } from "./_case.ts";
import { runWithInput } from "../../testing/mod.ts";

const root = new URL("../../", import.meta.url).pathname;

function protocolSpec(extra: Partial<ExternalSolverSpec>): ExternalSolverSpec {
  return {
    name: "reference-subprocess",
    command: [Deno.execPath(), "run", "--quiet", "reference-solver/protocol_main.ts"],
    mode: "once",
    encoding: "base64",
    layout: "vertex",
    scheme: "central",
    timeLimitSeconds: 120,
    skipCases: [],
    maxReplyMiB: 1024,
    ...extra,
  };
}

function maxDifference(a: SolveOutcome, b: SolveOutcome): { diff: number; scale: number } {
  assert.equal(a.values.length, b.values.length);
  let diff = 0;
  let scale = 0;
  for (let k = 0; k < a.values.length; k++) {
    diff = Math.max(diff, Math.abs(a.values[k] - b.values[k]));
    scale = Math.max(scale, Math.abs(a.values[k]));
  }
  return { diff, scale };
}

Deno.test("the reference solver gives the same solution in process and as a subprocess, in both modes and encodings", async (t) => {
  const c = testCase();
  for (const scheme of ["central", "upwind"] as const) {
    const inProcess = await createReferenceSolver().solve({
      case: c,
      nx: 16,
      ny: 32,
      scheme,
      tolerance: 1e-10,
    });
    assert.equal(inProcess.status, "ok", inProcess.reason);
    for (const mode of ["once", "session"] as const) {
      for (const encoding of ["numbers", "base64"] as const) {
        await t.step(`${scheme}, ${mode}, ${encoding}`, async () => {
          const solver = createExternalSolver(protocolSpec({ mode, encoding, scheme }), {
            solverFileDir: root,
          });
          try {
            const sub = await solver.solve({ case: c, nx: 16, ny: 32, scheme, tolerance: 1e-10 });
            assert.equal(sub.status, "ok", sub.reason);
            const { diff, scale } = maxDifference(inProcess, sub);
            // same code, bit-identical inputs (both encodings are exact): round-off at most
            assert.ok(diff <= 1e-13 * scale, `max difference ${diff}`);
            assert.equal(sub.iterations, inProcess.iterations);
            assert.equal(sub.converged, true);
            assert.deepEqual(sub.x, inProcess.x);
            assert.deepEqual(sub.weights, inProcess.weights);
          } finally {
            await solver.close();
          }
        });
      }
    }
  }
});

Deno.test("the protocol program reproduces u = x² + y² exactly from the canned request (central differences are exact for quadratics)", async () => {
  const t = JSON.parse(
    await Deno.readTextFile(
      new URL("testdata/protocol/transcripts/vertex-2x2-once.json", `file://${root}`),
    ),
  );
  const out = await runWithInput(
    [Deno.execPath(), "run", "--quiet", "reference-solver/protocol_main.ts"],
    JSON.stringify(t.request),
    { cwd: root },
  );
  const reply = JSON.parse(out.stdout);
  assert.equal(reply.id, t.request.id);
  // derived: the 5-point stencil and the central ghost-node Neumann/Robin closures are exact
  // for quadratics, so the discrete solution equals x² + y² at the nodes up to round-off
  (t.expectedValues as number[]).forEach((v, k) => {
    assert.ok(Math.abs(reply.values[k] - v) <= 1e-12, `node ${k}: ${reply.values[k]} vs ${v}`);
  });
});

Deno.test("the protocol program answers a cell-layout request with not applicable", async () => {
  const solver = createExternalSolver(protocolSpec({ layout: "cell" }), { solverFileDir: root });
  try {
    const o = await solver.solve({
      case: testCase(),
      nx: 4,
      ny: 8,
      scheme: "central",
      tolerance: 1e-8,
    });
    assert.equal(o.status, "not-applicable");
    assert.match(o.reason ?? "", /vertex-centred/);
  } finally {
    await solver.close();
  }
});
