import assert from "node:assert/strict";
import { findScipyPython } from "../../testing/mod.ts";
import { solve } from "../../reference-solver/mod.ts";
import { readSolveRequest } from "../../harness/protocol/mod.ts";
import {
  buildRequest,
  decodeValues,
  maxRelativeDifference,
  MIXES,
  runExample,
  SMOOTH,
} from "../test_requests.ts";

const HERE = new URL(".", import.meta.url);
const PYTHON = await findScipyPython();
const SKIP = PYTHON === undefined
  ? " — SKIPPED: no python3 with NumPy and SciPy (install python3-scipy)"
  : "";

Deno.test({
  name: `python-scipy (vertex) equals the reference multigrid solution to 1e-9 relative${SKIP}`,
  ignore: PYTHON === undefined,
  fn: async (t) => {
    // Source: issue 5 requirement; the SciPy side is an independent library (SuperLU) on an
    // independent assembly (NumPy), the reference side is the bundled multigrid in process.
    for (const scheme of ["central", "upwind"] as const) {
      for (const [mix, sides] of Object.entries(MIXES)) {
        await t.step(`${scheme}, ${mix}, 32×24`, async () => {
          const req = buildRequest(SMOOTH, sides, { nx: 32, ny: 24 }, { scheme });
          // the request as the protocol reader reads it is the reference solver's problem
          const ref = solve(readSolveRequest(JSON.stringify(req)).problem, {
            scheme: { upwind: scheme === "upwind" },
            stop: { tolerance: 1e-13, maxCycles: 200 },
          });
          const py = await runExample([PYTHON!, "-B", "solver.py"], HERE, JSON.stringify(req));
          assert.equal(py.code, 0, py.stderr);
          const rel = maxRelativeDifference(
            decodeValues(py.replies[0].values),
            Array.from(ref.solution),
          );
          assert.ok(rel < 1e-9, `max relative difference ${rel} (reference ${ref.reason})`);
        });
      }
    }
  },
});
