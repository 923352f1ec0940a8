import assert from "node:assert/strict";
import { Ajv2020 } from "ajv/dist/2020";
import { buildCExample, findScipyPython } from "../testing/mod.ts";
import { loadSolverFile } from "../harness/solvers/mod.ts";
import {
  buildRequest,
  decodeValues,
  DOMAIN,
  exactValues,
  maxDifference,
  MIXES,
  QUADRATIC,
  runExample,
} from "./test_requests.ts";

const HERE = new URL(".", import.meta.url);
const FILE: { solvers: Entry[] } = JSON.parse(
  await Deno.readTextFile(new URL("solvers.json", HERE)),
);
const PYTHON = await findScipyPython();

interface Entry {
  name: string;
  command: string[];
  cwd?: string;
  env?: Record<string, string>;
  mode?: "once" | "session";
  encoding?: "numbers" | "base64";
  layout?: "vertex" | "cell" | "points";
}

/** Resolves a solver-file path the way docs/protocol.md says: relative to the file's folder. */
function resolvePath(path: string): string {
  return path.startsWith("/") ? path : new URL(path, HERE).pathname;
}

Deno.test("examples/solvers.json follows the solver-file schema", async () => {
  const schema = JSON.parse(
    await Deno.readTextFile(new URL("../harness/solvers/solvers.schema.json", HERE)),
  );
  const ajv = new Ajv2020({ allErrors: true, strict: false });
  const validate = ajv.compile(schema);
  assert.ok(validate(FILE), JSON.stringify(validate.errors, null, 2));
  const names = FILE.solvers.map((s) => s.name);
  assert.equal(new Set(names).size, names.length, `duplicate names in ${names}`);
  // and gridproof's own loader accepts it
  const specs = await loadSolverFile(new URL("solvers.json", HERE).pathname);
  assert.deepEqual(specs.map((s) => s.name), names);
});

const NOT_BUILT = await buildCExample();
for (const entry of FILE.solvers) {
  const needsScipy = entry.command[0].includes("python");
  const needsC = entry.command[0].includes("c-gauss-seidel");
  const why = needsScipy && PYTHON !== "/usr/bin/python3"
    ? "/usr/bin/python3 lacks NumPy/SciPy (install python3-scipy)"
    : needsC && NOT_BUILT
    ? NOT_BUILT
    : undefined;
  Deno.test({
    name:
      `solvers.json entry ${entry.name} starts as written and answers a quadratic case correctly` +
      (why ? ` — SKIPPED: ${why}` : ""),
    ignore: why !== undefined,
    fn: async () => {
      const program = entry.command[0].includes("/")
        ? resolvePath(entry.command[0])
        : entry.command[0];
      const cwd = resolvePath(entry.cwd ?? ".");
      const layout = entry.layout ?? "vertex";
      // a solver on its own points is sent the vertex layout (docs/protocol.md)
      const requestLayout = layout === "cell" ? "cell" : "vertex";
      // Only Dirichlet sides: the seeded defect of the defective entry stays dormant, and the
      // cell-centred scheme's ghost cells are exact only for linear data, so it gets a looser check.
      const req = buildRequest(QUADRATIC, MIXES["all dirichlet"], { nx: 6, ny: 5 }, {
        layout: requestLayout,
        encoding: entry.encoding ?? "numbers",
      });
      const hello = { protocol: "gridproof-protocol/1", type: "hello" };
      const goodbye = { protocol: "gridproof-protocol/1", type: "goodbye" };
      const input = entry.mode === "session"
        ? [hello, req, goodbye].map((m) => JSON.stringify(m)).join("\n") + "\n"
        : JSON.stringify(req);
      const envCommand = entry.env
        ? ["/usr/bin/env", ...Object.entries(entry.env).map(([k, v]) => `${k}=${v}`), program]
        : [program];
      const run = await runExample([...envCommand, ...entry.command.slice(1)], cwd, input);
      assert.equal(run.code, 0, run.stderr);
      const reply = run.replies[run.replies.length - 1];
      if (entry.mode === "session") assert.equal(run.replies[0].type, "ready");
      assert.equal(reply.type, "solution", JSON.stringify(reply).slice(0, 300));
      if (layout === "points") {
        // deno-sor --reply-points: cell centres valued by the four-node average of a solution
        // exact at the nodes, i.e. u(c) + (hx²·u_xx + hy²·u_yy)/8 (derived by Taylor expansion)
        const points = reply.points as Record<string, unknown>;
        const x = decodeValues(points.x), y = decodeValues(points.y);
        const hx = (DOMAIN.x1 - DOMAIN.x0) / 6, hy = (DOMAIN.y1 - DOMAIN.y0) / 5;
        const expected = x.map((xi, k) =>
          QUADRATIC.u(xi, y[k]) +
          (hx * hx * QUADRATIC.uxx(xi, y[k]) + hy * hy * QUADRATIC.uyy(xi, y[k])) / 8
        );
        assert.equal(x.length, 30);
        const err = maxDifference(decodeValues(reply.values), expected);
        assert.ok(err < 1e-9, `max error ${err}`);
        return;
      }
      const err = maxDifference(decodeValues(reply.values), exactValues(QUADRATIC, layout, 6, 5));
      // Source: derived — the vertex scheme is exact for quadratics; the cell-centred one has an
      // O(h²) error (about 1e-2 here), so only its size is checked.
      assert.ok(err < (layout === "cell" ? 0.05 : 1e-9), `max error ${err}`);
    },
  });
}
