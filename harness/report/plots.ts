/**
 * The plots of the HTML report: Vega-Lite specifications built from the result, rendered to SVG
 * strings by Vega's headless view (renderer "none": no canvas, no DOM, no network).
 *
 * @module
 */
import * as vega from "vega";
import * as vl from "vega-lite";
import type { CampaignResult, NormSet } from "../result/mod.ts";
import { caseIds, pairs, solvesOf } from "./_shared.ts";

/** Which kind of plot, used in the HTML as `data-plot`. */
export type PlotKind = "errors" | "residuals" | "cost" | "error-map";

/** A plot to draw: its kind, what it shows and its Vega-Lite specification. */
export interface PlotSpec {
  kind: PlotKind;
  caseId: string;
  /** The solver, for per-solver plots. */
  solver?: string;
  /** One sentence saying what the plot shows (used as the figure caption). */
  caption: string;
  spec: vl.TopLevelSpec;
}

const NORM_LABEL: Record<keyof NormSet, string> = { max: "max", l2: "L2", l1: "L1" };
const WIDTH = 380;
const HEIGHT = 260;
/** Longest residual history drawn point by point; longer ones are thinned evenly. */
const MAX_POINTS = 400;

const CONFIG = {
  font: "system-ui, sans-serif",
  axis: { labelFontSize: 11, titleFontSize: 12, grid: true, gridOpacity: 0.35 },
  legend: { labelFontSize: 11, titleFontSize: 11, labelLimit: 220 },
  title: { fontSize: 13 },
} as const;

function logAxis(title: string) {
  // "~g" keeps log-axis ticks short (0.001, 1e-5) rather than printing every minor tick
  return { title, format: "~g", labelOverlap: "greedy" as const };
}

/**
 * The error plot of one case: each error norm on all nodes against h on log–log axes, one colour
 * per solver and one dash per norm, with a reference line of the expected order drawn through
 * the finest point of the first solver.
 */
export function errorPlot(result: CampaignResult, caseId: string): PlotSpec | undefined {
  const rows: Record<string, unknown>[] = [];
  for (const solver of pairs(result, caseId)) {
    for (const s of solvesOf(result, caseId, solver)) {
      if (s.status !== "ok" || !s.errors) continue;
      for (const norm of ["max", "l2", "l1"] as const) {
        const e = s.errors.all[norm];
        if (e > 0 && Number.isFinite(e)) {
          rows.push({ h: s.h, error: e, solver, norm: NORM_LABEL[norm] });
        }
      }
    }
  }
  if (rows.length === 0) return undefined;
  const study = result.studies.find((s) => s.caseId === caseId);
  const p = study?.expectedOrder ?? 2;
  const hs = rows.map((r) => r.h as number);
  const hMin = Math.min(...hs);
  const hMax = Math.max(...hs);
  // the slope line runs half a step below the lowest error at the finest h, so it never hides data
  const finest = rows.filter((r) => r.h === hMin).map((r) => r.error as number);
  const anchor = 0.5 * Math.min(...finest);
  const slopeLabel = `expected order ${Number(p.toPrecision(3))}`;
  const slope = [hMin, hMax].map((h) => ({
    h,
    error: anchor * Math.pow(h / hMin, p),
    solver: slopeLabel,
  }));
  return {
    kind: "errors",
    caseId,
    caption: "Error against grid spacing (log–log), every norm on all nodes; the dashed grey " +
      "line has the slope of the expected order",
    spec: {
      $schema: "https://vega.github.io/schema/vega-lite/v6.json",
      width: WIDTH,
      height: HEIGHT,
      config: CONFIG,
      layer: [
        {
          data: { values: slope },
          mark: { type: "line", strokeDash: [6, 4], color: "#777", strokeWidth: 1.5 },
          encoding: {
            x: { field: "h", type: "quantitative", scale: { type: "log", nice: false } },
            y: { field: "error", type: "quantitative", scale: { type: "log", nice: false } },
            color: { field: "solver", type: "nominal" },
          },
        },
        {
          data: { values: rows },
          mark: { type: "line", point: { filled: true, size: 45 }, strokeWidth: 2 },
          encoding: {
            x: {
              field: "h",
              type: "quantitative",
              scale: { type: "log", nice: false, padding: 12 },
              axis: logAxis("grid spacing h"),
            },
            y: {
              field: "error",
              type: "quantitative",
              scale: { type: "log", nice: false, padding: 12 },
              axis: logAxis("error"),
            },
            color: {
              field: "solver",
              type: "nominal",
              title: "solver",
              scale: {
                domain: [...new Set(rows.map((r) => r.solver as string)), slopeLabel],
                range: [...palette(new Set(rows.map((r) => r.solver)).size), "#777"],
              },
            },
            strokeDash: { field: "norm", type: "nominal", title: "norm" },
            shape: { field: "norm", type: "nominal", title: "norm" },
          },
        },
      ],
    },
  };
}

function palette(n: number): string[] {
  const base = ["#1f77b4", "#d62728", "#2ca02c", "#9467bd", "#ff7f0e", "#8c564b", "#e377c2"];
  return Array.from({ length: n }, (_, i) => base[i % base.length]);
}

/**
 * The residual plot of one case and solver: ‖r‖ against iteration on a log scale, one line per
 * grid. Histories longer than 400 points are thinned evenly (the first and last kept).
 */
export function residualPlot(
  result: CampaignResult,
  caseId: string,
  solver: string,
): PlotSpec | undefined {
  const rows: Record<string, unknown>[] = [];
  const grids: string[] = [];
  for (const s of solvesOf(result, caseId, solver)) {
    const history = s.residualHistory;
    if (history.length === 0) continue;
    const label = `${s.nx}×${s.ny}`;
    grids.push(label);
    const step = Math.max(1, Math.ceil(history.length / MAX_POINTS));
    for (let i = 0; i < history.length; i++) {
      if (i % step !== 0 && i !== history.length - 1) continue;
      const r = history[i];
      if (r > 0 && Number.isFinite(r)) rows.push({ iteration: i, residual: r, grid: label });
    }
  }
  if (rows.length === 0) return undefined;
  return {
    kind: "residuals",
    caseId,
    solver,
    caption: `Residual history of ${solver} on every grid (log scale)`,
    spec: {
      $schema: "https://vega.github.io/schema/vega-lite/v6.json",
      width: WIDTH,
      height: HEIGHT,
      config: CONFIG,
      data: { values: rows },
      mark: { type: "line", strokeWidth: 1.5 },
      encoding: {
        x: { field: "iteration", type: "quantitative", axis: { title: "iteration" } },
        y: {
          field: "residual",
          type: "quantitative",
          scale: { type: "log" },
          axis: logAxis("residual norm ‖r‖"),
        },
        color: {
          field: "grid",
          type: "ordinal",
          title: "grid",
          scale: { domain: grids, scheme: "viridis" },
        },
      },
    },
  };
}

/**
 * The cost plot of one case: iterations and solve time against the number of unknowns, side by
 * side on log–log axes, one colour per solver.
 */
export function costPlot(result: CampaignResult, caseId: string): PlotSpec | undefined {
  const rows: Record<string, unknown>[] = [];
  for (const solver of pairs(result, caseId)) {
    for (const s of solvesOf(result, caseId, solver)) {
      if (s.status !== "ok") continue;
      rows.push({
        unknowns: s.unknowns,
        iterations: s.iterations !== null && s.iterations > 0 ? s.iterations : null,
        seconds: s.seconds > 0 ? s.seconds : null,
        solver,
      });
    }
  }
  const iterationRows = rows.filter((r) => r.iterations !== null && (r.unknowns as number) > 0);
  const timeRows = rows.filter((r) => r.seconds !== null && (r.unknowns as number) > 0);
  if (iterationRows.length === 0 && timeRows.length === 0) return undefined;
  const solvers = [...new Set(rows.map((r) => r.solver as string))];
  const color = {
    field: "solver",
    type: "nominal" as const,
    title: "solver",
    scale: { domain: solvers, range: palette(solvers.length) },
  };
  const panel = (values: Record<string, unknown>[], field: string, title: string) => ({
    width: 280,
    height: 220,
    data: { values },
    mark: { type: "line" as const, point: true, strokeWidth: 2 },
    encoding: {
      x: {
        field: "unknowns",
        type: "quantitative" as const,
        scale: { type: "log" as const },
        axis: logAxis("unknowns"),
      },
      y: {
        field,
        type: "quantitative" as const,
        scale: { type: "log" as const },
        axis: logAxis(title),
      },
      color,
    },
  });
  return {
    kind: "cost",
    caseId,
    caption: "Iterations and solve time against the number of unknowns (log–log)",
    spec: {
      $schema: "https://vega.github.io/schema/vega-lite/v6.json",
      config: CONFIG,
      hconcat: [
        panel(iterationRows, "iterations", "iterations"),
        panel(timeRows, "seconds", "solve time (s)"),
      ],
    },
  };
}

/**
 * Where the error sits on the finest grid of a failing study: the block maxima of |u_h − u| as a
 * heat map with the sides named on the axes (only solves that kept a map: failing studies).
 */
export function errorMapPlot(
  result: CampaignResult,
  caseId: string,
  solver: string,
  which: "error" | "difference" = "error",
): PlotSpec | undefined {
  const field = which === "error" ? "errorMap" : "differenceMap";
  const s = solvesOf(result, caseId, solver).filter((r) => r[field]).sort((a, b) => b.nx - a.nx)[0];
  const map = s?.[field];
  if (!s || !map) return undefined;
  const { columns, rows, values } = map;
  const data = values.map((error, k) => ({
    column: k % columns,
    row: Math.floor(k / columns),
    error,
  }));
  const what = which === "error" ? "|u_h − u|" : "|u_h − u_ref|";
  return {
    kind: "error-map",
    caseId,
    solver,
    caption: which === "error"
      ? `${solver}: where the error sits on the ${s.nx}×${s.ny} grid — the largest |u_h − u| ` +
        `in each of ${columns} × ${rows} blocks, west to east and south to north`
      : `${solver}: where it differs from the reference solver's discrete solution on the ` +
        `${s.nx}×${s.ny} grid — the largest |u_h − u_ref| in each of ${columns} × ${rows} blocks`,
    spec: {
      $schema: "https://vega.github.io/schema/vega-lite/v6.json",
      config: CONFIG,
      width: WIDTH * 0.7,
      height: (WIDTH * 0.7 * rows) / columns,
      title: `${solver}: ${what} on ${s.nx}×${s.ny}`,
      data: { values: data },
      mark: { type: "rect" },
      encoding: {
        x: {
          field: "column",
          type: "ordinal",
          title: "west ← x → east",
          axis: { labels: false, ticks: false, grid: false },
        },
        y: {
          field: "row",
          type: "ordinal",
          sort: "descending",
          title: "south ← y → north",
          axis: { labels: false, ticks: false, grid: false },
        },
        color: {
          field: "error",
          type: "quantitative",
          title: what,
          scale: { scheme: "viridis" },
          legend: { format: ".1e" },
        },
        tooltip: [{ field: "error", type: "quantitative", format: ".2e" }],
      },
    },
  };
}

/** Every plot of the report, case by case, in the order the HTML shows them. */
export function reportPlots(result: CampaignResult): PlotSpec[] {
  const out: PlotSpec[] = [];
  for (const id of caseIds(result)) {
    const e = errorPlot(result, id);
    if (e) out.push(e);
    for (const solver of pairs(result, id)) {
      const r = residualPlot(result, id, solver);
      if (r) out.push(r);
    }
    const c = costPlot(result, id);
    if (c) out.push(c);
    for (const solver of pairs(result, id)) {
      for (const which of ["error", "difference"] as const) {
        const m = errorMapPlot(result, id, solver, which);
        if (m) out.push(m);
      }
    }
  }
  return out;
}

/** A Vega logger that collects messages instead of printing (library code never prints). */
function quietLogger(problems: string[]) {
  let level = 0;
  const logger = {
    level(value?: number) {
      if (value === undefined) return level;
      level = value;
      return logger;
    },
    error(...args: unknown[]) {
      problems.push(args.map(String).join(" "));
      return logger;
    },
    warn(...args: unknown[]) {
      void args;
      return logger;
    },
    info(...args: unknown[]) {
      void args;
      return logger;
    },
    debug(...args: unknown[]) {
      void args;
      return logger;
    },
  };
  return logger;
}

/**
 * Renders a Vega-Lite specification to an SVG string. Element ids inside the SVG (clip paths)
 * are renamed with `idPrefix` so several plots can sit in one HTML page without clashing.
 *
 * @param spec The Vega-Lite specification (inline data only).
 * @param idPrefix Prefix for the SVG's internal ids; distinct per plot in one page.
 * @returns The SVG markup.
 * @throws {Error} When Vega reports an error while rendering.
 */
export async function renderSvg(spec: vl.TopLevelSpec, idPrefix: string): Promise<string> {
  const problems: string[] = [];
  // deno-lint-ignore no-explicit-any
  const logger = quietLogger(problems) as any;
  const compiled = vl.compile(spec, { logger }).spec;
  const view = new vega.View(vega.parse(compiled), { renderer: "none", logger });
  try {
    const svg = await view.toSVG();
    if (problems.length > 0) {
      throw new Error(`could not draw a plot: ${problems.join("; ")}`);
    }
    const ids = new Map<string, string>();
    for (const m of svg.matchAll(/\sid="([^"]+)"/g)) {
      if (!ids.has(m[1])) ids.set(m[1], `${idPrefix}-${ids.size + 1}`);
    }
    return svg.replace(
      /(\sid="|url\(#|href="#)([^")]+)/g,
      (all, head: string, id: string) => ids.has(id) ? head + ids.get(id) : all,
    );
  } finally {
    view.finalize();
  }
}
