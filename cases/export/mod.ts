/**
 * Case export: a manufactured-solution case as C, Fortran or Python functions of (x, y), for
 * solvers that evaluate the exact solution, source term, coefficients and boundary data at their
 * own points.
 *
 * @example
 * ```ts
 * import { loadCase } from "../mod.ts";
 * import { exportCase } from "./mod.ts";
 * const c = await loadCase("layered-jump-100");
 * const text = exportCase(c, "c", { version: "0.1.0" });
 * if (!text.includes("layered_jump_100_region(")) throw new Error("no region selector");
 * ```
 *
 * @module
 */
export {
  caseIdentifier,
  caseQuantities,
  type CaseQuantity,
  EXPORT_LANGUAGES,
  exportCase,
  type ExportLanguage,
} from "./export_case.ts";
export { type Body, bodyOf, type Spelling } from "./_dag.ts";
export type { ExportQuantity, FileParts, Language } from "./_language.ts";
