/**
 * The defect zoo (issue 10, item 12): seeded, realistic bugs in an independent in-process solver
 * (testing/zoo: its own vertex and cell-centred assembly and a direct banded solve), each run
 * beside its correct twin over several different manufactured problems. Every defect must FAIL
 * with a reason naming its place; every twin must pass. The comparison is always the case's
 * manufactured exact solution.
 */
import assert from "node:assert/strict";
import { loadCase } from "../../cases/mod.ts";
import { runCampaign } from "../../harness/campaign/mod.ts";
import type { CampaignResult, Verdict } from "../../harness/result/mod.ts";
import { createZooSolver, type DefectName } from "../../testing/zoo/mod.ts";

/** One row: a defect, a layout, the cases it runs on, where it must fail and what it must say. */
interface Row {
  defect: DefectName;
  layout: "vertex" | "cell";
  cases: string[];
  /** Cases that must fail, with the criterion that fails and a pattern its reason must match. */
  fails: { caseId: string; criterion: string; says: RegExp }[];
  /** What isolation must find on the first failing case (the change that restores the order). */
  isolates?: RegExp;
}

// Each row varies the problem: boundary mixes, coefficients, domains and cell shapes differ.
const ROWS: Row[] = [
  {
    defect: "neumann-one-sided",
    layout: "vertex",
    isolates: /every Neumann side \(west, east, south, north\) is replaced by Dirichlet/,
    cases: ["neumann-all", "smooth-baseline"],
    fails: [{ caseId: "neumann-all", criterion: "order", says: /Neumann/ }],
  },
  {
    defect: "neumann-one-sided",
    layout: "cell",
    cases: ["weak-singularity", "mixed-boundaries", "variable-all"],
    fails: [{ caseId: "mixed-boundaries", criterion: "order", says: /Neumann/ }],
  },
  {
    defect: "robin-sign",
    layout: "cell",
    isolates: /every Robin side \(west, east, south, north\) is replaced by Dirichlet/,
    cases: ["robin-all", "strong-anisotropy"],
    fails: [{ caseId: "robin-all", criterion: "order", says: /Robin/ }],
  },
  {
    defect: "robin-sign",
    layout: "vertex",
    // mixed-boundaries has Robin east and north, Neumann south: only the Robin group restores
    isolates:
      /every Robin side \(east, north\) is replaced by Dirichlet: the defect is in the Robin/,
    cases: ["mixed-boundaries", "neumann-all"],
    fails: [{ caseId: "mixed-boundaries", criterion: "order", says: /Robin/ }],
  },
  {
    defect: "neumann-half-flux",
    layout: "vertex",
    cases: ["mixed-boundaries", "quartic-poisson"],
    fails: [{ caseId: "mixed-boundaries", criterion: "order", says: /Neumann|Robin/ }],
  },
  {
    defect: "dirichlet-shift",
    layout: "vertex",
    cases: ["variable-all"],
    fails: [{ caseId: "variable-all", criterion: "imposed-data", says: /Dirichlet side north/ }],
  },
  {
    defect: "dirichlet-shift",
    layout: "cell",
    isolates: /the treatment of the Dirichlet sides/,
    cases: ["variable-all", "neumann-all"],
    fails: [{ caseId: "variable-all", criterion: "order", says: /Dirichlet/ }],
  },
  {
    defect: "convection-x-sign",
    layout: "vertex",
    isolates: /the first-derivative term in x \(b·u_x\) is switched off/,
    cases: ["smooth-baseline", "quartic-poisson"],
    fails: [{
      caseId: "smooth-baseline",
      criterion: "order",
      says: /first-derivative term in x/,
    }],
  },
  {
    defect: "convection-y-onesided",
    layout: "cell",
    isolates: /the first-derivative term in y \(d·u_y\) is switched off/,
    cases: ["strong-anisotropy", "quartic-poisson"],
    fails: [{
      caseId: "strong-anisotropy",
      criterion: "order",
      says: /first-derivative term in y/,
    }],
  },
  {
    defect: "spacing-swap",
    layout: "vertex",
    isolates: /the cells are made square/,
    cases: ["rectangle-2x1", "smooth-baseline"],
    fails: [{ caseId: "rectangle-2x1", criterion: "order", says: /non-square cells/ }],
  },
  {
    defect: "coefficient-shift",
    layout: "cell",
    isolates: /the variable coefficient of u_xx \(a\)/,
    cases: ["variable-all", "smooth-baseline"],
    fails: [{ caseId: "variable-all", criterion: "order", says: /coefficient of u_xx/ }],
  },
  {
    defect: "source-shift",
    layout: "vertex",
    isolates: /no single change restored the order/,
    cases: ["strong-anisotropy"],
    fails: [{
      caseId: "strong-anisotropy",
      criterion: "order",
      says: /interior stencil, a coefficient or the source/,
    }],
  },
  {
    defect: "reaction-dropped-boundary",
    layout: "vertex",
    isolates: /the reaction term \(e·u\) is switched off/,
    cases: ["robin-all", "quartic-poisson"],
    fails: [{ caseId: "robin-all", criterion: "order", says: /reaction term/ }],
  },
  {
    defect: "loose-tolerance-lie",
    layout: "cell",
    cases: ["smooth-baseline"],
    fails: [{
      caseId: "smooth-baseline",
      criterion: "convergence",
      says: /reports converged, but/,
    }],
  },
  {
    defect: "stall-claims-converged",
    layout: "vertex",
    cases: ["robin-all"],
    fails: [{ caseId: "robin-all", criterion: "convergence", says: /reports converged, but/ }],
  },
  {
    defect: "transposed-output",
    layout: "vertex",
    cases: ["rectangle-2x1"],
    fails: [{ caseId: "rectangle-2x1", criterion: "imposed-data", says: /wrong point order/ }],
  },
  {
    defect: "transposed-output",
    layout: "cell",
    cases: ["variable-all"],
    fails: [{ caseId: "variable-all", criterion: "point-order", says: /y-fastest/ }],
  },
  {
    defect: "dropped-boundary-values",
    layout: "vertex",
    cases: ["oscillatory-coefficient"],
    fails: [{
      caseId: "oscillatory-coefficient",
      criterion: "imposed-data",
      says: /Dirichlet side south/,
    }],
  },
  {
    defect: "single-level-work",
    layout: "vertex",
    cases: ["smooth-baseline"],
    fails: [{ caseId: "smooth-baseline", criterion: "flat-iterations", says: /single-level/ }],
  },
];

const GRIDS = [16, 32, 64];
// refinement stays cheap: at most one added grid, 128 × 128 at most
const REFINE = { maxAdded: 1, maxUnknowns: 17_000 };

async function run(row: Row, defect?: DefectName): Promise<CampaignResult> {
  const cases = await Promise.all(row.cases.map((id) => loadCase(id)));
  const solver = createZooSolver({ layout: row.layout, ...(defect ? { defect } : {}) });
  return await runCampaign(cases, [solver], { grids: GRIDS, refine: REFINE });
}

const show = (vs: Verdict[]) => vs.map((v) => `${v.status} ${v.criterion}: ${v.reason}`).join("\n");

for (const row of ROWS) {
  Deno.test(`zoo: ${row.defect} (${row.layout}) fails where it acts and names its place; its twin passes`, async () => {
    const bad = await run(row, row.defect);
    for (const f of row.fails) {
      const study = bad.studies.find((s) => s.caseId === f.caseId)!;
      const v = study.verdicts.find((v) => v.criterion === f.criterion && v.status === "fail");
      assert.ok(v, `${f.caseId}: no failing ${f.criterion}\n${show(study.verdicts)}`);
      assert.match(v.reason + " " + (study.diagnosis ?? ""), f.says, show(study.verdicts));
      // never a FAIL worded as "maybe"
      for (const w of study.verdicts.filter((w) => w.status === "fail")) {
        assert.doesNotMatch(w.reason, /may still be pre-asymptotic|refine further/);
      }
    }
    if (row.isolates) {
      const study = bad.studies.find((s) => s.caseId === row.fails[0].caseId)!;
      assert.ok(study.isolation, "isolation ran on the failing study");
      assert.match(study.isolation.finding, row.isolates);
    }
    // isolation never runs where nothing failed on the order
    for (const s of bad.studies.filter((s) => !s.verdicts.some((v) => v.status === "fail"))) {
      assert.equal(s.isolation, undefined);
    }
    const twin = await run(row);
    const wrong = twin.studies.flatMap((s) =>
      s.verdicts.filter((v) => v.status === "fail" || v.status === "inconclusive")
    );
    assert.deepEqual(wrong, [], show(wrong));
  });
}
