/**
 * Benchmark of isolation runs (issue 11): for seeded defects of the test zoo (testing/zoo), the
 * solve time of the failing study itself against the solve time of its isolation variants, side by
 * side in one run, and the finding. Times are the harness's wall times per solve, summed.
 *
 * Run: npm run bench:isolation
 *
 * @module
 */
import { loadCase } from "../cases/mod.ts";
import { runCampaign } from "../harness/campaign/mod.ts";
import { createZooSolver, type DefectName } from "../testing/zoo/mod.ts";

const ROWS: [DefectName, "vertex" | "cell", string][] = [
  ["neumann-one-sided", "vertex", "mixed-boundaries"],
  ["robin-sign", "cell", "robin-all"],
  ["convection-x-sign", "vertex", "smooth-baseline"],
  ["coefficient-shift", "cell", "variable-all"],
  ["spacing-swap", "vertex", "rectangle-2x1"],
  ["source-shift", "vertex", "strong-anisotropy"],
];
const GRIDS = [16, 32, 64, 128];

console.log("defect (layout) × case | study s | isolation s | ratio | variants | finding");
for (const [defect, layout, id] of ROWS) {
  const result = await runCampaign([await loadCase(id)], [createZooSolver({ layout, defect })], {
    grids: GRIDS,
    refine: { maxAdded: 0 },
  });
  const study = result.studies[0];
  const own = result.solves.reduce((t, r) => t + r.seconds, 0);
  const iso = study.isolation;
  console.log(
    `${defect} (${layout}) × ${id} | ${own.toFixed(2)} | ${iso?.seconds.toFixed(2) ?? "—"} | ${
      iso ? (iso.seconds / own).toFixed(1) : "—"
    } | ${iso?.variants.length ?? 0} | ${iso?.finding.slice(0, 120) ?? "(no isolation)"}`,
  );
}
