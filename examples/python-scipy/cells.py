"""Cell-centred assembly: values at cell centres, boundary data at face centres.

Operator: a*u_xx + b*u_x + c*u_yy + d*u_y + e*u = f on [x0, x1] x [y0, y1] split into nx x ny
cells. Cell (i, j) has its centre at (x0 + (i + 1/2)*hx, y0 + (j + 1/2)*hy) and is unknown number
j*nx + i (x fastest). Coefficients and f are given at the cell centres.

Each cell balances the fluxes a*u_x through its west/east faces and c*u_y through its south/north
faces (a and c frozen at the cell centre), plus central first differences for b*u_x, d*u_y and the
point term e*u:

    a_P*((u_E - u_P)/hx - (u_P - u_W)/hx)/hx + b_P*(u_E - u_W)/(2hx) + ... + e_P*u_P = f_P

At a boundary face the missing neighbour is a ghost cell whose value makes the face relation hold
with the face value (u_ghost + u_P)/2 and the face normal derivative (u_ghost - u_P)/h (n outward):

    alpha*(u_ghost + u_P)/2 + beta*(u_ghost - u_P)/h = g

Dirichlet is alpha = 1, beta = 0 (the half-cell flux (u_P - g)/(h/2)); Neumann is alpha = 0,
beta = 1 (the face flux is the data); Robin uses its own alpha and beta. Corner cells take one ghost
per side, each from its own side's face data, so corners need no special rule.

Periodic pairs (west+east, south+north) have no ghosts: the neighbour of the first cell across
the seam is the last cell (the spacing is the same).

The ghost treatment is first order locally at the boundary cells but the scheme converges at order 2
(the boundary error sits in a band one cell wide).
"""

import numpy as np

from vertex import csr_from_stencil, periodic_axes, stencil


def _face_relation(bcside):
    """(alpha, beta) of a side's face relation, per face along the side for Robin."""
    kind = bcside["kind"]
    if kind == "dirichlet":
        return 1.0, 0.0
    if kind == "neumann":
        return 0.0, 1.0
    return np.asarray(bcside["alpha"], dtype=float), np.asarray(bcside["beta"], dtype=float)


def assemble(problem, upwind=False):
    """Assembles the cell-centred system A u = rhs (A as CSR)."""
    (x0, x1, y0, y1) = problem["domain"]
    nx, ny = problem["nx"], problem["ny"]
    hx, hy = (x1 - x0) / nx, (y1 - y0) / ny
    bc = problem["boundary"]
    # the same 5-point interior weights as the vertex scheme (at cell centres instead of nodes)
    cc, cw, ce, cs, cn = stencil(problem, upwind)
    rhs = problem["f"].astype(float).copy()

    # ghost = (g - (alpha/2 - beta/h)*u_P) / (alpha/2 + beta/h), the same on every side.
    for side, where, ghost_w, h in (
        ("west", (slice(None), 0), cw, hx),
        ("east", (slice(None), nx - 1), ce, hx),
        ("south", (0, slice(None)), cs, hy),
        ("north", (ny - 1, slice(None)), cn, hy),
    ):
        if bc[side]["kind"] == "periodic":
            continue
        alpha, beta = _face_relation(bc[side])
        den = alpha / 2 + beta / h
        if np.any(den == 0.0):
            raise ValueError(
                f"side {side}: the face relation alpha/2 + beta/h vanishes "
                f"(alpha = {alpha}, beta = {beta}, h = {h}); refine the grid or change alpha, beta"
            )
        g = np.asarray(bc[side]["values"], dtype=float)
        wg = ghost_w[where].copy()
        cc[where] -= wg * (alpha / 2 - beta / h) / den
        rhs[where] -= wg * g / den
        ghost_w[where] = 0.0

    A = csr_from_stencil(cc, cw, ce, cs, cn, wrap=periodic_axes(problem))
    return A, rhs.ravel()
