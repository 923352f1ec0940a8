#!/usr/bin/python3
"""A small protocol solver for gridproof's fault tests: it misbehaves on purpose.

Usage: misbehave.py MODE [ARG]   (see MODES below). Decodes base64 arrays with the standard
library only (base64 + struct, little-endian '<d'), independently of gridproof's TypeScript
decoder, so the "echo" modes double as an independent check of the encoding.
"""
import base64
import json
import os
import resource
import signal
import struct
import subprocess
import sys
import time

VERSION = "gridproof-protocol/1"


def decode(wire):
    if isinstance(wire, list):
        return [float(v) for v in wire]
    raw = base64.b64decode(wire["base64"])
    return list(struct.unpack("<%dd" % (len(raw) // 8), raw))


def encode(values, encoding):
    if encoding == "numbers":
        return list(values)
    return {"base64": base64.b64encode(struct.pack("<%dd" % len(values), *values)).decode("ascii")}


def out(message):
    sys.stdout.write(json.dumps(message) + "\n")
    sys.stdout.flush()


def solution(request, values, encoding="numbers", **extra):
    reply = {"protocol": VERSION, "type": "solution", "id": request["id"],
             "values": encode(values, encoding)}
    reply.update(extra)
    return reply


def address_space_limit():
    """The soft RLIMIT_AS of this process in bytes, or "unlimited"."""
    soft = resource.getrlimit(resource.RLIMIT_AS)[0]
    return "unlimited" if soft == resource.RLIM_INFINITY else str(soft)


def allocate(mib):
    """Allocates and zero-fills MIB MiB, as a solver building a large matrix would. Under an
    address-space limit below that, CPython raises MemoryError, left uncaught on purpose."""
    sys.stderr.write("address-space limit %s; allocating %d MiB\n" % (address_space_limit(), mib))
    sys.stderr.flush()
    return bytearray(mib * 1024 * 1024)


def once(mode, arg):
    if mode == "closestdin":
        os.close(0)
        time.sleep(0.2)
        return 0
    if mode == "hang":
        child = subprocess.Popen(["sleep", "300"])
        sys.stderr.write("grandchild pid %d\n" % child.pid)
        sys.stderr.flush()
        time.sleep(300)
        return 0
    request = json.loads(sys.stdin.read())
    source = decode(request["source"])
    if mode in ("holdstdout", "escape", "escape-scrubbed"):
        # a good reply, leaving a `sleep 300` behind: holdstdout — in the process group, holding
        # stdout and stderr open; escape — in a session of its own (setsid), its output elsewhere;
        # escape-scrubbed — the same with an empty environment, after which the solver waits 1.5 s
        # (gridproof's only trace of it is its parent, this process, while it lives)
        if mode == "holdstdout":
            child = subprocess.Popen(["sleep", "300"])
        else:
            child = subprocess.Popen(["/bin/sleep", "300"], start_new_session=True,
                                     stdin=subprocess.DEVNULL, stdout=subprocess.DEVNULL,
                                     stderr=subprocess.DEVNULL,
                                     env={} if mode == "escape-scrubbed" else None)
        sys.stderr.write("grandchild pid %d\n" % child.pid)
        sys.stderr.flush()
        if mode == "escape-scrubbed":
            time.sleep(1.5)
        out(solution(request, source))
        return 0
    if mode == "echo":
        # values = the request's source, re-encoded in the encoding given as ARG
        out(solution(request, source, arg or "numbers", iterations=0, converged=True,
                     seconds=0.001, solver={"name": "misbehave", "version": "1"},
                     notes="echo of the source", residualHistory=[1.0, 0.5]))
    elif mode == "points":
        d = request["domain"]
        xs = [d["x0"] + (d["x1"] - d["x0"]) * t for t in (0.0, 0.25, 0.5, 0.75, 1.0)]
        ys = [d["y0"] + (d["y1"] - d["y0"]) * t for t in (0.5, 0.5, 0.5, 0.5, 0.5)]
        reply = solution(request, [x + y for x, y in zip(xs, ys)])
        reply["points"] = {"x": xs, "y": ys}
        out(reply)
    elif mode == "allocate":
        # ARG MiB, then a good reply whose notes report the address-space limit seen
        block = allocate(int(arg))
        out(solution(request, source, notes="address-space limit %s; held %d bytes"
                     % (address_space_limit(), len(block))))
    elif mode == "exit3":
        sys.stderr.write("solver: matrix is singular at row 17\n")
        return 3
    elif mode == "signal":
        sys.stderr.write("about to crash\n")
        sys.stderr.flush()
        os.kill(os.getpid(), signal.SIGSEGV)
    elif mode == "badjson":
        sys.stdout.write("{'values': [1, 2, 3")
    elif mode == "wrongshape":
        out({"protocol": VERSION, "type": "solution", "id": 5, "values": "many",
             "iterations": -2, "converged": "yes"})
    elif mode == "wrongcount":
        out(solution(request, source[:-1]))
    elif mode == "nan":
        values = list(source)
        values[int(arg or 7)] = float("nan")
        out(solution(request, values))  # json.dumps writes a bare NaN token
    elif mode == "inf-base64":
        values = list(source)
        values[int(arg or 5)] = float("inf")
        out(solution(request, values, "base64"))
    elif mode == "logs":
        print("Starting my-solver 1.2")
        print("iteration 1: residual 1e-3")
        out(solution(request, source))
    elif mode == "huge":
        sys.stdout.write('{"protocol": "%s", "type": "solution", "values": [' % VERSION)
        chunk = "0.0, " * 20000
        for _ in range(60):  # about 6 MB
            sys.stdout.write(chunk)
        sys.stdout.write("0.0]}\n")
    elif mode == "version":
        reply = solution(request, source)
        reply["protocol"] = "gridproof-protocol/9"
        out(reply)
    elif mode == "wrongid":
        reply = solution(request, source)
        reply["id"] = "something-else"
        out(reply)
    elif mode == "na":
        out({"protocol": VERSION, "type": "not-applicable", "id": request["id"],
             "reason": "robin boundaries are not supported"})
    elif mode == "error":
        out({"protocol": VERSION, "type": "error", "id": request["id"],
             "reason": "factorization failed: zero pivot"})
    else:
        sys.stderr.write("unknown mode %s\n" % mode)
        return 2
    return 0


def session(mode, arg):
    """Session modes: session (good), session-crash N (exit 5 on request N), session-crash-held N
    (the same, leaving a `sleep 300` that holds stdout open),
    session-hang N (hang on request N), session-logs (a log line before each reply),
    session-allocate N (allocate 2 GiB on request N, which fails under a smaller memory limit),
    session-constants (declares that it reads the constant array form). Every reply's notes name
    the coefficients that arrived in the constant form."""
    hello = json.loads(sys.stdin.readline())
    assert hello["type"] == "hello"
    out({"protocol": VERSION, "type": "ready", "solver": {"name": "misbehave", "version": "1"},
         "supports": {"boundaryKinds": ["dirichlet", "neumann", "robin"],
                      "encodings": ["numbers", "base64"], "largestGrid": {"nx": 64, "ny": 128},
                      "constantArrays": mode == "session-constants"}})
    count = 0
    for line in sys.stdin:
        message = json.loads(line)
        if message["type"] == "goodbye":
            return 0
        count += 1
        sys.stderr.write("request %d\n" % count)
        sys.stderr.flush()
        if mode == "session-crash" and count == int(arg):
            sys.stderr.write("crashing on request %d\n" % count)
            return 5
        if mode == "session-crash-held" and count == int(arg):
            # the `sleep 300` left behind holds stdout open: only the crash ends the solve
            child = subprocess.Popen(["sleep", "300"])
            sys.stderr.write("grandchild pid %d; crashing on request %d\n" % (child.pid, count))
            return 5
        if mode == "session-hang" and count == int(arg):
            time.sleep(300)
        if mode == "session-allocate" and count == int(arg):
            allocate(2048)
        if mode == "session-logs":
            print("log line on stdout")
        constant = sorted(k for k, v in message["coefficients"].items()
                          if isinstance(v, dict) and "constant" in v)
        out(solution(message, decode(message["source"]), "base64", iterations=count,
                     notes="pid %d; constant arrays: %s" % (os.getpid(), ",".join(constant) or "none")))
    return 0


if __name__ == "__main__":
    mode = sys.argv[1]
    arg = sys.argv[2] if len(sys.argv) > 2 else None
    sys.exit(session(mode, arg) if mode.startswith("session") else once(mode, arg))
