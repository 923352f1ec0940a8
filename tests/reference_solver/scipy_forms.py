#!/usr/bin/python3
"""Independent assembly and sparse direct solve of the reference solver's two newer forms.

Reads one JSON object on stdin:
  {"domain": {"x0", "x1", "y0", "y1"}, "nx", "ny", "a", "b", "c", "d", "e", "f" (node arrays,
   x fastest), "m"?: node array, "conductivity"?: {"alongX": {"k11", "k12"?},
   "alongY": {"k12"?, "k22"}}, "boundary": {side: {"kind", "values", "alpha"?, "beta"?}} (Robin weights one
   number or one per node),
   "upwind"?: bool}
and writes {"solution": [...], "scipy": version} on stdout.

Written from the discretization contract in the reference solver's module documentation
(reference-solver/discretize.ts for the mixed term, reference-solver/discretize_conservative.ts for
the conservative form), not from its code, and by a different route: every row is built as a sum
of terms, each term a coefficient times the value of u at a grid point, and a point outside the
grid (a ghost) is replaced by the affine expression the side's condition gives for it.

Non-conservative form, a*u_xx + m*u_xy + c*u_yy + b*u_x + d*u_y + e*u = f:
- central second differences, central first differences (upwind: one-sided, forward when the
  coefficient is positive), m*u_xy by (u(i+1,j+1) - u(i+1,j-1) - u(i-1,j+1) + u(i-1,j-1))/(4hx hy);
- a ghost beyond a Neumann/Robin side is u_mirror + (2h/beta)(g - alpha*u_side), where u_side is
  the node on the side in the ghost's row (or column) and g the side's value there;
- Dirichlet nodes are identity rows; corners are Dirichlet when either side is (west/east value
  first).

Conservative form, div(K grad u) + b*u_x + d*u_y + e*u = f:
- control volume of node (i, j) extends hx/2 to each side that exists (half volume on a side,
  quarter at a corner); the row is (F_e - F_w)/wx + (G_n - G_s)/wy + b*u_x + d*u_y + e*u = f;
- F through the x-face between columns i and i+1 in row j: k11*(u(i+1,j) - u(i,j))/hx plus
  k12*Dy, Dy the four-node difference over rows j-1, j+1 divided by 4hy, or on a boundary row the
  two-row one-sided difference divided by 2hy; G alike with k22, k12 of the y-edge and Dx;
- a boundary face carries the conormal flux phi = g (Neumann) or (g - alpha*u)/beta (Robin):
  F_e = phi (east), F_w = -phi (west), G_n = phi (north), G_s = -phi (south);
- first-order terms: as inside away from the sides, the inward one-sided difference across a
  Neumann/Robin side.

Solved with scipy.sparse.linalg.spsolve (SuperLU).
"""

import json
import sys

import numpy as np
import scipy
import scipy.sparse as sparse
import scipy.sparse.linalg as linalg



def robin_weight(s, name, pos):
    """A Robin weight at a position along its side: one number for the side, or one per node."""
    w = s[name]
    return float(w[pos]) if isinstance(w, list) else float(w)

class Grid:
    def __init__(self, p):
        self.nx, self.ny = int(p["nx"]), int(p["ny"])
        dom = p["domain"]
        self.hx = (dom["x1"] - dom["x0"]) / self.nx
        self.hy = (dom["y1"] - dom["y0"]) / self.ny
        self.bc = p["boundary"]

    def idx(self, i, j):
        return j * (self.nx + 1) + i

    def fixed(self, side, pos):
        s = self.bc[side]
        if s["kind"] == "dirichlet":
            return s["values"][pos]
        if s["kind"] == "robin" and robin_weight(s, "beta", pos) == 0:
            return s["values"][pos] / robin_weight(s, "alpha", pos)
        return None

    def dirichlet_value(self, i, j):
        for on_side, side, pos in (
            (i == 0, "west", j),
            (i == self.nx, "east", j),
            (j == 0, "south", i),
            (j == self.ny, "north", i),
        ):
            if on_side:
                g = self.fixed(side, pos)
                if g is not None:
                    return g
        return None

    def alpha_beta(self, side, pos):
        s = self.bc[side]
        if s["kind"] == "robin":
            return robin_weight(s, "alpha", pos), robin_weight(s, "beta", pos)
        return 0.0, 1.0


def solve_system(n, rows, cols, vals, rhs):
    matrix = sparse.csr_matrix((vals, (rows, cols)), shape=(n, n))  # duplicates are summed
    return linalg.spsolve(matrix.tocsc(), rhs)


def nonconservative(p):
    g = Grid(p)
    nx, ny, hx, hy = g.nx, g.ny, g.hx, g.hy
    n = (nx + 1) * (ny + 1)
    co = {k: np.asarray(p[k], dtype=float) for k in "abcdef"}
    m = np.asarray(p["m"], dtype=float) if p.get("m") is not None else np.zeros(n)
    upwind = bool(p.get("upwind", False))

    def value_of(i, j):
        """u at grid point (i, j) as ({node: coefficient}, constant); ghosts by the conditions."""
        inside_x, inside_y = 0 <= i <= nx, 0 <= j <= ny
        if inside_x and inside_y:
            return {g.idx(i, j): 1.0}, 0.0
        if not inside_x and not inside_y:
            raise ValueError(f"ghost ({i}, {j}) lies outside two sides")
        if not inside_x:
            side, mirror, on, h, pos = (
                ("west", (1, j), (0, j), hx, j) if i < 0 else ("east", (nx - 1, j), (nx, j), hx, j)
            )
        else:
            side, mirror, on, h, pos = (
                ("south", (i, 1), (i, 0), hy, i) if j < 0 else ("north", (i, ny - 1), (i, ny), hy, i)
            )
        alpha, beta = g.alpha_beta(side, pos)
        gv = g.bc[side]["values"][pos]
        terms = {g.idx(*mirror): 1.0}
        if alpha != 0:
            k = g.idx(*on)
            terms[k] = terms.get(k, 0.0) - 2 * h * alpha / beta
        return terms, 2 * h * gv / beta

    rows, cols, vals = [], [], []
    rhs = np.zeros(n)
    for j in range(ny + 1):
        for i in range(nx + 1):
            k = g.idx(i, j)
            gd = g.dirichlet_value(i, j)
            if gd is not None:
                rows.append(k), cols.append(k), vals.append(1.0)
                rhs[k] = gd
                continue
            a, b, c, d, e, mm = co["a"][k], co["b"][k], co["c"][k], co["d"][k], co["e"][k], m[k]
            terms = {
                (-1, 0): a / hx**2,
                (1, 0): a / hx**2,
                (0, -1): c / hy**2,
                (0, 1): c / hy**2,
                (0, 0): -2 * a / hx**2 - 2 * c / hy**2 + e,
            }
            if upwind:
                if b > 0:
                    terms[(1, 0)] += b / hx
                    terms[(0, 0)] -= b / hx
                else:
                    terms[(-1, 0)] -= b / hx
                    terms[(0, 0)] += b / hx
                if d > 0:
                    terms[(0, 1)] += d / hy
                    terms[(0, 0)] -= d / hy
                else:
                    terms[(0, -1)] -= d / hy
                    terms[(0, 0)] += d / hy
            else:
                terms[(1, 0)] += b / (2 * hx)
                terms[(-1, 0)] -= b / (2 * hx)
                terms[(0, 1)] += d / (2 * hy)
                terms[(0, -1)] -= d / (2 * hy)
            if mm != 0:
                q = mm / (4 * hx * hy)
                for off, s in (((1, 1), q), ((1, -1), -q), ((-1, 1), -q), ((-1, -1), q)):
                    terms[off] = terms.get(off, 0.0) + s
            rhs[k] += co["f"][k]
            for (di, dj), coef in terms.items():
                if coef == 0:
                    continue
                expr, const = value_of(i + di, j + dj)
                for node, w in expr.items():
                    rows.append(k), cols.append(node), vals.append(coef * w)
                rhs[k] -= coef * const
    return solve_system(n, rows, cols, vals, rhs)


def conservative(p):
    g = Grid(p)
    nx, ny, hx, hy = g.nx, g.ny, g.hx, g.hy
    n = (nx + 1) * (ny + 1)
    co = {k: np.asarray(p[k], dtype=float) for k in "bdef"}
    K = p["conductivity"]
    k11 = np.asarray(K["alongX"]["k11"], dtype=float)
    k22 = np.asarray(K["alongY"]["k22"], dtype=float)
    k12x = np.asarray(K["alongX"].get("k12") or np.zeros(nx * (ny + 1)), dtype=float)
    k12y = np.asarray(K["alongY"].get("k12") or np.zeros((nx + 1) * ny), dtype=float)
    upwind = bool(p.get("upwind", False))

    def flux_x(i, j):
        """F through the x-face between columns i and i+1 in row j: {(col, row): coefficient}."""
        t = {}

        def add(ii, jj, v):
            t[(ii, jj)] = t.get((ii, jj), 0.0) + v

        add(i + 1, j, k11[j * nx + i] / hx)
        add(i, j, -k11[j * nx + i] / hx)
        c = k12x[j * nx + i]
        if 0 < j < ny:
            pairs, w = (j + 1, j - 1), c / (4 * hy)
        elif j == 0:
            pairs, w = (1, 0), c / (2 * hy)
        else:
            pairs, w = (ny, ny - 1), c / (2 * hy)
        for col in (i, i + 1):
            add(col, pairs[0], w)
            add(col, pairs[1], -w)
        return t

    def flux_y(i, j):
        """G through the y-face between rows j and j+1 in column i."""
        t = {}

        def add(ii, jj, v):
            t[(ii, jj)] = t.get((ii, jj), 0.0) + v

        add(i, j + 1, k22[j * (nx + 1) + i] / hy)
        add(i, j, -k22[j * (nx + 1) + i] / hy)
        c = k12y[j * (nx + 1) + i]
        if 0 < i < nx:
            pairs, w = (i + 1, i - 1), c / (4 * hx)
        elif i == 0:
            pairs, w = (1, 0), c / (2 * hx)
        else:
            pairs, w = (nx, nx - 1), c / (2 * hx)
        for row in (j, j + 1):
            add(pairs[0], row, w)
            add(pairs[1], row, -w)
        return t

    rows, cols, vals = [], [], []
    rhs = np.zeros(n)
    for j in range(ny + 1):
        for i in range(nx + 1):
            k = g.idx(i, j)
            gd = g.dirichlet_value(i, j)
            if gd is not None:
                rows.append(k), cols.append(k), vals.append(1.0)
                rhs[k] = gd
                continue
            wx = (hx / 2 if i > 0 else 0) + (hx / 2 if i < nx else 0)
            wy = (hy / 2 if j > 0 else 0) + (hy / 2 if j < ny else 0)
            row = {}
            const = 0.0

            def add_terms(terms, scale):
                for key, v in terms.items():
                    row[key] = row.get(key, 0.0) + scale * v

            def boundary_face(side, pos, w):
                nonlocal const
                s = g.bc[side]
                alpha, beta = g.alpha_beta(side, pos)
                # the face adds phi / w, phi = (g - alpha u) / beta
                const += s["values"][pos] / (beta * w)
                row[(i, j)] = row.get((i, j), 0.0) - alpha / (beta * w)

            if i < nx:
                add_terms(flux_x(i, j), 1 / wx)
            else:
                boundary_face("east", j, wx)
            if i > 0:
                add_terms(flux_x(i - 1, j), -1 / wx)
            else:
                boundary_face("west", j, wx)
            if j < ny:
                add_terms(flux_y(i, j), 1 / wy)
            else:
                boundary_face("north", i, wy)
            if j > 0:
                add_terms(flux_y(i, j - 1), -1 / wy)
            else:
                boundary_face("south", i, wy)
            b, d = co["b"][k], co["d"][k]
            # b*u_x: inward one-sided on a side, central or upwind inside
            if i == 0:
                add_terms({(1, j): b / hx, (0, j): -b / hx}, 1)
            elif i == nx:
                add_terms({(nx, j): b / hx, (nx - 1, j): -b / hx}, 1)
            elif not upwind:
                add_terms({(i + 1, j): b / (2 * hx), (i - 1, j): -b / (2 * hx)}, 1)
            elif b > 0:
                add_terms({(i + 1, j): b / hx, (i, j): -b / hx}, 1)
            else:
                add_terms({(i, j): b / hx, (i - 1, j): -b / hx}, 1)
            if j == 0:
                add_terms({(i, 1): d / hy, (i, 0): -d / hy}, 1)
            elif j == ny:
                add_terms({(i, ny): d / hy, (i, ny - 1): -d / hy}, 1)
            elif not upwind:
                add_terms({(i, j + 1): d / (2 * hy), (i, j - 1): -d / (2 * hy)}, 1)
            elif d > 0:
                add_terms({(i, j + 1): d / hy, (i, j): -d / hy}, 1)
            else:
                add_terms({(i, j): d / hy, (i, j - 1): -d / hy}, 1)
            row[(i, j)] = row.get((i, j), 0.0) + co["e"][k]
            rhs[k] = co["f"][k] - const
            for (ii, jj), v in row.items():
                if v != 0:
                    rows.append(k), cols.append(g.idx(ii, jj)), vals.append(v)
    return solve_system(n, rows, cols, vals, rhs)


def main():
    problem = json.load(sys.stdin)
    if problem.get("conductivity") is not None:
        solution = conservative(problem)
    else:
        solution = nonconservative(problem)
    json.dump({"solution": solution.tolist(), "scipy": scipy.__version__}, sys.stdout)


if __name__ == "__main__":
    main()
