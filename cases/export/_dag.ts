/**
 * The common-subexpression pass shared by every language's emitter: the same idea as the engine's
 * JavaScript compiler (`../compile.ts`). Identical subtrees are hash-consed to one node, constant
 * subtrees are folded with JavaScript's own `Math` (so folded constants are the very numbers the
 * harness uses), neutral elements are dropped the same way, and every node read twice or more
 * becomes a named temporary. Only the spelling of numbers, calls and powers differs per language:
 * that is the {@link Spelling} an emitter supplies.
 *
 * @module
 */
import type { Expr } from "../expression.ts";
import { applyOperator, NUMERIC } from "../compile.ts";

/** How one language spells what the expression trees contain. */
export interface Spelling {
  /** A finite, non-negative number as a literal of the language's double type. */
  number(value: number): string;
  /** A call of a whitelisted function (not `pow`, which is a power node) with rendered arguments. */
  call(name: string, args: readonly string[]): string;
  /** `base` to a non-integer or large power (integer powers 2…4 are written as products). */
  power(base: string, exponent: string): string;
  /** The square root (what `^0.5` is written as, as the engine does). */
  sqrt(arg: string): string;
}

/** One function body: temporaries in evaluation order, then the value. */
export interface Body {
  temps: { name: string; value: string }[];
  result: string;
}

interface Node {
  kind: "number" | "x" | "y" | "operator" | "call";
  name: string;
  value: number;
  kids: number[];
  /** small integer exponent of a power written as a product (0 when not) */
  intPower: number;
}

/** The numeric meaning of each whitelisted function: the engine's compiler's own folding table. */
const FOLD = NUMERIC;

/** Names of the functions an emitter must spell. */
export const EXPORTED_FUNCTIONS: readonly string[] = Object.keys(FOLD);

class Dag {
  readonly nodes: Node[] = [];
  readonly #index = new Map<string, number>();

  #add(node: Node): number {
    const key = node.kind === "number"
      ? `n${Object.is(node.value, -0) ? "-0" : String(node.value)}`
      : `${node.kind}:${node.name}(${node.kids.join(",")})`;
    const known = this.#index.get(key);
    if (known !== undefined) return known;
    this.nodes.push(node);
    this.#index.set(key, this.nodes.length - 1);
    return this.nodes.length - 1;
  }

  #number(value: number): number {
    return this.#add({ kind: "number", name: "", value, kids: [], intPower: 0 });
  }

  #operator(name: string, kids: number[]): number {
    return this.#add({ kind: "operator", name, value: 0, kids, intPower: 0 });
  }

  /** The engine's folding rules (`compile.ts`), so both evaluate the same arithmetic. */
  #fold(kind: "operator" | "call", name: string, kids: number[]): number | undefined {
    const nodes = kids.map((k) => this.nodes[k]);
    const num = (k: number) => nodes[k].kind === "number";
    const val = (k: number) => nodes[k].value;
    if (nodes.every((n) => n.kind === "number")) {
      const values = nodes.map((n) => n.value);
      const v = kind === "call" ? FOLD[name](values) : applyOperator(name, values);
      return Number.isFinite(v) ? this.#number(v) : undefined;
    }
    if (kind !== "operator") return undefined;
    switch (name) {
      case "neg":
        return nodes[0].kind === "operator" && nodes[0].name === "neg"
          ? nodes[0].kids[0]
          : undefined;
      case "+": {
        const rest = kids.filter((_, k) => !(num(k) && val(k) === 0));
        if (rest.length === kids.length) return undefined;
        if (rest.length === 0) return this.#number(0);
        return rest.length === 1 ? rest[0] : this.#operator("+", rest);
      }
      case "-":
        if (num(1) && val(1) === 0) return kids[0];
        if (num(0) && val(0) === 0) return this.#operator("neg", [kids[1]]);
        return undefined;
      case "*": {
        if (kids.some((_, k) => num(k) && val(k) === 0)) return this.#number(0);
        const rest = kids.filter((_, k) => !(num(k) && val(k) === 1));
        if (rest.length === kids.length) return undefined;
        if (rest.length === 0) return this.#number(1);
        return rest.length === 1 ? rest[0] : this.#operator("*", rest);
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

  intern(e: Expr): number {
    switch (e.kind) {
      case "number":
        if (!Number.isFinite(e.value)) {
          throw new RangeError(`cannot export the non-finite number ${e.value}`);
        }
        return this.#number(e.value);
      case "variable":
        return this.#add({ kind: e.name, name: "", value: 0, kids: [], intPower: 0 });
      case "operator":
      case "call": {
        const kids = e.args.map((a) => this.intern(a));
        let kind: "operator" | "call" = e.kind;
        let name = e.kind === "operator" ? e.op : e.name;
        if (kind === "call" && name === "pow") [kind, name] = ["operator", "^"];
        if (kind === "call" && !Object.hasOwn(FOLD, name)) {
          throw new RangeError(`cannot export a call of "${name}": not whitelisted`);
        }
        const folded = this.#fold(kind, name, kids);
        if (folded !== undefined) return folded;
        let intPower = 0;
        const exponent = kind === "operator" && name === "^" ? this.nodes[kids[1]] : undefined;
        if (
          exponent?.kind === "number" && Number.isInteger(exponent.value) &&
          Math.abs(exponent.value) >= 2 && Math.abs(exponent.value) <= 4
        ) intPower = exponent.value;
        return this.#add({ kind, name, value: 0, kids, intPower });
      }
    }
  }
}

/**
 * One expression as a function body in a language: shared subexpressions become temporaries
 * `prefix1`, `prefix2`, … (numbered in evaluation order), everything else is written inline.
 *
 * @param expr a checked expression tree (parameters already substituted)
 * @param spelling the language's numbers, calls and powers
 * @param prefix the temporaries' name prefix (default `t`)
 * @throws {RangeError} for a tree outside the whitelist (never for a tree the engine built)
 */
export function bodyOf(expr: Expr, spelling: Spelling, prefix = "t"): Body {
  const dag = new Dag();
  const root = dag.intern(expr);
  const n = dag.nodes.length;
  const uses = new Array<number>(n).fill(0);
  const reachable = new Array<boolean>(n).fill(false);
  const stack = [root];
  while (stack.length) {
    const id = stack.pop()!;
    if (reachable[id]) continue;
    reachable[id] = true;
    stack.push(...dag.nodes[id].kids);
  }
  for (let id = 0; id < n; id++) {
    if (!reachable[id]) continue;
    const node = dag.nodes[id];
    node.kids.forEach((k, position) => {
      if (node.intPower !== 0 && position === 1) return;
      // the base of a small integer power is read |p| times in the product
      uses[k] += node.intPower !== 0 ? Math.abs(node.intPower) : 1;
    });
  }
  const leaf = (id: number) => dag.nodes[id].kids.length === 0;
  const names = new Map<number, string>();
  const temps: Body["temps"] = [];
  const ref = (id: number): string => {
    const node = dag.nodes[id];
    if (node.kind === "number") {
      const text = spelling.number(Math.abs(node.value));
      return node.value < 0 || Object.is(node.value, -0) ? `(-${text})` : text;
    }
    if (node.kind === "x" || node.kind === "y") return node.kind;
    return names.get(id) ?? render(id);
  };
  const render = (id: number): string => {
    const node = dag.nodes[id];
    const args = node.kids.map(ref);
    if (node.kind === "call") return spelling.call(node.name, args);
    switch (node.name) {
      case "neg":
        return `(-${args[0]})`;
      case "^": {
        if (node.intPower !== 0) {
          const product = new Array(Math.abs(node.intPower)).fill(args[0]).join(" * ");
          return node.intPower > 0 ? `(${product})` : `(${spelling.number(1)} / (${product}))`;
        }
        const exponent = dag.nodes[node.kids[1]];
        if (exponent.kind === "number" && exponent.value === 0.5) return spelling.sqrt(args[0]);
        return spelling.power(args[0], args[1]);
      }
      default:
        return `(${args.join(` ${node.name} `)})`;
    }
  };
  // ids are in topological order: every temporary's operands are named before it
  for (let id = 0; id < n; id++) {
    if (!reachable[id] || leaf(id) || uses[id] < 2 || id === root) continue;
    const value = render(id);
    const name = `${prefix}${temps.length + 1}`;
    temps.push({ name, value });
    names.set(id, name);
  }
  return { temps, result: ref(root) };
}
