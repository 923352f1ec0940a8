/**
 * The one result object of a campaign (`CampaignResult`): its types, the severity order of verdict
 * statuses, and the reader of a saved `result.json` (format and version checked first, then the
 * JSON Schema `result.schema.json`). Reports, the baseline comparison and the command line read
 * results only through this door.
 *
 * `types.ts` is the contract file: it has no imports and no code beyond a few constants, so the
 * pure `harness/analysis/` part may take types and `PLACES` from it directly without loading the
 * reader (Ajv, file reading).
 *
 * @example
 * ```ts
 * import assert from "node:assert/strict";
 * import { parseResult, RESULT_FORMAT, RESULT_VERSION, worstStatus } from "./mod.ts";
 * assert.throws(() => parseResult(JSON.stringify({ format: "other" })), /not a gridproof result/);
 * assert.equal(RESULT_FORMAT, "gridproof-result");
 * assert.ok(RESULT_VERSION >= 1);
 * assert.equal(worstStatus([]), "not-applicable");
 * ```
 *
 * @module
 */
export type {
  CampaignResult,
  CaseInfo,
  FileDigest,
  ImposedDataCheck,
  IsolationRecord,
  NormSet,
  OrderRecord,
  Place,
  QuantityRecord,
  RankComparison,
  Region,
  ScalingRecord,
  SideName,
  SolverBuildRecord,
  SolveRecord,
  SolverInfo,
  SolveStatus,
  StudyRecord,
  Verdict,
  VerdictStatus,
} from "./types.ts";
export { PLACES, RESULT_FORMAT, RESULT_VERSION } from "./types.ts";
export { SEVERITY, worstStatus } from "./severity.ts";
export { checkResult, parseResult, type ParseResultOptions, readResult } from "./read.ts";
