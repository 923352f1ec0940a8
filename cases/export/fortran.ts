/**
 * The Fortran emitter: a Fortran 2008 module of pure functions on `real64`, with the cube root
 * bound to the C library's `cbrt` (ISO_C_BINDING; Fortran has no cube-root intrinsic) and helpers
 * that give `sign`, `min` and `max` JavaScript's meaning.
 *
 * @module
 */
import type { Body } from "./_dag.ts";
import { decimal, type Language } from "./_language.ts";
import { nested } from "./c.ts";

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
  "abs",
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
  if (SAME.includes(name)) return `${name}(${a.join(", ")})`;
  if (Object.hasOwn(RECIPROCAL, name)) return `(1.0_dp / ${RECIPROCAL[name]}(${a[0]}))`;
  switch (name) {
    case "log":
      return a.length === 1 ? `log(${a[0]})` : `(log(${a[0]}) / log(${a[1]}))`;
    case "cbrt":
      return `c_cbrt(${a[0]})`;
    case "sign":
      return `gp_sign(${a[0]})`;
    case "min":
      return nested("gp_min", a);
    case "max":
      return nested("gp_max", a);
    case "hypot":
      return nested("hypot", a);
  }
  throw new RangeError(`the Fortran emitter has no spelling for the function "${name}"`);
}

/** Longest line written before a break (the standard allows 132 characters). */
const WIDTH = 100;

/** Breaks a long statement at spaces between tokens, with free-form `&` continuations. */
function wrap(line: string): string[] {
  if (line.trimStart().startsWith("!")) return [line];
  const indent = line.length - line.trimStart().length;
  const out: string[] = [];
  let rest = line;
  while (rest.length > WIDTH) {
    const cut = rest.lastIndexOf(" ", WIDTH - 2);
    if (cut <= indent + 4) break;
    out.push(`${rest.slice(0, cut)} &`);
    rest = `${" ".repeat(indent + 4)}& ${rest.slice(cut + 1)}`;
  }
  out.push(rest);
  return out;
}

function tempDeclarations(bodies: readonly Body[], indent: string): string[] {
  const most = Math.max(0, ...bodies.map((b) => b.temps.length));
  if (most === 0) return [];
  const names = Array.from({ length: most }, (_, k) => `t${k + 1}`);
  const lines: string[] = [];
  for (let k = 0; k < names.length; k += 12) {
    lines.push(`${indent}real(dp) :: ${names.slice(k, k + 12).join(", ")}`);
  }
  return lines;
}

function body(b: Body, indent: string): string[] {
  return [...b.temps.map((t) => `${indent}${t.name} = ${t.value}`), `${indent}v = ${b.result}`];
}

function list(values: readonly number[]): string {
  return values.length ? values.map((v) => `${decimal(v)}_dp`).join(", ") : "0.0_dp";
}

function functionHead(name: string, args: string, summary: string): string[] {
  return [
    "",
    `  ! ${summary}`,
    `  pure function ${name}(${args}) result(v)`,
    ...(args.startsWith("r,") ? ["    integer, intent(in) :: r"] : []),
    "    real(dp), intent(in) :: x, y",
    "    real(dp) :: v",
  ];
}

/** The Fortran language. */
export const FORTRAN_LANGUAGE: Language = {
  name: "fortran",
  extension: ".f90",
  spelling: {
    number: (v) => `${decimal(v)}_dp`,
    call,
    power: (base, exponent) => `(${base} ** ${exponent})`,
    sqrt: (arg) => `sqrt(${arg})`,
  },
  usage(parts) {
    return [
      `Module ${parts.ident}: each function is pure real(real64) NAME(x, y) with real(real64)`,
      "arguments. Compile with gfortran (Fortran 2008); the cube root calls the C library's cbrt.",
    ];
  },
  file(parts) {
    const f = parts.interfaces;
    const names = parts.quantities.map((q) => q.name);
    if (f) names.push("regions_at", "region", ...parts.quantities.map((q) => `${q.name}_region`));
    const lines = parts.header.map((h) => (h ? `! ${h}` : "!"));
    lines.push(
      `module ${parts.ident}`,
      "  use, intrinsic :: iso_fortran_env, only: real64",
      "  use, intrinsic :: iso_c_binding, only: c_double",
      "  use, intrinsic :: ieee_arithmetic, only: ieee_is_nan, ieee_value, ieee_quiet_nan",
      "  implicit none",
      "  private",
      ...names.map((n) => `  public :: ${n}`),
      "  integer, parameter :: dp = real64",
      "  interface",
      '    pure function c_cbrt(v) bind(c, name="cbrt")',
      "      import :: c_double",
      "      real(c_double), value :: v",
      "      real(c_double) :: c_cbrt",
      "    end function c_cbrt",
      "  end interface",
    );
    if (f) {
      lines.push(
        `  real(dp), parameter :: x_lines(${Math.max(1, f.x.length)}) = [${list(f.x)}]`,
        `  real(dp), parameter :: y_lines(${Math.max(1, f.y.length)}) = [${list(f.y)}]`,
      );
    }
    lines.push(
      "contains",
      "",
      "  ! JavaScript's Math.sign, Math.min and Math.max: NaN in, NaN out.",
      "  pure elemental function gp_sign(a) result(v)",
      "    real(dp), intent(in) :: a",
      "    real(dp) :: v",
      "    v = a",
      "    if (a > 0.0_dp) v = 1.0_dp",
      "    if (a < 0.0_dp) v = -1.0_dp",
      "  end function gp_sign",
      "",
      "  pure elemental function gp_min(a, b) result(v)",
      "    real(dp), intent(in) :: a, b",
      "    real(dp) :: v",
      "    if (ieee_is_nan(a) .or. ieee_is_nan(b)) then",
      "      v = ieee_value(a, ieee_quiet_nan)",
      "    else if (a < b) then",
      "      v = a",
      "    else",
      "      v = b",
      "    end if",
      "  end function gp_min",
      "",
      "  pure elemental function gp_max(a, b) result(v)",
      "    real(dp), intent(in) :: a, b",
      "    real(dp) :: v",
      "    if (ieee_is_nan(a) .or. ieee_is_nan(b)) then",
      "      v = ieee_value(a, ieee_quiet_nan)",
      "    else if (a > b) then",
      "      v = a",
      "    else",
      "      v = b",
      "    end if",
      "  end function gp_max",
    );
    if (f) {
      lines.push(
        "",
        "  ! The strips (from 0) along one axis whose closure holds t: one inside, two on a line.",
        "  pure subroutine strips(lines, n, t, tol, count, out)",
        "    real(dp), intent(in) :: lines(:), t, tol",
        "    integer, intent(in) :: n",
        "    integer, intent(out) :: count, out(2)",
        "    integer :: s",
        "    s = 0",
        "    do while (s < n)",
        "      if (.not. (t > lines(s + 1))) exit",
        "      s = s + 1",
        "    end do",
        "    count = 2",
        "    if (s < n) then",
        "      if (abs(t - lines(s + 1)) <= tol) then",
        "        out = [s, s + 1]",
        "        return",
        "      end if",
        "    end if",
        "    if (s > 0) then",
        "      if (abs(t - lines(s)) <= tol) then",
        "        out = [s - 1, s]",
        "        return",
        "      end if",
        "    end if",
        "    count = 1",
        "    out = [s, s]",
        "  end subroutine strips",
        "",
        "  ! The regions (numbered from 1) whose closure holds (x, y): count is 1, 2 or 4.",
        "  pure subroutine regions_at(x, y, count, regions)",
        "    real(dp), intent(in) :: x, y",
        "    integer, intent(out) :: count, regions(4)",
        "    integer :: sx(2), sy(2), nx, ny, i, j",
        `    call strips(x_lines, ${f.x.length}, x, ${decimal(f.xTolerance)}_dp, nx, sx)`,
        `    call strips(y_lines, ${f.y.length}, y, ${decimal(f.yTolerance)}_dp, ny, sy)`,
        "    count = 0",
        "    regions = 0",
        "    do j = 1, ny",
        "      do i = 1, nx",
        "        count = count + 1",
        `        regions(count) = sy(j) * ${f.x.length + 1} + sx(i) + 1`,
        "      end do",
        "    end do",
        "  end subroutine regions_at",
        "",
        "  ! The region of (x, y); on an interface the lowest-numbered one (west, then south).",
        "  pure integer function region(x, y)",
        "    real(dp), intent(in) :: x, y",
        "    integer :: count, regions(4)",
        "    call regions_at(x, y, count, regions)",
        "    region = regions(1)",
        "  end function region",
      );
    }
    for (const q of parts.quantities) {
      if (!f) {
        lines.push(...functionHead(q.name, "x, y", q.summary));
        lines.push(...tempDeclarations(q.bodies, "    "), ...body(q.bodies[0], "    "));
        lines.push(`  end function ${q.name}`);
        continue;
      }
      lines.push(...functionHead(`${q.name}_region`, "r, x, y", `${q.summary}, in region r`));
      lines.push(...tempDeclarations(q.bodies, "    "), "    select case (r)");
      q.bodies.forEach((b, r) => lines.push(`    case (${r + 1})`, ...body(b, "      ")));
      lines.push(
        "    case default",
        "      v = ieee_value(v, ieee_quiet_nan)",
        "    end select",
        `  end function ${q.name}_region`,
        ...functionHead(q.name, "x, y", q.summary),
        "    integer :: count, regions(4), k",
        "    call regions_at(x, y, count, regions)",
        "    v = 0.0_dp",
        "    do k = 1, count",
        `      v = v + ${q.name}_region(regions(k), x, y)`,
        "    end do",
        "    v = v / count",
        `  end function ${q.name}`,
      );
    }
    lines.push("", `end module ${parts.ident}`);
    return lines.flatMap(wrap).join("\n") + "\n";
  },
};
