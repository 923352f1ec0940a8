"""An MPI solver for gridproof (once mode): rank 0 speaks gridproof-protocol/1 on stdin/stdout,
every rank owns a band of grid rows, and Jacobi-preconditioned BiCGSTAB solves the vertex-centred
5-point system of docs/protocol.md with Dirichlet data on every side.

Run under a launcher, e.g. `mpirun -np 4 /usr/bin/python3 -B solver.py < request.json`. The result
does not depend on the rank count beyond the iterative tolerance: only the order of the sums in the
dot products changes.

--seeded-defect boundary-rows plants a known parallel bug for gridproof's rank-count check: each
rank reads the west and east boundary values at its *local* row number instead of the global one,
so 1 rank is right and more ranks are wrong.
"""

import base64
import json
import sys

import numpy as np
from mpi4py import MPI

PROTOCOL = "gridproof-protocol/1"
SIDES = ("west", "east", "south", "north")


def log(*parts):
    print(*parts, file=sys.stderr, flush=True)


def decode(value, length, field):
    if isinstance(value, dict) and isinstance(value.get("base64"), str):
        arr = np.frombuffer(base64.b64decode(value["base64"]), dtype="<f8").astype(float)
    elif isinstance(value, list):
        arr = np.asarray(value, dtype=float)
    else:
        raise ValueError(f"{field}: must be an array of numbers or an object with base64")
    if arr.size != length:
        raise ValueError(f"{field}: has {arr.size} values, expected {length}")
    return arr


def read_request(text):
    """Rank 0: the request as a problem dict, or a reply dict when it does not apply."""
    req = json.loads(text)
    rid = req.get("id")
    base = {"protocol": PROTOCOL, "id": rid}
    if req.get("protocol") != PROTOCOL:
        return None, {**base, "type": "error", "reason": f"this solver speaks {PROTOCOL} only"}
    grid = req["grid"]
    why = None
    if grid.get("layout") != "vertex":
        why = "only the vertex layout"
    elif req.get("scheme") != "central":
        why = "only the central scheme"
    elif any(req["boundary"][s]["kind"] != "dirichlet" for s in SIDES):
        why = "only Dirichlet sides"
    elif set(req.get("coefficients", {})) - {"a", "b", "c", "d", "e"}:
        why = "only the coefficients a, b, c, d, e"
    if why:
        return None, {**base, "type": "not-applicable", "reason": f"this MPI example handles {why}"}
    nx, ny = int(grid["nx"]), int(grid["ny"])
    n = (nx + 1) * (ny + 1)
    p = {"id": rid, "nx": nx, "ny": ny, "tol": float(req.get("tolerance", 1e-10)),
         "encoding": req.get("encoding", "numbers")}
    d = req["domain"]
    p["hx"] = (d["x1"] - d["x0"]) / nx
    p["hy"] = (d["y1"] - d["y0"]) / ny
    for k in "abcde":
        p[k] = decode(req["coefficients"][k], n, f"coefficients.{k}").reshape(ny + 1, nx + 1)
    p["f"] = decode(req["source"], n, "source").reshape(ny + 1, nx + 1)
    for s in SIDES:
        length = ny + 1 if s in ("west", "east") else nx + 1
        p[s] = decode(req["boundary"][s]["values"], length, f"boundary.{s}.values")
    return p, None


class Band:
    """One rank's rows j0..j1-1 of the interior (1 ≤ j ≤ ny-1), with one halo row each side."""

    def __init__(self, comm, p, defect):
        self.comm = comm
        nx, ny = p["nx"], p["ny"]
        rows = ny - 1
        r, size = comm.rank, comm.size
        self.j0 = 1 + r * rows // size
        self.j1 = 1 + (r + 1) * rows // size
        sl = slice(self.j0, self.j1)
        self.hx2, self.hy2 = p["hx"] ** 2, p["hy"] ** 2
        self.h2x, self.h2y = 2 * p["hx"], 2 * p["hy"]
        self.a, self.b, self.c = p["a"][sl, 1:nx], p["b"][sl, 1:nx], p["c"][sl, 1:nx]
        self.d, self.e = p["d"][sl, 1:nx], p["e"][sl, 1:nx]
        self.diag = -2 * self.a / self.hx2 - 2 * self.c / self.hy2 + self.e
        # the lifted Dirichlet data: a full-width band with halos, boundary values in place
        g = np.zeros((self.j1 - self.j0 + 2, nx + 1))
        rows_here = np.arange(self.j0 - 1, self.j1 + 1)
        west_rows = rows_here - (self.j0 - 1) if defect else rows_here
        g[:, 0] = p["west"][west_rows]
        g[:, nx] = p["east"][west_rows]
        if self.j0 == 1:
            g[0, :] = p["south"]
        if self.j1 == ny:
            g[-1, :] = p["north"]
        self.nx, self.ny = nx, ny
        self.rhs = p["f"][sl, 1:nx] - self.apply_full(g)

    def exchange(self, full):
        """Fills the halo rows of `full` from the neighbouring ranks."""
        up = self.comm.rank + 1 if self.comm.rank + 1 < self.comm.size else MPI.PROC_NULL
        down = self.comm.rank - 1 if self.comm.rank > 0 else MPI.PROC_NULL
        recv = np.zeros(self.nx + 1)
        self.comm.Sendrecv(np.ascontiguousarray(full[-2]), dest=up, recvbuf=recv, source=down)
        if down != MPI.PROC_NULL:
            full[0] = recv
        recv = np.zeros(self.nx + 1)
        self.comm.Sendrecv(np.ascontiguousarray(full[1]), dest=down, recvbuf=recv, source=up)
        if up != MPI.PROC_NULL:
            full[-1] = recv

    def apply_full(self, full):
        """The operator at this band's interior nodes, from a full-width band with halos."""
        nx = self.nx
        u = full[1:-1, 1:nx]
        ue, uw = full[1:-1, 2:nx + 1], full[1:-1, 0:nx - 1]
        un, us = full[2:, 1:nx], full[:-2, 1:nx]
        return (self.a * (ue - 2 * u + uw) / self.hx2 + self.b * (ue - uw) / self.h2x
                + self.c * (un - 2 * u + us) / self.hy2 + self.d * (un - us) / self.h2y
                + self.e * u)

    def apply(self, x):
        """The operator on interior values with zero boundary data."""
        full = np.zeros((x.shape[0] + 2, self.nx + 1))
        full[1:-1, 1:self.nx] = x
        self.exchange(full)
        return self.apply_full(full)

    def dot(self, x, y):
        return self.comm.allreduce(float(np.sum(x * y)), op=MPI.SUM)


def bicgstab(band, tol, limit=20000):
    """Jacobi-preconditioned BiCGSTAB from a zero start; returns x and ‖r‖ after each iteration."""
    b = band.rhs
    x = np.zeros_like(b)
    r = b.copy()
    rhat = r.copy()
    history = [np.sqrt(band.dot(r, r))]
    target = tol * history[0]
    rho = alpha = omega = 1.0
    v = np.zeros_like(b)
    p = np.zeros_like(b)
    for _ in range(limit):
        if history[-1] <= target:
            break
        rho_new = band.dot(rhat, r)
        if rho_new == 0.0:
            break
        beta = (rho_new / rho) * (alpha / omega)
        rho = rho_new
        p = r + beta * (p - omega * v)
        phat = p / band.diag
        v = band.apply(phat)
        alpha = rho / band.dot(rhat, v)
        s = r - alpha * v
        shat = s / band.diag
        t = band.apply(shat)
        tt = band.dot(t, t)
        omega = band.dot(t, s) / tt if tt > 0 else 0.0
        x = x + alpha * phat + omega * shat
        r = s - omega * t
        history.append(np.sqrt(band.dot(r, r)))
        if omega == 0.0:
            break
    return x, history


def encode(arr, encoding):
    arr = np.ascontiguousarray(arr, dtype="<f8").ravel()
    if encoding == "base64":
        return {"base64": base64.b64encode(arr.tobytes()).decode("ascii")}
    return arr.tolist()


def main():
    world = MPI.COMM_WORLD
    defect = "--seeded-defect" in sys.argv and "boundary-rows" in sys.argv
    problem, early = (None, None)
    if world.rank == 0:
        try:
            problem, early = read_request(sys.stdin.read())
        except (ValueError, KeyError, TypeError) as err:
            early = {"protocol": PROTOCOL, "type": "error", "reason": f"bad request: {err}"}
    problem, early = world.bcast((problem, early), root=0)
    if early is not None:
        if world.rank == 0:
            print(json.dumps(early), flush=True)
        return
    t0 = MPI.Wtime()
    # at most one rank per interior row; the others wait
    used = min(world.size, problem["ny"] - 1)
    comm = world.Split(0 if world.rank < used else MPI.UNDEFINED, world.rank)
    pieces = None
    history = []
    if comm != MPI.COMM_NULL:
        band = Band(comm, problem, defect)
        x, history = bicgstab(band, problem["tol"])
        pieces = comm.gather((band.j0, x), root=0)
    if world.rank != 0:
        return
    nx, ny = problem["nx"], problem["ny"]
    u = np.zeros((ny + 1, nx + 1))
    u[:, 0], u[:, nx] = problem["west"], problem["east"]
    u[0, :], u[ny, :] = problem["south"], problem["north"]
    for j0, x in pieces:
        u[j0:j0 + x.shape[0], 1:nx] = x
    reply = {
        "protocol": PROTOCOL, "type": "solution", "id": problem["id"],
        "values": encode(u, problem["encoding"]),
        "residualHistory": [float(h) for h in history],
        "iterations": len(history) - 1,
        "converged": bool(history[-1] <= problem["tol"] * history[0]),
        "seconds": MPI.Wtime() - t0,
        "solver": {"name": "mpi-python-bicgstab", "version": "1"},
        "notes": f"{used} ranks" + (" (seeded defect boundary-rows)" if defect else ""),
    }
    print(json.dumps(reply), flush=True)


if __name__ == "__main__":
    main()
