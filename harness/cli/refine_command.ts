/**
 * `gridproof refine`: a grid-convergence study of a user's own results. Reads a CSV with one row
 * per grid — a `cells` column (cell count; h = (1/cells)^(1/D) with `--dimension D`) or an `h`
 * column (representative spacing), then one column per quantity named by its header — and
 * reports per quantity the observed order, the extrapolated value, the GCI with its safety factor,
 * the relative errors of Celik et al. (2008), the least-squares estimate with four or more grids,
 * the convergence type and warnings.
 *
 * @module
 */
import type { Command } from "commander";
import { parse } from "csv-parse/sync";
import { quantityRecord, studyWarnings } from "../analysis/mod.ts";
import type { QuantityRecord } from "../result/types.ts";
import { InputError } from "./errors.ts";
import type { SetExitCode } from "./mod.ts";

/** One grid of a user's study, as read from the CSV. */
export interface StudyRow {
  /** Line of the CSV the row came from. */
  line: number;
  /** Cell count, when the file gives one. */
  cells: number | null;
  /** Representative spacing (given, or (1/cells)^(1/D)). */
  h: number;
  /** Value per quantity (null for an empty cell). */
  values: (number | null)[];
}

/** A validated grid study, rows sorted coarsest first. */
export interface StudyTable {
  file: string;
  /** "cells" or "h": which column gave the grid size. */
  sizeColumn: "cells" | "h";
  dimension: number;
  quantities: string[];
  rows: StudyRow[];
}

/** The result of `refine`, as printed by `--json`. */
export interface RefineResult {
  format: "gridproof-refine";
  version: 1;
  data: string;
  sizeColumn: "cells" | "h";
  dimension: number;
  grids: { line: number; cells: number | null; h: number; ratio: number | null }[];
  quantities: (QuantityRecord & { warnings: string[] })[];
}

/**
 * Reads and validates a grid-study CSV. Blank lines and lines starting with `#` are ignored.
 *
 * @param text The CSV text.
 * @param options `file` (for messages), `dimension` D for h = (1/cells)^(1/D) (default 2).
 * @returns The table, rows sorted coarsest first.
 * @throws {InputError} naming the line and column: unreadable CSV, no `cells`/`h` column or both,
 *   no quantity column, an empty or repeated header, a non-numeric or non-positive size, a
 *   non-numeric value, fewer than three grids, a grid given twice.
 */
export function readStudyCsv(
  text: string,
  options: { file?: string; dimension?: number } = {},
): StudyTable {
  const file = options.file ?? "data";
  const dimension = options.dimension ?? 2;
  let records: { record: string[]; info: { lines: number } }[];
  try {
    records = parse(text, {
      info: true,
      skip_empty_lines: true,
      trim: true,
      comment: "#",
    }) as unknown as typeof records;
  } catch (error) {
    throw new InputError(
      `cannot read the CSV: ${
        (error as Error).message
      }; every row needs one cell per header column`,
      { where: file },
    );
  }
  if (records.length === 0) {
    throw new InputError("the file is empty: give a header row and one row per grid", {
      where: file,
    });
  }
  const header = records[0].record;
  const headerLine = records[0].info.lines;
  const names = header.map((h) => h.trim());
  const seen = new Map<string, number>();
  names.forEach((name, i) => {
    if (name === "") {
      throw new InputError(`column ${i + 1} has no name: name every column in the header row`, {
        where: `${file}: line ${headerLine}`,
      });
    }
    const key = name.toLowerCase();
    if (seen.has(key)) {
      throw new InputError(
        `the column name "${name}" appears twice (columns ${seen.get(key)! + 1} and ${i + 1}): ` +
          `give each quantity its own name`,
        { where: `${file}: line ${headerLine}` },
      );
    }
    seen.set(key, i);
  });
  const cellsAt = seen.get("cells");
  const hAt = seen.get("h");
  if (cellsAt !== undefined && hAt !== undefined) {
    throw new InputError(
      'both a "cells" and an "h" column are given: keep one of them to size the grids',
      { where: `${file}: line ${headerLine}` },
    );
  }
  if (cellsAt === undefined && hAt === undefined) {
    throw new InputError(
      `no "cells" or "h" column in the header (${names.join(", ")}): add a column "cells" with ` +
        `each grid's cell count or "h" with its representative spacing`,
      { where: `${file}: line ${headerLine}` },
    );
  }
  const sizeAt = (cellsAt ?? hAt)!;
  const sizeColumn = cellsAt !== undefined ? "cells" : "h";
  const quantityAt = names.map((_, i) => i).filter((i) => i !== sizeAt);
  if (quantityAt.length === 0) {
    throw new InputError(
      `no quantity column: add one column per quantity next to "${sizeColumn}", named by its header`,
      { where: `${file}: line ${headerLine}` },
    );
  }
  const rows: StudyRow[] = [];
  for (const { record, info } of records.slice(1)) {
    const line = info.lines;
    const sizeText = record[sizeAt];
    const size = parseNumber(sizeText);
    if (size === null || !(size > 0)) {
      throw new InputError(
        `"${sizeText}" is not a positive number: give the grid's ${
          sizeColumn === "cells" ? "cell count" : "spacing"
        }`,
        { where: `${file}: line ${line}, column "${names[sizeAt]}"` },
      );
    }
    const values = quantityAt.map((i) => {
      const cell = record[i];
      if (cell === "") return null;
      const v = parseNumber(cell);
      if (v === null) {
        throw new InputError(
          `"${cell}" is not a number: give the quantity's value, or leave the cell empty when it ` +
            `is missing on this grid`,
          { where: `${file}: line ${line}, column "${names[i]}"` },
        );
      }
      return v;
    });
    const h = sizeColumn === "cells" ? (1 / size) ** (1 / dimension) : size;
    rows.push({ line, cells: sizeColumn === "cells" ? size : null, h, values });
  }
  if (rows.length < 3) {
    throw new InputError(
      `${rows.length} grid${
        rows.length === 1 ? "" : "s"
      } given, at least three are needed for an ` +
        `observed order: add rows for more grids`,
      { where: file },
    );
  }
  rows.sort((a, b) => b.h - a.h);
  for (let i = 1; i < rows.length; i++) {
    if (rows[i].h === rows[i - 1].h) {
      const [a, b] = [rows[i - 1].line, rows[i].line].sort((x, y) => x - y);
      throw new InputError(
        `the same grid is given twice (lines ${a} and ${b}, ${sizeColumn} = ${
          sizeColumn === "cells" ? rows[i].cells : rows[i].h
        }): keep one row per grid`,
        { where: `${file}: line ${b}, column "${names[sizeAt]}"` },
      );
    }
  }
  return { file, sizeColumn, dimension, quantities: quantityAt.map((i) => names[i]), rows };
}

function parseNumber(text: string | undefined): number | null {
  if (text === undefined || text.trim() === "") return null;
  const v = Number(text);
  return Number.isFinite(v) ? v : null;
}

/**
 * Runs the grid-convergence analysis on a validated table.
 *
 * @param table From {@link readStudyCsv}.
 * @param options `safetyFactor`: override of the GCI safety factor (default 1.25 with an observed
 *   order; Roache 1994).
 * @returns One result object.
 */
export function refineStudy(
  table: StudyTable,
  options: { safetyFactor?: number } = {},
): RefineResult {
  const h = table.rows.map((r) => r.h);
  const quantities = table.quantities.map((name, k) => {
    const record = quantityRecord(h, table.rows.map((r) => r.values[k]), {
      name,
      safetyFactor: options.safetyFactor,
    });
    const present = record.values.filter((v) => v !== null).length;
    const warnings = studyWarnings(h, record);
    if (present < 3) {
      warnings.unshift(
        `only ${present} grids have a value: at least three are needed for an order`,
      );
    }
    return { ...record, warnings };
  });
  return {
    format: "gridproof-refine",
    version: 1,
    data: table.file,
    sizeColumn: table.sizeColumn,
    dimension: table.dimension,
    grids: table.rows.map((r, i) => ({
      line: r.line,
      cells: r.cells,
      h: r.h,
      ratio: i === 0 ? null : table.rows[i - 1].h / r.h,
    })),
    quantities,
  };
}

const num = (x: number | null, digits = 6) => (x === null ? "n/a" : x.toPrecision(digits));
const pct = (x: number | null) => (x === null ? "n/a" : `${(100 * x).toPrecision(4)} %`);

/** Renders a {@link RefineResult} as a readable text table. */
export function formatRefine(result: RefineResult): string {
  const out: string[] = [];
  const n = result.grids.length;
  out.push(
    `Grid study of ${result.data}: ${n} grids, coarsest first` +
      (result.sizeColumn === "cells" ? ` (h = (1/cells)^(1/${result.dimension}))` : ""),
  );
  out.push("");
  const head = ["grid", result.sizeColumn === "cells" ? "cells" : "", "h", "ratio to coarser"];
  const rows = result.grids.map((g, i) => [
    String(i + 1),
    g.cells === null ? "" : String(g.cells),
    num(g.h),
    g.ratio === null ? "" : num(g.ratio, 4),
  ]);
  out.push(...table([head, ...rows]));
  for (const q of result.quantities) {
    out.push("");
    out.push(`Quantity "${q.name}"`);
    const c = q.celik;
    const ls = q.leastSquares;
    const lines: [string, string][] = [
      ["values (coarsest first)", q.values.map((v) => num(v)).join(", ")],
      ["convergence", c?.convergence ?? "unknown"],
      ["observed order p", num(q.order, 4)],
      ["extrapolated value", num(q.extrapolated, 8)],
      [
        "GCI of the finest grid",
        q.gciFine === null ? "n/a" : `${pct(q.gciFine)} (safety factor ${q.safetyFactor})`,
      ],
      ["GCI of the next grid", pct(q.gciCoarse)],
      ["GCI_23/(r^p·GCI_12)", `${num(q.asymptoticRatio, 5)} (near 1 in the asymptotic range)`],
      ["relative change e_a21", pct(c?.relativeError ?? null)],
      ["error vs extrapolated e_ext21", pct(c?.extrapolatedRelativeError ?? null)],
      ["Celik GCI_fine21", pct(c?.gciFine ?? null)],
      [
        "least squares (Eça–Hoekstra)",
        ls === null
          ? "needs four or more grids"
          : `${ls.fit} fit, order ${num(ls.order, 4)}, limit ${num(ls.extrapolated, 8)}, ` +
            `uncertainty ${pct(ls.uncertainty)} (safety factor ${ls.safetyFactor})`,
      ],
    ];
    const width = Math.max(...lines.map(([k]) => k.length));
    for (const [k, v] of lines) out.push(`  ${k.padEnd(width)}  ${v}`);
    if (q.warnings.length > 0) {
      out.push("  warnings:");
      for (const w of q.warnings) out.push(`    - ${w}`);
    }
  }
  return out.join("\n");
}

function table(rows: string[][]): string[] {
  const widths = rows[0].map((_, c) => Math.max(...rows.map((r) => r[c].length)));
  return rows.map((r) => "  " + r.map((cell, c) => cell.padStart(widths[c])).join("  ").trimEnd());
}

/** Registers `gridproof refine` on the program. */
export function registerRefineCommand(program: Command, setExitCode: SetExitCode): void {
  void setExitCode; // warnings do not change the exit code; bad input throws (exit 2)
  program
    .command("refine")
    .description(
      "Grid-convergence study of your own results on three or more grids: observed order, " +
        "Richardson extrapolation, GCI, Celik et al. (2008) and least-squares estimates",
    )
    .requiredOption(
      "--data <file>",
      'CSV with a "cells" (cell count) or "h" (spacing) column and one column per quantity',
    )
    .option("--fs <factor>", "GCI safety factor (default 1.25 with an observed order)")
    .option("--dimension <d>", "space dimension D for h = (1/cells)^(1/D)", "2")
    .option("--json", "print the result as one JSON object")
    .action(async (opts: { data: string; fs?: string; dimension: string; json?: boolean }) => {
      const dimension = Number(opts.dimension);
      if (!(Number.isInteger(dimension) && dimension >= 1 && dimension <= 3)) {
        throw new InputError(`must be 1, 2 or 3, got "${opts.dimension}"`, {
          where: "--dimension",
        });
      }
      let safetyFactor: number | undefined;
      if (opts.fs !== undefined) {
        safetyFactor = Number(opts.fs);
        if (!(safetyFactor > 0 && Number.isFinite(safetyFactor))) {
          throw new InputError(
            `must be a positive number (1.25 for three or more grids, 3 for two), got "${opts.fs}"`,
            { where: "--fs" },
          );
        }
      }
      let text: string;
      try {
        text = await Deno.readTextFile(opts.data);
      } catch (error) {
        const why = error instanceof Deno.errors.NotFound
          ? "no such file"
          : (error as Error).message;
        throw new InputError(`cannot read the file: ${why}; check the path given to --data`, {
          where: opts.data,
        });
      }
      const result = refineStudy(readStudyCsv(text, { file: opts.data, dimension }), {
        safetyFactor,
      });
      console.log(opts.json ? JSON.stringify(result, null, 2) : formatRefine(result));
    });
}
