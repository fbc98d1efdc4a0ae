"""Reference cubic Hermite interpolants for test/linalg/cubic-hermite.test.ts.

stdin: {"x": [x0, x1], "y": [y0, y1], "dydx": [d0, d1], "at": [...]}
scipy.interpolate.CubicHermiteSpline through the two points with the given derivatives, its
values and first derivatives at `at`.
stdout (last line): {"values": [...], "slopes": [...]}
"""
import json
import sys

from scipy.interpolate import CubicHermiteSpline


def main():
    p = json.load(sys.stdin)
    s = CubicHermiteSpline(p["x"], p["y"], p["dydx"])
    print(json.dumps({"values": s(p["at"]).tolist(), "slopes": s(p["at"], 1).tolist()}))


if __name__ == "__main__":
    main()
