/**
 * Protocol version 2 in both directions: the v2 fields of real library cases survive encode →
 * decode bit for bit in both encodings, the face values a request carries are the effective
 * interface values (checked against the harmonic mean computed here by hand), a version 1 request
 * refuses what it cannot carry, a solver that speaks version 1 gets the new cases as not
 * applicable without being started, and `probe` checks a version 2 solver's answers to the new
 * fields against manufactured solutions.
 */
import assert from "node:assert/strict";
import { join } from "node:path";
import { type CompiledCase, loadCase as compileCase } from "../../cases/mod.ts";
import {
  buildSolveRequest,
  PROTOCOL_VERSION,
  PROTOCOL_VERSION_2,
  readSolveRequest,
  type RequestDetails,
  type SampledProblem,
  serializeMessage,
} from "../../harness/protocol/mod.ts";
import { sampleCase } from "../../harness/solvers/sample.ts";
import { createExternalSolver } from "../../harness/solvers/external.ts";
import { PROBE_ERROR_LIMIT, probeSolver } from "../../harness/solvers/probe.ts";

const details = (id: string, encoding: "numbers" | "base64"): RequestDetails => ({
  id: `${id}/r1`,
  caseId: id,
  expressions: {
    a: "1",
    b: "0",
    c: "1",
    d: "0",
    e: "0",
    source: "0",
    boundary: {
      west: "0",
      east: "0",
      south: "0",
      north: "0",
    },
  },
  scheme: "central" as const,
  tolerance: 1e-10,
  timeLimitSeconds: 10,
  encoding,
  protocol: PROTOCOL_VERSION_2,
});

const compiledCases = new Map<string, Promise<CompiledCase>>();
/** A library case, compiled once for all tests of this file. */
function loadCase(id: string): Promise<CompiledCase> {
  let found = compiledCases.get(id);
  if (!found) compiledCases.set(id, found = compileCase(id));
  return found;
}

/** Every Float64Array of a sampled problem by its path, for comparing two problems. */
function arraysOf(p: SampledProblem): Map<string, Float64Array> {
  const out = new Map<string, Float64Array>();
  const walk = (value: unknown, path: string) => {
    if (value instanceof Float64Array) out.set(path, value);
    else if (value && typeof value === "object") {
      for (const [k, v] of Object.entries(value)) walk(v, `${path}/${k}`);
    }
  };
  const { a, b, c, d, e, f } = p;
  walk({ a, b, c, d, e, f, s: p.boundary, m: p.m, k: p.conductivity, x: p.coordinates }, "");
  return out;
}

Deno.test("a version 2 request carries the new fields through encode and decode unchanged", async (t) => {
  const rows: [string, "vertex" | "cell", number][] = [
    ["rotated-anisotropy", "cell", 8],
    ["rotated-anisotropy", "vertex", 8],
    ["layered-jump-100", "cell", 8],
    ["layered-jump-10000", "vertex", 8],
    ["mixed-derivative", "cell", 6],
    ["mixed-derivative", "vertex", 6],
  ];
  for (const [id, layout, n] of rows) {
    for (const encoding of ["numbers", "base64"] as const) {
      await t.step(`${id}, ${layout} layout, ${encoding}`, async () => {
        const compiled = await loadCase(id);
        const sent = sampleCase(compiled, n, n, layout);
        const message = buildSolveRequest(sent, details(id, encoding));
        const { problem: got, message: read } = readSolveRequest(serializeMessage(message));
        assert.equal(read.protocol, PROTOCOL_VERSION_2);
        assert.equal(got.form, compiled.form);
        assert.deepEqual(got.interfaces, compiled.interfaces);
        const before = arraysOf(sent);
        const after = arraysOf(got);
        assert.deepEqual([...after.keys()].sort(), [...before.keys()].sort());
        for (const [path, values] of before) {
          const back = after.get(path)!;
          if (encoding === "base64") assert.deepEqual(back, values, path);
          else {
            // JSON numbers keep every value but not the sign of a zero (JSON.stringify(-0) is "0")
            assert.equal(back.length, values.length, path);
            assert.ok(back.every((v, k) => v === values[k]), path);
          }
        }
        if (compiled.form === "conservative") {
          const faces = got.conductivity!;
          const [xs, ys] = layout === "cell"
            ? [(n + 1) * n, n * (n + 1)]
            : [n * (n + 1), (n + 1) * n];
          assert.equal(faces.alongX.k11.length, xs);
          assert.equal(faces.alongY.k22.length, ys);
        } else {
          assert.ok(got.m!.some((v) => v !== 0), "the mixed term arrives");
        }
      });
    }
  }
});

Deno.test("the faces on an interface carry the harmonic mean across it, computed here by hand", async () => {
  // layered-jump-100: K = 1 below y = 0.5 and K = 100 above (the case file's regions); the
  // effective conductivity of a face on the interface for the flux across it is the harmonic mean
  // 2·1·100/(1 + 100) (Patankar 1980, §4.2-3), for a flux along it the arithmetic mean 50.5
  const compiled = await loadCase("layered-jump-100");
  const n = 8;
  const cell = sampleCase(compiled, n, n, "cell");
  const harmonic = (2 * 1 * 100) / 101;
  // y-faces: nx·(ny + 1), index j·nx + i; row j = 4 is y = 0.5
  for (let i = 0; i < n; i++) {
    assert.ok(Math.abs(cell.conductivity!.alongY.k22[4 * n + i] - harmonic) < 1e-12);
    assert.equal(cell.conductivity!.alongY.k22[3 * n + i], 1);
    assert.equal(cell.conductivity!.alongY.k22[5 * n + i], 100);
  }
  // vertex layout: edges along x on the node line y = 0.5 (row j = 4, nx per row) carry flux along
  // the interface: the arithmetic mean
  const vertex = sampleCase(compiled, n, n, "vertex");
  for (let i = 0; i < n; i++) {
    assert.ok(Math.abs(vertex.conductivity!.alongX.k11[4 * n + i] - 50.5) < 1e-12);
  }
});

Deno.test("a version 1 request refuses the conservative form and the mixed term", async (t) => {
  for (
    const [id, words] of [["conservative-smooth", /no conservative form/], [
      "mixed-derivative",
      /no mixed term/,
    ]] as const
  ) {
    await t.step(id, async () => {
      const sent = sampleCase(await loadCase(id), 4, 4, "vertex");
      assert.throws(
        () => buildSolveRequest(sent, { ...details(id, "numbers"), protocol: PROTOCOL_VERSION }),
        (e: Error) =>
          e instanceof RangeError && words.test(e.message) && /version 2/.test(e.message),
      );
    });
  }
});

Deno.test("a grid that puts an interface between grid lines is refused before any request", async () => {
  const compiled = await loadCase("layered-jump-100");
  assert.throws(
    () => sampleCase(compiled, 7, 7, "cell"),
    (e: Error) => e instanceof RangeError && /7×7 grid does not suit/.test(e.message),
  );
});

Deno.test("a solver that speaks protocol 1 gets the new cases as not applicable and is never started", async (t) => {
  const dir = await Deno.makeTempDir();
  const marker = join(dir, "started");
  // the solver's program leaves a file when it runs: it must not run at all
  const solver = createExternalSolver({
    name: "v1-only",
    command: ["/bin/sh", "-c", `touch '${marker}'`],
    mode: "once",
    encoding: "numbers",
    layout: "vertex",
    scheme: "central",
    timeLimitSeconds: 10,
    skipCases: [],
    maxReplyMiB: 1,
  }, { solverFileDir: dir });
  for (
    const [id, words] of [
      ["conservative-smooth", "no conservative form"],
      ["rotated-anisotropy", "no conservative form"],
      ["layered-jump-100", "no conservative form"],
      ["layered-jump-10000", "no conservative form"],
      ["mixed-derivative", "no mixed term"],
    ] as const
  ) {
    await t.step(id, async () => {
      const outcome = await solver.solve({
        case: await loadCase(id),
        nx: 16,
        ny: 16,
        scheme: "central",
        tolerance: 1e-10,
      });
      assert.equal(outcome.status, "not-applicable");
      assert.match(outcome.reason ?? "", new RegExp(`speaks protocol 1, which has ${words}`));
      assert.match(outcome.reason ?? "", /Moving to version 2/);
    });
  }
  await solver.close();
  await assert.rejects(Deno.stat(marker), Deno.errors.NotFound);
  await Deno.remove(dir, { recursive: true });
});

Deno.test("probe sends a version 2 solver a conservative and a mixed-term request and checks the answers", async () => {
  // the reference solver's protocol program speaks version 2; the probe measures its answers
  // against the probe cases' manufactured solutions
  const spec = {
    name: "reference-v2",
    command: [
      Deno.execPath(),
      "run",
      "--no-lock",
      "--quiet",
      "reference-solver/protocol_main.ts",
    ],
    mode: "session" as const,
    encoding: "base64" as const,
    layout: "vertex" as const,
    scheme: "central" as const,
    timeLimitSeconds: 60,
    skipCases: [],
    maxReplyMiB: 16,
    protocol: 2 as const,
  };
  const report = await probeSolver(spec, { solverFileDir: "." });
  const forms = report.checks.filter((c) =>
    c.boundary === "conservative" || c.boundary === "mixed" || c.boundary === "robin-varying"
  );
  assert.equal(forms.length, 6, JSON.stringify(report.checks));
  for (const c of forms) {
    assert.equal(c.status, "pass", JSON.stringify(c));
    assert.ok(c.relativeError! < PROBE_ERROR_LIMIT);
  }
  assert.ok(report.passed);
  // the same program declared as version 1 is probed as before: no form checks
  const old = await probeSolver({ ...spec, protocol: undefined }, {
    solverFileDir: ".",
    modes: ["once"],
  });
  assert.deepEqual(old.checks.map((c) => c.boundary).sort(), [
    "dirichlet",
    "dirichlet",
    "neumann",
    "neumann",
    "robin",
    "robin",
  ]);
});
