/**
 * `--format pdf`: the HTML report printed to PDF by headless Chromium (Debian's `chromium`), with
 * the report's own print style sheet (A4, tables that wrap or stack). Chromium is looked up before
 * any work, so a missing browser is bad input (exit 2) with the fix, never a failure at the end.
 *
 * @module
 */
import { InputError } from "./errors.ts";

/** Where Chromium is looked for: `GRIDPROOF_CHROMIUM` when set, then these, in order. */
const CANDIDATES = ["/usr/bin/chromium", "/usr/bin/chromium-browser", "/usr/bin/google-chrome"];

/**
 * The Chromium program that prints PDFs.
 *
 * @param where The flag to name in the error (`--format`).
 * @returns Its path.
 * @throws {InputError} When none is installed (or `GRIDPROOF_CHROMIUM` names no file).
 */
export function findChromium(where = "--format"): string {
  let chosen: string | undefined;
  try {
    chosen = Deno.env.get("GRIDPROOF_CHROMIUM");
  } catch {
    // no --allow-env: look in the usual places only
  }
  for (const path of chosen ? [chosen] : CANDIDATES) {
    try {
      if (Deno.statSync(path).isFile) return path;
    } catch {
      // not there: try the next one
    }
  }
  throw new InputError(
    chosen
      ? `GRIDPROOF_CHROMIUM names ${chosen}, which is not a file: point it at a Chromium ` +
        `program, or unset it`
      : `the pdf format is printed by Chromium, which is not installed (looked for ` +
        `${CANDIDATES.join(", ")}): install Debian's chromium package (apt-get install ` +
        `chromium), set GRIDPROOF_CHROMIUM to a Chromium program, or write --format html and ` +
        `print it from a browser`,
    { where },
  );
}

/**
 * Prints an HTML document to PDF with headless Chromium, offline (a fresh profile, no network
 * services, and the page itself fetches nothing).
 *
 * @param html The HTML report.
 * @param chromium The Chromium program ({@link findChromium}).
 * @returns The PDF bytes.
 * @throws {Error} When Chromium fails or writes no PDF (its stderr's end in the message).
 */
export async function printPdf(html: string, chromium: string): Promise<Uint8Array> {
  const dir = await Deno.makeTempDir({ prefix: "gridproof-pdf-" });
  try {
    const page = `${dir}/report.html`;
    const pdf = `${dir}/report.pdf`;
    await Deno.writeTextFile(page, html);
    const command = new Deno.Command(chromium, {
      args: [
        "--headless",
        "--no-sandbox",
        "--disable-gpu",
        "--no-first-run",
        "--disable-background-networking",
        "--disable-component-update",
        "--disable-sync",
        `--user-data-dir=${dir}/profile`,
        "--no-pdf-header-footer",
        `--print-to-pdf=${pdf}`,
        `file://${page}`,
      ],
      stdin: "null",
      stdout: "null",
      stderr: "piped",
    });
    let output: Deno.CommandOutput;
    try {
      output = await command.output();
    } catch (error) {
      if (error instanceof Deno.errors.NotCapable) {
        throw new InputError(
          `printing a PDF starts Chromium, which this run may not do: grant --allow-run (the npm ` +
            `script does), or write --format html`,
          { where: "--format" },
        );
      }
      throw error;
    }
    try {
      return await Deno.readFile(pdf);
    } catch {
      const tail = new TextDecoder().decode(output.stderr).trim().split("\n").slice(-5).join("\n");
      throw new Error(
        `Chromium (${chromium}) wrote no PDF (exit code ${output.code})` +
          (tail ? `; it said:\n${tail}` : ""),
      );
    }
  } finally {
    await Deno.remove(dir, { recursive: true }).catch(() => undefined);
  }
}
