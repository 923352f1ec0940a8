/**
 * Report renderers: every form of the one campaign result a person or a CI server reads. Each
 * renderer reads only the {@link CampaignResult} object; none runs a solver or evaluates a case,
 * so every report can be made again later from a saved `result.json`.
 *
 * Formats (by name in {@link RENDERERS}): `text` for a terminal, `html` (one self-contained page
 * with inline SVG plots and no scripts), `md` (a merge-request comment), `csv` (tidy long format),
 * `junit` (JUnit XML for CI servers) and `json` (the result itself).
 *
 * @example
 * ```ts ignore
 * import { rendererFor, renderMarkdown } from "./mod.ts";
 * import { readResult } from "../result/mod.ts";
 * const result = await readResult("gridproof-demo/result.json");
 * console.log(renderMarkdown(result));
 * await Deno.writeTextFile("report.html", await rendererFor("html").render(result));
 * ```
 *
 * @module
 */
import type { CampaignResult } from "../result/mod.ts";
export type { CampaignResult };
export { renderText, type TextOptions } from "./text.ts";
export { CSV_COLUMNS, renderCsv } from "./csv.ts";
export { renderJunit } from "./junit.ts";
export { renderMarkdown } from "./markdown.ts";
export { loadHtmlRenderer, renderHtml } from "./html_on_demand.ts";
export {
  type Renderer,
  rendererFor,
  RENDERERS,
  type RenderOptions,
  type ReportFormat,
} from "./registry.ts";
export { escapeCsvCell, escapeHtml, escapeMarkdown, escapeTerminal } from "./escape.ts";
export { type PlotKind, type PlotSpec, reportPlots } from "./plots.ts";
export { type BuildRow, buildRows } from "./builds.ts";
export {
  type Finding,
  type Findings,
  findingsOf,
  measureOf,
  type WarningGroup,
} from "./findings.ts";
export { foundLines, type FoundOptions, wrapWords } from "./found_text.ts";
