/**
 * Slurm batch backend: submit-to-result latency of one job, and the throughput of the same solves
 * as one job array against one job at a time, measured side by side in one run on the running
 * cluster (`npm run slurm:start`). The solver is the bundled reference solver as a protocol
 * program on a 16×16 grid, so the job's own work is small. Prints one table; no assertions.
 *
 * Run: `npm run bench:batch [-- --solves 12]`
 */
import { loadCase } from "../cases/mod.ts";
import { createBatchSolver } from "../harness/solvers/mod.ts";
import type { ExternalSolverSpec } from "../harness/solvers/mod.ts";

const count = Number(Deno.args[Deno.args.indexOf("--solves") + 1] || 12);
const root = new URL("../", import.meta.url).pathname;
const folder = await Deno.makeTempDir();
const spec = (gatherSeconds: number): ExternalSolverSpec => ({
  name: "bench",
  command: [
    Deno.execPath(),
    "run",
    "--no-lock",
    "--quiet",
    "--allow-read",
    "--allow-env",
    `${root}reference-solver/protocol_main.ts`,
  ],
  mode: "once",
  encoding: "base64",
  layout: "vertex",
  scheme: "central",
  timeLimitSeconds: 120,
  skipCases: [],
  maxReplyMiB: 64,
  batch: { scheduler: "slurm", folder, submitArguments: [], pollSeconds: 0.1, gatherSeconds },
});
const kase = await loadCase("smooth-baseline");
const task = { case: kase, nx: 16, ny: 16, scheme: "central" as const, tolerance: 1e-10 };

async function timed(gather: number, parallel: boolean): Promise<{ seconds: number; run: number }> {
  const solver = createBatchSolver(spec(gather), { solverFileDir: folder });
  const start = performance.now();
  const outcomes = [];
  if (parallel) {
    outcomes.push(...await Promise.all(Array.from({ length: count }, () => solver.solve(task))));
  } else for (let k = 0; k < count; k++) outcomes.push(await solver.solve(task));
  const seconds = (performance.now() - start) / 1000;
  await solver.close();
  const bad = outcomes.find((o) => o.status !== "ok");
  if (bad) throw new Error(`a solve failed: ${bad.reason}`);
  const run = outcomes.reduce(
    (s, o) => s + ((o.description?.job as { runSeconds: number }).runSeconds ?? 0),
    0,
  );
  return { seconds, run: run / count };
}

const one = await timed(0, false);
const array = await timed(0.2, true);
const jobs = await timed(0, true);
await Deno.remove(folder, { recursive: true });
const rows = [
  ["one job at a time", one],
  [`one job array of ${count}`, array],
  [`${count} separate jobs at once`, jobs],
] as const;
console.log(
  `${count} solves of smooth-baseline 16×16 (reference solver as a program), ${navigator.hardwareConcurrency} CPUs`,
);
console.log("way                          total s  solves/s  per solve s  solver run s  vs array");
for (const [name, r] of rows) {
  console.log(
    `${name.padEnd(28)} ${r.seconds.toFixed(2).padStart(7)}  ${
      (count / r.seconds).toFixed(2).padStart(8)
    }  ` +
      `${(r.seconds / count).toFixed(2).padStart(11)}  ${r.run.toFixed(2).padStart(12)}  ` +
      `${(r.seconds / array.seconds).toFixed(2).padStart(8)}`,
  );
}
