/**
 * Ctrl-C in the middle of `gridproof check`: every finished solve stays in the journal, the
 * command says how to continue, and `--resume` runs only what is missing.
 */
import assert from "node:assert/strict";
import { CLI_PERMISSIONS } from "../../testing/mod.ts";

const DENO = Deno.execPath();

/** `deno run … cli.ts check` with the slow SOR example on smooth-baseline, one job at a time. */
function sorCheck(dir: string, grids: string): string[] {
  return [
    "run",
    "--quiet",
    ...CLI_PERMISSIONS,
    "cli.ts",
    "check",
    "--solvers",
    "examples/solvers.json",
    "--solver",
    "deno-sor",
    "--cases",
    "smooth-baseline",
    "--grids",
    grids,
    "--jobs",
    "1",
    "--out",
    dir,
    "--no-progress",
  ];
}

function journalSolves(path: string): number {
  try {
    return Deno.readTextFileSync(path).split("\n").filter((l) => l.includes('"kind":"solve"'))
      .length;
  } catch {
    return 0;
  }
}

Deno.test("an interrupted check keeps its finished solves and --resume completes the rest", async () => {
  const dir = await Deno.makeTempDir();
  // the SOR example is slow on purpose (work ~ N^1.5): the 256 and 384 grids take seconds, so
  // the interrupt lands while one of them runs
  const args = sorCheck(dir, "16,32,256,384");
  const child = new Deno.Command(DENO, { args, stdout: "piped", stderr: "piped" }).spawn();
  const journal = `${dir}/journal.jsonl`;
  while (journalSolves(journal) < 2) await new Promise((r) => setTimeout(r, 50));
  child.kill("SIGINT");
  const first = await child.output();
  const stderr = new TextDecoder().decode(first.stderr);
  assert.equal(first.code, 130, stderr);
  assert.match(stderr, /interrupted; every finished solve is in .*journal\.jsonl.*--resume/);
  const kept = journalSolves(journal);
  assert.ok(kept >= 2 && kept < 4, `journal holds ${kept} solves`);

  const second = await new Deno.Command(DENO, {
    args: [...args.filter((a) => a !== "--no-progress"), "--resume"],
    stdout: "piped",
    stderr: "piped",
  }).output();
  const progress = new TextDecoder().decode(second.stderr);
  assert.equal(second.code, 0, progress + new TextDecoder().decode(second.stdout));
  assert.equal((progress.match(/from the journal/g) ?? []).length, kept);
  assert.equal(journalSolves(journal), 4);
  await Deno.remove(dir, { recursive: true });
});

/** Processes running the SOR example's session (its command line ends in "main.ts"). */
async function sorProcesses(): Promise<number> {
  const out = await new Deno.Command("ps", { args: ["-eo", "args"], stdout: "piped" }).output();
  return new TextDecoder().decode(out.stdout).split("\n")
    .filter((l) => /--no-lock --quiet main\.ts$/.test(l.trim())).length;
}

Deno.test("SIGTERM ends check at once with 143, ends the solver processes and keeps the journal (issue 12, item 5)", async () => {
  // before, SIGTERM killed the harness at once and left the solver processes running
  const dir = await Deno.makeTempDir();
  const args = sorCheck(dir, "16,32,384,512");
  const before = await sorProcesses();
  const child = new Deno.Command(DENO, { args, stdout: "piped", stderr: "piped" }).spawn();
  const journal = `${dir}/journal.jsonl`;
  while (journalSolves(journal) < 2) await new Promise((r) => setTimeout(r, 50));
  await new Promise((r) => setTimeout(r, 300)); // the 384 × 384 solve is under way
  assert.ok((await sorProcesses()) > before, "the SOR session runs");
  child.kill("SIGTERM");
  const out = await child.output();
  const stderr = new TextDecoder().decode(out.stderr);
  assert.equal(out.code, 143, stderr);
  assert.match(stderr, /interrupted; every finished solve is in/);
  assert.equal(journalSolves(journal), 2);
  assert.equal(await sorProcesses(), before, "no solver process is left running");
  await Deno.remove(dir, { recursive: true });
});
