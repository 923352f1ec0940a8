/**
 * The defect zoo on the new operator forms (issue 13): seeded bugs that real finite-volume codes
 * have — arithmetic face averaging across a conductivity jump, a cross-diffusion term with the
 * wrong sign, Neumann data read as ∂u/∂n instead of the conormal flux, a halved mixed term — in the
 * zoo's own finite-volume and nine-point schemes (testing/zoo, independent of the reference
 * solver). Each defect must FAIL where it acts, with the failing criterion and its place, and pass
 * where it cannot act; the correct scheme (every defect's twin) must pass every new case on both
 * layouts. The comparison is always the case's manufactured exact solution.
 */
import assert from "node:assert/strict";
import { loadCase } from "../../cases/mod.ts";
import { runCampaign } from "../../harness/campaign/mod.ts";
import type { CampaignResult, Verdict } from "../../harness/result/mod.ts";
import { createZooSolver, type DefectName } from "../../testing/zoo/mod.ts";

/** One row: a defect, a layout, the case it must fail and the cases it must pass. */
interface Row {
  defect: DefectName;
  layout: "vertex" | "cell";
  /** The case that must fail, the criterion that fails and what its reason must say. */
  fails: { caseId: string; criterion: string; says: RegExp };
  /** Cases where the defect cannot act (its data vanish): every verdict passes. */
  passes: string[];
  /** What isolation finds on the failing case. */
  isolates: RegExp;
}

const NEW_CASES = [
  "conservative-smooth",
  "rotated-anisotropy",
  "mixed-derivative",
  "layered-jump-100",
  "layered-jump-10000",
  "variable-robin-edge",
];

// Passing cases are chosen so that the cross-case diagnosis can single out the ingredient: for the
// jump rows, mixed-derivative shares the west Neumann side of the layered cases but has no jump.
const ROWS: Row[] = [
  {
    defect: "face-arithmetic-mean",
    layout: "vertex",
    fails: { caseId: "layered-jump-10000", criterion: "order", says: /material interfaces/ },
    passes: ["conservative-smooth", "mixed-derivative"],
    // the variant without jumps (every region takes the first one's K and u) restores the order
    isolates: /the jumps are removed/,
  },
  {
    defect: "face-arithmetic-mean",
    layout: "cell",
    fails: { caseId: "layered-jump-100", criterion: "order", says: /material interfaces/ },
    passes: ["conservative-smooth", "mixed-derivative"],
    isolates: /the jumps are removed/,
  },
  {
    defect: "cross-diffusion-sign",
    layout: "vertex",
    fails: { caseId: "rotated-anisotropy", criterion: "order", says: /cross-diffusion/ },
    passes: ["conservative-smooth", "mixed-derivative"],
    isolates: /off-diagonal conductivity is switched off \(k12 = 0\)/,
  },
  {
    defect: "cross-diffusion-sign",
    layout: "cell",
    fails: { caseId: "rotated-anisotropy", criterion: "order", says: /cross-diffusion/ },
    passes: ["conservative-smooth", "mixed-derivative"],
    isolates: /off-diagonal conductivity is switched off \(k12 = 0\)/,
  },
  {
    defect: "neumann-gradient-data",
    layout: "vertex",
    fails: { caseId: "conservative-smooth", criterion: "order", says: /Neumann side east/ },
    passes: ["rotated-anisotropy"],
    isolates: /the Neumann condition on the east side is replaced by Dirichlet/,
  },
  {
    defect: "neumann-gradient-data",
    layout: "cell",
    fails: { caseId: "conservative-smooth", criterion: "order", says: /Neumann side east/ },
    passes: ["rotated-anisotropy"],
    isolates: /the Neumann condition on the east side is replaced by Dirichlet/,
  },
  {
    defect: "mixed-term-halved",
    layout: "vertex",
    fails: { caseId: "mixed-derivative", criterion: "order", says: /mixed-derivative term/ },
    passes: ["conservative-smooth"],
    isolates: /the mixed-derivative term \(m·u_xy\) is switched off \(m = 0\)/,
  },
  {
    defect: "mixed-term-halved",
    layout: "cell",
    fails: { caseId: "mixed-derivative", criterion: "order", says: /mixed-derivative term/ },
    passes: ["conservative-smooth"],
    isolates: /the mixed-derivative term \(m·u_xy\) is switched off \(m = 0\)/,
  },
  // robin-all has Robin sides everywhere (constant weights) and conservative-smooth a constant
  // Robin side on the conservative form: only the variation along a side is left to blame
  ...(["vertex", "cell"] as const).map((layout): Row => ({
    defect: "robin-weights-per-side",
    layout,
    fails: {
      caseId: "variable-robin-edge",
      criterion: "order",
      says: /Robin weights that vary along a side/,
    },
    passes: ["conservative-smooth", "robin-all"],
    isolates: /Robin weights on every side where they vary \(east, south\) are frozen/,
  })),
];

const GRIDS = [16, 32, 64];
// refinement stays cheap: at most one added grid, 128 × 128 at most
const REFINE = { maxAdded: 1, maxUnknowns: 17_000 };

async function run(
  ids: string[],
  layout: "vertex" | "cell",
  defect?: DefectName,
): Promise<CampaignResult> {
  const cases = await Promise.all(ids.map((id) => loadCase(id)));
  const solver = createZooSolver({ layout, ...(defect ? { defect } : {}) });
  return await runCampaign(cases, [solver], { grids: GRIDS, refine: REFINE });
}

const show = (vs: Verdict[]) => vs.map((v) => `${v.status} ${v.criterion}: ${v.reason}`).join("\n");
const notPassing = (vs: Verdict[]) =>
  vs.filter((v) => v.status === "fail" || v.status === "inconclusive");

for (const layout of ["vertex", "cell"] as const) {
  Deno.test(`zoo forms: the correct ${layout} schemes (every defect's twin) pass every new case`, async () => {
    const result = await run(NEW_CASES, layout);
    assert.deepEqual(result.studies.map((s) => s.caseId).sort(), [...NEW_CASES].sort());
    for (const s of result.studies) {
      assert.deepEqual(notPassing(s.verdicts), [], `${s.caseId}\n${show(s.verdicts)}`);
      assert.ok(s.verdicts.some((v) => v.criterion === "order" && v.status === "pass"));
    }
  });
}

for (const row of ROWS) {
  Deno.test(`zoo forms: ${row.defect} (${row.layout}) fails ${row.fails.caseId} on ${row.fails.criterion}, names its place, and passes where it cannot act`, async () => {
    const result = await run([row.fails.caseId, ...row.passes], row.layout, row.defect);
    const study = result.studies.find((s) => s.caseId === row.fails.caseId)!;
    const failing = study.verdicts.find((v) =>
      v.criterion === row.fails.criterion && v.status === "fail"
    );
    assert.ok(failing, `no failing ${row.fails.criterion}\n${show(study.verdicts)}`);
    assert.match(failing.reason + " " + (study.diagnosis ?? ""), row.fails.says);
    for (const w of study.verdicts.filter((w) => w.status === "fail")) {
      assert.doesNotMatch(w.reason, /may still be pre-asymptotic|refine further/);
    }
    assert.ok(study.isolation, "isolation ran on the failing study");
    assert.match(study.isolation.finding, row.isolates);
    for (const id of row.passes) {
      const s = result.studies.find((s) => s.caseId === id)!;
      assert.deepEqual(notPassing(s.verdicts), [], `${id}\n${show(s.verdicts)}`);
      assert.equal(s.isolation, undefined);
    }
  });
}
