/**
 * The engine's private mathjs instance, loaded on first use (importing mathjs costs a few hundred
 * milliseconds, so commands that never touch expressions never pay it).
 *
 * The instance is created with `create(all)` and then locked: the functions that could change it
 * or run text (`import`, `createUnit`, `evaluate`, `parse`, `simplify`, `derivative`, `compile`,
 * `resolve`, `reviver`, `config`) are replaced in its expression namespace by functions that refuse.
 * The engine keeps its own references to `parse`, `simplify` and `derivative`, taken before the
 * lock. Expressions from case files are never evaluated by mathjs anyway: they are parsed, checked
 * against the whitelist, and compiled by our own compiler; the lock is a second wall.
 *
 * @module
 */
import type { MathNode } from "mathjs";

/** The parts of mathjs the engine uses. */
export interface MathTools {
  parse(text: string): MathNode;
  simplify(node: MathNode): MathNode;
  derivative(node: MathNode, variable: string, options?: { simplify?: boolean }): MathNode;
  /** Node constructors, for building trees without text. */
  nodes: {
    ConstantNode: new (value: number) => MathNode;
    SymbolNode: new (name: string) => MathNode;
    OperatorNode: new (op: string, fn: string, args: MathNode[]) => MathNode;
    FunctionNode: new (fn: string | MathNode, args: MathNode[]) => MathNode;
    ParenthesisNode: new (content: MathNode) => MathNode;
  };
}

let cached: Promise<MathTools> | undefined;

const LOCKED = [
  "import",
  "createUnit",
  "evaluate",
  "parse",
  "simplify",
  "derivative",
  "compile",
  "resolve",
  "reviver",
  "config",
] as const;

/**
 * Loads mathjs once and returns the engine's locked private instance.
 *
 * @example
 * ```ts
 * import { loadMath } from "./_mathjs.ts";
 * const math = await loadMath();
 * math.derivative(math.parse("x^2"), "x").toString(); // "2 * x"
 * ```
 */
export function loadMath(): Promise<MathTools> {
  cached ??= (async () => {
    const mathjs = await import("mathjs");
    const instance = mathjs.create(mathjs.all);
    const tools: MathTools = {
      parse: instance.parse as unknown as MathTools["parse"],
      simplify: instance.simplify as unknown as MathTools["simplify"],
      derivative: instance.derivative as unknown as MathTools["derivative"],
      nodes: {
        ConstantNode: instance.ConstantNode as unknown as MathTools["nodes"]["ConstantNode"],
        SymbolNode: instance.SymbolNode as unknown as MathTools["nodes"]["SymbolNode"],
        OperatorNode: instance.OperatorNode as unknown as MathTools["nodes"]["OperatorNode"],
        FunctionNode: instance.FunctionNode as unknown as MathTools["nodes"]["FunctionNode"],
        ParenthesisNode: instance
          .ParenthesisNode as unknown as MathTools["nodes"]["ParenthesisNode"],
      },
    };
    const refusals: Record<string, () => never> = {};
    for (const name of LOCKED) {
      refusals[name] = () => {
        throw new Error(`${name} is disabled in gridproof's mathjs instance`);
      };
    }
    instance.import(refusals, { override: true });
    return tools;
  })();
  return cached;
}

/**
 * Evaluates a mathjs tree with mathjs's own evaluator (for tests and the benchmark only: the engine
 * samples cases with its compiled functions). The tree must have passed the whitelist.
 */
export function mathjsEvaluator(node: MathNode): (scope: Record<string, number>) => number {
  const compiled = node.compile();
  return (scope) => compiled.evaluate(scope) as number;
}
