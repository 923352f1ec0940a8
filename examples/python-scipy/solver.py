#!/usr/bin/python3
"""gridproof example solver: NumPy + SciPy sparse direct solve of a finite-difference/volume system.

Usage (the protocol arrives on stdin, see docs/protocol.md):

    /usr/bin/python3 solver.py [--layout vertex|cell] [--seeded-defect one-sided]

--layout vertex   the reference solver's vertex-centred scheme (vertex.py), default
--layout cell     a cell-centred finite-volume variant (cells.py)
--seeded-defect one-sided
                  DELIBERATE DEFECT for the demo: Neumann/Robin sides by a first-order one-sided
                  difference instead of the second-order ghost node (vertex layout only)

It speaks protocol versions 1 and 2 (docs/protocol.md): version 2 brings stretched grids (grid.x,
grid.y: stretched.py, non-uniform 3-point differences on the vertex layout, the flux form on the
cell layout), the mixed term m*u_xy
and the conservative form div(K grad u) + bx*u_x + by*u_y + sigma*u = f with K at the faces
(forms.py: a finite-volume scheme on the cell layout, the flux balance of node volumes on the
vertex layout).

The mode is chosen by the first line: a hello message starts a session (one message per line),
anything else is a single request (once mode).
"""

import argparse
import sys
import time

import numpy as np
import scipy
import scipy.sparse as sp
import scipy.sparse.linalg as spla

import cells
import forms
import stretched
import vertex
from protocol_io import RequestError, encode_array, log, message, read_problem, run

VERSION = "2.0.0"
# SuperLU fill-in makes larger 2-D grids slow and memory-hungry on a small machine.
LARGEST = 512


def solve_free(A, rhs, mask, dvals):
    """Solves A u = rhs with the Dirichlet nodes (identity rows u = g) eliminated: u = g exactly
    there. Left in the system, their rows are solved only to the round-off of the largest rows
    (10^4/h^2 with a conductivity of 10^4), which shows as wrong imposed data."""
    fixed = mask.ravel()
    free = ~fixed
    u = np.empty(rhs.size)
    u[fixed] = dvals[mask]
    A = A.tocsr()
    rows = A[free]
    u[free] = spla.spsolve(rows[:, free].tocsc(), rhs[free] - rows[:, fixed] @ u[fixed])
    return u


def solve_bordered(A, rhs, w):
    """Solves the singular A u = rhs for the u with w.u = 0: the bordered system
    [A 1; w^T 0] [u; lam] = [rhs; 0], non-singular when A's null space is the constants."""
    n = rhs.size
    ones = sp.csr_matrix(np.ones((n, 1)))
    B = sp.bmat([[A, ones], [sp.csr_matrix(w.reshape(1, n)), None]], format="csc")
    x = spla.spsolve(B, np.concatenate([rhs, [0.0]]))
    return x[:n]


def make_solver(layout, defect):
    """Returns (solve, ready) for the chosen layout and defect."""
    name = "python-scipy-" + layout + ("-defective" if defect else "")
    ready = message(
        "ready",
        solver={"name": name, "version": VERSION},
        supports={
            "boundaryKinds": ["dirichlet", "neumann", "robin", "periodic"],
            "schemes": ["central", "upwind"],
            "layouts": [layout],
            "encodings": ["numbers", "base64"],
            "largestGrid": {"nx": LARGEST, "ny": LARGEST},
            "constantArrays": True,
            "forms": ["non-conservative", "conservative"],
        },
    )

    def solve(req):
        rid = str(req.get("id", ""))
        grid = req.get("grid") or {}
        if grid.get("layout") != layout:
            return message(
                "not-applicable",
                id=rid,
                reason=f"this solver was started for the {layout} layout, "
                f"the request asks for {grid.get('layout')}",
            )
        scheme = req.get("scheme", "central")
        if scheme not in ("central", "upwind"):
            return message("not-applicable", id=rid, reason=f"unknown scheme '{scheme}'")
        nx, ny = grid.get("nx"), grid.get("ny")
        if isinstance(nx, int) and isinstance(ny, int) and max(nx, ny) > LARGEST:
            return message(
                "not-applicable",
                id=rid,
                reason=f"grid {nx}x{ny} is above this example's largest grid {LARGEST}x{LARGEST}",
            )
        problem = read_problem(req)
        start = time.perf_counter()
        upwind = scheme == "upwind"
        conservative = problem["form"] == "conservative"
        periodic = any(vertex.periodic_axes(problem))
        mixed = "m" in problem and bool(np.any(problem["m"] != 0.0))
        if periodic and (conservative or mixed or defect):
            return message(
                "not-applicable",
                id=rid,
                reason="this example has periodic sides in the plain non-conservative scheme "
                "only (no conservative form, no mixed term, no seeded defect)",
            )
        if defect and (conservative or "m" in problem):
            return message(
                "not-applicable",
                id=rid,
                reason="the seeded defect is of the plain vertex scheme; this request needs "
                "the mixed term or the conservative form",
            )
        if "lines" in problem:
            why = stretched.unsupported(problem)
            if why is not None:
                return message("not-applicable", id=rid, reason=why)
            if defect:
                return message(
                    "not-applicable",
                    id=rid,
                    reason="the seeded defect is of the uniform vertex scheme",
                )
        try:
            if "lines" in problem:
                A, rhs = stretched.assemble(problem, upwind=upwind)
            elif conservative and layout == "cell":
                A, rhs = forms.assemble_conservative_cell(problem, upwind=upwind)
            elif conservative:
                A, rhs = forms.assemble_conservative_vertex(problem, upwind=upwind)
            elif layout == "cell":
                A, rhs = forms.add_mixed(problem, *cells.assemble(problem, upwind=upwind))
            else:
                A, rhs = forms.add_mixed(
                    problem, *vertex.assemble(problem, upwind=upwind, defect=defect)
                )
        except ValueError as err:
            raise RequestError(str(err)) from None
        singular = vertex.is_singular(problem)
        if singular:
            # fixed up to a constant: the bordered system [A 1; w^T 0] [u; lam] = [f; 0] picks
            # the solution of zero volume-weighted mean (lam absorbs the data's discrete imbalance)
            w = vertex.volume_weights(problem) if layout == "vertex" else np.ones(rhs.size)
            u = solve_bordered(A, rhs, w)
        elif layout == "vertex" and "lines" not in problem:
            mask, dvals = vertex.dirichlet_values(problem)
            u = solve_free(A, rhs, vertex.reduce(problem, mask), vertex.reduce(problem, dvals))
        else:
            u = spla.spsolve(A.tocsc(), rhs)
        r0 = float(np.linalg.norm(rhs))
        res = rhs - A @ u
        if singular:
            res = res - res.mean()  # the part of the data the constant shift lam took away
        r1 = float(np.linalg.norm(res))
        if layout == "vertex":
            u = vertex.expand(problem, u)
        seconds = time.perf_counter() - start
        if not np.all(np.isfinite(u)):
            return message("error", id=rid, reason="spsolve returned non-finite values "
                           "(the assembled matrix is singular)")
        log(f"{name}: {req.get('id')} n={A.shape[0]} residual {r1:.3e} in {seconds:.3f} s")
        notes = (
            f"scipy {scipy.__version__} spsolve (SuperLU), {layout} layout, {scheme} scheme, "
            f"{problem['form']} form" + ("" if "m" not in problem else " with u_xy")
            + ("" if "lines" not in problem else ", stretched grid (stretched.py)")
        )
        if defect:
            notes += "; SEEDED DEFECT: first-order one-sided Neumann/Robin boundary rows"
        return message(
            "solution",
            id=rid,
            values=encode_array(u, req.get("encoding", "numbers")),
            residualHistory=[r0, r1],
            iterations=1,
            converged=True,
            seconds=seconds,
            solver={"name": name, "version": VERSION},
            notes=notes,
        )

    return solve, ready


def main():
    parser = argparse.ArgumentParser(description=__doc__.splitlines()[1])
    parser.add_argument("--layout", choices=("vertex", "cell"), default="vertex")
    parser.add_argument("--seeded-defect", choices=("one-sided",), default=None)
    args = parser.parse_args()
    if args.seeded_defect and args.layout != "vertex":
        parser.error("--seeded-defect applies to --layout vertex only")
    solve, ready = make_solver(args.layout, args.seeded_defect)
    run(solve, ready)


if __name__ == "__main__":
    sys.exit(main())
