/**
 * The renderers by format name: the one place a format name is resolved to code, shared by
 * `gridproof report`, `check --format` and `demo`.
 *
 * @module
 */
import type { CampaignResult } from "../result/mod.ts";
import { renderCsv } from "./csv.ts";
import { renderHtml } from "./html_on_demand.ts";
import { renderJunit } from "./junit.ts";
import { renderMarkdown } from "./markdown.ts";
import { renderText } from "./text.ts";

/** Options every renderer accepts (each uses what applies to it). */
export interface RenderOptions {
  /** ANSI colour in the text format. Default false. */
  color?: boolean;
}

/** A report format: how to render it and how to name its file. */
export interface Renderer {
  /** The format name, as given to `--format`. */
  name: ReportFormat;
  /** Usual file extension, without the dot. */
  extension: string;
  /** Media type of the output. */
  mediaType: string;
  /** One line for help texts. */
  summary: string;
  /**
   * Renders the result (the HTML renderer is asynchronous). For a printed format this is the
   * document to print; the command line prints it (reports never start a process).
   */
  render(result: CampaignResult, options?: RenderOptions): string | Promise<string>;
  /** true: the rendered HTML is printed to this format by a browser (`pdf`). Default false. */
  printed?: boolean;
}

/** Names of the report formats. */
export type ReportFormat = "text" | "html" | "pdf" | "md" | "csv" | "junit" | "json";

/** Every report format by name. */
export const RENDERERS: Readonly<Record<ReportFormat, Renderer>> = {
  text: {
    name: "text",
    extension: "txt",
    mediaType: "text/plain",
    summary: "tables and verdicts for a terminal",
    render: (result, options) => renderText(result, { color: options?.color ?? false }),
  },
  html: {
    name: "html",
    extension: "html",
    mediaType: "text/html",
    summary: "one self-contained page with plots",
    render: (result) => renderHtml(result),
  },
  pdf: {
    name: "pdf",
    extension: "pdf",
    mediaType: "application/pdf",
    summary: "the HTML page printed to A4 by headless Chromium (Debian's chromium)",
    render: (result) => renderHtml(result),
    printed: true,
  },
  md: {
    name: "md",
    extension: "md",
    mediaType: "text/markdown",
    summary: "a short summary for a merge-request comment",
    render: (result) => renderMarkdown(result),
  },
  csv: {
    name: "csv",
    extension: "csv",
    mediaType: "text/csv",
    summary: "one row per case, solver, grid, region and norm",
    render: (result) => renderCsv(result),
  },
  junit: {
    name: "junit",
    extension: "xml",
    mediaType: "application/xml",
    summary: "JUnit XML, one test case per verdict, for CI servers",
    render: (result) => renderJunit(result),
  },
  json: {
    name: "json",
    extension: "json",
    mediaType: "application/json",
    summary: "the result object itself",
    render: (result) => JSON.stringify(result, null, 2) + "\n",
  },
};

/**
 * Looks up a renderer by format name.
 *
 * @param name A format name such as `"html"`.
 * @returns The renderer.
 * @throws {RangeError} When the name is unknown; the message lists the valid names.
 *
 * @example
 * ```ts
 * import { rendererFor } from "./registry.ts";
 * console.assert(rendererFor("csv").extension === "csv");
 * ```
 */
export function rendererFor(name: string): Renderer {
  if (Object.hasOwn(RENDERERS, name)) return RENDERERS[name as ReportFormat];
  throw new RangeError(
    `unknown report format "${name}": use one of ${Object.keys(RENDERERS).join(", ")}`,
  );
}
