"""The operator forms of protocol version 2: the mixed term m*u_xy and the conservative form.

Conservative form: div(K grad u) + bx*u_x + by*u_y + sigma*u = f with K = [[k11, k12], [k12, k22]].
K comes from the request at the faces (cell layout) or edge midpoints (vertex layout): a face on a
material interface carries the effective value already, so nothing here averages K.

Cell layout (assemble_conservative_cell), a finite-volume scheme: each cell balances the fluxes
through its four faces,

    (F_e - F_w)/hx + (G_n - G_s)/hy + bx*u_x + by*u_y + sigma*u = f   (at the cell centre),

F = k11_f*(u_E - u_P)/hx + k12_f*D_y through an x-face, D_y the mean of the central y-differences
of the two cells beside it; G alike. Boundary faces: Dirichlet by the ghost cell 2g - u_P (the
half-cell flux 2*k11_f*(u_P - g)/hx), with D_y along the side from the data; Neumann faces carry
the given conormal flux (K grad u).n; Robin faces the ghost of alpha*u_f + beta*k_nn*du/dn = g
(exact for diagonal K). Ghost cells outside a side serve the tangential differences and the first-
order terms, as in cells.py.

Vertex layout (assemble_conservative_vertex): the same flux balance on the control volume of each
node (half and quarter volumes on the sides), as gridproof's reference solver documents it
(reference-solver/discretize_conservative.ts); Dirichlet nodes are identity rows.

Mixed term (add_mixed): m*(u_NE - u_NW - u_SE + u_SW)/(4*hx*hy) added to the rows of the existing
assemblies (cells.py, vertex.py), with points outside the domain from the sides' ghost rules.

Rows are built point by point in Python loops: clear rather than fast (a 128x128 grid takes well
under a second); the plain forms keep the vectorized assemblies.
"""

import numpy as np
import scipy.sparse as sp

from vertex import dirichlet_like, dirichlet_values


class Rows:
    """A sparse matrix built row by row: add(row, point, weight) with ghost points resolved."""

    def __init__(self, n, resolve):
        self.rows, self.cols, self.vals = [], [], []
        self.rhs = np.zeros(n)
        self.resolve = resolve

    def add(self, row, i, j, w):
        """Adds w*u(i, j) to a row; u outside the domain is resolved into unknowns and data."""
        if w == 0.0:
            return
        for col, cw in self.resolve(i, j, self, row, w):
            self.rows.append(row)
            self.cols.append(col)
            self.vals.append(cw)

    def const(self, row, value):
        """Adds a known value to the left side of a row (moves it to the right side)."""
        self.rhs[row] -= value

    def matrix(self):
        n = self.rhs.size
        return sp.csr_matrix((self.vals, (self.rows, self.cols)), shape=(n, n))


def _relation(side, k_nn, m):
    """(alpha, beta) of a side's face relation alpha*u + beta*k_nn*du/dn = g at its face m."""
    kind = side["kind"]
    if kind == "dirichlet":
        return 1.0, 0.0
    if kind == "neumann":
        return 0.0, k_nn
    return float(side["alpha"][m]), float(side["beta"][m]) * k_nn


def cell_resolver(problem, conservative):
    """Resolves a cell index (i, j) into unknowns: inside, or a ghost cell beyond one side
    (u_g = A*u_P + B from the side's face relation, see cells.py), or beyond a corner (bilinear
    extrapolation from the three ghost or inside cells next to it)."""
    nx, ny = problem["nx"], problem["ny"]
    (x0, x1, y0, y1) = problem["domain"]
    hx, hy = (x1 - x0) / nx, (y1 - y0) / ny
    bc = problem["boundary"]

    def k_nn(side, m):
        if not conservative:
            return 1.0
        if side == "west":
            return problem["fx_k11"][m, 0]
        if side == "east":
            return problem["fx_k11"][m, nx]
        if side == "south":
            return problem["fy_k22"][0, m]
        return problem["fy_k22"][ny, m]

    def resolve(i, j, rows, row, w):
        out_x = i < 0 or i >= nx
        out_y = j < 0 or j >= ny
        if not out_x and not out_y:
            return [(j * nx + i, w)]
        if out_x and out_y:
            ic, jc = min(max(i, 0), nx - 1), min(max(j, 0), ny - 1)
            rows.add(row, i, jc, w)
            rows.add(row, ic, j, w)
            rows.add(row, ic, jc, -w)
            return []
        if out_x:
            side, m, h = ("west" if i < 0 else "east"), j, hx
            inside = (0 if i < 0 else nx - 1, j)
        else:
            side, m, h = ("south" if j < 0 else "north"), i, hy
            inside = (i, 0 if j < 0 else ny - 1)
        alpha, beta = _relation(bc[side], k_nn(side, m), m)
        den = alpha / 2 + beta / h
        if den == 0.0:
            raise ValueError(f"side {side}: the face relation alpha/2 + beta/h vanishes")
        g = bc[side]["values"][m]
        rows.const(row, w * g / den)
        rows.add(row, inside[0], inside[1], -w * (alpha / 2 - beta / h) / den)
        return []

    return resolve


def vertex_resolver(problem):
    """Resolves a node index (i, j): inside, or a ghost node beyond a Neumann/Robin side
    (u(-1, j) = u(1, j) + 2h*(g_j - alpha*u(0, j))/beta, as vertex.py folds it), or beyond a corner
    (bilinear extrapolation)."""
    nx, ny = problem["nx"], problem["ny"]
    (x0, x1, y0, y1) = problem["domain"]
    hx, hy = (x1 - x0) / nx, (y1 - y0) / ny
    bc = problem["boundary"]

    def resolve(i, j, rows, row, w):
        out_x = i < 0 or i > nx
        out_y = j < 0 or j > ny
        if not out_x and not out_y:
            return [(j * (nx + 1) + i, w)]
        if out_x and out_y:
            ic, jc = min(max(i, 0), nx), min(max(j, 0), ny)
            rows.add(row, i, jc, w)
            rows.add(row, ic, j, w)
            rows.add(row, ic, jc, -w)
            return []
        if out_x:
            side, m, h = ("west" if i < 0 else "east"), j, hx
            edge, mirror = ((0, j), (1, j)) if i < 0 else ((nx, j), (nx - 1, j))
        else:
            side, m, h = ("south" if j < 0 else "north"), i, hy
            edge, mirror = ((i, 0), (i, 1)) if j < 0 else ((i, ny), (i, ny - 1))
        s = bc[side]
        if dirichlet_like(s):
            raise ValueError(f"a ghost node beyond the Dirichlet side {side} was asked for")
        alpha, beta = (
            (0.0, 1.0) if s["kind"] == "neumann" else (float(s["alpha"][m]), float(s["beta"][m]))
        )
        rows.add(row, mirror[0], mirror[1], w)
        rows.add(row, edge[0], edge[1], -w * 2 * h * alpha / beta)
        rows.const(row, w * 2 * h * s["values"][m] / beta)
        return []

    return resolve


def add_mixed(problem, A, rhs):
    """Adds m*u_xy (central, 4-corner) to every row that is not a Dirichlet row; returns A, rhs."""
    m = problem.get("m")
    if m is None or not np.any(m != 0.0):
        return A, rhs
    nx, ny = problem["nx"], problem["ny"]
    (x0, x1, y0, y1) = problem["domain"]
    hx, hy = (x1 - x0) / nx, (y1 - y0) / ny
    cell = problem["layout"] == "cell"
    rows = Rows(rhs.size, cell_resolver(problem, False) if cell else vertex_resolver(problem))
    mask = np.zeros(m.shape, dtype=bool) if cell else dirichlet_values(problem)[0]
    width = nx if cell else nx + 1
    kappa = 1.0 / (4 * hx * hy)
    for j in range(m.shape[0]):
        for i in range(m.shape[1]):
            w = m[j, i] * kappa
            if w == 0.0 or mask[j, i]:
                continue
            row = j * width + i
            rows.add(row, i + 1, j + 1, w)
            rows.add(row, i - 1, j + 1, -w)
            rows.add(row, i + 1, j - 1, -w)
            rows.add(row, i - 1, j - 1, w)
    return A + rows.matrix(), rhs + rows.rhs


def _side_slope(g, h):
    """Derivative along a side of data g sampled at spacing h: central inside, one-sided second
    order at the ends."""
    d = np.empty_like(g)
    if g.size < 3:
        d[:] = (g[-1] - g[0]) / (h * max(g.size - 1, 1))
        return d
    d[1:-1] = (g[2:] - g[:-2]) / (2 * h)
    d[0] = (-3 * g[0] + 4 * g[1] - g[2]) / (2 * h)
    d[-1] = (3 * g[-1] - 4 * g[-2] + g[-3]) / (2 * h)
    return d


def _first_order(rows, row, i, j, coef, step, upwind, h):
    """coef*du along one direction at point (i, j): central, or upwind (forward when coef > 0);
    step = (di, dj)."""
    if coef == 0.0:
        return
    di, dj = step
    if upwind:
        if coef > 0:
            rows.add(row, i + di, j + dj, coef / h)
            rows.add(row, i, j, -coef / h)
        else:
            rows.add(row, i, j, coef / h)
            rows.add(row, i - di, j - dj, -coef / h)
    else:
        rows.add(row, i + di, j + dj, coef / (2 * h))
        rows.add(row, i - di, j - dj, -coef / (2 * h))


def assemble_conservative_cell(problem, upwind=False):
    """Assembles the cell-centred finite-volume system of the conservative form (module doc)."""
    nx, ny = problem["nx"], problem["ny"]
    (x0, x1, y0, y1) = problem["domain"]
    hx, hy = (x1 - x0) / nx, (y1 - y0) / ny
    bc = problem["boundary"]
    fx11, fx12 = problem["fx_k11"], problem["fx_k12"]  # (ny, nx + 1)
    fy12, fy22 = problem["fy_k12"], problem["fy_k22"]  # (ny + 1, nx)
    rows = Rows(nx * ny, cell_resolver(problem, True))
    slope = {
        s: _side_slope(np.asarray(bc[s]["values"], dtype=float), hy if s in ("west", "east") else hx)
        for s in ("west", "east", "south", "north")
    }

    def x_flux(row, i, j, sign):
        """sign * F through the x-face i (between cells i - 1 and i) of row j, over hx."""
        k11, k12 = fx11[j, i] * sign / hx, fx12[j, i] * sign / hx
        side = "west" if i == 0 else "east" if i == nx else None
        if side and bc[side]["kind"] == "neumann":
            # the conormal flux phi = (K grad u).n is the data; F = -phi on the west side
            rows.const(row, (-1.0 if side == "west" else 1.0) * sign / hx * bc[side]["values"][j])
            return
        rows.add(row, i, j, k11 / hx)
        rows.add(row, i - 1, j, -k11 / hx)
        if k12 == 0.0:
            return
        if side and bc[side]["kind"] == "dirichlet":
            rows.const(row, k12 * slope[side][j])
            return
        for ii in (i - 1, i):
            if side and (ii < 0 or ii >= nx):
                continue
            share = 1.0 if side else 0.5
            rows.add(row, ii, j + 1, share * k12 / (2 * hy))
            rows.add(row, ii, j - 1, -share * k12 / (2 * hy))

    def y_flux(row, i, j, sign):
        """sign * G through the y-face j (between cells j - 1 and j) of column i, over hy."""
        k22, k12 = fy22[j, i] * sign / hy, fy12[j, i] * sign / hy
        side = "south" if j == 0 else "north" if j == ny else None
        if side and bc[side]["kind"] == "neumann":
            rows.const(row, (-1.0 if side == "south" else 1.0) * sign / hy * bc[side]["values"][i])
            return
        rows.add(row, i, j, k22 / hy)
        rows.add(row, i, j - 1, -k22 / hy)
        if k12 == 0.0:
            return
        if side and bc[side]["kind"] == "dirichlet":
            rows.const(row, k12 * slope[side][i])
            return
        for jj in (j - 1, j):
            if side and (jj < 0 or jj >= ny):
                continue
            share = 1.0 if side else 0.5
            rows.add(row, i + 1, jj, share * k12 / (2 * hx))
            rows.add(row, i - 1, jj, -share * k12 / (2 * hx))

    bx, by, sigma, f = problem["b"], problem["d"], problem["e"], problem["f"]
    for j in range(ny):
        for i in range(nx):
            row = j * nx + i
            x_flux(row, i + 1, j, 1.0)
            x_flux(row, i, j, -1.0)
            y_flux(row, i, j + 1, 1.0)
            y_flux(row, i, j, -1.0)
            _first_order(rows, row, i, j, bx[j, i], (1, 0), upwind, hx)
            _first_order(rows, row, i, j, by[j, i], (0, 1), upwind, hy)
            rows.add(row, i, j, sigma[j, i])
    return rows.matrix(), rows.rhs + f.ravel()


def assemble_conservative_vertex(problem, upwind=False):
    """Assembles the vertex-centred flux-balance system of the conservative form (module doc)."""
    nx, ny = problem["nx"], problem["ny"]
    (x0, x1, y0, y1) = problem["domain"]
    hx, hy = (x1 - x0) / nx, (y1 - y0) / ny
    bc = problem["boundary"]
    if nx < 2 or ny < 2:
        raise ValueError(f"grid: the vertex layout needs nx, ny >= 2, got {nx}, {ny}")
    fx11, fx12 = problem["fx_k11"], problem["fx_k12"]  # (ny + 1, nx): edges along x
    fy12, fy22 = problem["fy_k12"], problem["fy_k22"]  # (ny, nx + 1): edges along y
    n = (nx + 1) * (ny + 1)
    rows = Rows(n, vertex_resolver(problem))
    mask, dvals = dirichlet_values(problem)
    bx, by, sigma, f = problem["b"], problem["d"], problem["e"], problem["f"]

    def phi(row, side, m, i, j, scale):
        """scale * (K grad u).n of a Neumann/Robin side at its node m (the node is (i, j))."""
        s = bc[side]
        g = s["values"][m]
        if s["kind"] == "neumann":
            rows.const(row, scale * g)
        else:
            beta = float(s["beta"][m])
            rows.const(row, scale * g / beta)
            rows.add(row, i, j, -scale * float(s["alpha"][m]) / beta)

    def x_edge(row, i, j, scale):
        """scale * F through the x-edge (i + 1/2, j)."""
        rows.add(row, i + 1, j, scale * fx11[j, i] / hx)
        rows.add(row, i, j, -scale * fx11[j, i] / hx)
        k12 = fx12[j, i] * scale
        if k12 == 0.0:
            return
        lo, hi = (j - 1, j + 1) if 0 < j < ny else (0, 1) if j == 0 else (ny - 1, ny)
        span = (hi - lo) * hy * 2
        for ii in (i, i + 1):
            rows.add(row, ii, hi, k12 / span)
            rows.add(row, ii, lo, -k12 / span)

    def y_edge(row, i, j, scale):
        """scale * G through the y-edge (i, j + 1/2)."""
        rows.add(row, i, j + 1, scale * fy22[j, i] / hy)
        rows.add(row, i, j, -scale * fy22[j, i] / hy)
        k12 = fy12[j, i] * scale
        if k12 == 0.0:
            return
        lo, hi = (i - 1, i + 1) if 0 < i < nx else (0, 1) if i == 0 else (nx - 1, nx)
        span = (hi - lo) * hx * 2
        for jj in (j, j + 1):
            rows.add(row, hi, jj, k12 / span)
            rows.add(row, lo, jj, -k12 / span)

    def first(row, i, j, coef, along_x):
        if coef == 0.0:
            return
        k, last, h = (i, nx, hx) if along_x else (j, ny, hy)
        step = (1, 0) if along_x else (0, 1)
        if k == 0:
            rows.add(row, i + step[0], j + step[1], coef / h)
            rows.add(row, i, j, -coef / h)
        elif k == last:
            rows.add(row, i, j, coef / h)
            rows.add(row, i - step[0], j - step[1], -coef / h)
        else:
            _first_order(rows, row, i, j, coef, step, upwind, h)

    rhs_d = np.zeros(n)
    for j in range(ny + 1):
        for i in range(nx + 1):
            row = j * (nx + 1) + i
            if mask[j, i]:
                rows.add(row, i, j, 1.0)
                rhs_d[row] = dvals[j, i]
                continue
            wx = (hx / 2 if i > 0 else 0.0) + (hx / 2 if i < nx else 0.0)
            wy = (hy / 2 if j > 0 else 0.0) + (hy / 2 if j < ny else 0.0)
            if i < nx:
                x_edge(row, i, j, 1.0 / wx)
            else:
                phi(row, "east", j, i, j, 1.0 / wx)
            if i > 0:
                x_edge(row, i - 1, j, -1.0 / wx)
            else:
                phi(row, "west", j, i, j, 1.0 / wx)
            if j < ny:
                y_edge(row, i, j, 1.0 / wy)
            else:
                phi(row, "north", i, i, j, 1.0 / wy)
            if j > 0:
                y_edge(row, i, j - 1, -1.0 / wy)
            else:
                phi(row, "south", i, i, j, 1.0 / wy)
            first(row, i, j, bx[j, i], True)
            first(row, i, j, by[j, i], False)
            rows.add(row, i, j, sigma[j, i])
            rhs_d[row] = f[j, i]
    return rows.matrix(), rows.rhs + rhs_d
