/**
 * The Python emitter: a module of plain functions on floats using the standard `math` module only.
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
  "hypot",
];
const RECIPROCAL: Readonly<Record<string, string>> = {
  sec: "cos",
  csc: "sin",
  cot: "tan",
  sech: "cosh",
  csch: "sinh",
  coth: "tanh",
};

function call(name: string, a: readonly string[]): string {
  if (SAME.includes(name)) return `math.${name}(${a.join(", ")})`;
  if (Object.hasOwn(RECIPROCAL, name)) return `(1.0 / math.${RECIPROCAL[name]}(${a[0]}))`;
  switch (name) {
    case "log":
      return a.length === 1 ? `math.log(${a[0]})` : `(math.log(${a[0]}) / math.log(${a[1]}))`;
    case "abs":
      return `abs(${a[0]})`;
    case "cbrt":
      return `_cbrt(${a[0]})`;
    case "sign":
      return `_sign(${a[0]})`;
    case "min":
      return `_min(${a.join(", ")})`;
    case "max":
      return `_max(${a.join(", ")})`;
  }
  throw new RangeError(`the Python emitter has no spelling for the function "${name}"`);
}

const HELPERS = [
  "",
  "def _cube_root(v):",
  "    r = abs(v) ** (1.0 / 3.0)",
  "    return math.copysign(r, v) if r == r else r",
  "",
  "",
  "# math.cbrt is exact (Python 3.11 and later); before that, the fallback is within a few ulp",
  '_cbrt = getattr(math, "cbrt", _cube_root)',
  "",
  "",
  "def _sign(v):",
  '    """JavaScript\'s Math.sign: -1.0, 1.0, or v itself for zero and NaN."""',
  "    return 1.0 if v > 0.0 else (-1.0 if v < 0.0 else v)",
  "",
  "",
  "def _min(*values):",
  '    """JavaScript\'s Math.min: NaN when any argument is NaN."""',
  "    return math.nan if any(v != v for v in values) else min(values)",
  "",
  "",
  "def _max(*values):",
  '    """JavaScript\'s Math.max: NaN when any argument is NaN."""',
  "    return math.nan if any(v != v for v in values) else max(values)",
];

function body(b: Body, indent: string): string[] {
  return [...b.temps.map((t) => `${indent}${t.name} = ${t.value}`), `${indent}return ${b.result}`];
}

function tuple(values: readonly number[]): string {
  return values.length === 1 ? `(${decimal(values[0])},)` : `(${values.map(decimal).join(", ")})`;
}

/** The Python language. */
export const PYTHON_LANGUAGE: Language = {
  name: "python",
  extension: ".py",
  spelling: {
    number: decimal,
    call,
    power: (base, exponent) => `math.pow(${base}, ${exponent})`,
    sqrt: (arg) => `math.sqrt(${arg})`,
  },
  usage() {
    return [
      "Each function is NAME(x, y) on floats. Where C gives NaN or an infinity (a logarithm of a",
      "negative number, a division by zero, an overflow) Python's math module raises ValueError,",
      "ZeroDivisionError or OverflowError instead.",
    ];
  },
  file(parts) {
    const f = parts.interfaces;
    const lines = parts.header.map((h) => (h ? `# ${h}` : "#"));
    lines.push("import math", "", ...HELPERS);
    if (f) {
      const columns = f.x.length + 1;
      lines.push(
        "",
        `_X_LINES = ${tuple(f.x)}`,
        `_Y_LINES = ${tuple(f.y)}`,
        "",
        "",
        "def _strips(lines, t, tol):",
        '    """The strips (from 0) along one axis whose closure holds t: one inside, two on a line."""',
        "    s = 0",
        "    while s < len(lines) and t > lines[s]:",
        "        s += 1",
        "    if s < len(lines) and abs(t - lines[s]) <= tol:",
        "        return (s, s + 1)",
        "    if s > 0 and abs(t - lines[s - 1]) <= tol:",
        "        return (s - 1, s)",
        "    return (s,)",
        "",
        "",
        "def regions_at(x, y):",
        '    """The regions (numbered from 1) whose closure holds (x, y): 1, 2 or 4 of them."""',
        `    xs = _strips(_X_LINES, x, ${decimal(f.xTolerance)})`,
        `    ys = _strips(_Y_LINES, y, ${decimal(f.yTolerance)})`,
        `    return [sy * ${columns} + sx + 1 for sy in ys for sx in xs]`,
        "",
        "",
        "def region(x, y):",
        '    """The region of (x, y); on an interface the lowest-numbered one (west, then south)."""',
        "    return regions_at(x, y)[0]",
      );
    }
    for (const q of parts.quantities) {
      lines.push("", "");
      if (!f) {
        lines.push(`def ${q.name}(x, y):`, `    """${q.summary}."""`, ...body(q.bodies[0], "    "));
        continue;
      }
      lines.push(`def ${q.name}_region(r, x, y):`, `    """${q.summary}, in region r."""`);
      q.bodies.forEach((b, r) => lines.push(`    if r == ${r + 1}:`, ...body(b, "        ")));
      lines.push(
        `    raise ValueError(f"no region {r}: the regions are 1 to ${q.bodies.length}")`,
        "",
        "",
        `def ${q.name}(x, y):`,
        `    """${q.summary}."""`,
        "    regions = regions_at(x, y)",
        "    total = 0.0",
        "    for r in regions:",
        `        total += ${q.name}_region(r, x, y)`,
        "    return total / len(regions)",
      );
    }
    return lines.join("\n") + "\n";
  },
};
