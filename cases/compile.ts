/**
 * The compiler from the engine's checked expression tree ({@link Expr}) to plain JavaScript.
 *
 * Source text is generated from the checked tree only and contains nothing but numeric literals,
 * the coordinates `x` and `y`, loop counters, local temporaries and calls of `Math.*` functions
 * looked up in a fixed table. Identical subtrees are hashed to one node (hash-consing on a
 * canonical key), so every repeated subexpression is evaluated once. Several expressions can be
 * compiled into one fused function, which shares their common subexpressions too.
 *
 * The grid sampler goes further: subtrees that depend on x alone are evaluated once per column into
 * tables, subtrees that depend on y alone once per row, constant subtrees once per compilation.
 *
 * Semantics are real-valued: where mathjs would return a complex number (sqrt of a negative number,
 * a negative base to a fractional power) the compiled code gives NaN, which sampling reports.
 *
 * @module
 */
import type { Expr } from "./expression.ts";

/** A compiled point function. */
export type PointFunction = (x: number, y: number) => number;

/** Several expressions fused: writes output k at `out[k]`. */
export type FusedPointFunction = (x: number, y: number, out: Float64Array) => void;

/**
 * A compiled grid sampler: fills rows j0 ≤ j < j1 of nodes (x0 + i·hx, y0 + j·hy), 0 ≤ i ≤ nx,
 * writing output k at `outputs[k][j·(nx + 1) + i]`.
 */
export type RowSampler = (
  x0: number,
  hx: number,
  nx: number,
  y0: number,
  hy: number,
  j0: number,
  j1: number,
  outputs: Float64Array[],
) => void;

/** Math functions the generated code may call, by expression function name. */
const CALLS: Readonly<Record<string, (args: string[]) => string>> = {
  sin: (a) => `Math.sin(${a[0]})`,
  cos: (a) => `Math.cos(${a[0]})`,
  tan: (a) => `Math.tan(${a[0]})`,
  sec: (a) => `(1 / Math.cos(${a[0]}))`,
  csc: (a) => `(1 / Math.sin(${a[0]}))`,
  cot: (a) => `(1 / Math.tan(${a[0]}))`,
  asin: (a) => `Math.asin(${a[0]})`,
  acos: (a) => `Math.acos(${a[0]})`,
  atan: (a) => `Math.atan(${a[0]})`,
  atan2: (a) => `Math.atan2(${a[0]}, ${a[1]})`,
  sinh: (a) => `Math.sinh(${a[0]})`,
  cosh: (a) => `Math.cosh(${a[0]})`,
  tanh: (a) => `Math.tanh(${a[0]})`,
  sech: (a) => `(1 / Math.cosh(${a[0]}))`,
  csch: (a) => `(1 / Math.sinh(${a[0]}))`,
  coth: (a) => `(1 / Math.tanh(${a[0]}))`,
  exp: (a) => `Math.exp(${a[0]})`,
  log: (a) => a.length === 1 ? `Math.log(${a[0]})` : `(Math.log(${a[0]}) / Math.log(${a[1]}))`,
  log10: (a) => `Math.log10(${a[0]})`,
  sqrt: (a) => `Math.sqrt(${a[0]})`,
  cbrt: (a) => `Math.cbrt(${a[0]})`,
  abs: (a) => `Math.abs(${a[0]})`,
  sign: (a) => `Math.sign(${a[0]})`,
  min: (a) => `Math.min(${a.join(", ")})`,
  max: (a) => `Math.max(${a.join(", ")})`,
  hypot: (a) => `Math.hypot(${a.join(", ")})`,
};

/**
 * Numeric versions of {@link CALLS}, for folding constant subtrees at compile time (the code
 * exporters fold with the same table, so exported and compiled values agree).
 */
export const NUMERIC: Readonly<Record<string, (a: number[]) => number>> = {
  sin: (a) => Math.sin(a[0]),
  cos: (a) => Math.cos(a[0]),
  tan: (a) => Math.tan(a[0]),
  sec: (a) => 1 / Math.cos(a[0]),
  csc: (a) => 1 / Math.sin(a[0]),
  cot: (a) => 1 / Math.tan(a[0]),
  asin: (a) => Math.asin(a[0]),
  acos: (a) => Math.acos(a[0]),
  atan: (a) => Math.atan(a[0]),
  atan2: (a) => Math.atan2(a[0], a[1]),
  sinh: (a) => Math.sinh(a[0]),
  cosh: (a) => Math.cosh(a[0]),
  tanh: (a) => Math.tanh(a[0]),
  sech: (a) => 1 / Math.cosh(a[0]),
  csch: (a) => 1 / Math.sinh(a[0]),
  coth: (a) => 1 / Math.tanh(a[0]),
  exp: (a) => Math.exp(a[0]),
  log: (a) => a.length === 1 ? Math.log(a[0]) : Math.log(a[0]) / Math.log(a[1]),
  log10: (a) => Math.log10(a[0]),
  sqrt: (a) => Math.sqrt(a[0]),
  cbrt: (a) => Math.cbrt(a[0]),
  abs: (a) => Math.abs(a[0]),
  sign: (a) => Math.sign(a[0]),
  min: (a) => Math.min(...a),
  max: (a) => Math.max(...a),
  hypot: (a) => Math.hypot(...a),
};

/** The value of one operator of an {@link Expr} on numbers (constant folding; the exporters fold with it too). */
export function applyOperator(op: string, v: number[]): number {
  switch (op) {
    case "neg":
      return -v[0];
    case "+":
      return v.reduce((p, q) => p + q);
    case "-":
      return v[0] - v[1];
    case "*":
      return v.reduce((p, q) => p * q);
    case "/":
      return v[0] / v[1];
    case "^":
      return Math.pow(v[0], v[1]);
  }
  return NaN;
}

/** Names of the functions the compiler can translate. */
export const COMPILABLE_FUNCTIONS: readonly string[] = Object.keys(CALLS);

interface Node {
  id: number;
  kind: "number" | "x" | "y" | "operator" | "call";
  /** operator symbol or function name */
  name: string;
  value: number;
  kids: number[];
  /** bit 1: depends on x, bit 2: depends on y */
  level: number;
  /** small integer exponent of a power node rendered as products (0 when not) */
  intPower: number;
}

function literal(v: number): string {
  if (!Number.isFinite(v)) throw new RangeError(`cannot compile the non-finite number ${v}`);
  if (Object.is(v, -0)) return "(-0)";
  return v < 0 ? `(${String(v)})` : String(v);
}

/** Hash-conses expression trees into a DAG whose ids are in topological order. */
class Dag {
  readonly nodes: Node[] = [];
  readonly #index = new Map<string, number>();

  #number(value: number): number {
    return this.intern({ kind: "number", value });
  }

  /**
   * Folds constants and drops neutral elements (x·1, x + 0, x^1, x·0 → 0, …), which mathjs's raw
   * derivatives are full of. x·0 → 0 assumes x finite, as symbolic simplification does.
   */
  #fold(kind: "operator" | "call", name: string, kids: number[]): number | undefined {
    const nodes = kids.map((k) => this.nodes[k]);
    const num = (k: number) => nodes[k].kind === "number";
    const val = (k: number) => nodes[k].value;
    if (nodes.every((n) => n.kind === "number")) {
      const v = kind === "call" ? NUMERIC[name](nodes.map((n) => n.value)) : applyOperator(
        name,
        nodes.map((n) => n.value),
      );
      // keep non-finite results (e.g. log(0)) as operations, so sampling reports them
      return Number.isFinite(v) ? this.#number(v) : undefined;
    }
    if (kind !== "operator") return undefined;
    switch (name) {
      case "neg":
        if (nodes[0].kind === "operator" && nodes[0].name === "neg") return nodes[0].kids[0];
        return undefined;
      case "+": {
        const rest = kids.filter((_, k) => !(num(k) && val(k) === 0));
        if (rest.length === kids.length) return undefined;
        if (rest.length === 0) return this.#number(0);
        if (rest.length === 1) return rest[0];
        return this.#internOperator("+", rest);
      }
      case "-":
        if (num(1) && val(1) === 0) return kids[0];
        if (num(0) && val(0) === 0) return this.#internOperator("neg", [kids[1]]);
        return undefined;
      case "*": {
        if (kids.some((_, k) => num(k) && val(k) === 0)) return this.#number(0);
        const rest = kids.filter((_, k) => !(num(k) && val(k) === 1));
        if (rest.length === kids.length) return undefined;
        if (rest.length === 0) return this.#number(1);
        if (rest.length === 1) return rest[0];
        return this.#internOperator("*", rest);
      }
      case "/":
        if (num(1) && val(1) === 1) return kids[0];
        if (num(0) && val(0) === 0 && num(1) && val(1) !== 0) return this.#number(0);
        return undefined;
      case "^":
        if (num(1) && val(1) === 1) return kids[0];
        if (num(1) && val(1) === 0) return this.#number(1);
        return undefined;
    }
    return undefined;
  }

  #internOperator(op: string, kids: number[]): number {
    const key = `operator:${op}(${kids.join(",")})`;
    const known = this.#index.get(key);
    if (known !== undefined) return known;
    let level = 0;
    for (const k of kids) level |= this.nodes[k].level;
    const id = this.nodes.length;
    this.nodes.push({ id, kind: "operator", name: op, value: 0, kids, level, intPower: 0 });
    this.#index.set(key, id);
    return id;
  }

  intern(e: Expr): number {
    let kind: Node["kind"];
    let name = "";
    let value = 0;
    let kids: number[] = [];
    switch (e.kind) {
      case "number":
        kind = "number";
        value = e.value;
        literal(value);
        break;
      case "variable":
        kind = e.name;
        break;
      case "operator":
        kind = "operator";
        name = e.op;
        kids = e.args.map((a) => this.intern(a));
        break;
      case "call":
        if (e.name !== "pow" && !Object.hasOwn(CALLS, e.name)) {
          throw new RangeError(`cannot compile a call of "${e.name}": not whitelisted`);
        }
        kind = "call";
        name = e.name;
        kids = e.args.map((a) => this.intern(a));
        break;
    }
    // pow(a, b) is the same node as a ^ b
    if (kind === "call" && name === "pow") {
      kind = "operator";
      name = "^";
    }
    if (kind === "operator" || kind === "call") {
      const folded = this.#fold(kind, name, kids);
      if (folded !== undefined) return folded;
    }
    const key = kind === "number" ? `n${String(value)}` : `${kind}:${name}(${kids.join(",")})`;
    const known = this.#index.get(key);
    if (known !== undefined) return known;
    let level = kind === "x" ? 1 : kind === "y" ? 2 : 0;
    for (const k of kids) level |= this.nodes[k].level;
    let intPower = 0;
    if (kind === "operator" && name === "^") {
      const exponent = this.nodes[kids[1]];
      if (
        exponent.kind === "number" && Number.isInteger(exponent.value) &&
        Math.abs(exponent.value) >= 2 && Math.abs(exponent.value) <= 4
      ) intPower = exponent.value;
    }
    const id = this.nodes.length;
    this.nodes.push({ id, kind, name, value, kids, level, intPower });
    this.#index.set(key, id);
    return id;
  }
}

type Mode = "point" | "grid";

/** Context a node of a given dependency level is computed in. */
function contextOf(level: number, mode: Mode): number {
  if (level === 0) return 0;
  return mode === "point" ? 3 : level;
}

interface Plan {
  dag: Dag;
  roots: number[];
  ctx: number[];
  /** node gets a named temporary in its own context */
  temp: boolean[];
  /** node is read from a context other than its own */
  cross: boolean[];
}

function plan(exprs: readonly Expr[], mode: Mode): Plan {
  const dag = new Dag();
  const roots = exprs.map((e) => dag.intern(e));
  const n = dag.nodes.length;
  const ctx = dag.nodes.map((node) => contextOf(node.level, mode));
  const sameUses = new Float64Array(n);
  const cross = new Array<boolean>(n).fill(false);
  const reachable = new Array<boolean>(n).fill(false);
  const stack = [...roots];
  while (stack.length) {
    const id = stack.pop()!;
    if (reachable[id]) continue;
    reachable[id] = true;
    for (const k of dag.nodes[id].kids) stack.push(k);
  }
  const leaf = (id: number) => dag.nodes[id].kids.length === 0;
  for (let id = 0; id < n; id++) {
    if (!reachable[id]) continue;
    const node = dag.nodes[id];
    node.kids.forEach((k, position) => {
      if (leaf(k)) return;
      // the base of a small integer power is read |p| times in the product
      const weight = node.intPower !== 0 && position === 0 ? Math.abs(node.intPower) : 1;
      if (node.intPower !== 0 && position === 1) return;
      if (ctx[k] === ctx[id]) sameUses[k] += weight;
      else cross[k] = true;
    });
  }
  for (const r of roots) {
    if (leaf(r)) continue;
    if (ctx[r] === 3 || mode === "point" && ctx[r] !== 0) sameUses[r] += 1;
    else cross[r] = true;
  }
  const temp = dag.nodes.map((_node, id) =>
    reachable[id] && !leaf(id) && (sameUses[id] >= 2 || (cross[id] && ctx[id] !== 1))
  );
  return { dag, roots, ctx, temp, cross };
}

/** Renders node `id` as read from context `from`. */
function renderer(p: Plan) {
  const name = (id: number, from: number): string => {
    const c = p.ctx[id];
    if (c === 0) return `c${id}`;
    if (c === 1) return from === 1 ? `t${id}` : `X${id}[i]`;
    if (c === 2) return `r${id}`;
    return `t${id}`;
  };
  const ref = (id: number, from: number): string => {
    const node = p.dag.nodes[id];
    if (node.kind === "number") return literal(node.value);
    if (node.kind === "x") return "x";
    if (node.kind === "y") return "y";
    if (p.ctx[id] !== from || p.temp[id]) return name(id, from);
    return expression(id, from);
  };
  const expression = (id: number, from: number): string => {
    const node = p.dag.nodes[id];
    const args = node.kids.map((k) => ref(k, from));
    if (node.kind === "call") return CALLS[node.name](args);
    switch (node.name) {
      case "neg":
        return `(-${args[0]})`;
      case "+":
      case "-":
      case "*":
      case "/":
        return `(${args.join(` ${node.name} `)})`;
      case "^": {
        if (node.intPower !== 0) {
          const product = new Array(Math.abs(node.intPower)).fill(args[0]).join(" * ");
          return node.intPower > 0 ? `(${product})` : `(1 / (${product}))`;
        }
        const exponent = p.dag.nodes[node.kids[1]];
        if (exponent.kind === "number" && exponent.value === 0.5) return `Math.sqrt(${args[0]})`;
        if (exponent.kind === "number" && exponent.value === 1) return args[0];
        return `Math.pow(${args[0]}, ${args[1]})`;
      }
    }
    throw new RangeError(`cannot compile the operator ${node.name}`);
  };
  return { ref, expression, name };
}

/** Statements computing the named temporaries of context `c`, in topological order. */
function statements(p: Plan, c: number, indent: string): string[] {
  const r = renderer(p);
  const out: string[] = [];
  for (let id = 0; id < p.dag.nodes.length; id++) {
    if (p.ctx[id] !== c) continue;
    const needed = p.temp[id] || (c === 1 && p.cross[id]);
    if (!needed) continue;
    const local = c === 0 ? `c${id}` : c === 2 ? `r${id}` : `t${id}`;
    out.push(`${indent}const ${local} = ${r.expression(id, c)};`);
    if (c === 1 && p.cross[id]) out.push(`${indent}X${id}[i] = ${local};`);
  }
  return out;
}

/**
 * Generates the body of a factory that returns a point function: `(x, y) => number` for one
 * expression, `(x, y, out) => void` for several.
 */
export function pointSource(exprs: readonly Expr[]): string {
  const p = plan(exprs, "point");
  const r = renderer(p);
  const lines = ['"use strict";', ...statements(p, 0, "")];
  if (exprs.length === 1) {
    lines.push("return function (x, y) {", ...statements(p, 3, "  "));
    lines.push(`  return ${r.ref(p.roots[0], 3)};`, "};");
  } else {
    lines.push("return function (x, y, out) {", ...statements(p, 3, "  "));
    p.roots.forEach((root, k) => lines.push(`  out[${k}] = ${r.ref(root, 3)};`));
    lines.push("};");
  }
  return lines.join("\n");
}

/** Generates the body of a factory that returns a {@link RowSampler} for the expressions. */
export function rowSamplerSource(exprs: readonly Expr[]): string {
  const p = plan(exprs, "grid");
  const r = renderer(p);
  const tables = p.dag.nodes.filter((node) => p.ctx[node.id] === 1 && p.cross[node.id]);
  const lines = ['"use strict";', ...statements(p, 0, "")];
  lines.push("return function (x0, hx, nx, y0, hy, j0, j1, outputs) {");
  exprs.forEach((_, k) => lines.push(`  const o${k} = outputs[${k}];`));
  for (const node of tables) lines.push(`  const X${node.id} = new Float64Array(nx + 1);`);
  const columnWork = statements(p, 1, "    ");
  if (columnWork.length) {
    lines.push("  for (let i = 0; i <= nx; i++) {", "    const x = x0 + i * hx;", ...columnWork);
    lines.push("  }");
  }
  lines.push("  for (let j = j0; j < j1; j++) {", "    const y = y0 + j * hy;");
  lines.push("    const base = j * (nx + 1);", ...statements(p, 2, "    "));
  lines.push("    for (let i = 0; i <= nx; i++) {", "      const x = x0 + i * hx;");
  lines.push(...statements(p, 3, "      "));
  p.roots.forEach((root, k) => lines.push(`      o${k}[base + i] = ${r.ref(root, 3)};`));
  lines.push("    }", "  }", "};");
  return lines.join("\n");
}

/**
 * Turns generated factory source (from {@link pointSource} or {@link rowSamplerSource}) into the
 * function. The source comes only from this module's generators.
 */
export function instantiate<T>(source: string): T {
  return new Function(source)() as T;
}

/**
 * Compiles one checked expression to a point function (common subexpressions evaluated once).
 *
 * @example
 * ```ts
 * import { compileExpr } from "./compile.ts";
 * const f = compileExpr({ kind: "call", name: "sin", args: [{ kind: "variable", name: "x" }] });
 * f(0, 0); // 0
 * ```
 */
export function compileExpr(expr: Expr): PointFunction {
  return instantiate<PointFunction>(pointSource([expr]));
}

/** Compiles several checked expressions into one fused point function sharing their work. */
export function compileFused(exprs: readonly Expr[]): FusedPointFunction {
  return instantiate<FusedPointFunction>(pointSource(exprs));
}

/** Compiles several checked expressions into one grid sampler; returns it with its source text. */
export function compileRowSampler(exprs: readonly Expr[]): { source: string; run: RowSampler } {
  const source = rowSamplerSource(exprs);
  return { source, run: instantiate<RowSampler>(source) };
}
