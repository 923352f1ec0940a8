/**
 * Builds and runs an exported case (`cases export`) in its own language, for the tests that compare
 * it with the harness: one program run per case evaluates every quantity at every point.
 *
 * @module
 */

/** A language's toolchain: found, or why not (for a skipped test's name). */
export type Toolchain = { command: string } | { missing: string };

async function works(command: string, args: string[]): Promise<boolean> {
  try {
    return (await new Deno.Command(command, { args, stdout: "null", stderr: "null" }).output())
      .success;
  } catch {
    // not installed (NotFound) or not runnable: the caller reports it as missing
    return false;
  }
}

/** The compiler or interpreter of a language, if this machine has one. */
export async function toolchainFor(language: string): Promise<Toolchain> {
  if (language === "c") {
    return await works("gcc", ["--version"]) ? { command: "gcc" } : { missing: "gcc not found" };
  }
  if (language === "fortran") {
    return await works("gfortran", ["--version"])
      ? { command: "gfortran" }
      : { missing: "gfortran not found (apt-get install gfortran)" };
  }
  for (const command of ["python3", "/usr/bin/python3"]) {
    if (await works(command, ["--version"])) return { command };
  }
  return { missing: "python3 not found" };
}

async function run(
  command: string,
  args: string[],
  options: { cwd: string; stdin?: string },
): Promise<string> {
  const child = new Deno.Command(command, {
    args,
    cwd: options.cwd,
    stdin: options.stdin === undefined ? "null" : "piped",
    stdout: "piped",
    stderr: "piped",
  }).spawn();
  if (options.stdin !== undefined) {
    const writer = child.stdin.getWriter();
    await writer.write(new TextEncoder().encode(options.stdin));
    await writer.close();
  }
  const out = await child.output();
  const stderr = new TextDecoder().decode(out.stderr);
  if (!out.success) {
    throw new Error(`${command} ${args.join(" ")} failed (exit ${out.code}):\n${stderr}`);
  }
  return new TextDecoder().decode(out.stdout);
}

/** Reads C's, Fortran's and Python's spellings of numbers, NaN and the infinities. */
function parseNumber(token: string): number {
  const t = token.toLowerCase().replace(/^[+-]?/, "");
  const sign = token.startsWith("-") ? -1 : 1;
  if (t === "nan") return NaN;
  if (t === "inf" || t === "infinity") return sign * Infinity;
  const value = Number(token);
  if (Number.isNaN(value)) throw new SyntaxError(`cannot read the number "${token}"`);
  return value;
}

/** What one program run needs. */
export interface ExportedProgram {
  language: string;
  toolchain: string;
  /** The exported file's text. */
  text: string;
  /** The case identifier (C prefix, Fortran module name). */
  ident: string;
  /** Function names to call, in output order. */
  names: readonly string[];
  points: readonly (readonly [number, number])[];
}

/**
 * Compiles (C: gcc -O0 -ffp-contract=off; Fortran: gfortran) or loads (Python) the exported file
 * with a small driver and evaluates every name at every point.
 *
 * @returns values[k · names.length + q] = names[q] at points[k]
 */
export async function evaluateExported(p: ExportedProgram): Promise<Float64Array> {
  const dir = await Deno.makeTempDir({ prefix: "gridproof-export-" });
  try {
    // String(v) is the shortest decimal that reads back to the same double in every language
    const input = [String(p.points.length), ...p.points.map(([x, y]) => `${x} ${y}`)].join("\n") +
      "\n";
    let output: string;
    if (p.language === "c") {
      const calls = p.names.map((n) => `    printf("%.17g\\n", ${p.ident}_${n}(x, y));`);
      await Deno.writeTextFile(`${dir}/case.c`, p.text);
      await Deno.writeTextFile(
        `${dir}/driver.c`,
        [
          "#include <stdio.h>",
          '#include "case.c"',
          "int main(void) {",
          "  int n;",
          '  if (scanf("%d", &n) != 1) return 1;',
          "  for (int k = 0; k < n; k++) {",
          "    double x, y;",
          '    if (scanf("%lf %lf", &x, &y) != 2) return 1;',
          ...calls,
          "  }",
          "  return 0;",
          "}",
          "",
        ].join("\n"),
      );
      await run(p.toolchain, [
        "-std=c99",
        "-Wall",
        "-Werror",
        "-O0",
        "-ffp-contract=off",
        "-o",
        "driver",
        "driver.c",
        "-lm",
      ], { cwd: dir });
      output = await run(`${dir}/driver`, [], { cwd: dir, stdin: input });
    } else if (p.language === "fortran") {
      await Deno.writeTextFile(`${dir}/case.f90`, p.text);
      await Deno.writeTextFile(
        `${dir}/driver.f90`,
        [
          "program driver",
          `  use ${p.ident}`,
          "  use, intrinsic :: iso_fortran_env, only: real64",
          "  implicit none",
          "  integer :: n, k",
          "  real(real64) :: x, y",
          "  read (*, *) n",
          "  do k = 1, n",
          "    read (*, *) x, y",
          ...p.names.map((name) => `    write (*, '(es26.17e3)') ${name}(x, y)`),
          "  end do",
          "end program driver",
          "",
        ].join("\n"),
      );
      await run(p.toolchain, [
        "-std=f2008",
        "-O0",
        "-ffp-contract=off",
        "-o",
        "driver",
        "case.f90",
        "driver.f90",
      ], { cwd: dir });
      output = await run(`${dir}/driver`, [], { cwd: dir, stdin: input });
    } else {
      await Deno.writeTextFile(`${dir}/exported_case.py`, p.text);
      await Deno.writeTextFile(
        `${dir}/driver.py`,
        [
          "import sys",
          "import exported_case",
          `names = ${JSON.stringify(p.names)}`,
          "data = sys.stdin.read().split()",
          "out = []",
          "for k in range(int(data[0])):",
          "    x, y = float(data[1 + 2 * k]), float(data[2 + 2 * k])",
          "    out.extend(repr(getattr(exported_case, name)(x, y)) for name in names)",
          'print("\\n".join(out))',
          "",
        ].join("\n"),
      );
      output = await run(p.toolchain, ["-B", "driver.py"], { cwd: dir, stdin: input });
    }
    const tokens = output.trim().split(/\s+/);
    const want = p.points.length * p.names.length;
    if (tokens.length !== want) {
      throw new Error(`the ${p.language} program printed ${tokens.length} values, not ${want}`);
    }
    return Float64Array.from(tokens, parseNumber);
  } finally {
    await Deno.remove(dir, { recursive: true });
  }
}
