/**
 * The expectation of one case for one scheme and one layout: the scheme's expectation with the
 * layout's override (`expected.<scheme>.layouts.<layout>`) merged in.
 *
 * @module
 */
import type { CompiledCase, ExpectedOrder, LayoutName, SchemeName } from "./types.ts";

/**
 * Returns what a case expects of a solver with the given scheme and layout: the case's
 * `expected[scheme]` with `expected[scheme].layouts[layout]` merged in. The override's `formal`,
 * `exactToRoundOff` and `orderTolerance` replace the scheme's; its `achievable` is merged per norm
 * (a norm it names replaces the scheme's entry for that norm, the others stay). `grids` always
 * come from the scheme. The result has no `layouts` field and shares no object with the case.
 *
 * @param kase the compiled case
 * @param scheme the solver's discretization
 * @param layout where the solver's values sit
 * @returns the merged expectation
 * @example
 * ```ts
 * import { expectationFor, loadCase } from "./mod.ts";
 * const kase = await loadCase("quadratic-exact");
 * expectationFor(kase, "central", "vertex").exactToRoundOff; // true
 * expectationFor(kase, "central", "cell").exactToRoundOff; // false
 * ```
 */
export function expectationFor(
  kase: Pick<CompiledCase, "expected">,
  scheme: SchemeName,
  layout: LayoutName,
): ExpectedOrder {
  const { layouts, achievable, grids, ...rest } = kase.expected[scheme];
  const result: ExpectedOrder = structuredClone(rest);
  if (achievable) result.achievable = structuredClone(achievable);
  if (grids) result.grids = [...grids];
  const override = layouts?.[layout];
  if (!override) return result;
  const { reason: _reason, achievable: layoutAchievable, ...fields } = override;
  Object.assign(result, structuredClone(fields));
  if (layoutAchievable) {
    result.achievable = { ...result.achievable, ...structuredClone(layoutAchievable) };
  }
  return result;
}
