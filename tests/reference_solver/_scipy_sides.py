"""Reading the boundary sides of the SciPy check scripts' input (scipy_stretched*.py): Robin
weights given as one number or one value per node, and whether a side fixes u."""


def weight(s, name, pos):
    """A Robin weight at a position along its side: one number or one value per node."""
    w = s[name]
    return float(w[pos]) if isinstance(w, list) else float(w)


def fixes_u(s):
    """Dirichlet, or Robin with beta = 0 along the whole side."""
    if s["kind"] == "dirichlet":
        return True
    return s["kind"] == "robin" and all(weight(s, "beta", k) == 0 for k in range(len(s["values"])))


def fixed_value(s, pos):
    """The value of u a side fixes at a position (g, or g / alpha for Robin with beta = 0)."""
    g = s["values"][pos]
    return g / weight(s, "alpha", pos) if s["kind"] == "robin" else g
