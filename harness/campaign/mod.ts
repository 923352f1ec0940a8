/**
 * Campaigns: chosen cases × solvers × grids, planned, run in parallel and journaled as each solve
 * finishes (resumable after a crash or an interrupt, one writer per output folder), measured
 * against the exact solutions, analysed into studies, judged by the verdict criteria, and returned
 * as the one `CampaignResult` (`harness/result/`). Also the grid sequences of a campaign and a
 * pool of workers running the bundled reference solver. Library code: it never prints; progress
 * comes back through `onProgress`.
 *
 * @example
 * ```ts
 * import assert from "node:assert/strict";
 * import { loadCase } from "../../cases/mod.ts";
 * import { createReferenceSolver } from "../solvers/mod.ts";
 * import { allVerdicts, gridSequence, runCampaign } from "./mod.ts";
 * const grids = gridSequence({ coarsest: 8, ratio: 2, levels: 3 }); // 8, 16, 32
 * const solver = createReferenceSolver();
 * const result = await runCampaign([await loadCase("smooth-baseline")], [solver], { grids });
 * await solver.close();
 * assert.equal(result.solves.length, 3);
 * assert.ok(allVerdicts(result).length > 0);
 * ```
 *
 * @module
 */
export {
  allVerdicts,
  type CampaignOptions,
  EXIT_INCONCLUSIVE,
  runCampaign,
  summarize,
} from "./campaign.ts";
export type { ProgressEvent } from "./run.ts";
export { gridSequence, type GridSpec } from "./grids.ts";
export { createPooledReferenceSolver, type PooledReferenceOptions } from "./reference_pool.ts";
export { JOURNAL_FILE } from "./journal.ts";
export { LOCK_FILE } from "./folder_lock.ts";
