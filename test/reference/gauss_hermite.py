"""Probabilists' Gauss-Hermite rules from NumPy for test/budget/gauss-hermite.test.ts.

stdin:  {"n": [list of rule sizes]}
stdout: {"rules": [{"n", "nodes", "weights"}]}, weights normalised to sum to 1
(numpy.polynomial.hermite_e.hermegauss integrates against exp(-x^2/2), total sqrt(2 pi)).
"""
import json
import sys

import numpy as np
from numpy.polynomial.hermite_e import hermegauss


def main():
    doc = json.load(sys.stdin)
    out = []
    for n in doc["n"]:
        x, w = hermegauss(int(n))
        out.append({"n": int(n), "nodes": x.tolist(), "weights": (w / w.sum()).tolist()})
    print(json.dumps({"rules": out}))


main()
