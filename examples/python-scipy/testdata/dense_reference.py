"""Independent dense reference for the python-scipy example's tests (not used by the solver).

Reads one vertex-layout solve request (numbers encoding) on stdin and prints the solution as a JSON
array. Unlike vertex.py, which folds ghost nodes into the boundary rows of a sparse matrix, this
keeps every ghost node as an unknown of its own on the grid extended by one node on each side, and
writes the central difference of each Neumann/Robin condition as an equation of its own:

    interior stencil at every non-Dirichlet node (neighbours may be ghosts)
    alpha*u_boundary + beta*(u_ghost - u_mirror)/(2h) = g     for each ghost used
    u = g (Dirichlet node, west/east winning at corners; Robin with beta = 0 gives u = g/alpha)
    u = 0 for ghosts nobody uses

and solves the whole dense system with numpy.linalg.solve (LAPACK). Formulation written from
docs/protocol.md and the reference solver's documented scheme, not from vertex.py.
"""

import json
import sys

import numpy as np

req = json.load(sys.stdin)
nx, ny = req["grid"]["nx"], req["grid"]["ny"]
dom = req["domain"]
hx, hy = (dom["x1"] - dom["x0"]) / nx, (dom["y1"] - dom["y0"]) / ny
upwind = req.get("scheme") == "upwind"
coef = {k: np.array(req["coefficients"][k], float) for k in "abcde"}
f = np.array(req["source"], float)
bnd = req["boundary"]
W = nx + 3  # extended row length, real node (i, j) -> unknown (j+1)*W + (i+1)
N = W * (ny + 3)


def ext(i, j):
    return (j + 1) * W + (i + 1)


def dlike(side):
    s = bnd[side]
    return s["kind"] == "dirichlet" or (s["kind"] == "robin" and s["beta"] == 0)


def dval(side, t):
    s = bnd[side]
    return s["values"][t] / s["alpha"] if s["kind"] == "robin" else s["values"][t]


def ab(side):
    s = bnd[side]
    return (0.0, 1.0) if s["kind"] == "neumann" else (s["alpha"], s["beta"])


A = np.zeros((N, N))
rhs = np.zeros(N)
used = np.zeros(N, bool)
is_dir = np.zeros((ny + 1, nx + 1), bool)
for j in range(ny + 1):
    for i in range(nx + 1):
        row = ext(i, j)
        used[row] = True
        if i == 0 and dlike("west"):
            A[row, row], rhs[row], is_dir[j, i] = 1, dval("west", j), True
        elif i == nx and dlike("east"):
            A[row, row], rhs[row], is_dir[j, i] = 1, dval("east", j), True
        elif j == 0 and dlike("south"):
            A[row, row], rhs[row], is_dir[j, i] = 1, dval("south", i), True
        elif j == ny and dlike("north"):
            A[row, row], rhs[row], is_dir[j, i] = 1, dval("north", i), True
        else:
            q = j * (nx + 1) + i
            a, b, c, d, e = (coef[k][q] for k in "abcde")
            A[row, ext(i - 1, j)] += a / hx**2
            A[row, ext(i + 1, j)] += a / hx**2
            A[row, row] += -2 * a / hx**2 - 2 * c / hy**2 + e
            A[row, ext(i, j - 1)] += c / hy**2
            A[row, ext(i, j + 1)] += c / hy**2
            if not upwind:
                A[row, ext(i + 1, j)] += b / (2 * hx)
                A[row, ext(i - 1, j)] -= b / (2 * hx)
                A[row, ext(i, j + 1)] += d / (2 * hy)
                A[row, ext(i, j - 1)] -= d / (2 * hy)
            else:
                if b * a > 0:
                    A[row, ext(i + 1, j)] += b / hx
                    A[row, row] -= b / hx
                else:
                    A[row, row] += b / hx
                    A[row, ext(i - 1, j)] -= b / hx
                if d * c > 0:
                    A[row, ext(i, j + 1)] += d / hy
                    A[row, row] -= d / hy
                else:
                    A[row, row] += d / hy
                    A[row, ext(i, j - 1)] -= d / hy
            rhs[row] = f[q]

# One equation per ghost used by a non-Dirichlet boundary node: the condition's central difference.
for j in range(ny + 1):
    for i in range(nx + 1):
        if is_dir[j, i]:
            continue
        for side, on, ghost, mirror, h, t in (
            ("west", i == 0, (i - 1, j), (i + 1, j), hx, j),
            ("east", i == nx, (i + 1, j), (i - 1, j), hx, j),
            ("south", j == 0, (i, j - 1), (i, j + 1), hy, i),
            ("north", j == ny, (i, j + 1), (i, j - 1), hy, i),
        ):
            if not on:
                continue
            alpha, beta = ab(side)
            row = ext(*ghost)
            used[row] = True
            A[row, ext(i, j)] += alpha
            A[row, row] += beta / (2 * h)
            A[row, ext(*mirror)] -= beta / (2 * h)
            rhs[row] = bnd[side]["values"][t]

for k in np.nonzero(~used)[0]:
    A[k, k] = 1.0

u = np.linalg.solve(A, rhs).reshape(ny + 3, nx + 3)[1 : ny + 2, 1 : nx + 2]
json.dump(u.ravel().tolist(), sys.stdout)
