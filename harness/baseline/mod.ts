/**
 * Release baselines: compare a new campaign result with the saved result of an earlier release
 * and judge regressions as verdicts of their own (criteria `baseline-order`, `baseline-status`,
 * `baseline-iterations`, `baseline-time`). Pure: reads two result objects, touches no files.
 *
 * @example
 * ```ts ignore
 * import { compareWithBaseline } from "./mod.ts";
 * import { readResult } from "../result/mod.ts";
 * const verdicts = compareWithBaseline(current, await readResult("release-1.4.json"));
 * const regressions = verdicts.filter((v) => v.status === "fail");
 * ```
 *
 * @module
 */
export { type BaselineOptions, compareWithBaseline } from "./compare.ts";
