#!/usr/bin/python3
"""Independent assembly and sparse direct solve of the reference solver's discrete problem.

Reads one JSON object on stdin:
  {"domain": {"x0", "x1", "y0", "y1"}, "nx", "ny", "a", "b", "c", "d", "e", "f" (node arrays,
   x fastest, length (nx+1)(ny+1)), "boundary": {"west"|"east"|"south"|"north":
   {"kind": "dirichlet"|"neumann"|"robin", "values": [...], "alpha"?, "beta"?}}
   (alpha and beta one number per side or one per node along it),
   "upwind"?: bool}
and writes {"solution": [...], "scipy": version} on stdout.

The assembly follows the discretization contract written in the reference solver's documentation,
re-implemented here from that text alone (no code shared with the solver):
- vertex grid, node (i, j) at (x0 + i*hx, y0 + j*hy), index j*(nx+1) + i;
- 5-point central differences for a*u_xx + b*u_x + c*u_yy + d*u_y + e*u = f; with "upwind",
  b*u_x and d*u_y by first-order one-sided differences taken on the side that keeps the matrix an
  M-matrix (b >= 0: forward, b < 0: backward; likewise d);
- Dirichlet nodes are identity rows u = g (a Robin side with beta = 0 counts as u = g/alpha);
- Neumann (du/dn = g, outward normal) and Robin (alpha*u + beta*du/dn = g) sides by ghost nodes:
  the ghost value comes from the central difference of the condition, and the interior stencil is
  applied at the boundary node;
- corners: if either side is Dirichlet the corner is Dirichlet, its value taken from the west/east
  side when that side is Dirichlet, otherwise from the south/north side; two Neumann/Robin sides
  give ghosts in both directions, each from its own side's data at the corner.

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

def assemble(p):
    nx, ny = int(p["nx"]), int(p["ny"])
    dom = p["domain"]
    hx = (dom["x1"] - dom["x0"]) / nx
    hy = (dom["y1"] - dom["y0"]) / ny
    n = (nx + 1) * (ny + 1)
    coef = {k: np.asarray(p[k], dtype=float) for k in "abcdef"}
    for k, v in coef.items():
        if v.shape != (n,):
            raise ValueError(f"field {k}: expected {n} values, got {v.shape}")
    bc = p["boundary"]
    upwind = bool(p.get("upwind", False))

    def idx(i, j):
        return j * (nx + 1) + i

    rows, cols, vals = [], [], []
    rhs = np.zeros(n)

    def add(r, c, v):
        rows.append(r)
        cols.append(c)
        vals.append(v)

    def fixed(side, pos):
        """The Dirichlet value of a side at a position, or None for a derivative side.

        A Robin side with beta = 0 is the Dirichlet condition u = g/alpha.
        """
        s = bc[side]
        if s["kind"] == "dirichlet":
            return s["values"][pos]
        if s["kind"] == "robin" and robin_weight(s, "beta", pos) == 0:
            return s["values"][pos] / robin_weight(s, "alpha", pos)
        return None

    def dirichlet_value(i, j):
        """The Dirichlet value of node (i, j), or None when the node is not Dirichlet.

        West/east data take precedence at corners where two Dirichlet sides meet.
        """
        for on_side, side, pos in (
            (i == 0, "west", j),
            (i == nx, "east", j),
            (j == 0, "south", i),
            (j == ny, "north", i),
        ):
            if on_side:
                g = fixed(side, pos)
                if g is not None:
                    return g
        return None

    def ghost(k, side, pos, weight, h, mirror, node):
        """Adds weight*u_ghost for the ghost of `side` at position `pos` along the side.

        u_ghost = u_mirror + 2h*g (Neumann) or u_mirror + (2h/beta)*(g - alpha*u_node) (Robin),
        from the central difference of the outward normal derivative.
        """
        s = bc[side]
        g = s["values"][pos]
        add(k, mirror, weight)
        if s["kind"] == "neumann":
            rhs[k] -= weight * 2 * h * g
        elif s["kind"] == "robin":
            alpha, beta = robin_weight(s, "alpha", pos), robin_weight(s, "beta", pos)
            add(k, node, -weight * 2 * h * alpha / beta)
            rhs[k] -= weight * 2 * h * g / beta
        else:
            raise ValueError(f"side {side}: unexpected kind {s['kind']}")

    for j in range(ny + 1):
        for i in range(nx + 1):
            k = idx(i, j)
            g = dirichlet_value(i, j)
            if g is not None:
                add(k, k, 1.0)
                rhs[k] = g
                continue
            a, b, c, d, e = (coef[q][k] for q in "abcde")
            cw, ce = a / hx**2, a / hx**2
            cs, cn = c / hy**2, c / hy**2
            cp = -2 * a / hx**2 - 2 * c / hy**2 + e
            if upwind:
                if b >= 0:
                    ce += b / hx
                    cp -= b / hx
                else:
                    cw -= b / hx
                    cp += b / hx
                if d >= 0:
                    cn += d / hy
                    cp -= d / hy
                else:
                    cs -= d / hy
                    cp += d / hy
            else:
                cw -= b / (2 * hx)
                ce += b / (2 * hx)
                cs -= d / (2 * hy)
                cn += d / (2 * hy)
            add(k, k, cp)
            rhs[k] += coef["f"][k]
            if i == 0:
                ghost(k, "west", j, cw, hx, idx(1, j), k)
            else:
                add(k, idx(i - 1, j), cw)
            if i == nx:
                ghost(k, "east", j, ce, hx, idx(nx - 1, j), k)
            else:
                add(k, idx(i + 1, j), ce)
            if j == 0:
                ghost(k, "south", i, cs, hy, idx(i, 1), k)
            else:
                add(k, idx(i, j - 1), cs)
            if j == ny:
                ghost(k, "north", i, cn, hy, idx(i, ny - 1), k)
            else:
                add(k, idx(i, j + 1), cn)
    matrix = sparse.csr_matrix((vals, (rows, cols)), shape=(n, n))  # duplicates are summed
    return matrix, rhs


def main():
    problem = json.load(sys.stdin)
    matrix, rhs = assemble(problem)
    solution = linalg.spsolve(matrix.tocsc(), rhs)
    json.dump({"solution": solution.tolist(), "scipy": scipy.__version__}, sys.stdout)


if __name__ == "__main__":
    main()
