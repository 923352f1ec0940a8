/**
 * `gridproof refine`: a grid-convergence study of a user's own results. Reads a CSV with one row
 * per grid — a `cells` column (cell count; h = (1/cells)^(1/D) with `--dimension D`) or an `h`
 * column (representative spacing), then one column per quantity named by its header — and
 * reports per quantity the convergence class, the observed order against the formal order
 * (`--formal-order`), the ratio of successive differences against the one the formal order
 * predicts, the extrapolated value and the GCI with the safety factor and order the published
 * rules give (Roache 1998; Oberkampf & Roy 2010, §8.6), the relative errors of Celik et al.
 * (2008), the least-squares estimate with four or more grids, and warnings. A quantity whose
 * differences do not shrink is divergent: the command then exits 1. See `docs/refine.md`.
 *
 * @module
 */
import type { Command } from "commander";
import { parse } from "csv-parse/sync";
import {
  quantityRecord,
  richardsonExtrapolate,
  roacheGci,
  studyWarnings,
} from "../analysis/mod.ts";
import { type RefineConvergence, refineConvergence } from "../analysis/refine_convergence.ts";
import { refineSafetyFactor, type SafetyFactorBasis } from "../analysis/refine_safety_factor.ts";
import type { QuantityRecord } from "../result/mod.ts";
import { InputError } from "./errors.ts";
import type { SetExitCode } from "./exit.ts";

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

/** One quantity of a `refine` study. Figures are fractions (0.01 = 1 %); grid 1 is the finest. */
export interface RefineQuantity {
  name: string;
  /** Value per grid, coarsest first (null where the CSV cell is empty). */
  values: (number | null)[];
  /** How the finest three grids with a value behave; null with fewer than three. */
  convergence: RefineConvergence | null;
  /** Observed order from the finest three grids (Celik et al. 2008); null when none. */
  observedOrder: number | null;
  formalOrder: number;
  /** observedOrder / formalOrder. */
  orderRatio: number | null;
  /** (f3 − f2)/(f2 − f1); negative when the differences change sign. */
  differenceRatio: number | null;
  /** |differenceRatio| for data exactly at the formal order: r^p_formal for a constant ratio. */
  expectedDifferenceRatio: number | null;
  /** The GCI with the rule's order and factor; null for divergent or unchanged data. */
  gci: {
    /** The factor used (the rule's, or `--fs`). */
    safetyFactor: number;
    /** The factor the rule chose. */
    ruleSafetyFactor: number;
    /** The order used for extrapolation and the GCI. */
    order: number;
    basis: SafetyFactorBasis;
    reason: string;
    /** f1 + (f1 − f2)/(r21^p − 1). */
    extrapolated: number;
    /** Fs·|(f2 − f1)/f1|/(r21^p − 1); null when f1 = 0. */
    fine: number | null;
    /** Fs·|(f3 − f2)/f2|/(r32^p − 1); null with two grids or f2 = 0. */
    coarse: number | null;
  } | null;
  /** Celik et al. (2008) three-grid procedure, with its own Fs = 1.25. */
  celik: QuantityRecord["celik"];
  /** Eça & Hoekstra (2014) least-squares estimate (four or more grids). */
  leastSquares: QuantityRecord["leastSquares"];
  warnings: string[];
}

/** The result of `refine`, as printed by `--json`. */
export interface RefineResult {
  format: "gridproof-refine";
  /** 2: formal order, convergence class, GCI rule; no asymptotic ratio. */
  version: 2;
  data: string;
  sizeColumn: "cells" | "h";
  dimension: number;
  formalOrder: number;
  grids: { line: number; cells: number | null; h: number; ratio: number | null }[];
  quantities: RefineQuantity[];
  /** Names of the divergent quantities (the command exits 1 when any). */
  divergent: string[];
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
 * Per quantity, from the finest three grids that have a value: the convergence class and the
 * ratio of successive differences against the one the formal order predicts
 * ({@link refineConvergence}); the observed order (Celik et al. 2008, which for a constant ratio
 * is the NPARC formula p = ln((f3 − f2)/(f2 − f1))/ln r); the safety factor and order of the GCI by
 * the published rules ({@link refineSafetyFactor}); then Richardson extrapolation and Roache's
 * GCI of the finest pair and of the next pair with that order and factor.
 *
 * The "asymptotic ratio" GCI_23/(r^p·GCI_12) is not reported: with a constant ratio r and p
 * observed from the same three grids it is an identity (derived):
 *   GCI_12 = Fs·|f2 − f1|/(|f1|·(r^p − 1)), GCI_23 = Fs·|f3 − f2|/(|f2|·(r^p − 1)),
 *   so GCI_23/(r^p·GCI_12) = |f3 − f2|·|f1| / (r^p·|f2 − f1|·|f2|),
 *   and the observed p satisfies r^p = |f3 − f2|/|f2 − f1|, hence the ratio is |f1/f2| exactly
 *   (NPARC's 1.0020 is 0.970500/0.968540). It only measures how much f changed, not whether the
 *   grids are in the asymptotic range. Instead the result gives the observed order against the
 *   formal order and (f3 − f2)/(f2 − f1) against r^p_formal, which do say that.
 *
 * @param table From {@link readStudyCsv}.
 * @param options `formalOrder` p_f of the user's scheme (required, > 0); `safetyFactor`: override
 *   of the factor the rule chooses (default: the rule's).
 * @returns One result object; `divergent` names the quantities whose differences do not shrink.
 * @throws {RangeError} when the formal order or the safety factor is not positive.
 *
 * @example
 * ```ts
 * import assert from "node:assert/strict";
 * import { readStudyCsv, refineStudy } from "./refine_command.ts";
 * // NASA NPARC tutorial: p = 1.786170 is more than 10 % below 2, so Fs = 3
 * const table = readStudyCsv("h,f\n1,0.9705\n2,0.96854\n4,0.96178\n");
 * const q = refineStudy(table, { formalOrder: 2 }).quantities[0];
 * assert.equal(q.gci?.safetyFactor, 3);
 * ```
 */
export function refineStudy(
  table: StudyTable,
  options: { formalOrder: number; safetyFactor?: number },
): RefineResult {
  const { formalOrder, safetyFactor } = options;
  if (!(formalOrder > 0 && Number.isFinite(formalOrder))) {
    throw new RangeError(
      `Cannot study the grids: formal order must be positive, got ${formalOrder}`,
    );
  }
  if (safetyFactor !== undefined && !(safetyFactor > 0 && Number.isFinite(safetyFactor))) {
    throw new RangeError(
      `Cannot study the grids: safety factor must be positive, got ${safetyFactor}`,
    );
  }
  const h = table.rows.map((r) => r.h);
  const quantities = table.quantities.map((name, k) =>
    refineQuantity(h, table.rows.map((r) => r.values[k]), { name, formalOrder, safetyFactor })
  );
  return {
    format: "gridproof-refine",
    version: 2,
    data: table.file,
    sizeColumn: table.sizeColumn,
    dimension: table.dimension,
    formalOrder,
    grids: table.rows.map((r, i) => ({
      line: r.line,
      cells: r.cells,
      h: r.h,
      ratio: i === 0 ? null : table.rows[i - 1].h / r.h,
    })),
    quantities,
    divergent: quantities.filter((q) => q.convergence === "divergent").map((q) => q.name),
  };
}

function refineQuantity(
  h: number[],
  values: (number | null)[],
  options: { name: string; formalOrder: number; safetyFactor?: number },
): RefineQuantity {
  const { name, formalOrder } = options;
  // Celik figures (at their own Fs = 1.25) and the least-squares estimate come from the shared
  // record; its GCI and asymptotic ratio are not used here (see refineStudy)
  const record = quantityRecord(h, values, { name, formalOrder });
  const usable = values.flatMap((v, i) => (v !== null ? [i] : []));
  const n = usable.length;
  const out: RefineQuantity = {
    name,
    values,
    convergence: null,
    observedOrder: record.order,
    formalOrder,
    orderRatio: record.order === null ? null : record.order / formalOrder,
    differenceRatio: null,
    expectedDifferenceRatio: null,
    gci: null,
    celik: record.celik,
    leastSquares: record.leastSquares,
    warnings: studyWarnings(h, { ...record, asymptoticRatio: null }),
  };
  if (n < 2) {
    out.warnings.unshift(`only ${n} grid${n === 1 ? " has" : "s have"} a value: nothing to study`);
    return out;
  }
  const [i1, i2] = [usable[n - 1], usable[n - 2]];
  const f1 = values[i1]!;
  const f2 = values[i2]!;
  const r21 = h[i2] / h[i1];
  let f3: number | null = null;
  let r32: number | null = null;
  if (n >= 3) {
    const i3 = usable[n - 3];
    f3 = values[i3]!;
    r32 = h[i3] / h[i2];
    const reading = refineConvergence({
      fine: { h: h[i1], value: f1 },
      medium: { h: h[i2], value: f2 },
      coarse: { h: h[i3], value: f3 },
    }, { formalOrder });
    out.convergence = reading.convergence;
    out.differenceRatio = reading.differenceRatio;
    out.expectedDifferenceRatio = reading.expectedDifferenceRatio;
  } else {
    out.warnings.unshift(
      "only 2 grids have a value: no observed order; the GCI uses the formal order with Fs = 3",
    );
  }
  if (out.convergence === "divergent" && record.celik?.convergence !== "divergent") {
    out.warnings.push(
      "the differences between grids do not shrink (divergent): no order or GCI can be " +
        "trusted; check the solutions or refine further",
    );
  }
  if (out.convergence === "unchanged") {
    out.warnings.push(
      "the value is the same on the finest three grids: no discretization error can be measured " +
        "(the quantity does not depend on the grid, or the values are rounded too coarsely)",
    );
  }
  const choice = refineSafetyFactor({
    observed: record.order,
    formal: formalOrder,
    convergence: out.convergence,
  });
  if (choice === null) return out;
  if (choice.basis === "observed-far-from-formal") {
    out.warnings.push(
      `observed order ${fmt(record.order!, 4)} is ${
        fmt(100 * Math.abs(record.order! / formalOrder - 1), 3)
      } % ${record.order! > formalOrder ? "above" : "below"} the formal order ${formalOrder}: ` +
        `the grids may not be in the asymptotic range (or the scheme does not reach its formal ` +
        `order); refine further before trusting the GCI`,
    );
  }
  const fs = options.safetyFactor ?? choice.safetyFactor;
  const p = choice.order;
  const gci = (fine: number, coarse: number, ratio: number) =>
    fine === 0 ? null : roacheGci(fine, coarse, { ratio, order: p, safetyFactor: fs }).fine;
  out.gci = {
    safetyFactor: fs,
    ruleSafetyFactor: choice.safetyFactor,
    order: p,
    basis: choice.basis,
    reason: choice.reason,
    extrapolated: richardsonExtrapolate(f1, f2, r21, p),
    fine: gci(f1, f2, r21),
    coarse: f3 === null || r32 === null ? null : gci(f2, f3, r32),
  };
  return out;
}

const fmt = (x: number, digits: number) => x.toPrecision(digits);
const num = (x: number | null, digits = 6) => (x === null ? "n/a" : x.toPrecision(digits));
const pct = (x: number | null) => (x === null ? "n/a" : `${(100 * x).toPrecision(4)} %`);

const CONVERGENCE_WORDS: Record<RefineConvergence, string> = {
  monotone: "monotone (the differences shrink, same sign)",
  oscillatory: "oscillatory (the differences shrink and change sign)",
  divergent: "DIVERGENT (the differences between grids do not shrink)",
  unchanged: "unchanged (same value on the finest three grids)",
};

/** Renders a {@link RefineResult} as a readable text table. */
export function formatRefine(result: RefineResult): string {
  const out: string[] = [];
  const n = result.grids.length;
  out.push(
    `Grid study of ${result.data}: ${n} grids, coarsest first` +
      (result.sizeColumn === "cells" ? ` (h = (1/cells)^(1/${result.dimension}))` : "") +
      `; formal order ${result.formalOrder}`,
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
    const g = q.gci;
    const lines: [string, string][] = [
      ["values (coarsest first)", q.values.map((v) => num(v)).join(", ")],
      ["convergence", q.convergence === null ? "n/a" : CONVERGENCE_WORDS[q.convergence]],
      [
        "observed order p",
        q.observedOrder === null
          ? "n/a"
          : `${num(q.observedOrder, 4)} (formal ${q.formalOrder}; observed/formal ` +
            `${num(q.orderRatio, 4)})`,
      ],
      [
        "(f3−f2)/(f2−f1), 1 finest",
        q.differenceRatio === null
          ? "n/a"
          : `${num(q.differenceRatio, 4)} (the formal order predicts ` +
            `${num(q.expectedDifferenceRatio, 4)})`,
      ],
      [
        "GCI rule",
        g === null
          ? "no GCI for this convergence"
          : `Fs = ${g.safetyFactor}, p = ${num(g.order, 4)}: ${g.reason}` +
            (g.safetyFactor !== g.ruleSafetyFactor
              ? `; Fs given by --fs instead of ${g.ruleSafetyFactor}`
              : ""),
      ],
      [
        "extrapolated value",
        g === null ? "n/a" : `${num(g.extrapolated, 8)} (p = ${num(g.order, 4)})`,
      ],
      [
        "GCI of the finest grid",
        g === null || g.fine === null ? "n/a" : `${pct(g.fine)} (safety factor ${g.safetyFactor})`,
      ],
      ["GCI of the next grid", pct(g?.coarse ?? null)],
      ["relative change e_a21", pct(c?.relativeError ?? null)],
      ["error vs extrapolated e_ext21", pct(c?.extrapolatedRelativeError ?? null)],
      ["Celik GCI_fine21 (Fs 1.25)", pct(c?.gciFine ?? null)],
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
  out.push("");
  out.push(
    result.divergent.length === 0
      ? "Verdict: no quantity diverges"
      : `Verdict: DIVERGENT: ${result.divergent.map((d) => `"${d}"`).join(", ")} (exit code 1)`,
  );
  return out.join("\n");
}

function table(rows: string[][]): string[] {
  const widths = rows[0].map((_, c) => Math.max(...rows.map((r) => r[c].length)));
  return rows.map((r) => "  " + r.map((cell, c) => cell.padStart(widths[c])).join("  ").trimEnd());
}

const HELP_AFTER = `
The CSV has a header row, then one row per grid (any order): a column "cells" (cell count) or
"h" (representative spacing), then one column per quantity. Lines starting with # are ignored.

Safety factor and order of the GCI (the published rules; docs/refine.md):
  observed order within 10 % of --formal-order   Fs = 1.25 with the observed order
  otherwise, or oscillatory convergence          Fs = 3 with p = min(max(observed, 0.5), formal)
  only two grids have a value, or no order       Fs = 3 with the formal order
  divergent (|f1-f2| >= |f2-f3|, 1 finest)       no GCI; the command exits 1

Exit codes: 0 no quantity diverges (warnings allowed), 1 a quantity diverges, 2 bad input.

Example:
  gridproof refine --data study.csv --formal-order 2
`;

/** Registers `gridproof refine` on the program. */
export function registerRefineCommand(program: Command, setExitCode: SetExitCode): void {
  program
    .command("refine")
    .description(
      "Grid-convergence study of your own results on three or more grids: observed order " +
        "against the formal order, Richardson extrapolation, GCI with the safety factor the " +
        "published rules give, Celik et al. (2008) and least-squares estimates; exits 1 when a " +
        "quantity diverges",
    )
    .requiredOption(
      "--data <file>",
      'CSV with a "cells" (cell count) or "h" (spacing) column and one column per quantity',
    )
    .option(
      "--formal-order <p>",
      "formal order of accuracy of your scheme, e.g. 2 for central differences, 1 for " +
        "first-order upwind (required)",
    )
    .option("--fs <factor>", "GCI safety factor instead of the rule's (1.25 or 3)")
    .option("--dimension <d>", "space dimension D for h = (1/cells)^(1/D)", "2")
    .option("--json", "print the result as one JSON object")
    .addHelpText("after", HELP_AFTER)
    .action(
      async (
        opts: {
          data: string;
          formalOrder?: string;
          fs?: string;
          dimension: string;
          json?: boolean;
        },
      ) => {
        const dimension = Number(opts.dimension);
        if (!(Number.isInteger(dimension) && dimension >= 1 && dimension <= 3)) {
          throw new InputError(`must be 1, 2 or 3, got "${opts.dimension}"`, {
            where: "--dimension",
          });
        }
        if (opts.formalOrder === undefined) {
          throw new InputError(
            "missing: give the formal order of accuracy of your scheme (e.g. --formal-order 2 " +
              "for central differences, 1 for first-order upwind); the safety factor of the GCI " +
              "depends on how the observed order compares with it",
            { where: "--formal-order" },
          );
        }
        const formalOrder = Number(opts.formalOrder);
        if (!(formalOrder > 0 && Number.isFinite(formalOrder))) {
          throw new InputError(
            `must be a positive number (e.g. 2 for central differences), got "${opts.formalOrder}"`,
            { where: "--formal-order" },
          );
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
          formalOrder,
          safetyFactor,
        });
        console.log(opts.json ? JSON.stringify(result, null, 2) : formatRefine(result));
        // a divergent quantity is a failed study, like a failed verdict of `check`
        if (result.divergent.length > 0) setExitCode(1);
      },
    );
}
