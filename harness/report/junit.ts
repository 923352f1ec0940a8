/**
 * The JUnit XML report, so CI servers list every verdict as a test result.
 *
 * Mapping (our choice, stated here once):
 * - one `<testsuite>` per case × solver (named `case · solver`), holding that study's verdicts and
 *   the baseline verdicts of the same case and solver;
 * - one `<testcase>` per verdict, named after its criterion and, for a verdict per norm and region,
 *   both (`order (L2 norm, all points)`), class name `gridproof.<case>.<solver>`;
 * - the suite's properties name the solver's build: what it reported, its command and digests;
 * - `fail` → `<failure>` whose message is the verdict's reason and whose body adds the details;
 * - `warn` → a passing test case with the reason in `<system-out>` prefixed `warning:`. A warning
 *   does not stop a release, and CI servers count "skipped" as "did not run", which would hide a
 *   criterion that did run;
 * - `not-applicable` → `<skipped>` with the reason as its message.
 *
 * @module
 */
import type { CampaignResult, Verdict } from "../result/mod.ts";
import { escapeHtml as esc } from "./escape.ts";
import { buildRows, reportedLine } from "./builds.ts";

interface Suite {
  caseId: string;
  solver: string;
  verdicts: Verdict[];
  seconds: number;
}

function suites(result: CampaignResult): Suite[] {
  const map = new Map<string, Suite>();
  const key = (c: string, s: string) => JSON.stringify([c, s]);
  const get = (caseId: string, solver: string) => {
    let suite = map.get(key(caseId, solver));
    if (!suite) {
      const seconds = result.solves
        .filter((s) => s.caseId === caseId && s.solver === solver)
        .reduce((a, s) => a + s.seconds, 0);
      suite = { caseId, solver, verdicts: [], seconds };
      map.set(key(caseId, solver), suite);
    }
    return suite;
  };
  for (const study of result.studies) {
    get(study.caseId, study.solver).verdicts.push(...study.verdicts);
  }
  for (const v of result.baselineVerdicts) get(v.caseId, v.solver).verdicts.push(v);
  return [...map.values()];
}

/** The solver's build as suite properties: what it reported, its command and file digests. */
function buildProperties(result: CampaignResult, solver: string): string[] {
  const row = buildRows(result).find((r) => r.solver === solver);
  if (!row) return [];
  const props: [string, string][] = [
    ["solver.reported", reportedLine(row)],
    ["solver.command", row.command],
    ...(row.solverFile
      ? [
        ["solver.file", `${row.solverFile.path} sha256:${row.solverFile.sha256}`] as [
          string,
          string,
        ],
      ]
      : []),
    ...row.files.map((
      f,
      k,
    ): [string, string] => [`solver.runs.${k + 1}`, `${f.path} sha256:${f.sha256}`]),
  ];
  return props.map(([name, value]) =>
    `      <property name="${esc(name)}" value="${attr(value)}"/>`
  );
}

/** ISO date-time without zone or fraction (the form the Ant schema's timestamp allows), or "". */
function timestamp(iso: string): string {
  const t = Date.parse(iso);
  return Number.isFinite(t) ? new Date(t).toISOString().slice(0, 19) : "";
}

/** Escapes for a quoted attribute, keeping line breaks (parsers turn raw ones into spaces). */
function attr(text: string): string {
  return esc(text).replace(/\r/g, "&#13;").replace(/\n/g, "&#10;").replace(/\t/g, "&#9;");
}

function testcase(v: Verdict, name: string, classname: string): string {
  const head = `    <testcase name="${attr(name)}" classname="${attr(classname)}" time="0"`;
  const details = v.details ? `\n${JSON.stringify(v.details, null, 2)}` : "";
  switch (v.status) {
    case "fail":
      return `${head}>\n      <failure message="${attr(v.reason)}" type="${attr(v.criterion)}">` +
        `${esc(v.reason + details)}</failure>\n    </testcase>`;
    case "inconclusive":
      // Not a pass: JUnit's <error> (the test could not reach a decision), so a gate that counts
      // failures and errors never lets an undecided verdict through.
      return `${head}>\n      <error message="${attr("undecided: " + v.reason)}" ` +
        `type="inconclusive">${esc(v.reason + details)}</error>\n    </testcase>`;
    case "warn":
      return `${head}>\n      <system-out>${esc("warning: " + v.reason + details)}</system-out>` +
        `\n    </testcase>`;
    case "not-applicable":
      return `${head}>\n      <skipped message="${attr(v.reason)}"/>\n    </testcase>`;
    default:
      return `${head}/>`;
  }
}

const NORM_NAME: Record<string, string> = { max: "max norm", l2: "L2 norm", l1: "L1 norm" };
const REGION_NAME: Record<string, string> = {
  all: "all points",
  interior: "interior points",
  boundary: "boundary band",
};

/** " (max norm, all points)" for a verdict with a norm or region in its details, else "". */
function measureName(v: Verdict): string {
  const norm = v.details?.norm;
  const region = v.details?.region;
  const parts: string[] = [];
  if (typeof norm === "string") parts.push(NORM_NAME[norm] ?? `${norm} norm`);
  if (typeof region === "string") parts.push(REGION_NAME[region] ?? region);
  else if (typeof norm === "string") parts.push(REGION_NAME.all);
  return parts.length > 0 ? ` (${parts.join(", ")})` : "";
}

/**
 * Renders every verdict (study and baseline) as JUnit XML.
 *
 * @param result The campaign result.
 * @returns An XML document with a `<testsuites>` root.
 *
 * @example
 * ```ts ignore
 * await Deno.writeTextFile("gridproof-junit.xml", renderJunit(result));
 * ```
 */
export function renderJunit(result: CampaignResult): string {
  const stamp = timestamp(result.createdAt);
  const out: string[] = [];
  let tests = 0;
  let failures = 0;
  let errors = 0;
  let total = 0;
  const body: string[] = [];
  for (const [index, suite] of suites(result).entries()) {
    const classname = `gridproof.${suite.caseId}.${suite.solver}`;
    const seen = new Map<string, number>();
    const cases = suite.verdicts.map((v) => {
      // a verdict per norm and region is named by both; any other repeat gets a counter so CI
      // servers keep both
      const name = v.criterion + measureName(v);
      const n = (seen.get(name) ?? 0) + 1;
      seen.set(name, n);
      return testcase(v, n === 1 ? name : `${name} (${n})`, classname);
    });
    const failed = suite.verdicts.filter((v) => v.status === "fail").length;
    const undecided = suite.verdicts.filter((v) => v.status === "inconclusive").length;
    errors += undecided;
    const skipped = suite.verdicts.filter((v) => v.status === "not-applicable").length;
    tests += suite.verdicts.length;
    failures += failed;
    total += suite.seconds;
    body.push(
      `  <testsuite name="${esc(`${suite.caseId} · ${suite.solver}`)}" ` +
        `tests="${suite.verdicts.length}" failures="${failed}" errors="${undecided}" ` +
        `skipped="${skipped}" ` +
        `time="${suite.seconds.toFixed(3)}"` + (stamp ? ` timestamp="${stamp}"` : "") +
        ` hostname="${esc(result.environment.hostname || "unknown")}" id="${index}" ` +
        `package="gridproof.${esc(suite.caseId)}">`,
      `    <properties>`,
      `      <property name="case" value="${esc(suite.caseId)}"/>`,
      `      <property name="solver" value="${esc(suite.solver)}"/>`,
      `      <property name="gridproof.version" value="${esc(result.tool.version)}"/>`,
      ...buildProperties(result, suite.solver),
      `    </properties>`,
      ...cases,
      `  </testsuite>`,
    );
  }
  out.push(`<?xml version="1.0" encoding="UTF-8"?>`);
  out.push(
    `<testsuites name="gridproof" tests="${tests}" failures="${failures}" errors="${errors}" ` +
      `time="${total.toFixed(3)}">`,
  );
  out.push(...body);
  out.push(`</testsuites>`);
  return out.join("\n") + "\n";
}
