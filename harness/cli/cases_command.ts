/**
 * `gridproof cases`: list the built-in cases, show one case's formulas (`cases show ID|FILE
 * [--tex]`), check user case files (`cases check FILE…`, every problem at once), and write a case
 * as C, Fortran or Python functions (`cases export ID|FILE --lang c|fortran|python [--out FILE]`).
 *
 * @module
 */
import type { Command } from "commander";
import { escapeTerminal } from "../report/mod.ts";
import {
  type CaseFile,
  checkCaseFiles,
  type CompiledCase,
  type ExpectedOrder,
  libraryFiles,
  loadCase,
} from "../../cases/mod.ts";
import { EXPORT_LANGUAGES, exportCase } from "../../cases/export/mod.ts";
import { VERSION } from "../version.ts";
import type { SetExitCode } from "./exit.ts";
import { InputError } from "./errors.ts";
import { parseParameterFlags } from "./solve_command.ts";

const SHORT = { dirichlet: "D", neumann: "N", robin: "R" } as const;

/** One row of `gridproof cases --json`. */
export interface CaseListing {
  id: string;
  title: string;
  /** Expected central order in the max norm (the observed one where the case declares it). */
  expectedOrder: number;
  /** true for an exactness case (round-off errors expected instead of an order). */
  exact: boolean;
  boundary: Record<"west" | "east" | "south" | "north", string>;
  tags: string[];
  motivation: string;
  grids: number[];
  parameters: Record<string, number>;
  expected: { central: ExpectedOrder; upwind: ExpectedOrder };
}

/** The listing row of a case file. */
export function caseListing(c: CaseFile): CaseListing {
  const central = c.expected.central;
  return {
    id: c.id,
    title: c.title,
    expectedOrder: central.achievable?.max?.order ?? central.formal,
    exact: central.exactToRoundOff === true,
    boundary: {
      west: c.boundary.west.kind,
      east: c.boundary.east.kind,
      south: c.boundary.south.kind,
      north: c.boundary.north.kind,
    },
    tags: [...c.tags],
    motivation: c.motivation,
    grids: [...c.grids],
    parameters: { ...(c.parameters ?? {}) },
    expected: { central, upwind: c.expected.upwind ?? { formal: 1 } },
  };
}

function orderText(e: ExpectedOrder): string {
  if (e.exactToRoundOff) return "exact";
  const observed = Object.entries(e.achievable ?? {}).map(([norm, o]) => `${norm} ${o?.order}`);
  return observed.length ? `${e.formal} (${observed.join(", ")})` : String(e.formal);
}

/** The listing as a plain-text table. */
export function casesTable(rows: readonly CaseListing[]): string {
  const head = ["id", "title", "W E S N", "order", "tags"];
  const body = rows.map((r) => [
    r.id,
    r.title.length > 56 ? r.title.slice(0, 55) + "…" : r.title,
    (["west", "east", "south", "north"] as const).map((s) => SHORT[r.boundary[s] as "robin"]).join(
      " ",
    ),
    orderText(r.expected.central),
    r.tags.join(", "),
  ]);
  const widths = head.map((h, k) => Math.max(h.length, ...body.map((row) => row[k].length)));
  const line = (cells: string[]) =>
    cells.map((c, k) => (k === cells.length - 1 ? c : c.padEnd(widths[k]))).join("  ");
  return [
    line(head),
    line(widths.map((w) => "-".repeat(w))),
    ...body.map(line),
    "",
    "Boundary kinds: D dirichlet, N neumann, R robin (sides west east south north). Order: central",
    "scheme, max norm; 'exact' means round-off errors are expected.",
  ].join("\n");
}

const SIDE_PLACE = {
  west: (c: CompiledCase) => `x = ${c.domain.x0}`,
  east: (c: CompiledCase) => `x = ${c.domain.x1}`,
  south: (c: CompiledCase) => `y = ${c.domain.y0}`,
  north: (c: CompiledCase) => `y = ${c.domain.y1}`,
} as const;

/** The readable description of a compiled case (`cases show`). */
export function showCase(c: CompiledCase, tex: boolean): string {
  const f = tex ? c.tex : c.formulas;
  const domain = `[${c.domain.x0}, ${c.domain.x1}] × [${c.domain.y0}, ${c.domain.y1}]`;
  const lines = [`${c.id}: ${c.title}`, `  ${c.motivation}`, ""];
  const k = f.conservative;
  const expanded = [
    `  a = ${f.a}`,
    ...(f.m === undefined ? [] : [`  m = ${f.m}`]),
    `  c = ${f.c}`,
    `  b = ${f.b}`,
    `  d = ${f.d}`,
    `  e = ${f.e}`,
  ];
  if (k) {
    lines.push(
      `Operator: ∇·(K∇u) + β·∇u + σ·u = f on ${domain}, K = [[k11, k12], [k12, k22]]`,
      `  k11 = ${k.k11}`,
      `  k12 = ${k.k12}`,
      `  k22 = ${k.k22}`,
      `  β = (${k.bx}, ${k.by})`,
      `  σ = ${k.sigma}`,
      `Expanded (a·u_xx + m·u_xy + c·u_yy + b·u_x + d·u_y + e·u${
        f.regions ? ", in the first region" : ""
      }):`,
      ...expanded,
    );
  } else {
    lines.push(
      `Operator: a·u_xx + ${
        f.m === undefined ? "" : "m·u_xy + "
      }c·u_yy + b·u_x + d·u_y + e·u = f on ${domain}`,
      ...expanded,
    );
  }
  lines.push(`Exact solution:`, `  u = ${f.exact}`, `Derived source term:`, `  f = ${f.source}`);
  if (f.regions) {
    const { x, y } = c.interfaces;
    lines.push(
      `Interfaces: ${[...x.map((v) => `x = ${v}`), ...y.map((v) => `y = ${v}`)].join(", ")}; ` +
        `${f.regions.length} regions, west to east, then south to north (the lines above show ` +
        "region 1):",
    );
    f.regions.forEach((r, n) => {
      lines.push(
        `  region ${n + 1}: K = ${
          r.k12 === "0" ? r.k11 : `[[${r.k11}, ${r.k12}], [${r.k12}, ${r.k22}]]`
        }`,
      );
      lines.push(`    u = ${r.exact}`, `    f = ${r.source}`);
    });
  }
  const flux = k ? "(K∇u)·n" : "∂u/∂n";
  lines.push(`Boundary data (n the outward normal${k ? ", (K∇u)·n the conormal flux" : ""}):`);
  for (const side of ["west", "east", "south", "north"] as const) {
    const b = c.boundary[side];
    const what = b.kind === "dirichlet"
      ? "u"
      : b.kind === "neumann"
      ? flux
      : `(${b.weightsText!.alpha})·u + (${b.weightsText!.beta})·${flux}`;
    lines.push(`  ${side} (${SIDE_PLACE[side](c)}), ${b.kind}: ${what} = ${f.boundary[side]}`);
  }
  const params = Object.entries(c.parameters);
  if (params.length) {
    lines.push(`Parameters: ${params.map(([k, v]) => `${k} = ${v}`).join(", ")}`);
  }
  lines.push(
    `Expected order: central ${orderText(c.expected.central)}, upwind ${
      orderText(c.expected.upwind)
    }`,
  );
  for (const [norm, o] of Object.entries(c.expected.central.achievable ?? {})) {
    lines.push(`  ${norm}: ${o?.order} because ${o?.reason}`);
  }
  const grids = c.grids.map((n) => {
    const g = c.gridFor(n);
    return g.nx === g.ny ? String(n) : `${g.nx}×${g.ny}`;
  });
  lines.push(`Suggested grids: ${grids.join(", ")}`);
  if (c.solver) lines.push(`Solver advice: ${JSON.stringify(c.solver)}`);
  lines.push(`Tags: ${c.tags.join(", ")}`, `Manufactured-solution guidance: ${c.manufactured}`);
  return lines.join("\n");
}

/**
 * Refuses an `--out` path that exists (without `--force`), is a folder, or lies in a missing folder:
 * checked before the case is built.
 */
async function checkOutPath(out: string, force: boolean): Promise<void> {
  let info: Deno.FileInfo | undefined;
  try {
    info = await Deno.stat(out);
  } catch (error) {
    if (!(error instanceof Deno.errors.NotFound)) {
      throw new InputError(`cannot write "${out}": ${(error as Error).message}`, {
        where: "--out",
      });
    }
  }
  if (info?.isDirectory) {
    throw new InputError(`"${out}" is a folder; give a file name`, { where: "--out" });
  }
  if (info && !force) {
    throw new InputError(`"${out}" exists; add --force to overwrite it or choose another name`, {
      where: "--out",
    });
  }
  const slash = out.lastIndexOf("/");
  const folder = slash < 0 ? "." : out.slice(0, slash) || "/";
  try {
    if (!(await Deno.stat(folder)).isDirectory) throw new Deno.errors.NotFound();
  } catch (error) {
    const why = error instanceof Deno.errors.NotFound ? "no such folder" : (error as Error).message;
    throw new InputError(`cannot write "${out}": ${why} (${folder}); create it first`, {
      where: "--out",
    });
  }
}

/**
 * Registers `cases`, `cases show`, `cases check` and `cases export`.
 *
 * @param program The root command.
 * @param setExitCode Raises the exit code (2 when `cases check` finds problems).
 */
export function registerCasesCommand(program: Command, setExitCode: SetExitCode): void {
  const cases = program
    .command("cases")
    .description("list the built-in manufactured-solution cases (a table, or --json)")
    .option("--json", "print a JSON array (id, title, expectedOrder, boundary, tags, …)")
    .action(async (opts: { json?: boolean }) => {
      const rows = (await libraryFiles()).map(caseListing);
      console.log(opts.json ? JSON.stringify(rows, null, 2) : terminalSafe(casesTable(rows)));
    });
  cases
    .command("show")
    .description("print a case's operator, exact solution, derived source term and boundary data")
    .argument("<case>", "a built-in case id or the path of a case file (.json)")
    .option("--tex", "print the formulas as TeX")
    .option(
      "--param <name=value>",
      "override a parameter (repeatable), e.g. --param width=0.1",
      (v: string, acc: string[] | undefined) => [...(acc ?? []), v],
    )
    .action(async (id: string, opts: { tex?: boolean; param?: string[] }) => {
      const parameters = parseParameterFlags(opts.param);
      const c = await loadCase(id, { parameters });
      for (const w of c.warnings ?? []) console.error(terminalSafe(`gridproof: warning: ${w}`));
      console.log(terminalSafe(showCase(c, opts.tex === true)));
    });
  cases
    .command("check")
    .description("validate case files and report every problem at once (exit 2 when any)")
    .argument("<files...>", "case files (.json)")
    .action(async (files: string[]) => {
      const results = await checkCaseFiles(files);
      let bad = 0;
      for (const r of results) {
        for (const w of r.warnings) console.error(terminalSafe(`gridproof: warning: ${w}`));
        if (r.problems.length === 0) {
          console.log(terminalSafe(`ok: ${r.file}`));
          continue;
        }
        bad++;
        console.error(`gridproof: ${r.file}: ${r.problems.length} problem(s)`);
        for (const p of r.problems) console.error(`  - ${p}`);
      }
      if (bad) setExitCode(2);
    });
  cases
    .command("export")
    .description(
      "write a case's exact solution, source term, coefficients and boundary data as C, Fortran " +
        "or Python functions of (x, y), for solvers that evaluate them at their own points",
    )
    .argument("<case>", "a built-in case id or the path of a case file (.json)")
    .requiredOption(
      "--lang <language>",
      `the language: ${Object.keys(EXPORT_LANGUAGES).join(", ")}`,
    )
    .option("-o, --out <file>", "write to this file instead of standard output")
    .option("--force", "overwrite the --out file if it exists")
    .option(
      "--param <name=value>",
      "override a parameter (repeatable), e.g. --param ratio=1000",
      (v: string, acc: string[] | undefined) => [...(acc ?? []), v],
    )
    .action(
      async (
        id: string,
        opts: { lang: string; out?: string; force?: boolean; param?: string[] },
      ) => {
        if (!Object.hasOwn(EXPORT_LANGUAGES, opts.lang)) {
          throw new InputError(
            `unknown language "${opts.lang}"; choose one of: ${
              Object.keys(EXPORT_LANGUAGES).join(", ")
            }`,
            { where: "--lang" },
          );
        }
        const parameters = parseParameterFlags(opts.param);
        if (opts.out !== undefined) await checkOutPath(opts.out, opts.force === true);
        const c = await loadCase(id, { parameters });
        const text = exportCase(c, opts.lang, { version: VERSION });
        if (opts.out === undefined) {
          console.log(text.replace(/\n$/, ""));
          return;
        }
        try {
          await Deno.writeTextFile(opts.out, text, { createNew: opts.force !== true });
        } catch (error) {
          throw new InputError(`cannot write "${opts.out}": ${(error as Error).message}`, {
            where: "--out",
          });
        }
        console.log(terminalSafe(`wrote ${opts.out} (${opts.lang}, case ${c.id})`));
      },
    );
}

/** Each line without control characters: a case file's title or text may carry escape sequences. */
function terminalSafe(text: string): string {
  return text.split("\n").map(escapeTerminal).join("\n");
}
