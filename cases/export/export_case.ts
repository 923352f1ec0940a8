/**
 * `exportCase`: a case's exact solution, source term, coefficients and boundary data as source
 * code in C, Fortran or Python, for solvers that evaluate them at their own points (quadrature
 * points of a finite-element code). The functions are written from the engine's own expression
 * trees with the parameters substituted, each repeated subexpression computed once.
 *
 * @module
 */
import { InputError } from "../../errors/mod.ts";
import type { CompiledCase, PointFn, RegionExpressions } from "../types.ts";
import { ON_LINE } from "../regions.ts";
import type { Expr } from "../expression.ts";
import { bodyOf } from "./_dag.ts";
import type { ExportQuantity, FileParts, Language } from "./_language.ts";
import { C_LANGUAGE } from "./c.ts";
import { FORTRAN_LANGUAGE } from "./fortran.ts";
import { PYTHON_LANGUAGE } from "./python.ts";

/** The languages `cases export --lang` writes, by name. */
export const EXPORT_LANGUAGES = {
  c: C_LANGUAGE,
  fortran: FORTRAN_LANGUAGE,
  python: PYTHON_LANGUAGE,
} as const satisfies Record<string, Language>;

/** A language name `exportCase` accepts. */
export type ExportLanguage = keyof typeof EXPORT_LANGUAGES;

/** One exported quantity: its function name, summary, per-region trees and the harness's function. */
export interface CaseQuantity {
  name: string;
  summary: string;
  /** Per region (west to east, then south to north), the expression tree. */
  exprs: Expr[];
  /** The harness's own point function for the same quantity (the mean on an interface). */
  harness: PointFn;
}

const SIDE_TEXT = {
  west: (c: CompiledCase) => `x = ${c.domain.x0}`,
  east: (c: CompiledCase) => `x = ${c.domain.x1}`,
  south: (c: CompiledCase) => `y = ${c.domain.y0}`,
  north: (c: CompiledCase) => `y = ${c.domain.y1}`,
} as const;

/**
 * The quantities an export writes, in file order, each with the harness's point function.
 *
 * @param c a compiled case built from a case file
 * @throws {RangeError} for a case made in code (it has no expression trees)
 */
export function caseQuantities(c: CompiledCase): CaseQuantity[] {
  const regions = c.expressions;
  if (!regions) {
    throw new RangeError(
      `case "${c.id}" was made in code and has no expression trees; only cases built from a ` +
        "case file can be exported",
    );
  }
  const pick = (f: (r: RegionExpressions) => Expr) => regions.map(f);
  const conservative = c.form === "conservative";
  const expansion = conservative ? " (the conservative form's expansion)" : "";
  const out: CaseQuantity[] = [
    {
      name: "exact",
      summary: "u, the exact solution",
      exprs: pick((r) => r.exact),
      harness: c.exact,
    },
    { name: "exact_dx", summary: "du/dx", exprs: pick((r) => r.ux), harness: c.exactDx },
    { name: "exact_dy", summary: "du/dy", exprs: pick((r) => r.uy), harness: c.exactDy },
    {
      name: "source",
      summary: "f, the source term (the operator applied to u)",
      exprs: pick((r) => r.source),
      harness: c.source,
    },
  ];
  const of = { a: "u_xx", b: "u_x", c: "u_yy", d: "u_y", e: "u", m: "u_xy" } as const;
  for (const k of ["a", "b", "c", "d", "e", "m"] as const) {
    out.push({
      name: `coefficient_${k}`,
      summary: `${k}, the coefficient of ${of[k]}${expansion}`,
      exprs: pick((r) => r.coefficients[k]),
      harness: c.coefficients[k],
    });
  }
  if (conservative && c.conservative) {
    const terms = [
      ["k11", "k11", "K11, conductivity"],
      ["k12", "k12", "K12 = K21, conductivity"],
      ["k22", "k22", "K22, conductivity"],
      ["bx", "beta_x", "beta_x, advection"],
      ["by", "beta_y", "beta_y, advection"],
      ["sigma", "sigma", "sigma, reaction"],
    ] as const;
    for (const [key, name, summary] of terms) {
      out.push({
        name,
        summary,
        exprs: pick((r) => r.conservative![key]),
        harness: c.conservative[key],
      });
    }
  }
  const flux = conservative ? "(K grad u).n" : "du/dn";
  for (const side of ["west", "east", "south", "north"] as const) {
    const b = c.boundary[side];
    const what = b.kind === "dirichlet"
      ? "u"
      : b.kind === "neumann"
      ? flux
      : `alpha*u + beta*${flux} with alpha = robin_alpha_${side}, beta = robin_beta_${side}`;
    out.push({
      name: `boundary_${side}`,
      summary: `${b.kind} data on the ${side} side ${SIDE_TEXT[side](c)}: ${what}`,
      exprs: pick((r) => r.boundary[side]),
      harness: b.data,
    });
    if (b.kind === "robin") {
      for (const w of ["alpha", "beta"] as const) {
        out.push({
          name: `robin_${w}_${side}`,
          summary: `Robin weight ${w} on the ${side} side (case file: ${b.weightsText![w]})`,
          exprs: pick((r) => r.robin[side]![w]),
          harness: b[w]!,
        });
      }
    }
  }
  return out;
}

/** An identifier made from a case id: letters, digits and underscores, starting with a letter. */
export function caseIdentifier(id: string): string {
  const plain = id.replace(/[^A-Za-z0-9_]/g, "_");
  return (/^[A-Za-z]/.test(plain) ? plain : `case_${plain}`).slice(0, 40);
}

/** Words filled into lines of at most `width` characters. */
function fill(text: string, width = 96): string[] {
  const lines: string[] = [];
  let line = "";
  for (const word of text.split(/\s+/).filter(Boolean)) {
    if (line && line.length + 1 + word.length > width) {
      lines.push(line);
      line = word;
    } else line = line ? `${line} ${word}` : word;
  }
  if (line) lines.push(line);
  return lines;
}

function header(c: CompiledCase, language: Language, parts: FileParts, version: string): string[] {
  // control characters of a user's title must not end a comment line early
  const clean = (s: string) =>
    Array.from(s, (ch) => {
      const code = ch.codePointAt(0)!;
      return code < 0x20 || (code >= 0x7f && code <= 0x9f) ? " " : ch;
    }).join("");
  const { x0, x1, y0, y1 } = c.domain;
  const params = Object.entries(c.parameters).map(([k, v]) => `${k} = ${v}`);
  const conservative = c.form === "conservative";
  const paragraphs = [
    `gridproof case "${clean(c.id)}": ${clean(c.title)}`,
    `Generated by gridproof ${version} with \`gridproof cases export ${
      clean(c.id)
    } --lang ${language.name}\`; do not edit, export again.`,
    `Domain: [${x0}, ${x1}] x [${y0}, ${y1}]. ${
      params.length
        ? `Parameters (substituted into every formula): ${params.join(", ")}.`
        : "No parameters."
    }`,
    conservative
      ? "Operator, conservative form: div(K grad u) + beta . grad u + sigma*u = f with K = " +
        "[[k11, k12], [k12, k22]] and beta = (beta_x, beta_y). coefficient_a ... coefficient_m " +
        "are its non-conservative expansion (a = k11, m = 2*k12, c = k22, b = beta_x + " +
        "d(k11)/dx + d(k12)/dy, d = beta_y + d(k12)/dx + d(k22)/dy, e = sigma), exact inside each " +
        "region. Neumann and Robin data use the conormal flux (K grad u).n, n the outward normal."
      : "Operator, non-conservative form: a*u_xx + m*u_xy + c*u_yy + b*u_x + d*u_y + e*u = f. " +
        "Neumann and Robin data use du/dn, n the outward normal.",
    "Boundary: " + (["west", "east", "south", "north"] as const).map((s) => {
      const b = c.boundary[s];
      return b.kind === "robin"
        ? `${s} robin (alpha = ${b.weightsText!.alpha}, beta = ${b.weightsText!.beta})`
        : `${s} ${b.kind}`;
    }).join(", ") + ". Every function is defined on the whole plane; boundary_SIDE is meant on " +
    "its side.",
    parts.interfaces
      ? `Interfaces: ${
        [...c.interfaces.x.map((v) => `x = ${v}`), ...c.interfaces.y.map((v) => `y = ${v}`)]
          .join(", ")
      }; regions numbered from 1, west to east, then south to north. As in the harness, a ` +
        `point within ${ON_LINE} times the domain's extent of an interface gets the mean of the ` +
        "one-sided values; NAME_region(r, x, y) gives region r's own value (pick a side) and " +
        "region(x, y) the region of a point."
      : "One region: no material interfaces.",
    language.usage(parts).join(" "),
    "The values match the harness's own to about 1e-12 relative: math libraries may round the " +
    "last bit of a function differently.",
  ];
  return paragraphs.flatMap((p, k) => [...(k ? [""] : []), ...fill(p)]);
}

/**
 * Writes a case as source code: one function of (x, y) per quantity (exact solution and its
 * gradient, source term, coefficients, conservative terms, boundary data), plus a region selector
 * for a case with interfaces.
 *
 * @param c a compiled case built from a case file
 * @param language `c`, `fortran` or `python`
 * @param options `version`: gridproof's version, named in the header (required)
 * @returns the file's text
 * @throws {InputError} for an unknown language, naming the known ones
 * @throws {RangeError} for a case made in code (no expression trees)
 *
 * @example
 * ```ts
 * import { loadCase } from "../mod.ts";
 * import { exportCase } from "./export_case.ts";
 * const text = exportCase(await loadCase("smooth-baseline"), "python", { version: "0.1.0" });
 * if (!text.includes("def exact(x, y):")) throw new Error("no exact solution");
 * ```
 */
export function exportCase(
  c: CompiledCase,
  language: string,
  options: { version: string },
): string {
  if (!Object.hasOwn(EXPORT_LANGUAGES, language)) {
    throw new InputError(
      `unknown language "${language}"; choose one of: ${Object.keys(EXPORT_LANGUAGES).join(", ")}`,
      { where: "--lang" },
    );
  }
  const lang: Language = EXPORT_LANGUAGES[language as ExportLanguage];
  const quantities: ExportQuantity[] = caseQuantities(c).map((q) => ({
    name: q.name,
    summary: q.summary,
    bodies: q.exprs.map((e) => bodyOf(e, lang.spelling)),
  }));
  const multiple = quantities[0].bodies.length > 1;
  const parts: FileParts = {
    ident: caseIdentifier(c.id),
    header: [],
    quantities,
    ...(multiple
      ? {
        interfaces: {
          x: c.interfaces.x,
          y: c.interfaces.y,
          xTolerance: ON_LINE * (c.domain.x1 - c.domain.x0),
          yTolerance: ON_LINE * (c.domain.y1 - c.domain.y0),
        },
      }
      : {}),
  };
  parts.header = header(c, lang, parts, options.version);
  return lang.file(parts);
}
