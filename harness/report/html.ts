/**
 * The HTML report: one self-contained file with inline SVG plots, no scripts and no network
 * fetches (a Content-Security-Policy forbids both, as a second line of defence behind escaping).
 *
 * @module
 */
import type {
  CampaignResult,
  CaseInfo,
  SolveRecord,
  StudyRecord,
  Verdict,
  VerdictStatus,
} from "../result/mod.ts";
import {
  allVerdicts,
  bySeverity,
  caseIds,
  caseInfo,
  CAUTION,
  commandLine,
  meanRemovedNote,
  num,
  order,
  pairs,
  percent,
  seconds,
  solvesOf,
  STATUS_WORD,
  worst,
} from "./_shared.ts";
import { escapeHtml as esc } from "./escape.ts";
import { buildRows, reportedLine, shortDigest } from "./builds.ts";
import {
  criteriaAt,
  type Finding,
  findingsOf,
  measuresPhrase,
  pairsPhrase,
  type WarningGroup,
} from "./findings.ts";
import { type PlotSpec, renderSvg, reportPlots } from "./plots.ts";
import { formulaMathml, texMathml } from "./formulas.ts";
import { SUPRACONVERGENCE, truncationReading } from "./truncation.ts";

const STYLE = `
:root { color-scheme: light; --fail: #b3261e; --undecided: #6a1b9a; --warn: #8a5a00; --pass: #1e6b34; --na: #666; }
body { font: 15px/1.5 system-ui, sans-serif; margin: 0 auto; max-width: 1320px; padding: 1.5rem;
  color: #1b1b1b; background: #fff; }
h1 { font-size: 1.6rem; margin-bottom: 0.2rem; }
h2 { font-size: 1.3rem; border-bottom: 2px solid #ddd; padding-bottom: 0.2rem; margin-top: 2.2rem; }
h3 { font-size: 1.05rem; margin-top: 1.4rem; }
table { border-collapse: collapse; margin: 0.5rem 0 1rem; font-size: 0.88rem; max-width: 100%; }
table.full { width: 100%; }
th, td { border: 1px solid #d5d5d5; padding: 0.2rem 0.5rem; text-align: left; vertical-align: top;
  overflow-wrap: break-word; }
th { background: #f3f3f3; font-weight: 600; }
td.n { text-align: right; font-variant-numeric: tabular-nums; white-space: nowrap; }
td.name { white-space: nowrap; }
code, pre { font: 0.85rem/1.4 ui-monospace, monospace; overflow-wrap: anywhere; }
pre { background: #f6f6f6; padding: 0.5rem; white-space: pre-wrap; }
.status { font-weight: 700; padding: 0 0.35rem; border-radius: 3px; color: #fff; font-size: 0.8rem;
  white-space: nowrap; print-color-adjust: exact; -webkit-print-color-adjust: exact; }
.status.fail { background: var(--fail); }
.status.inconclusive { background: var(--undecided); }
.status.warn { color: var(--warn); background: #fff; border: 1px solid var(--warn); padding: 0 0.3rem; }
.status.pass { color: var(--pass); background: #fff; border: 1px solid #9cc5a8; padding: 0 0.3rem; }
.status.not-applicable { color: var(--na); background: #fff; border: 1px solid #ccc; }
.caution { border-left: 4px solid var(--warn); background: #fff8e6; padding: 0.5rem 0.8rem; }
.flag { color: var(--fail); font-weight: 600; }
.plots { display: flex; flex-wrap: wrap; gap: 1rem; }
figure.plot { margin: 0; border: 1px solid #e3e3e3; padding: 0.4rem; max-width: 100%; }
figure.plot.wide { flex-basis: 100%; }
figure.plot svg { max-width: 100%; height: auto; }
figure.plot figcaption { font-size: 0.8rem; color: #444; max-width: 640px; }
ul.verdicts { list-style: none; padding-left: 0; } ul.verdicts li { margin: 0.25rem 0; }
ul.reasons { margin: 0.2rem 0 0.6rem; padding-left: 1.2rem; font-size: 0.9rem; }
.muted { color: #555; }
.formula math { font-size: 1.1em; margin-right: 0.25em; }
dl.kv { display: grid; grid-template-columns: max-content 1fr; gap: 0 0.6rem; margin: 0; }
dl.kv dt { color: #555; } dl.kv dd { margin: 0; overflow-wrap: anywhere; }
@media print, (max-width: 60rem) {
  table.stack thead { display: none; }
  table.stack, table.stack tbody { display: block; width: 100%; }
  table.stack tr { display: grid; grid-template-columns: repeat(auto-fill, minmax(13rem, 1fr));
    border: 1px solid #ccc; margin-bottom: 0.4rem; break-inside: avoid; }
  table.stack td { display: block; border: none; border-bottom: 1px dotted #ddd; text-align: left;
    white-space: normal; }
  table.stack td::before { content: attr(data-label) ": "; font-weight: 600; color: #333; }
}
@media print {
  @page { size: A4; margin: 12mm; }
  body { font-size: 10pt; max-width: none; padding: 0; }
  table { font-size: 8.5pt; }
  h2 { break-after: avoid; } h3 { break-after: avoid; }
  tr, figure.plot, li { break-inside: avoid; }
  .plots { gap: 0.4rem; }
  figure.plot { width: 48%; padding: 0.2rem; }
  figure.plot.wide { width: 100%; }
  figure.plot svg { width: 100%; }
  a { color: inherit; text-decoration: none; }
}
`;

function badge(status: VerdictStatus): string {
  return `<span class="status ${status}">${STATUS_WORD[status]}</span>`;
}

function td(text: string, numeric = false): string {
  return numeric ? `<td class="n">${esc(text)}</td>` : `<td>${esc(text)}</td>`;
}

/** Max error per place on each grid and the finest pairwise order (where a defect sits). */
function placeTable(study: StudyRecord): string {
  const places = study.places ?? [];
  if (places.length === 0) return "";
  return `<table><thead><tr><th>place</th>${
    study.grids.map((n) => `<th>max error, ${esc(String(n))}</th>`).join("")
  }<th>order, finest pair</th></tr></thead><tbody>${
    places.map((p) =>
      `<tr><td>${esc(p.place)}</td>${p.errors.map((e) => `<td>${num(e, 2)}</td>`).join("")}<td>${
        order(p.order)
      }</td></tr>`
    ).join("")
  }</tbody></table>`;
}

/** Grids added to decide, and the cross-case diagnosis. */
function studyNotes(study: StudyRecord): string {
  const notes: string[] = [];
  if (study.added) notes.push(`Grids added to decide: ${study.added.reason}.`);
  if (study.isolation) notes.push(`Isolation: ${study.isolation.finding}.`);
  if (study.diagnosis) notes.push(`Diagnosis: ${study.diagnosis}.`);
  const truncation = truncationReading(study);
  if (truncation) {
    notes.push(`The ${truncation.line}.`);
    if (truncation.lower) notes.push(SUPRACONVERGENCE);
  }
  return notes.map((n) => `<p class="muted">${esc(n)}</p>`).join("");
}

function verdictList(verdicts: Verdict[], withPair: boolean): string {
  if (verdicts.length === 0) return `<p class="muted">No verdicts.</p>`;
  const items = bySeverity(verdicts).map((v) =>
    `<li>${badge(v.status)} ${withPair ? `${esc(v.caseId)} · ${esc(v.solver)} · ` : ""}` +
    `<strong>${esc(v.criterion)}</strong>: ${esc(v.reason)}</li>`
  );
  return `<ul class="verdicts">${items.join("")}</ul>`;
}

/** An expression typeset as MathML, or as code when it cannot be (the reason in a note). */
function formulaCell(text: string): string {
  const mathml = formulaMathml(text);
  return mathml === undefined
    ? `<code>${esc(text)}</code> <span class="muted">(shown as text: a term of it is too long ` +
      `to typeset on one line, or it is not an expression)</span>`
    : `<span class="formula">${mathml}</span>`;
}

function formulas(info: CaseInfo): string {
  const f = info.formulas;
  const operator = texMathml(
    "a\\,u_{xx} + b\\,u_x + c\\,u_{yy} + d\\,u_y + e\\,u = f",
    "a·u_xx + b·u_x + c·u_yy + d·u_y + e·u = f",
  );
  const rows: [string, string][] = [
    ["operator", `<span class="formula">${operator}</span>`],
    ["a", formulaCell(f.a)],
    ["b", formulaCell(f.b)],
    ["c", formulaCell(f.c)],
    ["d", formulaCell(f.d)],
    ["e", formulaCell(f.e)],
    ["exact solution u", formulaCell(f.exact)],
    ["source f", formulaCell(f.source)],
    ...Object.entries(f.boundary).map(([side, text]): [string, string] => [
      `boundary ${side} (${info.boundaryKinds[side] ?? "?"})`,
      formulaCell(text),
    ]),
  ];
  const d = info.domain;
  return `<table class="full formulas"><tbody>${
    rows.map(([k, v]) => `<tr><th scope="row">${esc(k)}</th><td>${v}</td></tr>`).join("")
  }<tr><th scope="row">domain</th><td>[${num(d.x0)}, ${num(d.x1)}] × [${num(d.y0)}, ${
    num(d.y1)
  }]</td></tr>${
    Object.keys(info.parameters).length > 0
      ? `<tr><th scope="row">parameters</th><td>${
        esc(Object.entries(info.parameters).map(([k, v]) => `${k} = ${v}`).join(", "))
      }</td></tr>`
      : ""
  }</tbody></table><p class="muted">Formulas typeset from the case's expression text (MathML ` +
    `made by MathJax when the report was written); each keeps its text as alternative text.</p>`;
}

function solveTable(solves: SolveRecord[]): string {
  const head = [
    "grid",
    "h",
    "unknowns",
    "max error",
    "L2 error",
    "iterations",
    "conv. factor",
    "time",
    "status",
  ];
  const rows = solves.map((s) =>
    `<tr>${td(`${s.nx}×${s.ny}`)}${td(num(s.h), true)}${td(String(s.unknowns), true)}${
      td(num(s.errors?.all.max), true)
    }${td(num(s.errors?.all.l2), true)}${
      td(s.iterations === null ? "—" : String(s.iterations), true)
    }${td(num(s.averageFactor, 3), true)}${td(seconds(s.seconds), true)}${
      td(s.status === "ok" ? "ok" : `${s.status}: ${s.reason ?? "no reason given"}`)
    }</tr>`
  );
  const tails = solves.filter((s) => s.stderrTail).map((s) =>
    `<details><summary>stderr of the ${s.nx}×${s.ny} solve</summary><pre>${
      esc(s.stderrTail!)
    }</pre></details>`
  );
  return `<table><thead><tr>${head.map((h) => `<th>${h}</th>`).join("")}</tr></thead><tbody>${
    rows.join("")
  }</tbody></table>${tails.join("")}`;
}

function orderTable(study: StudyRecord): string {
  const pairsHead = study.grids.slice(1).map((n, i) => `${study.grids[i]}→${n}`);
  const rows = study.orders.map((o) =>
    `<tr>${td(o.region)}${td(o.norm === "l2" ? "L2" : o.norm === "l1" ? "L1" : "max")}${
      o.pairwise.map((p) => td(order(p), true)).join("")
    }${td(order(o.fitted.order), true)}${
      td(`[${order(o.fitted.low)}, ${order(o.fitted.high)}]`, true)
    }${td(String(o.fitted.points), true)}${td(o.asymptotic ? "yes" : "no")}</tr>`
  );
  return `<table><thead><tr><th>region</th><th>norm</th>${
    pairsHead.map((p) => `<th>order ${esc(p)}</th>`).join("")
  }<th>fitted order</th><th>interval</th><th>grids fitted</th><th>settled</th></tr></thead><tbody>${
    rows.join("")
  }</tbody></table>`;
}

/** A cell of a {@link stackTable}: text, numeric or not. */
type Cell = { text: string; numeric?: boolean; html?: string; name?: boolean };

/**
 * A table whose rows become blocks of "label: value" pairs in print and on narrow screens (class
 * `stack`), so no column is ever cut off; each cell carries its column header as `data-label`.
 */
function stackTable(head: string[], rows: Cell[][], className = "stack full"): string {
  return `<table class="${className}"><thead><tr>${
    head.map((h) => `<th>${esc(h)}</th>`).join("")
  }</tr></thead><tbody>${
    rows.map((row) =>
      `<tr>${
        row.map((c, k) =>
          `<td${c.numeric ? ` class="n"` : c.name ? ` class="name"` : ""} data-label="${
            esc(head[k] ?? "")
          }">${c.html ?? esc(c.text)}</td>`
        ).join("")
      }</tr>`
    ).join("")
  }</tbody></table>`;
}

/** Column headers of the GCI audit, the deciding column right after the quantity. */
export const GCI_HEADERS = [
  "solver",
  "quantity",
  "exact value inside GCI band",
  "values, coarsest first",
  "exact",
  "observed order",
  "extrapolated",
  "GCI fine",
  "GCI coarse",
  "safety factor",
  "GCI ratio (≈1 in range)",
  "GCI (Celik et al.)",
  "convergence",
  "least-squares uncertainty",
] as const;

function gciTable(studies: StudyRecord[]): string {
  const rows: Cell[][] = [];
  let audited = 0;
  let covered = 0;
  for (const study of studies) {
    for (const q of study.quantities) {
      if (q.covered !== null) {
        audited++;
        if (q.covered) covered++;
      }
      rows.push([
        { text: study.solver },
        { text: q.label || q.name },
        {
          text: "",
          html: q.covered === null ? "—" : q.covered ? "yes" : `<span class="flag">NO</span>`,
        },
        { text: q.values.map((v) => num(v, 6)).join(", ") },
        { text: num(q.exact, 6), numeric: true },
        { text: order(q.order), numeric: true },
        { text: num(q.extrapolated, 6), numeric: true },
        { text: percent(q.gciFine), numeric: true },
        { text: percent(q.gciCoarse), numeric: true },
        { text: num(q.safetyFactor, 3), numeric: true },
        { text: num(q.asymptoticRatio, 4), numeric: true },
        { text: percent(q.celik?.gciFine), numeric: true },
        { text: q.celik?.convergence ?? "—" },
        { text: num(q.leastSquares?.uncertainty), numeric: true },
      ]);
    }
  }
  if (rows.length === 0) return `<p class="muted">No quantities of interest were studied.</p>`;
  const coverage = studies
    .filter((s) => s.coverage !== null)
    .map((s) => `${esc(s.solver)} ${percent(s.coverage)}`);
  return `${stackTable([...GCI_HEADERS], rows, "stack full gci")}` +
    `<p><strong>Coverage audit:</strong> the finest-grid GCI band contained the ` +
    `true error in ${covered} of ${audited} quantities` +
    (coverage.length ? ` (coverage per solver: ${coverage.join(", ")})` : "") +
    `. A band that misses the exact value means the safety factor was not enough.</p>`;
}

/** The builds under test: what each solver reported, its command and the digests of its files. */
function buildsSection(result: CampaignResult): string {
  const rows = buildRows(result).map((row): Cell[] => [
    { text: row.solver, name: true },
    {
      text: "",
      html: esc(reportedLine(row)) +
        (row.changed ? ` <span class="flag">the build changed during the campaign</span>` : ""),
    },
    { text: "", html: `<code>${esc(row.command)}</code>` },
    {
      text: "",
      html: [
        ...(row.solverFile ? [`solver file ${esc(shortDigest(row.solverFile))}`] : []),
        ...row.files.map((f) => esc(shortDigest(f))),
        ...row.unread.map((u) => `<span class="flag">not read: ${esc(u)}</span>`),
      ].join("<br>") || (row.kind === "reference" ? "part of gridproof" : "—"),
    },
  ]);
  return `<section id="builds"><h2>Builds under test</h2>${
    stackTable(
      ["solver", "reported by the solver (name, version, build)", "command", "files (SHA-256)"],
      rows,
    )
  }</section>`;
}

/** A reason cut at a word boundary for a summary line (the full text is in the case section). */
function gist(text: string, max = 260): string {
  if ([...text].length <= max) return text;
  const cut = [...text].slice(0, max).join("");
  const space = cut.lastIndexOf(" ");
  return `${cut.slice(0, space > max / 2 ? space : max)} …`;
}

function findingRows(items: Finding[]): string {
  const rows = items.map((f): Cell[] => [
    {
      text: "",
      html: `<a href="#case-${esc(encodeURIComponent(f.caseId))}">${esc(f.caseId)}</a>`,
      name: true,
    },
    { text: f.solver, name: true },
    {
      text: "",
      html: `<strong>${esc(f.criterion)}</strong>${
        f.measures.length > 0
          ? `<br><span class="muted">${esc(measuresPhrase(f.measures))}</span>`
          : ""
      }`,
    },
    { text: gist(f.isolation ? `Isolated: ${f.isolation}` : f.reason) },
  ]);
  return stackTable(["case", "solver", "criterion", "what was found"], rows, "stack full found");
}

function warningList(groups: WarningGroup[]): string {
  return `<ul class="verdicts">${
    groups.map((g) =>
      `<li>${badge("warn")} <strong>${esc(g.criterion)}</strong>: ${g.count} ` +
      `warning${g.count === 1 ? "" : "s"} in ${g.cases.length} case${
        g.cases.length === 1 ? "" : "s"
      }<ul class="reasons">${
        g.reasons.map((r) =>
          `<li>${esc(r.reason)} <span class="muted">— ${esc(pairsPhrase(r.pairs))}</span></li>`
        ).join("")
      }</ul></li>`
    ).join("")
  }</ul>`;
}

/** Failures by defect, then undecided studies, then warnings by criterion. */
function findingsSection(result: CampaignResult): string {
  const found = findingsOf(result);
  const parts: string[] = [];
  const verdictCount = (items: Finding[]) => items.reduce((n, f) => n + f.verdicts.length, 0);
  if (found.failures.length > 0) {
    parts.push(
      `<h3>${badge("fail")} ${found.failures.length} failure${
        found.failures.length === 1 ? "" : "s"
      } <span class="muted">(${verdictCount(found.failures)} failing verdicts, each ` +
        `case × solver × criterion once)</span></h3>${findingRows(found.failures)}`,
    );
  }
  if (found.undecided.length > 0) {
    parts.push(
      `<h3>${badge("inconclusive")} ${found.undecided.length} undecided</h3>` +
        `<p class="muted">The evidence does not decide: refine further or fix what blocks it.</p>` +
        findingRows(found.undecided),
    );
  }
  if (found.warnings.length > 0) {
    const total = found.warnings.reduce((n, g) => n + g.count, 0);
    parts.push(
      `<h3>${total} warning${total === 1 ? "" : "s"} <span class="muted">(advice; they never ` +
        `change the exit code)</span></h3>${warningList(found.warnings)}`,
    );
  }
  if (parts.length === 0) parts.push(`<p>Every verdict passed.</p>`);
  return `<section id="found"><h2>What it found</h2>${parts.join("")}</section>`;
}

function figure(plot: PlotSpec, svg: string): string {
  return `<figure class="plot${
    plot.kind === "errors" ? " wide" : ""
  }" data-plot="${plot.kind}" data-case="${esc(plot.caseId)}"${
    plot.solver === undefined ? "" : ` data-solver="${esc(plot.solver)}"`
  }>${svg}<figcaption>${esc(plot.caption)}</figcaption></figure>`;
}

function overview(result: CampaignResult): string {
  // One row per case, one column per solver: the worst verdict and the failing criteria.
  const solvers = result.solvers.map((s) => s.name);
  const rows: string[] = [];
  for (const id of caseIds(result)) {
    const cells = solvers.map((solver) => {
      const study = result.studies.find((s) => s.caseId === id && s.solver === solver);
      const verdicts = [
        ...(study?.verdicts ?? []),
        ...result.baselineVerdicts.filter((v) => v.caseId === id && v.solver === solver),
      ];
      if (verdicts.length === 0) return `<td class="muted">—</td>`;
      const status = worst(verdicts);
      return `<td>${badge(status)} ${esc(criteriaAt(verdicts, status).join(", "))}</td>`;
    });
    rows.push(
      `<tr><td><a href="#case-${esc(encodeURIComponent(id))}">${esc(id)}</a></td>${
        cells.join("")
      }</tr>`,
    );
  }
  return `<table><thead><tr><th>case</th>${
    solvers.map((s) => `<th>${esc(s)}</th>`).join("")
  }</tr></thead><tbody>${rows.join("")}</tbody></table>`;
}

/** A description record as a list of "key: value" lines (nested records flattened with dots). */
function keyValues(record: Record<string, unknown>): string {
  const lines: [string, string][] = [];
  const walk = (prefix: string, value: unknown) => {
    if (value !== null && typeof value === "object" && !Array.isArray(value)) {
      const entries = Object.entries(value as Record<string, unknown>);
      if (entries.length === 0) lines.push([prefix, "(none)"]);
      for (const [k, v] of entries) walk(prefix ? `${prefix}.${k}` : k, v);
    } else {
      lines.push([prefix, Array.isArray(value) ? value.join(", ") : String(value)]);
    }
  };
  walk("", record);
  return `<dl class="kv">${
    lines.map(([k, v]) => `<dt>${esc(k)}</dt><dd>${esc(v)}</dd>`).join("")
  }</dl>`;
}

function environment(result: CampaignResult): string {
  const c = result.configuration;
  const e = result.environment;
  const rows: [string, string][] = [
    ["tool", `${result.tool.name} ${result.tool.version}`],
    ["date", result.createdAt],
    ["machine", `${e.hostname} (${e.os}, ${e.arch}, ${e.cpus} CPUs)`],
    ["Deno", e.deno],
    ["cases", c.cases.join(", ")],
    ["grids (nx)", c.grids.join(", ")],
    ["parallel jobs", String(c.jobs)],
    ["order tolerance", String(c.orderTolerance)],
    ["grid independence required", c.requireGridIndependence ? "yes" : "no"],
    ["baseline", c.baseline ?? "none"],
  ];
  const solvers = result.solvers.map((s) =>
    `<tr>${td(s.name)}${td(s.kind)}<td><code>${
      esc(commandLine(s.command) || "(in-process)")
    }</code></td>${td(s.layout)}${td(s.scheme)}<td>${
      s.description ? keyValues(s.description) : "—"
    }</td></tr>`
  );
  return `<table><tbody>${
    rows.map(([k, v]) => `<tr><th scope="row">${esc(k)}</th>${td(v)}</tr>`).join("")
  }</tbody></table><h3>Solvers</h3><table><thead><tr><th>name</th><th>kind</th><th>command</th>` +
    `<th>layout</th><th>scheme</th><th>description</th></tr></thead><tbody>${
      solvers.join("")
    }</tbody></table>`;
}

/**
 * Renders the result as one self-contained HTML page: overview, caution, then per case the plots
 * (errors against h with the expected slope, residual histories, iterations and time against
 * unknowns), the formulas, solve and order tables, the GCI table with its coverage audit and the
 * verdicts; then the baseline verdicts and the configuration and environment. Every text taken
 * from the result is escaped; the page contains no script.
 *
 * @param result The campaign result.
 * @returns The HTML document.
 * @throws {Error} When Vega cannot draw a plot.
 *
 * @example
 * ```ts ignore
 * await Deno.writeTextFile("report.html", await renderHtml(result));
 * ```
 */
export async function renderHtml(result: CampaignResult): Promise<string> {
  const plots = reportPlots(result);
  const svgs = new Map<PlotSpec, string>();
  for (const [i, plot] of plots.entries()) svgs.set(plot, await renderSvg(plot.spec, `gp${i}`));
  const all = allVerdicts(result);
  const count = (s: VerdictStatus) => all.filter((v) => v.status === s).length;
  const sections: string[] = [];
  for (const id of caseIds(result)) {
    const info = caseInfo(result, id);
    const studies = result.studies.filter((s) => s.caseId === id);
    const figures = plots.filter((p) => p.caseId === id).map((p) => figure(p, svgs.get(p)!));
    const perSolver = pairs(result, id).map((solver) => {
      const study = studies.find((s) => s.solver === solver);
      return `<h3>${esc(solver)}${
        study ? ` <span class="muted">(expected order ${num(study.expectedOrder)})</span>` : ""
      }</h3>${solveTable(solvesOf(result, id, solver))}${
        meanRemovedNote(solvesOf(result, id, solver)) === undefined
          ? ""
          : `<p class="muted">Mean removed: ${
            esc(meanRemovedNote(solvesOf(result, id, solver))!)
          }.</p>`
      }${
        study
          ? orderTable(study) + placeTable(study) + studyNotes(study) +
            verdictList(study.verdicts, false)
          : ""
      }`;
    });
    sections.push(
      `<section class="case" id="case-${esc(encodeURIComponent(id))}"><h2>${esc(id)}${
        info ? " — " + esc(info.title) : ""
      }</h2>${info ? `<p>${esc(info.motivation)}</p>` : ""}<div class="plots">${
        figures.join("")
      }</div>${info ? `<h3>Formulas</h3>${formulas(info)}` : ""}${perSolver.join("")}` +
        `<h3>Grid convergence index of the quantities of interest</h3>${gciTable(studies)}` +
        `</section>`,
    );
  }
  const baseline = result.baselineVerdicts.length > 0
    ? `<section id="baseline"><h2>Compared with the baseline${
      result.configuration.baseline ? ` ${esc(result.configuration.baseline)}` : ""
    }</h2>${verdictList(result.baselineVerdicts, true)}</section>`
    : "";
  const failures = all.filter((v) => v.status === "fail");
  const defects = findingsOf(result).failures.length;
  return `<!DOCTYPE html>
<html lang="en">
<head>
<meta charset="utf-8">
<meta http-equiv="Content-Security-Policy" content="default-src 'none'; style-src 'unsafe-inline'; img-src data:">
<meta name="viewport" content="width=device-width, initial-scale=1">
<title>gridproof report — ${esc(result.createdAt)}</title>
<style>${STYLE}</style>
</head>
<body>
<header>
<h1>gridproof verification report</h1>
<p class="muted">${esc(result.tool.name)} ${esc(result.tool.version)} · ${
    esc(result.createdAt)
  } · ${esc(result.environment.hostname)}</p>
<p>${
    badge(
      failures.length > 0
        ? "fail"
        : count("inconclusive") > 0
        ? "inconclusive"
        : count("warn") > 0
        ? "warn"
        : "pass",
    )
  } ${defects} failure${defects === 1 ? "" : "s"} (${count("fail")} failing verdicts), ${
    count("inconclusive")
  } undecided, ${count("warn")} warnings, ${count("pass")} passed, ${
    count("not-applicable")
  } not applicable · exit code ${esc(String(result.summary.exitCode))}</p>
</header>
<main>
${buildsSection(result)}
${findingsSection(result)}
<p class="caution"><strong>Caution.</strong> ${esc(CAUTION)}</p>
<h2>Overview</h2>
${overview(result)}
${sections.join("\n")}
${baseline}
<section id="environment"><h2>Configuration and environment</h2>${environment(result)}</section>
</main>
</body>
</html>
`;
}
