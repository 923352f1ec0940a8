/**
 * The plots of the HTML report: Vega-Lite specifications built from the result, rendered to SVG
 * strings by Vega's headless view (renderer "none": no canvas, no DOM, no network).
 *
 * @module
 */
// Vega and Vega-Lite take about 0.3 s to load: loaded on the first plot drawn, so that every
// command that draws none (check without an HTML report, the other formats) starts without them
import type * as vl from "vega-lite";
import type { CampaignResult, NormSet } from "../result/mod.ts";
import { caseIds, pairs, solvesOf } from "./_shared.ts";

/** Which kind of plot, used in the HTML as `data-plot`. */
export type PlotKind = "errors" | "residuals" | "cost" | "error-map" | "places";

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
/** The error plot spans the page's width: it is the plot a reviewer reads first. */
const WIDE = 760;
const HEIGHT = 260;
/** Longest residual history drawn point by point; longer ones are thinned evenly. */
const MAX_POINTS = 400;

const CONFIG = {
  font: "system-ui, sans-serif",
  axis: { labelFontSize: 11, titleFontSize: 12, grid: true, gridOpacity: 0.35 },
  legend: { labelFontSize: 11, titleFontSize: 11, labelLimit: 220, titleLimit: 320 },
  title: { fontSize: 13 },
} as const;

function logAxis(title: string) {
  // "~g" keeps log-axis ticks short (0.001, 1e-5) rather than printing every minor tick
  return { title, format: "~g", labelOverlap: "greedy" as const };
}

/** Ticks of a log axis of errors or residuals: one format for every label (1e-6, 1e-7). */
const POWER_FORMAT = ".0e";

/** A readable grid spacing for a tick: three significant figures, no trailing zeros. */
const SPACING_FORMAT = ".3~g";

/**
 * The error plot of one case: each error norm on all nodes against h on log–log axes, one colour
 * per solver and one line style and mark per norm, with slope guides for the expected order and
 * for order 1 drawn from half the lowest error at the finest h (labelled at their coarse end, so
 * the legend holds only solvers and norms). The h axis has a tick at every grid spacing used.
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
  const hs = [...new Set(rows.map((r) => r.h as number))].sort((a, b) => a - b);
  const hMin = hs[0];
  const hMax = hs[hs.length - 1];
  // the guides start half a step below the lowest error at the finest h, so they hide no data
  const finest = rows.filter((r) => r.h === hMin).map((r) => r.error as number);
  const anchor = 0.5 * Math.min(...finest);
  const orders = p === 1 ? [1] : [p, 1];
  const guideLabel = (q: number) =>
    `slope ${Number(q.toPrecision(3))}${q === p ? " (expected)" : ""}`;
  const guides = orders.flatMap((q) =>
    [hMin, hMax].map((h) => ({ h, error: anchor * Math.pow(h / hMin, q), guide: guideLabel(q) }))
  );
  const solvers = [...new Set(rows.map((r) => r.solver as string))];
  const hidden = coinciding(rows, solvers);
  const x = {
    field: "h",
    type: "quantitative" as const,
    scale: { type: "log" as const, nice: false, padding: 12 },
    axis: { title: "grid spacing h", values: hs, format: SPACING_FORMAT, labelOverlap: true },
  };
  const y = {
    field: "error",
    type: "quantitative" as const,
    scale: { type: "log" as const, nice: false, padding: 12 },
    axis: { title: "error", format: POWER_FORMAT, labelOverlap: "greedy" as const },
  };
  return {
    kind: "errors",
    caseId,
    caption: "Error against grid spacing (log–log), every norm on all nodes: colour is the " +
      "solver, line style and mark the norm; the grey dashed guides have the slope of the " +
      `expected order (${Number(p.toPrecision(3))})${p === 1 ? "" : " and of order 1"}, and ` +
      "the h axis has a tick at every grid spacing used" +
      (hidden.length > 0 ? `. ${hidden.join("; ")}` : ""),
    spec: {
      $schema: "https://vega.github.io/schema/vega-lite/v6.json",
      width: WIDE,
      height: HEIGHT,
      // the legend below the plot leaves the right margin to the guides' labels
      config: {
        ...CONFIG,
        legend: { ...CONFIG.legend, orient: "bottom", direction: "horizontal" },
      },
      layer: [
        {
          data: { values: guides },
          mark: { type: "line", strokeDash: [6, 4], color: "#777", strokeWidth: 1.5 },
          encoding: { x, y, detail: { field: "guide", type: "nominal" } },
        },
        {
          data: { values: rows },
          mark: { type: "line", point: { filled: true, size: 45 }, strokeWidth: 2 },
          encoding: {
            x,
            y,
            color: {
              field: "solver",
              type: "nominal",
              title: "solver (colour)",
              scale: { domain: solvers, range: palette(solvers.length) },
            },
            strokeDash: { field: "norm", type: "nominal", title: "norm (line and mark)" },
            shape: { field: "norm", type: "nominal", title: "norm (line and mark)" },
          },
        },
        {
          data: { values: guides.filter((g) => g.h === hMax) },
          mark: { type: "text", align: "left", dx: 4, fontSize: 11, color: "#555" },
          encoding: { x, y, text: { field: "guide", type: "nominal" } },
        },
      ],
    },
  };
}

/**
 * Where a failing study's error sits as the grid is refined: the max-norm error of each place
 * (the band along each side, the corners, the interior) against h, log–log. The place the
 * verdict blames is drawn thick (or, when none is blamed, the place with the largest error), so a
 * boundary band that converges more slowly than the interior stands out.
 */
export function placesPlot(
  result: CampaignResult,
  caseId: string,
  solver: string,
): PlotSpec | undefined {
  const study = result.studies.find((s) => s.caseId === caseId && s.solver === solver);
  const failing = study?.verdicts.find((v) =>
    v.status === "fail" && (v.criterion === "order" || v.criterion === "exactness")
  );
  if (!study?.places || study.places.length === 0 || !failing) return undefined;
  const location = failing.details?.location as
    | { blamed?: string[]; largest?: string }
    | undefined;
  const blamed = location?.blamed?.length ? location.blamed : [];
  const marked = blamed.length > 0 ? blamed : location?.largest ? [location.largest] : [];
  const rows = study.places.flatMap((p) =>
    p.errors.map((error, k) => ({
      h: study.h[k],
      error,
      place: `${p.place} (order ${p.order === null ? "—" : p.order.toFixed(2)})`,
      marked: marked.includes(p.place) ? "yes" : "no",
    })).filter((r) => r.error !== null && r.error > 0 && Number.isFinite(r.error))
  );
  if (rows.length === 0) return undefined;
  const hs = [...new Set(rows.map((r) => r.h))].sort((a, b) => a - b);
  const why = blamed.length > 0 ? "where the verdict locates the defect" : "the largest error";
  return {
    kind: "places",
    caseId,
    solver,
    caption: `${solver}: max-norm error of each place against h (log–log) — the band along each ` +
      `side, the corners and the interior, with each place's order on the finest pair; the ` +
      `thick line is ${why} (${marked.join(", ") || "none"})`,
    spec: {
      $schema: "https://vega.github.io/schema/vega-lite/v6.json",
      width: WIDTH,
      height: HEIGHT,
      config: CONFIG,
      title: `${solver}: error by place`,
      data: { values: rows },
      mark: { type: "line", point: { filled: true, size: 30 } },
      encoding: {
        x: {
          field: "h",
          type: "quantitative",
          scale: { type: "log", nice: false, padding: 12 },
          axis: { title: "grid spacing h", values: hs, format: SPACING_FORMAT },
        },
        y: {
          field: "error",
          type: "quantitative",
          scale: { type: "log", nice: false, padding: 12 },
          axis: { title: "max error in the place", format: POWER_FORMAT },
        },
        color: { field: "place", type: "nominal", title: "place (order, finest pair)" },
        strokeWidth: {
          field: "marked",
          type: "nominal",
          title: `thick: ${why}`,
          scale: { domain: ["yes", "no"], range: [3.5, 1.2] },
          legend: { symbolType: "stroke", symbolStrokeColor: "#333" },
        },
      },
    },
  };
}

/**
 * Solvers whose errors equal an earlier solver's on every grid and norm (to 0.1 %), so their lines
 * lie under that solver's: "reference lies under head-2.3 (the same errors to 0.1 %)".
 */
function coinciding(rows: Record<string, unknown>[], solvers: string[]): string[] {
  const key = (r: Record<string, unknown>) => `${r.h}\u0000${r.norm}`;
  const errors = new Map(solvers.map((s) => [s, new Map<string, number>()]));
  for (const r of rows) errors.get(r.solver as string)!.set(key(r), r.error as number);
  const out: string[] = [];
  for (const [k, later] of solvers.entries()) {
    const mine = errors.get(later)!;
    const under = solvers.slice(0, k).find((earlier) => {
      const theirs = errors.get(earlier)!;
      return theirs.size === mine.size &&
        [...mine].every(([at, e]) => {
          const t = theirs.get(at);
          return t !== undefined && Math.abs(t - e) <= 1e-3 * Math.max(t, e);
        });
    });
    // the later solver is drawn on top, so the earlier one is the hidden one
    if (under) out.push(`${under}'s lines lie under ${later}'s (the same errors to 0.1 %)`);
  }
  return out;
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
          axis: { title: "residual norm ‖r‖", format: POWER_FORMAT, labelOverlap: "greedy" },
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
      const p = placesPlot(result, id, solver);
      if (p) out.push(p);
    }
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
  const [vega, vegaLite] = await Promise.all([import("vega"), import("vega-lite")]);
  const compiled = vegaLite.compile(spec, { logger }).spec;
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
