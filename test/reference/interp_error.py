"""Largest error of the piecewise-linear interpolant through kept samples (kx, ky) against the
full samples (x, y), with NumPy's np.interp. Input JSON {x, y, kx, ky}; output {maxError}."""
import json
import sys

import numpy as np

d = json.load(sys.stdin)
x = np.asarray(d["x"], dtype=float)
y = np.asarray(d["y"], dtype=float)
approx = np.interp(x, np.asarray(d["kx"], dtype=float), np.asarray(d["ky"], dtype=float))
print(json.dumps({"maxError": float(np.max(np.abs(approx - y)))}))
