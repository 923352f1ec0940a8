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
import { type PlotSpec, renderSvg, reportPlots } from "./plots.ts";

const STYLE = `
:root { color-scheme: light; --fail: #b3261e; --undecided: #6a1b9a; --warn: #8a5a00; --pass: #1e6b34; --na: #666; }
body { font: 15px/1.5 system-ui, sans-serif; margin: 0 auto; max-width: 1180px; padding: 1.5rem;
  color: #1b1b1b; background: #fff; }
h1 { font-size: 1.6rem; margin-bottom: 0.2rem; }
h2 { font-size: 1.3rem; border-bottom: 2px solid #ddd; padding-bottom: 0.2rem; margin-top: 2.2rem; }
h3 { font-size: 1.05rem; margin-top: 1.4rem; }
table { border-collapse: collapse; margin: 0.5rem 0 1rem; font-size: 0.88rem; display: block;
  overflow-x: auto; max-width: 100%; }
th, td { border: 1px solid #d5d5d5; padding: 0.2rem 0.5rem; text-align: left; vertical-align: top; }
th { background: #f3f3f3; }
td.n { text-align: right; font-variant-numeric: tabular-nums; white-space: nowrap; }
code, pre { font: 0.85rem/1.4 ui-monospace, monospace; }
pre { background: #f6f6f6; padding: 0.5rem; overflow-x: auto; white-space: pre-wrap; }
.status { font-weight: 700; padding: 0 0.35rem; border-radius: 3px; color: #fff; font-size: 0.8rem; }
.status.fail { background: var(--fail); } .status.warn { background: var(--warn); }
.status.inconclusive { background: var(--undecided); }
.status.pass { background: var(--pass); } .status.not-applicable { background: var(--na); }
.caution { border-left: 4px solid var(--warn); background: #fff8e6; padding: 0.5rem 0.8rem; }
.plots { display: flex; flex-wrap: wrap; gap: 1rem; }
figure.plot { margin: 0; border: 1px solid #e3e3e3; padding: 0.4rem; }
figure.plot figcaption { font-size: 0.8rem; color: #444; max-width: 460px; }
ul.verdicts { list-style: none; padding-left: 0; } ul.verdicts li { margin: 0.25rem 0; }
.muted { color: #555; }
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

function formulas(info: CaseInfo): string {
  const f = info.formulas;
  const rows = [
    ["operator", "a·u_xx + b·u_x + c·u_yy + d·u_y + e·u = f"],
    ["a", f.a],
    ["b", f.b],
    ["c", f.c],
    ["d", f.d],
    ["e", f.e],
    ["exact solution u", f.exact],
    ["source f", f.source],
    ...Object.entries(f.boundary).map(([side, text]) => [
      `boundary ${side} (${info.boundaryKinds[side] ?? "?"})`,
      text,
    ]),
  ];
  const d = info.domain;
  return `<table><tbody>${
    rows.map(([k, v]) => `<tr><th scope="row">${esc(k)}</th><td><code>${esc(v)}</code></td></tr>`)
      .join("")
  }<tr><th scope="row">domain</th><td>[${num(d.x0)}, ${num(d.x1)}] × [${num(d.y0)}, ${
    num(d.y1)
  }]</td></tr>${
    Object.keys(info.parameters).length > 0
      ? `<tr><th scope="row">parameters</th><td>${
        esc(Object.entries(info.parameters).map(([k, v]) => `${k} = ${v}`).join(", "))
      }</td></tr>`
      : ""
  }</tbody></table>`;
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

function gciTable(studies: StudyRecord[]): string {
  const rows: string[] = [];
  let audited = 0;
  let covered = 0;
  for (const study of studies) {
    for (const q of study.quantities) {
      if (q.covered !== null) {
        audited++;
        if (q.covered) covered++;
      }
      rows.push(
        `<tr>${td(study.solver)}${td(q.label || q.name)}${
          td(q.values.map((v) => num(v, 6)).join(", "))
        }${td(num(q.exact, 6), true)}${td(order(q.order), true)}${
          td(num(q.extrapolated, 6), true)
        }${td(percent(q.gciFine), true)}${td(percent(q.gciCoarse), true)}${
          td(num(q.safetyFactor, 3), true)
        }${td(num(q.asymptoticRatio, 4), true)}${td(percent(q.celik?.gciFine), true)}${
          td(q.celik?.convergence ?? "—")
        }${td(num(q.leastSquares?.uncertainty), true)}${
          td(q.covered === null ? "—" : q.covered ? "yes" : "NO")
        }</tr>`,
      );
    }
  }
  if (rows.length === 0) return `<p class="muted">No quantities of interest were studied.</p>`;
  const coverage = studies
    .filter((s) => s.coverage !== null)
    .map((s) => `${esc(s.solver)} ${percent(s.coverage)}`);
  return `<table><thead><tr><th>solver</th><th>quantity</th><th>values, coarsest first</th>` +
    `<th>exact</th><th>observed order</th><th>extrapolated</th><th>GCI fine</th>` +
    `<th>GCI coarse</th><th>safety factor</th><th>GCI ratio (≈1 in range)</th>` +
    `<th>GCI (Celik et al.)</th><th>convergence</th><th>least-squares uncertainty</th>` +
    `<th>exact value inside GCI band</th></tr></thead><tbody>${
      rows.join("")
    }</tbody></table><p><strong>Coverage audit:</strong> the finest-grid GCI band contained the ` +
    `true error in ${covered} of ${audited} quantities` +
    (coverage.length ? ` (coverage per solver: ${coverage.join(", ")})` : "") +
    `. A band that misses the exact value means the safety factor was not enough.</p>`;
}

function figure(plot: PlotSpec, svg: string): string {
  return `<figure class="plot" data-plot="${plot.kind}" data-case="${esc(plot.caseId)}"${
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
      const failing = [
        ...new Set(verdicts.filter((v) => v.status === "fail").map((v) => v.criterion)),
      ];
      return `<td>${badge(worst(verdicts))} ${esc(failing.join(", "))}</td>`;
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
      s.description ? `<pre>${esc(JSON.stringify(s.description, null, 2))}</pre>` : "—"
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
  } ${count("fail")} failed, ${count("inconclusive")} undecided, ${count("warn")} warnings, ${
    count("pass")
  } passed, ${count("not-applicable")} not applicable · exit code ${
    esc(String(result.summary.exitCode))
  }</p>
<p class="caution"><strong>Caution.</strong> ${esc(CAUTION)}</p>
</header>
<main>
<h2>Overview</h2>
${overview(result)}
${failures.length > 0 ? `<h3>Failures</h3>${verdictList(failures, true)}` : ""}
${sections.join("\n")}
${baseline}
<section id="environment"><h2>Configuration and environment</h2>${environment(result)}</section>
</main>
</body>
</html>
`;
}
