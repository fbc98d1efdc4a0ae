"""Reference cubic Hermite interpolants for test/linalg/cubic-hermite.test.ts.

stdin: {"x": [x0, x1], "y": [y0, y1], "dydx": [d0, d1], "at": [...], "solve": [...] (optional)}
scipy.interpolate.CubicHermiteSpline through the two points with the given derivatives, its
values and first derivatives at `at`, and for each value of `solve` the x in [x0, x1] where the
interpolant takes it (PPoly.solve, real roots on the cell; the first when several).
stdout (last line): {"values": [...], "slopes": [...], "roots": [...]}
"""
import json
import sys

from scipy.interpolate import CubicHermiteSpline


def main():
    p = json.load(sys.stdin)
    s = CubicHermiteSpline(p["x"], p["y"], p["dydx"])
    roots = [float(s.solve(v, extrapolate=False)[0]) for v in p.get("solve", [])]
    print(json.dumps({"values": s(p["at"]).tolist(), "slopes": s(p["at"], 1).tolist(), "roots": roots}))


if __name__ == "__main__":
    main()
