"""Reference Chebyshev-Lobatto interpolants for test/linalg/chebyshev-series.test.ts.

stdin: {"problems": [{"f": "exp" | "runge" | "abs", "a": a, "b": b, "n": n}, ...]}
The n + 1 Chebyshev-Lobatto points x_j = (a+b)/2 + (b-a)/2 cos(pi j / n); the degree-n
least-squares fit through n + 1 points (numpy.polynomial.chebyshev.chebfit) is the interpolant,
so its coefficients are the interpolant's c_0..c_n in t = (2x - a - b)/(b - a).
stdout (last line): {"results": [{"x": [...], "values": [...], "coefficients": [...]}, ...]}
"""
import json
import sys

import numpy as np
from numpy.polynomial import chebyshev as C

FUNCS = {
    "exp": np.exp,
    "runge": lambda x: 1.0 / (1.0 + 25.0 * (x - 3.5) ** 2),
    "abs": lambda x: np.abs(x - 3.3),
}


def solve(p):
    a, b, n = float(p["a"]), float(p["b"]), int(p["n"])
    j = np.arange(n + 1)
    x = 0.5 * (a + b) + 0.5 * (b - a) * np.cos(np.pi * j / n)
    t = (2 * x - a - b) / (b - a)
    f = FUNCS[p["f"]](x)
    c = C.chebfit(t, f, n)
    return {"x": x.tolist(), "values": f.tolist(), "coefficients": c.tolist()}


def main():
    req = json.load(sys.stdin)
    print(json.dumps({"results": [solve(p) for p in req["problems"]]}))


if __name__ == "__main__":
    main()
