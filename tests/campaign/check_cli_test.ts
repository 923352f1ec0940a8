/**
 * The `check` command end to end, as a release gate runs it: a plain `gridproof check` with the
 * reference solver passes every built-in case (each case declares the order theory predicts for
 * it — docs/check-values.md, "Exact facts of central differences"), writes result.json and the
 * requested reports, and refuses bad flags with exit code 2.
 */
import assert from "node:assert/strict";
import { runGridproof } from "../../testing/mod.ts";

const gridproof = (args: string[]) => runGridproof(args);

Deno.test("gridproof check passes every built-in case with the reference solver and writes its reports", async () => {
  const dir = await Deno.makeTempDir();
  const run = await gridproof(["check", "--out", dir, "--format", "md,junit,csv", "--no-progress"]);
  assert.equal(run.code, 0, run.stdout + run.stderr);
  assert.match(run.stdout, / 0 failed/);
  const result = JSON.parse(await Deno.readTextFile(`${dir}/result.json`));
  assert.equal(result.format, "gridproof-result");
  assert.ok(result.studies.length >= 14);
  for (const file of ["report.md", "report.xml", "report.csv", "journal.jsonl"]) {
    assert.ok((await Deno.stat(`${dir}/${file}`)).size > 0, file);
  }
  await Deno.remove(dir, { recursive: true });
});

Deno.test("gridproof check --upwind passes every built-in case at first order", async () => {
  // first-order upwinding of b·u_x and d·u_y: formal order 1 (common practice; derived from the
  // Taylor expansion of the one-sided difference); cases without convection keep order 2, since
  // their upwind and central stencils are identical (exact identity)
  const dir = await Deno.makeTempDir();
  const run = await gridproof(["check", "--upwind", "--out", dir, "--no-progress"]);
  assert.equal(run.code, 0, run.stdout + run.stderr);
  const result = JSON.parse(await Deno.readTextFile(`${dir}/result.json`));
  const expected = Object.fromEntries(
    result.studies.map((
      s: { caseId: string; expectedOrder: number },
    ) => [s.caseId, s.expectedOrder]),
  );
  assert.equal(expected["smooth-baseline"], 1);
  assert.equal(expected["quartic-poisson"], 2);
  await Deno.remove(dir, { recursive: true });
});

Deno.test("gridproof check refuses bad flags with exit code 2 and says what to fix", async (t) => {
  const cases: [string[], RegExp][] = [
    [["--cases", "no-such-case"], /unknown case "no-such-case": valid ids are/],
    [["--grids", "16,x"], /--grids: "x" is not a whole number/],
    [["--ratio", "1.05", "--levels", "3"], /below 1\.1/],
    [["--jobs", "0"], /--jobs: "0" is not a positive number/],
    [["--jobz", "2"], /unknown option '--jobz'[\s\S]*Did you mean --jobs\?[\s\S]*--jobs <n>/],
    [["--solver", "nobody"], /unknown solver "nobody": valid names are reference/],
    [
      ["--format", "docx", "--cases", "quadratic-exact", "--grids", "8,16"],
      /unknown report format "docx"/,
    ],
    // issue 12, item 12: before, these ran and exited 1 with FAIL verdicts
    [
      ["--cases", "quartic-poisson", "--grids", "8,16,1e9"],
      /--grids: grid 1000000000×1000000000 has more than 134217728 nodes/,
    ],
    [
      ["--cases", "quartic-poisson", "--tolerance", "2"],
      /--tolerance: 2 is not a relative residual reduction: give a number between 0 and 1/,
    ],
    [
      ["--cases", "quartic-poisson", "--residual-tolerance", "2"],
      /--residual-tolerance: 2 is not a relative residual reduction/,
    ],
    [
      ["--cases", "quartic-poisson", "--residual-tolerance", "1e-9", "--tolerance", "1e-9"],
      /both --residual-tolerance and its deprecated alias --tolerance are given; keep --residual-tolerance only/,
    ],
    [
      ["--cases", "quartic-poisson", "--isolation-seconds", "soon"],
      /--isolation-seconds: "soon" is not a positive number/,
    ],
    [["--cases", "quartic-poisson", "--refine-grids", "-1"], /--refine-grids: "-1" is not a whole/],
  ];
  for (const [args, message] of cases) {
    await t.step(args.join(" "), async () => {
      const dir = await Deno.makeTempDir();
      const run = await gridproof(["check", "--out", dir, "--no-progress", ...args]);
      assert.equal(run.code, 2, run.stdout + run.stderr);
      assert.match(run.stderr, message);
      assert.doesNotMatch(run.stderr, /\n\s+at /); // no stack trace
      await Deno.remove(dir, { recursive: true });
    });
  }
  // issue 12, item 10: before, an --out that names a file ended in "internal error" (exit 3)
  await t.step("--out naming a file", async () => {
    const file = await Deno.makeTempFile();
    const run = await gridproof(["check", "--out", file, "--cases", "quartic-poisson"]);
    assert.equal(run.code, 2, run.stdout + run.stderr);
    assert.match(run.stderr, /--out: .* exists and is not a folder: name a folder/);
    assert.doesNotMatch(run.stderr, /internal error/);
    await Deno.remove(file);
  });
});

Deno.test("gridproof check caps --jobs at four per core and says so (issue 12, item 9)", async () => {
  // before, --jobs 1000000 started a worker per job and grew past 3 GB
  const dir = await Deno.makeTempDir();
  const run = await gridproof([
    "check",
    "--jobs",
    "1000000",
    "--cases",
    "quartic-poisson",
    "--out",
    dir,
    "--no-progress",
  ]);
  assert.equal(run.code, 0, run.stdout + run.stderr);
  assert.match(run.stderr, /--jobs 1000000 capped at \d+ \(4 per core on \d+ cores\)/);
  await Deno.remove(dir, { recursive: true });
});

Deno.test("gridproof check that cannot write its result says so, keeps the journal and exits 2 (issue 12, item 3)", async () => {
  // a folder where result.json should go makes the write fail, as a full disk would; before, the
  // command ended in "internal error" with a stack trace
  const dir = await Deno.makeTempDir();
  await Deno.mkdir(`${dir}/result.json/blocker`, { recursive: true });
  const run = await gridproof([
    "check",
    "--cases",
    "quartic-poisson",
    "--out",
    dir,
    "--no-progress",
  ]);
  assert.equal(run.code, 2, run.stdout + run.stderr);
  assert.match(run.stderr, /result\.json: could not write the result: .*--resume/);
  assert.doesNotMatch(run.stderr, /internal error|\n\s+at /);
  const journal = (await Deno.readTextFile(`${dir}/journal.jsonl`)).trim().split("\n");
  assert.equal(journal.length, 1 + 4, "the header and the four solves of quartic-poisson");
  // nothing half-written is left beside it
  const left = [...Deno.readDirSync(dir)].map((e) => e.name).filter((n) => n.includes("partial"));
  assert.deepEqual(left, []);
  await Deno.remove(dir, { recursive: true });
});

Deno.test("gridproof check refuses an output folder another running campaign holds (issue 12, item 2)", async () => {
  // before, two campaigns in one folder interleaved their journals
  const dir = await Deno.makeTempDir();
  const other = new Deno.Command("sleep", { args: ["30"] }).spawn();
  try {
    await Deno.writeTextFile(`${dir}/.gridproof.lock`, `${other.pid}\n`);
    const run = await gridproof(["check", "--cases", "quartic-poisson", "--out", dir]);
    assert.equal(run.code, 2, run.stdout + run.stderr);
    assert.match(
      run.stderr,
      new RegExp(`in use by another gridproof campaign \\(process ${other.pid}\\)`),
    );
  } finally {
    other.kill();
    await other.status;
  }
  await Deno.remove(dir, { recursive: true });
});

Deno.test("gridproof check refuses a case named twice, too many levels and a solver that cannot start, before any solve (issue 12, item 15)", async (t) => {
  const dir = await Deno.makeTempDir();
  const out = `${dir}/out`;
  const refused = async (args: string[], pattern: RegExp) => {
    const run = await gridproof(["check", "--out", out, "--no-progress", ...args]);
    assert.equal(run.code, 2, run.stdout + run.stderr);
    assert.match(run.stderr, pattern);
    assert.doesNotMatch(run.stderr, /internal error|\n\s+at /);
    // nothing ran: no journal was started
    await assert.rejects(Deno.stat(`${out}/journal.jsonl`), Deno.errors.NotFound);
  };
  try {
    await t.step("--cases x,x", async () => {
      // before: 'case id "quartic-poisson" is used twice (library and library): give each case
      // its own id', after compiling the case twice
      await refused(
        ["--cases", "quartic-poisson,smooth-baseline,quartic-poisson"],
        /--cases: case quartic-poisson is named twice in --cases; name each case once/,
      );
    });
    await t.step("--levels 1000000", async () => {
      // before: 'ratio 2 from 16 rounds two grids to the same count Infinity'
      await refused(
        ["--cases", "quartic-poisson", "--levels", "1000000"],
        /--ratio\/--levels\/--coarsest: 1000000 levels with ratio 2 from 16: .*use at most 10 levels/,
      );
    });
    await t.step("a script whose #! line names a missing interpreter", async () => {
      // before, every solve failed on its own with a bare "No such file or directory"
      await Deno.writeTextFile(`${dir}/solver.sh`, "#!/no/such/interpreter\necho hi\n");
      await Deno.chmod(`${dir}/solver.sh`, 0o755);
      await Deno.writeTextFile(
        `${dir}/solvers.json`,
        JSON.stringify({ solvers: [{ name: "mine", command: ["./solver.sh"] }] }),
      );
      await refused(
        ["--cases", "quartic-poisson", "--solvers", `${dir}/solvers.json`],
        /solvers\.json: solvers\[0\] \("mine"\): command "\.\/solver\.sh" \(.*\) names the interpreter \/no\/such\/interpreter on its first line .*which does not exist; fix the script's first line/,
      );
    });
    await t.step("a solver named reference", async () => {
      await Deno.writeTextFile(
        `${dir}/solvers.json`,
        JSON.stringify({ solvers: [{ name: "reference", command: ["/bin/sh"] }] }),
      );
      await refused(
        ["--cases", "quartic-poisson", "--solvers", `${dir}/solvers.json`],
        /solvers\[0\]\.name: "reference" is reserved for gridproof's bundled reference solver/,
      );
    });
  } finally {
    await Deno.remove(dir, { recursive: true });
  }
});

Deno.test("gridproof check reads old names (case fields, --tolerance) with deprecation warnings", async () => {
  // docs/cases.md, "Renamed fields": the old-name fixture is compiled exactly like its new-name
  // twin (cases/old_names_test.ts); here the CLI shows the warnings and runs the case
  const dir = await Deno.makeTempDir();
  const run = await gridproof([
    "check",
    "--out",
    dir,
    "--no-progress",
    "--case-file",
    "testdata/cases/old-names.json",
    "--grids",
    "8,16,32",
    "--tolerance",
    "1e-11",
  ]);
  assert.equal(run.code, 0, run.stdout + run.stderr);
  assert.match(
    run.stderr,
    /gridproof: warning: --tolerance is deprecated: use --residual-tolerance/,
  );
  assert.match(
    run.stderr,
    /gridproof: warning: testdata\/cases\/old-names\.json:\d+:\d+: expected\.central\.exact: deprecated field name "exact": rename it to "exactToRoundOff"/,
  );
  const result = JSON.parse(await Deno.readTextFile(`${dir}/result.json`));
  // the old `tolerance` of expected.central (0.2, not the default 0.1) reached the study
  const study = result.studies.find((s: { caseId: string }) => s.caseId === "old-names");
  assert.equal(study.orderTolerance, 0.2);
  await Deno.remove(dir, { recursive: true });
});
