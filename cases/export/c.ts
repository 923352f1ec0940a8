/**
 * The C emitter: C99 with `<math.h>` only (link with `-lm`). Public functions carry the case's
 * identifier as a prefix so that several exported cases can share one program.
 *
 * @module
 */
import type { Body } from "./_dag.ts";
import { decimal, type Language } from "./_language.ts";

const SAME: readonly string[] = [
  "sin",
  "cos",
  "tan",
  "asin",
  "acos",
  "atan",
  "atan2",
  "sinh",
  "cosh",
  "tanh",
  "exp",
  "log10",
  "sqrt",
  "cbrt",
];
const RECIPROCAL: Readonly<Record<string, string>> = {
  sec: "cos",
  csc: "sin",
  cot: "tan",
  sech: "cosh",
  csch: "sinh",
  coth: "tanh",
};

/** Folds a call of 2…8 arguments into nested two-argument calls, left to right (as JavaScript). */
export function nested(fn: string, args: readonly string[]): string {
  return args.slice(1).reduce((acc, a) => `${fn}(${acc}, ${a})`, args[0]);
}

function call(name: string, a: readonly string[]): string {
  if (SAME.includes(name)) return `${name}(${a.join(", ")})`;
  if (Object.hasOwn(RECIPROCAL, name)) return `(1.0 / ${RECIPROCAL[name]}(${a[0]}))`;
  switch (name) {
    case "log":
      return a.length === 1 ? `log(${a[0]})` : `(log(${a[0]}) / log(${a[1]}))`;
    case "abs":
      return `fabs(${a[0]})`;
    case "sign":
      return `gp_sign(${a[0]})`;
    case "min":
      return nested("gp_min", a);
    case "max":
      return nested("gp_max", a);
    case "hypot":
      return nested("hypot", a);
  }
  throw new RangeError(`the C emitter has no spelling for the function "${name}"`);
}

const HELPERS = [
  "/* JavaScript's Math.sign, Math.min and Math.max: NaN in, NaN out (fmin/fmax drop a NaN). */",
  "static double gp_sign(double v) { return v > 0.0 ? 1.0 : (v < 0.0 ? -1.0 : v); }",
  "static double gp_min(double a, double b) { return isnan(a) || isnan(b) ? NAN : (a < b ? a : b); }",
  "static double gp_max(double a, double b) { return isnan(a) || isnan(b) ? NAN : (a > b ? a : b); }",
];

function body(b: Body, indent: string): string[] {
  return [
    ...b.temps.map((t) => `${indent}const double ${t.name} = ${t.value};`),
    `${indent}return ${b.result};`,
  ];
}

function list(values: readonly number[]): string {
  return values.length ? values.map(decimal).join(", ") : "0.0";
}

/** The C language. */
export const C_LANGUAGE: Language = {
  name: "c",
  extension: ".c",
  spelling: {
    number: decimal,
    call,
    power: (base, exponent) => `pow(${base}, ${exponent})`,
    sqrt: (arg) => `sqrt(${arg})`,
  },
  usage(parts) {
    const p = parts.ident;
    return [
      `Each function is double ${p}_NAME(double x, double y); compile with the C99 standard or`,
      "later and link with -lm. -ffp-contract=off keeps the harness's rounding (no fused",
      "multiply-add).",
    ];
  },
  file(parts) {
    const p = parts.ident;
    const lines = parts.header.map((h) => (h ? `// ${h}` : "//"));
    lines.push("#include <math.h>", "");
    for (const q of parts.quantities) lines.push(`double ${p}_${q.name}(double x, double y);`);
    if (parts.interfaces) {
      lines.push(`int ${p}_regions_at(double x, double y, int regions[4]);`);
      lines.push(`int ${p}_region(double x, double y);`);
      for (const q of parts.quantities) {
        lines.push(`double ${p}_${q.name}_region(int region, double x, double y);`);
      }
    }
    // only the helpers the bodies call: an unused static function draws a compiler warning
    const text = parts.quantities.flatMap((q) => q.bodies).map((b) => JSON.stringify(b)).join();
    const used = HELPERS.slice(1).filter((h) => text.includes(`${/gp_[a-z]+/.exec(h)![0]}(`));
    if (used.length) lines.push("", HELPERS[0], ...used);
    const f = parts.interfaces;
    if (f) {
      lines.push(
        "",
        `static const double ${p}_x_lines[] = {${list(f.x)}};`,
        `static const double ${p}_y_lines[] = {${list(f.y)}};`,
        "",
        "/* The strips along one axis whose closure holds t: one inside, two on a line. */",
        `static int ${p}_strips(const double *lines, int n, double t, double tol, int out[2]) {`,
        "  int s = 0;",
        "  while (s < n && t > lines[s]) s++;",
        "  if (s < n && fabs(t - lines[s]) <= tol) { out[0] = s; out[1] = s + 1; return 2; }",
        "  if (s > 0 && fabs(t - lines[s - 1]) <= tol) { out[0] = s - 1; out[1] = s; return 2; }",
        "  out[0] = s;",
        "  return 1;",
        "}",
        "",
        "/* The regions (numbered from 1) whose closure holds (x, y): 1, 2 or 4 of them; returns the",
        "   count. */",
        `int ${p}_regions_at(double x, double y, int regions[4]) {`,
        "  int sx[2], sy[2], count = 0;",
        `  int nx = ${p}_strips(${p}_x_lines, ${f.x.length}, x, ${decimal(f.xTolerance)}, sx);`,
        `  int ny = ${p}_strips(${p}_y_lines, ${f.y.length}, y, ${decimal(f.yTolerance)}, sy);`,
        "  for (int j = 0; j < ny; j++) {",
        `    for (int i = 0; i < nx; i++) regions[count++] = sy[j] * ${
          f.x.length + 1
        } + sx[i] + 1;`,
        "  }",
        "  return count;",
        "}",
        "",
        "/* The region of (x, y); on an interface the lowest-numbered one (west, then south). */",
        `int ${p}_region(double x, double y) {`,
        "  int regions[4];",
        `  ${p}_regions_at(x, y, regions);`,
        "  return regions[0];",
        "}",
      );
    }
    for (const q of parts.quantities) {
      lines.push("", `/* ${q.summary} */`);
      if (!f) {
        lines.push(`double ${p}_${q.name}(double x, double y) {`, ...body(q.bodies[0], "  "), "}");
        continue;
      }
      lines.push(`double ${p}_${q.name}_region(int region, double x, double y) {`);
      lines.push("  switch (region) {");
      q.bodies.forEach((b, r) => {
        lines.push(`  case ${r + 1}: {`, ...body(b, "    "), "  }");
      });
      lines.push("  }", "  return NAN;", "}", "");
      lines.push(
        `double ${p}_${q.name}(double x, double y) {`,
        "  int regions[4];",
        `  int count = ${p}_regions_at(x, y, regions);`,
        "  double total = 0.0;",
        `  for (int k = 0; k < count; k++) total += ${p}_${q.name}_region(regions[k], x, y);`,
        "  return total / count;",
        "}",
      );
    }
    return lines.join("\n") + "\n";
  },
};
