import assert from "node:assert/strict";
import { loadCase } from "../../cases/mod.ts";
import type { StudyRecord, VerdictStatus } from "../result/mod.ts";
import { diagnoseAcrossCases, ingredients } from "./diagnosis.ts";

/** A study whose only verdict is an order verdict with the given status. */
function study(caseId: string, status: VerdictStatus): StudyRecord {
  return {
    caseId,
    solver: "s",
    grids: [],
    h: [],
    expectedOrder: 2,
    orderTolerance: 0.1,
    orders: [],
    quantities: [],
    coverage: null,
    scaling: {
      iterationsExponent: null,
      factorExponent: null,
      timeExponent: null,
      gridIndependent: null,
      problems: [],
    },
    verdicts: [{ caseId, solver: "s", criterion: "order", status, reason: "r" }],
  };
}

// The ingredients are read from the library case files themselves (their boundary kinds and
// coefficient expressions): robin-all has Robin on every side, mixed-boundaries Robin on east and
// north, quartic-poisson is a Dirichlet Poisson problem, rectangle-2x1 has non-square cells.
Deno.test("ingredients() names boundary kinds, operator terms and cell shapes of a case", async () => {
  const keys =
    (await Promise.all(["robin-all", "quartic-poisson", "rectangle-2x1"].map((id) => loadCase(id))))
      .map((c) => ingredients(c).map((i) => i.key));
  assert.ok(keys[0].includes("robin:north") && keys[0].includes("derivative"));
  assert.ok(!keys[1].includes("b") && !keys[1].includes("derivative"));
  assert.ok(keys[2].includes("cells"));
});

// From the case files: rotated-anisotropy has a constant k12 ≠ 0 (conservative form),
// mixed-derivative an m = 0.8·cos(πxy) (non-conservative form), layered-jump-100 an interface at
// y = 0.5, conservative-smooth a scalar K and no interface.
Deno.test("ingredients() tells a full tensor, a mixed term and material interfaces apart", async () => {
  const ids = ["rotated-anisotropy", "mixed-derivative", "layered-jump-100", "conservative-smooth"];
  const [tensor, mixed, layered, smooth] = (await Promise.all(ids.map((id) => loadCase(id)))).map((
    c,
  ) => ingredients(c).map((i) => i.key));
  assert.ok(tensor.includes("k12") && !tensor.includes("m"));
  assert.ok(mixed.includes("m") && !mixed.includes("k12"));
  assert.ok(layered.includes("interfaces") && !layered.includes("k12"));
  assert.ok(!smooth.includes("k12") && !smooth.includes("interfaces") && !smooth.includes("m"));
});

Deno.test("diagnoseAcrossCases() names what every failing case has and every passing one lacks", async () => {
  const ids = ["robin-all", "mixed-boundaries", "quartic-poisson", "smooth-baseline"];
  const cases = await Promise.all(ids.map((id) => loadCase(id)));
  const studies = [
    study("robin-all", "fail"),
    study("mixed-boundaries", "fail"),
    study("quartic-poisson", "pass"),
    study("smooth-baseline", "pass"),
  ];
  diagnoseAcrossCases(studies, cases);
  assert.match(studies[0].diagnosis!, /most likely lies with a Robin side/);
  assert.match(studies[0].verdicts[0].reason, /Across the campaign/);
  assert.equal(studies[2].diagnosis, undefined);
  assert.equal(studies[0].verdicts[0].status, "fail"); // a diagnosis never changes a verdict
});

Deno.test("diagnoseAcrossCases() names the few passing cases that share the ingredient", async () => {
  const ids = [
    "robin-all",
    "mixed-boundaries",
    "neumann-all",
    "weak-singularity",
    "quartic-poisson",
    "smooth-baseline",
    "strong-reaction",
    "high-frequency",
  ];
  const cases = await Promise.all(ids.map((id) => loadCase(id)));
  const studies = [
    study("robin-all", "fail"),
    study("mixed-boundaries", "fail"),
    study("neumann-all", "fail"),
    study("weak-singularity", "pass"), // has a Neumann side where the defect does not act
    study("quartic-poisson", "pass"),
    study("smooth-baseline", "pass"),
    study("strong-reaction", "pass"),
    study("high-frequency", "pass"),
  ];
  diagnoseAcrossCases(studies, cases);
  assert.match(
    studies[0].diagnosis!,
    /a Neumann or Robin side; of the 5 cases where it passes only weak-singularity has it too/,
  );
});
