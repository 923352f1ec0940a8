/**
 * End-to-end tests of the campaign: the reference solver passes the built-in cases, a defective
 * solver variant fails with a reason naming its side, results do not depend on the job
 * count, and an interrupted campaign resumes from its journal.
 */
import assert from "node:assert/strict";
import { loadCase } from "../../cases/mod.ts";
import type { CompiledCase } from "../../cases/types.ts";
import { createPooledReferenceSolver, runCampaign } from "../../harness/campaign/mod.ts";
import { createReferenceSolver, emptyOutcome, type Solver } from "../../harness/solvers/mod.ts";

/**
 * A defective variant of the reference solver: the east side's Dirichlet data are taken half a
 * cell inside the domain, g(x1 − h/2, y) instead of g(x1, y) — a first-order error in the
 * boundary treatment (Taylor: g(x1 − h/2) = g(x1) − (h/2)·u_x + O(h²)), the kind of slip a
 * cell-/vertex-centred mix-up makes. Truncation-error analysis (derived) predicts order 1 in the
 * boundary band, polluting the interior.
 */
function defectiveSolver(): Solver {
  const inner = createReferenceSolver({ name: "defective" });
  return {
    info: { ...inner.info, kind: "external", name: "defective" },
    solve(task) {
      const kase = task.case;
      const shifted: CompiledCase = {
        ...kase,
        sample(nx, ny) {
          const p = kase.sample(nx, ny);
          const hx = (p.domain.x1 - p.domain.x0) / nx;
          const hy = (p.domain.y1 - p.domain.y0) / ny;
          const east = p.boundary.east as { values: Float64Array };
          for (let j = 0; j <= ny; j++) {
            east.values[j] = kase.exact(p.domain.x1 - hx / 2, p.domain.y0 + j * hy);
          }
          return p;
        },
      };
      return inner.solve({ ...task, case: shifted });
    },
    close: () => inner.close(),
  };
}

Deno.test("check: the reference passes and a solver with shifted east data fails naming the Dirichlet side east", async () => {
  const kase = await loadCase("smooth-baseline");
  assert.equal(kase.boundary.east.kind, "dirichlet");
  const solvers = [createReferenceSolver(), defectiveSolver()];
  const result = await runCampaign([kase], solvers, { grids: [16, 32, 64, 128] });
  const reference = result.studies.find((s) => s.solver === "reference")!;
  const defective = result.studies.find((s) => s.solver === "defective")!;
  // Reference: order 2 within ±0.1 (formal order of the 5-point central scheme, derived)
  assert.ok(
    reference.verdicts.every((v) => v.status !== "fail"),
    JSON.stringify(reference.verdicts.filter((v) => v.status === "fail")),
  );
  // Any vertex scheme returns its Dirichlet data at the side's nodes (exact identity): the
  // shifted data do not come back on the east side, and no reordering of the field explains it
  const failed = defective.verdicts.filter((v) => v.status === "fail");
  const imposed = failed.find((v) => v.criterion === "imposed-data");
  assert.ok(imposed, JSON.stringify(defective.verdicts));
  assert.match(imposed.reason, /the Dirichlet side east/);
  assert.match(imposed.reason, /no simple reordering/);
  assert.doesNotMatch(imposed.reason, /west|south|north/);
  // the order is not blamed on the discretization while the imposed data are wrong
  const order = defective.verdicts.filter((v) => v.criterion === "order");
  assert.ok(order.every((v) => v.status !== "fail"), JSON.stringify(order));
  // where the error sits: maps are kept for the failing study's finest grid only, and the map of
  // the difference from the reference puts its largest block on the east side (the shifted data)
  const kept = result.solves.filter((r) => r.errorMap);
  assert.deepEqual(kept.map((r) => [r.solver, r.nx]), [["defective", 128]]);
  const d = kept[0].differenceMap!;
  const top = d.values.indexOf(Math.max(...d.values));
  assert.equal(top % d.columns, d.columns - 1, "largest difference in the east column of blocks");
  const max = defective.orders.find((o) => o.region === "boundary" && o.norm === "max")!;
  const last = max.pairwise[max.pairwise.length - 1]!;
  assert.ok(Math.abs(last - 1) < 0.2, `boundary-band order ${last} should be about 1`);
  assert.equal(result.summary.exitCode, 1);
});

Deno.test("check: results do not depend on the number of parallel jobs", async () => {
  const cases = [await loadCase("variable-all"), await loadCase("robin-all")];
  const grids = [8, 16, 32];
  const serial = await runCampaign(cases, [createReferenceSolver()], { grids, jobs: 1 });
  const pooled = createPooledReferenceSolver({ workers: 2, inProcessBelow: 0 });
  const parallel = await runCampaign(cases, [pooled], { grids, jobs: 2 });
  await pooled.close();
  // identical arithmetic in every worker: bit-for-bit equal errors (exact identity)
  const key = (r: { caseId: string; nx: number }) => `${r.caseId}/${r.nx}`;
  const a = new Map(serial.solves.map((r) => [key(r), r.errors]));
  for (const r of parallel.solves) assert.deepEqual(r.errors, a.get(key(r)));
  assert.deepEqual(
    parallel.studies.map((s) => s.verdicts.map((v) => [v.criterion, v.status])),
    serial.studies.map((s) => s.verdicts.map((v) => [v.criterion, v.status])),
  );
});

Deno.test("check: an interrupted campaign keeps its finished solves and resumes from the journal", async () => {
  const out = await Deno.makeTempDir();
  const kase = await loadCase("smooth-baseline");
  const grids = [8, 16, 32, 64];
  const controller = new AbortController();
  let seen = 0;
  const first = await runCampaign([kase], [createReferenceSolver()], {
    grids,
    outDir: out,
    signal: controller.signal,
    onProgress: () => {
      if (++seen === 2) controller.abort();
    },
  });
  assert.equal(first.solves.length, 2);
  const journal = await Deno.readTextFile(`${out}/journal.jsonl`);
  assert.equal(journal.trim().split("\n").length, 3); // header + 2 solves
  const resumed: boolean[] = [];
  const second = await runCampaign([kase], [createReferenceSolver()], {
    grids,
    outDir: out,
    resume: true,
    onProgress: (e) => resumed.push(e.resumed),
  });
  assert.deepEqual(resumed, [true, true, false, false]);
  assert.deepEqual(second.solves.map((r) => r.nx), grids);
  assert.deepEqual(second.solves[0].errors, first.solves[0].errors);
  // a different configuration is refused rather than mixed in
  await assert.rejects(
    () =>
      runCampaign([kase], [createReferenceSolver()], { grids: [8, 16], outDir: out, resume: true }),
    /another --out folder|same options/,
  );
  await Deno.remove(out, { recursive: true });
});

Deno.test("check: a resume refuses a journaled solve computed from an edited case file", async () => {
  // The header's fingerprint names cases by id and origin; only the per-solve input digest sees
  // that the file's exact solution changed, so without it the stale solves were reused as if
  // they answered the new case.
  const out = await Deno.makeTempDir();
  const file = `${out}/mine.json`;
  const text = await Deno.readTextFile(
    new URL("../../cases/library/smooth-baseline.json", import.meta.url),
  );
  const json = JSON.parse(text);
  delete json.$schema;
  json.id = "mine";
  await Deno.writeTextFile(file, JSON.stringify(json));
  const grids = [8, 16, 32];
  const controller = new AbortController();
  let seen = 0;
  await runCampaign([await loadCase(file)], [createReferenceSolver()], {
    grids,
    outDir: out,
    signal: controller.signal,
    onProgress: () => {
      if (++seen === 2) controller.abort();
    },
  });
  json.exact = "sin(pi*x)*cos(pi*y/2) + exp(x + y)";
  await Deno.writeTextFile(file, JSON.stringify(json));
  await assert.rejects(
    async () =>
      runCampaign([await loadCase(file)], [createReferenceSolver()], {
        grids,
        outDir: out,
        resume: true,
      }),
    /journal\.jsonl: line 2 \(case mine, solver reference, 8×8\) was computed from other inputs/,
  );
  // the unedited file resumes as before
  json.exact = "sin(pi*x)*cos(pi*y/2) + exp(x - y)";
  await Deno.writeTextFile(file, JSON.stringify(json));
  const resumed: boolean[] = [];
  await runCampaign([await loadCase(file)], [createReferenceSolver()], {
    grids,
    outDir: out,
    resume: true,
    onProgress: (e) => resumed.push(e.resumed),
  });
  assert.deepEqual(resumed, [true, true, false]);
  await Deno.remove(out, { recursive: true });
});

Deno.test("check: a case's own order tolerance takes precedence over the campaign's", async () => {
  const kase = await loadCase("smooth-baseline");
  // the same first-order defect as above (order ≈ 1 against 2): it fails at the campaign's
  // default 0.1 and passes the order verdicts when the case itself allows ±1.1
  kase.expected.central = { ...kase.expected.central, orderTolerance: 1.1 };
  const result = await runCampaign([kase], [defectiveSolver()], { grids: [16, 32, 64, 128] });
  const study = result.studies[0];
  assert.equal(study.orderTolerance, 1.1);
  const order = study.verdicts.filter((v) => v.criterion === "order");
  assert.equal(order.length, 3);
  assert.ok(order.every((v) => v.status === "pass"), JSON.stringify(order));
});

Deno.test("check: grids a solver declines leave the sequence, and the study says so", async () => {
  const kase = await loadCase("smooth-baseline");
  const inner = createReferenceSolver({ name: "small-only" });
  // a solver whose largest grid is 64 (as an external solver declares in its hello)
  const smallOnly: Solver = {
    info: { ...inner.info, kind: "external", name: "small-only" },
    solve: (task) =>
      task.nx > 64
        ? Promise.resolve(
          emptyOutcome("not-applicable", "largest grid 64×64", {
            layout: "vertex",
            nx: task.nx,
            ny: task.ny,
          }),
        )
        : inner.solve(task),
    close: () => inner.close(),
  };
  const result = await runCampaign([kase], [smallOnly], { grids: [16, 32, 64, 128] });
  const study = result.studies[0];
  assert.deepEqual(study.grids, [16, 32, 64]);
  // order 2 of the central scheme (derived) on the grids it solved
  assert.ok(
    study.verdicts.filter((v) => v.criterion === "order").every((v) => v.status === "pass"),
  );
  const applicability = study.verdicts.find((v) => v.criterion === "applicability");
  assert.equal(applicability?.status, "warn");
  assert.match(
    applicability!.reason,
    /declined 128×128 \(largest grid 64×64\); judged on the 3 grids/,
  );
  assert.equal(result.summary.exitCode, 0);
});

Deno.test("check: a resume refuses a journal written before the solver file was edited, naming the solver", async () => {
  // The CLI puts the SHA-256 of the solver file on the solver (info.build); an edited file (other
  // arguments, environment, build) must not reuse the solves of the old one.
  const out = await Deno.makeTempDir();
  const kase = await loadCase("smooth-baseline");
  const withFile = (sha256: string): Solver => {
    const solver = createReferenceSolver({ name: "mine" });
    solver.info.build = { files: [], solverFile: { path: "solvers.json", sha256, bytes: 10 } };
    return solver;
  };
  const before = "a".repeat(64), after = "b".repeat(64);
  const controller = new AbortController();
  await runCampaign([kase], [withFile(before)], {
    grids: [8, 16, 32],
    outDir: out,
    signal: controller.signal,
    onProgress: () => controller.abort(),
  });
  await assert.rejects(
    () => runCampaign([kase], [withFile(after)], { grids: [8, 16, 32], outDir: out, resume: true }),
    (error: Error) => {
      assert.match(
        error.message,
        /cannot resume: solver mine: its solver file solvers\.json changed/,
      );
      assert.match(error.message, /aaaaaaaaaaaa… then, bbbbbbbbbbbb… now/);
      assert.match(error.message, /restore the solver file to resume, or run the campaign afresh/);
      return true;
    },
  );
  // the unedited file resumes
  const resumed: boolean[] = [];
  await runCampaign([kase], [withFile(before)], {
    grids: [8, 16, 32],
    outDir: out,
    resume: true,
    onProgress: (e) => resumed.push(e.resumed),
  });
  assert.deepEqual(resumed, [true, false, false]);
  await Deno.remove(out, { recursive: true });
});
