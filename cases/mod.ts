/**
 * Manufactured-solution cases: the case file format (`case.schema.json`), the symbolic engine
 * (mathjs parses and differentiates; our own whitelisted compiler turns the trees into plain
 * JavaScript), the built-in library (`library/*.json`) and sampling onto grids.
 *
 * @example
 * ```ts
 * import { loadCase } from "./mod.ts";
 * const c = await loadCase("smooth-baseline");
 * const { nx, ny } = c.gridFor(32);
 * const problem = c.sample(nx, ny); // a SampledProblem (problem/) for the reference solver
 * const exact = c.sampleExact(nx, ny);
 * ```
 *
 * @module
 */
export type {
  CaseBoundary,
  CaseFormulas,
  CompiledCase,
  ConservativeTerms,
  ExpectedOrder,
  LayoutName,
  LayoutOverridable,
  LayoutOverride,
  NormName,
  PointFn,
  RegionExpressions,
  SchemeName,
} from "./types.ts";
export type {
  CaseFile,
  CaseProblem,
  ConductivityText,
  ExpressionText,
  QuantitySpec,
  RegionSpec,
  SideSpec,
} from "./case_file.ts";
export {
  CONSERVATIVE_TERMS,
  type DerivedRegion,
  deriveRegion,
  GENERAL_TERMS,
  type OperatorForm,
  type OperatorTrees,
} from "./operator.ts";
export {
  faceConductivity,
  gridMisses,
  hasInterfaces,
  type Interfaces,
  NO_INTERFACES,
  piecewiseMean,
  regionCount,
  regionsAt,
} from "./regions.ts";
export {
  checkInterfaceConditions,
  type ContinuityProblem,
  type RegionFunctions,
} from "./continuity.ts";
export { formatProblem } from "./case_file.ts";
export {
  checkCaseFiles,
  type FileCheck,
  libraryFiles,
  libraryIds,
  loadCase,
  loadCaseFiles,
  loadLibrary,
  type LoadOptions,
} from "./load.ts";
export { type CaseValidation, validateCaseText } from "./validate.ts";
export { buildCase, type BuildOptions, compileDerivation } from "./engine.ts";
export { type Derivation, derivationOf } from "./derivation.ts";
export { expectationFor } from "./expectation_for.ts";
export {
  caseIdentifier,
  caseQuantities,
  type CaseQuantity,
  EXPORT_LANGUAGES,
  exportCase,
  type ExportLanguage,
} from "./export/mod.ts";
export { type CaseVariant, caseVariants, sideMidpoint, variantEdits } from "./variants.ts";
export { compileExpression, type CompileExpressionOptions } from "./compile_expression.ts";
export {
  compileExpr,
  compileFused,
  compileRowSampler,
  type FusedPointFunction,
  type PointFunction,
  type RowSampler,
} from "./compile.ts";
export { checkGridSize, MAX_NODES, sampleSide } from "./sample.ts";
export { caseGrid, isStretchedCase } from "./grid_of.ts";
export { midpoints, onLattice } from "./sample_stretched.ts";
export { JsonSyntaxError, type LocatedJson, readJsonWithPositions } from "./_json.ts";
export {
  ALLOWED_FUNCTIONS,
  CONSTANTS,
  type Expr,
  MAX_EXPRESSION_DEPTH,
  MAX_EXPRESSION_LENGTH,
} from "./expression.ts";
export { gaussLegendre } from "./gauss_legendre.ts";
