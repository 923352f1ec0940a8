#!/usr/bin/python3
"""gridproof example solver: NumPy + SciPy sparse direct solve of a 5-point system.

Usage (the protocol arrives on stdin, see docs/protocol.md):

    /usr/bin/python3 solver.py [--layout vertex|cell] [--seeded-defect one-sided]

--layout vertex   the reference solver's vertex-centred scheme (vertex.py), default
--layout cell     a cell-centred finite-volume variant (cells.py)
--seeded-defect one-sided
                  DELIBERATE DEFECT for the demo: Neumann/Robin sides by a first-order one-sided
                  difference instead of the second-order ghost node (vertex layout only)

The mode is chosen by the first line: a hello message starts a session (one message per line),
anything else is a single request (once mode).
"""

import argparse
import sys
import time

import numpy as np
import scipy
import scipy.sparse.linalg as spla

import cells
import vertex
from protocol_io import RequestError, encode_array, log, message, read_problem, run

VERSION = "1.0.0"
# SuperLU fill-in makes larger 2-D grids slow and memory-hungry on a small machine.
LARGEST = 512


def make_solver(layout, defect):
    """Returns (solve, ready) for the chosen layout and defect."""
    name = "python-scipy-" + layout + ("-defective" if defect else "")
    ready = message(
        "ready",
        solver={"name": name, "version": VERSION},
        supports={
            "boundaryKinds": ["dirichlet", "neumann", "robin"],
            "schemes": ["central", "upwind"],
            "layouts": [layout],
            "encodings": ["numbers", "base64"],
            "largestGrid": {"nx": LARGEST, "ny": LARGEST},
            "constantArrays": True,
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
        if vertex.is_singular(problem):
            return message(
                "not-applicable",
                id=rid,
                reason="only Neumann sides and e = 0: the solution is fixed only up to a "
                "constant, and this example does not choose one",
            )
        start = time.perf_counter()
        try:
            if layout == "cell":
                A, rhs = cells.assemble(problem, upwind=scheme == "upwind")
            else:
                A, rhs = vertex.assemble(problem, upwind=scheme == "upwind", defect=defect)
        except ValueError as err:
            raise RequestError(str(err)) from None
        u = spla.spsolve(A.tocsc(), rhs)
        seconds = time.perf_counter() - start
        if not np.all(np.isfinite(u)):
            return message("error", id=rid, reason="spsolve returned non-finite values "
                           "(the assembled matrix is singular)")
        r0 = float(np.linalg.norm(rhs))
        r1 = float(np.linalg.norm(rhs - A @ u))
        log(f"{name}: {req.get('id')} n={A.shape[0]} residual {r1:.3e} in {seconds:.3f} s")
        notes = f"scipy {scipy.__version__} spsolve (SuperLU), {layout} layout, {scheme} scheme"
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
