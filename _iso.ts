import { loadCase } from "./cases/mod.ts";
import { runCampaign } from "./harness/campaign/campaign.ts";
import { createZooSolver, type DefectName } from "./testing/zoo/mod.ts";
const rows: [DefectName, "vertex" | "cell", string][] = [
  ["neumann-one-sided", "vertex", "neumann-all"],
  ["robin-sign", "cell", "robin-all"],
  ["neumann-half-flux", "vertex", "mixed-boundaries"],
  ["dirichlet-shift", "cell", "variable-all"],
  ["convection-x-sign", "vertex", "smooth-baseline"],
  ["convection-y-onesided", "cell", "strong-anisotropy"],
  ["spacing-swap", "vertex", "rectangle-2x1"],
  ["coefficient-shift", "cell", "variable-all"],
  ["source-shift", "vertex", "strong-anisotropy"],
  ["reaction-dropped-boundary", "vertex", "robin-all"],
];
for (const [defect, layout, id] of rows) {
  const t = performance.now();
  const r = await runCampaign([await loadCase(id)], [createZooSolver({ layout, defect })], { grids: [16, 32, 64], refine: { maxAdded: 1, maxUnknowns: 17000 } });
  const s = r.studies[0];
  console.log(`${defect} (${layout}) ${id} [${((performance.now() - t) / 1000).toFixed(1)} s, iso ${s.isolation?.seconds.toFixed(1)} s]: ${s.isolation?.finding ?? "(no isolation)"}`);
}
