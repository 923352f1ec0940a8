/**
 * `gridproof report RESULT.json --format … [--out FILE]`: renders a saved result again, in any
 * format, without running anything.
 *
 * @module
 */
import type { Command } from "commander";
import { InputError } from "./errors.ts";
import { writeFileWhole } from "./shared.ts";
import { findChromium, printPdf } from "./pdf.ts";
import { type CampaignResult, readResult } from "../result/mod.ts";
import { RENDERERS, type ReportFormat } from "../report/mod.ts";

/** Options of {@link writeReport}. */
export interface WriteReportOptions {
  /** Format name (a key of RENDERERS). Default `"text"`. */
  format?: string;
  /** File to write; standard output when absent. */
  out?: string;
}

/** True when colour is wanted on standard output: a terminal, and NO_COLOR unset or empty. */
export function wantsColor(): boolean {
  const noColor = (Deno.env.get("NO_COLOR") ?? "") !== "";
  return !noColor && Deno.stdout.isTerminal();
}

async function writeAll(bytes: Uint8Array): Promise<void> {
  let written = 0;
  while (written < bytes.length) written += await Deno.stdout.write(bytes.subarray(written));
}

/**
 * Renders a result in one format and writes it to a file or standard output (text is coloured
 * only on a terminal and never with NO_COLOR set). Shared by `report`, `check --format` and
 * `demo`.
 *
 * @param result The campaign result.
 * @param options Format and destination.
 * @returns The path written, or undefined for standard output.
 * @throws {InputError} When the format is unknown (`where` is `--format`) or the file cannot be
 * written (`where` is the path).
 *
 * @example
 * ```ts ignore
 * await writeReport(result, { format: "html", out: "report.html" });
 * ```
 */
export async function writeReport(
  result: CampaignResult,
  options: WriteReportOptions = {},
): Promise<string | undefined> {
  const format = options.format ?? "text";
  if (!Object.hasOwn(RENDERERS, format)) {
    throw new InputError(
      `unknown report format "${format}": use one of ${Object.keys(RENDERERS).join(", ")}`,
      { where: "--format" },
    );
  }
  const renderer = RENDERERS[format as ReportFormat];
  const chromium = renderer.printed ? findChromium() : undefined;
  const color = options.out === undefined && format === "text" && wantsColor();
  const text = await renderer.render(result, { color });
  const bytes = chromium ? await printPdf(text, chromium) : new TextEncoder().encode(text);
  if (options.out === undefined) {
    await writeAll(bytes);
    return undefined;
  }
  await writeFileWhole(options.out, bytes, `the ${format} report`);
  return options.out;
}

/**
 * Registers `report` on the program.
 *
 * The command exits 0 once the report is written, whatever the verdicts in the result: it only
 * renders (the run that made the result set its own exit code). A missing, damaged or foreign
 * file, an unknown format or an unwritable output is an InputError (exit 2).
 *
 * @param program The commander program.
 * @param setExitCode Raises the exit code (unused: rendering has no verdict of its own). Typed
 * inline rather than imported from `mod.ts`, which imports this file.
 */
export function registerReportCommand(
  program: Command,
  setExitCode: (code: number) => void,
): void {
  void setExitCode;
  const formats = Object.keys(RENDERERS).join("|");
  program
    .command("report")
    .description("Render a saved result.json again, in any report format, without running solvers")
    .argument("<result>", "the result.json that a gridproof run wrote")
    .option("-f, --format <name>", `report format: ${formats}`, "text")
    .option("-o, --out <file>", "write the report to this file instead of standard output")
    .action(async (path: string, options: { format: string; out?: string }) => {
      if (!Object.hasOwn(RENDERERS, options.format)) {
        throw new InputError(
          `unknown report format "${options.format}": use one of ${formats.replaceAll("|", ", ")}`,
          { where: "--format" },
        );
      }
      // a printed format needs its browser: refused before the result is read
      if (RENDERERS[options.format as ReportFormat].printed) findChromium();
      const result = await readResult(path);
      const written = await writeReport(result, options);
      if (written !== undefined) console.error(`gridproof: wrote ${written}`);
    });
}
