"""Minimisers of smooth test functions on a bracket, by SciPy's Brent method
(scipy.optimize.minimize_scalar, method='bounded', xatol 1e-12), for test/util/golden-section.test.ts.
Input: {"cases": [{"name": ..., "lo": ..., "hi": ...}]}; output: {"x": [...]} in the same order."""
import json
import sys

import numpy as np
from scipy.optimize import minimize_scalar

FUNCTIONS = {
    "shifted-sine": lambda x: (x - 0.3) ** 2 + 0.1 * np.sin(3 * x),
    "quartic": lambda x: (x - 1.234) ** 4 + 0.5 * (x - 1.234) ** 2 + 2.0,
    "log-cosh": lambda x: np.log(np.cosh(2.0 * (x + 0.77))) + 0.05 * x,
}

def main():
    doc = json.loads(sys.stdin.read())
    out = []
    for c in doc["cases"]:
        f = FUNCTIONS[c["name"]]
        r = minimize_scalar(f, bounds=(c["lo"], c["hi"]), method="bounded", options={"xatol": 1e-12})
        out.append(float(r.x))
    print(json.dumps({"x": out}))

main()
