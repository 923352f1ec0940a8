/**
 * The batch backend against a real one-node Slurm cluster (`npm run slurm:start`): a study runs as
 * Slurm jobs and passes with the jobs' ids in the result; a campaign whose harness is killed while
 * its jobs run is completed by `--resume` from the same jobs, none submitted again; scheduler
 * outcomes (a solver's exit code, Slurm's time limit) become failed solves with Slurm's words. The
 * solver is the bundled reference solver as a protocol program, behind `sleep` so the jobs are
 * still running when the harness dies; the verdicts' outside reference is the case's exact
 * solution, as in every study.
 */
import assert from "node:assert/strict";
import { fileURLToPath } from "node:url";
import { CLI_PERMISSIONS, runGridproof } from "../../testing/cli.ts";
import { slurmMissing } from "../../testing/slurm.ts";

const MISSING = await slurmMissing();
const SKIP = MISSING ? ` (skipped: ${MISSING})` : "";
const ROOT = fileURLToPath(new URL("../../", import.meta.url));

/** A solver file in `dir` whose one batch solver runs `before` and then the reference solver. */
async function solverFile(dir: string, before: string, extra: Record<string, unknown> = {}) {
  const reference = `exec ${Deno.execPath()} run --no-lock --quiet --allow-read --allow-env ` +
    `${ROOT}reference-solver/protocol_main.ts`;
  await Deno.writeTextFile(
    `${dir}/solvers.json`,
    JSON.stringify({
      solvers: [{
        name: "slurm-reference",
        command: ["/bin/sh", "-c", `${before}; ${reference}`],
        encoding: "base64",
        iterationGrowth: 0,
        batch: { scheduler: "slurm", folder: "jobs", pollSeconds: 0.3, ...extra },
      }],
    }),
  );
  return `${dir}/solvers.json`;
}

function journalJobs(text: string): { key: string; job: { id: string; state: string } }[] {
  return text.split("\n").filter((l) => l.trim() !== "").map((l) => JSON.parse(l))
    .filter((e) => e.kind === "job");
}

Deno.test({
  name: `a batch study killed while its Slurm jobs run is completed by --resume from the same ` +
    `jobs, none submitted again${SKIP}`,
  ignore: MISSING !== undefined,
  fn: async () => {
    const dir = await Deno.makeTempDir();
    try {
      const solvers = await solverFile(dir, "sleep 4");
      const args = [
        "check",
        "--solvers",
        solvers,
        "--solver",
        "slurm-reference",
        "--cases",
        "smooth-baseline",
        "--grids",
        "16,32,64",
        "--out",
        `${dir}/out`,
        "--no-isolation",
        "--no-refine",
        "--no-progress",
        "--jobs",
        "3",
      ];
      const child = new Deno.Command(Deno.execPath(), {
        args: ["run", "--quiet", ...CLI_PERMISSIONS, "cli.ts", ...args],
        cwd: ROOT,
        env: { NO_COLOR: "1" },
        stdout: "null",
        stderr: "null",
      }).spawn();
      // wait until every solve's job is submitted, then kill the harness outright
      let before: ReturnType<typeof journalJobs> = [];
      for (let k = 0; k < 200 && before.length < 3; k++) {
        await new Promise((r) => setTimeout(r, 100));
        const text = await Deno.readTextFile(`${dir}/out/journal.jsonl`).catch(() => "");
        before = journalJobs(text).filter((e) => e.job.state === "SUBMITTED");
      }
      assert.equal(before.length, 3, "three jobs submitted before the kill");
      child.kill("SIGKILL");
      await child.status;
      const journal = await Deno.readTextFile(`${dir}/out/journal.jsonl`);
      assert.ok(!journal.includes('"kind":"solve"'), "no solve finished before the kill");

      const run = await runGridproof([...args, "--resume"]);
      assert.equal(run.code, 0, run.stdout + run.stderr);
      const after = journalJobs(await Deno.readTextFile(`${dir}/out/journal.jsonl`));
      const submitted = after.filter((e) => e.job.state === "SUBMITTED").map((e) => e.job.id);
      assert.deepEqual(submitted.sort(), before.map((e) => e.job.id).sort());
      assert.ok(after.some((e) => e.job.state === "COMPLETED"));
      const result = JSON.parse(await Deno.readTextFile(`${dir}/out/result.json`));
      for (const solve of result.solves) {
        const job = solve.description.job;
        assert.ok(
          before.some((e) => e.job.id === job.id),
          `job ${job.id} is one of the first run's`,
        );
        assert.equal(job.state, "COMPLETED");
        assert.equal(job.collectedAfterResume, true);
      }
    } finally {
      await Deno.remove(dir, { recursive: true });
    }
  },
});

Deno.test({
  name: `Slurm's outcomes become failed solves in Slurm's words: a solver's exit code, a job ` +
    `that cannot leave the queue${SKIP}`,
  ignore: MISSING !== undefined,
  fn: async (t) => {
    const dir = await Deno.makeTempDir();
    const check = async (before: string, extra: Record<string, unknown>) => {
      const solvers = await solverFile(dir, before, extra);
      await runGridproof([
        "check",
        "--solvers",
        solvers,
        "--solver",
        "slurm-reference",
        "--cases",
        "smooth-baseline",
        "--grids",
        "8,16",
        "--out",
        `${dir}/out`,
        "--no-isolation",
        "--no-refine",
        "--no-progress",
        "--jobs",
        "2",
      ]);
      return JSON.parse(await Deno.readTextFile(`${dir}/out/result.json`)).solves;
    };
    try {
      await t.step("exit 3 before the solver runs", async () => {
        const solves = await check("echo broken >&2; exit 3", {});
        for (const s of solves) {
          assert.equal(s.status, "failed");
          assert.match(s.reason, /exited with code 3 \(Slurm job \d+(_\d+)? FAILED\).*broken/);
        }
      });
      await t.step("a queue limit cancels a job that cannot start", async () => {
        // more CPUs than the node has: Slurm keeps it pending (or refuses it)
        const solves = await check("true", {
          submitArguments: ["--cpus-per-task=512", "--immediate=0"],
          queueLimitSeconds: 1,
        });
        for (const s of solves) {
          assert.equal(s.status, "failed");
          assert.match(s.reason, /Slurm refused the job|queueLimitSeconds/);
        }
      });
    } finally {
      await Deno.remove(dir, { recursive: true });
    }
  },
});
