"""Stretched grids (protocol 2, grid.x and grid.y): the non-conservative operator
a*u_xx + b*u_x + c*u_yy + d*u_y + e*u = f assembled from one-dimensional difference matrices per
axis, combined with Kronecker products (x fastest).

Vertex layout (nodes at the grid lines x_i): non-uniform 3-point differences with h- = x_i - x_{i-1},
h+ = x_{i+1} - x_i:

    u_xx ~ 2/(h- + h+) * ((u_{i+1} - u_i)/h+ - (u_i - u_{i-1})/h-)
    u_x  ~ (h-^2 u_{i+1} - h+^2 u_{i-1} + (h+^2 - h-^2) u_i) / (h- h+ (h- + h+))

(upwind: (u_{i+1} - u_i)/h+ where the coefficient is positive, (u_i - u_{i-1})/h- otherwise).
Dirichlet sides only: the boundary rows are u = g.

Cell layout (grid lines are faces, centres p_i their midpoints, widths w_i): the flux form

    u_xx ~ ((u_{i+1} - u_i)/(p_{i+1} - p_i) - (u_i - u_{i-1})/(p_i - p_{i-1})) / w_i

and u_x by the 3-point formula on the centres. At a Dirichlet face the neighbour is the face
itself (value g at distance w/2); at a Neumann face the face derivative is the data (outward
normal). Robin sides and the mixed term are declined on stretched grids.

Conservative form div(K grad u) + bx*u_x + by*u_y + sigma*u = f with a diagonal K (k12 = 0; a
cross term is declined), K from the request at the faces (cell layout) or edge midpoints (vertex
layout). Each point balances the fluxes through the faces of its control volume:

    [k11_e (u_E - u_P)/he - k11_w (u_P - u_W)/hw] / w + (same in y) + bx*u_x + by*u_y + sigma*u = f,

vertex layout: he, hw the node spacings and w = (hw + he)/2, Dirichlet sides only (identity rows);
cell layout: he, hw the distances between centres and w the cell width; at a Dirichlet face the
neighbour is the face value g at distance w/2, at a Neumann face the flux is the data (the conormal
flux (K grad u).n). The first-order terms are those of the non-conservative form above; at a
Neumann face their face derivative is the data divided by k11 (k22) there.
"""

import numpy as np
import scipy.sparse as sp


def _three_point(hm, hp):
    """Weights (w-, w0, w+) of the non-uniform second and first derivative."""
    s = hm + hp
    second = (2 / (hm * s), -2 / (hm * hp), 2 / (hp * s))
    first = (-hp / (hm * s), (hp - hm) / (hm * hp), hm / (hp * s))
    return second, first


def _vertex_axis(x):
    """1-D matrices on the n + 1 nodes (boundary rows zero): D2, D1, forward, backward."""
    m = x.size
    D2, D1, F, B = (sp.lil_matrix((m, m)) for _ in range(4))
    for i in range(1, m - 1):
        hm, hp = x[i] - x[i - 1], x[i + 1] - x[i]
        second, first = _three_point(hm, hp)
        for k, (w2, w1) in enumerate(zip(second, first)):
            D2[i, i - 1 + k] = w2
            D1[i, i - 1 + k] = w1
        F[i, i], F[i, i + 1] = -1 / hp, 1 / hp
        B[i, i - 1], B[i, i] = -1 / hm, 1 / hm
    return [M.tocsr() for M in (D2, D1, F, B)]


def _cell_axis(faces, kinds):
    """1-D matrices on the n cells and, per end, the weight of the face data in each row.

    Returns (D2, D1, F, B) as (matrix, start-data weights, end-data weights) triples. Dirichlet
    data are face values, Neumann data outward normal derivatives."""
    p = (faces[:-1] + faces[1:]) / 2
    w = np.diff(faces)
    n = p.size
    mats = {name: sp.lil_matrix((n, n)) for name in ("D2", "D1", "F", "B")}
    data = {name: (np.zeros(n), np.zeros(n)) for name in mats}
    for i in range(n):
        # neighbours: (position, index or end) on each side
        left = (p[i - 1], i - 1) if i > 0 else (faces[0], "start")
        right = (p[i + 1], i + 1) if i < n - 1 else (faces[-1], "end")
        hm, hp = p[i] - left[0], right[0] - p[i]

        def put(name, where, weight):
            if isinstance(where, int):
                mats[name][i, where] += weight
            elif where == "start":
                data[name][0][i] += weight
            else:
                data[name][1][i] += weight

        neumann_start = left[1] == "start" and kinds[0] == "neumann"
        neumann_end = right[1] == "end" and kinds[1] == "neumann"
        # flux form of u_xx: face derivatives divided by the width
        for side, (pos_n, idx), h, sign in ((0, left, hm, -1), (1, right, hp, 1)):
            if (side == 0 and neumann_start) or (side == 1 and neumann_end):
                # the face derivative u_x is the data times the outward normal's x component
                put("D2", "start" if side == 0 else "end", sign * sign / w[i])
                continue
            # + (u_nb - u_P)/h on the east face, - (u_P - u_nb)/h on the west face: both (u_nb - u_P)/h
            put("D2", idx, 1 / (h * w[i]))
            mats["D2"][i, i] -= 1 / (h * w[i])
        # u_x: 3-point on (left, P, right); at a Neumann end the mean of the face derivatives
        if neumann_start or neumann_end:
            inner, h, sign = (right, hp, 1) if neumann_start else (left, hm, -1)
            end = "start" if neumann_start else "end"
            face_sign = -1 if neumann_start else 1
            for name in ("D1", "F", "B"):
                put(name, end, face_sign / 2)
                put(name, inner[1], sign / (2 * h))
                mats[name][i, i] -= sign / (2 * h)
            continue
        _, first = _three_point(hm, hp)
        put("D1", left[1], first[0])
        mats["D1"][i, i] += first[1]
        put("D1", right[1], first[2])
        put("F", right[1], 1 / hp)
        mats["F"][i, i] -= 1 / hp
        put("B", left[1], -1 / hm)
        mats["B"][i, i] += 1 / hm
    return [(mats[k].tocsr(), *data[k]) for k in ("D2", "D1", "F", "B")]


def _unsupported(problem):
    if problem["form"] == "conservative":
        if np.any(problem["k12"] != 0) or np.any(problem["fx_k12"] != 0) or np.any(
            problem["fy_k12"] != 0
        ):
            return "on stretched grids this example solves the conservative form with a diagonal K"
    elif np.any(problem.get("m", 0) != 0):
        return "on stretched grids this example solves the non-conservative form without u_xy"
    kinds = {s["kind"] for s in problem["boundary"].values()}
    if problem["layout"] == "vertex" and kinds != {"dirichlet"}:
        return "on stretched vertex grids this example takes Dirichlet sides only"
    if "robin" in kinds:
        return "on stretched cell grids this example takes Dirichlet and Neumann sides only"
    return None


def unsupported(problem):
    """Why this module cannot solve the stretched problem, or None."""
    return _unsupported(problem)


def _flux_vertex(x, y, fx, fy):
    """The diffusion rows of the conservative form on the nodes (boundary rows zero)."""
    mx, my = x.size, y.size
    D = sp.lil_matrix((mx * my, mx * my))
    for j in range(1, my - 1):
        hs, hn = y[j] - y[j - 1], y[j + 1] - y[j]
        wy = (hs + hn) / 2
        for i in range(1, mx - 1):
            hw, he = x[i] - x[i - 1], x[i + 1] - x[i]
            wx = (hw + he) / 2
            k = j * mx + i
            for nb, kf, h, w in ((k - 1, fx[j, i - 1], hw, wx), (k + 1, fx[j, i], he, wx),
                                 (k - mx, fy[j - 1, i], hs, wy), (k + mx, fy[j, i], hn, wy)):
                D[k, nb] += kf / (h * w)
                D[k, k] -= kf / (h * w)
    return D.tocsr()


def _flux_cell(x, y, fx, fy, bc):
    """The diffusion rows of the conservative form on the cells, and the data's part of the rhs."""
    px, py = (x[:-1] + x[1:]) / 2, (y[:-1] + y[1:]) / 2
    wx, wy = np.diff(x), np.diff(y)
    nx, ny = px.size, py.size
    D = sp.lil_matrix((nx * ny, nx * ny))
    known = np.zeros(nx * ny)
    for j in range(ny):
        for i in range(nx):
            k = j * nx + i
            faces = (
                # (neighbour or None, K at the face, distance, width, side, position along it)
                (k - 1 if i > 0 else None, fx[j, i], px[i] - px[i - 1] if i > 0 else wx[i] / 2,
                 wx[i], "west", j),
                (k + 1 if i < nx - 1 else None, fx[j, i + 1],
                 px[i + 1] - px[i] if i < nx - 1 else wx[i] / 2, wx[i], "east", j),
                (k - nx if j > 0 else None, fy[j, i], py[j] - py[j - 1] if j > 0 else wy[j] / 2,
                 wy[j], "south", i),
                (k + nx if j < ny - 1 else None, fy[j + 1, i],
                 py[j + 1] - py[j] if j < ny - 1 else wy[j] / 2, wy[j], "north", i),
            )
            for nb, kf, h, w, side, pos in faces:
                if nb is not None:
                    D[k, nb] += kf / (h * w)
                    D[k, k] -= kf / (h * w)
                elif bc[side]["kind"] == "neumann":
                    known[k] += bc[side]["values"][pos] / w  # the outward flux is the data
                else:  # Dirichlet: the face value at half a cell
                    D[k, k] -= kf / (h * w)
                    known[k] += kf * bc[side]["values"][pos] / (h * w)
    return D.tocsr(), known


def _assemble_conservative(problem, upwind):
    """A (CSR) and rhs of the conservative form on a stretched grid (module doc)."""
    x, y = problem["lines"]
    fx, fy = problem["fx_k11"], problem["fy_k22"]
    if problem["layout"] == "vertex":
        flux = _flux_vertex(x, y, fx, fy)
        zero = np.zeros(problem["b"].size)
        # the first-order terms, reaction and Dirichlet rows of the non-conservative assembly;
        # the flux rows of the boundary nodes are zero, so the identity rows stay
        A, rhs = assemble({**problem, "form": "non-conservative", "a": zero, "c": zero}, upwind)
        return (A + flux).tocsr(), rhs
    flux, known = _flux_cell(x, y, fx, fy, problem["boundary"])
    # the first-order terms of the non-conservative assembly; at a Neumann face its data must be
    # the normal derivative, the conormal flux divided by k11 (k22) there
    bc = {s: dict(v) for s, v in problem["boundary"].items()}
    for side, k_side in (("west", fx[:, 0]), ("east", fx[:, -1]), ("south", fy[0, :]),
                         ("north", fy[-1, :])):
        if bc[side]["kind"] == "neumann":
            bc[side]["values"] = np.asarray(bc[side]["values"], float) / k_side
    zero = np.zeros(problem["b"].size)
    A, rhs = assemble(
        {**problem, "form": "non-conservative", "a": zero, "c": zero, "boundary": bc}, upwind
    )
    return (A + flux).tocsr(), rhs - known


def assemble(problem, upwind=False):
    """A (CSR) and rhs of the stretched problem on its layout; Dirichlet rows (vertex) are u = g."""
    if problem["form"] == "conservative":
        return _assemble_conservative(problem, upwind)
    x, y = problem["lines"]
    a, b, c, d, e = (problem[k].ravel() for k in "abcde")
    f = problem["f"].ravel().astype(float).copy()
    bc = problem["boundary"]
    if problem["layout"] == "vertex":
        Dx = _vertex_axis(x)
        Dy = _vertex_axis(y)
        Ix, Iy = sp.identity(x.size), sp.identity(y.size)
        X = [sp.kron(Iy, M) for M in Dx]
        Y = [sp.kron(M, Ix) for M in Dy]
        A = _combine(a, b, c, d, e, X, Y, upwind).tolil()
        mx, my = x.size, y.size
        g = np.full((my, mx), np.nan)
        g[:, 0], g[:, -1] = bc["west"]["values"], bc["east"]["values"]
        g[0, :], g[-1, :] = bc["south"]["values"], bc["north"]["values"]
        rows = np.flatnonzero(~np.isnan(g.ravel()))
        for r in rows:
            A.rows[r], A.data[r] = [r], [1.0]
        f[rows] = g.ravel()[rows]
        return A.tocsr(), f
    kx = (bc["west"]["kind"], bc["east"]["kind"])
    ky = (bc["south"]["kind"], bc["north"]["kind"])
    Dx = _cell_axis(x, kx)
    Dy = _cell_axis(y, ky)
    nx, ny = x.size - 1, y.size - 1
    Ix, Iy = sp.identity(nx), sp.identity(ny)
    X = [sp.kron(Iy, M) for (M, _, _) in Dx]
    Y = [sp.kron(M, Ix) for (M, _, _) in Dy]
    A = _combine(a, b, c, d, e, X, Y, upwind)
    # boundary data: every 1-D row's weight of the face data, times the data along the side
    gw, ge = bc["west"]["values"], bc["east"]["values"]
    gs, gn = bc["south"]["values"], bc["north"]["values"]

    def data_x(k):
        _, ws, we = Dx[k]
        return (np.outer(np.ones(ny), ws) * gw[:, None] + np.outer(np.ones(ny), we) * ge[:, None])

    def data_y(k):
        _, ws, we = Dy[k]
        return (np.outer(ws, np.ones(nx)) * gs[None, :] + np.outer(we, np.ones(nx)) * gn[None, :])

    fx = _combine_data(a, b, [data_x(k).ravel() for k in range(4)], upwind)
    fy = _combine_data(c, d, [data_y(k).ravel() for k in range(4)], upwind)
    return A.tocsr(), f - fx - fy


def _combine(a, b, c, d, e, X, Y, upwind):
    A = sp.diags(a) @ X[0] + sp.diags(c) @ Y[0] + sp.diags(e)
    for coef, parts in ((b, X), (d, Y)):
        if upwind:
            A = A + sp.diags(np.maximum(coef, 0)) @ parts[2] + sp.diags(np.minimum(coef, 0)) @ parts[3]
        else:
            A = A + sp.diags(coef) @ parts[1]
    return A


def _combine_data(second, first, parts, upwind):
    out = second * parts[0]
    if upwind:
        return out + np.maximum(first, 0) * parts[2] + np.minimum(first, 0) * parts[3]
    return out + first * parts[1]
