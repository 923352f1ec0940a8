/**
 * The HTML renderer, loaded when first asked for. Its formulas (MathJax) and plots (Vega) take
 * about a second to load, which every command that writes no HTML report would otherwise pay at
 * start-up; a campaign that will write one calls {@link loadHtmlRenderer} when it starts, so the
 * loading overlaps the solves instead of following them.
 *
 * @module
 */
import type { CampaignResult } from "../result/mod.ts";

let loading: Promise<typeof import("./html.ts")> | undefined;

/**
 * Starts loading the HTML renderer (once; later calls return the same promise).
 *
 * @returns the renderer's module
 *
 * @example
 * ```ts ignore
 * const html = loadHtmlRenderer(); // while the campaign runs
 * ```
 */
export function loadHtmlRenderer(): Promise<typeof import("./html.ts")> {
  loading ??= import("./html.ts");
  return loading;
}

/**
 * Renders the result as one self-contained HTML page (see `html.ts`), loading the renderer on
 * first use.
 *
 * @param result the campaign result
 * @returns the HTML document
 * @throws {Error} When Vega cannot draw a plot
 *
 * @example
 * ```ts ignore
 * await Deno.writeTextFile("report.html", await renderHtml(result));
 * ```
 */
export async function renderHtml(result: CampaignResult): Promise<string> {
  return (await loadHtmlRenderer()).renderHtml(result);
}
