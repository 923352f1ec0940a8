#!/usr/bin/python3
"""Independent assembly and sparse direct solve of the reference solver's stretched-grid system.

Reads one JSON object on stdin:
  {"x": [...], "y": [...] (node coordinates, nx+1 and ny+1 values), "a", "b", "c", "d", "e", "f"
   (node arrays, x fastest, (nx+1)(ny+1) values), "boundary": {side: {"kind":
   "dirichlet"|"neumann"|"robin"|"periodic", "values"?, "alpha"?, "beta"?}}}
and writes {"solution": [...] (every node, periodic images included), "scipy": version}.

Written from the module documentation of reference-solver/discretize_stretched.ts alone
(non-conservative form, no mixed term): non-uniform three-point differences for u_xx and u_x,
mirrored ghost nodes on Neumann/Robin sides folded in with the spacing of the first interval,
identity rows on Dirichlet sides (west/east value at a corner where both sides fix u), and the
periodic seam (node nx is the image of node 0, and the spacing across the seam is x[nx] - x[nx-1]).
"""
import json
import sys

import numpy as np
import scipy
from scipy import sparse
from scipy.sparse import linalg

from _scipy_sides import fixed_value, fixes_u, weight


def spacings(xs, periodic):
    """(hw, he) per unknown of one axis; the missing spacing at a side mirrors the present one."""
    n = len(xs) - 1
    m = n if periodic else n + 1
    hw, he = np.zeros(m), np.zeros(m)
    for i in range(m):
        he[i] = xs[i + 1] - xs[i] if i < n else xs[n] - xs[n - 1]
        if i > 0:
            hw[i] = xs[i] - xs[i - 1]
        else:
            hw[i] = xs[n] - xs[n - 1] if periodic else xs[1] - xs[0]
    return hw, he


def assemble(p):
    x, y = np.asarray(p["x"], float), np.asarray(p["y"], float)
    nx, ny = len(x) - 1, len(y) - 1
    bc = p["boundary"]
    px, py = bc["west"]["kind"] == "periodic", bc["south"]["kind"] == "periodic"
    mx, my = (nx if px else nx + 1), (ny if py else ny + 1)
    co = {k: np.asarray(p[k], float) for k in "abcdef"}
    hwx, hex_ = spacings(x, px)
    hsy, hny = spacings(y, py)
    rows, cols, vals = [], [], []
    rhs = np.zeros(mx * my)

    def add(r, c, v):
        rows.append(r)
        cols.append(c)
        vals.append(v)

    def unknown(i, j):
        return (j % my if py else j) * mx + (i % mx if px else i)

    for j in range(my):
        for i in range(mx):
            k = j * mx + i
            q = j * (nx + 1) + i
            # identity rows: west/east first at a corner
            fixed = None
            for on, side, pos in ((not px and i == 0, "west", j), (not px and i == nx, "east", j),
                                  (not py and j == 0, "south", i), (not py and j == ny, "north", i)):
                if on and fixes_u(bc[side]):
                    fixed = fixed_value(bc[side], pos)
                    break
            if fixed is not None:
                add(k, k, 1.0)
                rhs[k] = fixed
                continue
            hw, he, hs, hn = hwx[i], hex_[i], hsy[j], hny[j]
            a, b, c, d = co["a"][q], co["b"][q], co["c"][q], co["d"][q]
            w = 2 * a / (hw * (hw + he)) - b * he / (hw * (hw + he))
            ea = 2 * a / (he * (hw + he)) + b * hw / (he * (hw + he))
            s = 2 * c / (hs * (hs + hn)) - d * hn / (hs * (hs + hn))
            n = 2 * c / (hn * (hs + hn)) + d * hs / (hn * (hs + hn))
            centre = -2 * a / (hw * he) + b * (he - hw) / (hw * he)
            centre += -2 * c / (hs * hn) + d * (hn - hs) / (hs * hn) + co["e"][q]
            r = co["f"][q]
            # ghost nodes beyond a Neumann/Robin side: u_ghost = u_mirror + 2h(g - alpha u)/beta
            for on, side, pos, h, coef, mirror in (
                (not px and i == 0, "west", j, x[1] - x[0], "w", "e"),
                (not px and i == nx, "east", j, x[nx] - x[nx - 1], "e", "w"),
                (not py and j == 0, "south", i, y[1] - y[0], "s", "n"),
                (not py and j == ny, "north", i, y[ny] - y[ny - 1], "n", "s"),
            ):
                if not on:
                    continue
                sd = bc[side]
                alpha, beta = (0.0, 1.0) if sd["kind"] == "neumann" else (
                    weight(sd, "alpha", pos), weight(sd, "beta", pos))
                ghost = {"w": w, "e": ea, "s": s, "n": n}[coef]
                centre -= ghost * 2 * h * alpha / beta
                r -= ghost * 2 * h * sd["values"][pos] / beta
                if mirror == "e":
                    ea += ghost
                elif mirror == "w":
                    w += ghost
                elif mirror == "n":
                    n += ghost
                else:
                    s += ghost
                if coef == "w":
                    w = 0.0
                elif coef == "e":
                    ea = 0.0
                elif coef == "s":
                    s = 0.0
                else:
                    n = 0.0
            add(k, k, centre)
            for di, dj, v in ((-1, 0, w), (1, 0, ea), (0, -1, s), (0, 1, n)):
                if v != 0.0:
                    add(k, unknown(i + di, j + dj), v)
            rhs[k] = r
    matrix = sparse.csr_matrix((vals, (rows, cols)), shape=(mx * my, mx * my))
    return matrix, rhs, (nx, ny, mx, my)


def main():
    p = json.load(sys.stdin)
    matrix, rhs, (nx, ny, mx, my) = assemble(p)
    u = linalg.spsolve(matrix.tocsc(), rhs)
    full = np.zeros((ny + 1) * (nx + 1))
    for j in range(ny + 1):
        for i in range(nx + 1):
            full[j * (nx + 1) + i] = u[(j % my) * mx + (i % mx)]
    json.dump({"solution": full.tolist(), "scipy": scipy.__version__}, sys.stdout)


if __name__ == "__main__":
    main()
