"""Gaussian flux-line reference for test/gate/pulse.test.ts, independent of fluxlane.

The AWG samples x_k at t_k = k / fs (parking before the first and after the last) joined
piecewise-linearly (numpy.interp) on a grid of step h, convolved with a unit-area Gaussian of
standard deviation sigma (scipy.signal.fftconvolve, kernel truncated at 10 sigma), then read at the
requested times by linear interpolation of the fine result, on the AWG's clock (no delay).

stdin:  {"samples": [...], "fs": GHz, "sigma": ns, "park": flux, "times": [ns, ...], "h": ns}
stdout: {"flux": [...]}
"""
import json
import sys

import numpy as np
from scipy.signal import fftconvolve

req = json.load(sys.stdin)
x = np.array(req["samples"], dtype=float)
fs = float(req["fs"])
sigma = float(req["sigma"])
park = float(req["park"])
h = float(req.get("h", 1e-3))
times = np.array(req["times"], dtype=float)

pad = 12 * sigma
t_awg = np.arange(len(x)) / fs
t_fine = np.arange(-pad, t_awg[-1] + pad + h / 2, h)
lin = np.interp(t_fine, t_awg, x, left=park, right=park)
half = int(np.ceil(10 * sigma / h))
u = np.arange(-half, half + 1) * h
kernel = np.exp(-0.5 * (u / sigma) ** 2)
kernel /= kernel.sum()
smooth = fftconvolve(lin, kernel, mode="same")
print(json.dumps({"flux": np.interp(times, t_fine, smooth).tolist()}))
