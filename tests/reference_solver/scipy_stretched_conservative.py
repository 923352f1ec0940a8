#!/usr/bin/python3
"""Independent assembly and sparse direct solve of the reference solver's conservative (flux-form)
system on stretched and periodic grids.

Reads one JSON object on stdin:
  {"x": [...], "y": [...] (node coordinates), "k11x": [...] (k11 at the x-edge midpoints, nx by
   ny + 1, x fastest), "k22y": [...] (k22 at the y-edge midpoints, nx + 1 by ny), "b", "d", "e",
   "f" (node arrays, x fastest), "boundary": {side: {"kind": "dirichlet"|"neumann"|"robin"|
   "periodic", "values"?, "alpha"?, "beta"?}}}
and writes {"solution": [...] (every node, periodic images included), "scipy": version}.

Written from the module documentation of reference-solver/discretize_stretched.ts alone (the
paragraph on the conservative form): a control volume around every node whose width is half the
spacing on each side (none beyond a non-periodic side), the flux k11 (u_E - u_P)/he through the
east face and alike for the other faces, the conormal flux (K grad u).n of the boundary condition
through a boundary face (Neumann g, Robin (g - alpha u)/beta), the non-uniform three-point first
derivative at interior and periodic nodes and the inward one-sided difference on Neumann/Robin
sides, identity rows on Dirichlet sides (west/east value at a corner where both fix u).
"""
import json
import sys

import numpy as np
import scipy
from scipy import sparse
from scipy.sparse import linalg

from _scipy_sides import fixed_value, fixes_u, weight


def assemble(p):
    x, y = np.asarray(p["x"], float), np.asarray(p["y"], float)
    nx, ny = len(x) - 1, len(y) - 1
    bc = p["boundary"]
    px, py = bc["west"]["kind"] == "periodic", bc["south"]["kind"] == "periodic"
    mx, my = (nx if px else nx + 1), (ny if py else ny + 1)
    k11 = np.asarray(p["k11x"], float).reshape(ny + 1, nx)
    k22 = np.asarray(p["k22y"], float).reshape(ny, nx + 1)
    node = {k: np.asarray(p[k], float).reshape(ny + 1, nx + 1) for k in "bdef"}
    size = mx * my
    A = sparse.lil_matrix((size, size))
    rhs = np.zeros(size)

    def unknown(i, j):
        return (j % my) * mx + (i % mx)

    def axis(coords, periodic, i, n):
        """Spacings to the lower and upper neighbour (None where a non-periodic side ends)."""
        lower = coords[i] - coords[i - 1] if i > 0 else (coords[n] - coords[n - 1] if periodic else None)
        upper = coords[i + 1] - coords[i] if i < n else None
        if periodic and i == 0:
            upper = coords[1] - coords[0]
        return lower, upper

    def flux_condition(side, pos):
        """(alpha/beta, g/beta) of the conormal flux phi = (g - alpha u)/beta."""
        s = bc[side]
        if s["kind"] == "neumann":
            return 0.0, s["values"][pos]
        beta = weight(s, "beta", pos)
        return weight(s, "alpha", pos) / beta, s["values"][pos] / beta

    for j in range(my):
        for i in range(mx):
            k = unknown(i, j)
            fixed = None
            for on, side, pos in ((not px and i == 0, "west", j), (not px and i == nx, "east", j),
                                  (not py and j == 0, "south", i), (not py and j == ny, "north", i)):
                if on and fixes_u(bc[side]):
                    fixed = fixed_value(bc[side], pos)
                    break
            if fixed is not None:
                A[k, k] = 1.0
                rhs[k] = fixed
                continue
            r = node["f"][j, i]
            A[k, k] += node["e"][j, i]
            # x: faces of the control volume, then the first-order term
            hw, he = axis(x, px, i, nx)
            wx = (hw or 0.0) / 2 + (he or 0.0) / 2
            if he is not None:
                kf = k11[j, i]
                A[k, unknown(i + 1, j)] += kf / (he * wx)
                A[k, k] -= kf / (he * wx)
            else:  # east boundary face: + phi / wx
                ab, gb = flux_condition("east", j)
                A[k, k] -= ab / wx
                r -= gb / wx
            if hw is not None:
                kf = k11[j, (i - 1) % nx if px else i - 1]
                A[k, unknown(i - 1, j)] += kf / (hw * wx)
                A[k, k] -= kf / (hw * wx)
            else:  # west boundary face
                ab, gb = flux_condition("west", j)
                A[k, k] -= ab / wx
                r -= gb / wx
            b = node["b"][j, i]
            if hw is not None and he is not None:
                A[k, unknown(i - 1, j)] += -b * he / (hw * (hw + he))
                A[k, unknown(i + 1, j)] += b * hw / (he * (hw + he))
                A[k, k] += b * (he - hw) / (hw * he)
            elif hw is None:  # west side: inward one-sided
                A[k, unknown(i + 1, j)] += b / he
                A[k, k] -= b / he
            else:
                A[k, k] += b / hw
                A[k, unknown(i - 1, j)] -= b / hw
            # y alike
            hs, hn = axis(y, py, j, ny)
            wy = (hs or 0.0) / 2 + (hn or 0.0) / 2
            if hn is not None:
                kf = k22[j, i]
                A[k, unknown(i, j + 1)] += kf / (hn * wy)
                A[k, k] -= kf / (hn * wy)
            else:
                ab, gb = flux_condition("north", i)
                A[k, k] -= ab / wy
                r -= gb / wy
            if hs is not None:
                kf = k22[(j - 1) % ny if py else j - 1, i]
                A[k, unknown(i, j - 1)] += kf / (hs * wy)
                A[k, k] -= kf / (hs * wy)
            else:
                ab, gb = flux_condition("south", i)
                A[k, k] -= ab / wy
                r -= gb / wy
            d = node["d"][j, i]
            if hs is not None and hn is not None:
                A[k, unknown(i, j - 1)] += -d * hn / (hs * (hs + hn))
                A[k, unknown(i, j + 1)] += d * hs / (hn * (hs + hn))
                A[k, k] += d * (hn - hs) / (hs * hn)
            elif hs is None:
                A[k, unknown(i, j + 1)] += d / hn
                A[k, k] -= d / hn
            else:
                A[k, k] += d / hs
                A[k, unknown(i, j - 1)] -= d / hs
            rhs[k] = r
    return A.tocsr(), rhs, (nx, ny, mx, my)


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
