"""Reading and writing gridproof protocol messages (docs/protocol.md), shared by the solvers here.

Nothing in this file knows about discretizations: it turns a request into a plain `problem` dict
of NumPy arrays and a solution back into a reply, and runs the `once` or `session` loop.
"""

import base64
import json
import sys

import numpy as np

PROTOCOL = "gridproof-protocol/1"
PROTOCOL_2 = "gridproof-protocol/2"
# this example speaks both versions and answers every message in the version it came in
SPOKEN = (PROTOCOL, PROTOCOL_2)
SIDES = ("west", "east", "south", "north")


class RequestError(ValueError):
    """A request this solver cannot read; the message says which field and what is wrong."""


def log(*parts):
    """Logs to stderr (stdout carries protocol messages only)."""
    print(*parts, file=sys.stderr, flush=True)


def decode_array(value, field, length):
    """Decodes a numbers array, a {"base64": ...} object or (in requests to a solver that declared
    constantArrays) a {"constant": v, "length": n} object into a float64 NumPy array."""
    if isinstance(value, dict) and "constant" in value:
        try:
            arr = np.full(int(value["length"]), float(value["constant"]))
        except (KeyError, TypeError, ValueError) as err:
            raise RequestError(f"{field}: a constant array needs a number and a length ({err})") from None
    elif isinstance(value, dict) and isinstance(value.get("base64"), str):
        raw = base64.b64decode(value["base64"], validate=True)
        if len(raw) % 8 != 0:
            raise RequestError(f"{field}: base64 data has {len(raw)} bytes, not a multiple of 8")
        arr = np.frombuffer(raw, dtype="<f8").astype(float)
    elif isinstance(value, list):
        try:
            arr = np.asarray(value, dtype=float)
        except (TypeError, ValueError) as err:
            raise RequestError(f"{field}: not an array of numbers ({err})") from None
    else:
        raise RequestError(f"{field}: must be an array of numbers or an object with base64")
    if arr.ndim != 1 or arr.size != length:
        raise RequestError(f"{field}: has {arr.size} values, expected {length}")
    if not np.all(np.isfinite(arr)):
        raise RequestError(f"{field}: contains a value that is not finite")
    return arr


def encode_array(arr, encoding):
    """Encodes a float64 array as the request's encoding ("numbers" or "base64")."""
    arr = np.ascontiguousarray(arr, dtype="<f8")
    if encoding == "base64":
        return {"base64": base64.b64encode(arr.tobytes()).decode("ascii")}
    return arr.tolist()


def read_problem(req):
    """Turns a solve request into a problem dict: 2-D arrays indexed [j, i] plus boundary data."""
    grid = req.get("grid") or {}
    layout = grid.get("layout")
    try:
        nx, ny = int(grid["nx"]), int(grid["ny"])
        dom = req["domain"]
        domain = (float(dom["x0"]), float(dom["x1"]), float(dom["y0"]), float(dom["y1"]))
    except (KeyError, TypeError, ValueError) as err:
        raise RequestError(f"grid/domain: missing or not a number ({err})") from None
    if layout == "cell":
        shape, along_x, along_y = (ny, nx), nx, ny
    else:
        shape, along_x, along_y = (ny + 1, nx + 1), nx + 1, ny + 1
    points = shape[0] * shape[1]
    form = req.get("form", "non-conservative")
    problem = {"domain": domain, "nx": nx, "ny": ny, "layout": layout, "form": form}
    if form == "conservative":
        _read_conservative(req, problem, shape)
    elif form == "non-conservative":
        coef = req.get("coefficients") or {}
        for k in ("a", "b", "c", "d", "e"):
            problem[k] = decode_array(coef.get(k), f"coefficients.{k}", points).reshape(shape)
        if coef.get("m") is not None:
            problem["m"] = decode_array(coef["m"], "coefficients.m", points).reshape(shape)
    else:
        raise RequestError(f"form: must be non-conservative or conservative, got {form!r}")
    problem["f"] = decode_array(req.get("source"), "source", points).reshape(shape)
    # version 2, stretched grids: the grid lines (vertex nodes or cell faces), nx + 1 and ny + 1
    if grid.get("x") is not None or grid.get("y") is not None:
        problem["lines"] = (
            decode_array(grid.get("x"), "grid.x", nx + 1),
            decode_array(grid.get("y"), "grid.y", ny + 1),
        )
    bnd = req.get("boundary") or {}
    problem["boundary"] = {}
    for side in SIDES:
        s = bnd.get(side)
        if not isinstance(s, dict) or s.get("kind") not in KINDS:
            raise RequestError(f"boundary.{side}.kind: must be one of {', '.join(KINDS)}")
        if s["kind"] == "periodic":
            # no data: the side's neighbours are across the seam (west with east, south with north)
            problem["boundary"][side] = {"kind": "periodic"}
            continue
        n = along_y if side in ("west", "east") else along_x
        entry = {
            "kind": s["kind"],
            "values": decode_array(s.get("values"), f"boundary.{side}.values", n),
        }
        if s["kind"] == "robin":
            # one number for the side, or (version 2) one value per point along it
            for w in ("alpha", "beta"):
                v = s.get(w)
                if isinstance(v, (int, float)) and not isinstance(v, bool):
                    entry[w] = np.full(n, float(v))
                else:
                    entry[w] = decode_array(v, f"boundary.{side}.{w}", n)
        problem["boundary"][side] = entry
    for one, other in (("west", "east"), ("south", "north")):
        if (problem["boundary"][one]["kind"] == "periodic") != (
            problem["boundary"][other]["kind"] == "periodic"
        ):
            raise RequestError(f"boundary: {one} and {other} must both be periodic or neither")
    problem["singular"] = req.get("singular") is True
    return problem


def _read_conservative(req, problem, shape):
    """Reads K, beta and sigma at the points and K at the faces (docs/protocol.md, version 2).

    The problem gets a = k11, c = k22, b = bx, d = by, e = sigma and k12 at the points, and the
    face arrays fx_k11, fx_k12 (flux along x) and fy_k12, fy_k22 (flux along y) as 2-D arrays.
    """
    k = req.get("conservative")
    if not isinstance(k, dict):
        raise RequestError("conservative: missing; a conservative request carries K at points and faces")
    ny, nx = problem["ny"], problem["nx"]
    points = shape[0] * shape[1]
    for key, name in (("a", "k11"), ("c", "k22"), ("k12", "k12"), ("b", "bx"), ("d", "by"),
                      ("e", "sigma")):
        problem[key] = decode_array(k.get(name), f"conservative.{name}", points).reshape(shape)
    if problem["layout"] == "cell":
        fx_shape, fy_shape = (ny, nx + 1), (ny + 1, nx)
    else:
        fx_shape, fy_shape = (ny + 1, nx), (ny, nx + 1)
    faces = k.get("faces") or {}
    for axis, names, fshape in (("x", ("k11", "k12"), fx_shape), ("y", ("k12", "k22"), fy_shape)):
        group = faces.get(axis) or {}
        for name in names:
            field = f"conservative.faces.{axis}.{name}"
            arr = decode_array(group.get(name), field, fshape[0] * fshape[1])
            problem[f"f{axis}_{name}"] = arr.reshape(fshape)


KINDS = ("dirichlet", "neumann", "robin", "periodic")


def message(kind, protocol=PROTOCOL, **fields):
    """A protocol message with the version and type filled in."""
    return {"protocol": protocol, "type": kind, **fields}


def answer(req, solve, ready):
    """Answers one message in its own version: `solve(req)` returns a reply dict; `ready` is the
    ready message (its version is set to the hello's)."""
    if not isinstance(req, dict):
        return message("error", reason="the message is not a JSON object")
    version = req.get("protocol")
    if version not in SPOKEN:
        return message(
            "error",
            reason=f"this solver speaks {' and '.join(SPOKEN)}; the request says '{version}'",
            **({"id": req["id"]} if isinstance(req.get("id"), str) else {}),
        )
    kind = req.get("type")
    if kind == "hello":
        reply = dict(ready)
    elif kind != "solve":
        reply = message("error", reason=f"unknown message type '{kind}'; expected hello or solve")
    else:
        try:
            reply = solve(req)
        except RequestError as err:
            reply = message("error", id=str(req.get("id", "")), reason=str(err))
    reply["protocol"] = version
    return reply


def enlarge_pipes():
    """On Linux, lets each pipe hand-over carry 1 MiB instead of 64 KiB (F_SETPIPE_SZ = 1031);
    anywhere else, or when the call fails, the pipes stay as they are."""
    try:
        import fcntl

        for stream in (sys.stdin, sys.stdout):
            fcntl.fcntl(stream.fileno(), 1031, 1 << 20)
    except (ImportError, OSError, ValueError):
        pass


def run(solve, ready):
    """Runs the once or session mode, chosen by the first line: a hello line starts a session."""
    enlarge_pipes()
    first = sys.stdin.readline()
    try:
        head = json.loads(first) if first.strip() else None
    except json.JSONDecodeError:
        head = None
    if not (isinstance(head, dict) and head.get("type") == "hello"):
        # once mode: the request is everything on stdin (it may span several lines)
        text = first + sys.stdin.read()
        try:
            req = json.loads(text)
        except json.JSONDecodeError as err:
            reply = message("error", reason=f"the request is not valid JSON: {err}")
        else:
            reply = answer(req, solve, ready)
        sys.stdout.write(json.dumps(reply) + "\n")
        sys.stdout.flush()
        return
    line = first
    while line:
        try:
            req = json.loads(line)
        except json.JSONDecodeError as err:
            reply = message("error", reason=f"the line is not valid JSON: {err}")
        else:
            if isinstance(req, dict) and req.get("type") == "goodbye":
                return
            reply = answer(req, solve, ready)
        sys.stdout.write(json.dumps(reply) + "\n")
        sys.stdout.flush()
        line = sys.stdin.readline()
        while line and not line.strip():
            line = sys.stdin.readline()
