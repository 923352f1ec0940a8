/**
 * gridproof command line: the one composition root. Each command lives in `harness/cli/` and
 * registers itself on the program; this file only wires them and maps errors to exit codes
 * (0 pass, 1 a verdict failed, 2 bad input).
 *
 * @module
 */
import { Command, CommanderError } from "commander";
import { registerCommands } from "./harness/cli/mod.ts";
import { exitCodeFor, formatError } from "./harness/cli/exit.ts";
import { narrowPermissions } from "./harness/cli/permissions.ts";
import { VERSION } from "./harness/version.ts";

async function main(args: string[]): Promise<number> {
  const program = new Command();
  program
    .name("gridproof")
    .description(
      "Verification harness for elliptic PDE solvers: manufactured solutions, observed order of " +
        "accuracy, grid convergence index and residual behaviour",
    )
    .version(`gridproof ${VERSION}`, "-V, --version", "print gridproof's version")
    .exitOverride()
    .showSuggestionAfterError(true)
    // an unknown option or command prints the valid ones
    .showHelpAfterError()
    // each command gives up the permissions it does not need before it starts
    .hook("preAction", (_program, action) => {
      const names: string[] = [];
      for (let at: Command | null = action; at?.parent; at = at.parent) names.unshift(at.name());
      narrowPermissions(names.join(" "));
    })
    .configureOutput({
      writeOut: (s) => Deno.stdout.writeSync(new TextEncoder().encode(s)),
      writeErr: (s) => Deno.stderr.writeSync(new TextEncoder().encode(s)),
    });
  let exitCode = 0;
  registerCommands(program, (code) => {
    exitCode = Math.max(exitCode, code);
  });
  try {
    await program.parseAsync(args, { from: "user" });
  } catch (error) {
    if (error instanceof CommanderError) {
      // help and version print and exit 0; every other commander error is bad usage
      return error.exitCode === 0 ? 0 : 2;
    }
    console.error(formatError(error));
    return exitCodeFor(error);
  }
  return exitCode;
}

if (import.meta.main) {
  Deno.exit(await main(Deno.args));
}
