import { createExternalSolver, createReferenceSolver } from "./harness/solvers/mod.ts";
import { testCase } from "./tests/protocol/_case.ts";
const c = testCase();
const mk = (mode: string, extra: Partial<any> = {}) => createExternalSolver({
  name: mode, command: ["/usr/bin/python3", "solvers/misbehave.py", ...mode.split(" ")], mode: "once", encoding: "base64",
  layout: "vertex", scheme: "central", timeLimitSeconds: 2, skipCases: [], maxReplyMiB: 1, ...extra,
}, { solverFileDir: "testdata/protocol" });
for (const mode of ["echo base64", "echo", "points", "hang", "exit3", "signal", "badjson", "wrongshape", "wrongcount", "nan", "inf-base64", "logs", "huge", "closestdin", "version", "wrongid", "na", "error"]) {
  const t = performance.now();
  const s = mk(mode, mode === "closestdin" ? { encoding: "numbers" } : {});
  const o = await s.solve({ case: c, nx: mode === "closestdin" ? 64 : 4, ny: mode === "closestdin" ? 128 : 8, scheme: "central", tolerance: 1e-10 });
  console.log(mode, ((performance.now() - t) / 1000).toFixed(2), o.status, o.layout, o.values.length, o.reason, JSON.stringify(o.stderrTail?.slice(0, 80)));
}
const r = createReferenceSolver();
const o = await r.solve({ case: c, nx: 16, ny: 32, scheme: "central", tolerance: 1e-10 });
console.log(o.status, o.iterations, o.converged, o.reason);
