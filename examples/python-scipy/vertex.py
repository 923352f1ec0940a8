"""Vertex-centred assembly of the 5-point system, the same scheme as gridproof's reference solver.

Operator: a*u_xx + b*u_x + c*u_yy + d*u_y + e*u = f on [x0, x1] x [y0, y1], nx x ny intervals.
Node (i, j) sits at (x0 + i*hx, y0 + j*hy) and is unknown number j*(nx + 1) + i (x fastest).

- Interior stencil: second-order central differences (or first-order upwinding of b*u_x and
  d*u_y when upwind=True).
- Dirichlet nodes: identity rows (u = g). A Robin side with beta = 0 is Dirichlet-like: u = g/alpha.
- Neumann (du/dn = g, n outward) and Robin (alpha*u + beta*du/dn = g) sides: a ghost node outside
  the side takes its value from the central difference of the boundary condition, and the interior
  stencil is applied at the boundary node; the ghost is then eliminated ("folded") into the row.
- Periodic pairs (west+east, south+north): node nx is the image of node 0, so the unknowns are
  the nodes 0..nx-1 along that axis and the west neighbour of node 0 is node nx-1 (spacing
  unchanged: the grid is uniform); `expand` appends the images to the solution.
- Corners: if either side meeting there is Dirichlet, the corner is a Dirichlet node, with its value
  from the west/east side when that side is Dirichlet, otherwise from the south/north side. If both
  sides are Neumann/Robin, ghosts are folded in both directions, each from its own side's data.

defect="one-sided" is the SEEDED DEFECT of the demo: Neumann and Robin rows are replaced by the
boundary condition with a first-order one-sided difference, so the boundary band converges at
order 1 instead of 2.
"""

import numpy as np
import scipy.sparse as sp

SIDES = ("west", "east", "south", "north")


def upwind_forward(coef_first, coef_second):
    """True where first-order upwinding uses the forward difference.

    The one-sided difference is chosen so that the off-diagonal entries keep the sign of the
    second-derivative coefficient (an M-matrix for a > 0 and e <= 0): forward where b and a have
    the same sign, backward otherwise.
    """
    return coef_first * coef_second > 0


def dirichlet_like(bcside):
    """True for a Dirichlet side or a Robin side with beta = 0."""
    return bcside["kind"] == "dirichlet" or (
        bcside["kind"] == "robin" and bool(np.all(np.asarray(bcside["beta"]) == 0.0))
    )


def _dirichlet_data(bcside):
    g = np.asarray(bcside["values"], dtype=float)
    return g / np.asarray(bcside["alpha"], dtype=float) if bcside["kind"] == "robin" else g


def dirichlet_values(problem):
    """Returns (mask, values) of the Dirichlet nodes as (ny+1, nx+1) arrays."""
    nx, ny = problem["nx"], problem["ny"]
    bc = problem["boundary"]
    mask = np.zeros((ny + 1, nx + 1), dtype=bool)
    vals = np.zeros((ny + 1, nx + 1))
    # South/north first, so that west/east overwrite the corners they share (west/east win).
    for side, row in (("north", ny), ("south", 0)):
        if dirichlet_like(bc[side]):
            mask[row, :] = True
            vals[row, :] = _dirichlet_data(bc[side])
    # east before west: at a corner the reference solver takes west, then east, then south, north
    for side, col in (("east", nx), ("west", 0)):
        if dirichlet_like(bc[side]):
            mask[:, col] = True
            vals[:, col] = _dirichlet_data(bc[side])
    return mask, vals


def stencil(problem, upwind=False):
    """Returns the five stencil weights (cc, cw, ce, cs, cn) at every node, as (ny+1, nx+1) arrays."""
    (x0, x1, y0, y1) = problem["domain"]
    nx, ny = problem["nx"], problem["ny"]
    hx, hy = (x1 - x0) / nx, (y1 - y0) / ny
    a, b, c, d, e = (problem[k] for k in ("a", "b", "c", "d", "e"))
    cw = a / hx**2
    ce = a / hx**2
    cs = c / hy**2
    cn = c / hy**2
    cc = -2 * a / hx**2 - 2 * c / hy**2 + e
    if upwind:
        fx = upwind_forward(b, a)
        fy = upwind_forward(d, c)
        ce = ce + np.where(fx, b / hx, 0.0)
        cw = cw - np.where(fx, 0.0, b / hx)
        cc = cc + np.where(fx, -b / hx, b / hx)
        cn = cn + np.where(fy, d / hy, 0.0)
        cs = cs - np.where(fy, 0.0, d / hy)
        cc = cc + np.where(fy, -d / hy, d / hy)
    else:
        cw = cw - b / (2 * hx)
        ce = ce + b / (2 * hx)
        cs = cs - d / (2 * hy)
        cn = cn + d / (2 * hy)
    return cc, cw, ce, cs, cn


def periodic_axes(problem):
    """(px, py): whether west+east and south+north are periodic pairs."""
    bc = problem["boundary"]
    return bc["west"]["kind"] == "periodic", bc["south"]["kind"] == "periodic"


def reduce(problem, arr):
    """A (ny+1, nx+1) node array without the periodic images (the unknowns' layout)."""
    px, py = periodic_axes(problem)
    return arr[: arr.shape[0] - 1 if py else None, : arr.shape[1] - 1 if px else None]


def expand(problem, u):
    """The solution on all (nx+1)(ny+1) nodes from the unknowns: images copied from node 0."""
    nx, ny = problem["nx"], problem["ny"]
    px, py = periodic_axes(problem)
    u = np.asarray(u).reshape(ny + (0 if py else 1), nx + (0 if px else 1))
    if px:
        u = np.concatenate([u, u[:, :1]], axis=1)
    if py:
        u = np.concatenate([u, u[:1, :]], axis=0)
    return u.ravel()


def csr_from_stencil(cc, cw, ce, cs, cn, wrap=(False, False)):
    """The sparse matrix of a 5-point stencil given as five (rows, columns) weight arrays, points
    numbered x fastest. Every non-zero off-diagonal weight must point inside the array (boundary
    ghosts already folded in), except across a periodic axis (wrap = (px, py)), where it wraps
    around; the vertex and the cell-centred assemblies share this."""
    ny, nx = cc.shape
    n = nx * ny
    idx = np.arange(n).reshape(ny, nx)
    rows, cols, vals = [idx.ravel()], [idx.ravel()], [cc.ravel()]
    for w, di, dj in ((cw, -1, 0), (ce, 1, 0), (cs, 0, -1), (cn, 0, 1)):
        jj, ii = np.nonzero(w)
        ok = ((ii + di >= 0) & (ii + di < nx) | wrap[0]) & ((jj + dj >= 0) & (jj + dj < ny) | wrap[1])
        if not np.all(ok):
            raise AssertionError("a stencil weight points outside the grid after folding")
        rows.append(idx[jj, ii])
        cols.append(idx[(jj + dj) % ny, (ii + di) % nx])
        vals.append(w[jj, ii])
    return sp.csr_matrix(
        (np.concatenate(vals), (np.concatenate(rows), np.concatenate(cols))), shape=(n, n)
    )


def _robin(bcside):
    """(alpha, beta) of a Neumann or Robin side, per point along it (Neumann is alpha = 0, beta = 1)."""
    if bcside["kind"] == "neumann":
        return 0.0, 1.0
    return np.asarray(bcside["alpha"], dtype=float), np.asarray(bcside["beta"], dtype=float)


def assemble(problem, upwind=False, defect=None):
    """Assembles the vertex-centred system A u = rhs (A as CSR). Raises ValueError on a bad problem."""
    (x0, x1, y0, y1) = problem["domain"]
    nx, ny = problem["nx"], problem["ny"]
    hx, hy = (x1 - x0) / nx, (y1 - y0) / ny
    bc = problem["boundary"]
    if nx < 2 or ny < 2:
        raise ValueError(f"grid: the vertex layout needs nx, ny >= 2, got {nx}, {ny}")
    cc, cw, ce, cs, cn = (w.copy() for w in stencil(problem, upwind))
    rhs = problem["f"].astype(float).copy()

    # Fold each Neumann/Robin side's ghost node into the boundary row:
    # ghost = mirror + 2h*(g - alpha*u)/beta, for every side with h the spacing normal to it.
    folds = (
        ("west", (slice(None), 0), cw, ce, hx),
        ("east", (slice(None), nx), ce, cw, hx),
        ("south", (0, slice(None)), cs, cn, hy),
        ("north", (ny, slice(None)), cn, cs, hy),
    )
    for side, where, ghost_w, mirror_w, h in folds:
        if dirichlet_like(bc[side]) or bc[side]["kind"] == "periodic":
            continue
        alpha, beta = _robin(bc[side])
        g = np.asarray(bc[side]["values"], dtype=float)
        wg = ghost_w[where].copy()
        mirror_w[where] += wg
        cc[where] -= wg * 2 * h * alpha / beta
        rhs[where] -= wg * 2 * h * g / beta
        ghost_w[where] = 0.0

    if defect == "one-sided":
        _seed_one_sided_defect(problem, cc, cw, ce, cs, cn, rhs, hx, hy)

    mask, dvals = dirichlet_values(problem)
    cc[mask], cw[mask], ce[mask], cs[mask], cn[mask] = 1.0, 0.0, 0.0, 0.0, 0.0
    rhs[mask] = dvals[mask]

    # periodic: drop the image nodes; their neighbours wrap across the seam
    cc, cw, ce, cs, cn, rhs = (reduce(problem, w) for w in (cc, cw, ce, cs, cn, rhs))
    A = csr_from_stencil(cc, cw, ce, cs, cn, wrap=periodic_axes(problem))
    return A, rhs.ravel()


def volume_weights(problem):
    """Control volumes of the unknowns: trapezoid weights, a whole cell across a periodic seam."""
    (x0, x1, y0, y1) = problem["domain"]
    nx, ny = problem["nx"], problem["ny"]
    px, py = periodic_axes(problem)
    wx = np.full(nx if px else nx + 1, (x1 - x0) / nx)
    wy = np.full(ny if py else ny + 1, (y1 - y0) / ny)
    if not px:
        wx[0] /= 2
        wx[-1] /= 2
    if not py:
        wy[0] /= 2
        wy[-1] /= 2
    return np.outer(wy, wx).ravel()


def _seed_one_sided_defect(problem, cc, cw, ce, cs, cn, rhs, hx, hy):
    """Replaces each Neumann/Robin row by alpha*u + beta*(one-sided du/dn) = g (first order)."""
    nx, ny = problem["nx"], problem["ny"]
    bc = problem["boundary"]
    # (side, row selector, weight toward the inside, spacing)
    for side, where, inward, h in (
        ("west", (slice(None), 0), ce, hx),
        ("east", (slice(None), nx), cw, hx),
        ("south", (0, slice(None)), cn, hy),
        ("north", (ny, slice(None)), cs, hy),
    ):
        if dirichlet_like(bc[side]) or bc[side]["kind"] == "periodic":
            continue
        alpha, beta = _robin(bc[side])
        # du/dn ~ (u_boundary - u_inside)/h, n outward
        for w in (cc, cw, ce, cs, cn):
            w[where] = 0.0
        cc[where] = alpha + beta / h
        inward[where] = -beta / h
        rhs[where] = np.asarray(bc[side]["values"], dtype=float)


def is_singular(problem):
    """True when no side fixes u (Neumann, periodic, Robin with alpha = 0) and e == 0 everywhere:
    the solution is fixed only up to a constant."""
    if problem.get("singular"):
        return True
    bc = problem["boundary"]
    if any(bc[s]["kind"] == "dirichlet" for s in SIDES):
        return False
    if any(bc[s]["kind"] == "robin" and bool(np.any(np.asarray(bc[s]["alpha"]) != 0.0)) for s in SIDES):
        return False
    return bool(np.all(problem["e"] == 0.0))
