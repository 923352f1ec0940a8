/**
 * The CSV report: tidy long format, one row per case × solver × grid × region × norm.
 *
 * @module
 */
import { stringify } from "csv-stringify/sync";
import { escapeCsvCell } from "./escape.ts";
import type { CampaignResult, NormSet, Region } from "../result/mod.ts";
import { caseIds, orderOf, pairs, pairwiseAt, solvesOf } from "./_shared.ts";

/** The columns of {@link renderCsv}, in order. */
export const CSV_COLUMNS = [
  "case",
  "solver",
  "nx",
  "ny",
  "h",
  "unknowns",
  "status",
  "region",
  "norm",
  "error",
  "observed_order",
  "fitted_order",
  "iterations",
  "converged",
  "average_factor",
  "seconds",
  "reason",
] as const;

const REGIONS: Region[] = ["all", "interior", "boundary"];
const NORMS: (keyof NormSet)[] = ["max", "l2", "l1"];

type Row = Record<(typeof CSV_COLUMNS)[number], string | number | null>;

/**
 * Renders the solves as tidy CSV (RFC 4180 quoting, header row, full-precision numbers, empty
 * cells for values that do not exist). A solve that failed still gets its rows, with an empty
 * error and its reason, so a table of the run shows every attempt. `observed_order` is the
 * pairwise order between this grid and the next coarser one; `fitted_order` is the study's
 * least-squares order of that region and norm (the same on every grid).
 *
 * @param result The campaign result.
 * @returns CSV text with a header row.
 *
 * @example
 * ```ts ignore
 * await Deno.writeTextFile("errors.csv", renderCsv(result));
 * ```
 */
export function renderCsv(result: CampaignResult): string {
  const rows: Row[] = [];
  for (const id of caseIds(result)) {
    for (const solver of pairs(result, id)) {
      const study = result.studies.find((s) => s.caseId === id && s.solver === solver);
      for (const s of solvesOf(result, id, solver)) {
        for (const region of REGIONS) {
          for (const norm of NORMS) {
            const record = orderOf(study, region, norm);
            rows.push({
              case: s.caseId,
              solver: s.solver,
              nx: s.nx,
              ny: s.ny,
              h: s.h,
              unknowns: s.unknowns,
              status: s.status,
              region,
              norm,
              error: s.errors?.[region]?.[norm] ?? null,
              observed_order: s.status === "ok" ? pairwiseAt(study, record, s.nx) : null,
              fitted_order: record?.fitted.order ?? null,
              iterations: s.iterations,
              converged: s.converged === null ? null : String(s.converged),
              average_factor: s.averageFactor,
              seconds: s.seconds,
              reason: s.reason ?? null,
            });
          }
        }
      }
    }
  }
  const safe = rows.map((row) =>
    Object.fromEntries(Object.entries(row).map(([k, v]) => [k, escapeCsvCell(v)]))
  );
  return stringify(safe, { header: true, columns: [...CSV_COLUMNS] });
}
